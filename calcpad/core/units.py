"""The one shared unit registry, unit-string parsing and display preferences.

Every module in calcpad uses :data:`ureg` from here; no second registry is ever made.
Unit strings from users (job files, widgets, formulas) go through :func:`parse_quantity`,
which checks the text against a character whitelist and rewrites the forms engineers
write by hand (``1-1/2 in``, ``5'-6"``) before pint's own expression parser sees it
(pint tokenises and evaluates its own grammar; Python's ``eval`` is never used).
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass, field
from decimal import ROUND_HALF_UP, Decimal
from typing import Any

import pint

from calcpad.core.errors import UnitInputError

__all__ = [
    "Q_",
    "DisplayPrefs",
    "Quantity",
    "UnitSystem",
    "as_quantity",
    "format_number",
    "kind_of",
    "parse_quantity",
    "parse_unit",
    "unit_symbol",
    "unit_system_of",
    "ureg",
]

ureg: pint.UnitRegistry = pint.UnitRegistry(
    autoconvert_offset_to_baseunit=True,
    cache_folder=":auto:",  # parsed definitions cached on disk: ~0.3 s faster start-up
)
ureg.formatter.default_sort_func = None  # keep kip·ft, not ft·kip
# Trade units that pint does not define (common practice).
ureg.define("psf = pound_force / foot ** 2")
ureg.define("ksf = kip / foot ** 2")
ureg.define("plf = pound_force / foot")
ureg.define("klf = kip / foot")
ureg.define("pcf = pound / foot ** 3")
ureg.define("kipf = kip")  # alias some engineers type

Q_ = ureg.Quantity
Quantity = pint.Quantity

_ALLOWED = re.compile(r"^[0-9A-Za-z_ .,+\-*/^()'\"µ°²³⁴·×]*$")
_MIXED = re.compile(r"(?<![\d.])(\d+)\s*-\s*(\d+)\s*/\s*(\d+)")
_FRACTION = re.compile(r"^\s*(\d+)\s*/\s*(\d+)")
_FEET_INCH = re.compile(r"""^\s*(-?\d+(?:\.\d+)?)\s*'\s*-?\s*(?:(\d+(?:\.\d+)?)\s*(?:"|in)?)?\s*$""")
_SUPERSCRIPT = str.maketrans({"²": "**2", "³": "**3", "⁴": "**4", "·": "*", "×": "*", "^": "**"})


def _normalise(text: str) -> str:
    text = text.strip().translate(_SUPERSCRIPT)
    text = text.replace("µ", "u").replace("°", " degree ")
    text = re.sub(r"\bkip-ft\b", "kip*ft", text)
    text = re.sub(r"\blb-ft\b|\blbf-ft\b", "lbf*ft", text)
    text = re.sub(r"\blb-in\b|\blbf-in\b", "lbf*in", text)
    text = re.sub(r"\bkip-in\b", "kip*in", text)
    # a bare "lb" as a force is what engineers mean in a load or moment
    text = re.sub(r"\blbs?\b", "lbf", text)
    return text


def parse_quantity(text: str | int | float, field_name: str = "value", expected: str | None = None) -> pint.Quantity:
    """Parse ``"84 in"``, ``"1-1/2 in"``, ``"36 ksi"``, ``"2.5 kN*m"``, ``5'-6"`` to a quantity.

    Args:
        text: The value with its unit, as written by the engineer. Numbers are dimensionless.
        field_name: Name used in error messages (the given, job field or widget).
        expected: Optional dimensionality the value must have, e.g. ``"[length]"`` or a unit
            string such as ``"in"`` whose dimension is required.

    Raises:
        UnitInputError: The text is not a value with a known unit, or has the wrong dimension.
    """
    if isinstance(text, bool):
        raise UnitInputError(f"{field_name}: got {text!r}; expected a number with a unit such as '84 in'")
    if isinstance(text, (int, float)):
        q = Q_(float(text), "")
    elif isinstance(text, pint.Quantity):
        q = text
    elif isinstance(text, str):
        q = _parse_text(text, field_name)
    else:
        raise UnitInputError(f"{field_name}: got {text!r} ({type(text).__name__}); expected a value with a unit such as '84 in'")
    if expected is not None:
        _require_dimension(q, expected, field_name, text)
    return q


def _parse_text(text: str, field_name: str) -> pint.Quantity:
    raw = text
    if not text.strip():
        raise UnitInputError(f"{field_name}: empty value; expected a number with a unit such as '84 in'")
    if len(text) > 200 or not _ALLOWED.match(text):
        raise UnitInputError(
            f"{field_name}: {raw!r} contains characters that are not part of a value with a unit; "
            "expected e.g. '84 in', '1-1/2 in', '36 ksi', '2.5 kN*m'"
        )
    feet = _FEET_INCH.match(text)
    if feet and "'" in text:
        ft = float(feet.group(1))
        inch = float(feet.group(2) or 0.0)
        sign = -1.0 if ft < 0 else 1.0
        return Q_(ft * 12.0 + sign * inch, "inch")
    if '"' in text or "'" in text:
        text = re.sub(r'(\d)\s*"', r"\1 in", text)
        text = re.sub(r"(\d)\s*'", r"\1 ft", text)
        if '"' in text or "'" in text:
            raise UnitInputError(f"{field_name}: {raw!r} is not a value with a unit; expected e.g. 5'-6\" or 66 in")
    if re.search(r"/\s*0+(?:\.0*)?(?![\d.])", text):
        raise UnitInputError(f"{field_name}: {raw!r} divides by zero; expected a value with a unit such as '3/4 in'")
    text = _MIXED.sub(lambda m: repr(int(m.group(1)) + int(m.group(2)) / int(m.group(3))), text)
    frac = _FRACTION.match(text)
    if frac:
        text = repr(int(frac.group(1)) / int(frac.group(2))) + text[frac.end() :]
    text = _normalise(text)
    if "__" in text:
        raise UnitInputError(f"{field_name}: {raw!r} is not a value with a unit")
    for m in re.finditer(r"\*\*\s*(\S*)", text):
        exp = re.match(r"-?\d+(?:\.\d+)?", m.group(1))
        if not exp or abs(float(exp.group())) > 12:
            raise UnitInputError(f"{field_name}: {raw!r}: a unit power must be a plain number such as in**4 or in^4")
    try:
        q = ureg.parse_expression(text)
    except (pint.errors.UndefinedUnitError, pint.errors.DefinitionSyntaxError) as exc:
        raise UnitInputError(f"{field_name}: {raw!r} has an unknown unit ({exc}); expected e.g. 'in', 'kip', 'ksi', 'kN*m'") from None
    except Exception as exc:  # pint's tokenizer raises several types for garbage
        raise UnitInputError(f"{field_name}: {raw!r} is not a value with a unit ({type(exc).__name__}); expected e.g. '84 in'") from None
    try:
        if not isinstance(q, pint.Quantity):
            q = Q_(float(q), "")
        finite = isinstance(q.magnitude, (int, float)) and math.isfinite(float(q.magnitude))
    except (ValueError, OverflowError, TypeError):
        finite = False
    if not finite:
        raise UnitInputError(f"{field_name}: {raw!r} is not a finite number with a unit")
    return Q_(float(q.magnitude), q.units)


def parse_unit(text: str, field_name: str = "unit") -> pint.Unit:
    """Parse a unit string (``"kip*ft"``, ``"in^4"``, ``"ksi"``) through the same safe path."""
    if text in ("", "1", None):
        return ureg.dimensionless
    q = _parse_text("1 " + text if not text.strip()[0].isdigit() else text, field_name)
    if abs(q.magnitude - 1.0) > 1e-12:
        raise UnitInputError(f"{field_name}: {text!r} is not a unit; expected e.g. 'in', 'kip*ft', 'ksi'")
    return q.units


def _require_dimension(q: pint.Quantity, expected: str, field_name: str, raw: Any) -> None:
    if expected.startswith("["):
        want = ureg.get_dimensionality(expected)
        label = expected
    else:
        want = parse_unit(expected, field_name).dimensionality
        label = f"a {kind_of(want)} like '{expected}'"
    if q.dimensionality != want:
        raise UnitInputError(f"{field_name}: {raw!r} is a {kind_of(q.dimensionality)}; expected {label}")


def as_quantity(value: Any, field_name: str = "value") -> pint.Quantity:
    """Return ``value`` as a pint quantity (strings parsed safely, numbers dimensionless)."""
    return parse_quantity(value, field_name)


# --------------------------------------------------------------------------- display


class UnitSystem:
    """Names of the two display systems."""

    US = "US"
    SI = "SI"


def _dim(unit: str) -> Any:
    return ureg.parse_units(unit).dimensionality


@functools.lru_cache(maxsize=1)
def _kind_table() -> dict[Any, str]:
    table = {
        _dim("in"): "length",
        _dim("lbf"): "force",
        _dim("lbf*in"): "moment",
        _dim("psi"): "stress",
        _dim("in**2"): "area",
        _dim("in**3"): "section modulus",
        _dim("in**4"): "moment of inertia",
        _dim("in**6"): "warping constant",
        _dim("lbf/in"): "force per length",
        _dim("lb/ft**3"): "density",
        _dim("lb/ft"): "mass per length",
        _dim("lb"): "mass",
        _dim("mph"): "speed",
        _dim("s"): "time",
        _dim("1/in"): "curvature",
    }
    return table


def kind_of(dimensionality: Any) -> str:
    """Name the quantity kind of a dimensionality ('length', 'stress', ...) for messages."""
    table = _kind_table()
    if dimensionality in table:
        return table[dimensionality]
    if not dimensionality:
        return "dimensionless number"
    return f"quantity of dimension {dimensionality}"


# Ladders: (unit, use while |value| < limit in this unit's base magnitude or None = last)
_US_LADDERS: dict[str, list[tuple[str, float | None]]] = {
    "length": [("in", None)],
    "force": [("lbf", 1000.0), ("kip", None)],
    "moment": [("lbf*in", 12000.0), ("kip*ft", None)],
    "stress": [("psf", 144.0), ("psi", 1000.0), ("ksi", None)],  # < 1 psi reads as a load in psf
    "area": [("in**2", None)],
    "section modulus": [("in**3", None)],
    "moment of inertia": [("in**4", None)],
    "warping constant": [("in**6", None)],
    "force per length": [("plf", 1000.0), ("klf", None)],
    "density": [("pcf", None)],
    "mass per length": [("lb/ft", None)],
    "mass": [("lb", None)],
    "speed": [("mph", None)],
    "curvature": [("1/in", None)],
}
_SI_LADDERS: dict[str, list[tuple[str, float | None]]] = {
    "length": [("mm", None)],
    "force": [("N", 1000.0), ("kN", None)],
    "moment": [("N*m", 1000.0), ("kN*m", None)],
    "stress": [("Pa", 1000.0), ("kPa", 1000.0), ("MPa", None)],  # 250 MPa, not 250,000 kPa
    "area": [("mm**2", None)],
    "section modulus": [("mm**3", None)],
    "moment of inertia": [("mm**4", None)],
    "warping constant": [("mm**6", None)],
    "force per length": [("N/m", 1000.0), ("kN/m", None)],
    "density": [("kg/m**3", None)],
    "mass per length": [("kg/m", None)],
    "mass": [("kg", None)],
    "speed": [("m/s", None)],
    "curvature": [("1/mm", None)],
}


_US_UNIT_NAMES = frozenset({
    "inch", "foot", "yard", "mile", "force_pound", "pound_force", "kip", "kipf", "pound", "kip_per_square_inch",
    "pound_force_per_square_inch", "psf", "ksf", "plf", "klf", "pcf", "mile_per_hour",
})
_SI_UNIT_NAMES = frozenset({"meter", "newton", "pascal", "gram", "tonne", "metric_ton", "kilometer_per_hour"})


def unit_system_of(unit: pint.Unit | str) -> str | None:
    """``"US"`` or ``"SI"`` when every part of ``unit`` belongs to that system, else None.

    Units of neither (degree, second, plain numbers) or of both give None.
    """
    if isinstance(unit, str):
        unit = ureg.parse_units(unit)
    found = set()
    for name in unit._units:
        base = ureg.parse_unit_name(name)
        base_name = base[0][1] if base else name
        if base_name in _US_UNIT_NAMES:
            found.add(UnitSystem.US)
        elif base_name in _SI_UNIT_NAMES:
            found.add(UnitSystem.SI)
    return found.pop() if len(found) == 1 else None


@dataclass
class DisplayPrefs:
    """How results are shown: unit system, significant figures and per-kind overrides.

    ``overrides`` maps a quantity kind ("moment", "stress", ...) to a fixed display unit.
    """

    system: str = UnitSystem.US
    sig: int = 4
    overrides: dict[str, str] = field(default_factory=dict)

    def __post_init__(self) -> None:
        if self.system not in (UnitSystem.US, UnitSystem.SI):
            raise UnitInputError(f"unit system: {self.system!r}; expected 'US' or 'SI'")
        if not isinstance(self.sig, int) or not 1 <= self.sig <= 15:
            raise UnitInputError(f"significant figures: {self.sig!r}; expected a whole number from 1 to 15")

    def shown_unit(self, q: pint.Quantity, unit: str | None) -> pint.Unit | str:
        """The unit to show ``q`` in: ``unit`` as asked, unless it belongs to the other unit
        system (a template written in US units on an SI sheet), then this system's choice."""
        if unit is None:
            return self.unit_for(q)
        other = unit_system_of(unit)
        if (other is not None and other != self.system and _kind_table().get(q.dimensionality) is not None
                and ureg.parse_units(unit).dimensionality == q.dimensionality):
            return self.unit_for(q)
        return unit  # a unit of the wrong dimension fails where it is applied, with its message

    def unit_for(self, q: pint.Quantity) -> pint.Unit:
        """Pick the display unit for a quantity by its kind and size."""
        dim = q.dimensionality
        kind = _kind_table().get(dim)
        if kind is None:
            if not dim:  # keep angles and percentages as given; plain numbers have no unit
                return q.units if str(q.units) in ("percent", "degree", "radian") else ureg.dimensionless
            return q.units
        if kind in self.overrides:
            return ureg.parse_units(self.overrides[kind])
        ladder = (_US_LADDERS if self.system == UnitSystem.US else _SI_LADDERS)[kind]
        for unit, limit in ladder:
            if limit is None:
                return ureg.parse_units(unit)
            try:
                size = float(abs(q.to(unit).magnitude))
            except TypeError:  # an array: choose by its largest entry
                import numpy as np

                size = float(np.max(np.abs(q.to(unit).magnitude)))
            if size < limit:
                return ureg.parse_units(unit)
        return ureg.parse_units(ladder[-1][0])


def unit_symbol(unit: pint.Unit | str, style: str = "text") -> str:
    """Abbreviated unit in the author's order: ``kip·ft``, ``in⁴`` (text), ``kip \\cdot ft`` (latex).

    ``style`` is one of ``"text"`` (Unicode), ``"ascii"``, ``"latex"``.
    """
    if isinstance(unit, str):
        unit = ureg.parse_units(unit)
    parts: list[tuple[str, float]] = []
    for name, power in unit._units.items():
        parts.append((ureg.get_symbol(name), power))
    if not parts:
        return ""
    num = [(s, p) for s, p in parts if p > 0]
    den = [(s, -p) for s, p in parts if p < 0]
    sup = str.maketrans("0123456789-.", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻·")

    def one(sym: str, p: float) -> str:
        sym = {"lbf": "lbf", "degree": "°", "delta_degF": "°F", "percent": "%", "u": "µ"}.get(sym, sym)
        if sym.startswith("u") and len(sym) > 1 and style != "ascii" and sym[1:] in ("m", "s"):
            sym = "µ" + sym[1:]
        p_txt = f"{p:g}"
        if p == 1:
            return rf"\mathrm{{{sym}}}" if style == "latex" else sym
        if style == "latex":
            return rf"\mathrm{{{sym}}}^{{{p_txt}}}"
        if style == "ascii":
            return f"{sym}^{p_txt}"
        return sym + p_txt.translate(sup)

    joiner = {"latex": r" \cdot ", "ascii": "*", "text": "·"}[style]
    top = joiner.join(one(s, p) for s, p in num) or "1"
    if not den:
        return top
    bottom = joiner.join(one(s, p) for s, p in den)
    if len(den) > 1:
        bottom = f"({bottom})"
    return f"{top}/{bottom}"


def _round_sig(x: float, sig: int) -> float:
    """Round half away from zero to ``sig`` significant figures (1234.5 → 1235, not 1234)."""
    d = Decimal(repr(x))
    exp = d.adjusted() - sig + 1
    return float(d.quantize(Decimal(1).scaleb(exp), rounding=ROUND_HALF_UP))


def format_number(x: float, sig: int = 4, style: str = "text") -> str:
    """Format with engineering significant figures and thousands separators.

    ``21000`` → ``21,000``; ``1.75`` → ``1.750``; ``0.09375`` → ``0.09375``; values at or above
    1e9 or below 1e-4 use powers of ten. ``sig=0`` means "as entered": up to six figures
    without trailing zeros, the way typed givens are shown; a negative ``sig`` means up to
    ``-sig`` figures without trailing zeros (values a template computed and passed as givens).
    """
    if x is None or (isinstance(x, float) and math.isnan(x)):
        return "—"
    x = float(x)
    if math.isinf(x):
        return "∞" if x > 0 else "−∞"
    if x == 0:
        return "0"
    exponent = math.floor(math.log10(abs(x)))
    limit = -sig if sig < 0 else 0  # "up to -sig figures, no padding zeros"
    if limit:
        sig = 0
    if exponent >= 9 or exponent < -4:
        sig = sig or limit or 4
        mant = x / 10**exponent
        m = f"{mant:.{max(sig - 1, 0)}f}"
        if float(m) >= 10:  # rounding pushed the mantissa to 10
            exponent += 1
            m = f"{x / 10**exponent:.{max(sig - 1, 0)}f}"
        if style == "latex":
            return rf"{m} \times 10^{{{exponent}}}"
        sup = str.maketrans("0123456789-", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻")
        return f"{m}×10{str(exponent).translate(sup)}" if style == "text" else f"{m}e{exponent}"
    strip = sig == 0  # "as entered": up to 6 figures, no trailing zeros (used for givens)
    if strip:
        sig = limit or 6
    rounded = _round_sig(x, sig)
    exponent = math.floor(math.log10(abs(rounded))) if rounded != 0 else 0
    decimals = max(sig - 1 - exponent, 0)
    text = f"{rounded:,.{decimals}f}"
    if strip and "." in text:
        text = text.rstrip("0").rstrip(".")
    if style == "latex":
        text = text.replace(",", "{,}")
    if text.startswith("-"):
        text = ("-" if style in ("latex", "ascii") else "−") + text[1:]
    return text
