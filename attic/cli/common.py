"""The typer app, the shared options and the helpers every command uses. Heavy libraries are imported inside
the commands, so --help is quick."""

from __future__ import annotations

import json
import sys
from enum import StrEnum
from pathlib import Path

import typer

app = typer.Typer(
    add_completion=False, no_args_is_help=True, rich_markup_mode="rich", pretty_exceptions_enable=False,
    help=("Predict how hot an attic gets, what the ducts in it gain, and what that adds to the cooling and "
          "heating load, for one house and its candidate attic configurations.\n\n"
          "Start with [bold]atticduct demo[/bold], then [bold]atticduct new my-house.toml[/bold] and edit it. "
          "Keys and units: [bold]atticduct keys[/bold]. To decide: [bold]compare[/bold], [bold]sweep[/bold], "
          "[bold]pick[/bold], [bold]report[/bold]; hour by hour: [bold]day[/bold], [bold]year[/bold]."),
    epilog=("Design loads need a full load calculation by a qualified person; unvented attics, spray foam and "
            "combustion appliances have code requirements; local codes and licensed practice govern."),
)

EXIT_CASE = 2
EXIT_SOLVE = 3


class Fmt(StrEnum):
    table = "table"
    json = "json"
    csv = "csv"


class UnitSystem(StrEnum):
    ip = "ip"
    si = "si"


def _fail(message, code):
    typer.echo(f"atticduct: {message}", err=True)
    raise typer.Exit(code)


def _load(path, variant=None):
    from attic.case.load import CaseError, load_cases

    try:
        return load_cases(path, only=variant)
    except CaseError as e:
        _fail(str(e), EXIT_CASE)


def _num(v):
    """A number for people: thousands with separators, small values with 3 significant digits."""
    if isinstance(v, bool) or not isinstance(v, int | float):
        return str(v)
    if abs(v) >= 1000:
        return f"{v:,.0f}"
    if abs(v) >= 10:
        return f"{v:.1f}"
    return f"{v:.3g}"


def _val(v):
    """A swept or picked value as the user wrote it (6 not 6.0)."""
    return f"{v:g}" if isinstance(v, float) else str(v)


def _write_atomic(path: Path, text: str, protect=()):
    """Write text to path through a temporary file in the same folder; never over a case file."""
    from attic.present.files import atomic_path

    _check_output_path(path, protect)
    with atomic_path(path) as tmp, open(tmp, "w", encoding="utf-8", newline="") as f:
        f.write(text)


def _run_outputs(cases, units):
    from attic.network.solve import SolveError
    from attic.present.contract import condition_output
    from attic.runs.condition import run_case

    results, failures = [], []
    for case in cases:
        try:
            results.append([condition_output(r, units) for r in run_case(case)])
        except SolveError as e:
            failures.append(str(e))
        except ValueError as e:
            failures.append(f'case "{case.name}": {e}')
    return results, failures


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


def _csv_text(results):
    from attic.present.contract import flatten

    return _rows_csv([flatten({k: v for k, v in o.items() if k != "caution"}) for group in results for o in group])


def _finish(failures):
    """Report the variants that did not solve, and exit 3 if there were any."""
    for f in failures:
        typer.echo(f"atticduct: {f}", err=True)
    if failures:
        raise typer.Exit(EXIT_SOLVE)


def _save_each(plot, case, items, make_figure):
    """One figure per result: PLOT itself for one, PLOT-stem-NAME.suffix for several."""
    from attic.present.plots import save

    _check_output_path(plot, [case])
    for item in items:
        p = plot if len(items) == 1 else plot.with_name(f"{plot.stem}-{_slug(item.case)}{plot.suffix}")
        save(make_figure(item), p)
        typer.echo(f"wrote {p}", err=True)


def _emit(results, failures, fmt, units, output, protect):
    from attic.present.contract import CAUTION

    if fmt == Fmt.json:
        text = json.dumps([o for group in results for o in group], indent=2)
    elif fmt == Fmt.csv:
        text = _csv_text(results)
    else:
        text = None
    if text is not None:
        if output:
            _write_atomic(output, text + ("\n" if not text.endswith("\n") else ""), protect)
        else:
            sys.stdout.write(text + ("\n" if not text.endswith("\n") else ""))
    else:
        from rich.console import Console

        from attic.present.tables import case_table, deck_line, vents_line

        con = Console()
        for group in results:
            con.print(case_table(group, units.value))
            con.print(vents_line(group[0]))
            for o in group:
                if deck_line(o):
                    con.print(deck_line(o))
            con.print()
        con.print(f"[dim]{CAUTION}[/dim]")
    _finish(failures)



class Condition(StrEnum):
    cooling = "cooling"
    heating = "heating"


def _solve_all(cases):
    """{name: [ConditionResult]} and failure messages."""
    from attic.network.solve import SolveError
    from attic.runs.condition import run_case

    results, failures = {}, []
    for c in cases:
        try:
            results[c.name] = run_case(c)
        except (SolveError, ValueError) as e:
            failures.append(str(e))
    return results, failures



def _check_output_path(path, protect):
    for p in protect:
        if Path(path).resolve() == Path(p).resolve():
            _fail(f"refusing to write over the case file {p}", EXIT_CASE)
    if Path(path).suffix == ".toml":
        _fail(f"refusing to write output to {path}: .toml files are case files", EXIT_CASE)



def _slug(name):
    import re

    return re.sub(r"[^A-Za-z0-9]+", "-", name).strip("-").lower() or "case"


