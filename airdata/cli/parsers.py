"""How every sub-command's parser is made: one helper, so each command states only its text.

An engineering and verification aid, not certified flight software.
"""

from __future__ import annotations

import argparse
from typing import Any

from ..notice import CAUTION
from .quantities import allow_negative_values, caution
from .texts import COMMAND_TEXT

__all__ = ["add_command", "add_compile_options", "define_type"]


def add_command(subparsers: Any, command: str, *, description: str | None = None,
                epilog: str = CAUTION, desk: bool = False) -> argparse.ArgumentParser:
    """Add the parser of sub-command (or action) ``name`` to ``subparsers``.

    Parameters
    ----------
    subparsers : argparse._SubParsersAction
        Where the parser goes (the ``airdata`` command's, or a command's actions).
    command : str
        The command's words after ``airdata`` (``"vectors build"``); the last one is the
        name of the new parser; its line in the parent's help and its description come
        from :data:`airdata.cli.texts.COMMAND_TEXT`.
    description : str, optional
        The description, where the table leaves it to the command's module (the desk
        commands).
    epilog : str, optional
        Text after the options; default the caution (:data:`airdata.notice.CAUTION`).
    desk : bool, optional
        A desk command (compute, convert, table, reduce): the description is shown as
        written (it holds examples), the caution wrapped at 79 columns, and option values
        may start with a minus sign (``--tat -20degC``).

    Returns
    -------
    argparse.ArgumentParser
        The new parser, to add the options to.
    """
    help, text = COMMAND_TEXT[command]
    name = command.split()[-1]
    if description is None:
        description = text
    if desk:
        p = subparsers.add_parser(name, help=help, description=description, epilog=caution(),
                                  formatter_class=argparse.RawDescriptionHelpFormatter)
        allow_negative_values(p)
        return p
    return subparsers.add_parser(name, help=help, description=description, epilog=epilog)


def define_type(text: str) -> tuple[str, str | None]:
    """``--define NAME[=VALUE]`` as (name, value or None); an argparse type."""
    name, sep, value = text.partition("=")
    if not name.isidentifier():
        raise argparse.ArgumentTypeError(f"--define {text!r}: expected NAME or NAME=VALUE")
    return name, (value if sep else None)


def add_compile_options(parser: argparse._ActionsContainer) -> None:
    """``--include`` and ``--define``: how a user's C port is compiled (``port check``,
    ``port coverage``, ``reduce --compare``)."""
    parser.add_argument("--include", action="append", default=[], metavar="DIR",
                        help="extra include directory (repeatable); the bundled airdata.h "
                             "is searched last")
    parser.add_argument("--define", action="append", default=[], type=define_type,
                        metavar="NAME[=V]", help="preprocessor definition (repeatable)")
