"""The thermal chain level by level (ducts.levels): the runs whose entering air is known together go through one
segment_transfer call.

Equivalence tests: every run of the levelled chain is compared with segment_transfer called on that run alone
(with the entering air the chain gave it), and the entering air of each run with its trunk's leaving air
(supply) or the mix of its feeding runs (return). The physics of segment_transfer and of the chain is checked
against handbook values and limiting cases in tests/test_duct_segment.py and tests/test_duct_system.py.
"""

import numpy as np
import pytest

import ducts.levels
from ducts import (
    CONDITIONED,
    DuctSegment,
    DuctSystem,
    Surroundings,
    energy_balance,
    energy_parts,
    stack_duct_systems,
    thermal_chain,
)
from ducts.levels import chain_plan, transfer_many
from ducts.segment import round_geometry, segment_transfer

P = 101325.0
RTOL = 1e-12
KEYS = ("T_out", "Q", "Q_conv", "Q_rad", "T_jacket_cold", "UA")


def deep(r=1.0, length=6.0, airflow=0.55, fs=0.05, fr=0.04, given=0.03, eps=0.9):
    """Three supply levels (plenum -> two branches -> runs) and three return levels (grilles -> a hall
    return -> the trunk); one level mixes attic, crawlspace and the house, film models and counts; one run
    has a given airflow."""
    return DuctSystem((
        DuctSegment("plenum", "supply", "attic", length, r, diameter=0.40, jacket_emittance=eps),
        DuctSegment("east", "supply", "attic", length, r, diameter=0.30, fed_by="plenum", jacket_emittance=eps),
        DuctSegment("west", "supply", "crawl", 0.8 * length, 1.2 * r, width=0.35, height=0.2, fed_by="plenum",
                    r_model="label"),
        DuctSegment("closet", "supply", CONDITIONED, 2.0, r, diameter=0.15, fed_by="plenum", airflow=given),
        DuctSegment("east runs", "supply", "attic", 2.0 * length, 0.8 * r, diameter=0.15, count=4, fed_by="east",
                    r_model="ashrae152", jacket_emittance=0.5 * eps),
        DuctSegment("west runs", "supply", "crawl", length, r, diameter=0.15, count=3, fed_by="west"),
        DuctSegment("trunk", "return", "attic", length, r, diameter=0.45),
        DuctSegment("hall", "return", "attic", 0.5 * length, r, diameter=0.35, fed_by="trunk", r_model="ashrae152"),
        DuctSegment("bedrooms", "return", "crawl", length, r, diameter=0.2, count=2, fed_by="hall"),
        DuctSegment("grille", "return", CONDITIONED, 1.0, 0.0, diameter=0.3, fed_by="trunk"),
    ), airflow, fs, fr)


def surroundings(k=None):
    base = {"attic": (325.0, 330.0, 0.012), "crawl": (292.0, 291.0, 0.010)}
    if k is None:
        return {loc: Surroundings(*v) for loc, v in base.items()}
    spread = np.linspace(-4.0, 4.0, k)
    return {loc: Surroundings(a + spread, b + 0.5 * spread, np.full(k, w)) for loc, (a, b, w) in base.items()}


def own_calls(system, chain, cp, sur):
    """segment_transfer on each run alone, at the entering air and flow the chain gave it."""
    out = {}
    for s in system.segments:
        seg = chain.segments[s.name]
        if s.location == CONDITIONED or np.all(seg["m_run"] <= 0):
            continue
        sr = sur[s.location]
        out[s.name] = segment_transfer(s.geometry(), seg["T_in"], seg["m_run"], cp, sr.T_air, sr.T_mrt,
                                       s.jacket_emittance, P)
    return out


def check_against_own_calls(system, chain, cp, sur, T_supply, T_house):
    flows = system.run_flows()
    for name, ref in own_calls(system, chain, cp, sur).items():
        seg = chain.segments[name]
        for k in KEYS:
            want = ref[k] * seg["count"] if k in ("Q", "Q_conv", "Q_rad") else ref[k]
            assert np.shape(seg[k]) == np.shape(want), (name, k)
            assert type(seg[k]) is type(want), (name, k, type(seg[k]), type(want))
            assert np.allclose(seg[k], want, rtol=RTOL, atol=0.0), (name, k)
    for s in system.segments:
        T_in = chain.segments[s.name]["T_in"]
        if s.side == "supply":
            want = T_supply if s.fed_by is None else chain.segments[s.fed_by]["T_out"]
        else:  # a return run takes house air at its own grilles and the air of the runs feeding it
            kids = system.children(s.name)
            carried = flows[s.name] * s.count
            own = carried - sum(flows[k.name] * k.count for k in kids)
            want = (own * T_house + sum(chain.segments[k.name]["T_out"] * flows[k.name] * k.count
                                        for k in kids)) / carried
        assert np.allclose(T_in, want, rtol=RTOL, atol=0.0), s.name


def test_the_plan_goes_down_the_supply_tree_and_up_the_return_tree():
    system = deep()
    plan = chain_plan(system.segments)
    names = [s.name for s in system.segments]
    levels = [sorted(names[i] for i in still + sum(groups, ())) for still, groups in plan.waves]
    assert levels == [["bedrooms", "grille", "plenum"], ["closet", "east", "hall", "west"],
                      ["east runs", "trunk", "west runs"]]
    # one call per film kind: the ashrae152 hall return holds its films, the east and west supply do not
    assert [sorted(names[i] for i in g) for g in plan.waves[1][1]] == [["east", "west"], ["hall"]]
    assert [names[i] for i in plan.waves[1][0]] == ["closet"]
    # the recursive chain's order: supply trunk before branches, return feeders before their trunk
    assert [names[i] for i in plan.order] == ["plenum", "east", "east runs", "west", "west runs", "closet",
                                              "bedrooms", "hall", "grille", "trunk"]
    assert system._chain_plan == plan


@pytest.mark.parametrize("k", [None, 1, 7])
def test_every_run_of_the_levelled_chain_is_its_own_segment_transfer_call(k):
    system = deep()
    rows = 1.0 if k is None else np.linspace(0.95, 1.05, k)
    m, cp, T_supply, T_house = 0.64 * rows, 1018.0, 285.0 * rows, 297.0
    sur = surroundings(k)
    chain = thermal_chain(system, m, cp, T_supply, T_house, sur, P)
    assert list(chain.segments) == [s.name for s in (system.segments[i] for i in system._chain_plan.order)]
    check_against_own_calls(system, chain, cp, sur, T_supply, T_house)


def test_a_stack_of_deep_trees_equals_its_rows_and_each_run_its_own_call():
    systems = [deep(), deep(r=1.5, length=9.0, airflow=0.7, eps=0.3), deep(r=0.5, given=0.2, fs=0.0, fr=0.1),
               deep(airflow=0.4, given=0.4 * 0.95)]  # the last row's closet takes all: the others carry none
    st = stack_duct_systems(systems)
    n = len(systems)
    m = np.array([0.64, 0.82, 0.60, 0.47])
    cp = np.array([1018.0, 1020.0, 1016.0, 1019.0])
    T_supply = np.array([285.0, 286.0, 318.0, 284.0])
    T_house = np.array([297.0, 296.0, 294.0, 297.5])
    sur = surroundings(n)
    chain = thermal_chain(st, m, cp, T_supply, T_house, sur, P)
    assert np.all(chain.segments["east runs"]["Q"][3] == 0.0)  # a still row next to live ones
    for i, sy in enumerate(systems):
        row_sur = {loc: Surroundings(float(s.T_air[i]), float(s.T_mrt[i]), float(s.W[i])) for loc, s in sur.items()}
        one = thermal_chain(sy, float(m[i]), float(cp[i]), float(T_supply[i]), float(T_house[i]), row_sur, P)
        for name, seg in one.segments.items():
            for k in KEYS + ("T_in", "m_run"):
                got = np.broadcast_to(chain.segments[name][k], (n,))[i]
                assert np.isclose(got, seg[k], rtol=RTOL, atol=1e-9), (i, name, k)
        want = energy_balance(sy, one, "cooling", 0.0093, row_sur, P).to_dict()["delivered_w"]
        got = energy_parts(st, chain, "cooling", np.full(n, 0.0093), sur, P)["delivered"][i]
        assert got == pytest.approx(want, rel=RTOL)
    assert st.take([0, 0, 2])._chain_plan is st._chain_plan  # one plan per layout


def test_one_segment_transfer_call_per_level_and_film_kind(monkeypatch):
    calls = []

    def counted(geom, *args, **kw):
        calls.append(np.shape(geom.length))
        return segment_transfer(geom, *args, **kw)

    monkeypatch.setattr(ducts.levels, "segment_transfer", counted)
    system, k = deep(), 7
    rows = np.ones(k)
    thermal_chain(system, 0.64 * rows, 1018.0, 285.0 * rows, 297.0, surroundings(k), P)
    # level 0: plenum with bedrooms; level 1: east with west, then the hall alone (its R holds the films);
    # level 2: the east runs alone (films held), the west runs with the trunk. The closet and the grille are
    # in the house: no call. A run alone goes through as it is (its geometry's own scalars).
    assert calls == [(2, 1), (2, 1), (), (), (2, 1)]


def test_a_run_among_row_arrays_keeps_the_shape_and_type_of_its_own_call():
    # one run of single numbers next to a run of rows: stacked together, each comes back as its own call's
    g = [round_geometry(0.2, 10.0, 1.0), round_geometry(0.15, 5.0, 0.5)]
    rows = np.array([1.0, 1.02, 0.97])
    args = ([285.0 * rows, 290.0], [0.2 * rows, 0.05], 1006.0, [325.0, 320.0], [325.0 * rows, 330.0], [0.9, 0.6])
    got = transfer_many(g, *args)
    for j in range(2):
        ref = segment_transfer(g[j], *(a[j] for a in args[:2]), args[2], *(a[j] for a in args[3:]))
        for key in KEYS:
            assert type(got[j][key]) is type(ref[key]) and np.shape(got[j][key]) == np.shape(ref[key]), (j, key)
            assert np.allclose(got[j][key], ref[key], rtol=RTOL, atol=0.0), (j, key)


def test_a_films_included_level_keeps_the_geometry_ua():
    # ASHRAE 152's R holds the films: UA = L / R' whatever the air does (as segment_transfer gives it)
    system = deep()
    k = 3
    chain = thermal_chain(system, np.full(k, 0.64), 1018.0, np.full(k, 285.0), 297.0, surroundings(k), P)
    g = system.segments[4].geometry()  # east runs
    assert g.films_included
    assert chain.segments["east runs"]["UA"] == g.length / g.insulation_resistance
    assert isinstance(chain.segments["east runs"]["UA"], float)


def test_no_ducts_and_a_still_side():
    # limiting cases: no segments at all; a side whose only run is in the house
    none = thermal_chain(DuctSystem((), 0.5), 0.6, 1006.0, 285.0, 297.0, {}, P)
    assert none.segments == {} and none.T_delivered == 285.0 and none.T_return_end == 297.0
    inside = DuctSystem((DuctSegment("s", "supply", CONDITIONED, 5.0, 1.0, diameter=0.3),
                         DuctSegment("r", "return", "attic", 5.0, 1.0, diameter=0.3)), 0.5)
    c = thermal_chain(inside, np.full(2, 0.6), 1006.0, 285.0, 297.0, surroundings(2), P)
    assert np.all(c.segments["s"]["Q"] == 0.0) and np.all(c.T_delivered == 285.0)
    assert np.all(c.segments["r"]["Q"] > 0.0)  # return air at 297 K gains from a 321-329 K attic (limiting case)
