"""A stack of duct systems: one layout, different numbers per row, so many variants of a case (the points of a
study) go through one batched thermal chain and energy balance with the rows on a leading array axis.

A DuctStack offers what ducts.chain.thermal_chain and ducts.energy.energy_parts read from a DuctSystem, with a
(n,) array wherever the system holds a float. Every per-row number sits in one (fields, n) matrix, so
``take`` (called each Newton iteration when a solver repeats rows for a Jacobian) is one fancy index.
"""

from __future__ import annotations

import math

import numpy as np

from ducts.insulation import Section, SegmentGeometry, insulated_geometry
from ducts.layout import CONDITIONED, SIDES, DuctSegment, DuctSystem
from ducts.levels import chain_plan

# per-segment inputs, in the order of the matrix rows (nan stands for None)
_SEG_INPUTS = ("length", "r_label", "diameter", "width", "height", "insulation_conductivity", "leak_share",
               "airflow", "jacket_emittance")
_GEOM = ("inner_perimeter", "flow_area", "hydraulic_diameter", "insulation_resistance", "outer_perimeter")


def _segment_key(s):
    return (s.name, s.side, s.location, s.count, s.fed_by, s.r_model, s.diameter is not None, s.airflow is None)


_KEY_PARTS = ("name", "side", "location", "count", "fed_by", "r_model", "round (diameter given)",
              "airflow given (None or not)")


def layout_key(system: DuctSystem):
    """What two duct systems must share to be stacked (equal keys: stackable).

    Parameters
    ----------
    system : DuctSystem

    Returns
    -------
    tuple
        The leak locations and, segment by segment in order, name, side, location, count, fed_by,
        r_model (hence films_included), round or rectangular, and whether its airflow is given.

    Examples
    --------
    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> a = DuctSystem((DuctSegment("s", "supply", "attic", 10.0, 1.0, diameter=0.2),), 0.2)
    >>> b = DuctSystem((DuctSegment("s", "supply", "attic", 7.0, 0.5, diameter=0.3),), 0.3, 0.05)
    >>> layout_key(a) == layout_key(b)
    True
    """
    return (system.supply_leak_location, system.return_leak_location,
            tuple(_segment_key(s) for s in system.segments))


def _difference(i, a, b):
    """Words for the first thing in which system a (row i) differs from system b (row 0)."""
    for what, x, y in (("supply_leak_location", a.supply_leak_location, b.supply_leak_location),
                       ("return_leak_location", a.return_leak_location, b.return_leak_location)):
        if x != y:
            return f"row {i} differs from row 0 in {what}: {x!r} vs {y!r}"
    na, nb = [s.name for s in a.segments], [s.name for s in b.segments]
    if na != nb:
        return f"row {i} differs from row 0 in its segments (names in order): {na} vs {nb}"
    for sa, sb in zip(a.segments, b.segments, strict=True):
        for part, x, y in zip(_KEY_PARTS, _segment_key(sa), _segment_key(sb), strict=True):
            if x != y:
                return f"row {i} differs from row 0 in segment {sa.name!r}: {part} {x!r} vs {y!r}"
    return f"row {i} differs from row 0 in its layout"


class _Layout:
    """What the rows share: segments' names and places, trunks, leak locations, and the matrix's row index."""

    def __init__(self, system):
        self.segments = system.segments  # row 0's segments: names, sides, counts... (the numbers are not used)
        self.supply_leak_location = system.supply_leak_location
        self.return_leak_location = system.return_leak_location
        self.films = {}
        self.plan = None  # the thermal chain's level order, made on first use (DuctStack._chain_plan)
        fields = ["airflow", "supply_leak_fraction", "return_leak_fraction"]
        fields += [(s.name, f) for s in self.segments for f in _SEG_INPUTS]
        self.n_inputs = len(fields)
        fields += [(s.name, f) for s in self.segments for f in _GEOM]
        fields += [(s.name, "run_flow") for s in self.segments]
        self.locations = {}  # side -> the locations where its leaks may open, in the scalar split's order
        for side in SIDES:
            given = system.supply_leak_location if side == "supply" else system.return_leak_location
            segs = [s for s in self.segments if s.side == side]
            locs = [given] if given is not None else list(dict.fromkeys(s.location for s in segs))
            if given is None and CONDITIONED not in locs:
                locs.append(CONDITIONED)  # where a side without any leak weight leaks (DuctSystem.leak_split)
            self.locations[side] = locs
            fields += [(side, "leak", loc) for loc in locs]
        self.index = {f: i for i, f in enumerate(fields)}
        self.n_fields = len(fields)


class StackSegment:
    """One segment of a DuctStack: shared name, side, location, count, fed_by, r_model; per-row numbers.

    Attributes
    ----------
    jacket_emittance : (n,) array [-]
    airflow : (n,) array [m3/s] through one run, or None (shares its trunk's air)
    length, r_label, diameter, width, height, insulation_conductivity : (n,) arrays (nan where not given)
    """

    def __init__(self, seg, layout, data, geometry):
        self.name, self.side, self.location = seg.name, seg.side, seg.location
        self.count, self.fed_by, self.r_model = seg.count, seg.fed_by, seg.r_model
        ix = layout.index
        for f in _SEG_INPUTS:
            setattr(self, f, data[ix[(seg.name, f)]])
        if seg.airflow is None:
            self.airflow = None
        self._geometry = geometry

    def geometry(self):
        """The runs' SegmentGeometry with (n,) arrays (films_included shared)."""
        return self._geometry


def _geometries(layout, data):
    """Each segment's geometry over all rows at once (the R models take arrays), into the matrix rows."""
    ix = layout.index
    for s in layout.segments:
        col = {f: data[ix[(s.name, f)]] for f in _SEG_INPUTS}
        sec = (Section(diameter=col["diameter"]) if s.diameter is not None
               else Section(width=col["width"], height=col["height"]))
        g = insulated_geometry(sec, col["length"], col["r_label"], s.r_model, col["insulation_conductivity"])
        for f in _GEOM:
            data[ix[(s.name, f)]] = getattr(g, f)
        layout.films[s.name] = g.films_included


def _run_flows(layout, data):
    """DuctSystem._run_flows over all rows, into the matrix rows (the same operations, so the same numbers)."""
    ix = layout.index
    kids = {}
    for s in layout.segments:
        if s.fed_by is not None:
            kids.setdefault(s.fed_by, []).append(s)

    def share(total, group):
        if not group:
            return
        fixed = sum(data[ix[(s.name, "airflow")]] * s.count for s in group if s.airflow is not None)
        rest = total - fixed
        bad = rest < -1e-12 * np.maximum(total, 1e-9)
        if np.any(bad):
            names = ", ".join(s.name for s in group)
            raise ValueError(f"ducts {names}: their airflows add up to more than the air that feeds them "
                             f"(rows {np.flatnonzero(bad).tolist()})")
        n_free = sum(s.count for s in group if s.airflow is None)
        for s in group:
            data[ix[(s.name, "run_flow")]] = (data[ix[(s.name, "airflow")]] if s.airflow is not None
                                              else (rest / n_free if n_free else 0.0))
        for s in group:
            share(data[ix[(s.name, "run_flow")]], kids.get(s.name, []))

    for side, frac in (("supply", "supply_leak_fraction"), ("return", "return_leak_fraction")):
        side_flow = data[ix["airflow"]] * (1.0 - data[ix[frac]])
        share(side_flow, [s for s in layout.segments if s.side == side and s.fed_by is None])


def _leak_splits(layout, data):
    """DuctSystem.leak_split of every row into the matrix rows: a location a row does not leak into gets 0."""
    ix = layout.index
    n = data.shape[1]
    for side in SIDES:
        locs = layout.locations[side]
        rows = {loc: data[ix[(side, "leak", loc)]] for loc in locs}
        for r in rows.values():
            r[:] = 0.0
        if len(locs) == 1 and (layout.supply_leak_location if side == "supply" else layout.return_leak_location):
            rows[locs[0]][:] = 1.0
            continue
        segs = [s for s in layout.segments if s.side == side]
        shares = [data[ix[(s.name, "leak_share")]] for s in segs]
        by_share = np.zeros(n, bool)
        for sh in shares:
            by_share |= ~np.isnan(sh)
        weights = []
        for s, sh in zip(segs, shares, strict=True):
            area = data[ix[(s.name, "inner_perimeter")]] * data[ix[(s.name, "length")]] * s.count
            weights.append(np.where(by_share, np.nan_to_num(sh, nan=0.0), area))
        total = np.zeros(n)
        for w in weights:  # summed in order, as the scalar sum() does
            total = total + w
        ok = total > 0.0
        safe = np.where(ok, total, 1.0)
        for s, w in zip(segs, weights, strict=True):
            rows[s.location] += np.where(ok & (w > 0), w / safe, 0.0)
        rows[CONDITIONED][~ok] = 1.0


class DuctStack:
    """n duct systems of one layout, their numbers as (n,) arrays (build with stack_duct_systems).

    Offers the interface of DuctSystem that thermal_chain and energy_parts read: airflow,
    supply_leak_fraction, return_leak_fraction (n,) [m3/s, -]; segments; side(); children(); leak_split();
    run_flows() and with_airflow(); plus n, take() and row().
    """

    def __init__(self, layout, data):
        self._layout, self._data = layout, data
        ix = layout.index
        self.airflow = data[ix["airflow"]]
        self.supply_leak_fraction = data[ix["supply_leak_fraction"]]
        self.return_leak_fraction = data[ix["return_leak_fraction"]]
        self.supply_leak_location = layout.supply_leak_location
        self.return_leak_location = layout.return_leak_location
        segs = []
        for s in layout.segments:
            g = SegmentGeometry(data[ix[(s.name, "length")]], *(data[ix[(s.name, f)]] for f in _GEOM),
                                films_included=layout.films[s.name])
            segs.append(StackSegment(s, layout, data, g))
        self.segments = tuple(segs)
        self._transfer_cache = {}  # the thermal chain's stacked geometries (ducts.levels.transfer_many)
        self._run_flows = {s.name: data[ix[(s.name, "run_flow")]] for s in layout.segments}
        self._children = {}
        for s in self.segments:
            if s.fed_by is not None:
                self._children.setdefault(s.fed_by, []).append(s)

    @property
    def n(self):
        """Number of rows."""
        return self._data.shape[1]

    def __len__(self):
        return self.n

    def side(self, side):
        return [s for s in self.segments if s.side == side]

    def children(self, name):
        return self._children.get(name, [])

    @property
    def _chain_plan(self):
        """The level order of the thermal chain (ducts.levels.ChainPlan), shared by every stack of the layout."""
        lay = self._layout
        if lay.plan is None:
            lay.plan = chain_plan(self.segments)
        return lay.plan

    def run_flows(self):
        """Volume flow through one run of every segment, m3/s: dict name -> (n,) array."""
        return dict(self._run_flows)

    def leak_split(self, side):
        """DuctSystem.leak_split row by row: {location: (n,) share}, 0 where a row leaks none there."""
        ix = self._layout.index
        return {loc: self._data[ix[(side, "leak", loc)]] for loc in self._layout.locations[side]}

    def take(self, idx):
        """The stack of rows idx (an index array, repeats allowed)."""
        data = self._data[:, np.asarray(idx, dtype=np.intp)]
        data.flags.writeable = False
        return DuctStack(self._layout, data)

    def with_airflow(self, airflow):
        """The same rows at another air-handler airflow, (n,) or scalar [m3/s]; runs with a given airflow
        keep their share of it (DuctSystem.with_airflow row by row)."""
        lay = self._layout
        ix = lay.index
        data = self._data.copy()
        k = airflow / self.airflow
        for s in lay.segments:
            if s.airflow is not None:
                data[ix[(s.name, "airflow")]] = data[ix[(s.name, "airflow")]] * k
        data[ix["airflow"]] = airflow
        _run_flows(lay, data)
        data.flags.writeable = False
        return DuctStack(lay, data)

    def row(self, i):
        """Row i as a DuctSystem (equal to the one it was stacked from, or its with_airflow)."""
        ix = self._layout.index
        d = self._data[:, i]

        def val(name, f):
            v = float(d[ix[(name, f)]])
            return None if math.isnan(v) else v

        segs = []
        for s in self._layout.segments:
            kw = {f: val(s.name, f) for f in _SEG_INPUTS}
            segs.append(DuctSegment(s.name, s.side, s.location, count=s.count, fed_by=s.fed_by,
                                    r_model=s.r_model, **kw))
        return DuctSystem(tuple(segs), float(d[ix["airflow"]]), float(d[ix["supply_leak_fraction"]]),
                          float(d[ix["return_leak_fraction"]]), self.supply_leak_location,
                          self.return_leak_location)


def stack_duct_systems(systems):
    """Stack duct systems of one layout into a DuctStack, row i from systems[i].

    Parameters
    ----------
    systems : sequence of DuctSystem
        With equal layout_key (same segments in order, sides, locations, counts, trunks, R models,
        leak locations); the numbers (airflow, leak fractions, lengths, R, sizes, emittances...) may differ.

    Returns
    -------
    DuctStack

    Raises
    ------
    ValueError
        If no systems are given, or one's layout differs from the first (the message names what).

    Examples
    --------
    Two variants of one supply run in a 325 K attic: each row of the batched chain is the scalar
    chain of its own system (an equivalence check; thermal_chain's physics is checked there):

    >>> import numpy as np
    >>> from ducts.chain import Surroundings, thermal_chain
    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> a = DuctSystem((DuctSegment("s", "supply", "attic", 10.0, 1.0, diameter=0.2),), 0.2)
    >>> b = DuctSystem((DuctSegment("s", "supply", "attic", 6.0, 2.0, diameter=0.25),), 0.25, 0.05)
    >>> st = stack_duct_systems([a, b])
    >>> st.n, st.row(1) == b
    (2, True)
    >>> attic = Surroundings(325.0, 325.0, 0.005)
    >>> c = thermal_chain(st, np.array([0.24, 0.3]), 1006.0, 285.0, 297.0,
    ...                   {"attic": Surroundings(np.full(2, 325.0), np.full(2, 325.0), np.full(2, 0.005))})
    >>> one = [thermal_chain(s, m, 1006.0, 285.0, 297.0, {"attic": attic}).T_delivered
    ...        for s, m in ((a, 0.24), (b, 0.3))]
    >>> bool(np.allclose(c.T_delivered, one, rtol=1e-12, atol=0.0))
    True
    """
    systems = list(systems)
    if not systems:
        raise ValueError("stack_duct_systems needs at least one duct system")
    key0 = layout_key(systems[0])
    for i, s in enumerate(systems[1:], start=1):
        if layout_key(s) != key0:
            raise ValueError("duct systems cannot be stacked: " + _difference(i, s, systems[0]))
    return _finish(_Layout(systems[0]), np.array([system_numbers(sy) for sy in systems], dtype=float).T)


def stack_duct_rows(system, n):
    """A DuctStack of n rows from one DuctSystem whose numbers may be (n,) arrays in place of floats (an
    uncertainty run's samples); a float holds for every row. Row by row as stack_duct_systems (tested).

    Parameters
    ----------
    system : DuctSystem
    n : int

    Returns
    -------
    DuctStack

    Raises
    ------
    ValueError
        If an array is not n long, or a row's airflows add up to more than the air that feeds them.

    Examples
    --------
    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> a = DuctSystem((DuctSegment("s", "supply", "attic", 10.0, np.array([1.0, 2.0]), diameter=0.2),), 0.2)
    >>> st = stack_duct_rows(a, 2)
    >>> st.n, float(st.segments[0].r_label[1])
    (2, 2.0)
    """
    return _finish(_Layout(system), np.stack([np.broadcast_to(np.asarray(v, float), (n,))
                                              for v in system_numbers(system)]))


def system_numbers(system):
    """A system's numbers (airflow, leak fractions, each segment's sizes, R, emittance...), in the order of a
    DuctStack's input rows, None as nan: floats, or (n,) arrays where the system holds them."""
    r = [system.airflow, system.supply_leak_fraction, system.return_leak_fraction]
    for s in system.segments:
        r += [s.length, s.r_label, s.diameter, s.width, s.height, s.insulation_conductivity, s.leak_share,
              s.airflow, s.jacket_emittance]
    return [math.nan if v is None else v for v in r]


def _finish(layout, inputs):
    """The stack of the input rows (n_inputs, n), with its derived rows: geometry, run flows, leak splits."""
    data = np.empty((layout.n_fields, inputs.shape[1]))
    data[:layout.n_inputs] = inputs
    _geometries(layout, data)
    _run_flows(layout, data)
    _leak_splits(layout, data)
    data.flags.writeable = False
    return DuctStack(layout, data)
