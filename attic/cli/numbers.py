"""Numbers for people on the command line: thousands separators, one number of decimals per column, never -0."""

from __future__ import annotations

import re


def _num(v):
    """A number for people: thousands with separators, small values with 3 significant digits, never -0."""
    if isinstance(v, bool) or not isinstance(v, int | float):
        return str(v)
    if abs(v) >= 1000:
        s = f"{v:,.0f}"
    elif abs(v) >= 10:
        s = f"{v:.1f}"
    else:
        s = f"{v:.3g}"
    return _no_minus_zero(s)


def _column(values, digits=None):
    """Every number of a table column with the same decimals, chosen by the column's largest magnitude
    (12,345 / 112.5 / 3.37 / 0.123), so a column reads 3.50 under 3.28, never 3.5; text passes as it is.
    digits : the decimals, where the quantity has its own (tons: 2, as equipment is chosen by the quarter ton)."""
    nums = [abs(v) for v in values if isinstance(v, int | float) and not isinstance(v, bool)]
    top = max(nums, default=0.0)
    if digits is None:
        digits = 0 if top >= 1000 else 1 if top >= 10 else 2 if top >= 1 else 3

    def fmt(v):
        if v is None:  # an output this condition does not give (tons in heating): as run's table shows it
            return "-"
        if isinstance(v, bool) or not isinstance(v, int | float):
            return str(v)
        return _no_minus_zero(f"{v:,.{digits}f}")

    return [fmt(v) for v in values]


def _swept(values):
    """The values of a swept key, all with as many decimals as the one that needs most (0.02 ... 0.10,
    30.0 38.0 49.5); text and booleans pass as they are."""
    nums = [v for v in values if isinstance(v, int | float) and not isinstance(v, bool)]
    digits = max((len(f"{v:g}".partition(".")[2]) for v in nums if "e" not in f"{v:g}"), default=0)
    return [f"{v:.{min(digits, 6)}f}" if v in nums and not isinstance(v, bool) else str(v) for v in values]


def _no_minus_zero(s):
    return s[1:] if re.fullmatch(r"-0(\.0*)?", s) else s


def _val(v):
    """A swept or picked value as the user wrote it (6 not 6.0)."""
    return f"{v:g}" if isinstance(v, float) else str(v)
