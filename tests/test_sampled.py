"""An uncertainty run's samples as the rows of one network (attic.runs.sampled): the rows are the networks the
samples give one by one, and their solved numbers are `run`'s. These are equivalence checks of a faster way to
the same numbers; the physics is checked where the one-by-one path is."""

from pathlib import Path

import numpy as np
import pytest

from attic.case.load import CaseError, apply_overrides, build_case, raw_of, read_toml, validate_raw
from attic.case.schema import SECTIONS
from attic.case.validate import _check_value
from attic.network.build import build_network
from attic.network.newton import chord_batched
from attic.network.nodes import ROW_FIELDS
from attic.network.stack import group_by_network, network_key, shared_key, stack_networks
from attic.runs import sampled
from attic.runs.uncertainty import OUTPUTS, numbers, run_uncertainty
from ducts.moist_air import tabulated
from helpers import raw_case

DEMO = raw_of(read_toml(Path(__file__).resolve().parent.parent / "cases" / "demo.toml"))
DEMO_CHECKED = validate_raw(DEMO)


def _float_keys():
    """Every number key of the demo as a concrete path (ducts by number): those it gives a value, and those it
    leaves unset that have a range to draw from."""
    def wanted(key, v):
        return key.kind == "float" and (isinstance(v, float) or (v is None and key.lo is not None
                                                                  and key.hi is not None))

    out = []
    for sec, keys in SECTIONS.items():
        if sec in ("", "duct") or DEMO_CHECKED.get(sec) is None:
            continue
        out += [(f"{sec}.{k}", key) for k, key in keys.items() if wanted(key, DEMO_CHECKED[sec].get(k))]
    for i, d in enumerate(DEMO_CHECKED["duct"]):
        out += [(f"duct.{i + 1}.{k}", key) for k, key in SECTIONS["duct"].items() if wanted(key, d.get(k))]
    return out


def _value(path):
    sec, *rest = path.split(".")
    if sec == "duct":
        return DEMO_CHECKED["duct"][int(rest[0]) - 1][rest[1]]
    return DEMO_CHECKED[sec][rest[0]]


def _samples(path, key, n):
    """n allowed values of a key around the demo's own (within its range where the demo leaves it unset)."""
    v = _value(path)
    steps = np.array([-0.04, 0.03, 0.07, -0.02, 0.05])[:n]
    if v is None:
        vals = key.lo + (key.hi - key.lo) * (0.5 + 2.0 * steps)
    else:
        vals = v * (1.0 + steps) if v != 0 else steps - steps.min() + (key.lo or 0.0) + 0.01
    ok = []
    for x in vals:
        try:
            ok.append(_check_value(path, key, float(x)))
        except CaseError:
            pass
    return np.array(ok)


def _one_by_one(path, values, kind="cooling"):
    """The networks the samples give when each is built as a case, or None when one is not a valid case."""
    nets = []
    for x in values:  # cases outside the moist-air tables, networks inside, as attic.runs.batch builds them
        try:
            case = build_case(validate_raw(apply_overrides(DEMO, {path: float(x)})))
        except CaseError:
            return None
        with tabulated():
            nets.append(build_network(case, case.cooling if kind == "cooling" else case.heating))
    return nets


@pytest.mark.parametrize("path,key", _float_keys(), ids=[p for p, _ in _float_keys()])
@pytest.mark.parametrize("n", [2, 3, 5])  # 2 and 3 are the planes and the interior surfaces: shapes that could mix
def test_rows_equal_the_networks_the_samples_give_one_by_one(path, key, n):
    values = _samples(path, key, n)
    if len(values) < 2:
        pytest.skip("fewer than two allowed values near the demo's")
    got = sampled.sampled_network(DEMO, {path: values}, "cooling")
    nets = _one_by_one(path, values)
    if got is None:  # left to the one-by-one path: fine, that path is the reference
        return
    assert nets is not None, "the rows took samples that are not valid cases"
    groups = group_by_network(nets)
    assert len(groups) == 1, "the rows took samples that cannot share one network"
    ref = stack_networks(nets)
    _, net = got
    assert shared_key(net) == shared_key(ref)
    for f in ROW_FIELDS:
        np.testing.assert_allclose(getattr(net, f), getattr(ref, f), rtol=1e-12, atol=0.0, err_msg=f)
    np.testing.assert_allclose(net.ducts._data, ref.ducts._data, rtol=1e-12, atol=0.0, equal_nan=True)


@pytest.mark.parametrize("path", ["roof.solar_reflectance", "roof.thermal_emittance", "attic.ceiling_r",
                                  "leakage.supply_fraction", "leakage.return_fraction", "cooling.wind_mph",
                                  "cooling.outdoor_F", "air_handler.airflow_cfm", "duct.1.r_value",
                                  "duct.2.length_ft", "house.cooling_sensible_btuh", "roof.deck_r"])
def test_the_inputs_people_are_unsure_of_share_one_network(path):
    key = dict(_float_keys())[path]
    assert sampled.sampled_network(DEMO, {path: _samples(path, key, 5)}, "cooling") is not None


def test_a_key_that_shapes_the_attic_is_left_to_the_one_by_one_path():
    values = np.array([1800.0, 1900.0, 2000.0])
    assert sampled.sampled_network(DEMO, {"attic.floor_area_ft2": values}, "cooling") is None
    nets = _one_by_one("attic.floor_area_ft2", values)
    assert len({network_key(n) for n in nets}) == 3  # indeed three different attics


def test_a_sample_breaking_a_cross_key_rule_is_left_to_the_one_by_one_path_which_names_it():
    raw = raw_case(with_ducts=True)
    raw["cooling"] = {**raw["cooling"], "outdoor_F": 85.0, "outdoor_dewpoint_F": 70.0}
    raw["cooling"].pop("outdoor_wetbulb_F", None)
    raw["uncertainty"] = {"cooling.outdoor_dewpoint_F": {"uniform": [60.0, 88.0]}}  # above 85 for some samples
    values = np.array([65.0, 87.0])
    assert sampled.sampled_network(raw_of(raw), {"cooling.outdoor_dewpoint_F": values}, "cooling") is None
    with pytest.raises(CaseError, match="cannot exceed cooling.outdoor_F.*a sample of 'base'"):
        run_uncertainty(raw, n=20)


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_rows_solved_together_give_runs_numbers(kind, monkeypatch):
    raw = raw_case(with_ducts=True, heating={"outdoor_F": 20.0})
    raw["uncertainty"] = {
        "leakage.supply_fraction": {"triangular": [0.02, 0.05, 0.15]},
        "roof.solar_reflectance": {"uniform": [0.05, 0.30]},
        "cooling.wind_mph": {"normal": [6.0, 2.0], "min": 0},
        "duct.*.r_value": {"scale": {"uniform": [0.5, 1.0]}},
    }
    used = []
    real = sampled.solve_sampled
    monkeypatch.setattr(sampled, "solve_sampled", lambda *a, **k: used.append(1) or real(*a, **k))
    res = run_uncertainty(raw, n=12, kind=kind)
    assert used, "the samples were not solved as rows"
    from attic.api import design_conditions
    from attic.case.uncertainty import parse_section, sample_overrides

    checked = validate_raw(raw)
    inputs = parse_section(raw["uncertainty"], checked)
    for i in range(12):
        case = build_case(validate_raw(apply_overrides(raw_of(raw), sample_overrides(checked, inputs,
                                                                                      res.values[i]))))
        expect = numbers({r.kind: r for r in design_conditions(case)}[kind])
        got = [res.outputs["base"][k][i] for k in OUTPUTS]
        # the issue's tolerance is 0.05 °F and 0.1 %; both solves close to RESIDUAL_LIMIT_W and GAP_TOL
        assert got[0] == pytest.approx(expect[0], abs=1e-4)
        assert got[1:4] == pytest.approx(expect[1:4], rel=1e-5, abs=1e-3)
        if kind == "heating":  # the roof deck's winter margin, as run's deck check gives it
            assert np.isfinite(got[4]) and got[4] == pytest.approx(expect[4], abs=1e-3)
        else:
            assert np.isnan(got[4]) and np.isnan(expect[4])


def test_chord_rows_that_do_not_settle_are_reported_not_converged():
    # arctan from 2 with its slope there (0.2) steps to -3.5, where the residual is larger: stopped, not trusted;
    # from 0.5 it settles on the root 0 (arctan's only root)
    def f(x, rows=None):
        return np.arctan(x)

    x, r, ok = chord_batched(f, lambda X: np.arctan(X), np.array([[2.0], [0.5]]), 1e-12, np.array([10.0]))
    assert ok.tolist() == [False, True]
    assert x[0, 0] == 2.0 and abs(x[1, 0]) < 1e-12


def test_a_variant_that_sets_every_uncertain_key_is_one_case_in_every_sample():
    raw = raw_case(with_ducts=True)
    raw["uncertainty"] = {"leakage.supply_fraction": {"uniform": [0.02, 0.12]}}
    raw["variant"] = [{"name": "sealed", "set": {"leakage.supply_fraction": 0.01}}]
    res = run_uncertainty(raw, n=7)
    from attic.api import design_conditions

    case = build_case(validate_raw(apply_overrides(raw_of(raw), {"leakage.supply_fraction": 0.01})))
    expect = numbers(design_conditions(case)[0])
    for k, v in zip(OUTPUTS[:4], expect[:4], strict=True):
        assert res.outputs["sealed"][k].tolist() == [v] * 7
    assert np.ptp(res.outputs["base"]["ducts_w"]) > 0  # the base's samples do differ


def test_heating_rows_whose_deck_check_cannot_take_arrays_go_one_by_one_and_keep_the_check(monkeypatch):
    # an uncertain deck R of a foamed deck: the deck's assembly branches on it, so the rows' deck check cannot run
    # on the array; the samples are then solved as cases, each with its own deck check, none lost
    raw = raw_case(with_ducts=True)
    raw["attic"] = {**raw["attic"], "type": "unvented", "ceiling_r": 0}
    raw["roof"] = {**raw["roof"], "deck_r": 20, "deck_insulation": "spray-foam"}
    raw["uncertainty"] = {"roof.deck_r": {"uniform": [15.0, 25.0]}}
    left = []
    real = sampled._deck_margins
    monkeypatch.setattr(sampled, "_deck_margins",
                        lambda case, net, out, at: real(case, net, out, at) or left.append(np.isnan(out[:, 2]).all()))
    res = run_uncertainty(raw, n=4, kind="heating")
    assert left == [True]  # every row handed to the one-by-one path
    assert res.errors["base"] == () and np.all(np.isfinite(res.outputs["base"]["deck_margin_K"]))
    assert np.ptp(res.outputs["base"]["deck_margin_K"]) > 0  # each sample's own foam, its own margin
