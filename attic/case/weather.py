"""Hourly weather from a plain CSV whose column names carry their units.

Columns (one of each group; names are case-sensitive):

    timestamp                      local standard time, ISO 8601: 2025-07-21 15:00 or 2025-07-21T15:00
    drybulb_F | drybulb_C          dry-bulb temperature
    dewpoint_F | dewpoint_C | rh | rh_pct
                                   humidity: dew point, relative humidity 0-1, or relative humidity in %
    ghi_w_m2 | ghi_btuh_ft2        global horizontal irradiance
    dni_w_m2, dhi_w_m2             optional, both or neither: direct normal and diffuse horizontal
    wind_mph | wind_m_s            wind speed at the weather station (10 m)

Rows must step by exactly one hour. A missing column, a value that is not a number, an impossible
value, a duplicate hour or a gap is a WeatherError naming the row (counting the header as row 1)
and the column.
"""

from __future__ import annotations

import csv
import datetime as dt
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from attic.units import C_to_K, F_to_K

GROUPS = {
    "drybulb": ("drybulb_F", "drybulb_C"),
    "humidity": ("dewpoint_F", "dewpoint_C", "rh", "rh_pct"),
    "ghi": ("ghi_w_m2", "ghi_btuh_ft2"),
    "wind": ("wind_mph", "wind_m_s"),
}
OPTIONAL = ("dni_w_m2", "dhi_w_m2")
RANGES = {  # column: (low, high) in its own unit
    "drybulb_F": (-80, 140), "drybulb_C": (-62, 60), "dewpoint_F": (-100, 95), "dewpoint_C": (-73, 35),
    "rh": (0, 1), "rh_pct": (0, 100), "ghi_w_m2": (0, 1500), "ghi_btuh_ft2": (0, 476), "dni_w_m2": (0, 1400),
    "dhi_w_m2": (0, 900), "wind_mph": (0, 120), "wind_m_s": (0, 54),
}


class WeatherError(ValueError):
    """A weather file that cannot be used: names the file, the row and the column."""


@dataclass(frozen=True)
class Weather:
    """Hourly weather in SI: times (naive local standard time), K, kg/kg via dew point, W/m2, m/s."""

    times: tuple
    T_dry: np.ndarray
    T_dew: np.ndarray | None
    rh: np.ndarray | None
    ghi: np.ndarray
    dni: np.ndarray | None
    dhi: np.ndarray | None
    wind: np.ndarray

    @property
    def n(self):
        return len(self.times)

    @staticmethod
    def constant(times, T_dry, T_dew, ghi, wind):
        n = len(times)
        return Weather(tuple(times), np.full(n, T_dry), np.full(n, T_dew), None, np.full(n, ghi), None, None,
                       np.full(n, wind))


def _parse_time(text, row, path):
    t = text.strip().replace("T", " ")
    try:
        return dt.datetime.fromisoformat(t)
    except ValueError:
        raise WeatherError(f"{path}: row {row}, column timestamp: {text!r} is not a time like 2025-07-21 15:00") \
            from None


def read_weather(path):
    """Read and check a weather CSV; returns Weather (SI)."""
    path = Path(path)
    try:
        f = path.open(newline="", encoding="utf-8")
    except OSError as e:
        raise WeatherError(f"cannot read the weather file {path}: {e.strerror}") from None
    with f:
        reader = csv.reader(f)
        try:
            header = [h.strip() for h in next(reader)]
        except StopIteration:
            raise WeatherError(f"{path}: the file is empty") from None
        if "timestamp" not in header:
            raise WeatherError(f"{path}: row 1: no timestamp column (columns: {', '.join(header)})")
        chosen = {}
        for g, names in GROUPS.items():
            have = [n for n in names if n in header]
            if not have:
                raise WeatherError(f"{path}: row 1: no {g} column; give one of {', '.join(names)}")
            if len(have) > 1:
                raise WeatherError(f"{path}: row 1: give one {g} column, not {' and '.join(have)}")
            chosen[g] = have[0]
        opt = [n for n in OPTIONAL if n in header]
        if len(opt) == 1:
            raise WeatherError(f"{path}: row 1: give both dni_w_m2 and dhi_w_m2, or neither")
        cols = ["timestamp"] + list(chosen.values()) + opt
        idx = {c: header.index(c) for c in cols}
        times, data = [], {c: [] for c in cols[1:]}
        for row_no, row in enumerate(reader, start=2):
            if not row or all(not c.strip() for c in row):
                continue
            if len(row) < len(header):
                raise WeatherError(f"{path}: row {row_no}: {len(row)} values for {len(header)} columns")
            t = _parse_time(row[idx["timestamp"]], row_no, path)
            if times:
                step = (t - times[-1]).total_seconds() / 3600.0
                if step == 0:
                    raise WeatherError(f"{path}: row {row_no}, column timestamp: {t} repeats the hour before it")
                if step < 0:
                    raise WeatherError(f"{path}: row {row_no}, column timestamp: {t} is earlier than the row before")
                if step != 1:
                    raise WeatherError(f"{path}: row {row_no}, column timestamp: {t} follows {times[-1]}: "
                                       f"{step - 1:g} hour(s) missing (rows must step by one hour)")
            times.append(t)
            for c in cols[1:]:
                text = row[idx[c]].strip()
                try:
                    v = float(text)
                except ValueError:
                    raise WeatherError(f"{path}: row {row_no}, column {c}: {text!r} is not a number") from None
                lo, hi = RANGES[c]
                if not lo <= v <= hi or v != v:
                    raise WeatherError(f"{path}: row {row_no}, column {c}: {v:g} is outside {lo:g} to {hi:g}")
                data[c].append(v)
    if not times:
        raise WeatherError(f"{path}: no data rows")
    a = {c: np.array(v) for c, v in data.items()}
    db = chosen["drybulb"]
    T = F_to_K(a[db]) if db.endswith("_F") else C_to_K(a[db])
    hum = chosen["humidity"]
    T_dew = rh = None
    if hum.startswith("dewpoint"):
        T_dew = F_to_K(a[hum]) if hum.endswith("_F") else C_to_K(a[hum])
        above = np.flatnonzero(T_dew > T + 0.05)
        if len(above):
            raise WeatherError(f"{path}: row {above[0] + 2}, column {hum}: the dew point is above the dry bulb")
    else:
        rh = a[hum] / 100.0 if hum == "rh_pct" else a[hum]
    ghi = a[chosen["ghi"]] * (3.154591 if chosen["ghi"] == "ghi_btuh_ft2" else 1.0)
    wind = a[chosen["wind"]] * (0.44704 if chosen["wind"] == "wind_mph" else 1.0)
    return Weather(tuple(times), T, T_dew, rh, ghi, a.get("dni_w_m2"), a.get("dhi_w_m2"), wind)
