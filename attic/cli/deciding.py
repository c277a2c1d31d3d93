"""Commands for deciding between options: compare, sweep, pick (report is in attic.cli.page)."""

from __future__ import annotations

from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_FAILED,
    EXIT_INPUT,
    EXIT_SOLVE,
    PLOT_SUFFIXES,
    Condition,
    Fmt,
    UnitSystem,
    _caution_line,
    _check_case_path,
    _check_output_path,
    _emit_data,
    _fail,
    _load,
    _save_figure,
    command,
    condition_option,
    format_option,
    output_option,
    plot_option,
    units_option,
    variant_option,
)
from attic.cli.money import WEATHER_HELP
from attic.cli.numbers import _column, _num, _swept, _val
from attic.cli.solving import _failure_code, _finish, _solve_all
from attic.cli.study_input import _at, _parse_sets, _split_target, _study_case


@command()
def compare(
    case: Path = typer.Argument(..., help="The case file; its \\[\\[variant]] tables are compared with the base."),
    format: Fmt | None = format_option(),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    plot: Path = plot_option("A stacked-bar chart of the load make-up of every variant at --condition."),
    condition: Condition = condition_option("Which design condition the chart shows (the table and data "
                                            "show both)."),
    weather: Path = typer.Option(None, "--weather", "-w", help=WEATHER_HELP),
):
    """Every variant beside the base: attic air, loads, tons and the difference from the base.

    Loads are what each part adds to the equipment load (+). Says what moving the ducts inside saves when a
    variant does that. The duct load's split (conduction, leakage sensible and latent) is in --format
    json/csv and in the chart. With a [money] section: first cost, equipment credit and, with --weather,
    annual energy cost, saving, payback and present value per variant (--plot then also writes
    NAME-cash-flow.png beside the chart).
    """
    from attic.cli.money import cash_flow_path, money_columns, money_for, money_renderables
    from attic.present.contract import comparison_output, flatten

    reads = [case, (weather, "weather file")]
    _check_output_path(output, reads)
    _check_output_path(plot, reads, PLOT_SUFFIXES, "--plot")
    if plot:  # with money, the cash-flow chart goes beside it under a name of its own: checked as well
        _check_output_path(cash_flow_path(Path(plot)), reads, PLOT_SUFFIXES, "--plot (its cash-flow chart)")
    solved, results, failures, cmp = solved_and_compared(case)
    money = money_for(case, solved_whole(solved, failures), cmp, weather)
    out = comparison_output(cmp, units.value)
    if money:
        out["money"] = money.to_dict()
    # in the files and the tables too, not only on the screen
    failed = [f.to_dict() for f in failures]
    if failed:
        out["failed"] = failed

    def renderables():
        from attic.present.tables import comparison_tables

        wu = "Btu/h" if units == UnitSystem.ip else "W"
        lines = [f"Moving the ducts inside (\"{d['variant']}\") saves {_num(d['saved_' + wu_key])} {wu}, "
                 f"{d['saved_tons']:.2f} tons at the cooling design condition." for d in out["ducts_inside"]]
        short = [f"{c.name} ({r.kind})" for c in solved for r in results[c.name] if r.house.air_handler_short]
        if short:  # as run and check flag it: the rows are at the airflow the load needs, not the case's
            from rich.markup import escape

            lines.append(escape(f"Air handler too small at the case's airflow for: {'; '.join(short)}. Those rows are "
                                "at the design airflow that carries the load; run or check says what to change."))
        if money:
            lines += [f'"{f["case"]}" is not in the money table: it did not solve at the '
                      f'{" and ".join(f["conditions"])} design condition.' for f in failed]
        return comparison_tables(out) + lines + (money_renderables(money) if money else []) + [_caution_line()]

    wu_key = "btuh" if units == UnitSystem.ip else "w"
    def csv_rows():
        # a variant's money is on its first row only, so a spreadsheet's sum of a money column counts it once
        rows, costed = [], set()
        for r in out["rows"]:
            first = r["case"] not in costed
            costed.add(r["case"])
            rows.append(flatten(r) | (money_columns(money, r["case"]) if money and first else {}))
        return rows + failed

    _emit_data(format, out, csv_rows, renderables, output, reads)
    if plot:
        from attic.present.plots import comparison_chart

        if not cmp.by_kind(condition.value):
            _fail(f"--condition {condition.value}: the case has no {condition.value} condition to plot", EXIT_INPUT)
        _save_figure(comparison_chart(cmp, condition.value, units.value), plot)
        if money and money.complete:
            from attic.present.plots import cash_flow_chart

            _save_figure(cash_flow_chart(money), cash_flow_path(Path(plot)))
    _finish(failures)


def solved_and_compared(case):
    """(the variants that solved, their results, the failures, the comparison) of a case file; one line and the
    failure's exit code when the base does not solve at every condition (compare, report: each variant is set
    against it). A variant keeps the conditions that solved where another failed (Failure.conditions)."""
    from attic.runs.study import compare as do_compare

    cases = _load(case)
    results, failures = _solve_all(cases, partial=True)
    base = cases[0]
    if len(results.get(base.name, [])) < len(base.conditions):
        _fail(next((f for f in failures if f.case == base.name), "the base case did not solve"),
              _failure_code(failures))
    solved = [c for c in cases if c.name in results]
    return solved, results, failures, do_compare(solved, results)


def solved_whole(solved, failures):
    """The solved variants with a result at every condition (what the money study sets side by side)."""
    partial = {f.case for f in failures}
    return [c for c in solved if c.name not in partial]


@command()
def sweep(
    case: Path = typer.Argument(..., help="The case file (the base is swept; -n sweeps one of its variants)."),
    set_: list[str] = typer.Option(..., "--set", "-s", help="PATH=START:STOP:STEP (STOP included) or "
                                   "PATH=V1,V2,... e.g. roof.deck_r=0:40:5 or duct.*.r_value=4.2,6,8,11, in the case "
                                   "file's units whatever --units. Give two for a grid."),
    condition: Condition = condition_option(),
    show: list[str] = typer.Option(None, "--show", help="An output key to show in the table and plot; repeat for "
                                   "more (default: attic air, duct load, equipment load and, in cooling, tons). "
                                   "Names as in the CSV header."),
    format: Fmt | None = format_option("table: the chosen outputs; json or csv: every output of every point."),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    plot: Path = plot_option("The chosen outputs against the first key, one panel each."),
    jobs: int = typer.Option(1, "--jobs", "-j", min=1, max=64,
                             help="Processes to spread the batches of points over (pays for very large grids "
                                  "only: each process first pays the imports)."),
    variant: str = variant_option("Sweep this variant (its settings, then the --set values) instead of the base."),
):
    """Run the case across values of one or two keys; tabulate, save and plot the results."""
    from attic.case.load import CaseError
    from attic.runs.study import sweep as do_sweep

    _check_output_path(output, [case])
    _check_output_path(plot, [case], PLOT_SUFFIXES, "--plot")
    _check_case_path(case)
    specs = _parse_sets(set_)
    n = 1
    for _, v in specs:
        n *= len(v)
    from rich.console import Console
    from rich.progress import Progress

    con = Console(stderr=True)
    try:
        raw = _study_case(case, variant)
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
        _fail(str(e), EXIT_INPUT)
    w = "_btuh" if units == UnitSystem.ip else "_w"
    t_ = "_F" if units == UnitSystem.ip else "_C"
    # with no point solved there are no outputs to check --show against: the rows, table and plot still say which
    # points failed and why
    first = next((o for o in res.outputs if o), None)
    failed_code = EXIT_SOLVE if any(res.balance_failed) else EXIT_INPUT
    from attic.present.contract import gives_tons

    tons = ("house.tons",) if gives_tons(condition.value) else ()
    keys = list(show) if show else [k for k in (f"attic.air{t_}", f"ducts.total{w}", f"house.total{w}", *tons)
                                    if first is None or k in first]
    for k in keys if first else ():
        if k not in first:
            import difflib

            close = difflib.get_close_matches(k, list(first), n=1)
            _fail(f"--show {k}: no such output key" + (f"; did you mean {close[0]}?" if close else ""), EXIT_INPUT)

    def renderables():
        from rich.markup import escape
        from rich.table import Table

        of = "" if variant in (None, "base") else f' of variant "{escape(variant)}"'
        t = Table(title=f"sweep{of} ({condition.value} design condition)", title_justify="left")
        # a header is a key the user types back (--show, the CSV): it folds rather than ending in an ellipsis
        from attic.present.plots import param_label

        for p in res.params:  # with its unit: a swept value is in the case file's units, whatever --units
            t.add_column(escape(param_label(p)), justify="right", overflow="fold")
        for k in keys:
            t.add_column(escape(k), justify="right", overflow="fold")
        shown = {k: iter(_column([o[k] for o in res.outputs if o], 2 if k.endswith("tons") else None))
                 for k in keys}
        swept = {x: iter(_swept([p[x] for p in res.points])) for x in res.params}
        for _p, o in zip(res.points, res.outputs, strict=True):
            vals = [next(shown[k]) for k in keys] if o else ["failed (below)"] + [""] * (len(keys) - 1)
            t.add_row(*[next(swept[x]) for x in res.params], *vals)
        return [t, _caution_line()]

    def rows():
        # with no point solved the rows still carry the shown outputs' columns (empty), so a sheet built on
        # them finds its columns
        out = res.to_rows()
        if variant not in (None, "base"):  # a saved sweep of a variant says so on every row
            out = [{"variant": variant, **r} for r in out]
        return out if first else [{**{k: v for k, v in r.items() if k != "error"}, **dict.fromkeys(keys),
                                   "error": r["error"]} for r in out]

    _emit_data(format, rows, rows, renderables, output, [case])
    if plot:
        from attic.present.plots import sweep_chart

        _save_figure(sweep_chart(res, keys), plot)
    bad = [(p, e) for p, e in zip(res.points, res.errors, strict=True) if e]
    if first is None:
        typer.echo(f"atticduct: no point of the sweep solved ({len(bad):,} tried)", err=True)
    for p, e in bad[:5]:
        typer.echo(f"atticduct: {_at(p, e)}", err=True)
    if len(bad) > 5:
        more = len(bad) - 5
        typer.echo(f"atticduct: and {more:,} more point{'s' if more > 1 else ''} did not solve (the error column of "
                   "-f csv or json says why for each)", err=True)
    if bad:
        raise typer.Exit(failed_code)


@command()
def pick(
    case: Path = typer.Argument(..., help="The case file (the base is tried; -n tries one of its variants)."),
    vary: str = typer.Option(..., "--vary", help="The key to vary, e.g. duct.*.r_value."),
    among: str = typer.Option(..., "--among", help="Comma-separated values to try, e.g. 4.2,6,8,11."),
    target: str = typer.Option(..., "--target", help='A comparison of output keys, e.g. "ducts.total_btuh <= '
                               '0.25 * house.total_btuh". Grammar: + - * / ( ) and <= >= < >; keys as in the CSV '
                               "(with --units si: _w, _C, ...)."),
    largest: bool = typer.Option(False, "--largest", help="Pick the largest value that meets the target, trying "
                                 "from the largest down (e.g. the most duct leakage that still passes)."),
    condition: Condition = condition_option(),
    format: Fmt | None = format_option("table: one line per value; json or csv: every check."),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    variant: str = variant_option("Try the values on this variant (its settings, then --vary) instead of the base."),
):
    """The smallest of the given values that meets a target (--largest: the largest), with its margin; exit 1
    when none does.

    A value that does not solve is listed as failed, with its reason on stderr, and the others are still tried;
    the command then exits 3 (2 where the input asks the impossible there, e.g. supply air that cools nothing),
    since that value might have met the target.
    """
    from attic.case.load import CaseError
    from attic.runs.study import parse_set
    from attic.runs.study import pick as do_pick
    from attic.runs.target import TargetError

    _check_output_path(output, [case])
    _check_case_path(case)
    try:
        _, values = parse_set(f"{vary}={among}", "--vary/--among")
        res = do_pick(_study_case(case, variant), vary, values, target, condition.value, units.value, largest)
    except TargetError as e:
        _fail(str(e), EXIT_INPUT)
    except CaseError as e:
        if e.source is None and not e.path.startswith("--"):  # an option's error is not the case file's
            e.source = str(case)
        _fail(str(e), EXIT_INPUT)

    def renderables():
        from rich.markup import escape

        lhs, rhs = (s.strip() for s in _split_target(target))
        # both sides with one number of decimals, and each margin the difference of the two numbers shown
        ran = [c for c in res.checks if c[1] is not None]
        sides = _column([c[2] for c in ran] + [c[3] for c in ran]) if ran else []
        n = len(ran)
        digits = len(sides[0].partition(".")[2]) if ran else 0
        margins = [f"{abs(float(sides[i].replace(',', '')) - float(sides[n + i].replace(',', ''))):,.{digits}f}"
                   for i in range(n)]

        def said(text, value):  # a side that is a plain number needs no "= value"
            try:
                float(text.replace(",", ""))
                return None
            except ValueError:
                return f"{text} = {value}"

        lines = [] if variant in (None, "base") else [escape(f'On variant "{variant}" ({condition.value} design '
                                                             "condition):")]
        i = 0
        for (v, met, _a, _b, _m), err in zip(res.checks, errors, strict=True):
            if err is not None:
                lines.append(escape(f"{vary} = {_val(v)}: did not solve (below), so it is not a candidate"))
                continue
            both = ", ".join(x for x in (said(lhs, sides[i]), said(rhs, sides[n + i])) if x)
            lines.append(escape(f"{vary} = {_val(v)}: {both}: {'meets, margin' if met else 'misses by'} "
                                f"{margins[i]}"))
            i += 1
        if not ran:
            lines.append(escape(f"No value solved, so none can be picked for {target!r}."))
        elif res.chosen is None:
            lines.append(escape(f"None {'of the values that solved ' if failed else 'of these '}meets {target!r} "
                                f"at the {condition.value} design condition."))
        else:
            most = res.order
            lines.append(escape(f"{'Of the values that solved, the ' + most if failed else most.capitalize()} that "
                                f"meets {target!r}: {vary} = {_val(res.chosen)}."))
        return lines + [_caution_line()]

    errors = res.errors or (None,) * len(res.checks)
    failed = [(c[0], e) for c, e in zip(res.checks, errors, strict=True) if e is not None]

    from attic.present.contract import CAUTION, _round

    d = res.to_dict()
    d["units"] = units.value
    d["variant"] = variant or "base"
    d["caution"] = CAUTION
    for c in d["checks"]:  # rounded like every other output: no 16-digit floats
        c.update({k: _round(c[k]) for k in ("left", "right", "margin") if isinstance(c[k], float)})
    _emit_data(format, d, lambda: [{"variant": d["variant"], "path": d["path"], "target": d["target"],
                                    "condition": d["condition"], "picks": d["picks"], "chosen": d["chosen"], **c}
                                   for c in d["checks"]],
               renderables, output, [case])
    for v, e in failed:
        typer.echo(f"atticduct: {_at({vary: v}, e)}", err=True)
    if failed:  # a value that did not solve might have met the target: the answer is not whole
        raise typer.Exit(EXIT_SOLVE if any(res.balance_failed) else EXIT_INPUT)
    if res.chosen is None:
        raise typer.Exit(EXIT_FAILED)
