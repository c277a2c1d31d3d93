"""Commands for deciding between options: compare, sweep, pick, report."""

from __future__ import annotations

import json
import sys
from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_CASE,
    EXIT_SOLVE,
    Condition,
    Fmt,
    UnitSystem,
    _check_output_path,
    _fail,
    _finish,
    _load,
    _num,
    _rows_csv,
    _solve_all,
    _val,
    _write_atomic,
    app,
)


@app.command()
def compare(
    case: Path = typer.Argument(..., help="The case file; its [[variant]] tables are compared with the base."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Write a stacked-bar chart of the load make-up (.png or "
                                                         ".svg)."),
    plot_condition: Condition = typer.Option(Condition.cooling, "--plot-condition", help="Which condition the "
                                                                                         "chart shows."),
):
    """Every variant beside the base: attic temperature, loads, tons and the difference from the base.

    Says what moving the ducts inside saves when a variant does that. The duct load's split (conduction,
    leakage sensible and latent) is in --format json/csv and in the chart."""
    from attic.runs.study import compare as do_compare

    cases = _load(case)
    results, failures = _solve_all(cases)
    if cases[0].name not in results:
        _fail(failures[0] if failures else "the base case did not solve", EXIT_SOLVE)
    cmp = do_compare([c for c in cases if c.name in results], results)
    u = units.value
    k, wu = (1 / 0.29307107, "Btu/h") if u == "ip" else (1.0, "W")
    if format == Fmt.json:
        typer.echo(json.dumps(cmp.to_dict(), indent=2))
    elif format == Fmt.csv:
        sys.stdout.write(_rows_csv([r.to_dict() for r in cmp.rows]))
    else:
        from rich.console import Console
        from rich.table import Table

        from attic.present.contract import CAUTION
        from attic.units import K_to_C, K_to_F

        con = Console()
        T = (lambda K: float(K_to_F(K))) if u == "ip" else (lambda K: float(K_to_C(K)))
        for kind in ("cooling", "heating"):
            rows = cmp.by_kind(kind)
            if not rows:
                continue
            t = Table(title=f"{cmp.title} — {kind} design condition, loads in {wu}", title_justify="left")
            t.add_column("variant", min_width=16, ratio=1)
            deck = kind == "heating" and any(r.deck_margin_K is not None for r in rows)
            for col in (f"attic {'°F' if u == 'ip' else '°C'}", "ceiling", "ducts", "equipment", "tons", "vs base"):
                t.add_column(col, justify="right", no_wrap=True)
            if deck:
                t.add_column(f"deck margin {'°F' if u == 'ip' else 'K'}", justify="right", no_wrap=True)
            for r in rows:
                cells = [r.case, f"{T(r.attic_air_K):.1f}", f"{r.ceiling_w * k:,.0f}", f"{r.ducts_w * k:,.0f}",
                         f"{r.equipment_w * k:,.0f}", f"{r.tons:.2f}", f"{r.delta_tons:+.2f} t"]
                if deck:
                    m = r.deck_margin_K * (1.8 if u == "ip" else 1.0)
                    cells.append(f"{m:+.1f}{' AT RISK' if m < 0 else ''}")
                t.add_row(*cells)
            con.print(t)
        for name, saved_w, saved_t in cmp.ducts_inside:
            con.print(f"Moving the ducts inside (\"{name}\") saves {saved_w * k:,.0f} {wu}, {saved_t:.2f} tons at the "
                      "cooling design condition.")
        con.print(f"[dim]{CAUTION}[/dim]")
    if plot:
        from attic.present.plots import comparison_chart, save

        _check_output_path(plot, [case])
        save(comparison_chart(cmp, plot_condition.value, u), plot)
        typer.echo(f"wrote {plot}", err=True)
    _finish(failures)



@app.command()
def sweep(
    case: Path = typer.Argument(..., help="The case file (its variants are ignored)."),
    set_: list[str] = typer.Option(..., "--set", "-s", help="PATH=START:STOP:STEP or PATH=V1,V2,... e.g. "
                                   "roof.deck_r=0:40:5 or duct.*.r_value=4.2,6,8,11. Give two for a grid."),
    condition: Condition = typer.Option(Condition.cooling, "--condition", "-c", help="cooling or heating."),
    y: list[str] = typer.Option(None, "--y", help="Output keys to show and plot (default: attic air, duct load, "
                                                   "equipment load, tons). Names as in the CSV header."),
    csv_path: Path = typer.Option(None, "--csv", help="Write every output of every point to this CSV file."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Plot the chosen outputs against the first key (.png/.svg)."),
    jobs: int = typer.Option(1, "--jobs", "-j", min=1, max=64, help="Processes to spread the points over."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
):
    """Run the case across values of one or two keys and tabulate, save and plot the results."""
    from attic.case.load import CaseError, read_toml
    from attic.runs.study import parse_set
    from attic.runs.study import sweep as do_sweep

    try:
        specs = [parse_set(s) for s in set_]
    except CaseError as e:
        _fail(str(e), EXIT_CASE)
    if len(specs) > 2:
        _fail("--set: give one key for a line or two for a grid", EXIT_CASE)
    n = 1
    for _, v in specs:
        n *= len(v)
    from rich.console import Console
    from rich.progress import Progress

    con = Console(stderr=True)
    try:
        raw = read_toml(case)
        if n >= 20:
            with Progress(console=con, transient=True) as prog:
                task = prog.add_task(f"solving {n} points", total=n)
                res = do_sweep(raw, specs, condition.value, units.value, jobs,
                               progress=lambda done, total: prog.update(task, completed=done))
        else:
            res = do_sweep(raw, specs, condition.value, units.value, jobs)
    except CaseError as e:
        if e.source is None:
            e.source = str(case)
        _fail(str(e), EXIT_CASE)
    w = "_btuh" if units == UnitSystem.ip else "_w"
    t_ = "_F" if units == UnitSystem.ip else "_C"
    first = next((o for o in res.outputs if o), None)
    if first is None:
        _fail("no point of the sweep solved: " + (res.errors[0] or ""), EXIT_SOLVE)
    keys = list(y) if y else [k for k in (f"attic.air{t_}", f"ducts.total{w}", f"house.total{w}", "house.tons")
                              if k in first]
    for k in keys:
        if k not in first:
            import difflib

            close = difflib.get_close_matches(k, list(first), n=1)
            _fail(f"--y {k}: no such output key" + (f"; did you mean {close[0]}?" if close else ""), EXIT_CASE)
    from rich.table import Table

    t = Table(title=f"sweep ({condition.value} design condition)", title_justify="left")
    for p in res.params:
        t.add_column(p, justify="right")
    for k in keys:
        t.add_column(k, justify="right")
    for p, o in zip(res.points, res.outputs, strict=True):
        vals = [_num(o[k]) for k in keys] if o else ["did not close"] * len(keys)
        t.add_row(*[_num(p[x]) for x in res.params], *vals)
    Console().print(t)
    if csv_path:
        _check_output_path(csv_path, [case])
        _write_atomic(csv_path, _rows_csv(res.to_rows()), [case])
        typer.echo(f"wrote {csv_path}", err=True)
    if plot:
        from attic.present.plots import save, sweep_chart

        _check_output_path(plot, [case])
        save(sweep_chart(res, keys), plot)
        typer.echo(f"wrote {plot}", err=True)
    bad = [e for e in res.errors if e]
    for e in bad[:5]:
        typer.echo(f"atticduct: {e}", err=True)
    if bad:
        raise typer.Exit(EXIT_SOLVE)


@app.command()
def pick(
    case: Path = typer.Argument(..., help="The case file (its variants are ignored)."),
    vary: str = typer.Option(..., "--vary", help="The key to vary, e.g. duct.*.r_value."),
    among: str = typer.Option(..., "--among", help="Comma-separated values to try, e.g. 4.2,6,8,11."),
    target: str = typer.Option(..., "--target", help='A comparison of output keys, e.g. "ducts.total_btuh <= '
                               '0.10 * house.total_btuh". Grammar: + - * / ( ) and <= >= < >; keys as in the CSV.'),
    condition: Condition = typer.Option(Condition.cooling, "--condition", "-c", help="cooling or heating."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table or json."),
):
    """The smallest of the given values that meets a target, with its margin; exit 1 when none does."""
    from attic.case.load import CaseError, read_toml
    from attic.runs.study import parse_set
    from attic.runs.study import pick as do_pick
    from attic.runs.target import TargetError

    try:
        _, values = parse_set(f"{vary}={among}")
        res = do_pick(read_toml(case), vary, values, target, condition.value)
    except TargetError as e:
        _fail(str(e), EXIT_CASE)
    except CaseError as e:
        if e.source is None:
            e.source = str(case)
        _fail(str(e), EXIT_CASE)
    if format == Fmt.json:
        typer.echo(json.dumps(res.to_dict(), indent=2))
    else:
        lhs, rhs = (s.strip() for s in _split_target(target))
        for v, met, a, b, margin in res.checks:
            typer.echo(f"{vary} = {_val(v)}: {lhs} = {_num(a)}, {rhs} = {_num(b)}: "
                       f"{'meets, margin' if met else 'misses by'} {_num(abs(margin))}")
        if res.chosen is None:
            typer.echo(f"None of these meets {target!r} at the {condition.value} design condition.")
        else:
            shown = _val(res.chosen)
            typer.echo(f"Smallest that meets {target!r}: {vary} = {shown}.")
    if res.chosen is None:
        raise typer.Exit(1)


def _split_target(text):
    import re

    parts = re.split(r"<=|>=|<|>", text, maxsplit=1)
    return parts if len(parts) == 2 else (text, "")


@app.command()
def report(
    case: Path = typer.Argument(..., help="The case file."),
    output: Path = typer.Option(..., "--output", "-o", help="The HTML file to write (never the case file)."),
    samples: int = typer.Option(2000, "--samples", "-n", min=2, max=1_000_000,
                                help="Samples for the uncertainty section, when the case has [uncertainty]."),
    seed: int = typer.Option(20261202, "--seed", help="Seed of the uncertainty section's Latin hypercube."),
    jobs: int = typer.Option(1, "--jobs", "-j", min=1, max=64, help="Processes for the uncertainty section."),
):
    """One self-contained HTML page: inputs, every variant's results, code checks, method, cautions."""
    from attic.codes.rules import check_case
    from attic.present.contract import condition_output
    from attic.present.plots import comparison_chart, svg_text
    from attic.present.report import build_report
    from attic.runs.study import compare as do_compare

    _check_output_path(output, [case])
    cases = _load(case)
    results, failures = _solve_all(cases)
    if cases[0].name not in results:
        _fail(failures[0] if failures else "the base case did not solve", EXIT_SOLVE)
    solved = [c for c in cases if c.name in results]
    cmp = do_compare(solved, results)
    outputs = {c.name: [condition_output(r) for r in results[c.name]] for c in solved}
    checks = {c.name: check_case(c) for c in solved}
    charts = {f"Load make-up at the {k} design condition": svg_text(comparison_chart(cmp, k))
              for k in ("cooling", "heating") if cmp.by_kind(k)}
    extra = []
    from attic.case.load import CaseError, read_toml

    raw = read_toml(case)
    if "uncertainty" in raw:
        from attic.present.plots import uncertainty_chart
        from attic.present.report import uncertainty_section
        from attic.present.uncertainty import uncertainty_output
        from attic.runs.uncertainty import run_uncertainty

        try:
            res = run_uncertainty(raw, samples, seed, jobs=jobs)
        except CaseError as e:
            if e.source is None:
                e.source = str(case)
            _fail(str(e), EXIT_CASE)
        extra.append(uncertainty_section(uncertainty_output(res, "ip"), svg_text(uncertainty_chart(res, "ip"))))
    html = build_report(Path(case).read_text(encoding="utf-8"), str(case), cmp, outputs, checks, charts, extra)
    _write_atomic(output, html, [case])
    typer.echo(f"wrote {output}")
    _finish(failures)


