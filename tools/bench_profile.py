"""Where the reference spends its time in lines 1, 2 and 5 of ``airdata bench``.

Run ``python tools/bench_profile.py [N]`` (default N = 1e6).  It times the stages of
``pressure_altitude``, of the supersonic ``mach_from_impact_pressure`` and of the
``air_data`` chain on the benchmark's own seeded inputs (best of 7, perf_counter), and
times candidate rewrites of the hot spots.  Every candidate is checked to give results
bitwise equal to the shipped reference on the same inputs before it is timed, so a
speed-up shown here costs no accuracy.  Nothing in the library is changed: candidates
are local functions, and the chain is measured with them swapped in for the duration
of one call only.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import sys
import time
from collections.abc import Callable, Iterator
from contextlib import contextmanager

import numpy as np
from numpy.typing import NDArray

import airdata
import airdata.altimetry as alt
import airdata.chain as chn
import airdata.pitot as pit
from airdata import _domains as dom
from airdata import bench
from airdata._inputs import Inputs
from airdata._layers import layer_table
from airdata.profiles import get_profile

F64 = NDArray[np.float64]
T = layer_table(get_profile(None))


def best_ms(f: Callable[[], object], repeats: int = 7) -> float:
    """Best of ``repeats`` timed calls after one warm-up, milliseconds."""
    f()
    out = float("inf")
    for _ in range(repeats):
        t0 = time.perf_counter()
        f()
        out = min(out, time.perf_counter() - t0)
    return 1e3 * out


def layer_by_comparisons(x: F64, base: F64) -> NDArray[np.intp]:
    """Same index as ``altimetry.layer_of_ratio``: count of bases above layer 0 >= x.

    Counted in uint8 (a bool adds to it without a cast), widened once at the end.
    """
    i = (x <= base[1]).view(np.uint8)
    for b in base[2:]:
        i = i + (x <= b).view(np.uint8)
    return i.astype(np.intp)


def altitude_of_pressure_candidate(p: F64) -> F64:
    """``altimetry.altitude_of_pressure`` with the layer found by comparisons."""
    i = layer_by_comparisons(p, T.pb)
    lr = np.log(p / T.pb.take(i))
    grad = T.gradient.take(i)
    m = np.where(grad, T.m.take(i), 1.0)
    return T.hb.take(i) + np.where(grad, np.expm1(T.n.take(i) * lr) / m, T.sh.take(i) * lr)


def mach_from_ratio_candidate(x: F64) -> F64:
    """``pitot.mach_from_ratio`` running the solver on the supersonic elements only."""
    sub = np.sqrt(5.0 * np.expm1(np.log1p(x) / 3.5))
    sup = x > pit.RATIO_SONIC
    if sup.any():
        sub[sup] = np.sqrt(pit.supersonic_mach_squared(1.0 + x[sup]))
    return sub


def in_chunks(f: Callable[..., F64], *arrays: F64, size: int = 1 << 15) -> F64:
    """``f`` applied block by block (temporaries stay in cache), concatenated."""
    n = arrays[0].size
    return np.concatenate([f(*[a[k:k + size] for a in arrays]) for k in range(0, n, size)])


@contextmanager
def swapped(module: object, name: str, value: object) -> Iterator[None]:
    """Temporarily replace ``module.name`` (measurement only)."""
    old = getattr(module, name)
    setattr(module, name, value)
    try:
        yield
    finally:
        setattr(module, name, old)


def same(a: object, b: object) -> bool:
    return bool(np.array_equal(np.asarray(a), np.asarray(b)))


def report(title: str, rows: list[tuple[str, float]], floor: float) -> None:
    print(f"\n{title}")
    for name, ms in rows:
        print(f"  {name:<58s} {ms:8.2f} ms  {ms / floor:6.1f} x floor")


def main(n: int) -> None:
    rng = np.random.default_rng([bench.SEED, 1])
    p = bench._pressures(rng, n)
    qc, ps = bench._supersonic(rng, n)
    cps, cpt, ctat = bench.chain_inputs(np.random.default_rng([bench.SEED, 5]), n)
    floor = best_ms(lambda: np.exp(np.log(p)))
    print(f"n = {n:,}; floor np.exp(np.log(p)) = {floor:.2f} ms")

    # Line 1 ------------------------------------------------------------------
    i = alt.layer_of_ratio(p, T.pb)
    lr = np.log(p / T.pb[i])
    assert same(altitude_of_pressure_candidate(p), alt.altitude_of_pressure(p, T))
    assert same(layer_by_comparisons(p, T.pb), i)
    report("line 1: pressure_altitude", [
        ("whole public function", best_ms(lambda: airdata.pressure_altitude(p))),
        ("input checks: Inputs(...) (classify + own copy)",
         best_ms(lambda: Inputs(True, ps=(p, dom.pressure(get_profile(None)))))),
        ("layer lookup: searchsorted on the negated bases",
         best_ms(lambda: alt.layer_of_ratio(p, T.pb))),
        ("6 table gathers t.x[i]", best_ms(lambda: (T.pb[i], T.gradient[i], T.m[i], T.n[i],
                                                     T.sh[i], T.hb[i]))),
        ("log(p / pb)", best_ms(lambda: np.log(p / T.pb[i]))),
        ("expm1(n lr)", best_ms(lambda: np.expm1(T.n[i] * lr))),
        ("candidate: layer by 6 comparisons (bitwise same index)",
         best_ms(lambda: layer_by_comparisons(p, T.pb))),
        ("candidate kernel: comparisons + take (bitwise same)",
         best_ms(lambda: altitude_of_pressure_candidate(p))),
        ("shipped kernel altitude_of_pressure", best_ms(lambda: alt.altitude_of_pressure(p, T))),
    ], floor)

    # Line 2 ------------------------------------------------------------------
    r = 1.0 + qc / ps
    rows = [("whole public function", best_ms(lambda: airdata.mach_from_impact_pressure(qc, ps)))]
    assert same(in_chunks(airdata.mach_from_impact_pressure, qc, ps),
                airdata.mach_from_impact_pressure(qc, ps))
    rows.append(("same, in blocks of 32768 (bitwise same)",
                 best_ms(lambda: in_chunks(airdata.mach_from_impact_pressure, qc, ps))))
    for steps in range(1, pit.NEWTON_STEPS + 1):
        with swapped(pit, "NEWTON_STEPS", steps):
            rows.append((f"solver supersonic_mach_squared, {steps} Newton steps",
                         best_ms(lambda: pit.supersonic_mach_squared(r))))
    report("line 2: supersonic mach_from_impact_pressure", rows, floor)

    # Line 5 ------------------------------------------------------------------
    ref = airdata.air_data(cps, cpt, ctat)
    fields = ("pressure_altitude", "mach", "cas", "eas", "tas", "sat", "density",
              "density_altitude", "dynamic_pressure")
    rows = [("reference air_data", best_ms(lambda: airdata.air_data(cps, cpt, ctat)))]
    with swapped(chn, "mach_from_ratio", mach_from_ratio_candidate):
        new = airdata.air_data(cps, cpt, ctat)
        assert all(same(getattr(new, f), getattr(ref, f)) for f in fields)
        rows.append(("candidate: solver on supersonic elements only (bitwise same)",
                     best_ms(lambda: airdata.air_data(cps, cpt, ctat))))
        with swapped(alt, "layer_of_ratio", layer_by_comparisons):
            new = airdata.air_data(cps, cpt, ctat)
            assert all(same(getattr(new, f), getattr(ref, f)) for f in fields)
            rows.append(("  + layer lookup by comparisons (bitwise same)",
                         best_ms(lambda: airdata.air_data(cps, cpt, ctat))))
    try:
        from airdata import cport

        mod = cport._module("double")
    except Exception as exc:  # noqa: BLE001 - the port is optional here
        print(f"C port not measured: {exc}")
    else:
        out = np.empty((n, 11))
        st = np.zeros(n, np.uint8)
        one = np.ones(n)

        def raw() -> None:
            fb = mod.ffi.from_buffer
            mod.lib.ad_air_data_n(fb("ad_real[]", cps), fb("ad_real[]", cpt),
                                  fb("ad_real[]", ctat), fb("ad_real[]", one), mod.ffi.NULL,
                                  0, 100.0, fb("ad_air_data_t[]", out),
                                  fb("unsigned char[]", st), n)

        rows.append(("C port through cport.air_data",
                     best_ms(lambda: cport.air_data(cps, cpt, ctat))))
        rows.append(("C port, the batch call ad_air_data_n alone", best_ms(raw)))
    print(f"\n(chain inputs: {np.mean(ref.mach > 1.0):.0%} supersonic)")
    report("line 5: the air_data chain", rows, floor)


if __name__ == "__main__":
    main(int(float(sys.argv[1])) if len(sys.argv) > 1 else 1_000_000)
