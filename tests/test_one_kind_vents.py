"""Attics with low vents alone (soffit-only) or high vents alone: accepted, ventilated by wind, failed by code
where the area falls short (issue: soffit-only and high-only attics are real)."""

import json

import numpy as np
import pytest
from typer.testing import CliRunner

from attic.case.load import build_case, validate_raw
from attic.cli import app
from attic.codes.rules import check_case, check_vents
from attic.network.build import build_network
from attic.physics.ventilation import openings_in_series, wind_flow, wind_inlet_area
from attic.units import IN2
from helpers import make_case, raw_case, solve_case, to_toml

SOFFIT_ONLY = {"vents.high_length_ft": 0.0}
HIGH_ONLY = {"vents.low_length_ft": 0.0}


def test_one_kind_of_vent_drives_wind_through_half_its_area():
    # ASHRAE Handbook-Fundamentals (2017) ch. 16 eq. (37): Q = C_v A U, A the free area of the inlet openings.
    # Soffits along both eaves: the windward half lets air in, the leeward half out, so A = A_low / 2.
    assert wind_inlet_area(2.0, 0.0) == pytest.approx(1.0)
    assert wind_inlet_area(0.0, 0.6) == pytest.approx(0.3)
    # both kinds present: unchanged from before (sqrt(2) times the series area; equal areas -> A)
    assert wind_inlet_area(0.7, 0.7) == pytest.approx(0.7)
    assert wind_inlet_area(0.9, 0.4) == pytest.approx(np.sqrt(2.0) * openings_in_series(0.9, 0.4))


def test_soffit_only_attic_flow_is_the_ashrae_wind_flow_with_no_stack():
    case = make_case(SOFFIT_ONLY)
    cond = case.cooling
    net = build_network(case, cond)
    # test house: 100 ft of soffit at 9 in²/ft = 900 in² (by hand); half of it faces the wind
    A_in = 900.0 * IN2 / 2.0
    expected = 0.25 * A_in * cond.wind  # ASHRAE F ch. 16 eq. (37), C_v = 0.25 (the case's default)
    for T_attic in (300.0, 320.0, 340.0):  # no stack: the openings sit at one height
        assert float(net.ventilation_flow(np.array([T_attic]))[0]) == pytest.approx(expected, rel=1e-9)
    assert case.vents.height == 0.0


def test_no_wind_no_ventilation_for_one_kind_but_stack_for_both():
    # limiting case of ASHRAE F ch. 16 eqs. (37)-(38): with U = 0 only the stack term is left, and openings at
    # a single height have no stack height between them
    calm = {"cooling.wind_mph": 0.0}
    one = build_network(make_case({**SOFFIT_ONLY, **calm}), make_case({**SOFFIT_ONLY, **calm}).cooling)
    both_case = make_case(calm)
    both = build_network(both_case, both_case.cooling)
    assert float(one.ventilation_flow(np.array([330.0]))[0]) == pytest.approx(0.0, abs=1e-12)
    assert float(both.ventilation_flow(np.array([330.0]))[0]) > 0.05


def test_soffit_only_attic_runs_hotter_than_with_its_ridge_vent():
    # less ventilation with the same sun can only warm a vented attic (energy balance of the air node)
    with_ridge = solve_case().attic.air_K
    soffit_only = solve_case(SOFFIT_ONLY).attic.air_K
    assert soffit_only > with_ridge + 0.5


def test_irc_r806_2_soffit_only_needs_1_150_and_the_fix_adds_high_vents():
    # IRC 2021 R806.2 (paraphrased): 1/150 of the vented space; 1/300 only when 40-50 % of the required area is
    # in the upper attic within 3 ft of the ridge. Soffits alone have 0 % up high, so 1/150 applies. Test house:
    # 1,600 ft² -> 10.67 ft² at 1/150 (by hand); 100 ft x 9 in²/ft = 6.25 ft² falls short.
    v = check_vents(make_case(SOFFIT_ONLY))
    assert v.applies and v.ratio == 150 and v.required_nfa_ft2 == pytest.approx(1600 / 150)
    assert not v.complies and v.has_exhaust is False and v.has_intake is True
    assert "no high (exhaust) vents" in v.why and "wind across the low vents alone" in v.why
    # the cheapest fix is a ridge vent making the 1/300 layout: 1600/300 = 5.33 ft² in all, with 40-50 % high:
    # 6.25 ft² low needs at least 0.4 x 6.25 / 0.6 = 4.17 ft² high (by hand)
    assert "high (ridge/gable) vent within 3 ft of the ridge" in v.fix and "1/300" in v.fix
    assert "(4.17 ft² more)" in v.fix


def test_irc_r806_1_cross_ventilation_soffits_with_enough_area_comply():
    # R806.1 asks for cross ventilation, which soffits on both eaves give; R806.2's 1/150 is then the whole rule:
    # 1,600/150 = 10.67 ft² -> 171 ft at 9 in²/ft (by hand: 10.67 x 144 / 9 = 170.7)
    v = check_vents(make_case({**SOFFIT_ONLY, "vents.low_length_ft": 171.0}))
    assert v.ratio == 150 and v.complies and not v.fix
    assert not check_vents(make_case({**SOFFIT_ONLY, "vents.low_length_ft": 170.0})).complies


def test_high_only_attic_fails_the_intake_practice():
    rules = check_case(make_case(HIGH_ONLY))
    intake = [r for r in rules if r.rule.startswith("Intake")][0]
    assert intake.verdict == "fail" and "low vent" in intake.fix
    vent = [r for r in rules if r.rule.startswith("Attic ventilation")][0]
    assert "no low (intake) vents" in vent.required


def test_run_says_the_attic_has_no_exhaust(tmp_path):
    raw = raw_case()
    raw["vents"] = {"low_length_ft": 100, "low_nfa_in2_per_ft": 9}
    validate_raw(raw) and build_case(validate_raw(raw))  # accepted, not a case error
    p = tmp_path / "soffit.toml"
    p.write_text(to_toml(raw))
    runner = CliRunner()
    out = runner.invoke(app, ["run", str(p)], terminal_width=200)
    assert out.exit_code == 0, out.output
    assert "no exhaust (low vents only)" in out.output
    data = json.loads(runner.invoke(app, ["run", str(p), "-f", "json"]).stdout)
    first = data[0] if isinstance(data, list) else next(iter(data.values()))[0]
    assert first["vents"]["has_exhaust"] is False and first["vents"]["has_intake"] is True
    both = tmp_path / "both.toml"
    both.write_text(to_toml(raw_case()))
    assert "no exhaust" not in runner.invoke(app, ["run", str(both)], terminal_width=200).output


def test_adding_vent_area_never_lowers_the_wind_area_or_warms_the_attic():
    # an added opening cannot block the flow through the others (energy of the flow, ASHRAE F ch. 16): the
    # wind's area must not fall as either area grows, from one kind alone to both
    grid = np.linspace(0.0, 2.0, 41)
    A = np.array([[wind_inlet_area(a, b) for b in grid] for a in grid])
    assert np.all(np.diff(A, axis=0) >= -1e-12) and np.all(np.diff(A, axis=1) >= -1e-12)
    # a soffit-only attic that gains 2 ft of ridge vent is no hotter (stack and wind both grow or hold)
    soffit_only = solve_case(SOFFIT_ONLY).attic.air_K
    a_little_ridge = solve_case({"vents.high_length_ft": 2.0}).attic.air_K
    assert a_little_ridge <= soffit_only + 1e-6


def test_wind_flow_matches_eq_37_for_a_soffit_only_attic():
    # the helper used by the network is ASHRAE F ch. 16 eq. (37) itself: Q = C_v A U
    assert wind_flow(wind_inlet_area(0.8, 0.0), 3.0, 0.3) == pytest.approx(0.3 * 0.4 * 3.0)


def test_low_only_attic_is_not_passed_by_the_intake_practice():
    # with no exhaust there is nothing to weigh the intake against: not applicable, not a pass
    raw = raw_case()
    raw["vents"] = {"low_length_ft": 100, "low_nfa_in2_per_ft": 9}
    intake = [r for r in check_case(build_case(validate_raw(raw))) if r.rule.startswith("Intake")][0]
    assert intake.verdict == "n/a"
