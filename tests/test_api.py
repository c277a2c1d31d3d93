"""The Python face: README's "From Python" block runs as written, and the API gives the CLI's numbers."""

import doctest
import json
import os
import re
from pathlib import Path

import pytest

import attic

ROOT = Path(__file__).resolve().parent.parent
DEMO = ROOT / "cases" / "demo.toml"


def test_readme_python_block_runs_as_written():
    text = (ROOT / "README.md").read_text()
    section = text.split("### From Python", 1)[1].split("\n### ", 1)[0]
    block = re.search(r"```python\n(.*?)```", section, re.S).group(1)
    test = doctest.DocTestParser().get_doctest(block, {}, "README From Python", str(ROOT / "README.md"), 0)
    assert test.examples, "the README block has no examples"
    runner = doctest.DocTestRunner(optionflags=doctest.NORMALIZE_WHITESPACE)
    cwd = os.getcwd()
    try:
        os.chdir(ROOT)
        runner.run(test)
    finally:
        os.chdir(cwd)
    assert runner.failures == 0


def test_everything_in_all_is_there():
    for name in attic.__all__:
        assert hasattr(attic, name), name


def test_a_dict_and_the_file_give_the_same_case():
    import tomllib

    from_file = attic.read_case(DEMO, variant="base")[0]
    from_dict = attic.read_case(tomllib.loads(DEMO.read_text()), variant="base")[0]
    assert from_file == from_dict


def test_api_results_are_the_cli_numbers():
    """The frame's SI numbers converted to IP equal the CLI's JSON (the CLI uses the same functions)."""
    from typer.testing import CliRunner

    from attic.cli import app
    from attic.units import BTUH, K_to_F

    out = json.loads(CliRunner().invoke(app, ["run", str(DEMO), "-f", "json", "--variant", "base"]).stdout)
    frame = attic.design_frame(attic.design_conditions(attic.read_case(DEMO, variant="base")[0]))
    rows = out if isinstance(out, list) else out["base"]
    for row, js in zip(frame.to_dict("records"), rows, strict=True):
        assert js["condition"] == row["condition"]
        assert js["attic"]["air_F"] == pytest.approx(float(K_to_F(row["attic_air_K"])), abs=0.001)
        assert js["house"]["total_btuh"] == pytest.approx(row["equipment_w"] / BTUH, rel=1e-4)


def test_year_frame_holds_every_hour():
    base = attic.read_case(DEMO, variant="base")[0]
    w = attic.read_weather(ROOT / "cases" / "demo-weather.csv")
    import numpy as np

    times = w.times[:48]
    short = type(w)(times, w.T_dry[:48], None if w.T_dew is None else w.T_dew[:48], None if w.rh is None else
                    w.rh[:48], w.ghi[:48], None if w.dni is None else w.dni[:48], None if w.dhi is None else
                    w.dhi[:48], w.wind[:48])
    y = attic.year(base, short)
    f = y.to_frame()
    assert len(f) == 48 and np.allclose(f["attic_air_K"].to_numpy(), y.hourly["attic_air_K"])
