"""Deciding: variants side by side, sweeps over key values, and the smallest value that meets a target.

Orchestration only: every number comes from attic.runs results; this module arranges and differences them.
It takes Cases or case dicts, never file paths: reading files is the command line's job.
"""

from __future__ import annotations

import itertools
from dataclasses import asdict, dataclass
from functools import partial

from attic.case.load import CaseError, raw_of
from attic.runs.points import solve_points, validate_points
from attic.units import TON

MAX_POINTS = 20_000  # a study larger than this is refused before it is built: about 20 s and 0.5 GB here


@dataclass(frozen=True)
class CompareRow:
    """One variant at one condition (SI, W; differences are this row minus the base row)."""

    case: str
    kind: str
    attic_air_K: float
    ceiling_w: float
    attic_air_w: float
    base_w: float
    duct_conduction_w: float
    duct_leak_sensible_w: float
    duct_leak_latent_w: float
    ducts_w: float
    equipment_w: float
    tons: float
    delta_w: float
    delta_tons: float
    deck_margin_K: float | None = None  # heating: the winter condensing surface's margin to the dew point

    def to_dict(self):
        return asdict(self)


@dataclass(frozen=True)
class Comparison:
    """Every variant of a case beside the base, at each design condition."""

    title: str
    rows: tuple
    ducts_inside: tuple  # (variant name, saved W, saved tons) for variants that move every duct inside

    def by_kind(self, kind):
        return [r for r in self.rows if r.kind == kind]

    def to_frame(self):
        """One row per case and condition, in SI (K, W), as a pandas DataFrame."""
        from attic.runs.plain import frame

        return frame([r.to_dict() for r in self.rows])

    def to_dict(self):
        return {"title": self.title, "rows": [r.to_dict() for r in self.rows],
                "ducts_inside": [{"variant": n, "saved_w": w, "saved_tons": t} for n, w, t in self.ducts_inside]}


def _row(result, base_total):
    h = result.house
    d = result.ducts
    cond = d.conduction_w if d else 0.0
    ls = d.leakage_sensible_w if d else 0.0
    ll = d.leakage_latent_w if d else 0.0
    return CompareRow(result.case, result.kind, result.attic.air_K, h.ceiling_w,
                      h.attic_air_sensible_w + h.attic_air_latent_w, h.base_sensible_w + h.base_latent_w,
                      cond, ls, ll, h.ducts_w, h.equipment_w, h.tons,
                      h.equipment_w - base_total, (h.equipment_w - base_total) / TON,
                      None if getattr(result, "deck", None) is None else result.deck.margin_K)


def _all_inside(case):
    return case.ducts is not None and all(s.location == "conditioned" for s in case.ducts.segments)


def compare(cases, results):
    """Comparison of solved cases. cases: list of Case (base first); results: {name: [ConditionResult]}."""
    base = cases[0]
    base_by_kind = {r.kind: r.house.equipment_w for r in results[base.name]}
    rows = []
    for c in cases:
        for r in results.get(c.name, []):
            rows.append(_row(r, base_by_kind[r.kind]))
    inside = []
    if base.ducts is not None and not _all_inside(base):
        for c in cases[1:]:
            cool = {r.kind: r for r in results.get(c.name, [])}.get("cooling")
            if _all_inside(c) and cool is not None:
                saved = base_by_kind["cooling"] - cool.house.equipment_w
                inside.append((c.name, saved, saved / TON))
    return Comparison(base.title, tuple(rows), tuple(inside))


# ---- sweeps ---------------------------------------------------------------------------------------

def _typed(text):
    t = text.strip()
    if t.lower() in ("true", "false"):
        return t.lower() == "true"
    try:
        return float(t)
    except ValueError:
        return t


def parse_set(spec, where="--set"):
    """'path=a:b:step' (inclusive of b) or 'path=v1,v2,...' -> (path, [values]); CaseError naming the option
    `where` if malformed."""
    if "=" not in spec:
        raise CaseError(where, f'"{spec}": write PATH=START:STOP:STEP or PATH=V1,V2,... e.g. roof.deck_r=0:40:5')
    path, vals = (s.strip() for s in spec.split("=", 1))
    if not path or not vals:
        raise CaseError(where, f'"{spec}": both a key path and values are needed')
    if ":" in vals and "," not in vals:
        parts = vals.split(":")
        try:
            nums = [float(p) for p in parts]
        except ValueError:
            raise CaseError(where, f'"{spec}": a range is three numbers, START:STOP:STEP') from None
        if len(nums) != 3 or nums[2] <= 0 or nums[1] < nums[0]:
            raise CaseError(where, f'"{spec}": a range is START:STOP:STEP with STOP >= START and STEP > 0')
        a, b, step = nums
        n = int(round((b - a) / step))
        if n + 1 > MAX_POINTS:  # counted before the values are built: 0:1e9:1 would fill the memory first
            raise CaseError(where, f'"{spec}": {n + 1:,} values; at most {MAX_POINTS:,} points are solved at once, '
                                   "so give a larger STEP or a narrower range")
        if abs(a + n * step - b) > 1e-9 * max(1.0, abs(b)):  # STOP is included, so it must be on the grid
            below = a + int((b - a) / step + 1e-9) * step
            raise CaseError(where, f'"{spec}": STOP {b:g} is not START plus a whole number of STEPs {step:g}; '
                                     f'give {path}={a:g}:{below:g}:{step:g} or {a:g}:{below + step:g}:{step:g}')
        values = [round(a + i * step, 10) for i in range(n + 1)]
    else:
        items = vals.split(",")
        if len(items) > 1 and any(not v.strip() for v in items):  # "4,,8" or "4,8,": a value left out by a slip
            raise CaseError(where, f'"{spec}": a value is empty between commas; list each value once, e.g. '
                                   f'{path}={",".join(v.strip() for v in items if v.strip())}')
        values = [_typed(v) for v in items if v.strip()]
    if not values:
        raise CaseError(where, f'"{spec}": no values')
    return path, values


def grid_size(specs):
    """How many points the parsed --set specs make; CaseError when that is more than MAX_POINTS."""
    count = 1
    for _, v in specs:
        count *= len(v)
    if count > MAX_POINTS:
        raise CaseError("--set", f"{' x '.join(f'{len(v):,}' for _, v in specs)} = {count:,} points; at most "
                                 f"{MAX_POINTS:,} are solved at once: give fewer values (for a range, a larger STEP)")
    return count


def grid(specs):
    """All combinations of the parsed --set specs: list of {path: value} dicts (first spec varies slowest);
    CaseError when there are more than MAX_POINTS."""
    grid_size(specs)
    paths = [p for p, _ in specs]
    return [dict(zip(paths, combo, strict=True)) for combo in itertools.product(*[v for _, v in specs])]


def flat_output(result, units="ip"):
    """A solved point as the flat output dict of the CSV and the target grammar (no caution text)."""
    from attic.present.contract import condition_output, flatten

    out = condition_output(result, units)
    return flatten({k: v for k, v in out.items() if k != "caution"})


@dataclass(frozen=True)
class SweepResult:
    """Sweep points in order, each with its flat output, or None and the reason where it did not solve.

    errors : per point, None or why it failed; balance_failed : per point, True where a heat balance did not
    close (False where the input asks the impossible, e.g. supply air that cools nothing).
    """

    params: tuple
    points: tuple
    outputs: tuple
    errors: tuple
    kind: str
    units: str
    balance_failed: tuple = ()

    def column(self, key):
        return [None if o is None else o.get(key) for o in self.outputs]

    def to_frame(self):
        """One row per sweep point (the set values, then the output columns in the sweep's units)."""
        from attic.runs.plain import frame

        return frame(self.to_rows())

    def to_rows(self):
        """A dict per point: its set values, every output (None where it failed) and `error`, always the last
        column (None where it solved), so that a sheet built on one study finds its columns in the next."""
        template = dict.fromkeys(next((o for o in self.outputs if o is not None), {}))
        rows = []
        for p, o, e in zip(self.points, self.outputs, self.errors, strict=True):
            rows.append({**{f"set.{k}": v for k, v in p.items()}, **(o if o is not None else template), "error": e})
        return rows


def sweep(case, specs, kind="cooling", units="ip", jobs=1, progress=None):
    """Run a case across the values of one or more keys.

    case : a Case, or a case dict as TOML gives it (its variants are ignored)
    progress : optional callable(n_done, n_total) for a progress bar
    """
    raw = raw_of(case)
    points = grid(specs)
    checked = validate_points(raw, points, combinations_fail=True)
    results = solve_points(raw, points, kind, partial(flat_output, units=units), jobs, progress, checked=checked,
                           as_text=False)
    return SweepResult(tuple(p for p, _ in specs), tuple(points), tuple(o for o, _ in results),
                       tuple(None if e is None else str(e) for _, e in results), kind, units,
                       tuple(_balance_failed(e) for _, e in results))


def _balance_failed(error):
    from attic.network.solve import SolveError

    return isinstance(error, SolveError)


# ---- pick -----------------------------------------------------------------------------------------

@dataclass(frozen=True)
class PickResult:
    """The smallest value of `path` among `values` that meets `target` (of those that solved), or None; every
    value's check, and why a value that did not solve failed."""

    path: str
    target: str
    kind: str
    chosen: object
    checks: tuple  # (value, met, left, right, margin) in the order tried; None but the value where it failed
    errors: tuple = ()  # per check: None, or why that value did not solve
    balance_failed: tuple = ()  # per check: True where a heat balance did not close (else the input's doing)
    largest: bool = False  # tried from the largest down: the largest value that meets the target

    @property
    def order(self):
        """Which value meeting the target was picked: the smallest or largest number, or the first of the
        choices in the order given (a covering has no size)."""
        if all(_is_number(c[0]) for c in self.checks):
            return "largest" if self.largest else "smallest"
        return "first in the order given"

    def to_dict(self):
        errors = self.errors or (None,) * len(self.checks)
        return {"path": self.path, "target": self.target, "condition": self.kind, "chosen": self.chosen,
                "picks": self.order,
                "checks": [dict(zip(("value", "met", "left", "right", "margin"), c, strict=True)) | {"error": e}
                           for c, e in zip(self.checks, errors, strict=True)]}


def _is_number(v):
    return isinstance(v, int | float) and not isinstance(v, bool)


def pick(case, path, values, target_text, kind="cooling", units="ip", largest=False):
    """Try `values` of `path` from the smallest up (largest=True: from the largest down), or choices (text, true or
    false) in the order given; the first that meets the target wins.

    case : a Case, or a case dict as TOML gives it (its variants are ignored).
    Raises CaseError for a bad input. A value that does not solve (its heat balance does not close, or no
    airflow serves the load there) is a failed check with its reason, never a number; the others are still tried.
    """
    from attic.runs.target import parse_target

    target = parse_target(target_text)
    raw = raw_of(case)

    given = list(dict.fromkeys(values))  # a value given twice is tried once
    if all(_is_number(v) for v in given):
        ordered = sorted(given, key=float, reverse=largest)
    elif largest:
        raise CaseError("--largest", "orders numbers; choices such as coverings are tried in the order you list "
                                     "them, so list them in the order you would prefer them")
    else:
        ordered = given  # choices have no size: the order the user listed them in is the order of preference
    points = [{path: v} for v in ordered]
    checked = validate_points(raw, points, "--vary", combinations_fail=True)
    checks, errors, chosen = [], [], None
    solved = solve_points(raw, points, kind, partial(flat_output, units=units), where="--vary", checked=checked,
                          as_text=False)
    for v, (flat, err) in zip(ordered, solved, strict=True):
        if flat is None:
            checks.append((v, None, None, None, None))
            errors.append(err)
            continue
        met, a, b, margin = target.check(flat)
        checks.append((v, met, a, b, margin))
        errors.append(None)
        if met and chosen is None:
            chosen = v
    return PickResult(path, target_text, kind, chosen, tuple(checks),
                      tuple(None if e is None else str(e) for e in errors), tuple(_balance_failed(e) for e in errors),
                      largest)
