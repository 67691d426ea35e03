"""Roll profiles of the rolled C and MC channel series: inner-flange slope and radii by series.

A mill rolls every weight of a channel series with one set of rolls and spreads the web: d, the
flange outstand b_f - t_w and the mean flange thickness t_f are the same for all weights of a
series. That is how :func:`channel_series` recognises a series, so a shop's own weight of a
catalog series gets the same profile.

The profile of each series was measured on the AISC Shapes Database v16.0 (our data files
``data/aisc_c.csv``, ``aisc_mc.csv``), in two steps:

1. slope: the candidate from {0, tan 2 deg, 1:12, tan 8 deg, 1:6} that brought A, I_x, I_y,
   x_bar, Z_x and Z_y of all weights of the series closest, radii free. With 1:6 the wide-flange
   MC series stay 5 % to 21 % off on one of them and MC8x8.5 with parallel flanges 14 %, whatever
   the radii; between 2 deg and parallel flanges the wide-flange MC series differ by 0.5 % or
   less, except MC6x15.3, which needs the 2 deg (parallel: 4.5 % off).
2. radii: the root fillet r1 (a fraction of the flange thickness at the web face) and the toe
   radius r2 (a fraction of that at the toe) by least squares on the relative deviations of A,
   I_x, I_y, S_x, S_y, Z_x, Z_y, x_o and J (the outline's own J, :mod:`._torsion`) of all weights;
   MC3x7.1 takes the radii that minimise its largest deviation instead (least squares left its
   Z_y 1.2 % out), C4 r1 = 0.60 for 0.63 (so that its miss is a J 1.1 % below the table, not
   one 1.6 % above).

What came out: C 1:6 for every series (the slope of American Standard channels), r1 about half
the flange thickness at the web face, r2 about 0.7 of that at the toe; wide-flange MC about 2 deg
(near-parallel; MC12 x31 to x50 and MC4x13.8 parallel) with r1 about the flange thickness; MC13
tan 8 deg; the light MC12x14.3, MC12x10.6, MC10x8.4, MC8x8.5 1:6 like C; MC10x6.5, MC6x7, MC6x6.5
1:12. With these every C and MC row is within 1.6 % of the table on A, I, S, Z, r, x_o, C_w and J
(``tests/eng/test_sections_computed.py`` lists the 7 rows outside 1 %, all below the table). These are measurements on
the published properties, not mill drawings: for a series not listed, give the mill's slope and
radii to :class:`~calcpad.eng.sections.rolled.RolledChannel`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from calcpad.core.errors import InputError
from calcpad.eng.sections.props import length_in
from calcpad.eng.sections.rolled import RolledChannel

__all__ = ["SERIES", "ChannelSeries", "channel_series", "series_channel"]

PARALLEL = 0.0
TWO_DEG = math.tan(math.radians(2.0))
ONE_IN_12 = 1.0 / 12.0
EIGHT_DEG = math.tan(math.radians(8.0))
ONE_IN_6 = 1.0 / 6.0


@dataclass(frozen=True)
class ChannelSeries:
    """One rolled series: depth, mean flange thickness, flange outstand b_f - t_w (in), inner-flange
    slope, root fillet as a fraction of the flange thickness at the web face and toe radius as a
    fraction of the flange thickness at the toe."""

    label: str
    d: float
    tf: float
    outstand: float
    slope: float
    root: float
    toe: float

    def radii(self) -> tuple[float, float]:
        """(r1, r2) in inches."""
        t_web = self.tf + self.slope * self.outstand / 2.0
        t_toe = self.tf - self.slope * self.outstand / 2.0
        return self.root * t_web, self.toe * t_toe


#: The C and MC series of the AISC Shapes Database v16.0 with the profile measured for each (see
#: the module docstring for how).
SERIES: tuple[ChannelSeries, ...] = (
    ChannelSeries("C15", 15.0, 0.65, 3.0, ONE_IN_6, 0.53, 0.71),
    ChannelSeries("C12", 12.0, 0.501, 2.66, ONE_IN_6, 0.46, 0.70),
    ChannelSeries("C10", 10.0, 0.436, 2.357, ONE_IN_6, 0.48, 0.69),
    ChannelSeries("C9", 9.0, 0.413, 2.202, ONE_IN_6, 0.48, 0.73),
    ChannelSeries("C8", 8.0, 0.39, 2.043, ONE_IN_6, 0.51, 0.68),
    ChannelSeries("C7", 7.0, 0.366, 1.881, ONE_IN_6, 0.57, 0.75),
    ChannelSeries("C6", 6.0, 0.343, 1.723, ONE_IN_6, 0.48, 0.69),
    ChannelSeries("C5", 5.0, 0.32, 1.565, ONE_IN_6, 0.60, 0.88),
    ChannelSeries("C4", 4.0, 0.296, 1.399, ONE_IN_6, 0.60, 0.70),  # least squares 0.63: J of C4x4.5 1.6 % above
    ChannelSeries("C3", 3.0, 0.273, 1.244, ONE_IN_6, 0.69, 0.94),
    ChannelSeries("MC18", 18.0, 0.625, 3.5, TWO_DEG, 0.96, 0.82),
    ChannelSeries("MC13", 13.0, 0.61, 3.623, EIGHT_DEG, 0.59, 0.97),
    ChannelSeries("MC12 (x31 to x50)", 12.0, 0.7, 3.305, PARALLEL, 0.86, 0.70),
    ChannelSeries("MC12x14.3", 12.0, 0.313, 1.87, ONE_IN_6, 0.45, 0.90),
    ChannelSeries("MC12x10.6", 12.0, 0.309, 1.31, ONE_IN_6, 0.55, 0.76),
    ChannelSeries("MC10 (x28.5 to x41.1)", 10.0, 0.575, 3.524, TWO_DEG, 0.93, 0.83),
    ChannelSeries("MC10 (x22, x25)", 10.0, 0.575, 3.03, TWO_DEG, 0.97, 0.88),
    ChannelSeries("MC10x8.4", 10.0, 0.28, 1.33, ONE_IN_6, 0.58, 0.86),
    ChannelSeries("MC10x6.5", 10.0, 0.202, 1.018, ONE_IN_12, 0.92, 0.42),
    ChannelSeries("MC9", 9.0, 0.55, 3.05, TWO_DEG, 0.95, 0.84),
    ChannelSeries("MC8 (x21.4, x22.8)", 8.0, 0.525, 3.073, TWO_DEG, 0.96, 0.87),
    ChannelSeries("MC8 (x18.7, x20)", 8.0, 0.5, 2.63, TWO_DEG, 0.95, 0.87),
    ChannelSeries("MC8x8.5", 8.0, 0.311, 1.691, ONE_IN_6, 0.50, 0.74),
    ChannelSeries("MC7", 7.0, 0.5, 3.097, TWO_DEG, 0.93, 0.83),
    ChannelSeries("MC6x18", 6.0, 0.475, 3.121, TWO_DEG, 0.94, 0.81),
    ChannelSeries("MC6x15.3", 6.0, 0.385, 3.16, TWO_DEG, 0.89, 0.97),
    ChannelSeries("MC6 (x15.1, x16.3)", 6.0, 0.475, 2.625, TWO_DEG, 0.97, 0.85),
    ChannelSeries("MC6x12", 6.0, 0.375, 2.19, TWO_DEG, 0.97, 0.88),
    ChannelSeries("MC6 (x6.5, x7)", 6.0, 0.291, 1.701, ONE_IN_12, 0.91, 0.82),
    ChannelSeries("MC4x13.8", 4.0, 0.5, 2.0, PARALLEL, 0.89, 0.74),
    ChannelSeries("MC3x7.1", 3.0, 0.351, 1.628, TWO_DEG, 1.055, 0.94),  # radii by minimax (least squares: 1.04, 0.96)
)

#: Matching tolerances (in): the tables print d and t_f exactly, b_f and t_w to 0.01 or 0.001.
_TOL_D, _TOL_TF, _TOL_OUT = 0.005, 0.002, 0.03


def channel_series(d: float, bf: float, tf: float, tw: float) -> ChannelSeries | None:
    """The series a channel of these dimensions (in) belongs to, or None."""
    for s in SERIES:
        if abs(s.d - d) <= _TOL_D and abs(s.tf - tf) <= _TOL_TF and abs(s.outstand - (bf - tw)) <= _TOL_OUT:
            return s
    return None


def series_channel(d: object, bf: object, tf: object, tw: object, *, name: str | None = None) -> RolledChannel:
    """A :class:`RolledChannel` with the slope and radii of the series its dimensions belong to
    (a catalog size or a shop's own weight of a catalog series)."""
    dims = [length_in(v, label) for v, label in ((d, "d (depth)"), (bf, "bf (flange width)"), (tf, "tf (flange thickness)"),
                                                  (tw, "tw (web thickness)"))]
    s = channel_series(*dims)
    if s is None:
        raise InputError(f"channel d = {dims[0]:g}, bf = {dims[1]:g}, tf = {dims[2]:g}, tw = {dims[3]:g} in: no C or MC series "
                         "has this depth, flange thickness and flange outstand bf - tw; expected a catalog series, or "
                         "give the mill's slope and radii to RolledChannel")
    r1, r2 = s.radii()
    return RolledChannel(*dims, slope=s.slope, r1=r1, r2=r2, name=name)
