"""A negative latent duct load is a credit (dry attic air drawn into return leaks), labelled so in the JSON,
the table and the report."""

import json

from typer.testing import CliRunner

from attic.cli import app
from helpers import raw_case, to_toml

runner = CliRunner()


def _case(tmp_path, dewpoint_F):
    raw = raw_case(with_ducts=True)
    raw["cooling"]["outdoor_dewpoint_F"] = dewpoint_F
    raw["leakage"] = {"supply_fraction": 0.0, "return_fraction": 0.08}  # return leaks only: attic air in
    p = tmp_path / f"dew{dewpoint_F}.toml"
    p.write_text(to_toml(raw))
    return p


def _cooling(p):
    data = json.loads(runner.invoke(app, ["run", str(p), "-f", "json"]).stdout)
    outs = data if isinstance(data, list) else next(iter(data.values()))
    return [o for o in outs if o["condition"] == "cooling"][0]


def test_dry_attic_air_in_a_return_leak_is_a_latent_credit(tmp_path):
    # psychrometrics (fact of the trade): 75 °F at 50 % RH has a dew point near 55 °F, so outdoor (attic) air at
    # a 35 °F dew point holds less water than the house air; mixing it into the return lowers the coil's
    # latent work. At a 72 °F dew point it holds more and adds to it.
    dry = _cooling(_case(tmp_path, 35.0))
    assert dry["ducts"]["leakage_latent_btuh"] < -50 and dry["ducts"]["leakage_latent_credit"] is True
    humid = _cooling(_case(tmp_path, 72.0))
    assert humid["ducts"]["leakage_latent_btuh"] > 50 and humid["ducts"]["leakage_latent_credit"] is False
    table = runner.invoke(app, ["run", str(_case(tmp_path, 35.0))], terminal_width=200).output
    assert "(credit)" in table
    assert "credit" not in runner.invoke(app, ["run", str(_case(tmp_path, 72.0))], terminal_width=200).output


def test_report_says_the_latent_part_is_a_credit(tmp_path):
    out = tmp_path / "r.html"
    res = runner.invoke(app, ["report", str(_case(tmp_path, 35.0)), "-o", str(out)])
    assert res.exit_code == 0, res.output
    assert "the latent part is a credit" in out.read_text()
