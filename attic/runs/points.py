"""Many points of one case at one design condition: each point is a set of dotted-path overrides of a case
dict, built, validated and solved through run_condition (so what one condition means is decided in one
place). Points are spread over processes when asked; a point that does not solve is reported as failed,
never as a number.
"""

from __future__ import annotations

from attic.case.load import CaseError, apply_overrides, build_case, validate_raw


def validate_points(raw, points, where="--set"):
    """Fail fast: check every point's case before solving any (CaseError names the point)."""
    checked = []
    for pt in points:
        try:
            checked.append(validate_raw(apply_overrides(raw, pt, where)))
        except CaseError as e:
            shown = ", ".join(f"{k}={v:.6g}" if isinstance(v, float) else f"{k}={v}" for k, v in pt.items())
            raise CaseError(e.path, f"{e.args[0]} (at {shown})") from None
    return checked


def solve_point(raw, point, kind, extract, where="--set"):
    """One point: (extract(ConditionResult), None), or (None, why it did not solve)."""
    from attic.network.solve import SolveError
    from attic.runs.condition import run_condition

    case = build_case(validate_raw(apply_overrides(raw, point, where)), "point")
    cond = case.cooling if kind == "cooling" else case.heating
    if cond is None:
        raise CaseError("[heating]", "section is missing: the case has no heating condition")
    try:
        return extract(run_condition(case, cond)), None
    except (SolveError, ValueError) as e:
        return None, str(e)


def _chunk(args):
    raw, chunk, kind, extract, where = args
    return [solve_point(raw, p, kind, extract, where) for p in chunk]


def solve_points(raw, points, kind, extract, jobs=1, progress=None, where="--set"):
    """[(extract(result) or None, error text or None)] for each point, in order.

    raw : a case dict as TOML gives it (no variants); points : list of {dotted path: value};
    extract : a module-level function of a ConditionResult (it crosses process boundaries), e.g. to keep
    only the numbers a study needs; jobs : processes; progress : optional callable(n_done, n_total).
    """
    out = []
    if jobs > 1 and len(points) > 1:
        from concurrent.futures import ProcessPoolExecutor

        size = max(1, len(points) // (jobs * 4))
        chunks = [points[i:i + size] for i in range(0, len(points), size)]
        with ProcessPoolExecutor(max_workers=jobs) as pool:
            for part in pool.map(_chunk, [(raw, c, kind, extract, where) for c in chunks]):
                out.extend(part)
                if progress:
                    progress(len(out), len(points))
    else:
        for i, p in enumerate(points):
            out.append(solve_point(raw, p, kind, extract, where))
            if progress:
                progress(i + 1, len(points))
    return out
