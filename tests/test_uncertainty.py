"""The uncertainty run: distributions against scipy.stats, validation of the [uncertainty] section, the bands
and the command. Sample counts are small: the properties tested hold for any count."""

import csv
import io
import json

import numpy as np
import pytest
from scipy import stats
from typer.testing import CliRunner

from attic.case.load import CaseError, build_case, validate_raw
from attic.case.uncertainty import UncertainInput, parse_distribution
from attic.cli import app
from attic.runs.uncertainty import draw, numbers, run_uncertainty
from helpers import raw_case, to_toml

runner = CliRunner()


def with_uncertainty(section, variants=()):
    raw = raw_case(with_ducts=True)
    raw["uncertainty"] = section
    if variants:
        raw["variant"] = list(variants)
    return raw


def base_numbers(raw, kind="cooling"):
    """What `run` gives for the base case at a condition (attic.api.design_conditions: the same solve as the
    command): attic air K, duct load W, equipment load W, tons and the winter deck margin K (NaN in cooling)."""
    from attic.api import design_conditions

    case = build_case(validate_raw({k: v for k, v in raw.items() if k not in ("uncertainty", "variant")}))
    return numbers(next(r for r in design_conditions(case) if r.kind == kind))


# ---- distributions -------------------------------------------------------------------------------

@pytest.mark.parametrize("spec,reference", [
    ({"uniform": [0.05, 0.12]}, stats.uniform(loc=0.05, scale=0.07)),
    ({"triangular": [0.03, 0.06, 0.12]}, stats.triang(1 / 3, loc=0.03, scale=0.09)),
    ({"normal": [7.5, 2.5]}, stats.norm(7.5, 2.5)),
    # cut at min only: a normal truncated below (scipy.stats.truncnorm, upper end open)
    ({"normal": [7.5, 2.5], "min": 5.0}, stats.truncnorm(-1.0, np.inf, loc=7.5, scale=2.5)),
    ({"normal": [0.5, 0.2], "min": 0.3, "max": 0.9}, stats.truncnorm(-1.0, 2.0, loc=0.5, scale=0.2)),
])
def test_sampled_moments_match_scipy_stats(spec, reference):
    inp = UncertainInput("x.y", parse_distribution(spec), False)
    x = draw([inp], 4000, seed=3)[:, 0]
    sd = reference.std()
    assert np.mean(x) == pytest.approx(reference.mean(), abs=2e-3 * sd)
    assert np.var(x) == pytest.approx(reference.var(), rel=0.02)
    assert stats.skew(x) == pytest.approx(reference.stats(moments="s"), abs=0.05)
    assert x.min() >= reference.support()[0] and x.max() <= reference.support()[1]


def test_latin_hypercube_puts_one_sample_in_each_stratum_and_repeats_with_the_seed():
    inp = UncertainInput("x.y", parse_distribution({"uniform": [0.0, 1.0]}), False)
    a = draw([inp, inp], 50, seed=11)
    assert sorted(np.floor(a[:, 0] * 50).astype(int)) == list(range(50))  # the Latin hypercube property
    assert np.array_equal(a, draw([inp, inp], 50, seed=11))
    assert not np.array_equal(a, draw([inp, inp], 50, seed=12))


# ---- validation ----------------------------------------------------------------------------------

@pytest.mark.parametrize("path,spec,words", [
    ("roof.solar_reflectnce", {"uniform": [0.05, 0.1]}, "did you mean roof.solar_reflectance"),
    ("duct.nosuch.r_value", {"uniform": [4, 6]}, "matches no duct"),
    ("roof.solar_reflectance", {"uniform": [0.2, 0.1]}, "maximum is below the minimum"),
    ("roof.solar_reflectance", {"triangular": [0.1, 0.3, 0.2]}, "MIN <= MODE <= MAX"),
    ("cooling.wind_mph", {"normal": [7, -1]}, "cannot be negative"),
    ("cooling.wind_mph", {"normal": [7, 1], "min": 9, "max": 8}, "not below max"),
    ("roof.solar_reflectance", {"uniform": [0.5, 1.2]}, "outside what roof.solar_reflectance allows"),
    ("cooling.wind_mph", {"normal": [7, 2.5]}, "outside what cooling.wind_mph allows"),  # reaches below 0 mph
    ("duct.*.r_value", {"scale": {"uniform": [1.0, 6.0]}}, "outside what duct.1.r_value allows"),
    ("roof.covering", {"uniform": [0, 1]}, "only number keys"),
    ("roof.thermal_emittance", {"scale": {"uniform": [0.9, 1.0]}}, "no value in the case to scale"),
    ("roof.solar_reflectance", {"lognormal": [0, 1]}, '"lognormal" is not a distribution'),
    ("roof.solar_reflectance", {"uniform": [0.05, 0.1], "min": 0}, "min and max go with normal only"),
])
def test_bad_uncertainty_entries_are_one_line_errors_naming_the_key(path, spec, words):
    with pytest.raises(CaseError) as e:
        validate_raw(with_uncertainty({path: spec}))
    msg = str(e.value)
    assert msg.startswith(f'uncertainty."{path}"') and words in msg and "\n" not in msg


def test_the_command_line_says_it_in_one_line_with_exit_2(tmp_path):
    p = tmp_path / "bad.toml"
    p.write_text(to_toml(raw_case(with_ducts=True)) + '\n[uncertainty]\n"attic.ceiling_r" = { uniform = [40, 30] }\n')
    res = runner.invoke(app, ["run", str(p)])
    assert res.exit_code == 2 and 'uncertainty."attic.ceiling_r"' in res.output and "Traceback" not in res.output


def test_the_section_is_found_where_a_user_looks(tmp_path):
    # a misspelt section is suggested; `keys` and the starter case both show how to write one
    raw = raw_case(with_ducts=True)
    raw["uncertanty"] = {"roof.solar_reflectance": {"uniform": [0.05, 0.12]}}
    with pytest.raises(CaseError, match="did you mean uncertainty"):
        validate_raw(raw)
    assert "[uncertainty]: optional" in " ".join(runner.invoke(app, ["keys"]).output.split())
    starter = tmp_path / "s.toml"
    runner.invoke(app, ["new", str(starter)])
    text = starter.read_text().replace("# [uncertainty]", "[uncertainty]").replace(
        '# "leakage.supply_fraction"', '"leakage.supply_fraction"')
    starter.write_text(text)  # the commented example, switched on as a user would, runs as it stands
    res = runner.invoke(app, ["uncertainty", str(starter), "--samples", "20"])
    assert res.exit_code == 0, res.output


def test_an_empty_section_is_refused_rather_than_shown_as_a_certain_answer(tmp_path):
    # every band would have zero width, reading as an answer known exactly
    p = tmp_path / "empty.toml"
    p.write_text(to_toml(raw_case(with_ducts=True)) + "\n[uncertainty]\n")
    for args in (["uncertainty", str(p), "--samples", "4"], ["report", str(p), "-o", str(tmp_path / "r.html")]):
        res = runner.invoke(app, args)
        assert res.exit_code == 2 and "names no inputs" in res.output and len(res.output.splitlines()) == 1
    assert not (tmp_path / "r.html").exists()
    # the example the message gives is one the case takes
    example = res.output.split("e.g. ", 1)[1].strip()
    p.write_text(to_toml(raw_case(with_ducts=True)) + f"\n[uncertainty]\n{example}\n")
    assert runner.invoke(app, ["uncertainty", str(p), "--samples", "4"]).exit_code == 0
    # a condition the case does not have is said in one line, before any notice about the samples
    cool_only = {k: v for k, v in raw_case(with_ducts=True).items() if k != "heating"}
    p.write_text(to_toml(cool_only) + f"\n[uncertainty]\n{example}\n")
    res = runner.invoke(app, ["uncertainty", str(p), "-c", "heating", "--samples", "4"])
    assert res.exit_code == 2 and res.output.count("\n") == 1 and "[heating]: section is missing" in res.output


# ---- the run -------------------------------------------------------------------------------------

def test_zero_width_distributions_give_exactly_the_run_numbers():
    raw = with_uncertainty({
        "cooling.wind_mph": {"normal": [5.0, 0.0]},
        "leakage.supply_fraction": {"triangular": [0.05, 0.05, 0.05]},
        "attic.ceiling_r": {"uniform": [30, 30]},
        "duct.*.r_value": {"scale": {"uniform": [1.0, 1.0]}},
    })
    res = run_uncertainty(raw, n=3)
    expect = base_numbers(raw)
    for i in range(3):
        got = tuple(res.outputs["base"][k][i] for k in ("attic_air_K", "ducts_w", "equipment_w", "tons"))
        assert got == expect[:4] and np.isnan(res.outputs["base"]["deck_margin_K"][i])  # no deck check in cooling


def test_percentiles_are_ordered_and_a_wider_input_never_narrows_a_monotone_output():
    # attic air falls as the roof reflects more (monotone); a wider reflectance range must widen its band
    narrow = run_uncertainty(with_uncertainty({"roof.solar_reflectance": {"uniform": [0.10, 0.15]}}), n=10)
    wide = run_uncertainty(with_uncertainty({"roof.solar_reflectance": {"uniform": [0.05, 0.20]}}), n=10)
    for res in (narrow, wide):
        for k in ("attic_air_K", "ducts_w", "equipment_w", "tons"):
            s = res.stats("base", k)
            assert s["p10"] <= s["p50"] <= s["p90"]
    n, w = narrow.stats("base", "attic_air_K"), wide.stats("base", "attic_air_K")
    assert w["p90"] - w["p10"] >= n["p90"] - n["p10"] > 0
    assert wide.rank_correlations(wide.outputs["base"]["attic_air_K"])["roof.solar_reflectance"] == pytest.approx(-1.0)


def test_the_same_seed_gives_the_same_numbers():
    raw = with_uncertainty({"leakage.return_fraction": {"uniform": [0.02, 0.08]}})
    a, b = run_uncertainty(raw, n=3, seed=5), run_uncertainty(raw, n=3, seed=5)
    for k in ("attic_air_K", "equipment_w"):
        assert np.array_equal(a.outputs["base"][k], b.outputs["base"][k])


def test_mean_of_a_linear_output_is_the_output_at_the_mean_input():
    # equipment = (base load + ceiling + attic air) / delivery effectiveness. The design airflow follows the
    # load, so with ducts in the attic the effectiveness and the attic move a little with the base load; with
    # the ducts inside conditioned space (effectiveness 1, nothing in the attic) neither depends on it: the
    # equipment load is linear in it, so the sample mean of the output equals the output at the sample mean of
    # the input, to rounding (tolerance 1e-9 relative).
    raw = with_uncertainty({"house.cooling_sensible_btuh": {"triangular": [14000, 15000, 19000]}})
    raw["duct"] = [{**d, "location": "conditioned"} for d in raw["duct"]]
    res = run_uncertainty(raw, n=6)
    mean_in = float(np.mean(res.values[:, 0]))
    raw2 = {k: v for k, v in raw.items() if k != "uncertainty"}
    raw2["house"] = {**raw2["house"], "cooling_sensible_btuh": mean_in}
    assert np.mean(res.outputs["base"]["equipment_w"]) == pytest.approx(base_numbers(raw2)[2], rel=1e-9)


def test_variants_share_the_samples_and_keep_their_own_value_of_an_uncertain_key():
    raw = with_uncertainty({"attic.ceiling_r": {"uniform": [19, 38]},
                            "duct.*.r_value": {"scale": {"uniform": [0.8, 1.0]}}},
                           [{"name": "R-49 ceiling", "set": {"attic.ceiling_r": 49}},
                            {"name": "R-8 ducts", "set": {"duct.*.r_value": 8}}])
    res = run_uncertainty(raw, n=4)
    assert res.held == (("R-49 ceiling", "attic.ceiling_r"),)  # a scale still multiplies the variant's value
    # the R-49 ceiling is the same in every sample: its ceiling gain no longer follows the drawn ceiling R
    rc = res.rank_correlations(res.outputs["R-49 ceiling"]["equipment_w"])
    assert rc["attic.ceiling_r"] != -1.0
    # and the saving is a paired difference, sample by sample
    assert np.allclose(res.saving("R-8 ducts"),
                       res.outputs["base"]["equipment_w"] - res.outputs["R-8 ducts"]["equipment_w"])
    assert np.all(res.saving("R-8 ducts") > 0)  # more duct R, less duct load in every sample


def test_the_command_table_json_samples_and_figure(tmp_path):
    raw = raw_case(with_ducts=True)
    raw["variant"] = [{"name": "R-8 ducts", "set": {"duct.*.r_value": 8}}]
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw) + '\n[uncertainty]\n"leakage.supply_fraction" = { triangular = [0.03, 0.05, 0.1] }\n'
                 '"cooling.wind_mph" = { normal = [5, 2], min = 0 }\n')
    out, fig = tmp_path / "samples.csv", tmp_path / "bands.png"
    res = runner.invoke(app, ["uncertainty", str(p), "--samples", "4", "--saves", "0.05t", "-o", str(out),
                              "-p", str(fig)])
    assert res.exit_code == 0, res.output
    text = " ".join(res.output.split())
    assert "P10" in text and "Spearman rank correlation" in text and "saves ≥ 600" in text
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert len(rows) == 8 and {r["case"] for r in rows} == {"base", "R-8 ducts"}
    assert fig.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    js = json.loads(runner.invoke(app, ["uncertainty", str(p), "--samples", "4", "-f", "json"]).stdout)
    for c in js["cases"]:
        assert c["equipment"]["p10_btuh"] <= c["equipment"]["p50_btuh"] <= c["equipment"]["p90_btuh"]
    bad = runner.invoke(app, ["uncertainty", str(p), "--samples", "4", "--saves", "lots"])
    assert bad.exit_code == 2 and "--saves" in bad.output
    not_csv = tmp_path / "summary.json"  # -o is every sample, as CSV: a .json name would get CSV text
    bad = runner.invoke(app, ["uncertainty", str(p), "--samples", "4", "-f", "json", "-o", str(not_csv)])
    assert bad.exit_code == 2 and ".csv" in bad.output and not not_csv.exists()
    for args, word in ((["--plot", str(tmp_path / "bands.pdf")], ".png or .svg"), (["--seed", "-5"], "--seed")):
        bad = runner.invoke(app, ["uncertainty", str(p), "--samples", "4", *args])  # before any work, exit 2
        assert bad.exit_code == 2 and word in " ".join(bad.output.split()), bad.output
    none = tmp_path / "plain.toml"
    none.write_text(to_toml(raw_case()))
    res = runner.invoke(app, ["uncertainty", str(none), "--samples", "4"])
    assert res.exit_code == 2 and "[uncertainty]" in res.output


def test_report_has_an_uncertainty_section_when_the_case_has_one(tmp_path):
    p = tmp_path / "house.toml"
    p.write_text(to_toml(raw_case(with_ducts=True)) + '\n[uncertainty]\n"attic.ceiling_r" = { uniform = [25, 35] }\n')
    html = tmp_path / "r.html"
    res = runner.invoke(app, ["report", str(p), "-o", str(html), "--samples", "3"])
    assert res.exit_code == 0, res.output
    page = html.read_text()
    assert "Spearman rank correlation" in page and page.count("<svg") >= 3
    # a section for each design condition the case has: the winter one with the roof deck's margin
    assert "How sure at the cooling design condition: 3 samples" in page
    assert "How sure at the heating design condition: 3 samples" in page and "roof deck margin to dew point" in page
    raw = raw_case(with_ducts=True)
    raw["variant"] = [{"name": "R-8 ducts", "set": {"duct.*.r_value": 8}}]
    p.write_text(to_toml(raw) + '\n[uncertainty]\n"attic.ceiling_r" = { uniform = [25, 35] }\n')
    res = runner.invoke(app, ["report", str(p), "-o", str(html), "--samples", "3", "--saves", "0.05t"])
    assert res.exit_code == 0, res.output
    assert "share saving ≥ 600 Btu/h" in html.read_text()  # as `uncertainty --saves 0.05t` counts them
    bad = runner.invoke(app, ["report", str(p), "-o", str(tmp_path / "x.html"), "--saves", "0.05"])
    assert bad.exit_code == 2 and "--saves" in bad.output and not (tmp_path / "x.html").exists()
    # uncertainty options given for a case without the section are said to go unused, not dropped in silence
    p.write_text(to_toml(raw_case(with_ducts=True)))
    res = runner.invoke(app, ["report", str(p), "-o", str(html), "--samples", "50"])
    assert res.exit_code == 0 and "no [uncertainty] section, so --samples is not used" in " ".join(
        res.output.split())


def test_a_sample_of_a_variant_is_the_variant_run_with_the_drawn_values():
    # the plumbing, checked against the ordinary path: variant overrides, then the drawn values written in
    raw = with_uncertainty({"leakage.supply_fraction": {"uniform": [0.03, 0.09]},
                            "duct.*.r_value": {"scale": {"uniform": [0.7, 1.0]}}},
                           [{"name": "R-8 ducts", "set": {"duct.*.r_value": 8}}])
    res = run_uncertainty(raw, n=2, seed=9)
    for i in range(2):
        leak, fraction = res.values[i]
        manual = {k: v for k, v in raw.items() if k not in ("uncertainty", "variant")}
        manual["leakage"] = {**manual["leakage"], "supply_fraction": leak}
        manual["duct"] = [{**d, "r_value": 8 * fraction} for d in manual["duct"]]
        T, _, equipment, _, _ = base_numbers(manual)
        assert res.outputs["R-8 ducts"]["attic_air_K"][i] == pytest.approx(T, abs=0.05 * 5 / 9)  # 0.05 °F
        assert res.outputs["R-8 ducts"]["equipment_w"][i] == pytest.approx(equipment, rel=1e-3)


def test_heating_samples_carry_the_winter_deck_margin_that_run_gives():
    # the rows of one network (attic.runs.sampled) against each sample solved as its own case by run's path
    raw = with_uncertainty({"heating.wind_mph": {"uniform": [4.0, 14.0]},
                            "attic.ceiling_r": {"scale": {"uniform": [0.8, 1.0]}}})
    res = run_uncertainty(raw, n=3, seed=4, kind="heating")
    for i in range(3):
        wind, fraction = res.values[i]
        manual = {k: v for k, v in raw.items() if k != "uncertainty"}
        manual["heating"] = {**manual["heating"], "wind_mph": wind}
        manual["attic"] = {**manual["attic"], "ceiling_r": raw["attic"]["ceiling_r"] * fraction}
        margin = base_numbers(manual, "heating")[4]
        assert np.isfinite(margin)
        assert res.outputs["base"]["deck_margin_K"][i] == pytest.approx(margin, abs=0.01)  # K


def test_the_winter_deck_margin_is_banded_and_its_risk_counted_in_every_output(tmp_path):
    from attic.present.uncertainty import deck_risk_lines, sample_rows, summary_rows, uncertainty_output

    raw = with_uncertainty({"heating.indoor_rh": {"uniform": [0.2, 0.6]}})
    raw["heating"] = {**raw["heating"], "outdoor_F": 5.0}
    res = run_uncertainty(raw, n=12, kind="heating")
    margin = res.outputs["base"]["deck_margin_K"]
    assert np.all(np.isfinite(margin)) and np.ptp(margin) > 0  # wetter indoor air, a smaller margin
    assert res.rank_correlations(margin)["heating.indoor_rh"] < -0.9
    out = uncertainty_output(res, "ip")
    base = out["cases"][0]
    assert base["deck_margin"]["p10_F"] <= base["deck_margin"]["p50_F"] <= base["deck_margin"]["p90_F"]
    assert base["share_deck_at_risk"] == pytest.approx(np.mean(margin < 0), abs=1e-4)
    assert summary_rows(out)[0]["share_deck_at_risk"] == base["share_deck_at_risk"]
    rows = sample_rows(res, "ip")
    assert [r["deck.margin_F"] < 0 for r in rows] == list(margin < 0)
    said = deck_risk_lines(out)
    assert (said != []) == bool(np.any(margin < 0))
    cool = uncertainty_output(run_uncertainty(with_uncertainty({"heating.indoor_rh": {"uniform": [0.2, 0.6]}}),
                                              n=4), "ip")
    assert cool["cases"][0]["share_deck_at_risk"] is None and "deck.margin_F" not in sample_rows(
        run_uncertainty(with_uncertainty({"roof.solar_reflectance": {"uniform": [0.05, 0.1]}}), n=2), "ip")[0]
    # the other condition's key moves nothing here: not ranked, however its draws happen to line up
    assert cool["rank_correlation"]["base equipment load"]["heating.indoor_rh"] is None


def test_a_share_never_rounds_a_few_samples_away():
    from attic.present.uncertainty import _share

    assert [_share(v) for v in (0.0, 0.002, 0.5, 0.998, 1.0)] == ["0 %", "0.2 %", "50 %", "99.8 %", "100 %"]


def test_samples_spread_over_processes_give_the_same_numbers():
    raw = with_uncertainty({"attic.ceiling_r": {"uniform": [19, 38]}})
    one, two = run_uncertainty(raw, n=4, jobs=1), run_uncertainty(raw, n=4, jobs=2)
    assert np.array_equal(one.outputs["base"]["equipment_w"], two.outputs["base"]["equipment_w"])


def test_an_input_that_moves_nothing_is_not_ranked_and_heating_has_no_tons():
    # the heating design outdoor temperature cannot move the cooling load; the cooling numbers still differ from
    # sample to sample by the solvers' tolerance, which must not show up as a rank correlation
    raw = with_uncertainty({"heating.outdoor_F": {"uniform": [20, 40]}})
    raw["heating"] = {"outdoor_F": 30.0}
    res = run_uncertainty(raw, n=12)
    assert res.rank_correlations(res.outputs["base"]["equipment_w"]) == {"heating.outdoor_F": None}
    heat = run_uncertainty(raw, n=10, kind="heating")  # MIN_RANKED samples, to be ranked at all
    from attic.present.uncertainty import sample_rows, uncertainty_output

    assert heat.rank_correlations(heat.outputs["base"]["equipment_w"])["heating.outdoor_F"] == pytest.approx(-1.0)
    band = uncertainty_output(heat)["cases"][0]
    assert set(band["tons"].values()) == {None}  # tons size cooling equipment, as `run` shows them
    assert all(r["house.tons"] is None for r in sample_rows(heat))


def test_a_drawn_reflectance_that_would_undo_a_variants_covering_is_refused():
    # a variant that changes only the covering gets its reflectance from it; an absolute draw would replace it in
    # every sample, so the "cool roof" would be the base roof under another name: refused rather than shown
    light = {"name": "light", "set": {"roof.covering": "asphalt-shingle-light"}}
    own = {"name": "own", "set": {"roof.covering": "asphalt-shingle-light", "roof.solar_reflectance": 0.3}}
    with pytest.raises(CaseError) as e:
        run_uncertainty(with_uncertainty({"roof.solar_reflectance": {"uniform": [0.04, 0.12]}}, [light, own]), n=4)
    msg = str(e.value)
    assert msg.startswith('uncertainty."roof.solar_reflectance": variant "light" changes roof.covering')
    assert "give the variant its own roof.solar_reflectance" in msg and "\n" not in msg
    res = run_uncertainty(with_uncertainty({"roof.solar_reflectance": {"uniform": [0.04, 0.12]}}, [own]), n=4)
    assert res.held == (("own", "roof.solar_reflectance"),)  # its own value: kept in every sample

def test_a_drawn_design_condition_says_the_base_load_stays_as_calculated():
    # the base load is the user's own calculation at the case's condition: the band cannot widen it
    from attic.present.uncertainty import uncertainty_output, uncertainty_tables

    out = uncertainty_output(run_uncertainty(with_uncertainty({"cooling.outdoor_F": {"uniform": [93, 97]}}), n=4))
    assert "cooling.outdoor_F is drawn, but the base load (house.cooling_sensible_btuh" in out["base_load_held"]
    assert out["base_load_held"] in uncertainty_tables(out)
    both = with_uncertainty({"cooling.outdoor_F": {"uniform": [93, 97]},
                             "house.cooling_sensible_btuh": {"uniform": [15000, 17000]}})
    assert uncertainty_output(run_uncertainty(both, n=4))["base_load_held"] is None
    other = with_uncertainty({"roof.solar_reflectance": {"uniform": [0.05, 0.12]}})
    assert uncertainty_output(run_uncertainty(other, n=4))["base_load_held"] is None


def test_saves_amounts_and_the_csv_summary_of_savings_and_correlations():
    from attic.present.uncertainty import parse_saves, summary_rows, uncertainty_output
    from attic.units import BTUH, TON

    assert parse_saves("0.25t") == pytest.approx(0.25 * TON)
    assert parse_saves("5,000") == pytest.approx(5000 * BTUH) and parse_saves("1500w") == 1500.0
    assert parse_saves("5btuh") == pytest.approx(5 * BTUH)  # a small amount is allowed when its unit is written
    with pytest.raises(ValueError, match="0.25t for tons"):
        parse_saves("0.25")  # a bare 0.25 is surely tons without the t, not a quarter of a Btu/h
    raw = with_uncertainty({"leakage.supply_fraction": {"uniform": [0.02, 0.12]}},
                           [{"name": "R-8 ducts", "set": {"duct.*.r_value": 8}},
                            {"name": "inside", "set": {"duct.*.location": "conditioned"}}])
    res = run_uncertainty(raw, n=10)  # MIN_RANKED samples, to be ranked at all
    out = uncertainty_output(res, "ip", parse_saves("0.1t"))
    rows = {r["case"]: r for r in summary_rows(out)}
    assert rows["base"]["saving_p50_btuh"] is None and rows["base"]["rho.leakage.supply_fraction"] == pytest.approx(1.0)
    s = next(x for x in out["savings"] if x["variant"] == "R-8 ducts")
    assert rows["R-8 ducts"]["saving_p50_btuh"] == s["saving_p50_btuh"] > 0
    assert rows["R-8 ducts"]["share_saving_at_least"] == s["share_saving_at_least"]
    # ducts inside conditioned space add exactly nothing: shown as 0, not as the balances' 1e-12 W
    assert set(next(c for c in out["cases"] if c["case"] == "inside")["ducts"].values()) == {0.0}


def test_samples_that_fail_are_counted_on_the_report_page_and_explained_in_the_sample_csv(tmp_path, monkeypatch):
    # a sample no airflow can serve (a ValueError: the input's doing, not the solver's) is left out, counted and
    # explained. A case that passes validation always finds its airflow, so every fifth sample is made to fail
    # here, as the airflow search reports it.
    from attic.runs import uncertainty as unc

    real = unc._solve_together
    why = "base (cooling): even at 1,000 times the air handler's airflow, the air reaching the rooms falls short"

    def every_fifth_fails(*a, **k):
        return [(None, ValueError(why)) if i % 5 == 0 else r for i, r in enumerate(real(*a, **k))]

    monkeypatch.setattr(unc, "_solve_together", every_fifth_fails)
    raw = raw_case(with_ducts=True)
    path = tmp_path / "warm-coil.toml"
    path.write_text(to_toml(raw) + '\n[uncertainty]\n"air_handler.supply_F" = { uniform = [52, 58] }\n')
    page = tmp_path / "page.html"
    res = CliRunner().invoke(app, ["report", str(path), "-o", str(page), "--samples", "40"])
    assert res.exit_code == 2, res.output  # every sample left out is the input's doing: no balance failed
    assert "16 uncertainty samples did not solve and are left out" in res.output  # 8 at each condition
    html = page.read_text()
    assert "Not every sample solved." in html and "samples failed)" in html
    out = tmp_path / "samples.csv"
    res = CliRunner().invoke(app, ["uncertainty", str(path), "--samples", "40", "-o", str(out)])
    assert res.exit_code == 2 and "base (cooling): even at 1,000 times" in res.output
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    failed = [r for r in rows if r["error"]]
    assert len(failed) == 8 and all(r["house.total_btuh"] == "" for r in failed)
    assert all(r["house.total_btuh"] != "" for r in rows if not r["error"])


def test_a_slow_one_case_at_a_time_run_is_announced_with_its_time():
    raw = raw_case(with_ducts=True)
    heard = []
    raw["uncertainty"] = {"roof.solar_reflectance": {"uniform": [0.05, 0.12]}}
    run_uncertainty(raw, 4, notice=heard.append)
    assert heard == []  # rows of one network: nothing to say
    raw["uncertainty"] = {"attic.floor_area_ft2": {"uniform": [1400, 1600]}}  # reshapes the attic
    run_uncertainty(raw, 4, notice=heard.append)
    assert len(heard) == 1 and "one case at a time" in heard[0] and "'base'" in heard[0]
    assert " s for 4 samples on one core" in heard[0] and "--jobs N shares it out" in heard[0]
    raw["uncertainty"] = {"site.elevation_ft": {"uniform": [0, 500]}}
    run_uncertainty(raw, 2, notice=heard.append, jobs=2)
    assert "(site.elevation_ft)" in heard[1] and "less with --jobs 2" in heard[1]


def test_samples_whose_heat_balance_did_not_close_exit_3(tmp_path, monkeypatch):
    from attic.network.solve import SolveError
    from attic.runs import batch

    def unclosed(cases, kind, *a, **k):
        return [(None, SolveError(f'case "{c.name}": the heat balance did not close')) for c in cases]

    monkeypatch.setattr(batch, "run_conditions", unclosed)
    raw = raw_case(with_ducts=True)
    path = tmp_path / "c.toml"
    path.write_text(to_toml(raw) + '\n[uncertainty]\n"roof.solar_reflectance" = { uniform = [0.05, 0.12] }\n')
    raw["uncertainty"] = {"roof.solar_reflectance": {"uniform": [0.05, 0.12]}}
    res = run_uncertainty(raw, 4)
    assert res.unclosed == 4 and len(res.errors["base"]) == 4
    out = CliRunner().invoke(app, ["uncertainty", str(path), "--samples", "4"])
    assert out.exit_code == 3 and "no sample of the base case solved" in out.output


def test_a_few_samples_are_said_to_give_rough_percentiles(tmp_path):
    # common practice, no source: P10 and P90 of a handful of draws move from seed to seed
    p = tmp_path / "c.toml"
    section = '\n[uncertainty]\n"roof.solar_reflectance" = { uniform = [0.05, 0.12] }\n'
    p.write_text(to_toml(raw_case(with_ducts=True)) + section)
    res = runner.invoke(app, ["uncertainty", str(p), "--samples", "4"])
    assert res.exit_code == 0 and "4 samples give rough percentiles" in res.stderr
    res = runner.invoke(app, ["uncertainty", str(p), "--samples", "200"])
    assert "rough percentiles" not in res.stderr


def test_a_distribution_reaching_values_the_case_cannot_take_is_refused_naming_the_key(tmp_path):
    # supply air drawn up to 68 °F in a 75 °F house: draws above 65 °F are within 10 °F of the room (common
    # practice, no source); leaving them out would cut the distribution, so the run is refused before any work
    path = tmp_path / "c.toml"
    path.write_text(to_toml(raw_case(with_ducts=True))
                    + '\n[uncertainty]\n"air_handler.supply_F" = { uniform = [50, 68] }\n')
    res = runner.invoke(app, ["uncertainty", str(path), "--samples", "200"])
    assert res.exit_code == 2 and len(res.stderr.strip().splitlines()) == 1
    assert "air_handler.supply_F" in res.stderr and "narrow that input's distribution" in res.stderr


def test_two_samples_rank_nothing_and_the_page_says_the_bands_are_rough(tmp_path):
    # common practice, no source: two pairs give a rank correlation of +1 or -1 whatever the inputs do
    raw = raw_case(with_ducts=True)
    raw["uncertainty"] = {"roof.solar_reflectance": {"uniform": [0.05, 0.12]},
                          "leakage.supply_fraction": {"uniform": [0.03, 0.12]}}
    res = run_uncertainty(raw, 2)
    assert set(res.rank_correlations(res.outputs["base"]["equipment_w"]).values()) == {None}
    many = run_uncertainty(raw, 40)
    assert all(v is not None for v in many.rank_correlations(many.outputs["base"]["equipment_w"]).values())
    path = tmp_path / "c.toml"
    path.write_text(to_toml({k: v for k, v in raw.items() if k != "uncertainty"})
                    + '\n[uncertainty]\n"roof.solar_reflectance" = { uniform = [0.05, 0.12] }\n')
    page = tmp_path / "p.html"
    assert runner.invoke(app, ["report", str(path), "-o", str(page), "--samples", "5"]).exit_code in (0, 1)
    assert "Few samples." in page.read_text()


def test_the_report_and_the_command_share_the_runs_defaults():
    # the page and `uncertainty` must give the same numbers when neither is told otherwise
    import typer.main

    from attic.cli.page import SAMPLES, SEED
    from attic.runs.uncertainty import DEFAULT_SAMPLES, DEFAULT_SEED

    assert (SAMPLES, SEED) == (DEFAULT_SAMPLES, DEFAULT_SEED)
    command = typer.main.get_command(app).commands["uncertainty"]
    defaults = {p.name: p.default for p in command.params}
    assert (defaults["samples"], defaults["seed"]) == (DEFAULT_SAMPLES, DEFAULT_SEED)
