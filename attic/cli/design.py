"""Commands at the design conditions: run, demo, new, check, keys."""

from __future__ import annotations

import json
from pathlib import Path

import typer

from attic.cli.common import EXIT_CASE, Fmt, UnitSystem, _emit, _fail, _load, _run_outputs, app


@app.command()
def run(
    case: Path = typer.Argument(..., help="The case file (TOML)."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table for reading, json for programs, csv for "
                                                                 "spreadsheets."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip (°F, Btu/h, CFM, ft²) or si (°C, W, "
                                                                          "L/s, m²)."),
    variant: str = typer.Option(None, "--variant", "-v", help="Run only this variant (\"base\" for the case "
                                                              "without variants)."),
    output: Path = typer.Option(None, "--output", "-o", help="Write json/csv to this file instead of the screen."),
):
    """Solve the attic, ducts and house totals at the cooling and heating design conditions.

    Every [[variant]] of the case is run too. Exit codes: 0 done, 2 the case file is wrong, 3 a heat balance did
    not close (nothing is printed for that variant).
    """
    cases = _load(case, variant)
    results, failures = _run_outputs(cases, units.value)
    _emit(results, failures, format, units, output, protect=[case])


@app.command()
def demo(
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
):
    """Run the shipped demo case (an invented house on a hot-humid coast) with all its variants."""
    from importlib.resources import as_file, files

    with as_file(files("attic") / "data" / "demo.toml") as p:
        cases = _load(p)
    results, failures = _run_outputs(cases, units.value)
    _emit(results, failures, format, units, None, protect=[])


@app.command()
def new(path: Path = typer.Argument(..., help="Where to write the starter case (must not exist yet).")):
    """Write a commented starter case file to edit. It never overwrites an existing file."""
    from importlib.resources import files

    if path.exists():
        _fail(f"{path} already exists; choose another name (atticduct never overwrites a case file)", EXIT_CASE)
    text = (files("attic") / "data" / "starter.toml").read_text(encoding="utf-8")
    try:
        with open(path, "x", encoding="utf-8") as f:
            f.write(text)
    except OSError as e:
        _fail(f"cannot write {path}: {e}", EXIT_CASE)
    typer.echo(f"wrote {path}; edit it, then: atticduct run {path}")


@app.command()
def check(
    case: Path = typer.Argument(..., help="The case file (TOML)."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table or json."),
    strict: bool = typer.Option(False, "--strict", help="Exit 1 when any rule fails (default: always exit 0)."),
    variant: str = typer.Option(None, "--variant", "-v", help="Check only this variant."),
):
    """Check vent areas, the unvented assembly and the ducts against code ratios (IRC, IECC).

    One line per rule: what it asks, where it comes from, what the case has, pass / fail / n/a, and for a failure
    what would fix it. The adopted edition and local amendments govern.
    """
    from attic.codes.rules import check_case

    cases = _load(case, variant)
    all_results = {c.name: check_case(c) for c in cases}
    failed = any(r.verdict == "fail" for rs in all_results.values() for r in rs)
    if format == Fmt.json:
        typer.echo(json.dumps({k: [r.to_dict() for r in v] for k, v in all_results.items()}, indent=2))
    elif format == Fmt.csv:
        _fail("check prints table or json", EXIT_CASE)
    else:
        from rich.console import Console

        from attic.codes.rules import check_lines

        con = Console()
        for name, rs in all_results.items():
            for line in check_lines(name, rs):
                con.print(line)
            con.print()
    if strict and failed:
        raise typer.Exit(1)



@app.command()
def keys():
    """Print every case-file key with its unit, default and what it accepts (Markdown)."""
    from attic.case.schema import REQUIRED, SECTIONS

    lines = []
    for sec, ks in SECTIONS.items():
        head = {"": "top level", "duct": "[[duct]] (one table per duct run)"}.get(sec, f"[{sec}]")
        lines.append(f"\n**{head}**\n")
        lines.append("| key | unit | default | accepts | meaning |")
        lines.append("|---|---|---|---|---|")
        for k, key in ks.items():
            d = "required" if key.default is REQUIRED else ("—" if key.default is None else f"`{key.default}`")
            lines.append(f"| `{k}` | {key.unit} | {d} | {key.allowed()} | {key.doc} |")
    lines.append("\n**[[variant]]**: `name` (text) and `set`, a table of dotted key paths to new values, e.g. "
                 '`set = { "roof.deck_r" = 20, "duct.*.r_value" = 8 }` (`duct.*` all ducts, `duct.NAME` one).')
    typer.echo("\n".join(lines))


