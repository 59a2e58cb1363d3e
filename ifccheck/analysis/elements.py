"""Closed-form element solution of the Euler-Bernoulli beam and exact extremes within an element.

Between two nodes the line load is linear, q(s) = q0 + (q1 - q0) s/h, so with the state at the
element's left end (shear V0, moment M0, deflection D0, slope T0) the exact solution is

    V(s) = V0 - q0 s - (q1 - q0) s^2 / (2h)                       dV/ds = -q
    M(s) = M0 + V0 s - q0 s^2/2 - (q1 - q0) s^3 / (6h)             dM/ds = V
    EI D''(s) = -M(s)                                              (D downward, M sagging)

Every function here works on stacked arrays (members x cases x elements) and writes the
polynomials in the element coordinate xi = s/h in [0, 1], coefficients in ascending powers along
the last axis. Extremes are found exactly: moment extremes at the roots of V (a quadratic, closed
form), zero-moment points at the roots of M inside the intervals where M is monotonic, and
deflection extremes at the roots of the slope inside the intervals where the slope is monotonic
(between zero-moment points). Each of those roots is bracketed, so a safeguarded Newton iteration
finds it (to 1e-12 of the element length).
"""

from __future__ import annotations

import numpy as np

#: state arrays of an element: left-end shear, moment, deflection, slope and the end line loads
STATE_FIELDS = ("V0", "M0", "D0", "T0", "q0", "q1")


def shear_coefficients(st: dict, h: np.ndarray) -> np.ndarray:
    """V(xi) in lbf."""
    dq = st["q1"] - st["q0"]
    return np.stack([st["V0"], -st["q0"] * h, -0.5 * dq * h], axis=-1)


def moment_coefficients(st: dict, h: np.ndarray) -> np.ndarray:
    """M(xi) in lbf*in (sagging positive)."""
    dq = st["q1"] - st["q0"]
    h2 = h * h
    return np.stack([st["M0"], st["V0"] * h, -0.5 * st["q0"] * h2, -dq * h2 / 6.0], axis=-1)


def slope_coefficients(st: dict, h: np.ndarray, EI: np.ndarray) -> np.ndarray:
    """Slope dD/dx(xi), radians (positive where the deflection grows to the right)."""
    dq = st["q1"] - st["q0"]
    h2 = h * h
    h3 = h2 * h
    return np.stack(
        [
            st["T0"],
            -st["M0"] * h / EI,
            -0.5 * st["V0"] * h2 / EI,
            st["q0"] * h3 / (6.0 * EI),
            dq * h3 / (24.0 * EI),
        ],
        axis=-1,
    )


def deflection_coefficients(st: dict, h: np.ndarray, EI: np.ndarray) -> np.ndarray:
    """D(xi) in inches (downward positive)."""
    dq = st["q1"] - st["q0"]
    h2 = h * h
    h3 = h2 * h
    h4 = h3 * h
    return np.stack(
        [
            st["D0"],
            st["T0"] * h,
            -0.5 * st["M0"] * h2 / EI,
            -st["V0"] * h3 / (6.0 * EI),
            st["q0"] * h4 / (24.0 * EI),
            dq * h4 / (120.0 * EI),
        ],
        axis=-1,
    )


def polyval(c: np.ndarray, xi: np.ndarray) -> np.ndarray:
    """Evaluate polynomials ``c[..., k] * xi**k`` at ``xi`` (shape ``c.shape[:-1] + (m,)``)."""
    out = np.broadcast_to(c[..., -1:], c.shape[:-1] + (xi.shape[-1],)).copy()
    for k in range(c.shape[-1] - 2, -1, -1):
        out *= xi
        out += c[..., k : k + 1]
    return out


def linear_root_in_unit(c: np.ndarray) -> np.ndarray:
    """Root in (0, 1) of ``c0 + c1 xi`` (shape ``(..., 1)``), NaN where there is none."""
    with np.errstate(divide="ignore", invalid="ignore"):
        r = -c[..., 0] / c[..., 1]
    return np.where((r > 0) & (r < 1), r, np.nan)[..., None]


def quadratic_roots_in_unit(c: np.ndarray) -> np.ndarray:
    """Real roots in (0, 1) of ``c0 + c1 xi + c2 xi^2``, ascending, NaN-padded to shape ``(..., 2)``.

    Uses the cancellation-free form q = -(c1 + sign(c1) sqrt(disc))/2, roots q/c2 and c0/q, which
    also gives the single root of a degenerate (linear) quadratic.
    """
    a, b, c0 = c[..., 2], c[..., 1], c[..., 0]
    disc = b * b - 4.0 * a * c0
    with np.errstate(divide="ignore", invalid="ignore"):
        q = -0.5 * (b + np.where(b >= 0, 1.0, -1.0) * np.sqrt(np.where(disc >= 0, disc, np.nan)))
        r = np.stack([q / a, c0 / q], axis=-1)
    r = np.where((r > 0) & (r < 1), r, np.nan)
    return np.sort(r, axis=-1)


def bracketed_roots(c: np.ndarray, points: np.ndarray, max_iter: int = 60) -> np.ndarray:
    """Roots of ``c`` in each interval between consecutive ``points`` where it changes sign.

    ``points`` (shape ``(..., K + 1)``, ascending, within [0, 1]) must split [0, 1] into intervals
    on which the polynomial is monotonic, so each holds at most one root. Returns shape ``(..., K)``
    with NaN where an interval holds no sign change.
    """
    lo, hi = points[..., :-1], points[..., 1:]
    f = polyval(c, points)
    flo, fhi = f[..., :-1], f[..., 1:]
    roots = np.full(lo.shape, np.nan)
    active = (flo * fhi < 0) & (hi > lo)
    where = np.nonzero(active)
    if not where[0].size:
        return roots
    cc = c[where[:-1]]
    roots[where] = _safeguarded_newton(cc, lo[where], hi[where], flo[where], fhi[where], max_iter)
    return roots


def _safeguarded_newton(c, lo, hi, flo, fhi, max_iter):
    """Newton's method kept inside a shrinking sign-change bracket.

    A step bisects instead when Newton would leave the bracket or would not halve the previous
    step (the rule of the classic safeguarded Newton-Raphson), so flat or near-double roots still
    converge fast. A root is done when its Newton step falls below 1e-12 of the element length; done
    roots drop out of the working set.
    """
    dc = c[:, 1:] * np.arange(1, c.shape[1])
    x = lo - flo * (hi - lo) / (fhi - flo)
    out = x.copy()
    todo = np.arange(x.size)
    last_step = hi - lo
    for _ in range(max_iter):
        fx = polyval(c, x[:, None])[:, 0]
        dfx = polyval(dc, x[:, None])[:, 0]
        same_as_lo = np.sign(fx) == np.sign(flo)
        lo = np.where(same_as_lo, x, lo)
        hi = np.where(same_as_lo, hi, x)
        flo = np.where(same_as_lo, fx, flo)
        with np.errstate(divide="ignore", invalid="ignore"):
            newton = x - fx / dfx
        converged = (np.abs(newton - x) <= 1e-12) | (fx == 0)
        bisect = ~((newton > lo) & (newton < hi)) | (np.abs(2 * fx) > np.abs(last_step * dfx))
        trial = np.where(bisect, 0.5 * (lo + hi), newton)
        new = np.where(converged, np.clip(np.where(fx == 0, x, newton), lo, hi), trial)
        step = np.abs(new - x)
        out[todo] = new
        going = ~(converged | (hi - lo <= 1e-12))
        if not going.any():
            break
        todo, c, dc, x, lo, hi, flo, last_step = (a[going] for a in (todo, c, dc, new, lo, hi, flo, step))
    return out


def interval_points(roots: np.ndarray) -> np.ndarray:
    """Interval ends 0, sorted roots, 1 (missing roots become 1, giving empty intervals at the end)."""
    inner = np.sort(np.where(np.isnan(roots), 1.0, roots), axis=-1)
    shape = roots.shape[:-1] + (1,)
    return np.concatenate([np.zeros(shape), inner, np.ones(shape)], axis=-1)


def extreme_candidates(roots: np.ndarray) -> np.ndarray:
    """Points where a function can take its extreme on [0, 1]: both ends and the given roots.

    Missing roots (NaN) are replaced by the end 0, which is a candidate anyway.
    """
    shape = roots.shape[:-1] + (1,)
    return np.concatenate([np.zeros(shape), np.ones(shape), np.where(np.isnan(roots), 0.0, roots)], axis=-1)


def merge_intervals(start: np.ndarray, end: np.ndarray, valid: np.ndarray, tol: np.ndarray):
    """Union of the valid intervals in each row (rows are the leading axes, intervals the last).

    Intervals that touch or overlap (within ``tol``, shape of the rows) merge. Returns flat arrays
    ``(row, start, end)``: the row's flat index and each merged region, in row then x order.
    """
    rows = int(np.prod(start.shape[:-1]))
    s = np.where(valid, start, np.inf).reshape(rows, -1)
    e = np.where(valid, end, -np.inf).reshape(rows, -1)
    t = np.broadcast_to(tol, start.shape[:-1]).reshape(rows, 1)
    order = np.argsort(s, axis=-1, kind="stable")
    s = np.take_along_axis(s, order, axis=-1)
    e = np.take_along_axis(e, order, axis=-1)
    reach = np.maximum.accumulate(e, axis=-1)
    before = np.concatenate([np.full((rows, 1), -np.inf), reach[:, :-1]], axis=-1)
    present = np.isfinite(s)
    first = present & (s > before + t)
    after = np.concatenate([first[:, 1:] | ~present[:, 1:], np.ones((rows, 1), bool)], axis=-1)
    last = present & after
    row = np.nonzero(first)[0]
    return row, s[first], reach[last]
