"""The uncertainty command: a band on every answer from the case's [uncertainty] section."""

from __future__ import annotations

import json
import sys
from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_INPUT,
    PLOT_SUFFIXES,
    Condition,
    Fmt,
    UnitSystem,
    _caution_line,
    _check_output_path,
    _fail,
    _rows_csv,
    _write_atomic,
    command,
)
from attic.cli.solving import _left_out_code


@command()
def uncertainty(
    case: Path = typer.Argument(..., help="The case file, with an \\[uncertainty] section."),
    samples: int = typer.Option(2000, "--samples", min=2, max=1_000_000, help="How many samples."),
    seed: int = typer.Option(20261202, "--seed", min=0, help="Seed of the Latin hypercube: the same seed, the same "
                                                      "numbers."),
    saves: str = typer.Option("0", "--saves", help="Count the samples in which a variant saves at least this: "
                                                   "0.25t (tons), 5000 or 5000btuh (Btu/h), 1500w."),
    condition: Condition = typer.Option(Condition.cooling, "--condition", "-c", help="cooling or heating."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv (the summary)."),
    output: Path = typer.Option(None, "--output", "-o", help="Write every sample of every case to this .csv file "
                                                             "(unlike other commands, not the summary)."),
    plot: Path = typer.Option(None, "--plot", "-p", help="A band per variant (.png or .svg)."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    jobs: int = typer.Option(1, "--jobs", "-j", min=1, max=64, help="Processes to spread the samples over."),
):
    """How wide the answer is: the base and every variant over the same samples of the uncertain inputs.

    Reports P10, P50, P90 and the mean of the attic air, duct load, equipment load and tons; each variant's
    saving against the base, sample by sample; and which inputs move the answer most (Spearman rank
    correlation).
    """
    from rich.console import Console
    from rich.progress import Progress

    from attic.case.load import CaseError, read_toml
    from attic.present.uncertainty import (
        parse_saves,
        sample_rows,
        summary_rows,
        uncertainty_output,
        uncertainty_tables,
    )
    from attic.runs.uncertainty import run_uncertainty

    try:
        saves_w = parse_saves(saves, units.value)
    except ValueError as e:
        _fail(f"--saves: {e}", EXIT_INPUT)
    if output is not None and output.suffix.lower() != ".csv":
        _fail(f"--output {output}: uncertainty writes every sample as CSV there; give a .csv name (the summary "
              "goes to the screen as -f table, json or csv)", EXIT_INPUT)
    if output:
        _check_output_path(output, [case])
    _check_output_path(plot, [case], PLOT_SUFFIXES, "--plot")
    from attic.present.uncertainty import few_samples_note

    try:
        raw = read_toml(case)
        with Progress(console=Console(stderr=True), transient=True, disable=not sys.stderr.isatty()) as prog:
            task = prog.add_task("solving samples", total=None)
            res = run_uncertainty(raw, samples, seed, condition.value, jobs,
                                  progress=lambda done, total: prog.update(task, completed=done, total=total),
                                  notice=lambda line: prog.console.print(f"atticduct: {line}", markup=False,
                                                                         highlight=False))
    except CaseError as e:
        if e.source is None:
            e.source = str(case)
        _fail(str(e), EXIT_INPUT)
    if few_samples_note(samples):  # after the case is read: an error in it is the one line said
        typer.echo(f"atticduct: {few_samples_note(samples)}", err=True)
    if not res.ok(res.cases[0]).any():
        _fail("no sample of the base case solved: " + res.errors[res.cases[0]][0][1], _left_out_code(res))
    out = uncertainty_output(res, units.value, saves_w)
    if format == Fmt.json:
        typer.echo(json.dumps(out, indent=2))
    elif format == Fmt.csv:
        sys.stdout.write(_rows_csv(summary_rows(out)))
    else:
        con = Console()
        for item in uncertainty_tables(out):
            con.print(item)
        con.print(_caution_line())
    if output:
        _write_atomic(output, _rows_csv(sample_rows(res, units.value)), [case])
        typer.echo(f"wrote {output}", err=True)
    if plot:
        from attic.present.plots import save, uncertainty_chart

        save(uncertainty_chart(res, units.value, saves_w), plot)
        typer.echo(f"wrote {plot}", err=True)
    failed = sum(len(v) for v in res.errors.values())
    if failed:
        first = next(e for v in res.errors.values() for _, e in v)
        typer.echo(f"atticduct: {failed:,} sample{'s' if failed > 1 else ''} did not solve and "
                   f"{'are' if failed > 1 else 'is'} left out (first: {first})", err=True)
        raise typer.Exit(_left_out_code(res))
