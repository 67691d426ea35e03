"""Section properties record: plain floats in inches for speed, pint quantities on request."""

from __future__ import annotations

import math
from dataclasses import dataclass, field, fields
from typing import Any

import pint

from calcpad.core.errors import InputError
from calcpad.core.units import Q_, parse_quantity

__all__ = ["EXTRA_DESCRIPTIONS", "STEEL_DENSITY_PCF", "UNITS", "PublishedProps", "SectionProps", "length_in"]

#: Density used for weight per foot of steel shapes (lb/ft^3), as the AISC Manual tables do
#: (common practice: 490 lb/ft^3).
STEEL_DENSITY_PCF = 490.0

#: Unit of each float field of :class:`SectionProps` (lengths in inches).
UNITS: dict[str, str] = {
    "A": "in**2",
    "xc": "in",
    "yc": "in",
    "width": "in",
    "depth": "in",
    "Ix": "in**4",
    "Iy": "in**4",
    "Ixy": "in**4",
    "I_max": "in**4",
    "I_min": "in**4",
    "Sx_top": "in**3",
    "Sx_bot": "in**3",
    "Sy_left": "in**3",
    "Sy_right": "in**3",
    "Sx": "in**3",
    "Sy": "in**3",
    "Zx": "in**3",
    "Zy": "in**3",
    "rx": "in",
    "ry": "in",
    "r_min": "in",
    "J": "in**4",
    "C": "in**3",
    "theta_p": "degree",
    "weight": "lbf/ft",  # weight per length, a force (pint reads "lb" as the pound mass)
    "c_top": "in",
    "c_bot": "in",
    "c_left": "in",
    "c_right": "in",
    "Cw": "in**6",
    "x_bar": "in",
    "y_bar": "in",
    "e_o": "in",
    "x_o": "in",
    "y_o": "in",
    "r_o_bar": "in",
    "H_flex": "",
    "x_pna": "in",
    "y_pna": "in",
    "Qs": "",
}

#: What each optional property of :class:`SectionProps` means (catalog shapes carry them as the
#: AISC Shapes Database tabulates them; computed shapes leave them None where not computed).
EXTRA_DESCRIPTIONS: dict[str, str] = {
    "Cw": "warping constant C_w",
    "x_bar": "x̄: centroid from the back of the web (channel) or of the vertical leg (angle)",
    "y_bar": "ȳ: centroid from the outside of the flange (tee) or the back of the horizontal leg (angle, 2L)",
    "e_o": "e_o: shear centre from the back of the web (channel)",
    "x_o": "x_o: centroid to shear centre along x (magnitude)",
    "y_o": "y_o: centroid to shear centre along y (magnitude)",
    "r_o_bar": "r̄_o: polar radius of gyration about the shear centre (AISC 360-16 Eq. E4-9)",
    "H_flex": "H: flexural constant (AISC 360-16 Eq. E4-8)",
    "x_pna": "x_p: plastic neutral axis for bending about y, from the same edge as x̄",
    "y_pna": "y_p: plastic neutral axis for bending about x, from the same edge as ȳ",
    "Qs": "Q_s: slender-element reduction factor as tabulated",
}


def length_in(value: Any, field_name: str, *, allow_zero: bool = False) -> float:
    """Read a length (float in inches, pint quantity or string such as ``"1.900 in"``) as inches.

    Raises:
        InputError: not a length, not finite, or not positive (zero allowed if ``allow_zero``).
    """
    if isinstance(value, bool):
        raise InputError(f"{field_name}: got {value!r}; expected a length such as 2.375 (inches) or '60 mm'")
    if isinstance(value, (int, float)):
        x = float(value)
    else:
        q = parse_quantity(value, field_name, expected="[length]")
        try:
            x = float(q.to("inch").magnitude)
        except (TypeError, pint.errors.DimensionalityError):
            raise InputError(f"{field_name}: {value!r} is not a single length; expected e.g. '2.375 in'") from None
    if not math.isfinite(x):
        raise InputError(f"{field_name}: {value!r} is not a finite length; expected a positive length in inches")
    if x < 0.0 or (x == 0.0 and not allow_zero):
        want = "zero or a positive length" if allow_zero else "a positive length"
        raise InputError(f"{field_name}: {value!r} is {'zero' if x == 0 else 'negative'}; expected {want}")
    return x


@dataclass
class SectionProps:
    """Properties of a section about centroidal axes parallel to its own x (horizontal) and y.

    All floats are inches-based (see :data:`UNITS`); ``quantity(name)`` gives a pint quantity.
    ``xc``/``yc`` are measured from the lower-left corner of the bounding box. Two section moduli
    are given for each axis (to the top/bottom and left/right extreme fibres); ``Sx``/``Sy`` are the
    smaller ones. ``ratios`` holds the width-to-thickness ratios AISC 360-16 Table B4.1 uses;
    ``notes`` states the approximations behind the numbers.
    """

    name: str
    kind: str
    A: float
    xc: float
    yc: float
    width: float
    depth: float
    Ix: float
    Iy: float
    Ixy: float
    Zx: float
    Zy: float
    J: float
    weight: float
    C: float | None = None
    ratios: dict[str, float] = field(default_factory=dict)
    notes: list[str] = field(default_factory=list)
    Cw: float | None = None
    x_bar: float | None = None
    y_bar: float | None = None
    e_o: float | None = None
    x_o: float | None = None
    y_o: float | None = None
    r_o_bar: float | None = None
    H_flex: float | None = None
    x_pna: float | None = None
    y_pna: float | None = None
    Qs: float | None = None

    # ----------------------------------------------------------- derived
    @property
    def c_top(self) -> float:
        """Distance from the centroid to the top fibre."""
        return self.depth - self.yc

    @property
    def c_bot(self) -> float:
        """Distance from the centroid to the bottom fibre."""
        return self.yc

    @property
    def c_left(self) -> float:
        """Distance from the centroid to the left fibre."""
        return self.xc

    @property
    def c_right(self) -> float:
        """Distance from the centroid to the right fibre."""
        return self.width - self.xc

    @property
    def Sx_top(self) -> float:
        """Elastic section modulus to the top fibre."""
        return self.Ix / self.c_top

    @property
    def Sx_bot(self) -> float:
        """Elastic section modulus to the bottom fibre."""
        return self.Ix / self.c_bot

    @property
    def Sy_left(self) -> float:
        """Elastic section modulus to the left fibre."""
        return self.Iy / self.c_left

    @property
    def Sy_right(self) -> float:
        """Elastic section modulus to the right fibre."""
        return self.Iy / self.c_right

    @property
    def Sx(self) -> float:
        """Smaller elastic section modulus about x."""
        return min(self.Sx_top, self.Sx_bot)

    @property
    def Sy(self) -> float:
        """Smaller elastic section modulus about y."""
        return min(self.Sy_left, self.Sy_right)

    @property
    def rx(self) -> float:
        """Radius of gyration about x."""
        return math.sqrt(self.Ix / self.A)

    @property
    def ry(self) -> float:
        """Radius of gyration about y."""
        return math.sqrt(self.Iy / self.A)

    @property
    def I_max(self) -> float:
        """Major principal moment of inertia."""
        return 0.5 * (self.Ix + self.Iy) + math.hypot(0.5 * (self.Ix - self.Iy), self.Ixy)

    @property
    def I_min(self) -> float:
        """Minor principal moment of inertia (``I_z`` of an angle)."""
        return 0.5 * (self.Ix + self.Iy) - math.hypot(0.5 * (self.Ix - self.Iy), self.Ixy)

    @property
    def r_min(self) -> float:
        """Least radius of gyration (``r_z`` of an angle)."""
        return math.sqrt(max(self.I_min, 0.0) / self.A)

    @property
    def theta_p(self) -> float:
        """Angle (degrees, CCW from x) of the major principal axis."""
        return math.degrees(0.5 * math.atan2(-2.0 * self.Ixy, self.Ix - self.Iy))

    # ----------------------------------------------------------- access
    def value(self, name: str) -> float:
        """Float value of a property (or a ratio such as ``"b/t"``) by name."""
        if name in self.ratios:
            return self.ratios[name]
        if name in UNITS and hasattr(self, name):
            v = getattr(self, name)
            if v is None:
                raise InputError(f"property {name!r}: not defined for {self.kind} {self.name!r}")
            return float(v)
        known = ", ".join(sorted([*UNITS, *self.ratios]))
        raise InputError(f"property {name!r}: unknown; expected one of {known}")

    def quantity(self, name: str) -> pint.Quantity:
        """Property as a pint quantity (ratios are dimensionless)."""
        v = self.value(name)
        return Q_(v, UNITS.get(name, ""))

    def as_dict(self, quantities: bool = False) -> dict[str, Any]:
        """All properties by name; floats in inch units, or pint quantities if asked."""
        names = [f.name for f in fields(self) if f.name in UNITS]
        names += [n for n in UNITS if n not in names]
        out: dict[str, Any] = {}
        for n in names:
            v = getattr(self, n)
            if v is None:
                continue
            out[n] = Q_(float(v), UNITS[n]) if quantities else float(v)
        for k, v in self.ratios.items():
            out[k] = Q_(v, "") if quantities else v
        return out


@dataclass
class PublishedProps(SectionProps):
    """Section properties as a published table gives them (catalog shapes).

    ``published`` holds the tabulated values by our names (``Sx``, ``rx``, ``rz`` ...); the
    derived properties (``Sx``, ``Sy``, ``rx``, ``ry``, ``r_min``, ``I_min``) return the tabulated
    value where the table has one instead of recomputing it, so a check prints the number a
    reviewer finds in the table. ``source`` names the table and its edition.
    """

    published: dict[str, float] = field(default_factory=dict)
    source: str = ""

    def _pub(self, name: str) -> float | None:
        return self.published.get(name)

    @property
    def Sx(self) -> float:
        """Elastic section modulus about x (tabulated: the smaller one)."""
        v = self._pub("Sx")
        return v if v is not None else min(self.Sx_top, self.Sx_bot)

    @property
    def Sy(self) -> float:
        """Elastic section modulus about y (tabulated: the smaller one)."""
        v = self._pub("Sy")
        return v if v is not None else min(self.Sy_left, self.Sy_right)

    @property
    def rx(self) -> float:
        """Radius of gyration about x (tabulated)."""
        v = self._pub("rx")
        return v if v is not None else math.sqrt(self.Ix / self.A)

    @property
    def ry(self) -> float:
        """Radius of gyration about y (tabulated)."""
        v = self._pub("ry")
        return v if v is not None else math.sqrt(self.Iy / self.A)

    @property
    def I_min(self) -> float:
        """Minor principal moment of inertia (tabulated ``I_z`` of an angle)."""
        v = self._pub("Iz")
        return v if v is not None else SectionProps.I_min.fget(self)  # type: ignore[attr-defined]

    @property
    def r_min(self) -> float:
        """Least radius of gyration (tabulated ``r_z`` of an angle, else the smaller of r_x, r_y)."""
        v = self._pub("rz")
        if v is not None:
            return v
        if self.Ixy == 0.0:
            return min(self.rx, self.ry)
        return math.sqrt(max(self.I_min, 0.0) / self.A)
