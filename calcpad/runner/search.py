"""Design search: the lightest catalog size (weight per foot) that passes every check, per member.

::

    [[calcs]]
    template = "post_combined"
    table = "posts.csv"
    [calcs.design]
    parameter = "post"           # the template parameter that names the section (default: the one
                                 # whose default is a catalog section)
    family = "hss_square"        # a catalog family (default: the family of the parameter's default)
    grades = ["A500 Gr C"]       # optional: grades tried for each size, in this order ...
    grade_parameter = "grade"    # ... through this parameter

How it runs (:func:`search`): the candidates are the family's sizes by weight per foot
(``catalog.find_sections``), each with every grade. The template builds its sheets once per
candidate (with one member's values) and once more per group of members whose values change
more than givens. Which given each member parameter sets is found by moving it
(:func:`~calcpad.runner.build.given_map`). Candidates whose sheets have the same structure share
one compiled sheet (``Sheet.compile()``), evaluated for all members x all those candidates in
one call: member givens vary along one axis, section givens along the other. The first
candidate passing every check (valid case, every ratio within its limit) is then built and
evaluated the ordinary way for that member; only a candidate that passes there too is chosen
(a check flag the compiled sheet does not evaluate, such as slenderness, sends the search on to
the next size). The next passing candidate is the runner-up. A template whose givens depend on
both the member and the section falls back to the scalar loop (build and evaluate every
candidate per member), said in the result's ``method``.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from calcpad.core.errors import CalcpadError, InputError
from calcpad.core.results import status_ok
from calcpad.runner.build import SheetBuilder, SheetBuildError, given_map, sheet_signature
from calcpad.runner.template import Template

__all__ = ["DESIGN_KEYS", "Candidate", "DesignResult", "candidates", "design_settings", "resolve_designs", "search", "section_parameter"]

DESIGN_KEYS = ("parameter", "family", "grades", "grade_parameter")


@dataclass(frozen=True)
class Candidate:
    """A catalog size (and grade) tried by a design search."""

    designation: str
    grade: str | None
    weight: float  # lb/ft (nominal wall)

    @property
    def label(self) -> str:
        """``HSS4x4x1/4`` or ``HSS4x4x1/4 A500 Gr C``."""
        return self.designation if self.grade is None else f"{self.designation} {self.grade}"


@dataclass
class DesignResult:
    """The outcome of a design search for one member."""

    member: str
    chosen: Candidate | None
    governing_check: str = ""
    governing_ratio: float | None = None
    runner_up: Candidate | None = None
    runner_up_ratio: float | None = None
    tried: int = 0  # candidates evaluated
    method: str = "compiled"  # "compiled" or "scalar"
    message: str = ""
    passing: list[int] = field(default_factory=list, repr=False)  # candidate indices the compiled sheet passed

    def as_record(self, settings: Mapping[str, Any]) -> dict[str, Any]:
        """Plain dictionary for the job record."""
        def cand(c: Candidate | None) -> dict[str, Any] | None:
            return None if c is None else {"designation": c.designation, "grade": c.grade, "weight_plf": round(c.weight, 6)}

        return {"parameter": settings["parameter"], "family": settings["family"], "grades": list(settings.get("grades") or []),
                "chosen": cand(self.chosen), "governing_check": self.governing_check, "governing_ratio": self.governing_ratio,
                "runner_up": cand(self.runner_up), "runner_up_ratio": self.runner_up_ratio, "candidates": self.tried,
                "method": self.method, "message": self.message}


def section_parameter(tpl: Template) -> str | None:
    """The template's one parameter whose default is a catalog section (None if none or several)."""
    from calcpad.eng.sections.catalog import get_entry

    found = []
    for name, p in tpl.parameters.items():
        if p.kind == "text" and isinstance(p.default, str):
            try:
                get_entry(p.default)
            except InputError:
                continue
            found.append(name)
    return found[0] if len(found) == 1 else None


def design_settings(raw: Any, tpl: Template, loc: str, problems: list[tuple[str, str]]) -> dict[str, Any] | None:
    """Validate a ``[calcs.design]`` table; problems are appended with their location."""
    from calcpad.eng.materials import get_material
    from calcpad.eng.sections.catalog import FAMILIES, designations, get_entry

    if not isinstance(raw, dict):
        problems.append((loc, f"{raw!r}; expected a table with parameter, family (and optionally grades, grade_parameter)"))
        return None
    bad = False
    for key in raw:
        if key not in DESIGN_KEYS:
            problems.append((f"{loc}.{key}", f"unknown key (allowed: {', '.join(DESIGN_KEYS)})"))
            bad = True
    param = raw.get("parameter", section_parameter(tpl))
    if not isinstance(param, str) or param not in tpl.parameters or tpl.parameters[param].kind != "text":
        problems.append((f"{loc}.parameter", f"{param!r}; expected the template parameter that names the section"
                                             f"{tpl.suggest(param) if isinstance(param, str) else ''}"))
        return None
    family = raw.get("family")
    if family is None:
        try:
            family = get_entry(str(tpl.parameters[param].default)).family
        except InputError:
            problems.append((f"{loc}.family", "missing; name a catalog family (" + ", ".join(FAMILIES) + ")"))
            return None
    try:
        if not isinstance(family, str) or not designations(family):
            raise InputError(f"{family!r} has no sizes")
    except InputError as exc:
        problems.append((f"{loc}.family", str(exc)))
        return None
    grades = raw.get("grades")
    gparam = raw.get("grade_parameter")
    if grades is not None:
        if not isinstance(grades, list) or not grades or not all(isinstance(g, str) for g in grades):
            problems.append((f"{loc}.grades", f"{grades!r}; expected a list of grade names such as [\"A500 Gr C\"]"))
            bad = True
        else:
            for j, g in enumerate(grades, start=1):
                try:
                    get_material(g)
                except CalcpadError as exc:
                    problems.append((f"{loc}.grades[{j}]", str(exc)))
                    bad = True
        if not isinstance(gparam, str) or gparam not in tpl.parameters:
            problems.append((f"{loc}.grade_parameter", f"{gparam!r}; expected the template parameter that takes the grade"
                                                       f"{tpl.suggest(gparam) if isinstance(gparam, str) else ''}"))
            bad = True
    elif gparam is not None:
        problems.append((f"{loc}.grade_parameter", "given without grades = [...]"))
        bad = True
    if bad:
        return None
    return {"parameter": param, "family": family, "grades": list(grades) if grades else None, "grade_parameter": gparam}


def candidates(family: str, grades: Sequence[str] | None = None, sizes: Sequence[str] | None = None) -> list[Candidate]:
    """The family's sizes by weight per foot (lightest first; equal weights in catalog order),
    each with each grade in the order given. ``sizes`` limits them to those designations."""
    from calcpad.eng.sections.catalog import find_sections

    table = find_sections(family)
    if sizes is not None:
        keep = set(sizes)
        table = table[table["designation"].isin(keep)]
    return [Candidate(str(d), g, float(w)) for d, w in zip(table["designation"], table["weight"], strict=True) for g in (grades or [None])]


def _values(inputs: Mapping[str, Any], cand: Candidate, settings: Mapping[str, Any]) -> dict[str, Any]:
    v = dict(inputs)
    v[settings["parameter"]] = cand.designation
    if cand.grade is not None:
        v[settings["grade_parameter"]] = cand.grade
    return v


def _scalar_ok(builder: SheetBuilder, values: Mapping[str, Any]) -> tuple[bool, str, float | None]:
    """Build and evaluate the ordinary way: (every check OK, governing check, its ratio)."""
    try:
        sheets = builder.sheets(values)
        checks = [c for s in sheets for c in s.evaluate().checks]
    except CalcpadError:
        return False, "", None
    if not checks:
        return False, "", None
    gov = max(checks, key=lambda c: c.ratio)
    return all(status_ok(c.status) for c in checks), gov.title, float(gov.ratio)


def _scalar_search(builder: SheetBuilder, member: str, inputs: Mapping[str, Any], cands: list[Candidate], settings: Mapping[str, Any],
                   why: str) -> DesignResult:
    res = DesignResult(member, None, method="scalar", message=why)
    for i, c in enumerate(cands):
        res.tried = i + 1
        ok, gov, ratio = _scalar_ok(builder, _values(inputs, c, settings))
        if not ok:
            continue
        if res.chosen is None:
            res.chosen, res.governing_check, res.governing_ratio = c, gov, ratio
        else:
            res.runner_up, res.runner_up_ratio = c, ratio
            break
    return res


def search(
    template: Template,
    members: Sequence[tuple[str, Mapping[str, Any]]],
    settings: Mapping[str, Any],
    sizes: Sequence[str] | None = None,
    builder: SheetBuilder | None = None,
) -> list[DesignResult]:
    """Design search for each ``(mark, inputs)`` of ``members`` (see the module docstring).

    ``settings``: ``parameter``, ``family``, optional ``grades`` and ``grade_parameter``
    (:func:`design_settings`). ``sizes`` limits the family to those designations.
    """
    builder = builder or SheetBuilder(template)
    cands = candidates(settings["family"], settings.get("grades"), sizes)
    if not cands:
        raise InputError(f"design search: no {settings['family']} sizes to try")
    if not members:
        return []
    section_params = {settings["parameter"], settings.get("grade_parameter")} - {None}
    varying = [n for n in template.parameters if n not in section_params and len({repr(m[1].get(n)) for m in members}) > 1]
    mapping = given_map(builder, _values(members[0][1], cands[0], settings), varying) if varying else {}
    unmapped = [n for n in varying if mapping.get(n) is None]
    groups: dict[tuple[str, ...], list[int]] = {}
    for i, (_mark, inputs) in enumerate(members):
        groups.setdefault(tuple(repr(inputs.get(n)) for n in unmapped), []).append(i)
    results: list[DesignResult | None] = [None] * len(members)
    for idx in groups.values():
        for i, r in zip(idx, _search_group(builder, [members[i] for i in idx], cands, settings, mapping), strict=True):
            results[i] = r
    return [r for r in results if r is not None]


def _search_group(builder: SheetBuilder, members: Sequence[tuple[str, Mapping[str, Any]]], cands: list[Candidate],
                  settings: Mapping[str, Any], mapping: dict[str, list[str | None] | None]) -> list[DesignResult]:
    """Members whose values differ only in parameters that set one given each."""
    from calcpad.core.units import parse_quantity

    rep = members[0][1]
    built: list[list[Any] | None] = []
    for c in cands:
        try:
            built.append(builder.sheets(_values(rep, c, settings)))
        except SheetBuildError:
            built.append(None)
    mapped = {n: g for n, g in mapping.items() if g is not None and len({repr(m[1].get(n)) for m in members}) > 1}
    # member values of the mapped parameters, as quantities
    member_q = {n: [parse_quantity(m[1][n], n) for m in members] for n in mapped}
    # givens that change with the section must not be member givens too
    by_sig: dict[tuple[Any, ...], list[int]] = {}
    for k, sheets in enumerate(built):
        if sheets is not None:
            by_sig.setdefault(tuple(sheet_signature(s) for s in sheets), []).append(k)
    member_givens = {g for gs in mapped.values() for g in gs if g is not None}
    for ks in by_sig.values():
        first = built[ks[0]]
        for k in ks[1:]:
            for s0, s1 in zip(first, built[k], strict=True):
                moved = {g.name for g, h in zip(s0.givens(), s1.givens(), strict=True) if g.value != h.value}
                if moved & member_givens:
                    why = f"the template sets {', '.join(sorted(moved & member_givens))} from both the member and the section"
                    return [_scalar_search(builder, m, v, cands, settings, why) for m, v in members]
    n_m, n_c = len(members), len(cands)
    passes = np.zeros((n_m, n_c), dtype=bool)
    for ks, sheets_k in ((ks, built[ks[0]]) for ks in by_sig.values()):
        ok = np.ones((n_m, len(ks)), dtype=bool)
        for si, sheet in enumerate(sheets_k):
            comp = sheet.compile()
            limits = {c.key: c.limit for c in sheet.evaluate().checks}
            if not limits:
                ok[:] = False
                continue
            kwargs: dict[str, Any] = {}
            for g in comp.given_units:
                col = [_given_value(built[k][si], g, comp.given_units[g]) for k in ks]
                if len({*col}) > 1:
                    kwargs[g] = np.asarray(col, dtype=float)[None, :]
            for n, gs in mapped.items():
                g = gs[si]
                if g is not None and g in comp.given_units:
                    kwargs[g] = np.asarray([q.to(comp.given_units[g]).magnitude for q in member_q[n]], dtype=float)[:, None]
            res = comp.ratios(**kwargs)
            good = np.broadcast_to(res.valid, (n_m, len(ks))).copy()
            for key, limit in limits.items():
                good &= np.broadcast_to(res[key] <= limit, (n_m, len(ks)))
            ok &= good
        passes[:, ks] = ok
    out = []
    for i, (mark, inputs) in enumerate(members):
        res = DesignResult(mark, None, tried=n_c, passing=[int(k) for k in np.flatnonzero(passes[i])])
        for k in res.passing:
            good, gov, ratio = _scalar_ok(builder, _values(inputs, cands[k], settings))
            if not good:
                continue
            if res.chosen is None:
                res.chosen, res.governing_check, res.governing_ratio = cands[k], gov, ratio
            else:
                res.runner_up, res.runner_up_ratio = cands[k], ratio
                break
        if res.chosen is None:
            res.message = f"no {settings['family'].replace('_', ' ')} size in the catalog passes every check"
        out.append(res)
    return out


def _given_value(sheet: Any, name: str, unit: Any) -> float:
    for g in sheet.givens():
        if g.name == name:
            return float(g.value.to(unit).magnitude)
    raise KeyError(name)



def resolve_designs(job: Any, client: Any = None, progress: Any = None) -> Any:
    """Run the design search of every calc with ``[calcs.design]`` and put the chosen size (and
    grade) into its inputs; ``calc.design`` then holds the settings and the result. A member
    for which no size passes keeps its own value (its calc then shows why it fails). With a Dask
    ``client`` the members are searched in chunks on the cluster (same results); ``progress(n)`` is
    called as members are done."""
    groups: dict[str, list[Any]] = {}
    for calc in job.calcs:
        if calc.design is not None and "result" not in calc.design:
            groups.setdefault(calc.location.split(".table")[0], []).append(calc)
    for calcs in groups.values():
        settings = {k: calcs[0].design[k] for k in ("parameter", "family", "grades", "grade_parameter")}
        members = [(c.member, c.inputs) for c in calcs]
        if client is None:
            found = search(calcs[0].template, members, settings)
            if progress is not None:
                progress(len(members))
        else:
            from calcpad.runner.scale import search_on_cluster

            found = search_on_cluster(client, calcs[0].template, members, settings, progress=progress)
        for calc, res in zip(calcs, found, strict=True):
            calc.design = {**settings, "result": res.as_record(settings)}
            if res.chosen is not None:
                calc.inputs = _values(calc.inputs, res.chosen, settings)
    return job
