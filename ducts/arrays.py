"""The one scalar-or-array rule of the duct functions: a float in, a float out; an array in, an array out.

ducts stands alone (it imports nothing from attic), so it keeps its own copy of attic.physics.arrays.
"""

from __future__ import annotations

import numpy as np


def scalar_or_array(x):
    """``x`` as a float when it is 0-dimensional, else as the numpy array it is.

    Examples
    --------
    >>> scalar_or_array(np.asarray(2.5)), scalar_or_array(np.array([1.0, 2.0])).shape
    (2.5, (2,))
    """
    x = np.asarray(x)
    return x if x.ndim else float(x)
