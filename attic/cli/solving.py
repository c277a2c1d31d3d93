"""Running cases for the commands: the variants solved together, what failed and why, the exit code that says
so, and the tables and data of `run`."""

from __future__ import annotations

import typer

from attic.cli.common import EXIT_INPUT, EXIT_SOLVE, _caution_line, _emit_data


class Failure(str):
    """A case or variant that did not solve: the message, with the name of the case it is about."""

    code = EXIT_SOLVE

    def __new__(cls, text, case="", conditions=()):
        made = super().__new__(cls, text)
        made.case = case
        made.conditions = tuple(conditions)  # the design conditions it has no results at
        return made

    def to_dict(self):
        """As the files and the report list it: the case, the conditions it has no results at, and why."""
        return {"case": self.case, "conditions": list(self.conditions), "error": str(self)}


class InputFailure(Failure):
    """A variant the case cannot run as given (e.g. supply air that cools nothing): exit 2, not 3."""

    code = EXIT_INPUT


def _failure_code(failures):
    """3 if any heat balance did not close; 2 if every failure is the input's."""
    return EXIT_INPUT if failures and all(isinstance(f, InputFailure) for f in failures) else EXIT_SOLVE


def _left_out_code(res):
    """For an uncertainty run with samples left out: 3 where some sample's heat balance did not close; 2 where
    every one is the input's doing (its distribution reaches values the case cannot run)."""
    return EXIT_SOLVE if res.unclosed else EXIT_INPUT


def _run_outputs(cases, units):
    from attic.present.contract import condition_output

    solved, failures = _solve_all(cases, partial=True)  # a case's cooling is shown though its heating failed
    return [[condition_output(r, units) for r in solved[c.name]] for c in cases if c.name in solved], failures


def _csv_rows(results):
    from attic.present.contract import flatten

    return [flatten({k: v for k, v in o.items() if k != "caution"}) for group in results for o in group]


def _finish(failures):
    """Report the variants that did not solve, and exit 3 (2 if the input is what made them fail)."""
    for f in failures:
        typer.echo(f"atticduct: {f}", err=True)
    if failures:
        raise typer.Exit(_failure_code(failures))


def _emit(results, failures, fmt, units, output, protect):
    def renderables():
        from attic.present.tables import air_handler_lines, case_table, deck_line, no_sun_line, vents_line

        out = []
        for group in results:
            out += [case_table(group, units.value), vents_line(group[0])]
            out += [deck_line(o) for o in group if deck_line(o)]
            out += [f"[bold]{no_sun_line(o)}[/bold]" for o in group if no_sun_line(o)]
            out += [f"[bold]{line}[/bold]" for line in air_handler_lines(group)] + [""]
        return out + [_caution_line()]

    _emit_data(fmt, lambda: [o for group in results for o in group], lambda: _csv_rows(results), renderables,
               output, protect)
    _finish(failures)


def _solve_all(cases, partial=False):
    """{name: [ConditionResult]} and the failures (`Failure`); the variants are solved together
    (attic.runs.batch). partial: a case keeps the conditions that solved where another failed."""
    from attic.network.solve import SolveError
    from attic.runs.batch import run_cases

    results, errors = run_cases(cases, partial=partial)
    failures = []
    for c in cases:
        e = errors.get(c.name)
        have = {r.kind for r in results.get(c.name, [])}
        missing = [k.kind for k in c.conditions if k.kind not in have]
        if isinstance(e, SolveError):
            failures.append(Failure(str(e), c.name, missing))
        elif e is not None:
            failures.append(InputFailure(f'variant "{c.name}": {e}', c.name, missing))
    return results, failures
