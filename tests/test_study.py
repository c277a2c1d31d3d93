"""Deciding: compare, sweep, pick, the target grammar, plots and the report."""

import csv
import io
import json
import os
import re
from html.parser import HTMLParser

import pytest
from typer.testing import CliRunner

from attic.case.load import CaseError
from attic.cli import app
from attic.runs.study import grid, parse_set, pick, sweep
from attic.runs.target import TargetError, parse_target
from helpers import raw_case, to_toml

runner = CliRunner()


@pytest.fixture(scope="module")
def case_file(tmp_path_factory):
    raw = raw_case(with_ducts=True)
    raw["variant"] = [
        {"name": "R-8 ducts", "set": {"duct.*.r_value": 8}},
        {"name": "ducts inside", "set": {"duct.*.location": "conditioned"}},
        {"name": "unvented", "set": {"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0}},
    ]
    p = tmp_path_factory.mktemp("study") / "house.toml"
    p.write_text(to_toml(raw))
    return p


@pytest.fixture(scope="module")
def case_raw(case_file):
    """The same case as a dict: the study functions take dicts or Cases, never file paths."""
    from attic.case.load import read_toml

    return read_toml(case_file)


def run_json(path, *extra):
    res = runner.invoke(app, ["run", str(path), "-f", "json", *extra])
    assert res.exit_code == 0, res.output
    return json.loads(res.output)


def test_compare_differences_equal_separate_runs(case_file):
    cmp = json.loads(runner.invoke(app, ["compare", str(case_file), "-f", "json"]).output)
    runs = {(o["case"], o["condition"]): o for o in run_json(case_file)}
    assert cmp["units"] == "ip"
    for row in cmp["rows"]:
        ran = runs[(row["case"], row["condition"])]
        # the same key as run's output contract, in the same units
        assert row["house"]["total_btuh"] == pytest.approx(ran["house"]["total_btuh"], rel=1e-4)
        assert row["attic"]["air_F"] == pytest.approx(ran["attic"]["air_F"], abs=0.01)
        base = runs[("base", row["condition"])]["house"]["total_btuh"]
        assert row["vs_base"]["total_btuh"] == pytest.approx(ran["house"]["total_btuh"] - base, abs=0.5)
    base_rows = [r for r in cmp["rows"] if r["case"] == "base"]
    assert all(r["vs_base"]["total_btuh"] == 0 for r in base_rows)
    (inside,) = cmp["ducts_inside"]
    assert inside["variant"] == "ducts inside"
    expect = runs[("base", "cooling")]["house"]["total_btuh"] - runs[("ducts inside", "cooling")]["house"]["total_btuh"]
    assert inside["saved_btuh"] == pytest.approx(expect, abs=0.5)


def test_compare_json_follows_units(case_file):
    si = json.loads(runner.invoke(app, ["compare", str(case_file), "-f", "json", "-u", "si"]).output)
    ip = json.loads(runner.invoke(app, ["compare", str(case_file), "-f", "json"]).output)
    assert si["units"] == "si" and "total_w" in si["rows"][0]["house"] and "air_C" in si["rows"][0]["attic"]
    assert si["rows"][0]["house"]["total_w"] == pytest.approx(ip["rows"][0]["house"]["total_btuh"] * 0.29307107,
                                                              rel=1e-4)
    # rounded for people and programs alike: no 16-digit floats
    assert all(len(repr(v)) < 12 for v in si["rows"][0]["house"].values())


def test_compare_table_says_what_moving_ducts_inside_saves(case_file):
    out = " ".join(runner.invoke(app, ["compare", str(case_file)]).output.split())
    assert 'Moving the ducts inside ("ducts inside") saves' in out and "tons at the cooling design condition" in out


def test_parse_set_forms_and_errors():
    assert parse_set("roof.deck_r=0:40:10") == ("roof.deck_r", [0.0, 10.0, 20.0, 30.0, 40.0])
    assert parse_set("duct.*.r_value=4.2,6,8") == ("duct.*.r_value", [4.2, 6.0, 8.0])
    assert parse_set("roof.radiant_barrier=true,false")[1] == [True, False]
    assert parse_set("roof.covering=clay-tile-red,membrane-white")[1] == ["clay-tile-red", "membrane-white"]
    for bad in ("roof.deck_r", "roof.deck_r=5:1:1", "roof.deck_r=0:10:0", "roof.deck_r=a:b:c", "=3"):
        with pytest.raises(CaseError):
            parse_set(bad)


def test_a_study_too_large_to_hold_is_refused_before_it_is_built(case_file):
    # nothing is lost to a typo: 0:1e9:1 had been built value by value until the machine ran out of memory
    from attic.runs.study import MAX_POINTS

    with pytest.raises(CaseError, match="1,000,000,001 values; at most"):
        parse_set("roof.deck_r=0:1e9:1")
    assert len(parse_set(f"roof.deck_r=1:{MAX_POINTS}:1")[1]) == MAX_POINTS  # the limit itself is allowed
    side = ("x", list(range(200)))
    with pytest.raises(CaseError, match="200 x 200 = 40,000 points.*for a range, a larger STEP"):
        grid([side, ("y", list(range(200)))])
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "roof.deck_r=0:40:0.01",
                              "--set", "duct.*.r_value=4:8:0.1"])
    assert res.exit_code == 2 and "4,001 x 41 = 164,041 points" in res.output and len(res.output.splitlines()) == 1


def test_grid_shape_and_order():
    g = grid([("a", [1, 2, 3]), ("b", ["x", "y"])])
    assert len(g) == 6 and g[0] == {"a": 1, "b": "x"} and g[1] == {"a": 1, "b": "y"} and g[-1] == {"a": 3, "b": "y"}


def test_sweep_trends_and_grid(case_raw):
    # physics that must hold: more duct R, less duct gain; a lighter roof, a cooler attic
    s = sweep(case_raw, [parse_set("duct.*.r_value=2,4.2,6,8,11")])
    gains = s.column("ducts.conduction_btuh")
    assert all(a > b for a, b in zip(gains, gains[1:], strict=False))
    s = sweep(case_raw, [parse_set("roof.solar_reflectance=0.05:0.65:0.15")])
    temps = s.column("attic.air_F")
    assert all(a > b for a, b in zip(temps, temps[1:], strict=False))
    g = sweep(case_raw, [parse_set("attic.ceiling_r=19,30,38"), parse_set("roof.radiant_barrier=false,true")])
    assert len(g.points) == 6 and all(o is not None for o in g.outputs)
    ceil = g.column("attic.ceiling_gain_btuh")
    assert ceil[0] > ceil[2] > ceil[4] and ceil[0] > ceil[1]  # more R less gain; barrier less gain


def test_sweep_csv_round_trips(case_file, case_raw, tmp_path):
    out = tmp_path / "sweep.csv"
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "duct.*.r_value=4.2,8", "-f", "csv", "-o",
                                  str(out)])
    assert res.exit_code == 0, res.output
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    s = sweep(case_raw, [parse_set("duct.*.r_value=4.2,8")])
    assert [float(r["set.duct.*.r_value"]) for r in rows] == [4.2, 8.0]
    for r, o in zip(rows, s.outputs, strict=True):
        assert float(r["house.total_btuh"]) == pytest.approx(o["house.total_btuh"])
        assert float(r["attic.air_F"]) == pytest.approx(o["attic.air_F"])
    assert oct(os.stat(out).st_mode & 0o777) != "0o600"


def test_sweep_in_processes_gives_the_same_answers(case_raw):
    specs = [parse_set("roof.deck_r=0,10,20,30")]
    one = sweep(case_raw, specs, jobs=1)
    two = sweep(case_raw, specs, jobs=2)
    assert one.column("house.total_btuh") == two.column("house.total_btuh")


def test_sweep_bad_value_is_a_case_error(case_file):
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "attic.ceiling_r=-5,10"])
    assert res.exit_code == 2 and "attic.ceiling_r" in res.output and "at attic.ceiling_r=-5" in res.output


def duct_loads(case_raw, values):
    s = sweep(case_raw, [("duct.*.r_value", values)])
    return s.column("ducts.total_btuh")


def test_pick_first_middle_and_none(case_raw):
    values = [4.2, 6.0, 8.0, 11.0]
    loads = duct_loads(case_raw, values)  # falling with R (checked in the sweep test)
    # a limit just above the load: the first value meets it
    first = pick(case_raw, "duct.*.r_value", values, f"ducts.total_btuh <= {loads[0] + 1}")
    assert first.chosen == 4.2
    # halfway between the loads: R-8 is the smallest that meets it
    mid = pick(case_raw, "duct.*.r_value", [11.0, 8.0, 4.2, 6.0], f"ducts.total_btuh <= {(loads[1] + loads[2]) / 2}")
    assert mid.chosen == 8.0
    met, a, b, margin = mid.checks[2][1:]
    assert met and margin == pytest.approx(b - a)
    # below even the R-11 load: none
    none = pick(case_raw, "duct.*.r_value", values, f"ducts.total_btuh <= {loads[-1] - 1}")
    assert none.chosen is None and not any(c[1] for c in none.checks)


def test_pick_largest_tries_from_the_largest_down(case_raw):
    # a fact of the trade: the duct load falls as the duct R rises, so "at least this load" is met by the small
    # R values; --largest finds the largest of them
    values = [4.2, 6.0, 8.0, 11.0]
    loads = duct_loads(case_raw, values)
    target = f"ducts.total_btuh >= {(loads[1] + loads[2]) / 2}"  # meet it, R-8 and R-11 do not
    assert pick(case_raw, "duct.*.r_value", values, target).chosen == 4.2
    most = pick(case_raw, "duct.*.r_value", values, target, largest=True)
    assert most.chosen == 6.0 and [c[0] for c in most.checks] == [11.0, 8.0, 6.0, 4.2]
    assert most.to_dict()["picks"] == "largest"

def test_study_takes_a_case_or_a_dict_alike(case_file, case_raw):
    from attic.case.load import load_cases

    base = load_cases(case_file, only="base")[0]
    specs = [parse_set("duct.*.r_value=4.2,8")]
    assert sweep(base, specs).outputs == sweep(case_raw, specs).outputs
    with pytest.raises(TypeError):
        sweep(str(case_file), specs)


def test_pick_command(case_file):
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "duct.*.r_value", "--among", "4.2,6,8,11",
                              "--target", "ducts.total_btuh <= 0.5 * house.total_btuh"])
    assert res.exit_code == 0 and "Smallest that meets" in res.output
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "duct.*.r_value", "--among", "4.2,6",
                              "--target", "ducts.total_btuh <= 0"])
    assert res.exit_code == 1 and "None of these meets" in res.output
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "duct.*.r_value", "--among", "4.2",
                              "--target", "ducts.total_btu <= 3"])
    assert res.exit_code == 2 and "did you mean ducts.total_btuh" in res.output
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "duct.*.r_value", "--among", "4.2",
                              "--target", "ducts.total_btuh <="])
    assert res.exit_code == 2 and "column" in res.output


def test_target_grammar():
    t = parse_target("a + 2 * b <= (c - 1) / 2")
    assert t.sides({"a": 1.0, "b": 3.0, "c": 21.0}) == (7.0, 10.0)
    assert parse_target("-a > -3").check({"a": 2.0})[0]
    key = "ducts.segments.supply trunk.gain_btuh"
    assert parse_target(f'"{key}" < 10').keys() == [key]
    for bad, where in [("a <", "column 4"), ("a b", "column 3"), ("(a <= 3", "not closed (column 1)"),
                       ("a ~ 3", "column 3"), ("a <= 3 3", "column 8")]:
        with pytest.raises(TargetError, match=re.escape(where)):
            parse_target(bad)


def test_comparison_chart_is_the_result_objects(case_file, tmp_path):
    import matplotlib.image as mpimg

    from attic.case.load import load_cases
    from attic.present.plots import LOAD_PARTS, comparison_chart, save
    from attic.runs.condition import run_case
    from attic.runs.study import compare

    cases = load_cases(case_file)
    results = {c.name: run_case(c) for c in cases}
    cmp = compare(cases, results)
    fig = comparison_chart(cmp, "cooling")
    ax = fig.axes[0]
    rows = cmp.by_kind("cooling")
    shown = [attr for _, attr, _ in LOAD_PARTS if any(abs(getattr(r, attr)) > 1e-9 for r in rows)]
    heights = [p.get_height() for p in ax.patches]
    expect = [getattr(r, attr) / 0.29307107 for attr in shown for r in rows]
    assert heights == pytest.approx(expect)
    assert ax.get_ylabel() == "equipment load, Btu/h" and "cooling design condition" in ax.get_title()
    w, h = fig.get_size_inches() * fig.dpi
    png = tmp_path / "c.png"
    save(fig, png)
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    img = mpimg.imread(png)
    assert img.shape[:2] == (round(h), round(w))


def test_sweep_chart_is_the_outputs(case_raw, tmp_path):
    from attic.present.plots import save, sweep_chart

    s = sweep(case_raw, [parse_set("duct.*.r_value=4.2,6,8")])
    fig = sweep_chart(s, ["house.tons"])
    line = fig.axes[0].lines[0]
    assert list(line.get_xdata()) == [4.2, 6.0, 8.0] and list(line.get_ydata()) == s.column("house.tons")
    assert "h·ft²·°F/Btu" in fig.axes[0].get_xlabel()
    save(fig, tmp_path / "s.svg")
    assert (tmp_path / "s.svg").read_text().lstrip().startswith("<?xml")


class StrictHTML(HTMLParser):
    VOID = {"meta", "br", "hr", "img", "input", "link", "path", "use", "stop", "rect", "circle", "line",
            "polyline", "polygon", "ellipse"}

    def __init__(self):
        super().__init__()
        self.stack, self.errors = [], []

    def handle_starttag(self, tag, attrs):
        if tag not in self.VOID:
            self.stack.append(tag)

    def handle_startendtag(self, tag, attrs):
        pass

    def handle_endtag(self, tag):
        if tag in self.VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"</{tag}> closes {self.stack[-1] if self.stack else 'nothing'}")
        else:
            self.stack.pop()


def test_report_is_valid_self_contained_html(case_file, tmp_path):
    out = tmp_path / "report.html"
    res = runner.invoke(app, ["report", str(case_file), "-o", str(out)])
    assert res.exit_code == 0, res.output
    html = out.read_text()
    p = StrictHTML()
    p.feed(html)
    p.close()
    assert not p.errors and not p.stack, (p.errors[:5], p.stack[:5])
    for name in ("base", "R-8 ducts", "ducts inside", "unvented"):
        assert name in html
    assert "qualified person" in html and "local amendments govern" in html and "<svg" in html
    assert "http://" not in html and "https://" not in html  # nothing is fetched
    assert "Moving the ducts inside" in html
    # the method names the convection model the case uses, with its published source
    assert "Clear, Gartland &amp; Winkelmann (2003) (clear-gartland-winkelmann)" in html
    assert "Watmuff" not in html


def test_report_refuses_the_case_file(case_file):
    before = case_file.read_text()
    res = runner.invoke(app, ["report", str(case_file), "-o", str(case_file)])
    assert res.exit_code == 2 and case_file.read_text() == before


def test_a_case_gives_back_a_dict_that_validates_to_its_inputs():
    from pathlib import Path

    from attic.case.load import load_cases, raw_of, validate_raw

    root = Path(__file__).resolve().parent.parent
    for path in sorted((root / "cases").glob("*.toml")) + [root / "attic" / "data" / "starter.toml"]:
        for case in load_cases(path):
            again = validate_raw(raw_of(case))
            expect = {k: v for k, v in case.inputs.items() if k != "uncertainty"}
            assert again == {**expect, "variant": []}, (path.name, case.name)


def test_pick_tries_every_value_when_one_cannot_solve(tmp_path):
    # a 69.5 °F house: supply air at 69 °F is half a degree cooler than the room, too close to carry a design load
    # (design supply air leaves 15-25 °F below the room: common practice, no source), so that value fails with its
    # reason, as the input's doing, and the others still count
    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5
    res = pick(raw, "air_handler.supply_F", [55.0, 69.0, 55.0, 58.0], "house.tons < 100")
    assert [c[0] for c in res.checks] == [55.0, 58.0, 69.0]  # sorted, a value given twice tried once
    assert res.chosen == 55.0 and res.checks[2][1:] == (None, None, None, None)
    assert res.errors[:2] == (None, None) and "at least 10 °F below" in res.errors[2]
    assert res.balance_failed[2] is False
    path = tmp_path / "cool-house.toml"
    path.write_text(to_toml(raw))
    out = runner.invoke(app, ["pick", str(path), "--vary", "air_handler.supply_F", "--among", "55,69",
                              "--target", "house.tons < 100", "-f", "json"])
    assert out.exit_code == 2  # the input's doing, and that value might have met the target
    assert "atticduct: at air_handler.supply_F=69: air_handler.supply_F: 69 is not allowed" in out.output
    assert "Traceback" not in out.output
    assert "cooling.indoor_F = 69.5 °F" in json.loads(out.stdout)["checks"][1]["error"]


def test_sweep_names_the_point_that_failed_and_why(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5  # as in test_pick_tries_every_value_when_one_cannot_solve
    path = tmp_path / "cool-house.toml"
    path.write_text(to_toml(raw))
    res = runner.invoke(app, ["sweep", str(path), "--set", "air_handler.supply_F=55,69", "-f", "csv"])
    assert res.exit_code == 2, res.output
    assert "atticduct: at air_handler.supply_F=69: " in res.output and "at least 10 °F below" in res.output
    rows = list(csv.DictReader(io.StringIO(res.stdout)))
    assert rows[0]["error"] == "" and "at least 10 °F below" in rows[1]["error"] and rows[1]["house.total_btuh"] == ""


def test_sweep_csv_always_ends_in_the_error_column_and_heating_shows_no_tons(case_file, tmp_path):
    # common practice, no source: a sheet built on one study's columns finds them in the next, failed points or not
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "roof.deck_r=0,10", "-f", "csv"])
    assert res.exit_code == 0, res.output
    header = res.stdout.splitlines()[0].split(",")
    assert header[-1] == "error" and all(r["error"] == "" for r in csv.DictReader(io.StringIO(res.stdout)))
    # tons are a cooling quantity: a heating sweep asked for them shows "-" and says so on the chart, not None
    png = tmp_path / "h.png"
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "roof.deck_r=0,10", "--show", "house.tons",
                              "-c", "heating", "-p", str(png)])
    assert res.exit_code == 0, res.output
    assert "None" not in res.stdout and png.stat().st_size > 0
    assert sum(line.rstrip().endswith("- │") for line in res.stdout.splitlines()) == 2
    from attic.case.load import read_toml
    from attic.present.plots import sweep_chart

    fig = sweep_chart(sweep(read_toml(case_file), [parse_set("roof.deck_r=0,10")], "heating"), ["house.tons"])
    said = [t.get_text() for ax in fig.axes for t in ax.texts]
    assert said == ["not given at the heating design condition"] and fig.axes[0].get_xlim() == (0.0, 10.0)


def test_choices_are_picked_in_the_order_given_and_numbers_by_size(case_file):
    # a covering has no size: the first listed that meets the target wins, and --largest is refused for it
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "roof.covering", "--among",
                              "asphalt-shingle-light,asphalt-shingle-dark", "--target", "house.total_btuh < 1e9"])
    text = " ".join(res.output.split())
    assert res.exit_code == 0 and "First in the order given that meets" in text
    as_json = runner.invoke(app, ["pick", str(case_file), "--vary", "roof.covering", "--among",
                                  "asphalt-shingle-light,asphalt-shingle-dark", "--target", "house.total_btuh < 1e9",
                                  "-f", "json"])
    assert json.loads(as_json.stdout)["picks"] == "first in the order given"  # as the table says
    assert text.index("= asphalt-shingle-light:") < text.index("= asphalt-shingle-dark:")
    assert "roof.covering = asphalt-shingle-light." in text
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "roof.covering", "--among",
                              "asphalt-shingle-light,asphalt-shingle-dark", "--target", "house.total_btuh < 1e9",
                              "--largest"])
    assert res.exit_code == 2 and res.output.startswith("atticduct: --largest: orders numbers")


def test_a_sweep_names_the_cases_own_error_without_a_point_and_shows_swept_units(case_file, tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text(case_file.read_text().replace("ceiling_r = 30", 'ceiling_r = "30"', 1))
    assert 'ceiling_r = "30"' in bad.read_text()
    res = runner.invoke(app, ["sweep", str(bad), "--set", "roof.deck_r=0,5"])
    assert res.exit_code == 2 and "attic.ceiling_r" in res.output and "(at " not in res.output
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "attic.ceiling_r=0,500"])
    assert res.exit_code == 2 and "(at attic.ceiling_r=500)" in res.output  # the point's own value
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "roof.deck_r=0,10", "-u", "si"])
    assert "h·ft²·°F/Btu" in res.stdout  # a swept value is in the case file's units, whatever --units


def test_sweep_refuses_a_key_given_twice(case_file):
    res = runner.invoke(app, ["sweep", str(case_file), "-s", "roof.deck_r=1,2", "-s", "roof.deck_r=3,4"])
    assert res.exit_code == 2 and "given twice" in res.output and "Traceback" not in res.output


def test_sweep_chart_breaks_its_line_at_a_point_that_did_not_solve(tmp_path):
    # common practice, no source: a line must not bridge a missing value as if it were known
    from attic.present.plots import sweep_chart

    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5  # as in test_pick_tries_every_value_when_one_cannot_solve
    s = sweep(raw, [parse_set("air_handler.supply_F=50,55,69")])  # 69 °F supply air is too close to the room
    assert s.outputs[2] is None
    ax = sweep_chart(s, ["house.tons"]).axes[0]
    y = list(ax.lines[0].get_ydata())
    assert y[:2] == s.column("house.tons")[:2] and y[2] != y[2]  # NaN: the line stops there
    assert list(ax.lines[1].get_xdata()) == [69.0]  # the failed point's mark
    assert any("did not solve" in t.get_text() for t in ax.get_legend().get_texts())


def test_sweep_chart_runs_along_x_and_marks_a_failure_in_its_line_colour():
    # common practice, no source: a line joins neighbouring x values, and a mark says which line it belongs to
    from attic.present.plots import sweep_chart

    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5  # as in test_pick_tries_every_value_when_one_cannot_solve
    s = sweep(raw, [parse_set("air_handler.supply_F=60,50,69,55"), parse_set("attic.ceiling_r=19,38")])
    ax = sweep_chart(s, ["house.tons"]).axes[0]
    lines = [ln for ln in ax.lines if ln.get_marker() == "o"]
    marks = [ln for ln in ax.lines if ln.get_marker() == "x"]
    assert all(list(ln.get_xdata()) == [50.0, 55.0, 60.0, 69.0] for ln in lines)
    assert len(marks) == 2 and [m.get_color() for m in marks] == [ln.get_color() for ln in lines]
    # both lines fail at 69 °F: two marks, one above the other, not one over the other
    assert marks[0].get_ydata()[0] != marks[1].get_ydata()[0]


def test_a_sweep_where_no_point_solves_still_writes_every_point_and_why(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5
    path = tmp_path / "cool-house.toml"
    path.write_text(to_toml(raw))
    plot = tmp_path / "s.png"
    res = runner.invoke(app, ["sweep", str(path), "--set", "air_handler.supply_F=69:69.4:0.1", "-f", "csv",
                              "--plot", str(plot)])
    assert res.exit_code == 2 and "no point of the sweep solved (5 tried)" in res.output
    rows = list(csv.DictReader(io.StringIO(res.stdout)))
    assert len(rows) == 5 and all("at least 10 °F below" in r["error"] for r in rows)
    assert all(r["house.total_btuh"] == "" and r["attic.air_F"] == "" for r in rows)  # the columns are there
    assert "and 0 more" not in res.output and plot.stat().st_size > 0
    res = runner.invoke(app, ["sweep", str(path), "--set", "air_handler.supply_F=69:69.25:0.05"])  # 6 points
    assert "and 1 more point did not solve" in res.output


def test_pick_where_no_value_solves_says_so_and_option_errors_name_the_option(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5
    path = tmp_path / "cool-house.toml"
    path.write_text(to_toml(raw))
    res = runner.invoke(app, ["pick", str(path), "--vary", "air_handler.supply_F", "--among", "69,69.2",
                              "--target", "house.tons < 9"])
    assert res.exit_code == 2 and "No value solved, so none can be picked" in res.output
    assert "that solved" not in res.output
    res = runner.invoke(app, ["pick", str(path), "--vary", "air_handler.suply_F", "--among", "55",
                              "--target", "house.tons < 9"])
    assert res.exit_code == 2 and "--vary air_handler.suply_F" in res.output and "--set" not in res.output


def test_a_point_refused_for_its_combination_crosses_processes_whole():
    # sweep --jobs sends each batch's checked points to a worker process: a refused point goes as its error
    import pickle

    from attic.case.errors import CombinationError

    e = CombinationError("air_handler.supply_F", "69 is not allowed", source="x.toml")
    again = pickle.loads(pickle.dumps(e))
    assert type(again) is CombinationError and str(again) == str(e) and again.path == e.path
    raw = raw_case(with_ducts=True)
    raw["cooling"]["indoor_F"] = 69.5
    specs = [parse_set("air_handler.supply_F=50,55,59.5,69")]
    one, two = sweep(raw, specs, jobs=1), sweep(raw, specs, jobs=2)
    assert two.errors == one.errors and "at least 10 °F below" in two.errors[3] and two.errors[2] is None
    assert [o is None for o in two.outputs] == [False, False, False, True]


def test_a_target_on_an_output_heating_does_not_give_says_so(case_raw):
    # tons measure cooling: at the heating condition house.tons is empty, and the target says why
    from attic.runs.target import TargetError

    with pytest.raises(TargetError, match="has no value at this design condition"):
        pick(case_raw, "duct.*.r_value", [4.2, 8.0], "house.tons <= 3", kind="heating")


def test_a_variant_is_swept_and_picked_with_its_own_settings():
    # -n: the variant's settings, then the swept value; at the variant's own value a point is the variant's run
    from pathlib import Path

    demo = str(Path(__file__).resolve().parent.parent / "cases" / "demo.toml")
    name = "unvented, R-20 foam under deck"
    run = json.loads(runner.invoke(app, ["run", demo, "-n", name, "-f", "json"]).stdout)[0]["house"]["total_btuh"]
    res = runner.invoke(app, ["sweep", demo, "-n", name, "--set", "roof.deck_r=10,20", "-f", "json"])
    rows = json.loads(res.stdout)
    assert res.exit_code == 0 and rows[1]["set.roof.deck_r"] == 20 and rows[1]["house.total_btuh"] == run
    assert rows[0]["house.total_btuh"] > run  # less foam, more load: the variant's attic, not the base's
    base = json.loads(runner.invoke(app, ["sweep", demo, "--set", "roof.deck_r=20", "-f", "json"]).stdout)
    assert base[0]["house.total_btuh"] != run  # without -n the base (vented, R-30 ceiling) is swept
    assert all(r["variant"] == name for r in rows)  # a saved sweep says whose it is
    pick = json.loads(runner.invoke(app, ["pick", demo, "-n", name, "--vary", "roof.deck_r", "--among", "10,20",
                                          "--target", f"house.total_btuh <= {run}", "-f", "json"]).stdout)
    assert pick["variant"] == name and pick["chosen"] == 20
    sheet = runner.invoke(app, ["pick", demo, "-n", name, "--vary", "roof.deck_r", "--among", "10,20",
                                "--target", f"house.total_btuh <= {run}", "-f", "csv"]).stdout
    assert all(r["variant"] == name for r in csv.DictReader(io.StringIO(sheet)))
    bad = runner.invoke(app, ["sweep", demo, "-n", "nope", "--set", "roof.deck_r=10"])
    assert bad.exit_code == 2 and '"nope" is not in the case' in bad.output
