"""Writing output files so that none is ever half-written."""

from __future__ import annotations

import os
import tempfile
from contextlib import contextmanager
from pathlib import Path


@contextmanager
def atomic_path(path, suffix=".tmp"):
    """Yield a temporary path in the same folder as `path`; rename it over `path` when the block succeeds.

    The file gets the permissions of an ordinary new file (mkstemp alone makes it 0600).
    """
    path = Path(path)
    fd, tmp = tempfile.mkstemp(dir=path.parent if str(path.parent) else ".", prefix=f".{path.name}.", suffix=suffix)
    os.close(fd)
    try:
        yield tmp
        mask = os.umask(0)
        os.umask(mask)
        os.chmod(tmp, 0o666 & ~mask)
        os.replace(tmp, path)
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)
