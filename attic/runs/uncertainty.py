"""The uncertainty run: the base case and every variant over the same Latin-hypercube samples of the
case's [uncertainty] inputs, so that each variant's saving is a paired difference, sample by sample.

Orchestration only: every number comes from the batched design-condition solve (attic.runs.batch) through
attic.runs.points.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from attic.case.load import CaseError, apply_overrides, raw_of, validate_raw
from attic.units import TON

# an entry every case can take (a ceiling R is required; a scale keeps each variant's own): for the messages
EXAMPLE = '"attic.ceiling_r" = { scale = { uniform = [0.8, 1.0] } }'
DEFAULT_SAMPLES = 2000
DEFAULT_SEED = 20261202
OUTPUTS = ("attic_air_K", "ducts_w", "equipment_w", "tons", "deck_margin_K")
PERCENTILES = (10, 50, 90)
# an output whose samples spread less than this fraction of its size does not vary (the balances close to about
# 1e-9 of the load, GAP_TOL 1e-5 of it for the design airflow)
NOISE = 1e-6
# Common practice, no source: a rank correlation of fewer than about ten pairs is noise (two pairs give +1 or -1).
MIN_RANKED = 10
# what a roof covering gives unless the case gives it: an absolute draw of one of these replaces the covering's
_COVERING_GIVES = {"roof.solar_reflectance", "roof.thermal_emittance", "roof.batten_gap_in"}


def numbers(result):
    """The outputs of one solved point (SI): attic air K, duct load W, equipment load W, tons, and the roof deck's
    winter margin to the dew point K (NaN where the condition has no deck check: cooling)."""
    deck = getattr(result, "deck", None)
    return (result.attic.air_K, result.house.ducts_w, result.house.equipment_w, result.house.equipment_w / TON,
            math.nan if deck is None else deck.margin_K)


def draw(inputs, n, seed=DEFAULT_SEED):
    """(n, len(inputs)) values of the uncertain inputs: a Latin hypercube (scipy.stats.qmc) mapped through
    each distribution's inverse CDF. For scale inputs the value is the multiplier."""
    from scipy.stats import qmc

    if not inputs:
        return np.zeros((n, 0))
    u = qmc.LatinHypercube(d=len(inputs), seed=seed).random(n)
    return np.column_stack([inp.dist.draw(u[:, j]) for j, inp in enumerate(inputs)])


@dataclass(frozen=True)
class UncertaintyResult:
    """Every sample of every case (SI). outputs[case][name] is an array over samples, NaN where the point
    did not solve; errors[case] lists (sample index, why) for those."""

    title: str
    kind: str
    n: int
    seed: int
    inputs: tuple  # UncertainInput
    values: np.ndarray  # (n, len(inputs)) drawn values (multipliers for scale inputs)
    cases: tuple  # names, base first
    outputs: dict
    errors: dict
    held: tuple  # (variant, input path) where the variant sets the key and keeps its own value
    unclosed: int = 0  # failed samples whose heat balance did not close (the others are the input's doing)

    def ok(self, case):
        return np.isfinite(self.outputs[case]["equipment_w"])

    def stats(self, case, name):
        """{p10, p50, p90, mean} over the samples that solved (None when none did)."""
        v = self.outputs[case][name]
        v = v[np.isfinite(v)]
        if not len(v):
            return {"p10": None, "p50": None, "p90": None, "mean": None}
        p = np.percentile(v, PERCENTILES)
        return {"p10": float(p[0]), "p50": float(p[1]), "p90": float(p[2]), "mean": float(np.mean(v))}

    def saving(self, variant):
        """Equipment-load saving of a variant against the base, W, sample by sample (paired)."""
        return self.outputs[self.cases[0]]["equipment_w"] - self.outputs[variant]["equipment_w"]

    def share_saving(self, variant, at_least_w):
        """Share of the samples (where both solved) in which the variant saves at least at_least_w."""
        s = self.saving(variant)
        s = s[np.isfinite(s)]
        return float(np.mean(s >= at_least_w)) if len(s) else float("nan")

    def rank_correlations(self, series):
        """Spearman rank correlation of each uncertain input with an output series (NaN samples dropped);
        None for an input that does not vary or belongs to the other design condition (its correlation would be the
        sample's noise), or an output that does not (a spread within NOISE of its size is the solver's tolerance,
        not the input's effect, and ranking it would invent a correlation), or with fewer than MIN_RANKED samples
        (two samples rank every input at +1 or -1)."""
        from scipy.stats import spearmanr

        good = np.isfinite(series)
        y = series[good]
        flat = len(y) < MIN_RANKED or np.ptp(y) <= NOISE * max(float(np.max(np.abs(y))), 1.0)
        other = "heating." if self.kind == "cooling" else "cooling."  # the other condition's keys move nothing here
        out = {}
        for j, inp in enumerate(self.inputs):
            x = self.values[good, j]
            if np.ptp(x) == 0 or flat or inp.path.startswith(other):
                out[inp.label] = None
            else:
                out[inp.label] = float(spearmanr(x, series[good]).statistic)
        return out


def _concrete(checked, paths):
    from attic.case.uncertainty import _Bad, targets

    out = set()
    for p in paths:
        try:
            out.update(t[0] for t in targets(checked, p))
        except _Bad:
            pass
    return out


def _start_of(result):
    """A solved sample's numbers, node temperatures and design airflow (where the other rows start)."""
    return numbers(result), result.attic.nodes_K, result.house.airflow_m3_s


def _solve_together(case_raw, rows, arrays, point_of, kind, jobs, progress):
    """[(numbers, None) or (None, why)] per sample, the samples solved as the rows of one network
    (attic.runs.sampled), from the state of the first sample solved alone; a sample the rows leave is solved
    alone. None when the first sample does not solve (the caller then solves them all one by one)."""
    from attic.runs.points import solve_points
    from attic.runs.sampled import sample_base_loads, solve_sampled

    case, net = rows
    m = net.n
    name = case.name
    ((first, _),) = solve_points(case_raw, [point_of(0)], kind, _start_of, 1, None, "uncertainty", name=name,
                                 as_text=False)
    if first is None or first[2] is None:
        return None
    nums0, x0, q0 = first
    vals = solve_sampled(net, sample_base_loads(case, kind, m), kind, x0, q0, progress, case=case)
    vals[np.all([a == a[0] for a in arrays.values()], axis=0)] = nums0  # the same inputs as the first: its numbers
    out = [(tuple(float(v) for v in row), None) for row in vals]
    left = np.flatnonzero(~np.isfinite(vals[:, 2]))  # the equipment load: NaN where the rows left the sample
    if left.size:
        for i, r in zip(left, solve_points(case_raw, [point_of(i) for i in left], kind, numbers, jobs, None,
                                           "uncertainty", as_text=False, name=name), strict=True):
            out[i] = r
    return out


def run_uncertainty(raw, n=DEFAULT_SAMPLES, seed=DEFAULT_SEED, kind="cooling", jobs=1, progress=None,
                    notice=None):
    """Solve the base and every variant of a case dict over the same n samples of its [uncertainty] inputs.

    A variant that sets an uncertain key keeps its own value there (listed in `held`), except for a scale,
    which multiplies the variant's value. Every sample's case is validated before anything is solved.

    The samples of a case are solved as the rows of one network (attic.runs.sampled) where they can share one;
    otherwise (say, an uncertain key that changes the attic's shape) each sample is built and solved as a case,
    and notice (an optional callable of one line of text) is told so before the work starts, as it is slower.
    """
    from attic.case.uncertainty import parse_section, sample_arrays, sample_overrides
    from attic.runs.points import solve_points, validate_points
    from attic.runs.sampled import sampled_network

    base_checked = validate_raw(raw)
    if base_checked.get("uncertainty") is None:
        raise CaseError("[uncertainty]", 'section is missing: name the uncertain inputs, e.g. [uncertainty] then '
                                         f"{EXAMPLE}")
    inputs = parse_section(base_checked["uncertainty"], base_checked)
    if not inputs:  # bands of width zero would read as a certain answer
        raise CaseError("[uncertainty]", f"the section names no inputs: add at least one, e.g. {EXAMPLE}")
    if base_checked[kind] is None:  # said before any sample is built, or any notice about them
        raise CaseError(f"[{kind}]", f"section is missing: the case has no {kind} design condition to sample")
    if n < 2:
        raise CaseError("--samples", f"{n} is not allowed: give at least 2")
    values = draw(inputs, n, seed)
    base_raw = raw_of(raw)
    cases = [("base", base_raw, set())] + [(v["name"], apply_overrides(base_raw, v["set"], f"variant.{v['name']}"),
                                            set(v["set"])) for v in base_checked["variant"]]
    from attic.network.solve import SolveError

    outputs, errors, held, work, unclosed = {}, {}, [], [], 0
    for name, case_raw, sets in cases:
        checked = validate_raw(case_raw)
        fixed = _concrete(checked, sets)
        for inp in inputs:
            if not inp.scale and _concrete(checked, [inp.path]) & fixed:
                held.append((name, inp.path))
            elif not inp.scale and "roof.covering" in fixed and _concrete(checked, [inp.path]) & _COVERING_GIVES:
                # the variant's answer would be the base covering's under another name: refused, not shown
                raise CaseError(f'uncertainty."{inp.path}"', f'variant "{name}" changes roof.covering, and the drawn '
                                f"{inp.path} would replace what that covering gives in every sample, undoing the "
                                f"variant: give the variant its own {inp.path} (its covering's value, aged as you "
                                "judge)")
        arrays = sample_arrays(checked, inputs, values, fixed)
        rows = sampled_network(case_raw, arrays, kind, name) if arrays else None

        def point_of(i, checked=checked, fixed=fixed):
            return sample_overrides(checked, inputs, values[i], fixed)

        checked_points = None
        if rows is None and arrays:  # one by one: every sample validated (the error names it) and built as a case
            try:
                checked_points = validate_points(case_raw, [point_of(i) for i in range(n)], "uncertainty")
            except CaseError as e:
                raise CaseError(e.path, f"{e.args[0]}, a sample of {name!r}: narrow that input's distribution in "
                                        "[uncertainty] to values the case can take") from None
        work.append((name, case_raw, point_of, checked_points, rows, arrays))
    apart = [w[0] for w in work if w[4] is None and w[5]]
    if apart and notice:
        notice(_one_by_one_notice(apart, inputs, n, jobs))
    total = n * len(work)
    done = 0
    for name, case_raw, point_of, checked_points, rows, arrays in work:
        def step(k, _total, base=done):
            if progress:
                progress(base + k, total)

        res = None
        if not arrays:  # the variant sets every uncertain key: its samples are all one case
            ((one, why),) = solve_points(case_raw, [point_of(0)], kind, numbers, 1, None, "uncertainty",
                                         as_text=False, name=name)
            res = [(one, why)] * n
            step(n, total)
        elif rows is not None:
            res = _solve_together(case_raw, rows, arrays, point_of, kind, jobs, step)
        if res is None:
            points = [point_of(i) for i in range(n)]
            res = solve_points(case_raw, points, kind, numbers, jobs, step, "uncertainty", checked_points,
                               as_text=False, name=name)
        done += n
        arr = np.array([r if r is not None else (np.nan,) * len(OUTPUTS) for r, _ in res], dtype=float)
        outputs[name] = {k: arr[:, i] for i, k in enumerate(OUTPUTS)}
        errors[name] = tuple((i, str(e)) for i, (_, e) in enumerate(res) if e)
        unclosed += sum(isinstance(e, SolveError) for _, e in res)
    return UncertaintyResult(base_checked["title"], kind, n, seed, inputs, values, tuple(c[0] for c in cases),
                             outputs, errors, tuple(held), unclosed)


# seconds a sample and case takes one case at a time, measured here on 2 cores with the demo: 0.01 with
# attic.floor_area_ft2 uncertain (0.00006 as rows of one network); 0.017 with site.elevation_ft, whose every
# sample's air pressure needs moist-air table nodes of its own
SECONDS_APART = 0.01
SECONDS_A_SAMPLE = {"site.elevation_ft": 0.017}


def _one_by_one_notice(names, inputs, n, jobs=1):
    """One line: which cases' samples are built one case at a time, and about how long that takes on one core
    (--jobs shares them out: 500 samples of five cases took 27 s on one core here and 19 s on two)."""
    slow = [i.path for i in inputs if i.path in SECONDS_A_SAMPLE]
    each = max([SECONDS_APART] + [SECONDS_A_SAMPLE[p] for p in slow])
    t = each * n * len(names)
    took = f"{t:,.0f} s" if t < 120 else f"{t / 60:,.0f} min"
    cores = f"less with --jobs {jobs}" if jobs > 1 else "--jobs N shares it out over N cores"
    return (f"the samples of {', '.join(repr(x) for x in names)} are built and solved one case at a time (an "
            "uncertain input changes what the rows of one network cannot hold: the attic's shape, the sun, the "
            f"ducts' layout or the air's pressure{' (' + ', '.join(slow) + ')' if slow else ''}): about {took} for "
            f"{n:,} samples on one core of a machine like ours ({cores}; fewer --samples, or a fixed value, is "
            "quicker)")
