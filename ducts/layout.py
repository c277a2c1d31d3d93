"""The layout of a duct system: its segments, their sides and locations, trunks and branches, and how
the air-handler flow shares out among them."""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np

from ducts.levels import chain_plan
from ducts.segment import FLEX_INSULATION_CONDUCTIVITY, rectangular_geometry, round_geometry

CONDITIONED = "conditioned"
SIDES = ("supply", "return")


@dataclass(frozen=True)
class DuctSegment:
    """One duct run, or `count` identical parallel runs (SI).

    Attributes
    ----------
    name : str
    side : "supply" or "return"
    location : "attic", "conditioned" or the name of another surrounding
    length : m
    r_label : m2.K/W, the labelled insulation R
    diameter : m (round) or None
    width, height : m (rectangular) or None
    count : number of identical runs
    fed_by : name of the trunk this run hangs on (supply: takes its air; return: feeds it)
    airflow : m3/s through one run, or None to share the trunk's air by count
    r_model : a key of ducts.insulation.R_MODELS ("cylinder", "label", "ashrae152")
    jacket_emittance : dimensionless
    insulation_conductivity : W/(m.K)
    leak_share : weight of this run in its side's leakage, or None (see DuctSystem.leak_split)
    """

    name: str
    side: str
    location: str
    length: float
    r_label: float
    diameter: float | None = None
    width: float | None = None
    height: float | None = None
    count: int = 1
    fed_by: str | None = None
    airflow: float | None = None
    r_model: str = "cylinder"
    jacket_emittance: float = 0.9
    insulation_conductivity: float = FLEX_INSULATION_CONDUCTIVITY
    leak_share: float | None = None

    def geometry(self):
        """The run's SegmentGeometry (computed once)."""
        return self._geometry

    @property
    def bare_area(self):
        """Inner (sheet-metal or core) surface of all its runs, m2: the basis of the leak split."""
        g = self._geometry
        return g.inner_perimeter * g.length * self.count

    @cached_property
    def _geometry(self):
        if self.diameter is not None:
            return round_geometry(self.diameter, self.length, self.r_label, self.r_model,
                                  self.insulation_conductivity)
        return rectangular_geometry(self.width, self.height, self.length, self.r_label,
                                    self.insulation_conductivity, self.r_model)


@dataclass(frozen=True)
class DuctSystem:
    """Segments, air handler airflow and leakage (SI).

    Attributes
    ----------
    segments : tuple of DuctSegment
    airflow : m3/s at the air handler, at the house air's density
    supply_leak_fraction, return_leak_fraction : of the air-handler flow, in operation
    supply_leak_location, return_leak_location : where all of a side's leaks open; None = spread
        over that side's segments (see leak_split)
    """

    segments: tuple
    airflow: float
    supply_leak_fraction: float = 0.0
    return_leak_fraction: float = 0.0
    supply_leak_location: str | None = None
    return_leak_location: str | None = None

    def __post_init__(self):
        names = [s.name for s in self.segments]
        if len(set(names)) != len(names):
            raise ValueError(f"duct names must be unique, got {names}")
        by_name = {s.name: s for s in self.segments}
        for s in self.segments:
            if s.side not in SIDES:
                raise ValueError(f"duct {s.name!r}: side {s.side!r} is not one of {SIDES}")
            if s.fed_by is not None:
                parent = by_name.get(s.fed_by)
                if parent is None:
                    raise ValueError(f"duct {s.name!r}: fed_by {s.fed_by!r} names no duct")
                if parent.side != s.side:
                    raise ValueError(f"duct {s.name!r} ({s.side}) cannot hang on {parent.name!r} ({parent.side})")
        for s in self.segments:  # no cycles
            seen, cur = set(), s
            while cur.fed_by is not None:
                if cur.name in seen:
                    raise ValueError(f"duct {s.name!r}: fed_by forms a loop")
                seen.add(cur.name)
                cur = by_name[cur.fed_by]
        for f in (self.supply_leak_fraction, self.return_leak_fraction):
            if not np.all((0.0 <= np.asarray(f)) & (np.asarray(f) < 1.0)):  # (m,) arrays: every row
                raise ValueError(f"leak fraction {f} must be at least 0 and below 1")
        for s in self.segments:
            if s.leak_share is not None and not np.all(np.asarray(s.leak_share) >= 0.0):
                raise ValueError(f"duct {s.name!r}: leak_share {s.leak_share} must be at least 0")
        for side in SIDES:
            segs = self.side(side)
            frac = self.supply_leak_fraction if side == "supply" else self.return_leak_fraction
            given = self.supply_leak_location if side == "supply" else self.return_leak_location
            if (np.any(np.asarray(frac) > 0) and given is None and segs and any(s.leak_share is not None for s in segs)
                    and sum(s.leak_share or 0.0 for s in segs) <= 0.0):
                raise ValueError(f"the {side} ducts' leak_share add up to 0, yet the {side} side leaks")

    def side(self, side):
        return [s for s in self.segments if s.side == side]

    def children(self, name):
        return self._children.get(name, [])

    @cached_property
    def _chain_plan(self):
        """The level order of the thermal chain (ducts.levels.ChainPlan, computed once)."""
        return chain_plan(self.segments)

    @cached_property
    def _transfer_cache(self):
        """The thermal chain's stacked geometries (ducts.levels.transfer_many), kept with the segments."""
        return {}

    @cached_property
    def _children(self):
        kids: dict[str, list] = {}
        for s in self.segments:
            if s.fed_by is not None:
                kids.setdefault(s.fed_by, []).append(s)
        return kids

    def leak_split(self, side):
        """Where that side's leaks open: {location: share of the side's leak flow} (shares add up to 1).

        A given supply_leak_location / return_leak_location takes all of it. Otherwise the leakage
        is spread over the side's segments by a basis that does not change with insulation: the
        segments' `leak_share` when any segment of the side gives one (a segment without one gets
        none), else their bare duct surface area (the leakier joints and seams scale with it; common
        practice, no source). The shares are then summed by location. A side without segments leaks
        at the air handler, in conditioned space.
        """
        given = self.supply_leak_location if side == "supply" else self.return_leak_location
        if given is not None:
            return {given: 1.0}
        return dict(self._leak_splits[side])

    @cached_property
    def _leak_splits(self):
        out = {}
        for side in SIDES:
            segs = self.side(side)
            if any(s.leak_share is not None for s in segs):
                weights = [(s.location, s.leak_share or 0.0) for s in segs]
            else:
                weights = [(s.location, s.bare_area) for s in segs]
            total = sum(w for _, w in weights)
            split: dict[str, float] = {}
            if total <= 0.0:
                split[CONDITIONED] = 1.0
            else:
                for loc, w in weights:
                    if w > 0:
                        split[loc] = split.get(loc, 0.0) + w / total
            out[side] = split
        return out

    def with_airflow(self, airflow):
        """The same system at another air-handler airflow, m3/s; runs with a given airflow keep their
        share of it (each scales with the air handler)."""
        import dataclasses

        k = airflow / self.airflow
        segs = tuple(s if s.airflow is None else dataclasses.replace(s, airflow=s.airflow * k)
                     for s in self.segments)
        return dataclasses.replace(self, segments=segs, airflow=airflow)

    def run_flows(self):
        """Volume flow through one run of every segment, m3/s (dict by name; computed once)."""
        return dict(self._run_flows)

    @cached_property
    def _run_flows(self):
        """Volume flow through one run of every segment, m3/s (dict by name).

        A segment fed by nothing shares its side's flow (air-handler flow less that side's
        leakage) with the other such segments in proportion to count; the runs fed by one trunk
        share what it carries in proportion to their count; a given airflow overrides both.
        """
        flows: dict[str, float] = {}
        for side, frac in (("supply", self.supply_leak_fraction), ("return", self.return_leak_fraction)):
            side_flow = self.airflow * (1.0 - frac)
            self._share(side_flow, [s for s in self.side(side) if s.fed_by is None], flows)
        return flows

    def _share(self, total, group, flows):
        if not group:
            return
        free = [s for s in group if s.airflow is None]
        fixed = sum(s.airflow * s.count for s in group if s.airflow is not None)
        rest = total - fixed
        if np.any(rest < -1e-12 * np.maximum(total, 1e-9)):  # (m,) arrays: any row
            names = ", ".join(s.name for s in group)
            raise ValueError(f"ducts {names}: their airflows add up to more than the air that feeds them")
        n_free = sum(s.count for s in free)
        for s in group:
            flows[s.name] = s.airflow if s.airflow is not None else (rest / n_free if n_free else 0.0)
        for s in group:
            self._share(flows[s.name], self.children(s.name), flows)

