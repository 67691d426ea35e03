"""Shared machinery of the member checks: errors, name suffixes, shared givens, φ/Ω steps.

Every check writes its steps through a :class:`Calc`, which

* appends the member suffix to each name (``P_n`` -> ``P_n_2`` with ``suffix="2"``);
* rewrites the identifiers of formula strings to the suffixed names;
* adds givens once: a given already on the sheet with the same value is reused (so several
  checks of one member share ``F_y``, ``A``, ...), a clash raises :class:`CheckInputError`;
* accepts the *name* of an existing sheet value in place of a value (``P="P_u"``), so a demand
  computed earlier on the sheet flows into the check and stays live under ``sh.set``.
"""

from __future__ import annotations

import math
import re
import warnings
from collections.abc import Mapping, Sequence
from typing import Any

import pint

from calcpad.core.errors import InputError, NotCoveredError
from calcpad.core.names import is_valid_name
from calcpad.core.sheet import Sheet
from calcpad.core.units import Q_, parse_quantity
from calcpad.eng.sections.shop import note_shop_section

__all__ = ["RESISTANCE", "Calc", "CheckInputError", "CheckNotCoveredError", "CheckWarning"]

#: Resistance factor φ and safety factor Ω per limit state (AISC 360-16, clause of each).
RESISTANCE: dict[str, tuple[float, float, str]] = {
    "tension_yield": (0.90, 1.67, "AISC 360-16 D2(a)"),
    "tension_rupture": (0.75, 2.00, "AISC 360-16 D2(b)"),
    "compression": (0.90, 1.67, "AISC 360-16 E1"),
    "flexure": (0.90, 1.67, "AISC 360-16 F1"),
    "shear": (0.90, 1.67, "AISC 360-16 G1"),
    "weld": (0.75, 2.00, "AISC 360-16 J2.4, Table J2.5"),
}

_IDENT = re.compile(r"\b[A-Za-z][A-Za-z0-9_]*\b")
_SUFFIX = re.compile(r"^[A-Za-z0-9]+$")


class CheckInputError(InputError):
    """A check input is out of range. Carries ``field``, ``value`` and ``expected``."""

    def __init__(self, field: str, value: Any, expected: str) -> None:
        self.field, self.value, self.expected = field, value, expected
        shown = f"{value:~}" if isinstance(value, pint.Quantity) else repr(value)
        super().__init__(f"{field}: got {shown}; expected {expected}")


class CheckNotCoveredError(NotCoveredError):
    """A shape / limit state the checks do not cover. Carries ``field``, ``value``, ``expected``."""

    def __init__(self, field: str, value: Any, expected: str) -> None:
        self.field, self.value, self.expected = field, value, expected
        super().__init__(f"{field}: {value!r} is not covered by this check; {expected}")


class CheckWarning(UserWarning):
    """An input is outside the usual range (the sheet also gets a note saying so)."""


def warn(sh: Sheet, text: str) -> None:
    """Put a caution on the sheet and raise a :class:`CheckWarning`."""
    sh.note("Caution: " + text)
    warnings.warn(text, CheckWarning, stacklevel=3)


class Calc:
    """Writes one check's steps on a sheet (see module docstring).

    Args:
        sh: The sheet to write on.
        suffix: Letters/digits appended (after ``_``) to every name this check defines.
        tag: Letters/digits appended to the names of steps and section values only (not to
            shared inputs such as ``F_y``), e.g. ``"y"`` for minor-axis flexure.
    """

    def __init__(self, sh: Sheet, suffix: str = "", tag: str = "") -> None:
        if not isinstance(sh, Sheet):
            raise CheckInputError("sh", type(sh).__name__, "a calcpad Sheet")
        if not isinstance(suffix, str) or (suffix and not _SUFFIX.match(suffix)):
            raise CheckInputError("suffix", suffix, "letters and digits only, e.g. '2' or 'top' (or '')")
        if not isinstance(tag, str) or (tag and not _SUFFIX.match(tag)):
            raise CheckInputError("tag", tag, "letters and digits only (or '')")
        self.sh = sh
        self.suffix = suffix
        self.tag = tag
        self.names: dict[str, str] = {}

    @property
    def lrfd(self) -> bool:
        """True when the sheet's method is LRFD."""
        return self.sh.method == "LRFD"

    # ----------------------------------------------------------- names
    def name(self, base: str, shared: bool = False) -> str:
        """The sheet name for ``base`` (already mapped, or base + tag + suffix)."""
        if base in self.names:
            return self.names[base]
        parts = [base] + ([] if shared or not self.tag else [self.tag]) + ([self.suffix] if self.suffix else [])
        return "_".join(parts)

    def f(self, formula: str) -> str:
        """Rewrite the identifiers of a formula to sheet names."""
        return _IDENT.sub(lambda m: self.names.get(m.group(0), m.group(0)), formula)

    def has(self, base: str) -> bool:
        """True when ``base`` has been written (or linked) by this check."""
        return base in self.names

    # ----------------------------------------------------------- givens
    def given(
        self,
        base: str,
        value: Any,
        description: str,
        source: str = "",
        *,
        dim: str | None = None,
        positive: bool = True,
        allow_zero: bool = False,
        allow_negative: bool = False,
        sig: int | None = None,
        sign_hint: str = "",
        shared: bool = False,
    ) -> pint.Quantity:
        """Add (or reuse, or link) an input; return its current value.

        ``value`` may be a value with unit, a pint quantity, a number, or the name of a value
        already on the sheet. ``dim`` is the required dimension (``"[length]"``, ``"ksi"`` ...).
        """
        sh = self.sh
        if isinstance(value, str) and is_valid_name(value) and value in sh:
            q = sh[value]
            self._dimension(base, value, q, dim)
            mag = float(q.magnitude)
            if not allow_negative and (mag < 0 or (mag == 0 and positive and not allow_zero)):
                hint = f" ({sign_hint})" if sign_hint else ""
                raise CheckInputError(base, f"{value} = {q:~}", f"a {'non-negative' if allow_zero else 'positive'} value{hint}")
            self.names[base] = value
            return q
        if value is None:
            raise CheckInputError(base, value, f"{description.lower()} ({dim or 'a number'})")
        q = parse_quantity(value, base, expected=dim)
        self._dimension(base, value, q, dim)
        mag = q.magnitude
        if not isinstance(mag, (int, float)) or not math.isfinite(float(mag)):
            raise CheckInputError(base, value, "a single finite value")
        if not allow_negative:
            if mag < 0 or (mag == 0 and positive and not allow_zero):
                word = "negative" if mag < 0 else "zero"
                hint = f" ({sign_hint})" if sign_hint else ""
                raise CheckInputError(base, value, f"a {'non-negative' if allow_zero else 'positive'} value, not {word}{hint}")
        name = self.name(base, shared)
        if name in sh:
            old = sh[name]
            same = old.dimensionality == q.dimensionality and math.isclose(
                float(old.to(q.units).magnitude), float(mag), rel_tol=1e-12, abs_tol=0.0
            )
            if not same:
                raise CheckInputError(
                    base, value, f"the value {name!r} already has on this sheet ({old:~}); give each member its own suffix="
                )
        else:
            sh.given(name, q, description, source, sig=sig)
        self.names[base] = name
        return q

    @staticmethod
    def _dimension(base: str, value: Any, q: pint.Quantity, dim: str | None) -> None:
        if dim is None:
            return
        if dim == "":
            if not q.dimensionless:
                raise CheckInputError(base, value, "a plain number")
            return
        parse_quantity(q, base, expected=dim)

    def prop(self, base: str, value: float, unit: str, description: str, source: Any, *, shared: bool = False) -> None:
        """Add a section property (float in ``unit``), shown to 4 significant figures in the
        sheet's unit system. ``source`` is a label, or the section (a ``Sec``): its label is
        shown, and a section whose properties come from a published table gets one reference
        line naming the table on the sheet."""
        label = source
        cite = ""
        if hasattr(source, "label") and hasattr(source, "cite"):
            label, cite = source.label, source.cite
        self.given(base, self.in_system(value, unit) if unit else float(value), description, label, sig=4, shared=shared)
        if cite:
            text = f"{label}: section properties as tabulated in the {cite}"
            if not any(getattr(s, "text", None) == text for s in self.sh.steps):
                self.sh.reference(text)
        if caveat := getattr(source, "caveat", ""):
            text = f"{label}: {caveat}"
            if not any(getattr(s, "text", None) == text for s in self.sh.steps):
                self.sh.note(text)
        note_shop_section(self.sh, label)

    def in_system(self, value: float, unit: str) -> str | pint.Quantity:
        """A catalog value (not one the engineer typed) in the sheet's unit system: as
        ``"value unit"`` when ``unit`` already belongs to it, else converted."""
        q = Q_(value, unit)
        shown = self.sh.prefs.shown_unit(q, unit)
        return f"{value!r} {unit}" if shown == unit else q.to(shown)

    def catalog_given(self, base: str, value: float, unit: str, description: str, source: str) -> None:
        """A material value from a catalog, shown as entered in its own system, else to 4 figures."""
        v = self.in_system(value, unit)
        self.given(base, v, description, source, dim=unit, sig=None if isinstance(v, str) else 4, shared=True)

    # ----------------------------------------------------------- steps
    def step(self, base: str, formula: str, description: str = "", *, unit: str | None = None, ref: str = "", sig: int | None = None,
             quiet: bool = False) -> str:
        """Add ``base = formula``; returns the sheet name (``quiet`` as in :meth:`Sheet.step`)."""
        name = self.name(base)
        text = self.f(formula)
        self.sh.step(name, text, description, unit=unit, ref=ref, sig=sig, quiet=quiet)
        self.names[base] = name
        return name

    def step_once(self, base: str, formula: str, description: str = "", *, unit: str | None = None, ref: str = "") -> str:
        """As :meth:`step`, but reuse the value when another check on the sheet already wrote it
        (e.g. ``C_w`` of a W-shape, needed by both E4 and F2)."""
        name = self.name(base)
        if name in self.sh:
            self.names[base] = name
            return name
        return self.step(base, formula, description, unit=unit, ref=ref)

    def branch(
        self,
        base: str,
        cases: Sequence[tuple[str | None, str, str]],
        description: str = "",
        *,
        unit: str | None = None,
        ref: str = "",
        words: bool = False,
    ) -> str:
        """Add a branch step (conditions and formulas in base names); ``words`` as in
        :meth:`Sheet.branch`."""
        name = self.name(base)
        built = [(self.f(c) if c is not None else None, self.f(formula), label) for c, formula, label in cases]
        self.sh.branch(name, built, description, unit=unit, ref=ref, words=words)
        self.names[base] = name
        return name

    def select(self, base: str, mode: str, candidates: Mapping[str, str], description: str = "", *, unit: str | None = None, ref: str = "") -> str:
        """Add a min/max selection over base names."""
        name = self.name(base)
        self.sh.select(name, mode, {self.name(c): label for c, label in candidates.items()}, description, unit=unit, ref=ref)
        self.names[base] = name
        return name

    def check(self, title: str, demand: str, capacity: str, *, key: str, ref: str = "", required_fs: float | None = None,
              show_fs: bool | None = None, flags: Sequence[tuple[str, float, str]] = ()) -> str:
        """Add a check of two base names under the ratio name ``key`` (+ tag/suffix); returns the key.
        ``flags`` are ``(base name, above, status)`` (see :meth:`Sheet.check`)."""
        full = f"{title} [{self.suffix}]" if self.suffix else title
        k = self.name(key)
        if k in self.sh:
            raise CheckInputError("suffix", self.suffix, f"a suffix not yet used on this sheet ({k!r} exists); give each member its own suffix=")
        return self.sh.check(full, self.name(demand), self.name(capacity), ref=ref, required_fs=required_fs, show_fs=show_fs, key=k,
                             flags=[(self.name(n), above, status) for n, above, status in flags])

    # ----------------------------------------------------------- φ / Ω
    def available(self, avail: str, nominal: str, kind: str, sub: str, description: str, *, unit: str | None = None) -> str:
        """Add φ or Ω (per the sheet's method) and ``avail = φ·nominal`` or ``nominal/Ω``."""
        phi, omega, ref = RESISTANCE[kind]
        return self.available_with(avail, nominal, phi, omega, ref, sub, description, unit=unit)

    def available_with(self, avail: str, nominal: str, phi: float, omega: float, ref: str, sub: str, description: str,
                       *, unit: str | None = None) -> str:
        """As :meth:`available` with explicit φ, Ω and clause."""
        if self.lrfd:
            self.given(f"phi_{sub}", phi, f"Resistance factor ({description.lower()})", ref, dim="", shared=True)
            return self.step(avail, f"phi_{sub}*{nominal}", f"{description}, LRFD", unit=unit, ref=ref)
        self.given(f"Omega_{sub}", omega, f"Safety factor ({description.lower()})", ref, dim="", shared=True)
        return self.step(avail, f"{nominal}/Omega_{sub}", f"{description}, ASD", unit=unit, ref=ref)

    def value(self, base: str, unit: str | None = None) -> float:
        """Current value of a written name as a float (in ``unit`` if given)."""
        q = self.sh[self.name(base)]
        return float(q.to(unit).magnitude if unit else q.to("").magnitude)


def as_float(q: pint.Quantity, unit: str) -> float:
    """Magnitude of ``q`` in ``unit``."""
    return float(q.to(unit).magnitude)


def add_material(c: Calc, material: Any = None, F_y: Any = None, E: Any = None, F_u: Any = None, *, need_fu: bool = False,
                 need_e: bool = True, G: Any = None, need_g: bool = False) -> None:
    """Add ``F_y`` and ``E`` (and ``F_u``, ``G``) from a Material / catalog name, or as given."""
    src = ""
    cat: dict[str, float] = {}
    if material is not None:
        from calcpad.eng.materials import get_material  # same layer (eng); lazy to keep import light

        m = material if hasattr(material, "Fy") else get_material(material)
        src = m.name
        cat = {"F_y": m.Fy, "E": m.E, "F_u": m.Fu, "G": m.G}
    else:
        cat = {"E": 29000.0, "G": 11200.0}
        if F_y is None:
            raise CheckInputError("F_y", None, "a yield stress such as '50 ksi', or material='ASTM A992'")
    typed = {"F_y": F_y, "E": E, "F_u": F_u, "G": G}
    wanted = [("F_y", "Specified minimum yield stress", True), ("E", "Modulus of elasticity", need_e),
              ("F_u", "Specified minimum tensile strength", need_fu), ("G", "Shear modulus of elasticity", need_g)]
    default_src = {"E": "AISC 360-16 (E = 29,000 ksi)", "G": "AISC 360-16 (G = 11,200 ksi)"}
    for base, description, needed in wanted:
        if not needed:
            continue
        if typed[base] is not None:
            c.given(base, typed[base], description, src, dim="ksi", shared=True)
        elif base in cat:
            c.catalog_given(base, cat[base], "ksi", description, src or default_src.get(base, ""))
        else:
            raise CheckInputError(base, None, "a tensile strength such as '65 ksi', or material='ASTM A992'")


def add_props(c: Calc, sec: Any, names: Mapping[str, str] | Sequence[str], check: str) -> None:
    """Add section properties as givens. ``names`` maps sheet base name -> property name."""
    from calcpad.eng.checks._section import PROPS

    pairs = dict(names) if isinstance(names, Mapping) else {n: n for n in names}
    for base, prop in pairs.items():
        unit, desc = PROPS[prop]
        c.prop(base, sec.need(prop, check), unit, desc, sec.label)


def check_length(c: Calc, base: str, value: Any, description: str) -> pint.Quantity:
    """Add a length given that must be > 0 (unbraced length, span ...)."""
    return c.given(base, value, description, dim="[length]", sign_hint="a length measured along the member, > 0")


def check_k(c: Calc, K: Any) -> float:
    """Add the effective length factor; warn when outside 0.5 .. 2.5."""
    q = c.given("K", K, "Effective length factor", "AISC 360-16 Appendix 7 / Commentary Table C-A-7.1", dim="")
    k = float(q.magnitude)
    if not 0.5 <= k <= 2.5:
        warn(c.sh, f"K = {k:g} is outside the usual range 0.5 to 2.5 (Commentary Table C-A-7.1); confirm the end conditions")
    return k
