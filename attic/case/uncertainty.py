"""The case file's optional [uncertainty] section: uncertain inputs named by their dotted key paths, each
with a distribution, validated like every other key.

    [uncertainty]
    "leakage.supply_fraction" = { triangular = [0.04, 0.08, 0.15] }    # min, mode, max
    "roof.solar_reflectance"  = { uniform = [0.05, 0.12] }              # min, max
    "cooling.wind_mph"        = { normal = [7.5, 2.5], min = 0 }        # mean, standard deviation
    "duct.*.r_value"          = { scale = { uniform = [0.8, 1.0] } }    # a multiplier of the case's value

A normal distribution is cut at min and max when given, and always at 6 standard deviations (a tail that
far out is never drawn in practice, and the cut keeps every draw inside the key's allowed range).
Drawing maps a number u in [0, 1) through the distribution's inverse CDF (scipy.stats), so a Latin
hypercube over u gives a Latin hypercube over the inputs.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from attic.case.schema import SECTIONS

KINDS = ("triangular", "uniform", "normal")
NORMAL_CUT_SD = 6.0


@dataclass(frozen=True)
class Distribution:
    """One distribution of the section. params: (min, mode, max), (min, max) or (mean, sd); lo/hi: the range
    every draw stays in (for normal: min/max, else mean -/+ 6 sd)."""

    kind: str
    params: tuple
    lo: float
    hi: float

    def draw(self, u):
        """Values at the cumulative probabilities u (array in [0, 1)), by the inverse CDF."""
        u = np.asarray(u, dtype=float)
        if self.hi == self.lo:  # zero width: the value itself, exactly
            return np.full(u.shape, float(self.lo))
        from scipy import stats

        return self.frozen(stats).ppf(u)

    def frozen(self, stats):
        """The scipy.stats frozen distribution (width above zero)."""
        if self.kind == "uniform":
            a, b = self.params
            return stats.uniform(loc=a, scale=b - a)
        if self.kind == "triangular":
            a, c, b = self.params
            return stats.triang((c - a) / (b - a), loc=a, scale=b - a)
        mu, sd = self.params
        return stats.truncnorm((self.lo - mu) / sd, (self.hi - mu) / sd, loc=mu, scale=sd)


@dataclass(frozen=True)
class UncertainInput:
    """One uncertain key: its path as written, the distribution, and whether it scales the case's value."""

    path: str
    dist: Distribution
    scale: bool

    @property
    def label(self):
        """The input's name in tables, JSON and CSV headers; plain ASCII, as spreadsheets read CSV in the local
        code page unless told otherwise."""
        return f"{self.path} (x case value)" if self.scale else self.path


class _Bad(ValueError):
    pass


def _numbers(v, n, what):
    if (not isinstance(v, list) or len(v) != n
            or not all(isinstance(x, int | float) and not isinstance(x, bool) for x in v)):
        raise _Bad(f"{what} takes a list of {n} numbers")
    if not all(np.isfinite(v)):
        raise _Bad(f"{what} takes finite numbers")
    return [float(x) for x in v]


def parse_distribution(spec):
    """A Distribution from its TOML table, e.g. {uniform = [0.05, 0.12]}; _Bad with plain words if wrong."""
    if not isinstance(spec, dict):
        raise _Bad("give a table like { uniform = [MIN, MAX] }")
    kinds = [k for k in spec if k in KINDS]
    extra = [k for k in spec if k not in KINDS + ("min", "max")]
    if extra:
        raise _Bad(f'"{extra[0]}" is not a distribution: give one of {", ".join(KINDS)}, or scale = {{ ... }}')
    if len(kinds) != 1:
        raise _Bad(f"give exactly one of {', '.join(KINDS)}")
    kind = kinds[0]
    if kind != "normal" and ("min" in spec or "max" in spec):
        raise _Bad("min and max go with normal only")
    if kind == "uniform":
        a, b = _numbers(spec[kind], 2, "uniform")
        if b < a:
            raise _Bad(f"uniform = [{a:g}, {b:g}]: the maximum is below the minimum")
        return Distribution(kind, (a, b), a, b)
    if kind == "triangular":
        a, c, b = _numbers(spec[kind], 3, "triangular")
        if not a <= c <= b:
            raise _Bad(f"triangular = [{a:g}, {c:g}, {b:g}]: give [MIN, MODE, MAX] with MIN <= MODE <= MAX")
        return Distribution(kind, (a, c, b), a, b)
    mu, sd = _numbers(spec[kind], 2, "normal")
    if sd < 0:
        raise _Bad(f"normal = [{mu:g}, {sd:g}]: the standard deviation cannot be negative")
    lo, hi = mu - NORMAL_CUT_SD * sd, mu + NORMAL_CUT_SD * sd
    for side in ("min", "max"):
        if side in spec:
            x = spec[side]
            if isinstance(x, bool) or not isinstance(x, int | float) or not np.isfinite(x):
                raise _Bad(f"{side} takes a number")
            lo, hi = (max(lo, float(x)), hi) if side == "min" else (lo, min(hi, float(x)))
    if spec.get("min", -np.inf) >= spec.get("max", np.inf) and sd > 0:
        raise _Bad(f"min = {spec['min']:g} is not below max = {spec['max']:g}")
    if not spec.get("min", -np.inf) <= mu <= spec.get("max", np.inf):
        raise _Bad(f"the mean {mu:g} lies outside min and max")
    if sd == 0:
        lo = hi = mu
    return Distribution(kind, (mu, sd), lo, hi)


def targets(checked, path):
    """The concrete keys a dotted path names in a validated case: [(concrete path, Key, value)].

    duct.*.KEY names every duct (duct.N.KEY, N from 1), duct.NAME.KEY and duct.N.KEY one; other paths
    are SECTION.KEY. _Bad with plain words when the path names nothing.
    """
    from attic.case.validate import _suggest

    parts = path.split(".")
    if parts[0] == "duct":
        if len(parts) != 3:
            raise _Bad("write duct.*.KEY, duct.NAME.KEY or duct.N.KEY")
        sel, key = parts[1], parts[2]
        if key not in SECTIONS["duct"]:
            raise _Bad("unknown duct key" + _suggest(key, "duct", f"duct.{sel}"))
        ducts = checked["duct"]
        idx = [i for i, d in enumerate(ducts) if sel == "*" or d["name"] == sel
               or (sel.isdigit() and int(sel) == i + 1)]
        if not idx:
            raise _Bad("matches no duct of the case")
        return [(f"duct.{i + 1}.{key}", SECTIONS["duct"][key], ducts[i][key]) for i in idx]
    if len(parts) != 2 or parts[0] not in SECTIONS or parts[0] in ("", "duct"):
        raise _Bad("is not a key path like roof.solar_reflectance" + _suggest(parts[-1], ""))
    sec, key = parts
    if key not in SECTIONS[sec]:
        raise _Bad("unknown key" + _suggest(key, sec))
    section = checked.get(sec)
    return [(path, SECTIONS[sec][key], None if section is None else section[key])]


def parse_section(section, checked):
    """The [uncertainty] section of a validated case dict -> tuple of UncertainInput.

    Raises CaseError naming uncertainty."PATH" for an unknown path, a key that is not a number, impossible
    bounds, or draws that would leave the key's allowed range.
    """
    from attic.case.errors import CaseError
    from attic.case.validate import _check_value

    if not isinstance(section, dict):
        raise CaseError("uncertainty", 'write it as a table: [uncertainty] then "KEY.PATH" = { uniform = [MIN, MAX] }')
    out = []
    for path, spec in section.items():
        where = f'uncertainty."{path}"'
        try:
            scale = isinstance(spec, dict) and "scale" in spec
            if scale and len(spec) != 1:
                raise _Bad("scale = { ... } stands alone: put the distribution inside it")
            dist = parse_distribution(spec["scale"] if scale else spec)
            for concrete, key, value in targets(checked, path):
                if key.kind != "float":
                    raise _Bad(f"only number keys can be uncertain; this one takes {key.allowed()}")
                if scale:
                    if value is None:
                        raise _Bad(f"{concrete} has no value in the case to scale: give it, or a distribution of "
                                   "its own values")
                    ends = (value * dist.lo, value * dist.hi)
                else:
                    ends = (dist.lo, dist.hi)
                for end in ends:
                    try:
                        _check_value(concrete, key, end)
                    except CaseError:
                        raise _Bad(f"draws reach {end:g}, outside what {concrete} allows: {key.allowed()}") from None
        except _Bad as e:
            raise CaseError(where, str(e)) from None
        out.append(UncertainInput(path, dist, scale))
    return tuple(out)


def sample_arrays(checked, inputs, values, fixed=()):
    """The dotted-path overrides of many samples for a validated case (base or variant): {concrete path: (m,)
    array}.

    values : (m, len(inputs)) drawn values (multipliers for scale inputs); fixed : concrete paths the variant
    sets, which keep the variant's value for absolute distributions (a scale still multiplies the variant's value).
    """
    over = {}
    for inp, col in zip(inputs, np.asarray(values, dtype=float).T, strict=True):
        for concrete, _, value in targets(checked, inp.path):
            if inp.scale:
                over[concrete] = value * col
            elif concrete not in fixed:
                over[concrete] = col.copy()
    return over


def sample_overrides(checked, inputs, values, fixed=()):
    """The dotted-path overrides of one sample (values: one per input), as sample_arrays gives them."""
    return {k: float(a[0]) for k, a in sample_arrays(checked, inputs, [values], fixed).items()}
