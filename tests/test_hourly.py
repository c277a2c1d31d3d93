"""Hours, days and years: profiles, the batched solve against the single one, energy sums, weather files."""

import dataclasses
import datetime as dt
import json

import numpy as np
import pytest
from typer.testing import CliRunner

from attic.case.load import load_cases
from attic.case.weather import Weather, WeatherError, read_weather
from attic.cli import app
from attic.network.solve import solve, solve_hours
from attic.runs.condition import run_condition
from attic.runs.day import DAILY_RANGE_FRACTIONS, hourly_dry_bulb, run_design_day
from attic.runs.year import run_year
from attic.units import K_to_F
from helpers import make_case

runner = CliRunner()
DEMO = "cases/demo.toml"
WEATHER = "cases/demo-weather.csv"

@pytest.fixture(scope="module")
def demo():
    return load_cases(DEMO, only="base")[0]


@pytest.fixture(scope="module")
def weather():
    return read_weather(WEATHER)


def test_daily_range_profile_has_the_shape_of_the_ashrae_table():
    # attic/runs/day.py copies ASHRAE Handbook-Fundamentals (2009-2017) ch. 14, Table 6 (fraction of the
    # daily range by hour) from memory; a second copy here, also from memory, would check nothing. So only
    # the table's shape is tested (fact of the trade: the day is coolest just before sunrise and warmest in
    # mid-afternoon, cooling slowly through the night and warming fast through the morning).
    f = DAILY_RANGE_FRACTIONS
    assert f.shape == (24,) and np.all((f >= 0.0) & (f <= 1.0))
    assert list(np.flatnonzero(f == 1.0) + 1) == [5]  # coolest at 5 a.m.
    assert list(np.flatnonzero(f == 0.0) + 1) == [14, 15]  # warmest at 2-3 p.m.
    assert np.all(np.diff(f[4:14]) < 0)  # warming from 5 a.m. to 2 p.m.
    assert np.all(np.diff(np.r_[f[14:], f[:5]]) > 0)  # cooling from 3 p.m. to 5 a.m.
    assert np.max(np.abs(np.diff(f[4:14]))) > np.max(np.abs(np.diff(np.r_[f[14:], f[:5]])))  # faster by day
    T = hourly_dry_bulb(300.0, 10.0)
    assert np.max(T) == 300.0 and np.min(T) == pytest.approx(290.0)  # the design dry bulb is the peak


def test_plane_sun_through_a_day_matches_pvlib_pipeline():
    # pvlib's own high-level path (Location.get_clearsky and get_total_irradiance at clock times, converted
    # to solar time with pvlib's hour angle) against our solar-time wrapper; same Ineichen turbidity.
    import pandas as pd
    import pvlib

    from attic.physics.solar import clear_sky_on_planes

    lat, tilt, tl = 32.0, 26.57, 3.5
    times = pd.date_range("2025-07-21 06:00", "2025-07-21 19:00", freq="h", tz="UTC")
    loc = pvlib.location.Location(lat, 0.0, tz="UTC", altitude=0.0)  # else pvlib looks up an elevation
    sp = loc.get_solarposition(times)
    cs = loc.get_clearsky(times, model="ineichen", linke_turbidity=tl)
    eot = pvlib.solarposition.equation_of_time_spencer71(times.day_of_year)
    ast = 12.0 + pvlib.solarposition.hour_angle(times, 0.0, eot) / 15.0
    for az in (180.0, 0.0):
        extra = pvlib.irradiance.get_extra_radiation(times)
        ref = pvlib.irradiance.get_total_irradiance(tilt, az, sp["apparent_zenith"], sp["azimuth"], cs["dni"],
                                                    cs["ghi"], cs["dhi"], dni_extra=extra,
                                                    model="haydavies")["poa_global"].to_numpy()
        ours = clear_sky_on_planes(lat, 202, np.asarray(ast), [tilt], [az], linke_turbidity=tl)["poa"][0]
        # the two paths differ only in airmass rounding and refraction detail: 1 % or 3 W/m2
        assert np.allclose(ours, ref, rtol=0.01, atol=3.0)


def test_design_day_matches_single_solve_at_the_design_hour(demo):
    from attic.network.build import build_network

    day = run_design_day(demo)
    # the day runs the case's air handler all hour: the single solve of the same network at hour 15
    single = solve(build_network(demo, demo.cooling))
    assert float(K_to_F(day.attic_air_K[14])) == pytest.approx(float(K_to_F(single.air_K)), abs=0.05)


def test_an_unvented_design_day_carries_its_attic_air_into_the_house_as_the_single_solve_does():
    # the day's hour 15 against the single solve of the same network: the attic's air into the house (sensible
    # and latent) is the same term run adds as "air from the attic"; a vented attic sends none
    from attic.network.build import build_network

    sealed = load_cases(DEMO, only="unvented, R-20 foam under deck")[0]
    day = run_design_day(sealed)
    single = solve(build_network(sealed, sealed.cooling))
    expect = single.attic_air_to_house_w + single.attic_air_to_house_latent_w
    assert abs(expect) > 10.0 and day.attic_air_w[14] == pytest.approx(expect, rel=0.02)
    vented = run_design_day(load_cases(DEMO, only="base")[0])
    assert np.all(vented.attic_air_w == 0.0)


def test_design_day_peaks_in_the_afternoon_for_a_south_roof(demo):
    # common practice, no source: a south-facing dark roof's load peaks in mid-to-late afternoon (clock time).
    # With the roof's heat capacity the model's peak falls at 13-16 h solar time, which is 14-17 h on a
    # daylight-saving clock near the zone's meridian. Quasi-steady it comes no later.
    with_mass = run_design_day(demo, mass=True)
    steady = run_design_day(demo)
    assert 13 <= with_mass.peak_hour <= 16 and 13 <= with_mass.peak_attic_hour <= 16
    assert steady.peak_hour <= with_mass.peak_hour
    # an east/west roof (ridge north-south) does not peak earlier than a north/south one
    ew = run_design_day(make_case({"roof.ridge_azimuth_deg": 0.0, "cooling.daily_range_F": 15}), mass=True)
    ns = run_design_day(make_case({"roof.ridge_azimuth_deg": 90.0, "cooling.daily_range_F": 15}), mass=True)
    assert ew.peak_attic_hour >= ns.peak_attic_hour


def test_heat_capacity_tends_to_the_steady_day_and_trims_the_peak(demo):
    steady = run_design_day(demo)
    tiny = dataclasses.replace(demo, heat_capacity_outer=1e-3, heat_capacity_inner=1e-3)
    assert np.max(np.abs(run_design_day(tiny, mass=True).attic_air_K - steady.attic_air_K)) < 1e-4
    heavy = run_design_day(demo, mass=True)
    assert heavy.outer_K.max() < steady.outer_K.max()  # storage trims the deck's peak
    # and over the day it stores and returns the same heat: the mean deck temperature barely moves
    assert abs(heavy.outer_K.mean() - steady.outer_K.mean()) < 0.3


def test_batched_solve_equals_single_solves_on_a_sample_of_hours(demo, weather):
    from attic.runs.year import year_network

    a, b = 2000, 2400  # spring: cooling, heating and equipment-off hours
    span = Weather(weather.times[a:b], weather.T_dry[a:b], weather.T_dew[a:b], None, weather.ghi[a:b], None, None,
                   weather.wind[a:b])
    net, _ = year_network(demo, span)
    assert set(np.unique(net.mode)) == {-1, 0, 1}
    batch = solve_hours(net)
    for i in range(0, net.n, 23):
        one = solve(net.take(slice(i, i + 1)))  # scipy.optimize.root on that hour alone
        assert float(K_to_F(one.air_K)) == pytest.approx(float(K_to_F(batch.air_K[i])), abs=0.05)
        assert np.allclose(one.outer_K, batch.outer_K[i], atol=0.03)


def test_constant_weather_year_is_n_times_the_steady_result(demo):
    # a span of identical hours must give n times the single design-condition result (no sun). The design
    # state runs the whole hour at the airflow that carries the load; an air handler of exactly that airflow
    # must then run the whole hour of the year too (part-load runtime 1), and the two states are the same.
    c = demo.cooling
    n = 500
    # the same clock hour every day, so that the sky's hourly correction is the same in every hour too
    times = [dt.datetime(2025, 7, 1) + dt.timedelta(days=i) for i in range(n)]
    from ducts import moist_air

    T_dew = float(moist_air.dew_point(c.T_out, demo.pressure, c.W_out))
    w = Weather.constant(times, c.T_out, T_dew, 0.0, c.wind / demo.wind_factor)
    night = dataclasses.replace(c, irradiance=0.0, solar_hour=0.0)
    steady = run_condition(demo, night)
    sized = dataclasses.replace(demo, ducts=demo.ducts.with_airflow(steady.house.airflow_m3_s))
    y = run_year(sized, w)
    assert np.allclose(y.hourly["runtime"], 1.0, atol=2e-3) and not np.any(y.hourly["short"])
    coil = y.hourly["coil_w"]
    assert np.allclose(coil, coil[0])
    # the year takes its properties from tables of HAPropsSI values, the single solve calls it directly
    assert y.totals["cooling"]["coil"] == pytest.approx(n * 3600.0 * steady.house.equipment_w, rel=5e-4)
    assert y.totals["cooling"]["ducts"] == pytest.approx(n * 3600.0 * steady.house.ducts_w, rel=5e-3)


def test_year_and_heating_take_the_sky_hourly_correction(demo):
    # Berdahl & Martin (1984), Solar Energy 32(5): +0.013 cos(2 pi t / 24) on the clear-sky emissivity, t the
    # hour from midnight: midnight's sky is 0.026 more emissive than noon's at the same dew point
    from attic.network.build import build_network
    from attic.runs.year import year_network
    from ducts import moist_air

    c = demo.cooling
    T_dew = float(moist_air.dew_point(c.T_out, demo.pressure, c.W_out))
    times = [dt.datetime(2025, 7, 1, 0), dt.datetime(2025, 7, 1, 6), dt.datetime(2025, 7, 1, 12)]
    net, _ = year_network(demo, Weather.constant(times, c.T_out, T_dew, 0.0, 1.0))
    eps = (net.T_sky / net.T_out) ** 4
    assert eps[0] - eps[2] == pytest.approx(0.026, abs=1e-9)
    assert eps[1] == pytest.approx(0.5 * (eps[0] + eps[2]), abs=1e-9)  # cos(pi/2) = 0 at 6 h
    # heating is taken at its design hour near sunrise (6 h), where the correction is cos(pi/2) = 0
    from attic.case.load import HEATING_DESIGN_HOUR
    from attic.physics.sky import sky_emissivity_berdahl_martin

    h = demo.heating
    hnet = build_network(demo, h)
    T_dp = float(moist_air.dew_point(h.T_out, demo.pressure, h.W_out))
    expect = sky_emissivity_berdahl_martin(T_dp, HEATING_DESIGN_HOUR, demo.pressure)
    assert (hnet.T_sky[0] / h.T_out) ** 4 == pytest.approx(expect, abs=1e-12)


def test_annual_energy_is_the_sum_of_its_hours_and_of_its_spans(demo, weather):
    def span(a, b):
        return Weather(weather.times[a:b], weather.T_dry[a:b], weather.T_dew[a:b], None, weather.ghi[a:b], None, None,
                       weather.wind[a:b])

    # halves of 300 hours: long enough that all three runs take properties the same way (ducts.moist_air)
    whole = run_year(demo, span(2000, 2600))
    first, second = run_year(demo, span(2000, 2300)), run_year(demo, span(2300, 2600))
    for mode in ("cooling", "heating"):
        for part in ("coil", "ducts", "ceiling"):
            assert whole.totals[mode][part] == pytest.approx(first.totals[mode][part] + second.totals[mode][part],
                                                             rel=1e-6, abs=1e-3)
    sel = whole.hourly["mode"] == 1
    assert whole.totals["cooling"]["coil"] == pytest.approx(np.sum(whole.hourly["coil_w"][sel]) * 3600.0)
    # what a short air handler leaves undelivered is not at the coil
    parts = sum(whole.totals["cooling"][p] for p in ("base", "ceiling", "attic_air", "ducts")) \
        - whole.totals["cooling"]["unmet"]
    assert whole.totals["cooling"]["coil"] == pytest.approx(parts, rel=1e-9)
    from attic.present.hours import year_output

    d = year_output(whole, seer=15.0)
    assert d["cooling"]["electricity_kwh"] == pytest.approx(whole.energy("cooling", "coil") / 15000.0, rel=1e-3)


def test_hours_above_thresholds(demo, weather):
    from attic.units import F_to_K

    y = run_year(demo, weather, [float(F_to_K(t)) for t in (90.0, 110.0)])
    counts = list(y.hours_above.values())
    T = K_to_F(y.hourly["attic_air_K"])
    assert counts == [int(np.sum(T > 90.0)), int(np.sum(T > 110.0))] and counts[0] > counts[1] > 0


def write(tmp_path, text, name="w.csv"):
    p = tmp_path / name
    p.write_text(text)
    return p


GOOD = "timestamp,drybulb_F,dewpoint_F,ghi_w_m2,wind_mph\n" + "".join(
    f"2025-07-01 {h:02d}:00,{80 + h % 5},{65},{max(0, 800 - 100 * abs(h - 12))},5\n" for h in range(24))


@pytest.mark.parametrize("text, expect", [
    (GOOD.replace("dewpoint_F", "humidity"), ["row 1", "no humidity column", "dewpoint_F"]),
    (GOOD.replace("2025-07-01 05:00,80,", "2025-07-01 05:00,hot,"), ["row 7", "column drybulb_F", "'hot'"]),
    (GOOD.replace("2025-07-01 06:00,", "2025-07-01 05:00,", 1), ["row 8", "column timestamp", "repeats"]),
    ("\n".join(line for line in GOOD.splitlines() if not line.startswith("2025-07-01 09:00")) + "\n",
     ["row 11", "column timestamp", "1 hour(s) missing"]),
    (GOOD.replace("2025-07-01 03:00,83", "2025-07-01 03:00,183"), ["row 5", "column drybulb_F", "outside"]),
    (GOOD.replace(",65,", ",90,", 1), ["row 2", "dewpoint_F", "above the dry bulb"]),
    (GOOD.replace("2025-07-01 02:00", "July 1st"), ["row 4", "column timestamp", "not a time"]),
    (GOOD.replace("wind_mph", "wind_mph,dni_w_m2").replace(",5\n", ",5,0\n"), ["row 1", "both dni_w_m2 and dhi_w_m2"]),
])
def test_malformed_weather_names_row_and_column(tmp_path, text, expect):
    p = write(tmp_path, text)
    with pytest.raises(WeatherError) as e:
        read_weather(p)
    for piece in expect:
        assert piece in str(e.value), str(e.value)
    res = runner.invoke(app, ["year", DEMO, "--weather", str(p)])
    assert res.exit_code == 2 and "Traceback" not in res.output


def test_weather_units_and_columns(tmp_path):
    si = GOOD.replace("drybulb_F", "drybulb_C").replace("dewpoint_F", "rh").replace("wind_mph", "wind_m_s")
    si = "\n".join([si.splitlines()[0]] + [",".join([r.split(",")[0], "30", "0.5", r.split(",")[3], "2"])
                                          for r in si.splitlines()[1:]]) + "\n"
    w = read_weather(write(tmp_path, si))
    assert w.n == 24 and np.allclose(w.T_dry, 303.15) and np.allclose(w.rh, 0.5) and np.allclose(w.wind, 2.0)
    f = read_weather(write(tmp_path, GOOD, "f.csv"))
    assert f.T_dry[0] == pytest.approx((80 - 32) / 1.8 + 273.15) and f.wind[0] == pytest.approx(5 * 0.44704)


def test_year_needs_longitude(tmp_path):
    p = tmp_path / "c.toml"
    p.write_text(open(DEMO).read().replace("longitude_deg = -91.47", ""))
    res = runner.invoke(app, ["year", str(p), "--weather", str(write(tmp_path, GOOD))])
    assert res.exit_code == 2 and "site.longitude_deg" in res.output


def test_year_and_day_commands(tmp_path):
    w = write(tmp_path, GOOD)
    res = runner.invoke(app, ["year", DEMO, "--weather", str(w), "-f", "json", "--seer", "14", "-n", "base"])
    assert res.exit_code == 0, res.output
    (d,) = json.loads(res.output)
    assert d["hours"] == 24 and "electricity_kwh" in d["cooling"] and d["cooling"]["total_kwh"] > 0
    res = runner.invoke(app, ["year", DEMO, "--weather", str(w), "-f", "csv", "-n", "base"])
    assert res.exit_code == 0 and len(res.output.strip().splitlines()) == 25
    res = runner.invoke(app, ["day", DEMO, "-f", "json", "-n", "base"])
    (day,) = json.loads(res.output)
    assert len(day["hours"]) == 24 and 1 <= day["peak_hour"] <= 24
    png = tmp_path / "d.png"
    assert runner.invoke(app, ["day", DEMO, "-n", "base", "--plot", str(png)]).exit_code == 0
    assert png.read_bytes()[:4] == b"\x89PNG"


def test_heatmap_shows_the_results(demo, weather):
    from attic.present.plots import attic_heatmap

    w = Weather(weather.times[:72], weather.T_dry[:72], weather.T_dew[:72], None, weather.ghi[:72], None, None,
                weather.wind[:72])
    y = run_year(demo, w)
    fig = attic_heatmap([y])
    img = fig.axes[0].images[0].get_array()
    assert img.shape == (24, 3)
    assert np.allclose(np.asarray(img).T.ravel(), K_to_F(y.hourly["attic_air_K"]))
    assert "attic air, °F" in fig.axes[1].get_ylabel()


def test_the_design_day_says_which_airflow_its_ducts_run_at(tmp_path):
    # run sizes the design airflow, day runs the case's own: the day's output names it, so the two are not confused
    from helpers import raw_case, to_toml

    path = tmp_path / "c.toml"
    path.write_text(to_toml(raw_case(with_ducts=True)))
    res = CliRunner().invoke(app, ["day", str(path), "-f", "json"])
    out = json.loads(res.stdout)
    day = out[0] if isinstance(out, list) else out
    assert day["air_handler_cfm"] == pytest.approx(raw_case(with_ducts=True)["air_handler"]["airflow_cfm"])
