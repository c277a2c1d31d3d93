"""The atticduct command line. Heavy libraries are imported inside the commands, so --help is quick."""

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
    from .case import CaseError, load_cases

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
    from .files import atomic_path

    _check_output_path(path, protect)
    with atomic_path(path) as tmp, open(tmp, "w", encoding="utf-8", newline="") as f:
        f.write(text)


def _run_outputs(cases, units):
    from .balance import SolveError
    from .output import condition_output
    from .run import run_case

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
    from .output import flatten

    return _rows_csv([flatten({k: v for k, v in o.items() if k != "caution"}) for group in results for o in group])


def _finish(failures):
    """Report the variants that did not solve, and exit 3 if there were any."""
    for f in failures:
        typer.echo(f"atticduct: {f}", err=True)
    if failures:
        raise typer.Exit(EXIT_SOLVE)


def _save_each(plot, case, items, make_figure):
    """One figure per result: PLOT itself for one, PLOT-stem-NAME.suffix for several."""
    from .plots import save

    _check_output_path(plot, [case])
    for item in items:
        p = plot if len(items) == 1 else plot.with_name(f"{plot.stem}-{_slug(item.case)}{plot.suffix}")
        save(make_figure(item), p)
        typer.echo(f"wrote {p}", err=True)


def _emit(results, failures, fmt, units, output, protect):
    from .output import CAUTION

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

        from .tables import case_table, vents_line

        con = Console()
        for group in results:
            con.print(case_table(group, units.value))
            con.print(vents_line(group[0]))
            con.print()
        con.print(f"[dim]{CAUTION}[/dim]")
    _finish(failures)


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
    from .codes import check_case

    cases = _load(case, variant)
    all_results = {c.name: check_case(c.inputs) for c in cases}
    failed = any(r.verdict == "fail" for rs in all_results.values() for r in rs)
    if format == Fmt.json:
        typer.echo(json.dumps({k: [r.to_dict() for r in v] for k, v in all_results.items()}, indent=2))
    elif format == Fmt.csv:
        _fail("check prints table or json", EXIT_CASE)
    else:
        from rich.console import Console

        from .codes import check_lines

        con = Console()
        for name, rs in all_results.items():
            for line in check_lines(name, rs):
                con.print(line)
            con.print()
    if strict and failed:
        raise typer.Exit(1)


class Condition(StrEnum):
    cooling = "cooling"
    heating = "heating"


def _solve_all(cases):
    """{name: [ConditionResult]} and failure messages."""
    from .balance import SolveError
    from .run import run_case

    results, failures = {}, []
    for c in cases:
        try:
            results[c.name] = run_case(c)
        except (SolveError, ValueError) as e:
            failures.append(str(e))
    return results, failures


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
    from .study import compare as do_compare

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

        from .output import CAUTION
        from .units import K_to_C, K_to_F

        con = Console()
        T = (lambda K: float(K_to_F(K))) if u == "ip" else (lambda K: float(K_to_C(K)))
        for kind in ("cooling", "heating"):
            rows = cmp.by_kind(kind)
            if not rows:
                continue
            t = Table(title=f"{cmp.title} — {kind} design condition, loads in {wu}", title_justify="left")
            t.add_column("variant", min_width=16, ratio=1)
            for col in (f"attic {'°F' if u == 'ip' else '°C'}", "ceiling", "ducts", "equipment", "tons", "vs base"):
                t.add_column(col, justify="right", no_wrap=True)
            for r in rows:
                t.add_row(r.case, f"{T(r.attic_air_K):.1f}", f"{r.ceiling_w * k:,.0f}", f"{r.ducts_w * k:,.0f}",
                          f"{r.equipment_w * k:,.0f}", f"{r.tons:.2f}", f"{r.delta_tons:+.2f} t")
            con.print(t)
        for name, saved_w, saved_t in cmp.ducts_inside:
            con.print(f"Moving the ducts inside (\"{name}\") saves {saved_w * k:,.0f} {wu}, {saved_t:.2f} tons at the "
                      "cooling design condition.")
        con.print(f"[dim]{CAUTION}[/dim]")
    if plot:
        from .plots import comparison_chart, save

        _check_output_path(plot, [case])
        save(comparison_chart(cmp, plot_condition.value, u), plot)
        typer.echo(f"wrote {plot}", err=True)
    _finish(failures)


def _check_output_path(path, protect):
    for p in protect:
        if Path(path).resolve() == Path(p).resolve():
            _fail(f"refusing to write over the case file {p}", EXIT_CASE)
    if Path(path).suffix == ".toml":
        _fail(f"refusing to write output to {path}: .toml files are case files", EXIT_CASE)


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
    from .case import CaseError
    from .study import parse_set
    from .study import sweep as do_sweep

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
        if n >= 20:
            with Progress(console=con, transient=True) as prog:
                task = prog.add_task(f"solving {n} points", total=n)
                res = do_sweep(case, specs, condition.value, units.value, jobs,
                               progress=lambda done, total: prog.update(task, completed=done))
        else:
            res = do_sweep(case, specs, condition.value, units.value, jobs)
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
        from .plots import save, sweep_chart

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
    from .case import CaseError
    from .study import parse_set
    from .study import pick as do_pick
    from .target import TargetError

    try:
        _, values = parse_set(f"{vary}={among}")
        res = do_pick(case, vary, values, target, condition.value)
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
):
    """One self-contained HTML page: inputs, every variant's results, code checks, method, cautions."""
    from .codes import check_case
    from .output import condition_output
    from .plots import comparison_chart, svg_text
    from .report import build_report
    from .study import compare as do_compare

    _check_output_path(output, [case])
    cases = _load(case)
    results, failures = _solve_all(cases)
    if cases[0].name not in results:
        _fail(failures[0] if failures else "the base case did not solve", EXIT_SOLVE)
    solved = [c for c in cases if c.name in results]
    cmp = do_compare(solved, results)
    outputs = {c.name: [condition_output(r) for r in results[c.name]] for c in solved}
    checks = {c.name: check_case(c.inputs) for c in solved}
    charts = {f"Load make-up at the {k} design condition": svg_text(comparison_chart(cmp, k))
              for k in ("cooling", "heating") if cmp.by_kind(k)}
    html = build_report(Path(case).read_text(encoding="utf-8"), str(case), cmp, outputs, checks, charts)
    _write_atomic(output, html, [case])
    typer.echo(f"wrote {output}")
    _finish(failures)


@app.command()
def day(
    case: Path = typer.Argument(..., help="The case file (every variant is run)."),
    variant: str = typer.Option(None, "--variant", "-v", help="Run only this variant."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Plot temperatures and loads through the day (.png/.svg); "
                                                         "with several variants, one file each (name-variant.png)."),
    mass: bool = typer.Option(False, "--mass", help="Include the heat capacity of the roof covering and sheathing "
                                                    "(a repeating day); by default each hour is quasi-steady."),
):
    """The 24 hours of the cooling design day, hour by hour, with the peak hour.

    The design dry bulb with ASHRAE's daily-range profile (cooling.daily_range_F) and clear-sky sun on each
    roof plane. Each hour is quasi-steady unless --mass."""
    from .balance import SolveError
    from .design_day import run_design_day

    cases = _load(case, variant)
    days, failures = [], []
    for c in cases:
        try:
            days.append(run_design_day(c, mass=mass))
        except SolveError as e:
            failures.append(str(e))
    u = units.value
    if format == Fmt.json:
        typer.echo(json.dumps([d.to_dict(u) for d in days], indent=2))
    elif format == Fmt.csv:
        sys.stdout.write(_rows_csv([{"case": d.case, **r} for d in days for r in d.to_dict(u)["hours"]]))
    else:
        from rich.console import Console
        from rich.table import Table

        con = Console()
        t_, w_ = ("_F", "_btuh") if u == "ip" else ("_C", "_w")
        for d in days:
            dd = d.to_dict(u)
            unit = "Btu/h" if u == "ip" else "W"
            t = Table(title=f"{d.title} — {d.case}: cooling design day (solar time; loads in {unit}, ducts with "
                            "the air handler running)", title_justify="left")
            for col in ("hour", "outdoor", "attic air", "deck 1", "deck 2", "ceiling", "ducts"):
                t.add_column(col, justify="right")
            for r in dd["hours"]:
                style = "bold" if r["hour"] == d.peak_hour else None
                t.add_row(str(r["hour"]), f"{r['outdoor' + t_]:.1f}", f"{r['attic_air' + t_]:.1f}",
                          f"{r['plane1_inner' + t_]:.1f}", f"{r['plane2_inner' + t_]:.1f}", f"{r['ceiling' + w_]:,.0f}",
                          f"{r['ducts' + w_]:,.0f}", style=style)
            con.print(t)
            how = ("With the roof's heat capacity (covering and sheathing)." if d.mass else
                   "Quasi-steady: a real roof's heat capacity delays and trims the peak (try --mass).")
            con.print(f"Peak ceiling + duct load at hour {d.peak_hour}; hottest attic at hour {d.peak_attic_hour} "
                      f"(solar time). {how}")
    if plot:
        from .plots import design_day_chart

        _save_each(plot, case, days, lambda d: design_day_chart(d, u))
    _finish(failures)


class Runtime(StrEnum):
    load = "load"
    full = "full"


@app.command()
def year(
    case: Path = typer.Argument(..., help="The case file (every variant is run). Needs site.longitude_deg and "
                                          "site.utc_offset_h."),
    weather: Path = typer.Option(..., "--weather", "-w", help="Hourly weather CSV; columns: timestamp, "
                                 "drybulb_F|drybulb_C, dewpoint_F|dewpoint_C|rh|rh_pct, ghi_w_m2|ghi_btuh_ft2, "
                                 "wind_mph|wind_m_s, optional dni_w_m2 and dhi_w_m2."),
    above: str = typer.Option("100,120,140", "--above", help="Count the hours the attic air is above these "
                                                             "temperatures (°F, or °C with --units si)."),
    seer: float = typer.Option(None, "--seer", min=1, max=60, help="Cooling efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    hspf: float = typer.Option(None, "--hspf", min=1, max=30, help="Heating efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    runtime: Runtime = typer.Option(Runtime.load, "--runtime", help="load: the air handler runs as much of each "
                                    "hour as the load needs; full: all of every cooling or heating hour."),
    variant: str = typer.Option(None, "--variant", "-v", help="Run only this variant."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv (csv: one row an hour)."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Heat map of attic temperature by day and hour (.png/.svg); "
                                                         "with several variants, one file each."),
):
    """A year (or any span) of weather: hours above attic temperatures and the ceiling and duct energy.

    Energy at the coil in Btu and kWh, for cooling and heating, per variant. Cooling hours are those at or above
    65 °F outdoors, heating hours at or below 60 °F. The base load of each hour follows a straight line from
    zero at those temperatures to the design load at the design condition (the bin method's load line). Each
    hour is quasi-steady."""
    from rich.console import Console

    from .annual import run_year
    from .balance import SolveError
    from .case import CaseError
    from .units import F_to_K
    from .weather import WeatherError, read_weather

    cases = _load(case, variant)
    try:
        w = read_weather(weather)
    except WeatherError as e:
        _fail(str(e), EXIT_CASE)
    u = units.value
    try:
        limits = [float(x) for x in above.split(",") if x.strip()]
    except ValueError:
        _fail(f"--above {above!r}: give temperatures separated by commas, e.g. 100,120,140", EXIT_CASE)
    to_K = (lambda t: float(F_to_K(t))) if u == "ip" else (lambda t: t + 273.15)
    con = Console(stderr=True)
    years, failures = [], []
    from rich.progress import Progress

    with Progress(console=con, transient=True) as prog:
        task = prog.add_task(f"solving {w.n} hours", total=len(cases))
        for c in cases:
            try:
                years.append(run_year(c, w, [to_K(t) for t in limits], runtime.value))
            except CaseError as e:
                e.source = e.source or str(case)
                _fail(str(e), EXIT_CASE)
            except SolveError as e:
                failures.append(str(e))
            prog.advance(task)
    if format == Fmt.json:
        typer.echo(json.dumps([y.to_dict(u, seer, hspf) for y in years], indent=2))
    elif format == Fmt.csv:
        import csv
        import io

        from .units import BTUH, K_to_C, K_to_F

        buf = io.StringIO()
        wr = csv.writer(buf, lineterminator="\n")
        k, wu = (1 / BTUH, "btuh") if u == "ip" else (1.0, "w")
        tk = "F" if u == "ip" else "C"
        parts = ("base", "ceiling", "attic_air", "duct_conduction", "duct_leakage_sensible", "duct_leakage_latent",
                 "ducts", "coil")
        wr.writerow(["case", "timestamp", f"attic_air_{tk}", "mode", "runtime"] + [f"{p}_{wu}" for p in parts])
        for y in years:
            T = K_to_F(y.hourly["attic_air_K"]) if u == "ip" else K_to_C(y.hourly["attic_air_K"])
            for i, t in enumerate(y.times):
                m = {1: "cooling", -1: "heating", 0: "off"}[int(y.hourly["mode"][i])]
                wr.writerow([y.case, f"{t:%Y-%m-%d %H:%M}", f"{T[i]:.2f}", m, f"{y.hourly['runtime'][i]:.3f}"]
                            + [f"{y.hourly[p + '_w'][i] * k:.1f}" for p in parts])
        sys.stdout.write(buf.getvalue())
    else:
        from rich.table import Table

        out = Console()
        for y in years:
            d = y.to_dict(u, seer, hspf)
            out.print(f"[bold]{y.title} — {y.case}[/bold]: {d['hours']} hours, {d['start']} to {d['end']}")
            tk = "_F" if u == "ip" else "_C"
            hot = ", ".join(f"{h} h above {k.replace(tk, '')}{'°F' if u == 'ip' else '°C'}"
                            for k, h in d["hours_above"].items())
            out.print(f"Attic air: hottest {d['attic_air_max' + tk]:.1f}{'°F' if u == 'ip' else '°C'}; {hot}.")
            t = Table(title="energy at the coil over the span", title_justify="left")
            t.add_column("")
            for mode in ("cooling", "heating"):
                t.add_column(f"{mode} ({d[mode]['hours']} h)", justify="right")
            rows = [("base load (load line)", "base"), ("ceiling", "ceiling"), ("air from the attic", "attic_air"),
                    ("duct conduction", "duct_conduction"), ("duct leakage, sensible", "duct_leakage_sensible"),
                    ("duct leakage, latent", "duct_leakage_latent"), ("ducts, all", "ducts"), ("coil total", "coil")]
            for label, p in rows:
                cells = []
                for mode in ("cooling", "heating"):
                    kwh = d[mode][p + "_kwh"]
                    cells.append(f"{y.energy(mode, p, 'btu') / 1e6:,.2f} MMBtu = {kwh:,.0f} kWh" if u == "ip"
                                 else f"{kwh:,.0f} kWh")
                t.add_row(label, *cells)
            if seer or hspf:
                t.add_row("electricity", *[f"{d[m]['electricity_kwh']:,.0f} kWh" if "electricity_kwh" in d[m] else "-"
                                           for m in ("cooling", "heating")])
            out.print(t)
        out.print("[dim]Quasi-steady hours: the roof's heat capacity is left out, which sharpens the daily swing. "
                  "Annual energy is an estimate for comparing variants, not a bill.[/dim]")
    if plot:
        from .plots import attic_heatmap

        _save_each(plot, case, years, lambda y: attic_heatmap(y, u))
    _finish(failures)


def _slug(name):
    import re

    return re.sub(r"[^A-Za-z0-9]+", "-", name).strip("-").lower() or "case"


@app.command()
def keys():
    """Print every case-file key with its unit, default and what it accepts (Markdown)."""
    from .schema import REQUIRED, SECTIONS

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


def main():
    """Console entry point. An unexpected error prints one line (ATTICDUCT_DEBUG=1 shows the traceback)."""
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
        sys.exit(1)


if __name__ == "__main__":
    main()
