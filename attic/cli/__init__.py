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
    try:
        app()  # standalone: usage errors print typer's message and exit 2
    except (KeyboardInterrupt, BrokenPipeError):
        sys.exit(130)
    except Exception as e:  # the last line of defence: no traceback for users
        typer.echo(f"atticduct: internal error ({type(e).__name__}: {e}). Please report it with the case file; "
                   "ATTICDUCT_DEBUG=1 shows the details.", err=True)
        sys.exit(EXIT_INTERNAL)


if __name__ == "__main__":
    main()
