"""The report command: one self-contained HTML page of a case, for a client or an inspector."""

from __future__ import annotations

from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_INPUT,
    _check_output_path,
    _fail,
    command,
)
from attic.cli.deciding import solved_and_compared, solved_whole
from attic.cli.money import WEATHER_HELP
from attic.cli.solving import _finish, _left_out_code

SAMPLES, SEED = 2000, 20261202  # attic.runs.uncertainty's defaults (tested equal), without importing it for --help


@command()
def report(
    case: Path = typer.Argument(..., help="The case file."),
    output: Path = typer.Option(..., "--output", "-o", help="The HTML file to write (.html; checked before any "
                                                            "work; never the case file)."),
    samples: int = typer.Option(SAMPLES, "--samples", min=2, max=1_000_000,
                                help="Samples for the uncertainty section, when the case has \\[uncertainty] "
                                     "(the same default as `uncertainty`, so the page and the command agree)."),
    seed: int = typer.Option(SEED, "--seed", min=0, help="Seed of the uncertainty section's Latin hypercube."),
    saves: str = typer.Option("0", "--saves", help="The uncertainty section counts the samples in which a variant "
                                                   "saves at least this: 0.25t (tons), 5000 or 5000btuh, 1500w."),
    jobs: int = typer.Option(1, "--jobs", "-j", min=1, max=64, help="Processes for the uncertainty section."),
    weather: Path = typer.Option(None, "--weather", "-w", help=WEATHER_HELP),
):
    r"""One self-contained HTML page: inputs, every variant's results, code checks, method, cautions.

    The page names the case file by its name only, not the folders it sits in. With a [money] section, what
    each variant costs and pays back (annual figures with --weather).
    """
    from attic.cli.money import money_for
    from attic.present.contract import condition_output
    from attic.present.plots import cash_flow_chart, comparison_chart, svg_text
    from attic.present.report import build_report

    reads = [case, (weather, "weather file")]
    _check_output_path(output, reads, (".html", ".htm"))
    from attic.present.uncertainty import parse_saves

    try:
        saves_w = parse_saves(saves)
    except ValueError as e:
        _fail(f"--saves: {e}", EXIT_INPUT)
    solved, results, failures, cmp = solved_and_compared(case)
    outputs = {c.name: [condition_output(r) for r in results[c.name]] for c in solved}
    from attic.runs.totals import case_checks

    checks = {c.name: case_checks(c, results[c.name]) for c in solved}  # as `check` lists them
    charts = {f"Load make-up at the {k} design condition": svg_text(comparison_chart(cmp, k))
              for k in ("cooling", "heating") if cmp.by_kind(k)}
    extra = []
    from attic.case.load import CaseError, read_toml

    raw = read_toml(case)
    runs = []  # (condition, UncertaintyResult), at every condition the case has
    if "uncertainty" in raw:
        from attic.present.plots import uncertainty_chart
        from attic.present.report import uncertainty_section
        from attic.present.uncertainty import few_samples_note, uncertainty_output
        from attic.runs.uncertainty import run_uncertainty

        for kind in ("cooling", "heating"):
            if not cmp.by_kind(kind):
                continue
            try:
                res = run_uncertainty(raw, samples, seed, kind, jobs,
                                      notice=lambda line: typer.echo(f"atticduct: {line}", err=True))
            except CaseError as e:
                if e.source is None:
                    e.source = str(case)
                _fail(str(e), EXIT_INPUT)
            runs.append((kind, res))
            extra.append(uncertainty_section(uncertainty_output(res, "ip", saves_w),
                                             svg_text(uncertainty_chart(res, "ip", saves_w))))
        if few_samples_note(samples):  # after the case is read: an error in it is the one line said
            typer.echo(f"atticduct: {few_samples_note(samples)}", err=True)
    elif given := [o for o, v, d in (("--samples", samples, SAMPLES), ("--seed", seed, SEED), ("--saves", saves, "0"))
                   if v != d]:
        typer.echo(f"atticduct: {case} has no [uncertainty] section, so {' and '.join(given)} "
                   f"{'is' if len(given) == 1 else 'are'} not used", err=True)
    from attic.cli.common import _write_atomic

    money = money_for(case, solved_whole(solved, failures), cmp, weather)
    money_chart = svg_text(cash_flow_chart(money)) if money and money.complete else None
    html = build_report(Path(case).read_text(encoding="utf-8"), Path(case).name, cmp, outputs, checks, charts, extra,
                        money.to_dict() if money else None, money_chart,
                        sorted({c.exterior_convection for c in solved}),
                        [f.to_dict() for f in failures])
    _write_atomic(output, html, reads)
    typer.echo(f"wrote {output}")
    left_out = [(kind, res) for kind, res in runs if any(res.errors.values())]
    if left_out:  # as the uncertainty command: the page says so too
        kind, res = left_out[0]
        first = next(e for v in res.errors.values() for _, e in v)
        n = sum(len(v) for _, r in runs for v in r.errors.values())
        typer.echo(f"atticduct: {n:,} uncertainty samples did not solve and are left out of the page's bands "
                   f"(first, {kind}: {first})", err=True)
        if not failures:
            raise typer.Exit(max(_left_out_code(r) for _, r in left_out))
    _finish(failures)
