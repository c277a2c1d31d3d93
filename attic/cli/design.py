"""Commands at the design conditions: run, demo, new, check, keys."""

from __future__ import annotations

from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_FAILED,
    EXIT_INPUT,
    Fmt,
    UnitSystem,
    _check_output_path,
    _emit_data,
    _fail,
    _load,
    command,
    format_option,
    output_option,
    units_option,
    variant_option,
)
from attic.cli.solving import _emit, _run_outputs, _solve_all


@command()
def run(
    case: Path = typer.Argument(..., help="The case file (TOML)."),
    format: Fmt | None = format_option(),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    variant: str = variant_option(),
):
    """Solve the attic, ducts and house totals at the cooling and heating design conditions.

    Every [[variant]] of the case is run too, unless --variant names one. Exit codes (all of them in atticduct
    --help): 0 done, 2 the input is wrong, 3 a heat balance did not close (a condition that did not solve is left
    out, never guessed).
    """
    _check_output_path(output, [case])
    cases = _load(case, variant)
    results, failures = _run_outputs(cases, units.value)
    _emit(results, failures, format, units, output, protect=[case])


@command()
def demo(
    format: Fmt | None = format_option(),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    variant: str = variant_option(),
):
    """Run the shipped demo case (an invented house in an invented hot-humid place) with all its variants."""
    from importlib.resources import as_file, files

    _check_output_path(output)
    with as_file(files("attic") / "data" / "demo.toml") as p:
        cases = _load(p, variant)
    results, failures = _run_outputs(cases, units.value)
    _emit(results, failures, format, units, output, protect=[])


@command()
def new(path: Path = typer.Argument(..., help="Where to write the starter case (must not exist yet).")):
    """Write a commented starter case file to edit. It never overwrites an existing file."""
    from importlib.resources import files

    if path.suffix.lower() != ".toml":  # case files end in .toml, the one ending no output is ever written to
        stem = path.name.split(".")[0] or "my-house"
        _fail(f"{path}: a case file's name ends in .toml (e.g. {stem}.toml)", EXIT_INPUT)
    if path.exists():
        _fail(f"{path} already exists; choose another name (atticduct never overwrites a case file)", EXIT_INPUT)
    if not (path.parent if str(path.parent) else Path(".")).is_dir():
        _fail(f"{path}: the folder {path.parent} does not exist", EXIT_INPUT)
    text = (files("attic") / "data" / "starter.toml").read_text(encoding="utf-8")
    try:
        with open(path, "x", encoding="utf-8") as f:
            f.write(text)
    except OSError as e:
        _fail(f"cannot write {path}: {e.strerror or e}", EXIT_INPUT)
    typer.echo(f"wrote {path}; edit it, then: atticduct run {path}")


@command()
def check(
    case: Path = typer.Argument(..., help="The case file (TOML)."),
    format: Fmt | None = format_option("table: one short line per rule; json or csv: every field of every rule."),
    output: Path = output_option(),
    variant: str = variant_option(),
    strict: bool = typer.Option(False, "--strict", help="Exit 1 when a code rule or the air-handler rule fails "
                                                        "(default: exit 0). The roof deck's winter line is this "
                                                        "tool's estimate, shown but not counted: the code's "
                                                        "assembly rule governs."),
    verbose: bool = typer.Option(False, "--verbose", help="The full text of every rule: what it asks, the "
                                                          "source, what the case has and what it requires."),
):
    """Check vent areas, the unvented assembly and the ducts against code ratios (IRC, IECC), and whether the
    air handler's airflow carries the design load.

    One short line per rule: the rule, pass / fail / n/a, what the case has against what is required, and for
    a failure what would fix it on the next line. --verbose prints the full text. The areas and R-values are
    in the code's own units (ft², h·ft²·°F/Btu). The adopted edition and local amendments govern.
    """
    from attic.runs.deck import ESTIMATE
    from attic.runs.totals import case_checks

    _check_output_path(output, [case])
    cases = _load(case, variant)
    solved, _ = _solve_all(cases)
    all_results = {c.name: case_checks(c, solved.get(c.name, [])) for c in cases}
    failed = any(r.verdict == "fail" and r.source != ESTIMATE for rs in all_results.values() for r in rs)

    def renderables():
        from attic.codes.rules import DEFER
        from attic.present.checks import check_lines

        out = []
        for name, rs in all_results.items():
            out += check_lines(name, rs, verbose) + [""]
        return out if verbose else out + [f"[dim]{DEFER}[/dim]"]

    _emit_data(format, lambda: {k: [r.to_dict() for r in v] for k, v in all_results.items()},
               lambda: [{"variant": k, **r.to_dict()} for k, v in all_results.items() for r in v],
               renderables, output, [case])
    if strict and failed:
        raise typer.Exit(EXIT_FAILED)


@command()
def keys(markdown: bool = typer.Option(False, "--markdown", help="Markdown tables (as in README) instead of "
                                                                 "the terminal table.")):
    """Every case-file key with its unit, default and what it accepts."""
    from attic.present.keys import keys_markdown, keys_tables

    if markdown:
        typer.echo(keys_markdown())
    else:
        from rich.console import Console

        con = Console()
        for t in keys_tables(con.width):
            con.print(t)
