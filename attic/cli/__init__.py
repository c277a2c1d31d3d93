"""The command line: thin typer commands over the runs and presentation layers.

Each module registers its commands on the one app in ``common``; importing them here is what registers them."""

import sys

import typer

# isort: off
# importing the command modules registers their commands, in the order --help lists them
from attic.cli import deciding, page, design, hours, uncertain  # noqa: F401
# isort: on
from attic.cli.common import EXIT_INTERNAL, app

__all__ = ["app", "main"]


def main():
    """Console entry point. An unexpected error prints one line and exits 4 (ATTICDUCT_DEBUG=1 shows the traceback)."""
    import os

    if os.environ.get("ATTICDUCT_DEBUG"):
        app()
        return
    # typer's usage errors derive from click's ClickException, which typer may carry as a private copy
    usage_error = next(c for c in typer.BadParameter.__mro__ if c.__name__ == "ClickException")
    try:
        code = app(standalone_mode=False)  # so that a usage error comes back here, to be said in one line
    except usage_error as e:  # a wrong option or value: one line, as a wrong case file gets
        ctx = getattr(e, "ctx", None)
        if ctx is not None and type(e).__name__ == "NoArgsIsHelpError":  # bare `atticduct`: the help itself
            typer.echo(ctx.get_help())
            sys.exit(0)
        where = f" (see {' '.join(['atticduct', *_subcommands(ctx)])} --help)" if ctx is not None else ""
        typer.echo(f"atticduct: {e.format_message()}{where}", err=True)
        sys.exit(e.exit_code)
    except (KeyboardInterrupt, BrokenPipeError):
        sys.exit(130)
    except Exception as e:  # the last line of defence: no traceback for users
        if type(e).__name__ == "Abort":  # end of input at a prompt
            sys.exit(1)
        typer.echo(f"atticduct: internal error ({type(e).__name__}: {e}). Please report it with the case file; "
                   "ATTICDUCT_DEBUG=1 shows the details.", err=True)
        sys.exit(EXIT_INTERNAL)
    sys.exit(code if isinstance(code, int) else 0)  # typer.Exit(n) inside a command comes back as n


def _subcommands(ctx):
    """The command names below the program's own, as typed (the program is `atticduct` however it was started)."""
    names = []
    while ctx is not None and ctx.parent is not None:
        names.append(ctx.info_name)
        ctx = ctx.parent
    return names[::-1]


if __name__ == "__main__":
    main()
