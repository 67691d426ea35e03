"""Basic load combinations, ASCE 7-16 Sec. 2.3 (strength design, LRFD) and Sec. 2.4 (allowable
stress design, ASD), applied to load effects (member forces, reactions: scalars or arrays).

Load names: ``D`` dead, ``L`` live, ``Lr`` roof live, ``S`` snow, ``R`` rain, ``W`` wind,
``E`` seismic. With ``S_DS`` given, ``E`` is the horizontal seismic load effect E_h and the
vertical effect E_v = 0.2 S_DS D (ASCE 7-16 Sec. 12.4.2.2) is folded into the factor on D of the
seismic combinations of Sec. 2.3.6 (comb. 6, 7) and Sec. 2.4.5 (comb. 8, 9, 10). Without it ``E``
is taken as the seismic effect already combined by the user, and those combinations say so.

Combinations are expanded for each roof load actually present ("Lr or S or R"), and, when
``wind_reversal`` is on, for wind acting in both directions (+W and -W).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from calcpad.core.errors import InputError
from calcpad.eng.analysis._values import to_array

__all__ = ["LOAD_NAMES", "Combination", "CombinationResult", "add_governing_effect", "basic_combinations", "combine"]

LOAD_NAMES = ("D", "L", "Lr", "S", "R", "W", "E")
_ROOF = ("Lr", "S", "R")


@dataclass(frozen=True)
class Combination:
    """One load combination: a name, factors by load name and its code reference."""

    name: str
    factors: dict[str, float]
    ref: str

    def label(self) -> str:
        """Text such as ``1.2D + 1.6L + 0.5S``."""
        parts = []
        for k, f in self.factors.items():
            if f == 0:
                continue
            sign = "-" if f < 0 else "+"
            mag = abs(f)
            txt = f"{k}" if mag == 1 else f"{mag:g}{k}"
            parts.append((sign, txt))
        if not parts:
            return "0"
        out = ("-" if parts[0][0] == "-" else "") + parts[0][1]
        for sign, txt in parts[1:]:
            out += f" {sign} {txt}"
        return out


def _lrfd(roof: list[str], live_half: bool, sds: float | None) -> list[tuple[str, dict[str, float], str]]:
    ref = "ASCE 7-16 Sec. 2.3.1"
    fl = 0.5 if live_half else 1.0
    out: list[tuple[str, dict[str, float], str]] = [("LC1", {"D": 1.4}, f"{ref} comb. 1")]
    for r in roof or [None]:
        d = {"D": 1.2, "L": 1.6}
        if r:
            d[r] = 0.5
        out.append((f"LC2{r or ''}", d, f"{ref} comb. 2"))
    for r in roof:
        out.append((f"LC3{r}-L", {"D": 1.2, r: 1.6, "L": fl}, f"{ref} comb. 3"))
        out.append((f"LC3{r}-W", {"D": 1.2, r: 1.6, "W": 0.5}, f"{ref} comb. 3"))
    for r in roof or [None]:
        d = {"D": 1.2, "W": 1.0, "L": fl}
        if r:
            d[r] = 0.5
        out.append((f"LC4{r or ''}", d, f"{ref} comb. 4"))
    out.append(("LC5", {"D": 0.9, "W": 1.0}, f"{ref} comb. 5"))
    sref = "ASCE 7-16 Sec. 2.3.6"
    if sds is None:
        out.append(("LC6E", {"D": 1.2, "E": 1.0, "L": fl, "S": 0.2}, f"{sref} comb. 6 (E given as E_h + E_v)"))
        out.append(("LC7E", {"D": 0.9, "E": 1.0}, f"{sref} comb. 7 (E given as E_h - E_v)"))
    else:
        ev = f"E_v = 0.2 S_DS D, S_DS = {sds:g}"
        out.append(("LC6E", {"D": 1.2 + 0.2 * sds, "E": 1.0, "L": fl, "S": 0.2}, f"{sref} comb. 6 ({ev})"))
        out.append(("LC7E", {"D": 0.9 - 0.2 * sds, "E": 1.0}, f"{sref} comb. 7 ({ev})"))
    return out


def _asd(roof: list[str], sds: float | None) -> list[tuple[str, dict[str, float], str]]:
    ref = "ASCE 7-16 Sec. 2.4.1"
    out: list[tuple[str, dict[str, float], str]] = [
        ("AC1", {"D": 1.0}, f"{ref} comb. 1"),
        ("AC2", {"D": 1.0, "L": 1.0}, f"{ref} comb. 2"),
    ]
    for r in roof:
        out.append((f"AC3{r}", {"D": 1.0, r: 1.0}, f"{ref} comb. 3"))
    for r in roof or [None]:
        d = {"D": 1.0, "L": 0.75}
        if r:
            d[r] = 0.75
        out.append((f"AC4{r or ''}", d, f"{ref} comb. 4"))
    out.append(("AC5", {"D": 1.0, "W": 0.6}, f"{ref} comb. 5"))
    for r in roof or [None]:
        d = {"D": 1.0, "L": 0.75, "W": 0.45}  # 0.75*(0.6W)
        if r:
            d[r] = 0.75
        out.append((f"AC6{r or ''}", d, f"{ref} comb. 6a"))
    out.append(("AC7", {"D": 0.6, "W": 0.6}, f"{ref} comb. 7"))
    sref = "ASCE 7-16 Sec. 2.4.5"
    if sds is None:
        out.append(("AC8E", {"D": 1.0, "E": 0.7}, f"{sref} comb. 8 (E given as E_h + E_v)"))
        out.append(("AC9E", {"D": 1.0, "E": 0.525, "L": 0.75, "S": 0.75}, f"{sref} comb. 9 (E given as E_h + E_v)"))
        out.append(("AC10E", {"D": 0.6, "E": 0.7}, f"{sref} comb. 10 (E given as E_h - E_v)"))
    else:
        ev = f"E_v = 0.2 S_DS D, S_DS = {sds:g}"
        out.append(("AC8E", {"D": 1.0 + 0.14 * sds, "E": 0.7}, f"{sref} comb. 8 ({ev})"))
        out.append(("AC9E", {"D": 1.0 + 0.105 * sds, "E": 0.525, "L": 0.75, "S": 0.75}, f"{sref} comb. 9 ({ev})"))
        out.append(("AC10E", {"D": 0.6 - 0.14 * sds, "E": 0.7}, f"{sref} comb. 10 ({ev})"))
    return out


def basic_combinations(
    method: str,
    loads: Any = LOAD_NAMES,
    *,
    wind_reversal: bool = True,
    live_half: bool = False,
    S_DS: float | None = None,
) -> list[Combination]:
    """The basic combinations for the loads present.

    Args:
        method: ``"LRFD"`` (ASCE 7-16 Sec. 2.3.1) or ``"ASD"`` (Sec. 2.4.1).
        loads: Names of the loads present (terms with absent loads are dropped, and combinations
            left identical to another are removed).
        wind_reversal: Also make the -W / -E variant of each wind or seismic combination.
        live_half: LRFD only: take the L factor in comb. 3, 4 and 6 as 0.5 (ASCE 7-16 Sec. 2.3.1
            exception 1; not for garages, public assembly or L > 100 psf).
        S_DS: Design spectral response acceleration at short periods (0 to 3; ASCE 7-16 Sec.
            11.4.5). Given, ``E`` is E_h and E_v = 0.2 S_DS D is in the D factors of the seismic
            combinations; left out, ``E`` is the combined effect E_h ± E_v.
    """
    present = list(loads)
    bad = [k for k in present if k not in LOAD_NAMES]
    if bad:
        raise InputError(f"load names: got {bad!r}; expected names from {list(LOAD_NAMES)}")
    if "D" not in present:
        raise InputError(f"load names: got {present!r}; expected the dead load 'D' among them")
    if S_DS is not None and not (isinstance(S_DS, (int, float)) and not isinstance(S_DS, bool) and 0.0 <= S_DS <= 3.0):
        raise InputError(f"S_DS: got {S_DS!r}; expected a number from 0 to 3 (ASCE 7-16 Sec. 11.4.5)")
    sds = None if S_DS is None else float(S_DS)
    m = method.upper() if isinstance(method, str) else method
    roof = [r for r in _ROOF if r in present]
    if m == "LRFD":
        raw = _lrfd(roof, live_half, sds)
    elif m == "ASD":
        raw = _asd(roof, sds)
    else:
        raise InputError(f"method: got {method!r}; expected 'LRFD' or 'ASD'")
    out: list[Combination] = []
    seen: set[tuple[tuple[str, float], ...]] = set()
    for name, factors, ref in raw:
        f = {k: v for k, v in factors.items() if k in present}
        if ("W" in factors and "W" not in present) or ("E" in factors and "E" not in present):
            continue  # a wind/seismic combination without that load repeats a gravity one
        variants = [(name, f)]
        if wind_reversal:
            for lat in ("W", "E"):
                if lat in f:
                    g = dict(f)
                    g[lat] = -g[lat]
                    variants = [(name + "+", f), (name + "-", g)]
        for nm, fac in variants:
            key = tuple(sorted(fac.items()))
            if key in seen:
                continue
            seen.add(key)
            out.append(Combination(nm, fac, ref))
    return out


@dataclass
class CombinationResult:
    """Combined effects and the governing combination per entry.

    ``values[i]`` is combination ``i`` (shape: combos x effect shape). ``governing_max`` /
    ``governing_min`` / ``governing_abs`` hold, per entry, the index of the combination giving the
    largest, smallest and largest-magnitude value.
    """

    combinations: list[Combination]
    values: np.ndarray
    governing_max: np.ndarray = field(repr=False)
    governing_min: np.ndarray = field(repr=False)
    governing_abs: np.ndarray = field(repr=False)

    @property
    def names(self) -> list[str]:
        """Combination names in order."""
        return [c.name for c in self.combinations]

    @property
    def max(self) -> np.ndarray:
        """Largest combined value per entry."""
        return self.values.max(axis=0)

    @property
    def min(self) -> np.ndarray:
        """Smallest combined value per entry."""
        return self.values.min(axis=0)

    @property
    def absmax(self) -> np.ndarray:
        """Combined value of largest magnitude per entry (with its sign)."""
        return np.take_along_axis(self.values, self.governing_abs[None, ...], axis=0)[0]

    def governing(self, which: str = "abs") -> Any:
        """Name(s) of the governing combination per entry: ``which`` = ``"abs"``, ``"max"`` or ``"min"``."""
        idx = {"abs": self.governing_abs, "max": self.governing_max, "min": self.governing_min}.get(which)
        if idx is None:
            raise InputError(f"which: got {which!r}; expected 'abs', 'max' or 'min'")
        names = np.array(self.names, dtype=object)
        out = names[idx]
        return str(out) if np.ndim(out) == 0 else out

    def label(self, index: int) -> str:
        """Name and factors of combination ``index``, e.g. ``LC2S: 1.2D + 1.6L + 0.5S``."""
        c = self.combinations[int(index)]
        return f"{c.name}: {c.label()}"


def combine(
    effects: dict[str, Any],
    method: str = "LRFD",
    *,
    combinations: list[Combination] | None = None,
    unit: str | None = None,
    wind_reversal: bool = True,
    live_half: bool = False,
) -> CombinationResult:
    """Apply the basic combinations to load effects.

    Args:
        effects: Load name -> effect (number, array, or quantity; all of one shape).
        method: ``"LRFD"`` or ``"ASD"`` (ignored when ``combinations`` is given).
        combinations: Explicit list to use instead of the basic set.
        unit: If effects are quantities, the unit to convert them to (floats are taken as given).
        wind_reversal, live_half: See :func:`basic_combinations`.
    """
    if not effects:
        raise InputError("effects: empty; expected at least the dead load effect 'D'")
    arrays: dict[str, np.ndarray] = {}
    for k, v in effects.items():
        if k not in LOAD_NAMES:
            raise InputError(f"effects: load name {k!r}; expected one of {list(LOAD_NAMES)}")
        if unit is None and hasattr(v, "units"):
            unit = str(v.units)
        arrays[k] = to_array(v, unit, f"effect {k}") if unit else to_array(v, "", f"effect {k}")
    shapes = {a.shape for a in arrays.values()}
    if len(shapes) > 1:
        raise InputError(f"effects: shapes {sorted(shapes)} differ; expected every load effect of one shape")
    combos = combinations if combinations is not None else basic_combinations(
        method, list(arrays), wind_reversal=wind_reversal, live_half=live_half
    )
    shape = next(iter(shapes))
    values = np.zeros((len(combos), *shape))
    for i, c in enumerate(combos):
        for k, f in c.factors.items():
            if k in arrays:
                values[i] += f * arrays[k]
    return CombinationResult(
        combos,
        values,
        governing_max=values.argmax(axis=0),
        governing_min=values.argmin(axis=0),
        governing_abs=np.abs(values).argmax(axis=0),
    )


def add_governing_effect(
    sh: Any,
    name: str,
    effects: dict[str, Any],
    method: str | None = None,
    *,
    which: str = "abs",
    description: str = "Governing combined load effect",
    wind_reversal: bool = True,
    live_half: bool = False,
) -> str:
    """Combine scalar load effects (quantities) with the basic combinations, add a table of every
    combination to sheet ``sh`` and the governing value as given ``name`` whose source names the
    combination and its ASCE 7-16 clause. Returns the name of the governing combination.

    Args:
        sh: The sheet (its ``method`` is used when ``method`` is None).
        name: Name of the given to add (e.g. ``"P_u"``).
        effects: Load name -> effect (quantities of one dimension, e.g. axial forces).
        which: ``"abs"`` (largest magnitude), ``"max"`` or ``"min"``.
    """
    from calcpad.core.units import Q_

    if which not in ("abs", "max", "min"):
        raise InputError(f"which: got {which!r}; expected 'abs', 'max' or 'min'")
    m = method or getattr(sh, "method", None) or "LRFD"
    unit = None
    for v in effects.values():
        if hasattr(v, "units"):
            unit = str(v.units)
            break
    res = combine(effects, m, unit=unit, wind_reversal=wind_reversal, live_half=live_half)
    if res.values.ndim != 1:
        raise InputError(f"effects: got arrays; expected one value per load for {name!r}")
    rows = [[c.name, c.label(), Q_(float(v), unit) if unit else float(v), c.ref]
            for c, v in zip(res.combinations, res.values, strict=True)]
    sh.table(f"Load combinations for {name} ({m})", rows, columns=["combination", "factors", "effect", "reference"])
    idx = int({"abs": res.governing_abs, "max": res.governing_max, "min": res.governing_min}[which])
    c = res.combinations[idx]
    val = float(res.values[idx])
    sh.given(name, Q_(val, unit) if unit else val, description, source=f"{c.name}: {c.label()}, {c.ref}")
    return c.name
