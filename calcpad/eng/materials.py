"""Materials catalog: yield and tensile strength, moduli and density, each with its source.

Catalog values live in ``calcpad/eng/data/materials.toml`` (ASTM A36, A53 Gr B, A500 Gr B/C
round and shaped per ASTM A500/A500M-18, A1085, A572 Gr 50, A992, stainless 304, aluminum
6061-T6 and 6063-T6). Lookup is forgiving (``"a500 gr c shaped"``, ``"6061"``); a name that
fits several materials (``"A500 Gr B"``: round or shaped?) raises an error listing them, or is
settled by ``shape="round"``/``"shaped"``. User materials are made with :func:`define_material`
and may be registered for lookup with :func:`register_material`.
"""

from __future__ import annotations

import difflib
import functools
import math
import re
import tomllib
from dataclasses import dataclass, field
from importlib import resources
from typing import Any

import pint

from calcpad.core.errors import InputError
from calcpad.core.units import Q_, parse_quantity

__all__ = [
    "ROUND_TUBE_GRADES",
    "Material",
    "define_material",
    "get_material",
    "grade_label",
    "hss_material",
    "material_names",
    "register_material",
]

_UNITS = {"Fy": "ksi", "Fu": "ksi", "E": "ksi", "G": "ksi", "density": "lb/ft**3", "Fy_welded": "ksi", "Fu_welded": "ksi"}


@dataclass(frozen=True)
class Material:
    """A material. Floats in ksi (strengths, moduli) and lb/ft^3 (density).

    ``Fy_welded``/``Fu_welded`` are heat-affected-zone strengths where the material has them
    (aluminum); ``None`` otherwise.
    """

    name: str
    Fy: float
    Fu: float
    E: float
    G: float
    density: float
    source: str
    Fy_welded: float | None = None
    Fu_welded: float | None = None
    aliases: tuple[str, ...] = field(default_factory=tuple)

    def quantity(self, prop: str) -> pint.Quantity:
        """Property as a pint quantity, e.g. ``m.quantity("Fy")`` -> 46 ksi."""
        if prop not in _UNITS:
            raise InputError(f"material property {prop!r}: unknown; expected one of {', '.join(_UNITS)}")
        v = getattr(self, prop)
        if v is None:
            raise InputError(f"material property {prop!r}: not given for {self.name}")
        return Q_(v, _UNITS[prop])

    def as_dict(self, quantities: bool = False) -> dict[str, Any]:
        """Properties by name (floats in ksi and lb/ft^3, or pint quantities)."""
        out: dict[str, Any] = {"name": self.name}
        for k, u in _UNITS.items():
            v = getattr(self, k)
            if v is not None:
                out[k] = Q_(v, u) if quantities else v
        out["source"] = self.source
        return out


def _norm(text: str) -> str:
    s = text.lower().replace("grade", "gr").replace("astm", "").replace("aluminium", "aluminum")
    return re.sub(r"[\s.\-_/(),]", "", s)


@functools.lru_cache(maxsize=1)
def _catalog() -> dict[str, Material]:
    text = resources.files("calcpad.eng").joinpath("data").joinpath("materials.toml").read_text(encoding="utf-8")
    data = tomllib.loads(text)
    out: dict[str, Material] = {}
    for key, d in data.items():
        out[key] = Material(
            name=d["name"], Fy=float(d["Fy"]), Fu=float(d["Fu"]), E=float(d["E"]), G=float(d["G"]),
            density=float(d["density"]), source=d["source"],
            Fy_welded=d.get("Fy_welded"), Fu_welded=d.get("Fu_welded"), aliases=tuple([key, *d.get("aliases", [])]),
        )
    return out


_USER: dict[str, Material] = {}


def _all() -> dict[str, Material]:
    return {**_catalog(), **_USER}


_INDEX: dict[str, Material] = {}


def _index() -> dict[str, Material]:
    """Normalised name and alias -> material; made once, again after a material is registered."""
    if not _INDEX:
        for m in _all().values():
            for a in (m.name, *m.aliases):
                _INDEX.setdefault(_norm(a), m)
    return _INDEX


def material_names() -> list[str]:
    """Names of all catalog and registered materials."""
    return [m.name for m in _all().values()]


def get_material(name: str | Material, shape: str | None = None) -> Material:
    """Material by name, forgiving of case, spaces, 'Gr'/'Grade', 'ASTM'.

    Args:
        name: e.g. ``"A36"``, ``"A500 Gr C shaped"``, ``"6061-T6"``; a :class:`Material` passes through.
        shape: ``"round"`` or ``"shaped"`` to settle A500 grades (values differ).

    Raises:
        InputError: unknown name ("did you mean") or a name that fits several materials.
    """
    if isinstance(name, Material):
        return name
    if not isinstance(name, str) or not name.strip():
        raise InputError(f"material: {name!r}; expected a name such as 'A36', 'A500 Gr C shaped', '6061-T6'")
    if shape is not None and shape not in ("round", "shaped"):
        raise InputError(f"shape: {shape!r}; expected 'round' or 'shaped' (square/rectangular)")
    key = _norm(name) + (_norm(shape) if shape else "")
    index = _index()
    if key in index:
        return index[key]
    starts = {m.name: m for a, m in index.items() if a.startswith(key)}
    if len(starts) == 1:
        return next(iter(starts.values()))
    if len(starts) > 1:
        raise InputError(f"material: {name!r} fits several materials ({', '.join(sorted(starts))}); "
                         "expected a more precise name, e.g. with 'round' or 'shaped' for A500")
    hits = difflib.get_close_matches(key, list(index), n=5, cutoff=0.5)
    sugg = list(dict.fromkeys(index[h].name for h in hits))[:3]
    names = sorted({m.name for m in _all().values()})
    hint = f"did you mean {', '.join(map(repr, sugg))}?" if sugg else f"expected one of {', '.join(names)}"
    raise InputError(f"material: {name!r} is not in the catalog; {hint}")


def hss_material(grade: str, section: Any) -> Material:
    """A500-type grade for a section: the round values for round tubes, shaped values otherwise."""
    kind = getattr(section, "kind", "")
    return get_material(grade, shape="round" if kind == "round tube" else "shaped")


def grade_label(F_y: Any, among: tuple[str, ...] | None = None) -> str:
    """The catalog grade of a yield stress actually used, for the label beside it.

    ``among`` limits the search to catalog names (e.g. the pipe and round-HSS grades for a
    tube). A value within 1 % of a grade's F_y (so 240 MPa finds the 35 ksi grade) gives its
    name ("ASTM A53 Gr. B"; several as "X or Y"); a value no grade has gives "as given".
    """
    fy = float(parse_quantity(F_y, "F_y").to("ksi").magnitude)
    pool = [get_material(n) for n in among] if among else list(_all().values())
    hits = list(dict.fromkeys(m.name for m in pool if abs(m.Fy - fy) <= 0.01 * m.Fy))
    return " or ".join(hits) if hits else "as given"


#: Catalog grades of round tubes and pipe (for :func:`grade_label`).
ROUND_TUBE_GRADES = ("A53 Gr B", "A500 Gr B round", "A500 Gr C round", "A1085")


def _stress(value: Any, name: str, *, allow_none: bool = False) -> float | None:
    if value is None and allow_none:
        return None
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        x = float(value)
    else:
        q = parse_quantity(value, name, expected="ksi")
        x = float(q.to("ksi").magnitude)
    if not math.isfinite(x) or x <= 0:
        raise InputError(f"{name}: {value!r}; expected a positive stress such as '36 ksi' (numbers are ksi)")
    return x


def _density_pcf(value: Any) -> float:
    q = parse_quantity(value, "density")
    if q.check("[mass]/[length]**3"):
        return float(q.to("lb/ft**3").magnitude)
    if q.check("[force]/[length]**3"):  # a unit weight such as '490 lb/ft^3' read as lbf/ft^3
        return float((q / Q_(1.0, "standard_gravity")).to("lb/ft**3").magnitude)
    raise InputError(f"density: {value!r}; expected a density such as '490 pcf' or '7850 kg/m^3'")


def define_material(name: str, Fy: Any, Fu: Any, E: Any = "29000 ksi", G: Any | None = None, *, nu: float = 0.3,
                    density: Any = "490 pcf", source: str = "user-defined", Fy_welded: Any | None = None,
                    Fu_welded: Any | None = None) -> Material:
    """Make a user material. Numbers are ksi (density lb/ft^3); strings/quantities carry units.

    ``G`` defaults to ``E / (2 (1 + nu))``.

    Raises:
        InputError: missing name, non-positive values, wrong units, or ``Fu < Fy``.
    """
    if not isinstance(name, str) or not name.strip():
        raise InputError(f"material name: {name!r}; expected a non-empty name")
    fy = _stress(Fy, "Fy (yield strength)")
    fu = _stress(Fu, "Fu (tensile strength)")
    e = _stress(E, "E (elastic modulus)")
    assert fy is not None and fu is not None and e is not None
    if fu < fy:
        raise InputError(f"Fu (tensile strength): {fu:g} ksi; expected at least Fy = {fy:g} ksi")
    if not (isinstance(nu, (int, float)) and 0.0 <= nu < 0.5):
        raise InputError(f"nu (Poisson's ratio): {nu!r}; expected a number from 0 up to 0.5")
    g = _stress(G, "G (shear modulus)") if G is not None else e / (2.0 * (1.0 + nu))
    if isinstance(density, (int, float)) and not isinstance(density, bool):
        rho = float(density)
    else:
        rho = _density_pcf(density)
    if not math.isfinite(rho) or rho <= 0:
        raise InputError(f"density: {density!r}; expected a positive density such as '490 lb/ft^3'")
    return Material(name.strip(), fy, fu, e, float(g), rho, source, _stress(Fy_welded, "Fy_welded", allow_none=True),
                    _stress(Fu_welded, "Fu_welded", allow_none=True))


def register_material(material: Material, aliases: tuple[str, ...] = ()) -> Material:
    """Make a user material findable by :func:`get_material` (by its name and ``aliases``)."""
    if not isinstance(material, Material):
        raise InputError(f"material: {material!r}; expected a Material from define_material()")
    m = Material(**{**material.__dict__, "aliases": tuple(material.aliases) + tuple(aliases)})
    _USER[_norm(m.name)] = m
    _INDEX.clear()  # the next lookup indexes the new material too
    return m
