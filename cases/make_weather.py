"""Make cases/demo-weather.csv: one INVENTED year of hourly weather for the demo case.

    python cases/make_weather.py

Not a measured year, and not any real station's. It is built from:
- sun: the ASHRAE clear-sky model, E_b = E_0 exp(-tau_b m^ab), E_d = E_0 exp(-tau_d m^ad), with
  ab = 1.454 - 0.406 tau_b - 0.268 tau_d + 0.021 tau_b tau_d and ad = 0.507 + 0.205 tau_b - 0.080 tau_d
  - 0.190 tau_b tau_d (ASHRAE Handbook-Fundamentals (2017) ch. 14, eqs. (17)-(19); values from memory), the
  Kasten-Young air mass and pvlib's solar position, with invented monthly tau values and a seeded random
  cloudiness per day;
- dry bulb: a mean daily high from one smooth annual cycle (no place's normals),
      high(d) = HIGH_MEAN + HIGH_AMP cos(2 pi (d - PEAK_DAY) / 365)   [°F, d the day of the year],
  a daily range RANGE_MEAN - RANGE_AMP cos(2 pi (d - PEAK_DAY) / 365) (narrower in summer), shaped hour by
  hour with ASHRAE's daily-range fractions (attic.runs.day.DAILY_RANGE_FRACTIONS), plus seeded day-to-day
  swings;
- dew point: DEW_MEAN + DEW_AMP cos(2 pi (d - PEAK_DAY) / 365) with seeded variation, never above the dry bulb;
- wind: a daily cycle with seeded variation.
The same seed gives the same file.
"""

from __future__ import annotations

import datetime as dt
import sys
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

LAT, LON, UTC_OFFSET = 28.63, -91.47, -6.0  # the demo case's invented site
YEAR = 2025
PEAK_DAY = 205  # the warmest day of the invented year (late July)
HIGH_MEAN, HIGH_AMP = 78.0, 15.0  # °F: mean daily highs from 63 (late January) to 93 (late July)
RANGE_MEAN, RANGE_AMP = 16.0, 2.0  # °F: daily ranges from 14 in summer to 18 in winter
DEW_MEAN, DEW_AMP = 60.0, 14.0  # °F: mean dew points from 46 to 74
TAU_B = [0.33, 0.35, 0.37, 0.40, 0.44, 0.50, 0.55, 0.53, 0.47, 0.40, 0.35, 0.33]  # invented
TAU_D = [2.45, 2.35, 2.30, 2.25, 2.20, 2.10, 2.00, 2.05, 2.15, 2.30, 2.40, 2.45]  # invented


def ashrae_clear_sky(zenith_deg, doy, tau_b, tau_d):
    """Beam normal and diffuse horizontal irradiance of ASHRAE's clear-sky model, W/m2."""
    beta = 90.0 - np.asarray(zenith_deg, float)
    E0 = 1367.0 * (1 + 0.033 * np.cos(np.radians(360.0 * (doy - 3) / 365.0)))
    up = beta > 0
    b = np.where(up, beta, 1.0)
    m = 1.0 / (np.sin(np.radians(b)) + 0.50572 * (6.07995 + b) ** -1.6364)  # Kasten & Young (1989)
    ab = 1.454 - 0.406 * tau_b - 0.268 * tau_d + 0.021 * tau_b * tau_d
    ad = 0.507 + 0.205 * tau_b - 0.080 * tau_d - 0.190 * tau_b * tau_d
    Eb = np.where(up, E0 * np.exp(-tau_b * m**ab), 0.0)
    Ed = np.where(up, E0 * np.exp(-tau_d * m**ad), 0.0)
    return Eb, Ed


def main(path=ROOT / "cases" / "demo-weather.csv", seed=2025):
    import pandas as pd
    import pvlib

    from attic.runs.day import DAILY_RANGE_FRACTIONS

    rng = np.random.default_rng(seed)
    start = dt.datetime(YEAR, 1, 1)
    times = [start + dt.timedelta(hours=i) for i in range(8760)]
    tz = dt.timezone(dt.timedelta(hours=UTC_OFFSET))
    idx = pd.DatetimeIndex(times).tz_localize(tz)
    pos = pvlib.solarposition.get_solarposition(idx, LAT, LON)
    zen = pos["apparent_zenith"].to_numpy()
    month = np.array([t.month for t in times]) - 1
    doy = np.array([t.timetuple().tm_yday for t in times])
    day = doy - 1
    clear = np.clip(rng.beta(5.0, 1.3, 365), 0.25, 1.0)  # mostly clear days, some cloudy
    swing = np.convolve(rng.normal(0, 4.0, 365 + 4), np.ones(5) / 5, mode="valid")  # °F, smooth day to day
    Eb, Ed = ashrae_clear_sky(zen, doy, np.array(TAU_B)[month], np.array(TAU_D)[month])
    k = clear[day]
    cosz = np.clip(np.cos(np.radians(zen)), 0, None)
    ghi = k * Eb * cosz + Ed * (1.0 + 0.6 * (1.0 - k))
    hour = np.array([t.hour for t in times])
    frac = DAILY_RANGE_FRACTIONS[np.where(hour == 0, 23, hour - 1)]
    season = np.cos(2.0 * np.pi * (doy - PEAK_DAY) / 365.0)
    high = HIGH_MEAN + HIGH_AMP * season + swing[day] - 6.0 * (1.0 - k)
    daily_range = RANGE_MEAN - RANGE_AMP * season
    db = high - frac * daily_range * (0.6 + 0.4 * k[...])
    dew = np.minimum(DEW_MEAN + DEW_AMP * season + np.convolve(rng.normal(0, 3.0, 8760 + 23), np.ones(24) / 24,
                                                               mode="valid"), db - 0.5)
    wind = np.clip(6.0 + 3.0 * np.sin(np.radians(15.0 * (hour - 9))) + rng.normal(0, 1.5, 8760), 0.0, None)
    with open(path, "w", encoding="utf-8", newline="") as f:
        f.write("timestamp,drybulb_F,dewpoint_F,ghi_w_m2,wind_mph\n")
        for i, t in enumerate(times):
            f.write(f"{t:%Y-%m-%d %H:%M},{db[i]:.1f},{dew[i]:.1f},{ghi[i]:.0f},{wind[i]:.1f}\n")
    print(f"wrote {path}: 8760 invented hours for latitude {LAT}, longitude {LON}, UTC{UTC_OFFSET:+g}")


if __name__ == "__main__":
    main()
