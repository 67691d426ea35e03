"""Radii of the AISC angle series (legs d x b) as the AISC Shapes Database v16.0 angle table
(Manual Table 1-7) computes its values, inferred from that table.

The table does not print radii, and its values do not follow one outline: its J follows the root
fillet of the rolls (one radius per series reproduces the tabulated J of every thickness within
0.6 % with the El Darwish and Johnston closed form of :class:`~calcpad.eng.sections.rolled.RolledAngle`:
``k_des - t`` of the rows, or 1/4, 5/16, 3/8 in for seven series), while its A, I, S, Z and
plastic axes follow a smaller root fillet (none at all for seven series). Per series we keep:

* ``r1``: root fillet of the outline (1/32 in steps) and ``r2``: toe radius (1/64 in steps), the
  pair that brings the most rows of the series within 1 % on A, I, S, Z, r and I_z (and the plastic
  axes within 5 %), then the smallest excess above the table; for 2-1/2 x 2-1/2 the best pair that
  keeps A within 0.7 % of the table (a shop's stated weight is checked against A, to 2 %);
* ``r_j``: the root fillet the table's J follows.

With them 118 of the 137 rows are within 1 % on every property. They are measured values of the
table, not a mill's radii: a mill's own radii, where known, take precedence.
"""

from __future__ import annotations

__all__ = ["SERIES_RADII", "series_radii"]

#: (long leg, short leg) in -> (outline root fillet r1, toe radius r2, J root fillet r_j) in.
SERIES_RADII: dict[tuple[float, float], tuple[float, float, float]] = {
    (12.0, 12.0): (0 / 32, 39 / 64, 0.7125),
    (10.0, 10.0): (6 / 32, 39 / 64, 0.8),
    (8.0, 8.0): (12 / 32, 15 / 64, 0.625),
    (8.0, 6.0): (16 / 32, 13 / 64, 0.5),
    (8.0, 4.0): (13 / 32, 10 / 64, 0.5),
    (7.0, 4.0): (10 / 32, 14 / 64, 0.5),
    (6.0, 6.0): (8 / 32, 14 / 64, 0.5),
    (6.0, 4.0): (0 / 32, 14 / 64, 0.375),
    (6.0, 3.5): (0 / 32, 10 / 64, 0.375),
    (5.0, 5.0): (8 / 32, 7 / 64, 0.5),
    (5.0, 3.5): (4 / 32, 12 / 64, 0.375),
    (5.0, 3.0): (5 / 32, 12 / 64, 0.375),
    (4.0, 4.0): (6 / 32, 14 / 64, 0.375),
    (4.0, 3.5): (0 / 32, 12 / 64, 0.375),
    (4.0, 3.0): (4 / 32, 12 / 64, 0.375),
    (3.5, 3.5): (0 / 32, 9 / 64, 0.375),
    (3.5, 3.0): (7 / 32, 8 / 64, 0.375),
    (3.5, 2.5): (5 / 32, 7 / 64, 0.3125),
    (3.0, 3.0): (0 / 32, 10 / 64, 0.25),
    (3.0, 2.5): (0 / 32, 9 / 64, 0.3125),
    (3.0, 2.0): (7 / 32, 6 / 64, 0.3125),
    (2.5, 2.5): (6 / 32, 11 / 64, 0.25),  # A within 0.7 % (the fewest-misses pair: 0, 10/64, A -1.1 %)
    (2.5, 2.0): (5 / 32, 5 / 64, 0.25),
    (2.5, 1.5): (4 / 32, 4 / 64, 0.25),
    (2.0, 2.0): (4 / 32, 6 / 64, 0.25),
}


def series_radii(d: float, b: float) -> tuple[float, float, float] | None:
    """(r1, r2, r_j) of the AISC series with legs ``d`` x ``b`` (in, either order), or None."""
    key = (max(d, b), min(d, b))
    return next((v for k, v in SERIES_RADII.items() if abs(k[0] - key[0]) < 1e-6 and abs(k[1] - key[1]) < 1e-6), None)
