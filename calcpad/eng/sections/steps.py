"""Traceable sheet steps for section properties (tube, rectangular tube, any shape, built-up).

Each function adds givens and formula steps to a :class:`calcpad.core.sheet.Sheet` and returns a
dict mapping a property (``"A"``, ``"I"``, ``"S_top"``, ...) to the step name it added, so the
caller can refer to them in later steps. ``suffix`` makes the names unique when the same calc
appears twice in one sheet (``suffix="R"`` gives ``A_R``, ``I_x_R``, ...). The formulas are the
same closed forms the numeric path uses (tests check the two agree).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.sections.builtup import BuiltUp
from calcpad.eng.sections.props import UNITS, PublishedProps
from calcpad.eng.sections.shapes import RectTube, RoundTube, Shape
from calcpad.eng.sections.shop import note_shop_section

__all__ = ["add_builtup_steps", "add_rect_tube_steps", "add_round_tube_steps", "add_shape_props"]

_ROUND_REF = "common practice (solid mechanics)"
_B41 = "AISC 360-16 Table B4.1"


def _n(base: str, suffix: str) -> str:
    if not suffix:
        return base
    return base + (suffix if suffix.startswith("_") else "_" + suffix)


def _len(value: Any) -> Any:
    return Q_(float(value), "in") if isinstance(value, (int, float)) and not isinstance(value, bool) else value


def add_round_tube_steps(sheet: Any, D_o: Any, t: Any, suffix: str = "", *, source: str = "") -> dict[str, str]:
    """Givens ``D_o``, ``t`` and steps ``D_i, A, I, c, S, Z, r`` and the D/t ratio of a round tube.

    ``D_o`` and ``t`` are lengths (floats are inches); ``t`` is the design wall.
    """
    RoundTube(D_o, t)  # validate with the same rules as the numeric path
    n = {k: _n(k, suffix) for k in ("D_o", "t", "D_i", "A", "I", "c", "S", "Z", "r", "lambda_D")}
    sheet.given(n["D_o"], _len(D_o), "Outside diameter", source=source)
    sheet.given(n["t"], _len(t), "Design wall thickness", source=source)
    sheet.step(n["D_i"], f"{n['D_o']} - 2*{n['t']}", "Inside diameter", unit="in", ref=_ROUND_REF)
    sheet.step(n["A"], f"pi/4*({n['D_o']}**2 - {n['D_i']}**2)", "Area", unit="in^2", ref=_ROUND_REF)
    sheet.step(n["I"], f"pi/64*({n['D_o']}**4 - {n['D_i']}**4)", "Moment of inertia", unit="in^4", ref=_ROUND_REF)
    sheet.step(n["c"], f"{n['D_o']}/2", "Distance to extreme fibre", unit="in", ref=_ROUND_REF)
    sheet.step(n["S"], f"{n['I']}/{n['c']}", "Elastic section modulus", unit="in^3", ref=_ROUND_REF)
    sheet.step(n["Z"], f"({n['D_o']}**3 - {n['D_i']}**3)/6", "Plastic section modulus", unit="in^3", ref=_ROUND_REF)
    sheet.step(n["r"], f"sqrt({n['I']}/{n['A']})", "Radius of gyration", unit="in", ref=_ROUND_REF)
    sheet.step(n["lambda_D"], f"{n['D_o']}/{n['t']}", "Diameter-to-thickness ratio D/t", ref=_B41)
    return n


def add_rect_tube_steps(sheet: Any, H: Any, B: Any, t: Any, r_o: Any | None = None, suffix: str = "", *,
                        source: str = "") -> dict[str, str]:
    """Steps for a rectangular tube with rounded corners (outside radius ``r_o``, default ``2*t``).

    Each rounded corner removes a spandrel of area ``(1 - pi/4)*r**2`` whose centroid lies
    ``k_c*r`` from the corner and whose own moment of inertia is ``j_c*r**4``; the steps show the
    outer and inner rounded rectangles and their difference.
    """
    tube = RectTube(H, B, t, r_out=r_o)
    if tube.r_out < tube.t:
        raise InputError(f"r_o (outside corner radius): {tube.r_out:g} in; expected at least the wall t = {tube.t:g} in "
                         "for the sheet steps (inner corners would be sharp)")
    keys = ("H", "B", "t", "r_o", "r_i", "k_c", "j_c", "A", "I_x_o", "I_x_i", "I_x", "I_y_o", "I_y_i", "I_y",
            "c_x", "c_y", "S_x", "S_y", "Z_x", "Z_y", "r_x", "r_y", "lambda_b", "lambda_h")
    n = {k: _n(k, suffix) for k in keys}
    H_, B_, t_, ro, ri, kc, jc = (n[k] for k in ("H", "B", "t", "r_o", "r_i", "k_c", "j_c"))
    ref = "common practice (rounded corners as spandrels)"
    sheet.given(H_, _len(H), "Outside depth", source=source)
    sheet.given(B_, _len(B), "Outside width", source=source)
    sheet.given(t_, _len(t), "Design wall thickness", source=source)
    if r_o is None:
        sheet.step(ro, f"2*{t_}", "Outside corner radius", unit="in", ref="AISC Manual HSS tables (r = 2t)")
    else:
        sheet.given(ro, _len(r_o), "Outside corner radius", source=source)
    sheet.step(ri, f"{ro} - {t_}", "Inside corner radius", unit="in", ref=ref)
    sheet.step(kc, "(10 - 3*pi)/(12 - 3*pi)", "Corner spandrel centroid from corner, per unit radius", ref=ref)
    sheet.step(jc, f"1 - 5*pi/16 - (1 - pi/4)*{kc}**2", "Corner spandrel own I, per unit radius^4", ref=ref)
    sheet.step(n["A"], f"{B_}*{H_} - (4 - pi)*{ro}**2 - (({B_} - 2*{t_})*({H_} - 2*{t_}) - (4 - pi)*{ri}**2)",
               "Area", unit="in^2", ref=ref)

    def corner_i(r: str, half: str) -> str:
        return f"4*({jc}*{r}**4 + (1 - pi/4)*{r}**2*({half} - {kc}*{r})**2)"

    hi, bi = f"({H_} - 2*{t_})", f"({B_} - 2*{t_})"
    sheet.step(n["I_x_o"], f"{B_}*{H_}**3/12 - {corner_i(ro, f'{H_}/2')}", "I of outer rounded rectangle", unit="in^4", ref=ref)
    sheet.step(n["I_x_i"], f"{bi}*{hi}**3/12 - {corner_i(ri, f'{hi}/2')}", "I of inner rounded rectangle", unit="in^4", ref=ref)
    sheet.step(n["I_x"], f"{n['I_x_o']} - {n['I_x_i']}", "Moment of inertia about x", unit="in^4", ref=ref)
    sheet.step(n["I_y_o"], f"{H_}*{B_}**3/12 - {corner_i(ro, f'{B_}/2')}", "I_y of outer rounded rectangle", unit="in^4", ref=ref)
    sheet.step(n["I_y_i"], f"{hi}*{bi}**3/12 - {corner_i(ri, f'{bi}/2')}", "I_y of inner rounded rectangle", unit="in^4", ref=ref)
    sheet.step(n["I_y"], f"{n['I_y_o']} - {n['I_y_i']}", "Moment of inertia about y", unit="in^4", ref=ref)
    sheet.step(n["c_x"], f"{H_}/2", "Distance to extreme fibre (x axis)", unit="in", ref=ref)
    sheet.step(n["c_y"], f"{B_}/2", "Distance to extreme fibre (y axis)", unit="in", ref=ref)
    sheet.step(n["S_x"], f"{n['I_x']}/{n['c_x']}", "Elastic section modulus about x", unit="in^3", ref=ref)
    sheet.step(n["S_y"], f"{n['I_y']}/{n['c_y']}", "Elastic section modulus about y", unit="in^3", ref=ref)

    def z(b: str, h: str, r: str) -> str:
        return f"{b}*{h}**2/4 - 4*(1 - pi/4)*{r}**2*({h}/2 - {kc}*{r})"

    sheet.step(n["Z_x"], f"{z(B_, H_, ro)} - ({z(bi, hi, ri)})", "Plastic section modulus about x", unit="in^3", ref=ref)
    sheet.step(n["Z_y"], f"{z(H_, B_, ro)} - ({z(hi, bi, ri)})", "Plastic section modulus about y", unit="in^3", ref=ref)
    sheet.step(n["r_x"], f"sqrt({n['I_x']}/{n['A']})", "Radius of gyration about x", unit="in", ref=ref)
    sheet.step(n["r_y"], f"sqrt({n['I_y']}/{n['A']})", "Radius of gyration about y", unit="in", ref=ref)
    sheet.step(n["lambda_b"], f"({B_} - 3*{t_})/{t_}", "Width-to-thickness ratio b/t", ref="AISC 360-16 B4.1b(d)")
    sheet.step(n["lambda_h"], f"({H_} - 3*{t_})/{t_}", "Depth-to-thickness ratio h/t", ref="AISC 360-16 B4.1b(d)")
    return n


_SHAPE_GIVENS = [("A", "A", "Area"), ("I_x", "Ix", "Moment of inertia about x"), ("S_x", "Sx", "Elastic section modulus about x (smaller)"),
                 ("Z_x", "Zx", "Plastic section modulus about x"), ("r_x", "rx", "Radius of gyration about x"),
                 ("I_y", "Iy", "Moment of inertia about y"), ("S_y", "Sy", "Elastic section modulus about y (smaller)"),
                 ("Z_y", "Zy", "Plastic section modulus about y"), ("r_y", "ry", "Radius of gyration about y")]


def add_shape_props(sheet: Any, shape: Shape | BuiltUp, suffix: str = "", *, names: list[str] | None = None,
                    source: str | None = None) -> dict[str, str]:
    """Add a shape's (or built-up section's) properties as givens with their source.

    ``names`` picks from ``A, I_x, S_x, Z_x, r_x, I_y, S_y, Z_y, r_y`` (default: all).
    """
    p = shape.props
    if isinstance(p, PublishedProps):
        src = source or f"{shape.name}: {p.source}"
    else:
        src = source or f"{shape.name}: computed from dimensions (calcpad.eng.sections)"
    out: dict[str, str] = {}
    for step_name, prop, desc in _SHAPE_GIVENS:
        if names is not None and step_name not in names:
            continue
        name = _n(step_name, suffix)
        sheet.given(name, Q_(p.value(prop), UNITS[prop]), desc, source=src)
        out[step_name] = name
    note_shop_section(sheet, shape.name)
    return out


def add_builtup_steps(sheet: Any, builtup: BuiltUp, suffix: str = "", *, plastic: bool = True) -> dict[str, str]:
    """Composite properties of a built-up section, shown the hand-calc way.

    Adds a parallel-axis table, then per member the givens ``A_i``, ``x_i``, ``y_i``, ``I_x0_i``,
    ``I_y0_i`` (own centroidal values), and the steps ``A = sum(A_i)``,
    ``y_bar = sum(A_i*y_i)/A``, ``x_bar``, ``I_x = sum(I_x0_i + A_i*(y_i - y_bar)**2)``, ``I_y``,
    the fibre distances and section moduli to each extreme fibre, and radii of gyration. When a
    member or the composite is unsymmetric, ``I_xy0_i`` givens and an ``I_xy`` step are added too.
    With ``plastic`` the numerically found plastic moduli are added as givens.
    """
    if not isinstance(builtup, BuiltUp) or not builtup.members:
        raise InputError(f"builtup: {builtup!r}; expected a BuiltUp with at least one member")
    p = builtup.props
    x0, y0, x1, y1 = builtup.bbox
    df = builtup.table()
    shown = df[["member", "A", "x", "y", "A*y", "I_x0", "d_y", "A*d_y^2", "I_x", "I_y0", "d_x", "I_y"]].copy()
    shown = shown.astype(object).where(shown.notna(), "")
    sheet.table(f"Parallel-axis table - {builtup.name} (lengths in in, A in in², I in in⁴)", shown,
                note="I_x = I_x0 + A*d_y^2 about the composite centroid; likewise I_y")
    n: dict[str, str] = {}
    a_terms, ax_terms, ay_terms, ix_terms, iy_terms, ixy_terms = [], [], [], [], [], []
    with_ixy = abs(p.Ixy) > 1e-9 * max(p.Ix, p.Iy) or any(abs(m.central.Ixy) > 1e-9 * max(m.central.Ix, m.central.Iy)
                                                          for m in builtup.members)
    for i, m in enumerate(builtup.members, start=1):
        c = m.central
        tag = f"{i}{suffix if suffix.startswith('_') or not suffix else '_' + suffix}"
        a, x, y, ix0, iy0 = f"A_{tag}", f"x_{tag}", f"y_{tag}", f"I_x0_{tag}", f"I_y0_{tag}"
        src = f"{m.label} ({m.shape.name})"
        sheet.given(a, Q_(c.A, "in**2"), f"Area of {m.label}", source=src)
        sheet.given(x, Q_(c.xc, "in"), f"Centroid x of {m.label}", source="placement")
        sheet.given(y, Q_(c.yc, "in"), f"Centroid y of {m.label}", source="placement")
        sheet.given(ix0, Q_(c.Ix, "in**4"), f"I about own centroid (x) of {m.label}", source=src)
        sheet.given(iy0, Q_(c.Iy, "in**4"), f"I about own centroid (y) of {m.label}", source=src)
        if with_ixy:
            ixy0 = f"I_xy0_{tag}"
            sheet.given(ixy0, Q_(c.Ixy, "in**4"), f"Product of inertia about own centroid of {m.label}", source=src)
            ixy_terms.append((ixy0, a, x, y))
        a_terms.append(a)
        ax_terms.append(f"{a}*{x}")
        ay_terms.append(f"{a}*{y}")
        n.update({f"A_{i}": a, f"x_{i}": x, f"y_{i}": y})
        ix_terms.append((ix0, a, y))
        iy_terms.append((iy0, a, x))
    keys = ("A", "x_bar", "y_bar", "I_x", "I_y", "I_xy", "y_top", "y_bot", "x_left", "x_right", "c_top", "c_bot", "c_left",
            "c_right", "S_x_top", "S_x_bot", "S_y_left", "S_y_right", "r_x", "r_y", "Z_x", "Z_y")
    n.update({k: _n(k, suffix) for k in keys})
    ref = "parallel-axis theorem (common practice)"
    sheet.step(n["A"], " + ".join(a_terms), "Composite area", unit="in^2", ref=ref)
    sheet.step(n["x_bar"], f"({' + '.join(ax_terms)})/{n['A']}", "Composite centroid x", unit="in", ref=ref)
    sheet.step(n["y_bar"], f"({' + '.join(ay_terms)})/{n['A']}", "Composite centroid y", unit="in", ref=ref)
    sheet.step(n["I_x"], " + ".join(f"({i0} + {a}*({y} - {n['y_bar']})**2)" for i0, a, y in ix_terms),
               "Composite moment of inertia about x", unit="in^4", ref=ref)
    sheet.step(n["I_y"], " + ".join(f"({i0} + {a}*({x} - {n['x_bar']})**2)" for i0, a, x in iy_terms),
               "Composite moment of inertia about y", unit="in^4", ref=ref)
    if with_ixy:
        sheet.step(n["I_xy"], " + ".join(f"({i0} + {a}*({x} - {n['x_bar']})*({y} - {n['y_bar']}))" for i0, a, x, y in ixy_terms),
                   "Composite product of inertia", unit="in^4", ref=ref)
    else:
        n.pop("I_xy")
    sheet.given(n["y_top"], Q_(y1, "in"), "Top extreme fibre", source="outline")
    sheet.given(n["y_bot"], Q_(y0, "in"), "Bottom extreme fibre", source="outline")
    sheet.given(n["x_left"], Q_(x0, "in"), "Left extreme fibre", source="outline")
    sheet.given(n["x_right"], Q_(x1, "in"), "Right extreme fibre", source="outline")
    sheet.step(n["c_top"], f"{n['y_top']} - {n['y_bar']}", "Centroid to top fibre", unit="in")
    sheet.step(n["c_bot"], f"{n['y_bar']} - {n['y_bot']}", "Centroid to bottom fibre", unit="in")
    sheet.step(n["c_left"], f"{n['x_bar']} - {n['x_left']}", "Centroid to left fibre", unit="in")
    sheet.step(n["c_right"], f"{n['x_right']} - {n['x_bar']}", "Centroid to right fibre", unit="in")
    sheet.step(n["S_x_top"], f"{n['I_x']}/{n['c_top']}", "Section modulus to top fibre", unit="in^3")
    sheet.step(n["S_x_bot"], f"{n['I_x']}/{n['c_bot']}", "Section modulus to bottom fibre", unit="in^3")
    sheet.step(n["S_y_left"], f"{n['I_y']}/{n['c_left']}", "Section modulus to left fibre", unit="in^3")
    sheet.step(n["S_y_right"], f"{n['I_y']}/{n['c_right']}", "Section modulus to right fibre", unit="in^3")
    sheet.step(n["r_x"], f"sqrt({n['I_x']}/{n['A']})", "Radius of gyration about x", unit="in")
    sheet.step(n["r_y"], f"sqrt({n['I_y']}/{n['A']})", "Radius of gyration about y", unit="in")
    if plastic:
        src = "plastic neutral axis found numerically from the outlines (calcpad.eng.sections.builtup)"
        sheet.given(n["Z_x"], Q_(p.Zx, "in**3"), "Plastic section modulus about x", source=src)
        sheet.given(n["Z_y"], Q_(p.Zy, "in**3"), "Plastic section modulus about y", source=src)
    else:
        n.pop("Z_x")
        n.pop("Z_y")
    if abs(p.Ixy) > 1e-6 * max(p.Ix, p.Iy):
        sheet.note(f"{builtup.name}: product of inertia I_xy = {p.Ixy:.4g} in⁴ is not zero, so x and y are not principal "
                   f"axes (principal: I_max = {p.I_max:.4g} in⁴, I_min = {p.I_min:.4g} in⁴ at {p.theta_p:.1f}°). "
                   "Bending about x alone causes some deflection about y.")
    return n


def add_section_steps(sheet: Any, shape: Shape, suffix: str = "", *, source: str | None = None) -> dict[str, str]:
    """Section properties of any shape on a sheet, as steps where a hand calc is usual.

    Catalog shapes get their published properties as givens with the table as source. Other
    round tubes and rectangular tubes (outside corner radius at least the wall) get the full
    formula steps; other shapes get their properties as givens with the source. The returned
    dict always has the keys ``A, I_x, S_x, Z_x, r_x, I_y, S_y, Z_y, r_y`` (round tubes: the
    same step names for x and y).
    """
    src = source if source is not None else shape.name
    note_shop_section(sheet, shape.name)
    if isinstance(shape.props, PublishedProps):  # a catalog shape: the tabulated values, not a recomputation
        return add_shape_props(sheet, shape, suffix, source=source)
    if isinstance(shape, RoundTube):
        n = add_round_tube_steps(sheet, shape.D, shape.t, suffix, source=src)
        return {**n, "I_x": n["I"], "S_x": n["S"], "Z_x": n["Z"], "r_x": n["r"],
                "I_y": n["I"], "S_y": n["S"], "Z_y": n["Z"], "r_y": n["r"]}
    if isinstance(shape, RectTube) and shape.r_out >= shape.t:
        return add_rect_tube_steps(sheet, shape.H, shape.B, shape.t, shape.r_out, suffix, source=src)
    return add_shape_props(sheet, shape, suffix, source=source)
