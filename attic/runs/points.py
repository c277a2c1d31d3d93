"""Many points of one case at one design condition: each point is a set of dotted-path overrides of a case
dict, built, validated and solved together in batches (attic.runs.batch, whose answers equal run_condition's
to solver tolerance, tested). Batches are spread over processes when asked; a point that does not solve is
reported as failed, never as a number.
"""

from __future__ import annotations

from attic.case.errors import CombinationError
from attic.case.load import CaseError, apply_overrides, build_case, validate_raw


def point_name(point):
    """A point as the user writes it, key=value, ... (6 not 6.0): the name its case and its messages carry."""
    return ", ".join(f"{k}={v:.6g}" if isinstance(v, float) else f"{k}={v}" for k, v in point.items())


def validate_points(raw, points, where="--set", combinations_fail=False):
    """Fail fast: check every point's case before solving any (CaseError names the point).

    combinations_fail : a point whose values are each allowed but cannot go together (CombinationError, e.g. a
    grid crossing supply temperatures with room temperatures) is kept as that error in place of its checked
    case, so that the study lists it as failed and solves the others (solve_points)."""
    checked = []
    for pt in points:
        try:
            checked.append(validate_raw(apply_overrides(raw, pt, where)))
        except CaseError as e:
            if combinations_fail and isinstance(e, CombinationError):
                checked.append(e)
                continue
            if not any(e.path.split(".")[0] == k.split(".")[0] for k in pt):
                raise  # a key of a section the point does not touch: the case's own error, whatever the point
            raise type(e)(e.path, f"{e.args[0]} (at {point_name(pt)})") from None
    return checked


def _solve_chunk(args):
    """Build every point's case and solve them together (attic.runs.batch); picklable for a process pool."""
    from attic.runs.batch import run_conditions

    raw, chunk, kind, extract, where, checked, name = args
    if checked is None:
        checked = [validate_raw(apply_overrides(raw, p, where)) for p in chunk]
    ok = [i for i, c in enumerate(checked) if not isinstance(c, CaseError)]
    out = [(None, c) for c in checked]  # a point validate_points kept as its CombinationError stays failed
    cases = [build_case(checked[i], point_name(chunk[i]) if name is None else name) for i in ok]
    if kind == "heating" and cases and cases[0].heating is None:
        raise CaseError("[heating]", "section is missing: the case has no heating condition")
    for i, (r, e) in zip(ok, run_conditions(cases, kind), strict=True):
        out[i] = (extract(r), None) if e is None else (None, e)
    return out


def solve_points(raw, points, kind, extract, jobs=1, progress=None, where="--set", checked=None, as_text=True,
                 name=None):
    """[(extract(result) or None, error text or None)] for each point, in order (with as_text=False the error is
    the SolveError or ValueError itself).

    raw : a case dict as TOML gives it (no variants); points : list of {dotted path: value};
    name : what each point's case (and so its results and messages) is called; by default the point itself
    (`point_name`);
    checked : optional, what validate_points gave for these points (so they are not validated twice);
    extract : a module-level function of a ConditionResult (it crosses process boundaries), e.g. to keep
    only the numbers a study needs; jobs : processes; progress : optional callable(n_done, n_total).

    The points are solved in batches (attic.runs.batch: one stacked network each); with jobs > 1 the
    batches are spread over that many processes, which pays only for very large studies.
    """
    from attic.runs.batch import CHUNK

    out = []
    size = CHUNK if jobs <= 1 else max(1, min(CHUNK, -(-len(points) // (jobs * 2))))
    work = [(raw, points[i:i + size], kind, extract, where, None if checked is None else checked[i:i + size], name)
            for i in range(0, len(points), size)]
    if jobs > 1 and len(work) > 1:
        from concurrent.futures import ProcessPoolExecutor

        with ProcessPoolExecutor(max_workers=jobs) as pool:
            parts = pool.map(_solve_chunk, work)
            for part in parts:
                out.extend(part)
                if progress:
                    progress(len(out), len(points))
    else:
        for w in work:
            out.extend(_solve_chunk(w))
            if progress:
                progress(len(out), len(points))
    return [(r, str(e)) if as_text and e is not None else (r, e) for r, e in out]
