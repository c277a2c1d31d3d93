"""Newton-type methods on many independent rows at once (the hours of a year, the points of a study, the
samples of an uncertainty run): each row's Jacobian block comes from one vectorised evaluation of all rows and
their perturbed copies side by side (`stacked_jacobian`), and the rows' small linear systems are solved together.

Numerical methods only: what the rows are (attic networks, the design airflow) is for the callers.
"""

from __future__ import annotations

import numpy as np


def stacked_jacobian(evaluate, x, h=1e-4):
    """Residuals (n, m) and their forward-difference Jacobian (n, m, m) at x (n, m), from ONE call of
    evaluate on the n (m + 1) rows [x_i, x_i + h e_1, ..., x_i + h e_m] (row i's state and its perturbed copies
    side by side, as `stacked` lays out a network). The rows (hours or points) do not interact, so the Jacobian
    is block-diagonal: one (m, m) block per row."""
    n, m = x.shape  # rows, unknowns per row
    k = m + 1
    X = np.repeat(x, k, axis=0)
    rows = np.arange(n)[:, None] * k + 1 + np.arange(m)[None, :]
    X[rows.ravel(), np.tile(np.arange(m), n)] += h
    R = evaluate(X).reshape(n, k, m)
    r = R[:, 0, :]
    return r, np.transpose(R[:, 1:, :] - r[:, None, :], (0, 2, 1)) / h


def newton_batched(evaluate, x, tol, max_step, max_iter=40, h=1e-4):
    """Newton's method on many independent rows at once.

    evaluate : residuals of stacked rows (see `stacked_jacobian`), so that each trial state's residuals and
    Jacobian come from one vectorised evaluation; x : (n, m) starting unknowns; tol : the residual each unknown's
    equation must reach, broadcast to (n, m); max_step : (m,) the largest step of each unknown (a longer step is
    shortened as a whole). Steps are halved while a row's worst residual grows. Returns (x, residuals, iterations).
    """
    x = np.array(x, dtype=float)
    n = x.shape[0]
    r, J = stacked_jacobian(evaluate, x, h)
    steps = 0
    for _ in range(max_iter):
        norm = np.max(np.abs(r), axis=1)
        active = np.any(~(np.abs(r) <= tol), axis=1)
        if not np.any(active & np.isfinite(norm)):
            break
        steps += 1
        with np.errstate(all="ignore"):
            try:
                dx = np.linalg.solve(J, -r[:, :, None])[:, :, 0]
            except np.linalg.LinAlgError:
                break
        dx[~np.isfinite(dx)] = 0.0
        shrink = np.min(max_step / np.maximum(np.abs(dx), 1e-300), axis=1)
        dx *= np.minimum(1.0, shrink)[:, None]
        dx[~active] = 0.0
        alpha = np.ones(n)
        for _ in range(8):
            x_new = x + alpha[:, None] * dx
            with np.errstate(all="ignore"):
                r_new, J_new = stacked_jacobian(evaluate, x_new, h)
            worse = (np.max(np.abs(r_new), axis=1) > norm) & active & np.isfinite(norm)
            bad = worse | ~np.all(np.isfinite(r_new), axis=1)
            if not np.any(bad):
                break
            alpha = np.where(bad, alpha * 0.5, alpha)
        x, r, J = x_new, r_new, J_new
    return x, r, steps


def chord_batched(evaluate, evaluate_stacked, x, tol, max_step, max_iter=20, h=1e-4, floor=100.0):
    """The chord method on many independent rows at once: each row's Jacobian is taken once, at the start, from
    one stacked evaluation (`stacked_jacobian`), and every step then costs one plain evaluation of the rows.

    It converges linearly, and fast where the start lies near the root (an uncertainty run's samples around
    one solved sample); a row whose worst residual grows is stopped where it was, and counts as converged when it
    stopped within floor x tol (the round-off of the residuals themselves, which Newton's method meets there too).
    Rows it does not bring that close are for `newton_batched`.

    evaluate : evaluate(x_rows, rows) -> the residuals of the rows an index array names, at x_rows;
    evaluate_stacked : residuals of stacked rows (see `stacked_jacobian`); tol, max_step : as for
    `newton_batched`. Returns (x, residuals, converged (n,)).

    References
    ----------
    Kelley, C. T. (1995), Iterative Methods for Linear and Nonlinear Equations, SIAM, ch. 5 (the chord method;
    chapter from memory).

    Examples
    --------
    x**2 = a row by row, from starts near the roots; the answers are the square roots:

    >>> a = np.array([[2.0], [3.0]])
    >>> def f(x, rows=None):
    ...     return x**2 - (a if rows is None else a[rows])
    >>> x, r, ok = chord_batched(f, lambda X: X**2 - np.repeat(a, 2, axis=0), np.array([[1.5], [1.8]]),
    ...                          1e-12, np.array([1.0]))
    >>> bool(np.allclose(x[:, 0], np.sqrt([2.0, 3.0]), rtol=1e-12)), ok.tolist()
    (True, [True, True])
    """
    x = np.array(x, dtype=float)
    r, J = stacked_jacobian(evaluate_stacked, x, h)
    live = np.all(np.isfinite(r), axis=1)
    try:
        with np.errstate(all="ignore"):
            inv = np.linalg.inv(np.where(live[:, None, None], J, np.eye(x.shape[1])))
    except np.linalg.LinAlgError:
        return x, r, np.zeros(len(x), bool)
    for _ in range(max_iter):
        norm = np.max(np.abs(r), axis=1)
        active = live & np.any(~(np.abs(r) <= tol), axis=1)
        if not np.any(active):
            break
        with np.errstate(all="ignore"):
            dx = -(inv @ r[:, :, None])[:, :, 0]
        dx[~np.isfinite(dx)] = 0.0
        dx *= np.minimum(1.0, np.min(max_step / np.maximum(np.abs(dx), 1e-300), axis=1))[:, None]
        rows = np.flatnonzero(active)  # only the rows still stepping are evaluated
        with np.errstate(all="ignore"):
            r_new = evaluate(x[rows] + dx[rows], rows)
        grew = ~(np.max(np.abs(r_new), axis=1) < norm[rows])
        live[rows[grew]] = False
        step = rows[~grew]
        x[step] += dx[step]
        r[step] = r_new[~grew]
    within = np.all(np.abs(r) <= np.where(live[:, None], 1.0, floor) * tol, axis=1)
    return x, r, within & np.all(np.isfinite(r), axis=1)
