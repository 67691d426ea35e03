"""The shared unit registry (made in :mod:`calcpad.core.registry`), value parsing and display.

Every module in calcpad uses :data:`ureg` from here; no second registry is ever made.
Text from users (job files, ``--set``, the what-if panel, ``Sheet.given``, template ranges)
goes through :func:`parse_quantity` / :func:`parse_unit`, which read it with the grammar of
:mod:`calcpad.core.value_text` (never an expression evaluator, never pint's string parser).
"""

from __future__ import annotations

import functools
import math
import numbers
from dataclasses import dataclass, field
from decimal import ROUND_HALF_UP, Decimal
from typing import Any

import numpy as np
import pint

from calcpad.core.errors import UnitInputError
from calcpad.core.registry import Q_, Quantity, copy_quantity, ureg
from calcpad.core.value_text import ACCEPTED_FORMS, read_unit, read_value

__all__ = [
    "ACCEPTED_FORMS",
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


def parse_quantity(text: Any, field_name: str = "value", expected: str | None = None) -> pint.Quantity:
    """Read ``"84 in"``, ``"1-1/2 in"``, ``"3'-6 1/2\""``, ``"1,200 lbf"``, ``"2.5 kip*ft"`` as a quantity.

    Args:
        text: The value with its unit as written (see :mod:`calcpad.core.value_text` for the
            forms), a number (dimensionless) or a pint quantity. Non-finite numbers are refused.
        field_name: Name used in error messages (the given, job field or widget).
        expected: Optional dimensionality the value must have, e.g. ``"[length]"`` or a unit
            string such as ``"in"`` whose dimension is required.

    Raises:
        UnitInputError: The text is not a value with a known unit, is not finite, or has the
            wrong dimension.
    """
    if isinstance(text, bool):
        raise UnitInputError(f"{field_name}: got {text!r}; expected a number with a unit such as '84 in'")
    if isinstance(text, numbers.Real):
        q = Q_(_finite(text, field_name), "")
    elif isinstance(text, pint.Quantity):
        q = text
        _check_finite_quantity(q, field_name)
    elif isinstance(text, str):
        q = _read_text(text, field_name)
    else:
        raise UnitInputError(f"{field_name}: got {text!r} ({type(text).__name__}); expected a value with a unit such as '84 in'")
    if expected is not None:
        _require_dimension(q, expected, field_name, text)
    return q


#: Value text -> its quantity, successes only (a refusal names the field of each call). A copy is
#: handed out: a Quantity is mutable (``ito``). Bounded: cleared when full.
_READ: dict[str, pint.Quantity] = {}
_READ_MAX = 4_096


def _read_text(text: str, field_name: str) -> pint.Quantity:
    """:func:`~calcpad.core.value_text.read_value` of ``text``, read once per text (see :data:`_READ`)."""
    hit = _READ.get(text)
    if hit is None:
        hit = read_value(text, field_name)
        if len(_READ) >= _READ_MAX:
            _READ.clear()
        _READ[text] = hit
    return copy_quantity(hit)


def _finite(x: numbers.Real, field_name: str) -> float:
    try:
        v = float(x)
    except (OverflowError, ValueError):
        v = math.inf
    if not math.isfinite(v):
        raise UnitInputError(f"{field_name}: {x!r} is not a finite number; expected a value such as '84 in' or 0.85")
    return v


def _check_finite_quantity(q: pint.Quantity, field_name: str) -> None:
    try:
        finite = bool(np.all(np.isfinite(np.asarray(q.magnitude, dtype=float))))
    except (TypeError, ValueError):
        return  # not numeric: fails where it is used
    if not finite:
        raise UnitInputError(f"{field_name}: {q!r} is not finite; expected a value such as '84 in'")


def parse_unit(text: str | None, field_name: str = "unit") -> pint.Unit:
    """Read a unit string (``"kip*ft"``, ``"kip-ft"``, ``"in^4"``, ``"ksi"``, ``"1/in"``) with the same grammar."""
    if text is None:
        return ureg.dimensionless
    if not isinstance(text, str):
        raise UnitInputError(f"{field_name}: {text!r}; expected a unit string such as 'in', 'kip*ft', 'ksi'")
    unit = _UNITS_READ.get(text)
    if unit is None:  # a refused text raises here every time, naming this call's field
        unit = read_unit(text, field_name)
        if len(_UNITS_READ) < _CACHE_LIMIT:
            _UNITS_READ[text] = unit
    return unit


#: Units read from text, by the exact text (a template asks for the same few units thousands of
#: times in a batch). Only successful reads are kept; pint units are immutable.
_UNITS_READ: dict[str, pint.Unit] = {}
#: Symbols of units by (units, style): pint's symbol lookup is slow and the same units recur.
_SYMBOLS: dict[tuple[Any, str], str] = {}
_CACHE_LIMIT = 4096


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
    return _system_of(unit._units)


@functools.lru_cache(maxsize=1024)
def _system_of(units: Any) -> str | None:
    """:func:`unit_system_of` by the unit's items (a shown value asks it for every result)."""
    found = set()
    for name in units:
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

    def shown_unit(self, q: pint.Quantity, unit: pint.Unit | str | None) -> pint.Unit | str:
        """The unit to show ``q`` in: ``unit`` as asked, unless it belongs to the other unit
        system (a template written in US units on an SI sheet), then this system's choice.

        A string is a unit written in code (pint's reading); text from users arrives already
        read by :func:`parse_unit` as a :class:`pint.Unit`."""
        if unit is None:
            return self.unit_for(q)
        asked = unit if isinstance(unit, pint.Unit) else ureg.parse_units(unit)
        other = unit_system_of(asked)
        if (other is not None and other != self.system and _kind_table().get(q.dimensionality) is not None
                and asked.dimensionality == q.dimensionality):
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


def unit_symbol(unit: pint.Unit | pint.Quantity | str, style: str = "text") -> str:
    """Abbreviated unit in the author's order: ``kip·ft``, ``in⁴`` (text), ``kip \\cdot ft`` (latex).

    ``unit`` may be a quantity (its units). ``style`` is one of ``"text"`` (Unicode), ``"ascii"``, ``"latex"``.
    """
    # the key keeps the units' order: kip·ft and ft·kip are equal units printed differently
    key = (unit if isinstance(unit, str) else tuple(unit._units.items()), style)
    cached = _SYMBOLS.get(key)
    if cached is None:
        units = ureg.parse_units(unit) if isinstance(unit, str) else unit
        cached = _unit_symbol(tuple(units._units.items()), style)
        if len(_SYMBOLS) < _CACHE_LIMIT:
            _SYMBOLS[key] = cached
    return cached


@functools.lru_cache(maxsize=4096)
def _unit_symbol(units: tuple[tuple[str, float], ...], style: str) -> str:
    """:func:`unit_symbol` of a unit's (name, power) pairs in the author's order (the key keeps
    the order: pint's containers compare equal in any order). Printing a sheet asks for the same
    few units thousands of times and pint's symbol lookup parses the name each time (a quarter
    of the printing time before this cache)."""
    parts: list[tuple[str, float]] = []
    for name, power in units:
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
