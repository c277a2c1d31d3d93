"""Money: the economics arithmetic against hand calculations and interest tables, the [money] keys, and the
money rows of compare and report (annual energy taken from the year runs, never guessed)."""

import copy
import doctest
import json
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

from attic.case.load import load_cases, validate_raw
from attic.cli import app
from attic.runs import economics as eco
from attic.runs.money import NEEDS_WEATHER, annual_energy, money_study
from attic.runs.study import CompareRow, Comparison
from attic.runs.year import YearResult
from attic.units import BTU
from helpers import raw_case, to_toml

runner = CliRunner()
ROOT = Path(__file__).resolve().parent.parent
DEMO = ROOT / "cases" / "demo.toml"
WEATHER = ROOT / "cases" / "demo-weather.csv"
GOLDEN = Path(__file__).resolve().parent / "golden"

MONEY = {"electricity_per_kwh": 0.15, "heating_fuel": "heat-pump", "seer": 15, "hspf": 8.5,
         "equipment_per_ton": 1000, "life_years": 10, "discount_rate": 0.05}


def test_economics_examples_run_as_doctests():
    result = doctest.testmod(eco)
    assert result.attempted >= 10 and result.failed == 0


# ---- the arithmetic ---------------------------------------------------------------------------------

@pytest.mark.parametrize("rate,years,table", [
    # Newnan, Eschenbach & Lavelle, Engineering Economic Analysis, compound interest tables, column P/A
    # (values from memory)
    (0.10, 10, 6.1446),
    (0.05, 20, 12.4622),
    (0.05, 10, 7.7217),
    (0.08, 10, 6.7101),
])
def test_present_worth_factor_matches_the_interest_tables(rate, years, table):
    assert eco.uniform_series_present_worth(rate, years) == pytest.approx(table, abs=6e-5)


@settings(max_examples=40, deadline=None)
@given(rate=st.floats(0.0, 0.3), years=st.integers(0, 50))
def test_present_worth_factor_is_the_sum_of_discounted_payments(rate, years):
    # independent calculation: P/A is the sum over t = 1..n of (1 + i)^-t (definition of present worth)
    direct = sum((1.0 + rate) ** -t for t in range(1, years + 1))
    assert eco.uniform_series_present_worth(rate, years) == pytest.approx(direct, rel=1e-9, abs=1e-12)


@settings(max_examples=30, deadline=None)
@given(cost=st.floats(-5e3, 5e4), saving=st.floats(-500, 5e3), years=st.integers(1, 40))
def test_discount_rate_zero_is_the_plain_sum(cost, saving, years):
    assert eco.net_present_value(cost, saving, 0.0, years) == pytest.approx(-cost + years * saving, abs=1e-6)
    flows = eco.cumulative_cash_flow(cost, saving, 0.0, years)
    assert flows == pytest.approx([-cost + t * saving for t in range(years + 1)], abs=1e-6)


def test_payback_by_hand():
    # 2,000 $ net first cost, 250 $ a year: 2,000 / 250 = 8 years
    assert eco.simple_payback(2000.0, 250.0) == 8.0
    # zero cost and a positive saving pays back at once; a saving of nothing (or a loss) never does
    assert eco.simple_payback(0.0, 50.0) == 0.0
    assert eco.simple_payback(1000.0, 0.0) is None
    assert eco.simple_payback(1000.0, -20.0) is None


def test_equipment_credit_only_when_the_tons_fall():
    assert eco.equipment_credit(3.5, 3.0, 1800.0) == pytest.approx(900.0)  # 0.5 t x 1,800 $/t, by hand
    assert eco.equipment_credit(3.0, 3.0, 1800.0) == 0.0
    assert eco.equipment_credit(3.0, 3.4, 1800.0) == 0.0


def test_fuel_accounting_by_hand():
    # 1 kWh = 3,412.14 Btu (NIST SP 811); 1 therm = 100,000 Btu; SEER/HSPF in Btu per Wh
    assert eco.resistance_kwh(34121.4) == pytest.approx(10.0, rel=1e-6)
    assert eco.gas_therms(4.5e7, 0.9) == pytest.approx(500.0)
    assert eco.electricity_kwh(3.0e7, 12.0) == pytest.approx(2500.0)


# ---- the study, from hand-made year totals ----------------------------------------------------------

def _cases(money=MONEY, cost=600.0):
    raw = raw_case(with_ducts=True)
    raw["money"] = dict(money)
    raw["variant"] = [{"name": "R-8 ducts", "set": {"duct.*.r_value": 8}, "cost": cost}]
    return raw


def _load(tmp_path, raw):
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw))
    return load_cases(p)


def _year(name, cool_btu, heat_btu, hours=8760):
    j = {"cooling": {"coil": cool_btu * BTU}, "heating": {"coil": heat_btu * BTU}}
    return YearResult(name, "t", tuple(range(hours)), {}, j, {}, 0.0)


def _comparison(tons):
    rows = [CompareRow(n, "cooling", 300.0, 0, 0, 0, 0, 0, 0, 0, t * 3516.85, t, 0.0, 0.0) for n, t in tons.items()]
    return Comparison("t", tuple(rows), ())


def test_study_against_a_hand_calculation(tmp_path):
    cases = _load(tmp_path, _cases())
    years = {"base": _year("base", 45e6, 17e6), "R-8 ducts": _year("R-8 ducts", 39e6, 17e6)}
    s = money_study(cases, _comparison({"base": 3.5, "R-8 ducts": 3.3}), years)
    v = s.for_case("R-8 ducts")
    # By hand: base 45e6 / 15,000 = 3,000 kWh cooling + 17e6 / 8,500 = 2,000 kWh heating; x 0.15 = 750 $/year.
    # Variant 39e6 / 15,000 = 2,600 kWh + 2,000 kWh = 4,600 kWh x 0.15 = 690 $/year: 60 $/year saved.
    # Credit 0.2 t x 1,000 = 200 $, net 600 - 200 = 400 $, payback 400 / 60 = 6.667 years;
    # PV = -400 + 60 x (P/A, 5 %, 10) = -400 + 60 x 7.7217 = 63.30 $ (P/A from the interest tables).
    assert s.for_case("base").annual_energy_cost == pytest.approx(750.0)
    assert v.cooling_electricity_kwh == pytest.approx(2600.0)
    assert v.heating_electricity_kwh == pytest.approx(2000.0)
    assert v.annual_energy_cost == pytest.approx(690.0)
    assert v.annual_saving == pytest.approx(60.0)
    assert v.equipment_credit == pytest.approx(200.0)
    assert v.net_first_cost == pytest.approx(400.0)
    assert v.payback_years == pytest.approx(400.0 / 60.0)
    assert v.present_value == pytest.approx(63.30, abs=0.01)
    assert v.cash_flow[-1] == pytest.approx(v.present_value)
    assert len(v.cash_flow) == 11 and v.cash_flow[0] == pytest.approx(-400.0)


def test_zero_cost_pays_at_once_and_no_saving_never(tmp_path):
    cases = _load(tmp_path, _cases(cost=0.0))
    cmp = _comparison({"base": 3.5, "R-8 ducts": 3.5})
    s = money_study(cases, cmp, {"base": _year("base", 45e6, 0), "R-8 ducts": _year("R-8 ducts", 40e6, 0)})
    assert s.for_case("R-8 ducts").payback_years == 0.0
    s = money_study(cases, cmp, {"base": _year("base", 45e6, 0), "R-8 ducts": _year("R-8 ducts", 45e6, 0)})
    assert s.for_case("R-8 ducts").payback_years is None
    assert s.for_case("R-8 ducts").equipment_credit == 0.0  # tons did not fall


def test_gas_and_resistance_heating_by_hand(tmp_path):
    gas = dict(MONEY, heating_fuel="gas", gas_per_therm=1.20, heating_efficiency=0.9)
    terms = validate_raw(_cases(gas))["money"]
    # 45e6 Btu / (0.9 x 1e5) = 500 therms x 1.20 = 600 $; cooling 30e6 / 15,000 = 2,000 kWh x 0.15 = 300 $
    ck, hk, th, cost = annual_energy(_year("b", 30e6, 45e6), terms)
    assert (ck, hk, th) == pytest.approx((2000.0, 0.0, 500.0)) and cost == pytest.approx(900.0)
    terms = validate_raw(_cases(dict(MONEY, heating_fuel="electric")))["money"]
    # resistance: 34,121.4 Btu is 10 kWh
    ck, hk, th, cost = annual_energy(_year("b", 0.0, 34121.4), terms)
    assert hk == pytest.approx(10.0, rel=1e-6) and th is None and cost == pytest.approx(1.5, rel=1e-6)


def test_without_weather_the_annual_rows_say_so(tmp_path):
    cases = _load(tmp_path, _cases())
    s = money_study(cases, _comparison({"base": 3.5, "R-8 ducts": 3.2}))
    assert s.needs == NEEDS_WEATHER and not s.complete
    v = s.for_case("R-8 ducts")
    assert v.annual_energy_cost is None and v.payback_years is None and v.present_value is None
    assert v.equipment_credit == pytest.approx(300.0)  # 0.3 t x 1,000 $/t needs no weather


def test_a_span_shorter_than_a_year_is_not_scaled_up(tmp_path):
    cases = _load(tmp_path, _cases())
    years = {"base": _year("base", 1e6, 0, 48), "R-8 ducts": _year("R-8 ducts", 9e5, 0, 48)}
    s = money_study(cases, _comparison({"base": 3.5, "R-8 ducts": 3.2}), years)
    assert "whole year" in s.needs and s.for_case("R-8 ducts").annual_saving is None


def test_no_money_section_no_money():
    raw = raw_case(with_ducts=True)
    assert validate_raw(raw)["money"] is None


# ---- the keys ---------------------------------------------------------------------------------------

def _with(fn):
    raw = _cases()
    fn(raw)
    return raw


BAD = [
    ("price has no default", _with(lambda r: r["money"].pop("electricity_per_kwh")),
     ["money.electricity_per_kwh", "is missing"]),
    ("negative price", _with(lambda r: r["money"].__setitem__("equipment_per_ton", -5)),
     ["money.equipment_per_ton", "-5", "from 0 to 20000"]),
    ("fuel needed with [heating]", _with(lambda r: r["money"].pop("heating_fuel")),
     ["money.heating_fuel", "is missing", "[heating]"]),
    ("gas needs its price", _with(lambda r: r["money"].__setitem__("heating_fuel", "gas")),
     ["money.gas_per_therm", "is missing"]),
    ("unknown fuel", _with(lambda r: r["money"].__setitem__("heating_fuel", "heatpump")),
     ["money.heating_fuel", '"heatpump"', 'did you mean "heat-pump"']),
    ("AFUE above 1", _with(lambda r: r["money"].__setitem__("heating_efficiency", 95)),
     ["money.heating_efficiency", "95", "0.5 to 1"]),
    ("life not whole", _with(lambda r: r["money"].__setitem__("life_years", 12.5)),
     ["money.life_years", "12.5", "whole number"]),
    ("unknown money key", _with(lambda r: r["money"].__setitem__("discount", 0.03)),
     ["money.discount", "unknown key", "money.discount_rate"]),
    ("variant cost missing", _with(lambda r: r["variant"][0].pop("cost")),
     ["variant[1].cost", "is missing", "[money]"]),
    ("variant cost not a number", _with(lambda r: r["variant"][0].__setitem__("cost", "cheap")),
     ["variant[1].cost", '"cheap"', "a number"]),
    ("variant sets a price", _with(lambda r: r["variant"][0]["set"].__setitem__("money.seer", 18)),
     ["variant[1].set", "money.seer", "whole case"]),
]


@pytest.mark.parametrize("label,raw,needles", BAD, ids=[b[0] for b in BAD])
def test_bad_money_input_is_one_line_exit_2(tmp_path, label, raw, needles):
    p = tmp_path / "bad.toml"
    p.write_text(to_toml(raw))
    res = runner.invoke(app, ["compare", str(p)])
    assert res.exit_code == 2, res.output
    err = res.stderr.strip()
    assert "\n" not in err and "Traceback" not in err
    for n in needles:
        assert n in err, (n, err)


def test_zero_discount_and_defaults_are_accepted():
    raw = _cases()
    raw["money"] = {"electricity_per_kwh": 0.1, "heating_fuel": "electric", "equipment_per_ton": 0,
                    "discount_rate": 0}
    m = validate_raw(raw)["money"]
    assert m["discount_rate"] == 0.0 and m["seer"] == 14.0 and m["life_years"] == 15


def test_a_cost_without_money_is_kept_and_harmless():
    raw = copy.deepcopy(_cases())
    raw.pop("money")
    assert validate_raw(raw)["variant"][0]["cost"] == 600.0


# ---- the commands -----------------------------------------------------------------------------------

def test_annual_energy_is_the_year_commands_own():
    # the shipped compare --weather output (golden, checked byte for byte elsewhere) against `year` itself
    money = json.loads((GOLDEN / "compare-money-demo.json").read_text())["money"]
    t = money["terms"]
    res = runner.invoke(app, ["year", str(DEMO), "--weather", str(WEATHER), "--seer", str(t["seer"]),
                              "--hspf", str(t["hspf"]), "-f", "json"])
    assert res.exit_code == 0, res.output
    years = {y["case"]: y for y in json.loads(res.stdout)}
    assert t["heating_fuel"] == "heat-pump"
    for v in money["variants"]:
        y = years[v["case"]]
        assert v["cooling_electricity_kwh"] == y["cooling"]["electricity_kwh"]
        assert v["heating_electricity_kwh"] == y["heating"]["electricity_kwh"]
        kwh = y["cooling"]["electricity_kwh"] + y["heating"]["electricity_kwh"]
        assert v["annual_energy_cost"] == pytest.approx(kwh * t["electricity_per_kwh"], abs=0.01)


def test_demo_money_is_consistent():
    money = json.loads((GOLDEN / "compare-money-demo.json").read_text())["money"]
    base = money["variants"][0]
    assert base["case"] == "base" and base["first_cost"] == 0 and base["payback_years"] is None
    for v in money["variants"][1:]:
        assert v["annual_saving"] == pytest.approx(base["annual_energy_cost"] - v["annual_energy_cost"], abs=0.02)
        assert v["net_first_cost"] == pytest.approx(v["first_cost"] - v["equipment_credit"], abs=0.02)
        if v["annual_saving"] > 0:
            assert v["payback_years"] == pytest.approx(v["net_first_cost"] / v["annual_saving"], rel=1e-3)
        assert v["cash_flow"][-1] == pytest.approx(v["present_value"], abs=0.02)


def test_compare_without_weather_says_a_weather_file_is_needed():
    res = runner.invoke(app, ["compare", str(DEMO)])
    assert res.exit_code == 0, res.output
    assert "needs a weather file" in res.stdout and "does not predict a utility bill" in res.stdout
    d = json.loads((GOLDEN / "compare-demo.json").read_text())["money"]
    assert d["needs"] == NEEDS_WEATHER
    assert all(v["annual_energy_cost"] is None and v["payback_years"] is None for v in d["variants"])


def test_a_short_weather_file_is_not_scaled_to_a_year(tmp_path):
    short = tmp_path / "two-days.csv"
    short.write_text("".join(WEATHER.read_text().splitlines(keepends=True)[:49]))
    res = runner.invoke(app, ["compare", str(DEMO), "--weather", str(short), "-f", "csv"])
    assert res.exit_code == 0, res.output
    assert "money.annual_energy_cost" in res.stdout.splitlines()[0]
    res = runner.invoke(app, ["compare", str(DEMO), "--weather", str(short)])
    assert "needs a whole year of weather" in res.stdout


def test_report_with_weather_has_the_money_and_the_chart(tmp_path):
    out = tmp_path / "r.html"
    res = runner.invoke(app, ["report", str(DEMO), "-o", str(out), "--weather", str(WEATHER), "--samples", "4"])
    assert res.exit_code == 0, res.output
    html = out.read_text()
    assert "Money: what each option costs and pays back" in html
    assert "Cumulative cash flow" in html and html.count("<svg") >= 3
    assert "does not predict a utility bill" in html and "present-worth factor" in html


def test_the_screen_says_never_and_at_once(tmp_path):
    from attic.present.tables import money_cells

    cases = _load(tmp_path, _cases(cost=0.0))
    cmp = _comparison({"base": 3.5, "R-8 ducts": 3.5})
    s = money_study(cases, cmp, {"base": _year("base", 45e6, 0), "R-8 ducts": _year("R-8 ducts", 40e6, 0)})
    assert money_cells(s.for_case("R-8 ducts").to_dict(), None)[4] == "at once"
    s = money_study(cases, cmp, {"base": _year("base", 45e6, 0), "R-8 ducts": _year("R-8 ducts", 46e6, 0)})
    cells = money_cells(s.for_case("R-8 ducts").to_dict(), None)
    # 1e6 Btu more cooling / 15,000 = 66.7 kWh x 0.15 $/kWh: it costs 10 $ a year more to run
    assert cells[4] == "never" and cells[3] == "-$10"


def test_report_without_weather_says_what_it_needs(tmp_path):
    out = tmp_path / "r.html"
    res = runner.invoke(app, ["report", str(DEMO), "-o", str(out), "--samples", "4"])
    assert res.exit_code == 0, res.output
    html = out.read_text()
    assert "Money: what each option costs and pays back" in html and "needs a weather file" in html
    assert "$1,400" in html  # the first cost needs no weather


def test_weather_without_money_is_said_not_ignored(tmp_path):
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw_case()))
    res = runner.invoke(app, ["compare", str(p), "--weather", str(WEATHER), "-f", "json"])
    assert res.exit_code == 0, res.output
    assert "no [money] section" in res.stderr and "money" not in json.loads(res.stdout)


def test_money_with_weather_needs_the_sun_keys(tmp_path):
    short = tmp_path / "two-days.csv"
    short.write_text("".join(WEATHER.read_text().splitlines(keepends=True)[:49]))
    raw = _cases()  # the test house gives no longitude or time zone
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw))
    res = runner.invoke(app, ["compare", str(p), "--weather", str(short)])
    assert res.exit_code == 2 and "site.longitude_deg" in res.stderr and "Traceback" not in res.stderr


def test_python_face_gives_the_same_first_costs_as_the_command():
    import attic

    s = attic.money(attic.read_case(DEMO))
    golden = json.loads((GOLDEN / "compare-demo.json").read_text())["money"]
    assert s.to_dict() == golden
    table = s.to_frame()
    assert list(table.index) == [v["case"] for v in golden["variants"]]
    assert table.loc["R-8 ducts", "first_cost"] == 450.0


def test_compare_csv_gives_each_variants_money_once():
    # a spreadsheet sums a column: a variant's first cost on both its cooling and heating rows would count twice
    import csv
    import io

    res = runner.invoke(app, ["compare", str(DEMO), "-f", "csv"])
    rows = list(csv.DictReader(io.StringIO(res.stdout)))
    costed = [r["case"] for r in rows if r["money.first_cost"] != ""]
    assert sorted(costed) == sorted({r["case"] for r in rows}) and len(costed) == len(set(costed))
    # without a weather file the annual columns are empty, and the note beside them says why, as the table does
    noted = [r for r in rows if r["money.first_cost"] != ""]
    assert all(r["money.annual_saving"] == "" and "need a weather file" in r["money.note"] for r in noted)


def test_compare_csv_with_money_keeps_a_variant_whose_heating_failed(monkeypatch):
    # its cooling row is compared, without money (the study sets only whole variants side by side)
    import csv
    import io

    from helpers import fail_heating_of

    fail_heating_of(monkeypatch, "R-8 ducts")
    res = runner.invoke(app, ["compare", str(DEMO), "-f", "csv"])
    assert res.exit_code == 2, res.output
    rows = list(csv.DictReader(io.StringIO(res.stdout)))
    r8 = [r for r in rows if r["case"] == "R-8 ducts"]
    assert [r["condition"] for r in r8 if r["condition"]] == ["cooling"] and r8[0]["money.first_cost"] == ""
