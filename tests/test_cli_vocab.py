"""One tool, one vocabulary: the same options everywhere, output paths checked before any work, help that
renders, exit codes as documented."""

import csv
import io
import json
from pathlib import Path

import pytest
from typer.testing import CliRunner

from attic.cli import app
from helpers import raw_case, to_toml

runner = CliRunner()
ROOT = Path(__file__).resolve().parent.parent
DEMO = str(ROOT / "cases" / "demo.toml")
WEATHER = str(ROOT / "cases" / "demo-weather.csv")
COMPUTING = ("run", "demo", "compare", "sweep", "pick", "day", "year")


@pytest.fixture
def case_file(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["variant"] = [{"name": "inside", "set": {"duct.*.location": "conditioned"}},
                      {"name": "R-8", "set": {"duct.*.r_value": 8}}]
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw))
    return p


def _commands():
    import typer.main

    group = typer.main.get_command(app)
    return {name: group.commands[name] for name in group.commands}


def _opts(cmd):
    return {o: p for p in cmd.params for o in p.opts + p.secondary_opts}


@pytest.mark.parametrize("name", COMPUTING)
def test_every_computing_command_has_format_output_units(name):
    opts = _opts(_commands()[name])
    for long, short in (("--format", "-f"), ("--output", "-o"), ("--units", "-u")):
        assert long in opts and short in opts and opts[long] is opts[short], (name, long)
    assert "<table|json|csv>" in runner.invoke(app, [name, "--help"], env={"COLUMNS": "200"}).output


def test_the_same_option_means_the_same_thing_everywhere():
    seen = {}
    for name, cmd in _commands().items():
        for p in cmd.params:
            for o in p.opts + p.secondary_opts:
                # no one-letter long options, and -v (verbose or version to most users) is not taken
                assert not (o.startswith("--") and len(o) == 3), (name, o)
                assert o != "-v", (name, o)
            longs = tuple(o for o in p.opts if o.startswith("--"))
            shorts = tuple(o for o in p.opts if not o.startswith("--"))
            for long in longs:
                if long in seen and long != "--output":  # report's --output is required; the short form agrees
                    assert seen[long] == shorts, (name, long, shorts, seen[long])
                seen.setdefault(long, shorts)
    assert seen["--variant"] == ("-n",) and seen["--condition"] == ("-c",) and seen["--plot"] == ("-p",)
    assert "--plot-condition" not in seen and "--csv" not in seen


def test_plot_writes_exactly_the_path_given(case_file, tmp_path):
    out = tmp_path / "figs"
    out.mkdir()
    res = runner.invoke(app, ["day", str(case_file), "--plot", str(out / "day.png"), "-f", "json"])
    assert res.exit_code == 0, res.output
    assert sorted(p.name for p in out.iterdir()) == ["day.png"]
    assert (out / "day.png").read_bytes()[:4] == b"\x89PNG"
    res = runner.invoke(app, ["day", "--help"], env={"COLUMNS": "200"})
    assert "one file" in " ".join(res.output.split())


def test_day_plot_has_a_row_per_variant(case_file):
    from attic.case.load import load_cases
    from attic.present.plots import design_day_chart
    from attic.runs.day import run_design_day

    days = [run_design_day(c) for c in load_cases(case_file)]
    fig = design_day_chart(days)
    assert len(fig.axes) == 2 * len(days) == 6
    assert [fig.axes[2 * i].get_title(loc="left") for i in range(3)] == ["base", "inside", "R-8"]
    # the load panel's colours repeat two temperature lines': its lines are named beside it, not in the shared key
    shared = [t.get_text() for t in fig.legends[0].get_texts()]
    beside = [t.get_text() for t in fig.axes[1].get_legend().get_texts()]
    assert "attic air" in shared and "ceiling" not in shared and beside == ["ceiling", "ducts (air handler running)"]


@pytest.mark.parametrize("args", [
    ["run", "{case}", "-f", "json", "-o", "{missing}/out.json"],
    ["run", "{case}", "-f", "csv", "-o", "{folder}"],
    ["compare", "{case}", "-o", "{missing}/c.txt"],
    ["compare", "{case}", "--plot", "{missing}/c.png"],
    ["compare", "{case}", "--plot", "{folder}/c.pdf"],
    ["sweep", "{case}", "--set", "roof.deck_r=0,10", "-f", "csv", "-o", "{missing}/s.csv"],
    ["sweep", "{case}", "--set", "roof.deck_r=0,10", "--plot", "{folder}"],
    ["pick", "{case}", "--vary", "duct.*.r_value", "--among", "6,8", "--target", "house.tons < 9",
     "-o", "{missing}/p.json"],
    ["day", "{case}", "--plot", "{missing}/d.png"],
    ["year", "{case}", "--weather", WEATHER, "-o", "{missing}/y.csv"],
    ["report", "{case}", "-o", "{missing}/r.html"],
    ["report", "{case}", "-o", "{folder}/r.toml"],
    ["check", "{case}", "-f", "csv", "-o", "{folder}"],
])
def test_an_output_path_that_cannot_be_written_is_found_before_the_work(args, case_file, tmp_path, monkeypatch):
    import attic.runs.condition as condition

    def must_not_run(*a, **k):
        raise AssertionError("computed before checking the output path")

    monkeypatch.setattr(condition, "run_case", must_not_run)
    monkeypatch.setattr(condition, "run_condition", must_not_run)
    folder = tmp_path / "a-folder"
    folder.mkdir()
    fill = {"case": str(case_file), "missing": str(tmp_path / "no-such-folder"), "folder": str(folder)}
    res = runner.invoke(app, [a.format(**fill) for a in args])
    assert res.exit_code == 2, res.output
    lines = res.output.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("atticduct: ") and "Traceback" not in res.output, res.output


def test_a_case_path_that_is_a_folder_or_not_text_is_said_in_words(tmp_path):
    res = runner.invoke(app, ["run", str(tmp_path)])
    assert res.exit_code == 2 and "is a folder" in res.output and "Errno" not in res.output
    bad = tmp_path / "latin1.toml"
    bad.write_bytes('title = "Caf\xe9"\n'.encode("latin-1"))
    res = runner.invoke(app, ["run", str(bad)])
    assert res.exit_code == 2 and "not UTF-8 text" in res.output and "codec" not in res.output
    res = runner.invoke(app, ["sweep", str(tmp_path), "--set", "roof.deck_r=0,10"])
    assert res.exit_code == 2 and "is a folder" in res.output


@pytest.mark.parametrize("spec,words", [
    ("roof.deck_r=0:40:0", "the step is 0"),
    ("roof.deck_r=0:40:-5", "a range runs up"),
    ("roof.deck_r=40:0:5", "a range runs up"),
    ("roof.deck_r=0:10:20", "larger than the span"),
    ("roof.deck_r=0:x:5", "three numbers"),
    ("roof.deck_r=0:10:3", "roof.deck_r=0:9:3 or 0:12:3"),  # STOP is included, so it must be on the grid
])
def test_sweep_ranges_are_checked(spec, words, case_file):
    res = runner.invoke(app, ["sweep", str(case_file), "--set", spec])
    assert res.exit_code == 2 and words in res.output and len(res.output.strip().splitlines()) == 1, res.output


def test_sweep_range_includes_the_stop_and_says_so(case_file):
    res = runner.invoke(app, ["sweep", str(case_file), "--set", "roof.deck_r=0:10:5", "-f", "json"])
    assert res.exit_code == 0, res.output
    assert [r["set.roof.deck_r"] for r in json.loads(res.output)] == [0.0, 5.0, 10.0]
    assert "STOP included" in " ".join(runner.invoke(app, ["sweep", "--help"], env={"COLUMNS": "200"}).output.split())


def test_help_renders_what_is_written():
    out = runner.invoke(app, ["run", "--help"], env={"COLUMNS": "200"}).output
    assert "[[variant]]" in out
    assert "did not close" in out  # the sentence is not broken mid-line
    for name in _commands():
        text = runner.invoke(app, [name, "--help"], env={"COLUMNS": "200"}).output
        assert "<bool>" not in text, name
    year = " ".join(runner.invoke(app, ["year", "--help"], env={"COLUMNS": "100"}).output.split())
    assert "dni_w_m2" in year and "…" not in year


def test_version_and_bare_command():
    from importlib.metadata import version

    res = runner.invoke(app, ["--version"])
    assert res.exit_code == 0 and res.output.strip() == f"atticduct {version('atticduct')}"
    res = runner.invoke(app, [])
    assert res.exit_code == 0 and "Usage" in res.output and "compare" in res.output


def test_main_help_has_the_exit_code_table():
    text = " ".join(runner.invoke(app, ["--help"], env={"COLUMNS": "200"}).output.split())
    for code in ("0 done", "1 ran, and a check", "2 the input is wrong", "3 a heat balance did not close",
                 "4 internal error"):
        assert code in text
    readme = " ".join((ROOT / "README.md").read_text().split())
    from attic.cli.common import EXIT_CODES

    for code, words in EXIT_CODES:
        assert f"| {code} | {words} |" in readme


def test_a_balance_that_does_not_close_names_the_node_and_residual(case_file, monkeypatch):
    from attic.network import solve

    monkeypatch.setattr(solve, "RESIDUAL_LIMIT_W", -1.0)
    res = runner.invoke(app, ["run", str(case_file), "-n", "base"])
    assert res.exit_code == 3
    assert "node '" in res.output and " W" in res.output and "air_F" not in res.output


def test_keys_table_and_markdown():
    md = runner.invoke(app, ["keys", "--markdown"]).output
    assert "| `radiant_barrier` |  | `false` | true or false |" in md and "`False`" not in md
    assert "0-1 0-1" not in md and "a number from 0 to 1 |" in md  # the unit once
    table = runner.invoke(app, ["keys"], env={"COLUMNS": "160"}).output
    assert "|---|" not in table and "radiant_barrier" in table and "false" in table
    # an 80-column terminal gets a paragraph per key: no word broken across a narrow column
    narrow = runner.invoke(app, ["keys"], env={"COLUMNS": "80"}).output
    assert "┃" not in narrow and "  deck_air_impermeable_r, h·ft²·°F/Btu (optional): " in narrow
    assert "  radiant_barrier (default false): true or false." in narrow


def test_check_short_lines_verbose_and_formats(case_file):
    res = runner.invoke(app, ["check", str(case_file), "-n", "base"], env={"COLUMNS": "200"})
    assert res.exit_code == 0
    lines = [ln for ln in res.output.splitlines() if ln[:4] in ("PASS", "FAIL", "N/A ")]
    assert lines and not any("…" in ln for ln in lines)  # a requirement is never cut short: it wraps
    assert res.output.count("Check the edition your jurisdiction adopted") == 1
    fixes = [ln for ln in res.output.splitlines() if ln.strip().startswith("fix:")]
    assert fixes and all(ln.startswith("     ") for ln in fixes)
    verbose = runner.invoke(app, ["check", str(case_file), "-n", "base", "--verbose"], env={"COLUMNS": "300"}).output
    assert "Attic ventilation: net free area at least 1/150" in verbose
    rows = list(csv.DictReader(io.StringIO(runner.invoke(app, ["check", str(case_file), "-f", "csv"]).output)))
    assert {"variant", "rule", "source", "verdict", "fix"} <= set(rows[0]) and {r["variant"] for r in rows} == {
        "base", "inside", "R-8"}
    assert "no source" not in runner.invoke(app, ["check", str(case_file), "-f", "json"]).output


def test_check_says_a_safety_requirement_whole_and_reads_as_words():
    # an unvented attic's combustion-appliance rule had been cut to "needs sealed-combustion or …"
    demo = str(Path(__file__).resolve().parent.parent / "cases" / "demo.toml")
    args = ["check", demo, "-n", "unvented, R-20 foam under deck"]
    short = " ".join(runner.invoke(app, args, env={"COLUMNS": "100"}).output.split())
    assert "needs sealed-combustion or direct-vent appliances, or combustion air provided" in short
    verbose = " ".join(runner.invoke(app, [*args, "--verbose"], env={"COLUMNS": "300"}).output.split())
    assert "has not described" not in verbose and "requires -." not in verbose


@pytest.mark.parametrize("cmd", [["compare"], ["pick", "--vary", "duct.*.r_value", "--among", "6,8", "--target",
                                               "house.tons < 9"], ["day", "-n", "base"],
                                 ["sweep", "--set", "roof.deck_r=0,10"]])
def test_csv_and_json_everywhere(cmd, case_file, tmp_path):
    args = [cmd[0], str(case_file), *cmd[1:]]
    js = runner.invoke(app, [*args, "-f", "json"])
    assert js.exit_code == 0, js.output
    json.loads(js.output)
    out = tmp_path / "x.csv"
    res = runner.invoke(app, [*args, "-f", "csv", "-o", str(out)])
    assert res.exit_code == 0, res.output
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert rows and len(rows[0]) > 2


def test_table_to_a_file_is_plain_text(case_file, tmp_path):
    out = tmp_path / "t.txt"
    assert runner.invoke(app, ["compare", str(case_file), "-o", str(out)]).exit_code == 0
    text = out.read_text()
    assert "equipment load" in text and "\x1b[" not in text


def test_pick_units(case_file):
    res = runner.invoke(app, ["pick", str(case_file), "--vary", "duct.*.r_value", "--among", "6,8", "-u", "si",
                              "--target", "ducts.total_w <= 0.5 * house.total_w"])
    assert res.exit_code == 0, res.output


def test_day_names_planes_by_facing(case_file):
    (d,) = json.loads(runner.invoke(app, ["day", str(case_file), "-n", "base", "-f", "json"]).output)
    row = d["hours"][0]
    assert "planes.south.inner_F" in row and "planes.north.irradiance_btuh_ft2" in row
    assert not any(k.startswith("plane1") for k in row)
    table = runner.invoke(app, ["day", str(case_file), "-n", "base"], env={"COLUMNS": "200"}).output
    header = " ".join(table.split("┡")[0].split())  # the header's lines, broken between words
    assert "south" in header and "underside" in header and "deck 1" not in table


def test_heating_shows_no_tons_and_no_minus_zero(case_file):
    out = runner.invoke(app, ["run", str(case_file), "-n", "base"], env={"COLUMNS": "200"}).output
    tons = next(ln for ln in out.splitlines() if "tons of cooling" in ln)
    assert tons.rstrip(" │").endswith("-")  # the heating column has no tons
    assert " -0 " not in out and " -0│" not in out.replace(" ", "")
    cmp = runner.invoke(app, ["compare", str(case_file)], env={"COLUMNS": "200"}).output
    assert "-0 " not in cmp and "-0.00" not in cmp


def test_report_names_the_case_file_not_its_folders(case_file, tmp_path):
    out = tmp_path / "r.html"
    assert runner.invoke(app, ["report", str(case_file), "-o", str(out)]).exit_code == 0
    html = out.read_text()
    assert "<code>house.toml</code>" in html and str(case_file.parent) not in html


def test_output_to_a_device_is_written_in_place_not_replaced(case_file, tmp_path):
    import os
    import stat

    fifo = tmp_path / "pipe.json"
    os.mkfifo(fifo)
    import threading

    got = []
    reader = threading.Thread(target=lambda: got.append(open(fifo).read()))
    reader.start()
    res = runner.invoke(app, ["run", str(case_file), "-n", "base", "-f", "json", "-o", str(fifo)])
    reader.join(timeout=60)
    assert res.exit_code == 0, res.output
    assert stat.S_ISFIFO(os.stat(fifo).st_mode) and json.loads(got[0])[0]["case"] == "base"


def test_supply_air_that_cools_nothing_is_an_input_error(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["air_handler"]["supply_F"] = 70
    raw["cooling"]["indoor_F"] = 68
    raw["cooling"]["outdoor_F"] = 115
    p = tmp_path / "warm.toml"
    p.write_text(to_toml(raw))
    res = runner.invoke(app, ["run", str(p), "-f", "json"])
    assert res.exit_code == 2 and "air_handler.supply_F" in res.output and "Traceback" not in res.output


def test_figures_read_well(case_file):
    # the figure items: thousands separators, labels inside the frame, colours apart, no faint yellow
    from matplotlib.colors import to_rgb

    from attic.case.load import load_cases
    from attic.present.plots import LOAD_PARTS, OKABE_ITO, comparison_chart, design_day_chart
    from attic.runs.condition import run_case
    from attic.runs.day import run_design_day
    from attic.runs.study import compare

    cases = load_cases(case_file)
    results = {c.name: run_case(c) for c in cases}
    cmp = compare(cases, results)
    fig = comparison_chart(cmp, "cooling")
    ax = fig.axes[0]
    fig.canvas.draw()
    labels = [t.get_text() for t in ax.get_yticklabels() if t.get_text()]
    assert any("," in t for t in labels), labels  # 20,000 not 20000
    top = max(r.equipment_w for r in cmp.by_kind("cooling")) / 0.29307107
    assert ax.get_ylim()[1] >= 1.1 * top  # room for the tons label above the tallest bar
    colours = {attr: to_rgb(c) for _, attr, c in LOAD_PARTS}
    base, latent = colours["base_w"], colours["duct_leak_latent_w"]
    assert sum((a - b) ** 2 for a, b in zip(base, latent, strict=True)) ** 0.5 > 0.3
    day = design_day_chart([run_design_day(cases[0])])
    for a in day.axes:
        for line in a.get_lines():
            assert line.get_color().upper() != OKABE_ITO[3].upper()  # the faint yellow
            assert line.get_linewidth() >= 1.5 or line.get_label().startswith("_")


def test_heatmap_x_axis_in_months(tmp_path):
    from attic.case.load import load_cases
    from attic.case.weather import read_weather
    from attic.present.plots import attic_heatmap
    from attic.runs.year import run_year

    (case,) = load_cases(DEMO, only="base")
    fig = attic_heatmap([run_year(case, read_weather(WEATHER))])
    fig.canvas.draw()
    ticks = [t.get_text() for t in fig.axes[0].get_xticklabels()]
    assert ticks[:3] == ["Jan", "Feb", "Mar"] and ticks[-1] == "Dec"


def test_readme_names_match_the_commands(case_file):
    # README's words for compare, day and year are the keys the commands print
    readme = (ROOT / "README.md").read_text()
    cmp = json.loads(runner.invoke(app, ["compare", str(case_file), "-f", "json"]).output)["rows"][0]
    for sec, keys in (("attic", ["air_F"]), ("house", ["base_btuh", "ceiling_btuh", "attic_air_btuh", "ducts_btuh",
                                                      "total_btuh", "tons"]),
                      ("ducts", ["conduction_btuh", "leakage_sensible_btuh", "leakage_latent_btuh"]),
                      ("vs_base", ["total_btuh", "tons"])):
        for k in keys:
            assert k in cmp[sec], (sec, k)
    assert "`vs_base.{total_btuh, tons}`" in readme and "`planes.south.inner_F`" in readme
