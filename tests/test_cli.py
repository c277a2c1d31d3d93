"""The command line: output contract, units, files, help."""

import csv
import io
import json
import subprocess
import sys
from pathlib import Path

import pytest
from typer.testing import CliRunner

from attic.cli import app
from helpers import raw_case, to_toml

runner = CliRunner()

CONTRACT = ["attic.air_F", "attic.ventilation_cfm", "attic.ceiling_gain_btuh", "ducts.conduction_btuh",
            "ducts.leakage_sensible_btuh", "ducts.leakage_latent_btuh", "ducts.delivery_effectiveness",
            "house.total_btuh", "house.tons", "vents.required_nfa_ft2", "vents.provided_nfa_ft2", "vents.complies",
            "residual_w"]
SEGMENT_KEYS = {"name", "leaving_F", "gain_btuh", "jacket_F", "dewpoint_margin_F"}


def get(d, dotted):
    for part in dotted.split("."):
        d = d[part]
    return d


@pytest.fixture
def case_file(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["variant"] = [{"name": "inside", "set": {"duct.*.location": "conditioned"}}]
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw))
    return p


def test_json_has_the_output_contract(case_file):
    res = runner.invoke(app, ["run", str(case_file), "--format", "json"])
    assert res.exit_code == 0, res.output
    data = json.loads(res.output)
    assert [(o["case"], o["condition"]) for o in data] == [("base", "cooling"), ("base", "heating"),
                                                          ("inside", "cooling"), ("inside", "heating")]
    for o in data:
        for k in CONTRACT:
            get(o, k)
        for s in o["ducts"]["segments"]:
            assert SEGMENT_KEYS <= set(s)
        assert "qualified person" in o["caution"]


def test_si_twins(case_file):
    data = json.loads(runner.invoke(app, ["run", str(case_file), "-f", "json", "-u", "si"]).output)
    ip = json.loads(runner.invoke(app, ["run", str(case_file), "-f", "json"]).output)
    o, p = data[0], ip[0]
    assert o["attic"]["air_C"] == pytest.approx((p["attic"]["air_F"] - 32) / 1.8, abs=1e-3)
    assert o["house"]["total_w"] == pytest.approx(p["house"]["total_btuh"] * 0.29307107, rel=1e-4)
    assert o["vents"]["required_nfa_m2"] == pytest.approx(p["vents"]["required_nfa_ft2"] * 0.09290304, rel=1e-4)
    assert "leaving_C" in o["ducts"]["segments"][0] and "ventilation_l_s" in o["attic"]


def test_csv_for_spreadsheets(case_file, tmp_path):
    out = tmp_path / "result.csv"
    res = runner.invoke(app, ["run", str(case_file), "-f", "csv", "-o", str(out)])
    assert res.exit_code == 0, res.output
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert len(rows) == 4 and float(rows[0]["house.tons"]) > 0
    assert "ducts.segments.trunk.gain_btuh" in rows[0]
    js = json.loads(runner.invoke(app, ["run", str(case_file), "-f", "json"]).output)
    assert float(rows[2]["attic.air_F"]) == pytest.approx(js[2]["attic"]["air_F"])


def test_output_never_overwrites_the_case(case_file):
    before = case_file.read_text()
    res = runner.invoke(app, ["run", str(case_file), "-f", "json", "-o", str(case_file)])
    assert res.exit_code == 2 and "refusing" in res.output
    assert case_file.read_text() == before


def test_no_output_writes_over_the_weather_file_it_reads(tmp_path):
    # nothing a user gave is lost: -o or --plot naming the weather file is refused before any work
    import shutil

    root = Path(__file__).resolve().parent.parent / "cases"
    case = tmp_path / "demo.toml"
    shutil.copy(root / "demo.toml", case)
    weather = tmp_path / "w.csv"
    shutil.copy(root / "demo-weather.csv", weather)
    before = weather.read_bytes()
    for args in (["compare", str(case), "-w", str(weather), "-f", "csv", "-o", str(weather)],
                 ["year", str(case), "-w", str(weather), "-o", str(weather)],
                 ["year", str(case), "-w", str(weather), "-o", str(tmp_path / "." / "w.csv")]):
        res = runner.invoke(app, args)
        assert res.exit_code == 2, res.output
        assert "refusing to write over the weather file" in res.output and "\n" not in res.output.strip()
        assert weather.read_bytes() == before
    # compare --plot X.png also writes X-cash-flow.png (with money): that name is checked against the inputs too
    sneaky = tmp_path / "d-cash-flow.png"
    shutil.copy(case, sneaky)
    res = runner.invoke(app, ["compare", str(sneaky), "-w", str(weather), "--plot", str(tmp_path / "d.png")])
    assert res.exit_code == 2 and "its cash-flow chart" in res.output and "refusing" in res.output
    assert sneaky.read_text() == case.read_text() and not (tmp_path / "d.png").exists()
    # and a case file is only ever started under a .toml name, the one ending no output is written to
    res = runner.invoke(app, ["new", str(tmp_path / "mine.csv")])
    assert res.exit_code == 2 and "ends in .toml (e.g. mine.toml)" in res.output
    assert not (tmp_path / "mine.csv").exists()
    res = runner.invoke(app, ["new", str(tmp_path / "foo.toml.bak")])
    assert res.exit_code == 2 and "(e.g. foo.toml)" in res.output


def test_table_shows_cautions_and_vents(case_file):
    res = runner.invoke(app, ["run", str(case_file)])
    assert res.exit_code == 0
    text = " ".join(res.output.split())  # the terminal wraps long lines
    assert "qualified person" in text and "IRC R806.2" in text and "tons" in text


@pytest.mark.parametrize("args", [
    ["sweep", "{case}", "--set", "roof.deck_r=0,10"],
    ["pick", "{case}", "--vary", "duct.*.r_value", "--among", "4.2,8", "--target", "ducts.total_btuh <= 1e9"],
    ["day", "{case}"],
    ["compare", "{case}"],
])
def test_every_table_and_json_of_loads_carries_the_caution(case_file, args):
    # the house rule: design loads need a full load calculation by a qualified person; codes govern
    args = [a.replace("{case}", str(case_file)) for a in args]
    res = runner.invoke(app, args)
    assert res.exit_code == 0, res.output
    assert "qualified person" in " ".join(res.stdout.split()) and "Local codes" in " ".join(res.stdout.split())
    if args[0] != "sweep":  # sweep's JSON is the rows of a sheet, one per point
        res = runner.invoke(app, [*args, "-f", "json"])
        data = json.loads(res.stdout)
        assert all("qualified person" in d["caution"] for d in (data if isinstance(data, list) else [data]))


def test_new_writes_a_starter_that_runs_and_never_overwrites(tmp_path):
    p = tmp_path / "mine.toml"
    assert runner.invoke(app, ["new", str(p)]).exit_code == 0
    text = p.read_text()
    res = runner.invoke(app, ["new", str(p)])
    assert res.exit_code == 2 and "already exists" in res.output and p.read_text() == text
    assert runner.invoke(app, ["run", str(p), "-f", "json"]).exit_code == 0


def test_demo_runs():
    res = runner.invoke(app, ["demo", "-f", "json"])
    assert res.exit_code == 0
    names = {o["case"] for o in json.loads(res.output)}
    assert {"base", "ducts inside conditioned space", "unvented, R-20 foam under deck"} <= names


def test_packaged_demo_is_the_shipped_demo():
    from importlib.resources import files
    from pathlib import Path

    shipped = Path(__file__).parent.parent / "cases" / "demo.toml"
    assert (files("attic") / "data" / "demo.toml").read_text() == shipped.read_text()


def test_solve_failure_is_reported_not_printed(case_file, monkeypatch):
    from attic.network import solve as balance

    monkeypatch.setattr(balance, "RESIDUAL_LIMIT_W", -1.0)
    res = runner.invoke(app, ["run", str(case_file), "-f", "json"])
    assert res.exit_code == 3 and "did not close" in res.output and "air_F" not in res.output


def test_pick_that_cannot_solve_exits_3_and_names_the_value(case_file, monkeypatch):
    from attic.network import solve as balance

    monkeypatch.setattr(balance, "RESIDUAL_LIMIT_W", -1.0)  # no balance can close that tightly
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "roof.deck_r", "--among", "0,10",
                              "--target", "tons <= 5"])
    assert res.exit_code == 3, res.output
    assert "roof.deck_r=0" in res.output and "did not close" in res.output and "Traceback" not in res.output


def test_help_imports_no_heavy_libraries():
    # DEVELOPERS.md: `atticduct --help` imports no CoolProp, scipy or matplotlib
    code = ("import sys\nfrom typer.testing import CliRunner\nfrom attic.cli import app\n"
            "CliRunner().invoke(app, ['--help'])\nCliRunner().invoke(app, ['run', '--help'])\n"
            "print(sorted(m for m in ('CoolProp', 'scipy', 'matplotlib', 'pvlib', 'pandas') if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert out.strip() == "[]"


def test_keys_reference_lists_every_key():
    from attic.case.schema import SECTIONS

    out = runner.invoke(app, ["keys", "--markdown"]).output
    table = runner.invoke(app, ["keys"], env={"COLUMNS": "200"}).output
    for keys in SECTIONS.values():
        for k in keys:
            assert f"`{k}`" in out
            assert f"│ {k} " in table


def test_an_unexpected_error_is_one_line_not_a_traceback(monkeypatch, capsys, case_file):
    import attic.cli as cli
    import attic.runs.batch as run

    def boom(cases, *a, **k):
        raise ZeroDivisionError("synthetic")

    monkeypatch.setattr(run, "run_cases", boom)
    monkeypatch.setattr(sys, "argv", ["atticduct", "run", str(case_file)])
    monkeypatch.delenv("ATTICDUCT_DEBUG", raising=False)
    with pytest.raises(SystemExit) as e:
        cli.main()
    err = capsys.readouterr().err
    assert e.value.code == 4 and "internal error (ZeroDivisionError: synthetic)" in err and "Traceback" not in err


def test_readme_key_table_is_the_schema():
    # the README's reference is `atticduct keys`; it must not drift from what the loader accepts
    from pathlib import Path

    readme = (Path(__file__).parent.parent / "README.md").read_text()
    out = runner.invoke(app, ["keys", "--markdown"]).output.strip()
    assert out in readme


def test_a_table_column_keeps_one_number_of_decimals():
    from attic.cli.numbers import _column

    assert _column([3.5, 3.28, 2.0]) == ["3.50", "3.28", "2.00"]
    assert _column([12345.6, 980.2, -0.4]) == ["12,346", "980", "0"]  # never -0
    assert _column([112.46, 99.0, "n/a"]) == ["112.5", "99.0", "n/a"]


def test_an_output_named_csv_or_json_gets_that_format(case_file, tmp_path):
    # common practice, no source: a file named .csv holds CSV, whatever the default screen format
    for name, first in (("r.csv", "case,"), ("r.json", "[")):
        out = tmp_path / name
        res = runner.invoke(app, ["run", str(case_file), "-o", str(out)])
        assert res.exit_code == 0, res.output
        assert out.read_text().startswith(first)
    txt = tmp_path / "r.txt"
    assert runner.invoke(app, ["run", str(case_file), "-o", str(txt)]).exit_code == 0
    assert "attic air" in txt.read_text()  # any other name: the table
    asked = tmp_path / "table.csv"
    res = runner.invoke(app, ["run", str(case_file), "-f", "table", "-o", str(asked)])
    assert res.exit_code == 0
    assert "attic air" in asked.read_text()  # a format typed out is the format written, whatever the name
    assert "note: -f table writes a table to" in res.stderr and "ends in .csv" in res.stderr  # and says so
    res = runner.invoke(app, ["run", str(case_file), "-f", "json", "-o", str(tmp_path / "same.json")])
    assert "note:" not in res.stderr  # name and format agree: nothing to say


def test_run_shows_the_condition_that_solved_when_the_other_did_not(case_file, monkeypatch):
    # the heating solve is made to fail: the cooling answer is still shown, heating is said to have failed
    from attic.runs import batch

    real = batch.run_conditions

    def no_heating(cases, kind, *a, **k):
        if kind == "heating":
            return [(None, ValueError(f"{c.name} heating: no airflow serves it")) for c in cases]
        return real(cases, kind, *a, **k)

    monkeypatch.setattr(batch, "run_conditions", no_heating)
    res = runner.invoke(app, ["run", str(case_file), "-f", "json"])
    assert res.exit_code == 2 and "heating: no airflow serves it" in res.output
    shown = json.loads(res.stdout)
    assert shown and {o["condition"] for o in shown} == {"cooling"}  # each case's cooling, no heating


def test_compare_and_report_keep_a_variant_whose_heating_failed_and_say_so(case_file, tmp_path, monkeypatch):
    # the variant's heating solve is made to fail: its cooling is compared, and the heating table, the data and the
    # page say it did not solve (a reader must not take a missing variant for one never asked for)
    from helpers import fail_heating_of

    fail_heating_of(monkeypatch, "inside")
    res = runner.invoke(app, ["compare", str(case_file), "-f", "json"])
    assert res.exit_code == 2
    out = json.loads(res.stdout)
    assert {(r["case"], r["condition"]) for r in out["rows"]} == {("base", "cooling"), ("base", "heating"),
                                                                   ("inside", "cooling")}
    assert out["failed"] == [{"case": "inside", "conditions": ["heating"],
                              "error": 'variant "inside": inside (heating): no airflow serves it'}]
    table = runner.invoke(app, ["compare", str(case_file)], terminal_width=120).stdout
    heating = table[table.index("heating design condition"):]
    assert "inside" in heating and "failed" in heating
    page = tmp_path / "r.html"
    res = runner.invoke(app, ["report", str(case_file), "-o", str(page)])
    assert res.exit_code == 2
    html = page.read_text()
    assert "Not every variant solved." in html and "no airflow serves it" in html and "did not solve" in html


def test_an_output_folder_that_refuses_writes_is_said_up_front_and_a_failed_write_in_a_line(case_file, tmp_path,
                                                                                          monkeypatch):
    # permissions do not tell a read-only file system (nor anything, for the superuser): a probe file does
    import tempfile

    import attic.present.files as files

    def read_only(*a, **k):
        raise OSError(30, "Read-only file system")

    with monkeypatch.context() as m:
        m.setattr(tempfile, "NamedTemporaryFile", read_only)
        res = runner.invoke(app, ["run", str(case_file), "-o", str(tmp_path / "x.csv")])
    assert res.exit_code == 2 and "cannot write in the folder" in res.output and "Read-only" in res.output
    assert len(res.output.strip().splitlines()) == 1

    def disk_full(path):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(files, "atomic_path", disk_full)
    res = runner.invoke(app, ["run", str(case_file), "-o", str(tmp_path / "y.csv")])
    assert res.exit_code == 2 and "could not be written (No space left on device)" in res.output
    assert "internal error" not in res.output and not (tmp_path / "y.csv").exists()


def test_tons_are_cooling_only_in_every_output(case_file):
    # a fact of the trade: a ton is 12,000 Btu/h of cooling; a heating load shown in tons reads like a size
    out = json.loads(runner.invoke(app, ["run", str(case_file), "-f", "json"]).stdout)
    heat = [o for o in out if o["condition"] == "heating"]
    assert heat and all(o["house"]["tons"] is None and o["house"]["ft2_per_ton"] is None
                        and o["ducts"]["cfm_per_ton"] is None for o in heat)
    assert all(o["house"]["tons"] > 0 for o in out if o["condition"] == "cooling")
    cmp = json.loads(runner.invoke(app, ["compare", str(case_file), "-f", "json"]).stdout)
    assert all(r["house"]["tons"] is None and r["vs_base"]["tons"] is None
               for r in cmp["rows"] if r["condition"] == "heating")
    res = runner.invoke(app, ["sweep", str(case_file), "-c", "heating", "--set", "duct.*.r_value=4,8"],
                        terminal_width=160)
    assert res.exit_code == 0 and "house.tons" not in res.stdout and "house.total_btuh" in res.stdout


def test_a_workbook_name_and_an_empty_listed_value_are_refused_before_any_work(case_file, tmp_path):
    # common practice, no source: a text table under an .xlsx name is a file no spreadsheet opens
    res = runner.invoke(app, ["run", str(case_file), "-o", str(tmp_path / "out.xlsx")])
    assert res.exit_code == 2 and "give a .csv name" in res.output and not (tmp_path / "out.xlsx").exists()
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "duct.*.r_value=4,,8"])
    assert res.exit_code == 2 and "a value is empty between commas" in res.output and "=4,8" in res.output


def test_compare_data_show_zero_loads_as_zero_not_rounding(case_file):
    # ducts inside conditioned space add nothing: 0, not the balances' 3e-12 Btu/h or -0.0
    rows = list(csv.DictReader(io.StringIO(runner.invoke(app, ["compare", str(case_file), "-f", "csv"]).stdout)))
    inside = [r for r in rows if r["case"] == "inside"]
    assert inside and all(r["house.ducts_btuh"] == "0.0" and r["ducts.conduction_btuh"] == "0.0" for r in inside)


@pytest.mark.parametrize("argv, code, said", [
    (["uncertainty", "{case}", "--samples", "1"], 2, "atticduct: Invalid value for '--samples'"),
    (["run", "{case}", "--bogus"], 2, "atticduct: No such option: --bogus (see atticduct run --help)"),
    (["report", "{case}"], 2, "atticduct: Missing option '--output'"),
    (["check", "{case}", "--strict"], 1, None),  # a rule fails: the command's own exit code comes through
    (["keys"], 0, None),
])
def test_the_console_entry_says_a_usage_error_in_one_line(case_file, monkeypatch, capsys, argv, code, said):
    # a wrong option gets what a wrong case file gets: one line naming it, exit 2, no box and no traceback
    import attic.cli as cli

    monkeypatch.setattr(sys, "argv", ["atticduct", *(str(case_file) if a == "{case}" else a for a in argv)])
    monkeypatch.delenv("ATTICDUCT_DEBUG", raising=False)
    with pytest.raises(SystemExit) as e:
        cli.main()
    assert e.value.code == code
    err = capsys.readouterr().err
    if said:
        assert err.startswith(said) and len(err.strip().splitlines()) == 1 and "╭" not in err


def test_compare_and_report_rows_add_up_to_the_equipment_load(tmp_path):
    # a reader adds the columns: base + ceiling + the attic's air reaching the house + ducts = equipment load
    # (the output contract's definition of house.total); an unvented variant sends attic air into the house
    raw = raw_case(with_ducts=True)
    raw["variant"] = [{"name": "sealed", "set": {"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0}}]
    path = tmp_path / "c.toml"
    path.write_text(to_toml(raw))
    out = json.loads(runner.invoke(app, ["compare", str(path), "-f", "json"]).stdout)
    for r in out["rows"]:
        h = r["house"]
        assert h["base_btuh"] + h["ceiling_btuh"] + h["attic_air_btuh"] + h["ducts_btuh"] == pytest.approx(
            h["total_btuh"], abs=0.5)
    sealed = next(r for r in out["rows"] if r["case"] == "sealed" and r["condition"] == "cooling")
    assert abs(sealed["house"]["attic_air_btuh"]) > 50  # the column matters here
    table = runner.invoke(app, ["compare", str(path)], terminal_width=80).stdout
    assert "from" in table and f"{sealed['house']['attic_air_btuh']:,.0f}" in table
    assert "vs base," in table  # the last column still fits 80 columns
    page = tmp_path / "r.html"
    assert runner.invoke(app, ["report", str(path), "-o", str(page)]).exit_code in (0, 1)
    html = page.read_text()
    assert "air from the attic Btu/h" in html and "base Btu/h" in html
    assert "Air handler airflow carries the design equipment load" in html  # as `check` lists it


def test_compare_says_which_variants_air_handler_is_too_small(tmp_path):
    # run and check flag an air handler short of the design airflow; compare's rows are at that airflow, so it
    # says so too
    raw = raw_case(with_ducts=True)
    raw["air_handler"]["airflow_cfm"] = 300
    raw["variant"] = [{"name": "big fan", "set": {"air_handler.airflow_cfm": 3000}}]
    path = tmp_path / "c.toml"
    path.write_text(to_toml(raw))
    out = runner.invoke(app, ["compare", str(path)], terminal_width=200).stdout
    assert "Air handler too small at the case's airflow for: base (cooling)" in out and "big fan (" not in out


def test_run_says_when_the_cooling_design_hour_has_no_sun(tmp_path):
    # a fact of the trade: cooling design conditions are taken in the afternoon sun; 2 h solar time is night
    raw = raw_case(with_ducts=True)
    raw["cooling"]["solar_hour"] = 2
    path = tmp_path / "night.toml"
    path.write_text(to_toml(raw))
    assert "No sun on the roof" in runner.invoke(app, ["run", str(path)], terminal_width=200).stdout
    raw["cooling"]["solar_hour"] = 15
    path.write_text(to_toml(raw))
    assert "No sun on the roof" not in runner.invoke(app, ["run", str(path)], terminal_width=200).stdout


def test_the_report_signs_a_difference_from_the_base_as_the_terminal_does():
    from attic.present.report import _signed

    assert [_signed(30471.2), _signed(-1078.4), _signed(0.0), _signed(0.004, 2)] == ["+30,471", "-1,078", "0",
                                                                                      "0.00"]


def test_year_in_si_counts_hours_above_si_temperatures(tmp_path):
    # 100 °F is about 38 °C: the default thresholds are the same three temperatures in either system
    root = Path(__file__).resolve().parent.parent / "cases"
    args = ["year", str(root / "demo.toml"), "-w", str(root / "demo-weather.csv"), "-n", "base", "-f", "json"]
    ip = json.loads(runner.invoke(app, args).stdout)[0]["hours_above"]
    si = json.loads(runner.invoke(app, [*args, "-u", "si"]).stdout)[0]["hours_above"]
    assert list(ip) == ["100_F", "120_F", "140_F"] and list(si) == ["38_C", "49_C", "60_C"]
    assert ip["100_F"] > 0 and abs(si["38_C"] - ip["100_F"]) <= 0.05 * ip["100_F"]  # 38 °C is 100.4 °F


def test_si_table_labels_a_temperature_difference_in_kelvin(case_file):
    # a margin is a difference: K in SI (as the JSON's margin_K and the sentence under the table), not °C
    out = runner.invoke(app, ["run", str(case_file), "-u", "si"], env={"COLUMNS": "200"}).output
    assert "jacket / margin to dew point, °C / K" in out and "margin to dew point, °C │" not in out
