"""Saint-Venant torsion constant J of a solid polygon by finite differences.

Prandtl's stress function phi solves laplacian(phi) = -2 inside the outline with phi = 0 on it, and
J = 2 * integral(phi dA) (Timoshenko and Goodier, Theory of Elasticity, torsion chapter; from
memory). The grid is regular; where a node's arm crosses the outline the five-point stencil takes
the exact distance to the crossing (Shortley-Weller), so the error falls as h^2 and two grids
(h and h/2) extrapolate it away (Richardson). Against the finite-element warping analysis of
sectionproperties on the same rolled-channel outlines the result agrees within 0.2 %
(``tests/eng/test_sections_rolled.py``).
"""

from __future__ import annotations

import math

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla

__all__ = ["torsion_constant"]

#: Most grid nodes a solve may use (the grid is coarsened to stay below).
MAX_NODES = 250_000


def _crossings(ring: np.ndarray, axis: int, levels: np.ndarray) -> list[np.ndarray]:
    """Sorted crossings of the outline with the lines ``coordinate[axis] = level`` (the other coordinate)."""
    p, q = ring, np.roll(ring, -1, axis=0)
    other = 1 - axis
    out = []
    for v in levels:
        c1, c2 = p[:, axis], q[:, axis]
        m = (c1 <= v) != (c2 <= v)
        s = (v - c1[m]) / (c2[m] - c1[m])
        out.append(np.sort(p[m, other] + s * (q[m, other] - p[m, other])))
    return out


def _arms(levels: np.ndarray, crossings: list[np.ndarray], pos: np.ndarray, h: float) -> tuple[np.ndarray, ...]:
    """Per line: inside mask, forward and backward arm lengths (capped at h), and whether each arm
    ends on the outline."""
    n_lines, n_pos = len(levels), len(pos)
    inside = np.zeros((n_lines, n_pos), bool)
    fwd = np.full((n_lines, n_pos), h)
    bwd = np.full((n_lines, n_pos), h)
    for j, cr in enumerate(crossings):
        k = np.searchsorted(cr, pos)
        inside[j] = (k % 2) == 1
        nxt = np.where(k < len(cr), cr[np.minimum(k, len(cr) - 1)], np.inf) - pos
        prv = pos - np.where(k > 0, cr[np.maximum(k - 1, 0)], -np.inf)
        fwd[j], bwd[j] = np.minimum(nxt, h), np.minimum(prv, h)
    return inside, fwd, bwd, fwd < h, bwd < h


def _solve(ring: np.ndarray, h: float) -> float:
    x0, y0 = ring.min(axis=0)
    x1, y1 = ring.max(axis=0)
    nx, ny = max(2, math.ceil((x1 - x0) / h)), max(2, math.ceil((y1 - y0) / h))
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    xs = x0 + (np.arange(nx) + 0.5) * hx  # cell centres: no node on an edge of the bounding box
    ys = y0 + (np.arange(ny) + 0.5) * hy
    inside, east, west, e_b, w_b = _arms(ys, _crossings(ring, 1, ys), xs, hx)
    _, north_t, south_t, n_bt, s_bt = _arms(xs, _crossings(ring, 0, xs), ys, hy)
    north, south, n_b, s_b = north_t.T, south_t.T, n_bt.T, s_bt.T
    idx = -np.ones((ny, nx), dtype=int)
    n = int(inside.sum())
    idx[inside] = np.arange(n)
    jj, ii = np.nonzero(inside)
    e, w, no, so = east[inside], west[inside], north[inside], south[inside]
    rows, cols, vals = [np.arange(n)], [np.arange(n)], [2.0 / (e * w) + 2.0 / (no * so)]
    for dj, di, arm, opp, ends in ((0, 1, e, w, e_b), (0, -1, w, e, w_b), (1, 0, no, so, n_b), (-1, 0, so, no, s_b)):
        j2, i2 = jj + dj, ii + di
        ok = ~ends[inside] & (j2 >= 0) & (j2 < ny) & (i2 >= 0) & (i2 < nx)
        nbr = np.full(n, -1)
        nbr[ok] = idx[j2[ok], i2[ok]]
        ok &= nbr >= 0
        rows.append(np.arange(n)[ok])
        cols.append(nbr[ok])
        vals.append((-2.0 / (arm * (arm + opp)))[ok])
    a = sp.csc_matrix((np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=(n, n))
    phi = spla.spsolve(a, np.full(n, 2.0))
    return 2.0 * float(phi.sum()) * hx * hy


def torsion_constant(ring: np.ndarray, t_min: float, per_thickness: int = 6) -> float:
    """J of the polygon ``ring`` (N x 2, in), whose thinnest part is ``t_min``: grids of
    ``t_min/per_thickness`` and half that, extrapolated (error of order h^4 after extrapolation)."""
    ring = np.asarray(ring, dtype=float)
    area = 0.5 * abs(float(np.sum(ring[:, 0] * np.roll(ring[:, 1], -1) - np.roll(ring[:, 0], -1) * ring[:, 1])))
    h = t_min / per_thickness
    h = max(h, 2.0 * math.sqrt(area / MAX_NODES))  # the fine grid (h/2) stays within MAX_NODES
    coarse, fine = _solve(ring, h), _solve(ring, h / 2.0)
    return (4.0 * fine - coarse) / 3.0
