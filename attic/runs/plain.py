"""Results as plain data: the frozen results' fields in SI, for programs and notebooks."""

from __future__ import annotations

import dataclasses

import numpy as np


def si_dict(result):
    """A frozen result's fields in SI, numpy arrays as lists (for notebooks and programs)."""
    def plain(v):
        if isinstance(v, np.ndarray):
            return v.tolist()
        if isinstance(v, np.generic):
            return v.item()
        if isinstance(v, dict):
            return {str(k): plain(x) for k, x in v.items()}
        if isinstance(v, tuple | list):
            return [plain(x) for x in v]
        return v

    return {f.name: plain(getattr(result, f.name)) for f in dataclasses.fields(result)}


def frame(columns, index=None, index_name=None):
    """A pandas DataFrame of SI columns (pandas is imported here, on first use)."""
    import pandas as pd

    df = pd.DataFrame(columns, index=index)
    if index_name is not None:
        df.index.name = index_name
    return df


def facing(azimuth_deg):
    """The compass word for a plane's azimuth (degrees clockwise from north)."""
    names = ["north", "northeast", "east", "southeast", "south", "southwest", "west", "northwest"]
    return names[int(((azimuth_deg % 360) + 22.5) // 45) % 8]
