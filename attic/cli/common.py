"""The typer app, the shared options and the helpers every command uses. Heavy libraries are imported inside
the commands, so --help is quick.

One vocabulary: every command that computes takes the same -f/--format, -o/--output, -u/--units, -n/--variant,
-c/--condition and -p/--plot options, declared once here. Every output path is checked before any work."""

from __future__ import annotations

import json
import os
import sys
from enum import StrEnum
from pathlib import Path

import typer

EXIT_OK = 0
EXIT_FAILED = 1  # ran, and a check (--strict) or a target (pick) failed
EXIT_INPUT = 2  # the input is wrong: case file, option, weather file, output path
EXIT_SOLVE = 3  # a heat balance did not close
EXIT_INTERNAL = 4  # a bug: please report it

EXIT_CODES = (
    (EXIT_OK, "done"),
    (EXIT_FAILED, "ran, and a check (check --strict) or a target (pick) failed"),
    (EXIT_INPUT, "the input is wrong: case file, option, weather file or output path (one line names the field, "
                 "the value and what is allowed; found before any work where it can be)"),
    (EXIT_SOLVE, "a heat balance did not close (the message names the node and its residual; that condition of "
                 "that variant prints no numbers)"),
    (EXIT_INTERNAL, "internal error, a bug (please report it with the case file; ATTICDUCT_DEBUG=1 shows the "
                    "details)"),
)

CAUTION_EPILOG = ("Design loads need a full load calculation by a qualified person; unvented attics, spray foam and "
                  "combustion appliances have code requirements; local codes and licensed practice govern.")

app = typer.Typer(
    add_completion=False, rich_markup_mode="rich", pretty_exceptions_enable=False,
    help=("Predict how hot an attic gets, what the ducts in it gain, and what that adds to the cooling and "
          "heating load, for one house and its candidate attic configurations.\n\n"
          "Start with [bold]atticduct demo[/bold], then [bold]atticduct new my-house.toml[/bold] and edit it. "
          "Keys and units: [bold]atticduct keys[/bold]. To decide: [bold]compare[/bold], [bold]sweep[/bold], "
          "[bold]pick[/bold], [bold]report[/bold]; hour by hour: [bold]day[/bold], [bold]year[/bold].\n\n"
          "Every command that computes takes -f/--format table|json|csv, -o/--output FILE, -u/--units ip|si "
          "and, where it draws, -p/--plot FILE (exactly that file).\n\n"
          "Exit codes: " + "; ".join(f"{c} {w}" for c, w in EXIT_CODES) + "."),
    epilog=CAUTION_EPILOG,
)


def _flags_take_no_value():
    """typer 0.29 shows on/off flags as `<bool>`, as if they took a value; show nothing for them."""
    from typer.core import TyperOption

    shown = getattr(TyperOption, "display_type_rich", None)
    if shown is None or getattr(shown, "_atticduct", False):
        return

    def display_type_rich(self, ctx):
        return "" if getattr(self, "is_flag", False) else shown(self, ctx)

    display_type_rich._atticduct = True
    TyperOption.display_type_rich = display_type_rich


_flags_take_no_value()


def _version():
    from importlib.metadata import PackageNotFoundError, version

    try:
        return version("atticduct")
    except PackageNotFoundError:
        return "unknown (not installed)"


@app.callback(invoke_without_command=True)
def _top(ctx: typer.Context,
         show_version: bool = typer.Option(False, "--version", is_eager=True, help="Print the version and exit.")):
    if show_version:
        typer.echo(f"atticduct {_version()}")
        raise typer.Exit(EXIT_OK)
    if ctx.invoked_subcommand is None:
        typer.echo(ctx.get_help())
        raise typer.Exit(EXIT_OK)


def help_text(doc):
    """A docstring as help: paragraphs joined into lines (the terminal wraps them), rich markup escaped."""
    from inspect import cleandoc

    from rich.markup import escape

    paras = [" ".join(p.split()) for p in cleandoc(doc or "").split("\n\n")]
    return escape("\n\n".join(p for p in paras if p))


def command(name=None):
    """app.command with the docstring reflowed and escaped (so `[[variant]]` shows as written)."""

    def register(f):
        return app.command(name, help=help_text(f.__doc__))(f)

    return register


# ---- the shared options ------------------------------------------------------------------------------

class Fmt(StrEnum):
    table = "table"
    json = "json"
    csv = "csv"


class UnitSystem(StrEnum):
    ip = "ip"
    si = "si"


class Condition(StrEnum):
    cooling = "cooling"
    heating = "heating"


def format_option(what="table for reading, json for programs, csv for spreadsheets."):
    # no default value, so that a format typed out can be told from none: -o x.csv alone writes CSV, while
    # -f table -o x.csv writes the table, as asked
    return typer.Option(None, "--format", "-f", help=what + " Default: table, or csv or json where the -o "
                        "file's name ends so.", show_default=False)


def output_option(what="Write the output to this file instead of the screen, in the chosen --format (a .csv or "
                       ".json name gives that format when no --format is given). Checked before any work; "
                       "never a .toml file."):
    return typer.Option(None, "--output", "-o", help=what)


def units_option():
    return typer.Option(UnitSystem.ip, "--units", "-u", help="ip (°F, Btu/h, CFM, ft²) or si (°C, W, L/s, m²).")


def variant_option(what="Only this variant, by name (\"base\" for the case itself)."):
    return typer.Option(None, "--variant", "-n", help=what)


def condition_option(what="Which design condition: cooling or heating."):
    return typer.Option(Condition.cooling, "--condition", "-c", help=what)


def plot_option(what):
    return typer.Option(None, "--plot", "-p", help=what + " Writes exactly this file (.png or .svg).")


# ---- failing early and in words ----------------------------------------------------------------------

def _fail(message, code=EXIT_INPUT):
    typer.echo(f"atticduct: {message}", err=True)
    raise typer.Exit(code)


def _check_case_path(path):
    """A case path that is missing, a folder or not UTF-8 text: one line in words, exit 2."""
    p = Path(path)
    if not p.exists():
        _fail(f"no case file at {p}")
    if p.is_dir():
        _fail(f"{p} is a folder; give the case file (a .toml file) inside it")
    try:
        data = p.read_bytes()
    except OSError as e:
        _fail(f"cannot read the case file {p}: {e.strerror or e}")
    try:
        data.decode("utf-8")
    except UnicodeDecodeError as e:
        _fail(f"{p} is not UTF-8 text (byte {e.start}); a case file is TOML text saved as UTF-8")


def _check_output_path(path, protect=(), suffixes=None, option="--output"):
    """Fail in words, before any work, when `path` cannot or must not be written (exit 2)."""
    if path is None:
        return
    p = Path(path)
    for q in protect:  # the files the command reads: a path (the case file) or (path, what it is)
        q, what = q if isinstance(q, tuple) else (q, "case file")
        if q is not None and p.resolve() == Path(q).resolve():
            _fail(f"{option} {p}: refusing to write over the {what} {q}, which this command reads")
    if p.suffix.lower() == ".toml":
        _fail(f"{option} {p}: refusing to write output to a .toml file (those are case files)")
    if suffixes and p.suffix.lower() not in suffixes:
        _fail(f"{option} {p}: the file name must end in {' or '.join(suffixes)}")
    if p.suffix.lower() in SPREADSHEET_SUFFIXES:
        _fail(f"{option} {p}: atticduct writes text, not a workbook; give a .csv name (every spreadsheet opens it)")
    if p.is_dir():
        _fail(f"{option} {p}: that is a folder; give a file name")
    parent = p.parent if str(p.parent) else Path(".")
    if not parent.exists():
        _fail(f"{option} {p}: the folder {parent} does not exist")
    if not parent.is_dir():
        _fail(f"{option} {p}: {parent} is not a folder")
    if not os.access(parent, os.W_OK | os.X_OK):
        _fail(f"{option} {p}: cannot write in the folder {parent}")
    if p.exists() and not os.access(p, os.W_OK):
        _fail(f"{option} {p}: the file exists and cannot be written")
    if not _special(p):
        _probe_folder(parent, f"{option} {p}")


def _probe_folder(folder, what):
    """Create and remove a file in folder: permissions alone do not tell a read-only file system (or, for the
    superuser, a folder the kernel will not let anyone write), and the work should not run before that is known."""
    import tempfile

    try:
        with tempfile.NamedTemporaryFile(dir=folder, prefix=".atticduct-probe-"):
            pass
    except OSError as e:
        _fail(f"{what}: cannot write in the folder {folder} ({e.strerror or e})")


PLOT_SUFFIXES = (".png", ".svg")
SPREADSHEET_SUFFIXES = (".xlsx", ".xlsm", ".xls", ".ods")  # binary workbooks: text written there would not open


def _load(path, variant=None):
    from attic.case.load import CaseError, load_cases

    _check_case_path(path)
    try:
        return load_cases(path, only=variant)
    except CaseError as e:
        _fail(str(e), EXIT_INPUT)


# ---- text for spreadsheets ------------------------------------------------------------------------

def _rows_csv(rows):
    """CSV text of a list of dicts; the columns are every key met, in the order first met."""
    import csv
    import io

    cols = []
    for r in rows:
        cols += [k for k in r if k not in cols]
    buf = io.StringIO()
    w = csv.DictWriter(buf, fieldnames=cols, lineterminator="\n")
    w.writeheader()
    w.writerows(rows)
    return buf.getvalue()


# ---- writing -----------------------------------------------------------------------------------------

def _write_atomic(path: Path, text: str, protect=()):
    """Write text to path through a temporary file in the same folder; never over a case file."""
    from attic.present.files import atomic_path

    _check_output_path(path, protect)
    try:
        if _special(path):
            with open(path, "w", encoding="utf-8", newline="") as f:
                f.write(text)
            return
        with atomic_path(path) as tmp, open(tmp, "w", encoding="utf-8", newline="") as f:
            f.write(text)
    except OSError as e:  # a disk that filled, a folder removed meanwhile: said in a line, nothing half-written
        _fail(f"{path}: could not be written ({e.strerror or e})", EXIT_INPUT)


def _special(path):
    """A device or pipe (/dev/null, /dev/stdout, a FIFO): written in place, never renamed over."""
    p = Path(path)
    return p.exists() and not p.is_file()


def _deliver(text, output, protect=()):
    """Text to the file given (atomically) or to the screen."""
    if not text.endswith("\n"):
        text += "\n"
    if output:
        _write_atomic(output, text, protect)
        typer.echo(f"wrote {output}", err=True)
    else:
        sys.stdout.write(text)


def _caution_line():
    """The caution every output of loads ends with (attic.present.contract.CAUTION), dimmed on the screen."""
    from attic.present.contract import CAUTION

    return f"[dim]{CAUTION}[/dim]"


def _show(renderables, output, protect=()):
    """Rich tables and lines to the screen, or as plain text to the file given."""
    from rich.console import Console

    if output:
        import io

        buf = io.StringIO()
        con = Console(file=buf, width=120, color_system=None, force_terminal=False, legacy_windows=False)
        for r in renderables:
            con.print(r)
        _deliver(buf.getvalue(), output, protect)
    else:
        con = Console()
        for r in renderables:
            con.print(r)


def _emit_data(fmt, data_json, rows_csv, renderables, output, protect=()):
    """The one place a computing command's output goes: json, csv or the table, to the screen or a file (whose
    .csv or .json name chooses that format when none is given)."""
    suffix = Path(output).suffix.lower() if output is not None else ""
    named = {".csv": Fmt.csv, ".json": Fmt.json}.get(suffix)
    if fmt is None:
        fmt = named or Fmt.table
    elif named is not None and named != fmt:  # the user asked for both: -f wins, and says so
        typer.echo(f"note: -f {fmt.value} writes {fmt.value.upper() if fmt != Fmt.table else 'a table'} to "
                   f"{output}, whose name ends in {suffix}", err=True)
    if fmt == Fmt.json:
        _deliver(json.dumps(data_json() if callable(data_json) else data_json, indent=2), output, protect)
    elif fmt == Fmt.csv:
        _deliver(_rows_csv(rows_csv() if callable(rows_csv) else rows_csv), output, protect)
    else:
        _show(renderables() if callable(renderables) else renderables, output, protect)


def _save_figure(fig, path):
    from attic.present.plots import save

    try:
        if _special(path):
            fig.savefig(path, format=Path(path).suffix.lstrip(".").lower() or "png")
        else:
            save(fig, path)
    except OSError as e:
        _fail(f"{path}: could not be written ({e.strerror or e})", EXIT_INPUT)
    typer.echo(f"wrote {path}", err=True)
