"""Member checks fed by the frame solver: forces per load case, the governing case, one check.

    res = frame.solve()
    out = check_frame_member(sh, res, "L1", get_section("Pipe 2 Std"), material="A53 Gr B", L="24 in", K=2.1)

For each load case or combination (and each member named) the forces are read from the solved frame (axial
force, largest bending moment and largest shear along it), every applicable AISC 360-16 limit
state is evaluated on a scratch sheet, and the case with the highest ratio is written on the
sheet in full (:func:`check_member`), after a table of the governing ratio of every case.
"""

from __future__ import annotations

import functools
import threading
import warnings
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np
import pint

from calcpad.core.compiled import CompiledSheet
from calcpad.core.content_key import content_key
from calcpad.core.errors import CalcpadError
from calcpad.core.sheet import Sheet
from calcpad.core.units import Q_
from calcpad.eng.checks._common import CheckInputError
from calcpad.eng.checks.member import MemberChecks, check_member

__all__ = ["MemberForces", "check_frame_member", "frame_member_forces"]


@dataclass(frozen=True)
class MemberForces:
    """Forces of one member in one case: P compression positive (the checks' sign), M and V the
    largest magnitudes along the member (with their sign) and where M occurs."""

    case: str
    P: pint.Quantity
    M: pint.Quantity
    V: pint.Quantity
    x_M: pint.Quantity

    @property
    def empty(self) -> bool:
        """True when the member carries no force in this case."""
        return all(float(abs(q.magnitude)) == 0.0 for q in (self.P, self.M, self.V))


def frame_member_forces(result: Any, member: str, case: str, n: int = 41) -> MemberForces:
    """Read ``member``'s forces for ``case`` from a solved frame (:class:`FrameResult`).

    The axial force is taken where its magnitude is largest; the frame's sign (tension +) is
    turned into the checks' sign (compression +).
    """
    dg = result.diagram(member, case, n)
    fu, mu, lu = result.units["force"], result.units["moment"], result.units["length"]
    k_n, k_m, k_v = (int(np.argmax(np.abs(a))) for a in (dg.N, dg.M, dg.V))
    return MemberForces(
        case,
        _q(-float(dg.N[k_n]), fu),
        _q(float(dg.M[k_m]), mu),
        _q(float(dg.V[k_v]), fu),
        _q(float(dg.x[k_m]), lu),
    )


def _q(value: float, unit: str) -> pint.Quantity:
    return Q_(value + 0.0, _units(unit))  # + 0.0: no negative zero in the sheet


@functools.lru_cache(maxsize=64)
def _units(text: str) -> Any:
    """The units container of a frame's unit text (read once; a Quantity made from the container
    skips pint's parsing)."""
    return Q_(1.0, text)._units


def _sign(q: pint.Quantity) -> int:
    return int(np.sign(float(q.magnitude)))


#: Scratch sheets kept between calls, by the content of what they check and the force signs:
#: the same member in another direction, or a calc like an earlier one, re-evaluates a kept sheet.
_KEPT: dict[tuple[str, tuple[int, int, int]], _Scratch] = {}
KEPT_LIMIT = 48
#: Governing limit state and ratio by member content, force signs and the forces' exact values
#: (answers of the scalar sheet only).
_ANSWERS: dict[tuple[Any, ...], tuple[str, float]] = {}
ANSWERS_LIMIT = 5_000
#: Relative margin within which a compiled answer is not trusted: two limit states' ratios, a
#: ratio and the rounding of its 3 decimals, a branch condition's two sides, a ratio and the
#: largest (the compiled and the scalar sheet round differently, some 1e-15 apart).
NEAR = 1e-9
#: Cases of one force-sign pattern from which a scratch sheet is compiled (compiling costs some
#: 5 scalar evaluations; a compiled sheet is kept with its scratch sheet).
COMPILE_FROM = 6


class _Scratch:
    """A reusable scratch sheet, what :func:`check_member` wrote on it, and its compiled form
    (made when first needed; False when the sheet does not compile)."""

    __slots__ = ("compiled", "out", "sheet")

    def __init__(self, sheet: Sheet, out: MemberChecks) -> None:
        self.sheet, self.out = sheet, out
        self.compiled: CompiledSheet | bool | None = None

    def compile(self) -> CompiledSheet | None:
        if self.compiled is None:
            try:
                self.compiled = CompiledSheet(self.sheet)
            except CalcpadError:
                self.compiled = False
        return self.compiled or None


class _Scratches:
    """The per-case member checks of :func:`check_frame_member`, on reused scratch sheets.

    A scratch sheet is built once per pattern of force signs (which limit states apply and which
    inputs are accepted depend only on the signs) and re-evaluated with each case's forces
    through :meth:`Sheet.set`, which recomputes only what depends on them. Reuse needs the
    forces as givens named as :func:`check_member` writes them (``P_r`` or ``T_r``, ``M_r``,
    ``V_r``) holding the values passed; a sheet built otherwise is used for its own case only.
    Reusable sheets are also kept between calls (``_KEPT``, bounded), keyed by the exact content
    of the section, length, options and design method (:func:`content_key`; no key, no keeping).
    Many cases of one pattern are evaluated at once on the compiled sheet (:meth:`check_all`).
    """

    def __init__(self, sh: Sheet, section: Any, L: Any, options: dict[str, Any]) -> None:
        self.sh, self.section, self.L, self.options = sh, section, L, options
        self.sheets: dict[tuple[int, int, int], _Scratch] = {}
        key = content_key("check_member", type(section), section, L, options, sh.method, sh.prefs.system)
        # a kept sheet is re-evaluated in place: never share one between threads
        self.key = None if key is None else f"{key}:{threading.get_ident()}"

    def _kept(self, signs: tuple[int, int, int]) -> _Scratch | None:
        entry = self.sheets.get(signs)
        if entry is None and self.key is not None:
            entry = _KEPT.get((self.key, signs))
            if entry is not None:
                self.sheets[signs] = entry
                entry.sheet.title = self.sh.title  # messages name this calc's sheet
        return entry

    def _keep(self, signs: tuple[int, int, int], entry: _Scratch) -> None:
        self.sheets[signs] = entry
        if self.key is not None:
            _KEPT[(self.key, signs)] = entry
            while len(_KEPT) > KEPT_LIMIT:
                _KEPT.pop(next(iter(_KEPT)), None)

    def _build(self, P: pint.Quantity, M: pint.Quantity, V: pint.Quantity) -> _Scratch:
        sh = self.sh
        scratch = Sheet(sh.title, method=sh.method, system=sh.prefs.system)
        with warnings.catch_warnings():  # cautions are raised again when the governing case is written
            warnings.simplefilter("ignore")
            out = check_member(scratch, self.section, L=self.L, P=P, M_x=M, V=V, table=False, **self.options)
        return _Scratch(scratch, out)

    @staticmethod
    def _forces(P: pint.Quantity, M: pint.Quantity, V: pint.Quantity) -> dict[str, pint.Quantity]:
        """The givens :func:`check_member` writes for the forces (tension as ``T_r = -P``)."""
        out = {"M_r": M, "V_r": V}
        if _sign(P) > 0:
            out["P_r"] = P
        elif _sign(P) < 0:
            out["T_r"] = -P
        return out

    @staticmethod
    def _holds(scratch: Sheet, forces: dict[str, pint.Quantity]) -> bool:
        """True when the scratch sheet has each force as a given of that name and value."""
        givens = {g.name: g.value for g in scratch.givens()}
        for name, q in forces.items():
            g = givens.get(name)
            if g is None or g.dimensionality != q.dimensionality or float(g.to(q.units).magnitude) != float(q.magnitude):
                return False
        return True

    @staticmethod
    def _governing(scratch: Sheet, out: MemberChecks) -> tuple[str, float]:
        """The limit state with the highest ratio (the first of equal ones) and its ratio: the
        ratios read by check key (the sheet computes what changed; no result model is made)."""
        ratios = {name: float(scratch[key].magnitude) for name, key in out.keys.items()}
        name = max(ratios, key=lambda n: ratios[n])
        return name, ratios[name]

    def _memo(self, P: pint.Quantity, M: pint.Quantity, V: pint.Quantity) -> tuple[Any, ...] | None:
        if self.key is None:
            return None
        forces = self._forces(P, M, V)
        return self.key, _signs(P, M, V), tuple((n, repr(q.magnitude), q.units._units) for n, q in forces.items())

    def check(self, P: pint.Quantity, M: pint.Quantity, V: pint.Quantity) -> tuple[str, float]:
        """The governing limit state and its ratio for one case's forces (an answer for the same
        member content and the same forces is taken from the previous evaluation)."""
        memo = self._memo(P, M, V)
        if memo is not None and memo in _ANSWERS:
            return _ANSWERS[memo]
        answer = self._evaluate(_signs(P, M, V), self._forces(P, M, V), P, M, V)
        if memo is not None:
            if len(_ANSWERS) >= ANSWERS_LIMIT:
                _ANSWERS.clear()
            _ANSWERS[memo] = answer
        return answer

    def _evaluate(self, key: tuple[int, int, int], forces: dict[str, pint.Quantity], P: pint.Quantity, M: pint.Quantity,
                  V: pint.Quantity) -> tuple[str, float]:
        entry = self._kept(key)
        if entry is not None:
            entry.sheet.set(**forces)
            with warnings.catch_warnings():  # as for a new scratch sheet: cautions come with the governing case
                warnings.simplefilter("ignore")
                return self._governing(entry.sheet, entry.out)
        entry = self._build(P, M, V)
        if self._holds(entry.sheet, forces):
            self._keep(key, entry)
        return entry.out.governing, entry.out.governing_ratio

    def check_all(self, cases: list[tuple[pint.Quantity, pint.Quantity, pint.Quantity]]) -> list[tuple[str, float]]:
        """:meth:`check` for each case's forces, the cases of one force-sign pattern evaluated at
        once on the compiled scratch sheet. A compiled answer is taken only where it cannot differ
        from the scalar sheet's in what is shown or chosen (see :meth:`_trusted`), and every case
        whose ratio is within :data:`NEAR` of the largest is answered by the scalar sheet: so the
        first case with the largest ratio is the one :meth:`check` finds. Cases the scalar sheet
        answers are evaluated in order (a failing case raises as :meth:`check` would)."""
        answers: list[tuple[str, float] | None] = [None] * len(cases)
        exact = [False] * len(cases)
        groups: dict[tuple[int, int, int], list[int]] = {}
        for i, (P, M, V) in enumerate(cases):
            memo = self._memo(P, M, V)
            if memo is not None and memo in _ANSWERS:
                answers[i], exact[i] = _ANSWERS[memo], True
            elif self._kept(_signs(P, M, V)) is None and _signs(P, M, V) not in groups:
                try:  # the pattern's scratch sheet, built with this case's forces (its answer exact)
                    answers[i], exact[i] = self.check(P, M, V), True
                except Exception:  # raised again, in case order, when answered below
                    groups[_signs(P, M, V)] = []
            else:
                groups.setdefault(_signs(P, M, V), []).append(i)
        for signs, rows in groups.items():
            entry = self._kept(signs)
            if entry is not None and rows and (entry.compiled is not None or len(rows) >= COMPILE_FROM):
                compiled = entry.compile()
                if compiled is not None:
                    for i, answer in zip(rows, self._trusted(compiled, entry.out, [cases[i] for i in rows]), strict=True):
                        answers[i] = answer
        while True:
            for i, a in enumerate(answers):  # untrusted answers, and compiled ones near the largest: scalar
                if a is None:
                    answers[i], exact[i] = self.check(*cases[i]), True
            top = max(a[1] for a in answers if a is not None)
            close = [i for i, a in enumerate(answers) if not exact[i] and a is not None and a[1] >= top * (1 - 4 * NEAR)]
            if not close:
                return [a for a in answers if a is not None]
            for i in close:
                answers[i] = None

    def _trusted(self, compiled: CompiledSheet, out: MemberChecks,
                 cases: list[tuple[pint.Quantity, pint.Quantity, pint.Quantity]]) -> list[tuple[str, float] | None]:
        """The compiled sheet's governing limit state and ratio per case, None where it might not
        be the scalar sheet's: an invalid case (the scalar sheet says why), a branch condition or
        the runner-up limit state within :data:`NEAR`, a ratio that close to a rounding of its
        3 decimals."""
        forces = [self._forces(*c) for c in cases]
        values = {n: np.array([float(f[n].to(compiled.given_units[n]).magnitude) for f in forces]) for n in forces[0]}
        res, near = compiled.ratios_near(NEAR, **values)
        names = list(out.keys)
        table = np.column_stack([np.broadcast_to(np.asarray(res[out.keys[n]], dtype=float), near.shape) for n in names])
        trusted: list[tuple[str, float] | None] = []
        for k, r in enumerate(table):
            g = int(np.argmax(r))  # the first of equal ratios, as max() takes
            ratio, runner_up = float(r[g]), float(np.delete(r, g).max(initial=-np.inf))
            if near[k] or not res.valid[k] or runner_up >= ratio * (1 - 2 * NEAR) \
                    or f"{ratio * (1 - NEAR):.3f}" != f"{ratio * (1 + NEAR):.3f}":
                trusted.append(None)
            else:
                trusted.append((names[g], ratio))
        return trusted


def _signs(P: pint.Quantity, M: pint.Quantity, V: pint.Quantity) -> tuple[int, int, int]:
    return _sign(P), _sign(M), _sign(V)


def check_frame_member(
    sh: Sheet,
    result: Any,
    member: str | Sequence[str],
    section: Any,
    *,
    L: Any,
    cases: list[str] | None = None,
    B2: Any = None,
    suffix: str = "",
    **options: Any,
) -> MemberChecks:
    """Check a frame member (or the worst of several alike) for the case that governs.

    Args:
        sh: Sheet to write on.
        result: A solved frame (:meth:`Frame.solve`).
        member: The member's name in the frame, or several names of members with the same
            section and length (e.g. the legs): the member and case with the highest ratio are
            written.
        section: Shape or property mapping for the checks.
        L: Unbraced length for the checks (the member length or less), a value or a sheet name.
        cases: Cases and combinations to consider (default: all of the result's).
        B2: Sway amplifier of AISC 360-16 App. 8 (a number or a sheet name, e.g. written by
            :func:`add_second_order`): every case's P and M are multiplied by it (all of them
            treated as lateral-translation effects, Eqs. A-8-1, A-8-2: conservative when the
            no-translation moments are small).
        suffix: Name suffix for the sheet (one per member checked on the same sheet).
        **options: Passed to :func:`check_member` (``material``, ``K``, ``F_y`` ...); values may
            name sheet values.

    Returns:
        What :func:`check_member` wrote for the governing member and case.
    """
    members = [member] if isinstance(member, str) else list(member)
    names = list(cases) if cases is not None else list(result.names)
    if not names:
        raise CheckInputError("cases", cases, "at least one load case or combination of the frame")
    if not members:
        raise CheckInputError("member", member, "a member name of the frame")
    for key in ("P", "M_x", "V", "table"):
        if key in options:
            raise CheckInputError(key, options[key], "nothing: the forces come from the frame result")

    def value(v: Any) -> Any:  # scratch sheets do not hold the sheet's names: use their values
        return sh[v] if isinstance(v, str) and v in sh else v

    scratch_opts = {k: value(v) for k, v in options.items()}
    amp = 1.0 if B2 is None else float(value(B2).magnitude if hasattr(value(B2), "magnitude") else B2)
    if not (np.isfinite(amp) and amp >= 1.0):
        raise CheckInputError("B2", B2, "a sway amplifier B2 >= 1 (AISC 360-16 Eq. A-8-6)")
    rows, best = [], None
    scratches = _Scratches(sh, section, value(L), scratch_opts)
    found = [(m, frame_member_forces(result, m, c)) for m in members for c in names]
    loaded = [f for _, f in found if not f.empty]
    answers = iter(scratches.check_all([(f.P * amp, f.M * amp, f.V) for f in loaded]) if loaded else [])
    for m, f in found:
        if f.empty:
            rows.append([m, f.case, f.P, f.M, f.V, "-", "no force"])
            continue
        governing, ratio = next(answers)
        rows.append([m, f.case, f.P, f.M, f.V, f"{ratio:.3f}", governing])
        if best is None or ratio > best[0]:
            best = (ratio, m, f)
    if best is None:
        raise CheckInputError("cases", names, f"a case in which {', '.join(members)} carries force")
    _, gov_m, gov = best
    s = f"_{suffix}" if suffix else ""
    sh.heading(f"Member {gov_m}: forces from the frame analysis{f' [{suffix}]' if suffix else ''}", 2)
    what = f"members {', '.join(members)}" if len(members) > 1 else f"member {gov_m}"
    sh.table(f"Governing ratio per case, {what}", rows,
             columns=["member", "case", "P (compression +)", "M max", "V max", "ratio", "governing limit state"],
             note=f"Each case checked with every applicable limit state; {gov_m} in {gov.case} governs and is worked below.")
    src = f"frame analysis, {gov.case}"
    sh.given(f"P_fr{s}", gov.P, f"Axial force in {gov_m} (compression +)", source=src)
    sh.given(f"M_fr{s}", gov.M, f"Largest bending moment in {gov_m} (at x = {gov.x_M:~.4g})", source=src)
    sh.given(f"V_fr{s}", gov.V, f"Largest shear in {gov_m}", source=src)
    p_name, m_name = f"P_fr{s}", f"M_fr{s}"
    if B2 is not None:
        b2 = B2 if isinstance(B2, str) and B2 in sh else f"B_2fr{s}"
        if b2 != B2:
            sh.given(b2, amp, "Sway amplifier B2", source="AISC 360-16 Appendix 8")
        p_name, m_name = f"P_fr2{s}", f"M_fr2{s}"
        sh.step(p_name, f"{b2}*P_fr{s}", "Axial force, second order (all of it as from lateral translation)",
                ref="AISC 360-16 Eq. A-8-2")
        sh.step(m_name, f"{b2}*M_fr{s}", "Bending moment, second order (all of it as from lateral translation)",
                ref="AISC 360-16 Eq. A-8-1")
    return check_member(sh, section, L=L, P=p_name, M_x=m_name, V=f"V_fr{s}", suffix=suffix, **options)
