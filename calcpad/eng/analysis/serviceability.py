"""Deflection limits as sheet checks: ``Δ <= span/n`` for the usual limits (L/180, L/240, L/360,
H/100) or any ratio the engineer chooses.

The L/180, L/240 and L/360 limits are those of IBC 2018 Table 1604.3 (from memory; its footnotes
and the member type decide which applies); H/100 for the sway of an equipment stand or post is
common practice, not a code value. The engineer picks the limit; the sheet shows it with its
source.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis._values import to_float

__all__ = ["LIMITS", "add_deflection_check", "add_result_given", "deflection_ratio", "limit_ratio"]

#: Named deflection limits: name -> (n in span/n, source).
LIMITS: dict[str, tuple[float, str]] = {
    "L/180": (180.0, "IBC 2018 Table 1604.3 (from memory)"),
    "L/240": (240.0, "IBC 2018 Table 1604.3 (from memory)"),
    "L/360": (360.0, "IBC 2018 Table 1604.3 (from memory)"),
    "L/120": (120.0, "user-chosen limit"),
    "H/100": (100.0, "common practice for stand/post sway"),
    "H/200": (200.0, "user-chosen limit"),
    "H/400": (400.0, "user-chosen limit"),
}


def limit_ratio(limit: str | float) -> tuple[float, str]:
    """``(n, source)`` for a named limit (``"L/240"``) or a number ``n`` (user-chosen)."""
    if isinstance(limit, bool):
        raise InputError(f"deflection limit: got {limit!r}; expected e.g. 'L/240' or a number such as 300")
    if isinstance(limit, (int, float)):
        if not limit > 0:
            raise InputError(f"deflection limit: got {limit!r}; expected a number greater than zero")
        return float(limit), "user-chosen limit"
    if isinstance(limit, str) and limit.strip() in LIMITS:
        return LIMITS[limit.strip()]
    if isinstance(limit, str) and "/" in limit:
        head, _, tail = limit.partition("/")
        try:
            n = float(tail)
        except ValueError:
            n = -1.0
        if head.strip() in ("L", "H") and n > 0:
            return n, "user-chosen limit"
    raise InputError(f"deflection limit: got {limit!r}; expected one of {list(LIMITS)}, 'L/n', 'H/n' or a number n")


def deflection_ratio(delta: Any, span: Any, limit: str | float = "L/240") -> float:
    """Demand/capacity ratio ``|Δ| / (span/n)`` (OK when <= 1).

    Args:
        delta: Deflection (quantity, string or inches).
        span: Span or height (quantity, string or inches).
        limit: Named limit or the number n.
    """
    n, _ = limit_ratio(limit)
    d = abs(to_float(delta, "in", "deflection"))
    L = to_float(span, "in", "span")
    if L <= 0:
        raise InputError(f"span: got {span!r}; expected a length greater than zero")
    return d / (L / n)


def add_result_given(
    sh: Any, name: str, value: Any, description: str, source: str = "frame analysis", *, sig: int | None = 4
) -> str:
    """Put an analysis result (a quantity) into a sheet as a given with its source, rounded to
    ``sig`` significant figures (None keeps every digit)."""
    if sig is not None and hasattr(value, "magnitude"):
        value = Q_(float(f"{float(value.magnitude):.{sig}g}"), value.units)
    sh.given(name, value, description, source=source)
    return name


def add_deflection_check(
    sh: Any,
    delta: str | Any,
    span: str | Any,
    limit: str | float = "L/240",
    *,
    suffix: str = "",
    title: str | None = None,
) -> str:
    """Add ``Delta_allow = span/n`` and the check ``|Δ| <= Delta_allow`` to sheet ``sh``.

    Args:
        sh: The sheet.
        delta: Name of an existing step/given with the deflection, or a value to add as a given.
        span: Name of an existing step/given with the span or height, or a value to add as a given.
        limit: ``"L/240"``, ``"H/100"`` ..., or the number n.
        suffix: Appended to the names added.
        title: Check title (default: "Deflection <limit>").

    Returns:
        The check key.
    """
    n, source = limit_ratio(limit)
    label = limit if isinstance(limit, str) else f"span/{n:g}"
    d_name = delta if isinstance(delta, str) and delta in sh else None
    s_name = span if isinstance(span, str) and span in sh else None
    if d_name is None:
        d_name = f"Delta{suffix}"
        sh.given(d_name, Q_(abs(to_float(delta, "in", "deflection")), "in") if not isinstance(delta, str) else delta,
                 "Deflection", source="analysis")
    if s_name is None:
        s_name = f"L_d{suffix}"
        sh.given(s_name, span if isinstance(span, str) else Q_(to_float(span, "in", "span"), "in"), "Span or height")
    sh.given(f"n_lim{suffix}", n, f"Deflection limit divisor ({label})", source=source)
    sh.step(f"Delta_allow{suffix}", f"{s_name}/n_lim{suffix}", "Allowable deflection", ref=source)
    sh.step(f"Delta_abs{suffix}", f"abs({d_name})", "Deflection magnitude")
    return sh.check(title or f"Deflection {label}", demand=f"Delta_abs{suffix}", capacity=f"Delta_allow{suffix}", ref=source)
