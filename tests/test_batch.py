"""Equivalence tests: the batched solve of many study points (attic.runs.batch, attic.network.stack,
attic.runs.points) against the one-point solver (attic.runs.condition.run_condition, run_case), whose physics
is tested elsewhere. Nothing here checks physics; every test compares the two paths point by point.

Tolerances (the issue that asked for the batch): attic air within 0.05 °F (0.0278 K) and equipment load within
0.1 % between the batched and the one-point result; the other quantities to the same relative 0.1 %.
Point counts are small, except one test past ducts.moist_air.TABLE_MIN rows, where moist-air properties come
from tables instead of direct calls.
"""

from __future__ import annotations

import dataclasses
import itertools
from pathlib import Path

import numpy as np
import pytest

from attic.case.load import apply_overrides, build_case, load_cases, raw_of, read_toml, validate_raw
from attic.network import solve as balance
from attic.network.build import build_network
from attic.network.nodes import ROW_FIELDS
from attic.network.solve import SolveError
from attic.network.stack import group_by_network, network_key, stack_networks
from attic.runs import batch
from attic.runs.batch import run_cases, run_conditions
from attic.runs.condition import run_case, run_condition
from attic.runs.points import solve_points
from ducts.moist_air import TABLE_MIN

CASES = Path(__file__).resolve().parent.parent / "cases"
AIR_K = 0.05 * 5.0 / 9.0  # 0.05 °F, the tolerance on the attic air
REL = 1e-3  # 0.1 %, the tolerance on the equipment load


@pytest.fixture(scope="module")
def demo_raw():
    """cases/demo.toml without its variants and uncertainty section (as the studies take it)."""
    return raw_of(read_toml(CASES / "demo.toml"))


def build(raw, overrides=None, name="point"):
    return build_case(validate_raw(apply_overrides(raw, overrides or {})), name)


def cond_of(case, kind):
    return case.cooling if kind == "cooling" else case.heating


def differences(b, o):
    """The largest differences between a batched and a one-point ConditionResult, as the tolerances read them."""
    hb, ho = b.house, o.house
    scale = max(abs(ho.equipment_w), abs(ho.house_w), 1.0)
    d = {
        "air_K": abs(b.attic.air_K - o.attic.air_K),
        "without_leaks_K": abs(b.attic_air_without_leaks_K - o.attic_air_without_leaks_K),
        "equipment_rel": abs(hb.equipment_w - ho.equipment_w) / scale,
        "ducts_rel": abs(hb.ducts_w - ho.ducts_w) / scale,  # a part of the equipment load
        "tons_rel": abs(hb.tons - ho.tons) / max(abs(ho.tons), 1e-9) if ho.equipment_w else abs(hb.tons - ho.tons),
        "effectiveness": abs(hb.delivery_effectiveness - ho.delivery_effectiveness),
    }
    if ho.airflow_m3_s is None:
        assert hb.airflow_m3_s is None
    else:
        d["airflow_rel"] = abs(hb.airflow_m3_s - ho.airflow_m3_s) / max(ho.airflow_m3_s, 1e-9) \
            if ho.airflow_m3_s else abs(hb.airflow_m3_s)
    if o.deck is not None:
        d["deck_margin_K"] = abs(b.deck.margin_K - o.deck.margin_K)
    return d


def assert_same(b, o):
    """A batched ConditionResult equals the one-point one within the issue's tolerances."""
    assert (b.case, b.kind, b.attic_type) == (o.case, o.kind, o.attic_type)
    assert (b.ducts is None) == (o.ducts is None) and (b.deck is None) == (o.deck is None)
    d = differences(b, o)
    limits = {"air_K": AIR_K, "without_leaks_K": AIR_K, "deck_margin_K": AIR_K, "effectiveness": REL}
    for k, v in d.items():
        assert v <= limits.get(k, REL), (o.case, o.kind, k, v)
    return d


def solved(pairs):
    """The results of run_conditions, asserting none failed."""
    errors = [e for _, e in pairs if e is not None]
    assert not errors, errors
    return [r for r, _ in pairs]


# ---- 1. a sweep over several keys at once --------------------------------------------------------------

SWEEP = [{"roof.deck_r": a, "duct.*.r_value": b, "leakage.supply_fraction": c, "roof.solar_reflectance": d}
         for a, b, c, d in itertools.product([0, 10], [4, 8], [0.03, 0.1], [0.1, 0.6])]


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_a_sweep_of_the_demo_case_equals_one_point_at_a_time(demo_raw, kind):
    cases = [build(demo_raw, p) for p in SWEEP]
    assert len(group_by_network([build_network(c, cond_of(c, kind)) for c in cases])) == 1  # one stack
    results = solved(run_conditions(cases, kind))
    for case, b in zip(cases, results, strict=True):
        o = run_condition(case, cond_of(case, kind))
        assert b.house.equipment_w > 0  # the sweep's points all run the equipment
        assert_same(b, o)
        if kind == "heating":
            assert b.deck.surface == o.deck.surface and b.deck.reached_by == o.deck.reached_by


def test_past_the_moist_air_table_threshold_a_sample_equals_one_point(demo_raw):
    # more points than TABLE_MIN: the stacked states take their moist-air properties from the tables
    n = TABLE_MIN + 44
    points = [{"roof.deck_r": 12.0 * i / n, "leakage.supply_fraction": 0.02 + 0.1 * i / n,
               "roof.solar_reflectance": 0.05 + 0.5 * ((7 * i) % n) / n} for i in range(n)]
    cases = [build(demo_raw, p) for p in points]
    results = solved(run_conditions(cases, "cooling"))
    assert len(results) == n
    for i in np.linspace(0, n - 1, 9).astype(int):
        assert_same(results[i], run_condition(cases[i], cases[i].cooling))


# ---- 2. points that cannot share a network ------------------------------------------------------------

@pytest.fixture(scope="module")
def mixed(demo_raw):
    tile = raw_of(read_toml(CASES / "desert-tile-ranch.toml"))
    no_ducts = {k: v for k, v in demo_raw.items() if k not in ("duct", "air_handler", "leakage")}
    unvented = {"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0}
    cases = [
        build(demo_raw, name="vented"),
        build(tile, name="tile on battens"),
        build(no_ducts, name="no ducts"),
        build(demo_raw, unvented, name="unvented"),
        build(demo_raw, {"duct.*.r_value": 8}, name="vented R-8"),
        build(demo_raw, {"roof.pitch": "10/12"}, name="steeper"),
        build(no_ducts, {"attic.ceiling_r": 49}, name="no ducts R-49"),
        build(tile, {"roof.covering": "concrete-tile-white"}, name="white tile"),
        build(demo_raw, {"duct.*.location": "conditioned"}, name="ducts inside"),
    ]
    assert cases[1].batten_gap > 0 and cases[2].ducts is None  # the premises of the test
    return cases


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_points_of_different_networks_come_back_in_order_with_their_own_results(mixed, kind):
    groups = group_by_network([build_network(c, cond_of(c, kind)) for c in mixed])
    assert len(groups) >= 5 and any(len(g) > 1 for g in groups)  # several groups, some of more than one
    results = solved(run_conditions(mixed, kind))
    assert [r.case for r in results] == [c.name for c in mixed]
    for case, b in zip(mixed, results, strict=True):
        assert_same(b, run_condition(case, cond_of(case, kind)))


# ---- 3. nothing to deliver ------------------------------------------------------------------------------

NOTHING = {
    # a mild night with the house kept cool and no base load: the attic warms the house
    "heating": {"heating.outdoor_F": 70, "heating.indoor_F": 55, "house.heating_btuh": 0},
    # a cool night with the house kept warm and no base load: the attic cools the house
    "cooling": {"cooling.outdoor_F": 50, "cooling.outdoor_wetbulb_F": 45, "cooling.indoor_F": 85,
                "cooling.solar_hour": 0, "house.cooling_sensible_btuh": 0, "house.cooling_latent_btuh": 0},
}


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_a_point_with_nothing_to_deliver_equals_one_point(demo_raw, kind):
    cases = [build(demo_raw, NOTHING[kind], name="off"), build(demo_raw, name="on"),
             build(demo_raw, {**NOTHING[kind], "leakage.supply_fraction": 0.1}, name="off, leakier")]
    results = solved(run_conditions(cases, kind))
    for case, b in zip(cases, results, strict=True):
        o = run_condition(case, cond_of(case, kind))
        assert_same(b, o)
        if case.name.startswith("off"):
            assert o.house.house_w <= 0  # the premise: nothing to deliver
            assert b.house.equipment_w == 0 and b.house.airflow_m3_s == 0 and b.ducts.equipment_w == 0
        else:
            assert b.house.equipment_w > 0


# ---- 4. failures ----------------------------------------------------------------------------------------

def test_points_that_close_nowhere_are_reported_failed_with_no_numbers(demo_raw, monkeypatch):
    monkeypatch.setattr(balance, "RESIDUAL_LIMIT_W", -1.0)  # no balance can be that close
    cases = [build(demo_raw, {"roof.deck_r": r}) for r in (0, 5, 10)]
    out = run_conditions(cases, "cooling")
    assert len(out) == 3
    for r, e in out:
        assert r is None and isinstance(e, SolveError)
    results, errors = run_cases(cases[:1])
    assert results == {} and isinstance(errors["point"], SolveError)


NO_AIRFLOW = {
    # supply air warmer than the house: the equipment does no cooling at all
    "cooling": 10.0,
    # supply air as warm as the house: no airflow delivers the heating load
    "heating": 0.0,
}


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_a_point_no_airflow_can_serve_fails_as_one_point_does_and_spares_its_neighbour(demo_raw, kind):
    """The case file refuses such supply air (test_case_validation); the solver's own guard is tested here on a
    case built past that check."""
    good = build(demo_raw, name="good")
    cond = cond_of(good, kind)
    wrong = dataclasses.replace(cond, T_supply=cond.T_in + NO_AIRFLOW[kind])
    bad = dataclasses.replace(good, name="bad", **{kind: wrong})
    with pytest.raises(ValueError) as alone:
        run_condition(bad, cond_of(bad, kind))
    (r_bad, e_bad), (r_good, e_good) = run_conditions([bad, good], kind)
    assert r_bad is None and type(e_bad) is type(alone.value) and str(e_bad) == str(alone.value)
    assert e_good is None
    assert_same(r_good, run_condition(good, cond_of(good, kind)))


@pytest.mark.parametrize("call", [None, 0, 1])  # None: no step-by-step solve spoilt; 0: its first solve; 1: the next
def test_a_point_that_does_not_close_in_the_batch_gets_the_one_point_answer(demo_raw, monkeypatch, call):
    """A row the joint solve leaves goes one state after the other; a row that does not close there either
    goes the one-point way; the others keep the joint answers, and every answer is the one-point answer."""
    from attic.runs import joint

    real_newton, real_alone, real_joint = batch.newton_rows, batch.run_condition, joint.newton_batched
    calls, alone = [], []

    def spoilt_joint(*a, **k):
        x, res, it = real_joint(*a, **k)
        res = res.copy()
        res[0] = np.nan  # the first point's three states did not close together
        return x, res, it

    def newton(net, x0, *a, **k):
        x, res, it = real_newton(net, x0, *a, **k)
        if len(calls) == call:
            res = res.copy()
            res[0] = np.nan  # this row did not close
        calls.append(net.n)
        return x, res, it

    def one(case, cond, *a, **k):
        alone.append(case.name)
        return real_alone(case, cond, *a, **k)

    monkeypatch.setattr(joint, "newton_batched", spoilt_joint)
    monkeypatch.setattr(batch, "newton_rows", newton)
    monkeypatch.setattr(batch, "run_condition", one)
    cases = [build(demo_raw, {"roof.deck_r": r}, name=f"deck R-{r}") for r in (0, 5, 10)]
    results = solved(run_conditions(cases, "cooling"))
    assert calls and calls[0] == 1  # only the first point went step by step
    assert alone == ([] if call is None else ["deck R-0"])  # and only it went the one-point way, when spoilt
    for case, b in zip(cases, results, strict=True):
        assert_same(b, real_alone(case, case.cooling))


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_the_joint_solve_takes_every_demo_variant_and_agrees_with_one_state_after_the_other(monkeypatch, kind):
    """The three states as one Newton system (attic.runs.joint) is the way every demo variant is solved, and
    gives what solving them one after the other gives."""
    from attic.runs import joint

    cases = [c for c in load_cases(CASES / "demo.toml") if any(k.kind == kind for k in c.conditions)]
    stepped, real = [], batch._step_by_step
    monkeypatch.setattr(batch, "_step_by_step", lambda c, *a: stepped.append(len(c)) or real(c, *a))
    together = solved(run_conditions(cases, kind))
    assert stepped == []
    monkeypatch.setattr(joint, "accepted", lambda ok, last: np.zeros_like(ok))  # every point the other way
    apart = solved(run_conditions(cases, kind))
    assert stepped and sum(stepped) == len(cases)
    for t, a in zip(together, apart, strict=True):
        assert_same(t, a)



def _numbers(d, path=""):
    """Every number of a nested to_dict(), by its path."""
    if isinstance(d, dict):
        return {k: v for key, x in d.items() for k, v in _numbers(x, f"{path}.{key}").items()}
    if isinstance(d, (list, tuple)):
        return {k: v for i, x in enumerate(d) for k, v in _numbers(x, f"{path}[{i}]").items()}
    return {path: float(d)} if isinstance(d, (int, float)) and not isinstance(d, bool) else {}


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_results_read_from_the_last_newton_evaluation_are_those_of_a_fresh_evaluation(monkeypatch, kind):
    """The joint solve hands its last evaluation (the design state at the solution, rows cut out of a stack of
    every point and its perturbed copies) to the results; evaluating that state again gives the same numbers,
    so no row-wise array was missed in the cut (every variant of the demo, its ducts and deck check)."""
    cases = [c for c in load_cases(CASES / "demo.toml") if any(k.kind == kind for k in c.conditions)]
    reused = solved(run_conditions(cases, kind))
    real = batch._finish_at
    seen = []

    def fresh(*a, evaluated=None, **k):
        seen.append(evaluated is not None)
        return real(*a, **k)

    monkeypatch.setattr(batch, "_finish_at", fresh)
    again = solved(run_conditions(cases, kind))
    assert seen and all(seen)  # every group came through the joint solve with its evaluation at hand
    for r, a in zip(reused, again, strict=True):
        nr, na = _numbers(r.to_dict()), _numbers(a.to_dict())
        assert nr.keys() == na.keys()
        for k in nr:
            assert nr[k] == pytest.approx(na[k], rel=1e-9, abs=1e-9), (r.case, k)

# ---- 5. every variant at every condition ----------------------------------------------------------------

def test_run_cases_equals_run_case_for_each_variant_of_the_demo():
    cases = load_cases(CASES / "demo.toml")
    assert len(cases) > 2
    results, errors = run_cases(cases)
    assert errors == {}
    assert list(results) == [c.name for c in cases]
    for case in cases:
        one = run_case(case)
        assert [r.kind for r in results[case.name]] == [r.kind for r in one] == [c.kind for c in case.conditions]
        for b, o in zip(results[case.name], one, strict=True):
            assert_same(b, o)


# ---- 6. solve_points ------------------------------------------------------------------------------------

def numbers(result):
    """What the study keeps of a point (module level: it crosses process boundaries)."""
    return (result.case, result.attic.air_K, result.house.equipment_w, result.house.airflow_m3_s)


def test_solve_points_keeps_the_order_and_gives_the_same_numbers_with_two_processes(demo_raw):
    points = [{"roof.deck_r": r, "duct.*.r_value": d} for r, d in [(0, 4), (10, 8), (3, 6), (6, 4), (1, 8), (8, 6)]]
    one = solve_points(demo_raw, points, "cooling", numbers, jobs=1)
    two = solve_points(demo_raw, points, "cooling", numbers, jobs=2)
    assert all(e is None for _, e in one + two)
    assert [n for n, _ in two] == [n for n, _ in one]  # chunked over processes: the same, in the same order
    for p, (n, _) in zip(points, one, strict=True):
        o = run_condition(build(demo_raw, p), build(demo_raw, p).cooling)
        assert n[1] == pytest.approx(o.attic.air_K, abs=AIR_K)
        assert n[2] == pytest.approx(o.house.equipment_w, rel=REL)
        assert n[3] == pytest.approx(o.house.airflow_m3_s, rel=REL)


# ---- 7. which networks stack --------------------------------------------------------------------------

def test_networks_that_differ_only_in_row_fields_stack_row_by_row(demo_raw):
    a = build(demo_raw)
    b = build(demo_raw, {"roof.deck_r": 10, "roof.solar_reflectance": 0.5, "cooling.wind_mph": 2,
                         "leakage.supply_fraction": 0.1, "duct.*.r_value": 8})
    na, nb = build_network(a, a.cooling), build_network(b, b.cooling)
    assert network_key(na) == network_key(nb)
    st = stack_networks([na, nb, na])
    assert st.n == 3
    for f in ROW_FIELDS:
        for i, n in enumerate([na, nb, na]):
            assert np.array_equal(getattr(st, f)[i:i + 1], getattr(n, f)), f
    assert np.asarray(st.ducts.supply_leak_fraction)[1] == pytest.approx(nb.ducts.supply_leak_fraction)


@pytest.mark.parametrize("change", [{"roof.pitch": "10/12"}, {"attic.type": "unvented", "roof.deck_r": 20},
                                    {"duct.*.location": "conditioned"}, {"roof.covering": "concrete-tile-grey"}])
def test_networks_that_differ_outside_row_fields_do_not_stack(demo_raw, change):
    a = build(demo_raw)
    b = build(demo_raw, change)
    na, nb = build_network(a, a.cooling), build_network(b, b.cooling)
    assert network_key(na) != network_key(nb)
    assert group_by_network([na, nb, na]) == [[0, 2], [1]]
    with pytest.raises(ValueError, match="cannot be stacked"):
        stack_networks([na, nb])
