/*
 * startup.c - minimal Cortex-M4F start-up for the vector runner under semihosting.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * The vector table sits at address 0 (section .vectors, first in ROM; linker script
 * m4.ld): initial stack pointer, reset handler, and a fault handler for the rest of
 * the system exceptions.  Reset: enable the FPU (CPACR, ARMv7-M Architecture Reference
 * Manual B3.2.20: CP10 and CP11 full access) before any floating-point instruction
 * runs, copy .data from ROM, zero .bss, start newlib's semihosting I/O, run main and
 * hand its status to exit() (semihosting SYS_EXIT: the host sees 0 or non-zero).
 * No C library start-up file is used (-nostartfiles).
 */
#include <stdint.h>
#include <stdlib.h>

extern int main(void);
extern void initialise_monitor_handles(void);

extern uint32_t __data_load__;
extern uint32_t __data_start__;
extern uint32_t __data_end__;
extern uint32_t __bss_start__;
extern uint32_t __bss_end__;
extern uint32_t __stack_top__;

void reset_handler(void);
void fault_handler(void);

#define CPACR (*(volatile uint32_t *)0xE000ED88UL)

void reset_handler(void)
{
    uint32_t *src = &__data_load__;
    uint32_t *dst = &__data_start__;
    CPACR |= (0xFUL << 20); /* CP10, CP11: full access */
    __asm__ volatile("dsb\n\tisb" ::: "memory");
    while (dst < &__data_end__) { /* bounded by the linker's section size */
        *dst++ = *src++;
    }
    for (dst = &__bss_start__; dst < &__bss_end__; ++dst) {
        *dst = 0U;
    }
    initialise_monitor_handles();
    exit(main());
}

/* Any fault: report through semihosting exit with a failure status. */
void fault_handler(void)
{
    exit(3);
}

typedef void (*vector_t)(void);

__attribute__((section(".vectors"), used))
static const vector_t vectors[16] = {
    (vector_t)(uintptr_t)&__stack_top__, /* initial SP */
    reset_handler,                       /* reset */
    fault_handler,                       /* NMI */
    fault_handler,                       /* HardFault */
    fault_handler,                       /* MemManage */
    fault_handler,                       /* BusFault */
    fault_handler,                       /* UsageFault */
    0, 0, 0, 0,
    fault_handler,                       /* SVCall */
    fault_handler,                       /* DebugMonitor */
    0,
    fault_handler,                       /* PendSV */
    fault_handler,                       /* SysTick */
};
