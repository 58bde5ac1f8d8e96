"""crossrate command line: `crossrate` alone opens the workbench; subcommands answer in one line over SSH."""

import importlib
import sys

from .. import __version__
from .help_format import CAUTION, CrossrateArgumentParser

#: Subcommand modules, each exposing register(subparsers); imported only when the parser is built.
COMMAND_MODULES = (
    "predict_cmd",
    "screen_cmd",
    "map_cmd",
    "check_cmd",
    "solve_cmd",
    "fit_cmd",
    "lambda_cmd",
    "library_cmd",
    "electrode_cmd",
)


DESCRIPTION = (
    "Predict and check outer-sphere electron-transfer cross rates (Marcus cross relation with work terms "
    "and the diffusion limit) from a layered library of redox couples. Run without a command to open the "
    "terminal workbench."
)


def _command_of(argv: list[str]) -> str | None:
    """The subcommand module named by argv (e.g. "predict_cmd"), None when there is none or it is unknown.

    Only the named command's module is imported then: importing all of them (with their help texts)
    costs a cold `crossrate predict` about 10 ms for nothing. The root options before the command are
    --debug, --version, -h/--help and --library PATH (which takes a value).
    """
    skip = False
    for arg in argv:
        if skip:
            skip = False
            continue
        if arg == "--library":
            skip = True
            continue
        if arg.startswith("-"):
            continue
        module = f"{arg}_cmd"
        return module if module in COMMAND_MODULES else None
    return None


def build_parser(only: str | None = None) -> CrossrateArgumentParser:
    """The root parser with every subcommand, or with the one of module `only` (see _command_of)."""
    parser = CrossrateArgumentParser(
        prog="crossrate",
        description=DESCRIPTION,
        epilog=CAUTION,
    )
    parser.add_argument("--version", action="version", version=f"crossrate {__version__}")
    parser.add_argument("--debug", action="store_true", help="show a traceback on errors")
    parser.add_argument(
        "--library",
        action="append",
        default=[],
        dest="root_library",
        metavar="PATH",
        help="extra library file on top of the layered set (repeatable); before or after the command",
    )
    from .common_options import add_layer_options

    add_layer_options(parser, dest_prefix="root_")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    for name in (only,) if only else COMMAND_MODULES:
        try:
            module = importlib.import_module(f".{name}", __package__)
        except ModuleNotFoundError as exc:
            if exc.name != f"{__package__}.{name}":
                raise
            continue
        module.register(sub)
    return parser


def os_error_text(exc) -> str:
    """`path: reason` for an OSError (no errno numbers), str(exc) for anything else."""
    filename = getattr(exc, "filename", None)
    reason = getattr(exc, "strerror", None)
    if filename and reason:
        return f"{filename}: {reason.lower()}"
    return str(exc)


def demo_hint(exc, args) -> str:
    """'; hl-med2 is a couple of the invented demo library: add --demo' when an unknown couple is one of the
    demo's and the demo was not loaded (the README's examples all use --demo)."""
    import re

    if getattr(args, "demo", False) or getattr(args, "root_demo", False):
        return ""
    unknown = re.findall(r"unknown couple '([^']+)'", str(exc))
    if not unknown:
        return ""
    from ..errors import CrossrateError
    from ..library.layers import DEMO_FILE, bundled_dir
    from ..library.toml_reader import read_library_file

    try:
        demo_ids = {c.id for c in read_library_file(bundled_dir() / DEMO_FILE, "demo").couples}
    except (CrossrateError, OSError):
        return ""
    named = sorted(set(unknown) & demo_ids)
    if not named:
        return ""
    if len(named) > 2:
        return f"; {named[0]} and {len(named) - 1} more are couples of the invented demo library: add --demo"
    return f"; {' and '.join(named)} {'is a couple' if len(named) == 1 else 'are couples'} of the invented demo " \
           "library: add --demo"


def _run_tui(args) -> int:
    from ..tui.app import run_app
    from .common_options import layer_choice

    return run_app(library_paths=args.root_library, layers=layer_choice(args))


def main(argv: list[str] | None = None) -> int:
    """Entry point of the `crossrate` console script. Returns the process exit code."""
    argv = list(sys.argv[1:] if argv is None else argv)
    parser = build_parser(_command_of(argv))
    args = parser.parse_args(argv)
    if args.command is None:  # the workbench owns the terminal; it escapes library text itself
        return _run_command(args)
    from .terminal_output import guard_terminal_streams

    restore = guard_terminal_streams()
    try:
        return _run_command(args)
    finally:
        restore()


def _run_command(args) -> int:
    from ..errors import CrossrateError, printable

    try:
        if args.command is None:
            return _run_tui(args)
        return int(args.func(args) or 0)
    except CrossrateError as exc:
        if args.debug:
            raise
        print(f"crossrate: {printable(str(exc))}{demo_hint(exc, args)}", file=sys.stderr)
        return 2
    except BrokenPipeError:
        # The reader went away (`| head`): not an error of the user's input. Point stdout at devnull so the
        # interpreter's final flush does not complain again.
        import os

        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return 0
    except (OSError, UnicodeDecodeError) as exc:
        if args.debug:
            raise
        print(f"crossrate: {printable(os_error_text(exc))}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        return 130


if __name__ == "__main__":
    sys.exit(main())
