"""A stack of duct systems (one layout, numbers per row) through the batched chain and energy balance.

Equivalence tests: every row of the batched code is compared with the existing scalar code on that row's own
DuctSystem (thermal_chain, energy_parts, energy_balance, run flows, leak split), whose physics is checked
against handbook values and limiting cases in tests/test_duct_system.py and tests/test_duct_segment.py.
"""

import dataclasses

import numpy as np
import pytest

from ducts import (
    CONDITIONED,
    DuctSegment,
    DuctSystem,
    Surroundings,
    energy_balance,
    energy_balances,
    energy_parts,
    layout_key,
    stack_duct_systems,
    thermal_chain,
)

P = 101325.0
RTOL = 1e-12


def system(r=1.0, length=8.0, d=0.35, fs=0.06, fr=0.04, airflow=0.5, eps=0.9, closet=0.04, bare_grille=0.0,
           width=0.3):
    """A plenum trunk feeding attic runs (6 alike), a closet run of given airflow in the house and two
    rectangular runs in a crawlspace; an attic return trunk fed by two grilles in the house. Supply leaks
    spread by bare area, return leaks by leak_share."""
    return DuctSystem((
        DuctSegment("plenum", "supply", "attic", length, r, diameter=d, jacket_emittance=eps),
        DuctSegment("runs", "supply", "attic", 2.0 * length, 0.8 * r, diameter=0.15, count=6, fed_by="plenum",
                    r_model="ashrae152", jacket_emittance=eps),
        DuctSegment("closet", "supply", CONDITIONED, 3.0, r, diameter=0.15, fed_by="plenum", airflow=closet),
        DuctSegment("crawl runs", "supply", "crawl", 0.5 * length, 1.2 * r, width=width, height=0.2, count=2,
                    fed_by="plenum", r_model="label", jacket_emittance=0.5 * eps),
        DuctSegment("return", "return", "attic", length, r, diameter=d + 0.05, leak_share=1.0,
                    jacket_emittance=eps),
        DuctSegment("grille", "return", CONDITIONED, 1.0, bare_grille, diameter=0.3, count=2, fed_by="return",
                    leak_share=0.5),
    ), airflow, fs, fr)


# six rows: R, lengths, sizes, leaks, airflow and emittance vary; row 4 has bare grilles (R = 0); in row 5
# the closet takes all the plenum's air, so the other runs carry none (a still run next to live rows)
SYSTEMS = [
    system(),
    system(r=1.5, length=12.0, d=0.4, fs=0.10, fr=0.0, airflow=0.6, eps=0.1, width=0.25),
    system(r=0.5, length=5.0, d=0.3, fs=0.0, fr=0.12, airflow=0.35, eps=0.6, closet=0.01),
    system(r=2.0, length=20.0, d=0.45, fs=0.15, fr=0.08, airflow=0.8, eps=0.3),
    system(r=1.0, length=9.0, d=0.35, fs=0.02, fr=0.02, airflow=0.45, bare_grille=0.0, eps=0.95),
    system(r=1.0, length=8.0, d=0.35, fs=0.05, fr=0.05, airflow=0.4, closet=0.4 * 0.95),
]
N = len(SYSTEMS)
M_DOT = np.array([0.59, 0.70, 0.41, 0.94, 0.53, 0.47])
CP = np.array([1020.0, 1018.0, 1025.0, 1016.0, 1021.0, 1019.0])
T_SUPPLY = np.array([285.0, 286.0, 284.0, 287.0, 285.5, 316.0])  # the last row heats
T_HOUSE = np.array([297.0, 296.5, 297.5, 296.0, 297.2, 294.0])
SUR = {"attic": Surroundings(np.array([325.0, 330.0, 318.0, 335.0, 322.0, 270.0]),
                             np.array([328.0, 340.0, 318.0, 337.0, 320.0, 265.0]),
                             np.array([0.012, 0.015, 0.009, 0.018, 0.011, 0.002])),
       "crawl": Surroundings(np.array([293.0, 292.0, 295.0, 291.0, 294.0, 280.0]),
                             np.array([293.0, 291.0, 295.0, 290.0, 294.0, 279.0]),
                             np.array([0.010, 0.011, 0.009, 0.012, 0.010, 0.004]))}
W_HOUSE = np.array([0.0093, 0.0095, 0.0090, 0.0100, 0.0092, 0.0050])


def row_surroundings(i):
    return {loc: Surroundings(float(s.T_air[i]), float(s.T_mrt[i]), float(s.W[i])) for loc, s in SUR.items()}


def scalar_chain(i, systems=SYSTEMS):
    return thermal_chain(systems[i], float(M_DOT[i]), float(CP[i]), float(T_SUPPLY[i]), float(T_HOUSE[i]),
                         row_surroundings(i), P)


def stack_chain(stack):
    return thermal_chain(stack, M_DOT, CP, T_SUPPLY, T_HOUSE, SUR, P)


def close(a, b):
    return np.allclose(np.asarray(a, float), np.asarray(b, float), rtol=RTOL, atol=1e-9)


def test_a_stack_gives_back_its_rows_and_their_run_flows_and_leak_splits():
    st = stack_duct_systems(SYSTEMS)
    assert st.n == N and len(st.segments) == 6 and st.airflow.shape == (N,)
    for i, s in enumerate(SYSTEMS):
        assert st.row(i) == s
        for name, q in s.run_flows().items():
            assert st.run_flows()[name][i] == pytest.approx(q, rel=RTOL, abs=0.0)
        for side in ("supply", "return"):
            mine = {loc: float(v[i]) for loc, v in st.leak_split(side).items() if v[i] != 0.0}
            assert mine == pytest.approx(s.leak_split(side), rel=RTOL)
        for a, b in zip(st.segments, s.segments, strict=True):
            ga, gb = a.geometry(), b.geometry()
            assert ga.films_included == gb.films_included
            for f in ("length", "inner_perimeter", "flow_area", "hydraulic_diameter", "insulation_resistance",
                      "outer_perimeter"):
                assert getattr(ga, f)[i] == pytest.approx(getattr(gb, f), rel=RTOL, abs=0.0)
    assert np.all(st.run_flows()["runs"][5] == 0.0)  # the still row is still


def test_the_batched_chain_equals_the_scalar_chain_row_by_row():
    chain = stack_chain(stack_duct_systems(SYSTEMS))
    for i in range(N):
        one = scalar_chain(i)
        for f in ("T_return_end", "T_equipment_in", "T_delivered"):
            assert close(getattr(chain, f)[i], getattr(one, f)), (i, f)
        for name, seg in one.segments.items():
            for f in ("T_in", "T_out", "Q", "Q_conv", "Q_rad", "T_jacket_cold", "m_run", "UA"):
                assert close(np.broadcast_to(chain.segments[name][f], (N,))[i], seg[f]), (i, name, f)
        for mine, theirs in ((chain.supply_leaks, one.supply_leaks), (chain.return_leaks, one.return_leaks)):
            assert close([mine[k][i] for k in theirs], list(theirs.values()))
            assert all(mine[k][i] == 0.0 for k in mine if k not in theirs)
        for loc in ("attic", "crawl"):
            got, want = chain.sinks(loc), one.sinks(loc)
            assert all(close(np.broadcast_to(got[k], (N,))[i], want[k]) for k in ("Q_conv", "Q_rad", "m_in",
                                                                                   "m_out"))


@pytest.mark.parametrize("mode", ["cooling", "heating"])
def test_the_batched_energy_parts_and_balances_equal_the_scalar_ones(mode):
    st = stack_duct_systems(SYSTEMS)
    chain = stack_chain(st)
    parts = energy_parts(st, chain, mode, W_HOUSE, SUR, P)
    results = energy_balances(st, chain, mode, W_HOUSE, SUR, P)
    assert len(results) == N
    for i in range(N):
        one = scalar_chain(i)
        want = energy_parts(SYSTEMS[i], one, mode, float(W_HOUSE[i]), row_surroundings(i), P)
        assert all(close(parts[k][i], want[k]) for k in want)
        got = results[i].to_dict()
        ref = energy_balance(SYSTEMS[i], one, mode, float(W_HOUSE[i]), row_surroundings(i), P).to_dict()
        for a, b in zip(got.pop("segments"), ref.pop("segments"), strict=True):
            assert same(a, b), (i, a, b)
        assert same(got, ref), (i, got, ref)


def same(a, b):
    """Two result dicts: equal keys, floats to RTOL, the rest exactly."""
    return a.keys() == b.keys() and all(
        (close(a[k], b[k]) or (np.isnan(a[k]) and np.isnan(b[k]))) if isinstance(b[k], float) else a[k] == b[k]
        for k in b)


def test_take_with_repeats_is_the_stack_of_those_rows():
    # the solver's Jacobian repeats every row; the chain on the taken stack is the chain's rows repeated
    st = stack_duct_systems(SYSTEMS)
    idx = np.repeat(np.arange(N), 3)
    taken = st.take(idx)
    assert taken.n == 3 * N and [taken.row(j) for j in (0, 4, 17)] == [SYSTEMS[0], SYSTEMS[1], SYSTEMS[5]]
    c = thermal_chain(taken, M_DOT[idx], CP[idx], T_SUPPLY[idx], T_HOUSE[idx],
                      {k: Surroundings(s.T_air[idx], s.T_mrt[idx], s.W[idx]) for k, s in SUR.items()}, P)
    full = stack_chain(st)
    assert close(c.T_delivered, full.T_delivered[idx]) and close(c.T_equipment_in, full.T_equipment_in[idx])
    assert close(c.segments["runs"]["Q"], full.segments["runs"]["Q"][idx])


def test_with_airflow_scales_each_row_as_the_scalar_rule_does():
    st = stack_duct_systems(SYSTEMS)
    new = np.linspace(0.3, 0.9, N)
    moved = st.with_airflow(new)
    for i, s in enumerate(SYSTEMS):
        ref = s.with_airflow(float(new[i]))
        assert moved.row(i) == ref
        assert all(moved.run_flows()[k][i] == pytest.approx(v, rel=RTOL, abs=0.0) for k, v in ref.run_flows().items())
    same = st.with_airflow(0.5)  # a scalar for every row
    assert same.row(2) == SYSTEMS[2].with_airflow(0.5)


def test_layout_key_groups_the_stackable_systems():
    other = dataclasses.replace(SYSTEMS[0], supply_leak_location="attic")
    groups = {}
    for s in SYSTEMS + [other, dataclasses.replace(other, airflow=0.3)]:
        groups.setdefault(layout_key(s), []).append(s)
    assert sorted(len(g) for g in groups.values()) == [2, N]
    assert stack_duct_systems(groups[layout_key(other)]).leak_split("supply") == {"attic": pytest.approx([1.0, 1.0])}


def test_unstackable_systems_raise_and_name_what_differs():
    moved = dataclasses.replace(SYSTEMS[1], segments=tuple(
        dataclasses.replace(s, location="crawl") if s.name == "runs" else s for s in SYSTEMS[1].segments))
    with pytest.raises(ValueError, match="row 1 differs from row 0 in segment 'runs': location 'crawl' vs 'attic'"):
        stack_duct_systems([SYSTEMS[0], moved])
    fewer = dataclasses.replace(SYSTEMS[2], segments=SYSTEMS[2].segments[:-1])
    with pytest.raises(ValueError, match="names in order"):
        stack_duct_systems([SYSTEMS[0], SYSTEMS[1], fewer])
    placed = dataclasses.replace(SYSTEMS[1], return_leak_location="attic")
    with pytest.raises(ValueError, match="return_leak_location"):
        stack_duct_systems([SYSTEMS[0], placed])
    with pytest.raises(ValueError, match="at least one"):
        stack_duct_systems([])
