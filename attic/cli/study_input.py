"""What sweep and pick are given, read and checked: --set ranges and grids, a failed point's name, a target's
two sides. One line and exit 2 for anything malformed."""

from __future__ import annotations

from attic.cli.common import EXIT_INPUT, _fail


def _study_case(case, variant):
    """What sweep and pick run on: the case file's base as a dict (its variants ignored), or with -n one variant
    built (its settings applied); an unknown variant name is one line and exit 2 (attic.cli.common._load)."""
    from attic.case.load import read_toml
    from attic.cli.common import _load

    return read_toml(case) if variant in (None, "base") else _load(case, variant)[0]


def _parse_sets(set_):
    """The --set specs, with ranges checked; one line and exit 2 for a malformed one."""
    from attic.case.load import CaseError
    from attic.runs.study import parse_set

    specs = []
    for s in set_:
        _check_range(s)
        try:
            specs.append(parse_set(s))
        except CaseError as e:
            _fail(str(e), EXIT_INPUT)
    if len(specs) > 2:
        _fail("--set: give one key for a line or two for a grid", EXIT_INPUT)
    if len(specs) == 2 and specs[0][0] == specs[1][0]:
        _fail(f"--set {specs[0][0]}: the key is given twice; give its values once (a grid needs two keys)", EXIT_INPUT)
    from attic.runs.study import grid_size

    try:
        grid_size(specs)
    except CaseError as e:
        _fail(str(e), EXIT_INPUT)
    return specs


def _check_range(spec):
    """START:STOP:STEP: STOP included; a zero step, one of the wrong sign or one larger than the span is an error."""
    if "=" not in spec:
        return
    path, vals = (x.strip() for x in spec.split("=", 1))
    if ":" not in vals or "," in vals:
        return
    parts = vals.split(":")
    try:
        a, b, step = (float(p) for p in parts)
    except ValueError:
        _fail(f'--set "{spec}": a range is three numbers, START:STOP:STEP (e.g. {path}=0:40:5)', EXIT_INPUT)
    if step == 0:
        _fail(f'--set "{spec}": the step is 0; give a step above 0 (e.g. {path}={a:g}:{b:g}:{abs(b - a) / 4 or 1:g})',
              EXIT_INPUT)
    if step < 0 or b < a:
        _fail(f'--set "{spec}": a range runs up: START <= STOP and a STEP above 0 (e.g. {path}={min(a, b):g}:'
              f'{max(a, b):g}:{abs(step):g})', EXIT_INPUT)
    if b > a and step > b - a:
        _fail(f'--set "{spec}": the step {step:g} is larger than the span {b - a:g}; give a step of at most '
              f"{b - a:g}", EXIT_INPUT)


def _at(point, why):
    """A failed point's reason, naming the point (a solve's message names it already: its case is called so)."""
    from attic.runs.points import point_name

    name = point_name(point)
    return why if name in why else f"at {name}: {why}"


def _split_target(text):
    import re

    parts = re.split(r"<=|>=|<|>", text, maxsplit=1)
    return parts if len(parts) == 2 else (text, "")
