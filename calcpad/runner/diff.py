"""Compare two job records: what changed between two runs (or two revisions) of a job.

:func:`diff_records` lists, in the order a reviewer reads them:

- ``added`` / ``removed``: calcs present in one record only (a calc is matched by template and
  member mark);
- ``inputs``: inputs of matched calcs whose typed or parsed value changed;
- ``flips``: checks whose status changed (OK → NG ...), and calcs that started or stopped
  failing;
- ``results``: sheet values (results, catalog givens, check ratios) that moved by more than a
  relative tolerance ``rtol`` (values are compared in the new record's unit); givens that are a
  changed job input are listed once, under ``inputs``;
- ``templates``: templates of the same name whose source digest changed;
- ``data``: shipped data files (catalogs, materials) and the job's shop table whose digest
  changed, appeared or went.

``versions`` (calcpad, Python, libraries) are listed as notes and do not count as a change.
:func:`diff_table` renders a diff for the terminal (rich), :func:`diff_html` as an HTML fragment
("Changes since revision X") a submittal can include.
"""

from __future__ import annotations

import html
import math
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

from calcpad.runner.record import SpooledCalcs

__all__ = ["KINDS", "Change", "RecordDiff", "diff_html", "diff_records", "diff_table"]

#: Change kinds in report order, with their display label.
KINDS = {
    "added": "calc added",
    "removed": "calc removed",
    "inputs": "input changed",
    "flips": "status flipped",
    "results": "result moved",
    "templates": "template changed",
    "data": "data file changed",
}


@dataclass(frozen=True)
class Change:
    """One difference: which calc (``""`` for job-wide), which item, old and new as text."""

    calc: str
    item: str
    old: str
    new: str
    note: str = ""


@dataclass
class RecordDiff:
    """The differences between an old and a new record."""

    old_label: str
    new_label: str
    rtol: float
    added: list[Change] = field(default_factory=list)
    removed: list[Change] = field(default_factory=list)
    inputs: list[Change] = field(default_factory=list)
    flips: list[Change] = field(default_factory=list)
    results: list[Change] = field(default_factory=list)
    templates: list[Change] = field(default_factory=list)
    data: list[Change] = field(default_factory=list)
    versions: list[Change] = field(default_factory=list)

    @property
    def changed(self) -> bool:
        """True when anything but the versions differs."""
        return any(getattr(self, k) for k in KINDS)

    def rows(self) -> list[tuple[str, Change]]:
        """``(kind, change)`` pairs in report order (versions excluded)."""
        return [(k, c) for k in KINDS for c in getattr(self, k)]


# ----------------------------------------------------------------------------- formatting


def _num(v: Any) -> str:
    if isinstance(v, bool) or not isinstance(v, (int, float)):
        return "—" if v is None else str(v)
    return f"{v:.6g}"


def _qty(rec: Any) -> str:
    if not isinstance(rec, dict):
        return "—"
    unit = rec.get("unit")
    text = _num(rec.get("value"))
    if unit:
        text += f" {unit}"
    if rec.get("case"):
        text += f" ({rec['case']})"
    return text


def _typed(rec: Any) -> str:
    if not isinstance(rec, dict):
        return "—"
    typed = rec.get("typed")
    if typed is None:
        return f"{_qty(rec)} (default)"
    return typed if isinstance(typed, str) else _num(typed) if not isinstance(typed, dict) else _qty(typed)


def _short(sha: Any) -> str:
    return sha[:12] if isinstance(sha, str) else "—"


def _calc_label(c: dict[str, Any]) -> str:
    return f"{c.get('member', '?')} ({c.get('template', '?')})"


# ----------------------------------------------------------------------------- comparing


def _close(a: Any, b: Any, rtol: float) -> bool:
    if isinstance(a, bool) or isinstance(b, bool) or not isinstance(a, (int, float)) or not isinstance(b, (int, float)):
        return a == b
    if not (math.isfinite(a) and math.isfinite(b)):
        return a == b
    return abs(a - b) <= rtol * max(abs(a), abs(b))


def _in_unit(rec: dict[str, Any], unit: Any) -> Any:
    """``rec``'s value expressed in ``unit`` (None when the units do not convert)."""
    value = rec.get("value")
    if rec.get("unit") == unit or not isinstance(value, (int, float)) or isinstance(value, bool):
        return value
    from calcpad.core.units import Q_

    try:
        return float(Q_(value, rec.get("unit") or "").to(unit or "").magnitude)
    except Exception:  # pint raises several types for an unknown or incompatible unit
        return None


def _moved(old: Any, new: Any, rtol: float) -> bool:
    if not isinstance(old, dict) or not isinstance(new, dict):
        return old != new
    if old.get("case") != new.get("case"):
        return True
    if old.get("unit") == new.get("unit"):
        return not _close(old.get("value"), new.get("value"), rtol)
    converted = _in_unit(old, new.get("unit"))
    return converted is None or not _close(converted, new.get("value"), rtol)


def _rel(a: Any, b: Any) -> str:
    """``"+12.500%"``: the relative move from ``a`` to ``b`` (numbers), or ""."""
    if not all(isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v) for v in (a, b)) or not a:
        return ""
    return f"{(b - a) / abs(a):+.3%}"


def _rel_q(old: Any, new: Any) -> str:
    if not isinstance(old, dict) or not isinstance(new, dict):
        return ""
    return _rel(_in_unit(old, new.get("unit")), new.get("value"))


def _keyed(items: list[dict[str, Any]], key: Any) -> dict[Any, dict[str, Any]]:
    """Index items by ``key(item)``; repeats get an occurrence number so none is lost."""
    seen: Counter[Any] = Counter()
    out: dict[Any, dict[str, Any]] = {}
    for it in items:
        k = key(it)
        out[(k, seen[k])] = it
        seen[k] += 1
    return out


def _calcs(value: Any) -> Sequence[dict[str, Any]]:
    """A record's calcs: read one at a time when spooled or left in the file, else the dicts listed."""
    return value if isinstance(value, SpooledCalcs) else _dicts(value)


def _keyed_places(calcs: Sequence[dict[str, Any]]) -> dict[Any, int]:
    """Index of each calc by (template, member) and occurrence (as :func:`_keyed`), not the calc itself."""
    seen: Counter[Any] = Counter()
    out: dict[Any, int] = {}
    for i, c in enumerate(calcs):
        k = (c.get("template"), c.get("member"))
        out[(k, seen[k])] = i
        seen[k] += 1
    return out


def _dicts(value: Any) -> list[dict[str, Any]]:
    return [v for v in value if isinstance(v, dict)] if isinstance(value, list) else []


def _mapping(value: Any) -> dict[str, Any]:
    return value if isinstance(value, dict) else {}


def _compare_values(d: RecordDiff, label: str, sheet: str, old: dict[str, Any], new: dict[str, Any], skip: set[str]) -> None:
    for name in [*old, *(n for n in new if n not in old)]:
        if name in skip:
            continue
        a, b = old.get(name), new.get(name)
        if _moved(a, b, d.rtol):
            d.results.append(Change(label, f"{sheet} › {name}", _qty(a), _qty(b), _rel_q(a, b)))


def _compare_sheets(d: RecordDiff, label: str, old: dict[str, Any], new: dict[str, Any], skip: set[str]) -> None:
    olds = _keyed(_dicts(old.get("sheets")), lambda s: s.get("title"))
    news = _keyed(_dicts(new.get("sheets")), lambda s: s.get("title"))
    for key in [*olds, *(k for k in news if k not in olds)]:
        title = str(key[0]) + (f" #{key[1] + 1}" if key[1] else "")
        a, b = olds.get(key), news.get(key)
        if a is None or b is None:
            d.results.append(Change(label, f"sheet {title}", "—" if a is None else "present", "—" if b is None else "present"))
            continue
        _compare_values(d, label, title, _mapping(a.get("inputs")), _mapping(b.get("inputs")), skip)
        _compare_values(d, label, title, _mapping(a.get("results")), _mapping(b.get("results")), set())
        ca = _keyed(_dicts(a.get("checks")), lambda c: c.get("key"))
        cb = _keyed(_dicts(b.get("checks")), lambda c: c.get("key"))
        for ck in [*ca, *(k for k in cb if k not in ca)]:
            x, y = ca.get(ck), cb.get(ck)
            name = (x or y or {}).get("title") or str(ck[0])
            item = f"{title} › {name}"
            if x is None or y is None:
                d.results.append(Change(label, f"{item} (check)", "—" if x is None else "present", "—" if y is None else "present"))
                continue
            if x.get("status") != y.get("status"):
                d.flips.append(Change(label, item, f"{x.get('status')} ({_num(x.get('ratio'))})", f"{y.get('status')} ({_num(y.get('ratio'))})"))
            if not _close(x.get("ratio"), y.get("ratio"), d.rtol):
                d.results.append(Change(label, f"{item} (ratio)", _num(x.get("ratio")), _num(y.get("ratio")), _rel(x.get("ratio"), y.get("ratio"))))


def _compare_inputs(d: RecordDiff, label: str, old: dict[str, Any], new: dict[str, Any]) -> set[str]:
    changed: set[str] = set()
    for name in [*old, *(n for n in new if n not in old)]:
        a, b = old.get(name), new.get(name)
        same_typed = isinstance(a, dict) and isinstance(b, dict) and a.get("typed") == b.get("typed")
        same_value = isinstance(a, dict) and isinstance(b, dict) and a.get("unit") == b.get("unit") and _close(a.get("value"), b.get("value"), 0.0)
        if same_typed and not same_value:  # same text read differently (or the record was edited)
            changed.add(name)
            d.inputs.append(Change(label, name, _qty(a), _qty(b), f"typed {_typed(b)} in both"))
        elif not same_typed:
            changed.add(name)
            d.inputs.append(Change(label, name, _typed(a), _typed(b)))
    return changed


def _compare_calc(d: RecordDiff, old: dict[str, Any], new: dict[str, Any]) -> None:
    label = _calc_label(new)
    changed = _compare_inputs(d, label, _mapping(old.get("inputs")), _mapping(new.get("inputs")))
    a, b = old.get("status"), new.get("status")
    if (a == "ERROR") != (b == "ERROR"):
        d.flips.append(Change(label, "calc", str(a), str(b), _mapping(new.get("error") or old.get("error")).get("message", "")))
    elif a == "ERROR" and old.get("error") != new.get("error"):
        d.flips.append(Change(label, "calc error", _mapping(old.get("error")).get("message", ""), _mapping(new.get("error")).get("message", "")))
    _compare_sheets(d, label, old, new, changed)


def _compare_files(out: list[Change], old: dict[str, Any], new: dict[str, Any]) -> None:
    for name in [*old, *(n for n in new if n not in old)]:
        a, b = old.get(name), new.get(name)
        if a != b:
            out.append(Change("", name, _short(a), _short(b), "added" if a is None else "removed" if b is None else ""))


def _templates(rec: dict[str, Any]) -> dict[str, Any]:
    out: dict[str, Any] = {}
    for t in _dicts(rec.get("templates")):
        out.setdefault(str(t.get("name")), t.get("sha256"))
    return out


def _data(rec: dict[str, Any]) -> dict[str, Any]:
    """Digests of the shipped data files and of the shop table the job named (if any)."""
    out = dict(_mapping(rec.get("data")))
    shop = _mapping(rec.get("shop_sections"))
    if shop:
        out[f"shop table {shop.get('file')}"] = shop.get("sha256")
    return out


def _revision_label(rec: dict[str, Any], fallback: str) -> str:
    rev = _mapping(rec.get("job")).get("revision")
    return str(rev) if rev not in (None, "") else fallback


def diff_records(old: dict[str, Any], new: dict[str, Any], rtol: float = 1e-6, old_label: str | None = None, new_label: str | None = None) -> RecordDiff:
    """Everything that differs between two job records (see the module docstring)."""
    d = RecordDiff(old_label or _revision_label(old, "old"), new_label or _revision_label(new, "new"), rtol)
    old_calcs = _calcs(old.get("calcs"))  # a record read from a file holds its calcs there: one at a time
    olds = _keyed_places(old_calcs)
    matched: set[Any] = set()
    seen: Counter[Any] = Counter()
    for c in _calcs(new.get("calcs")):
        k = (c.get("template"), c.get("member"))
        key = (k, seen[k])
        seen[k] += 1
        if key not in olds:
            d.added.append(Change(_calc_label(c), str(c.get("title") or c.get("template_title") or ""), "—", c.get("status", "—")))
        else:
            matched.add(key)
            _compare_calc(d, old_calcs[olds[key]], c)
    for key, i in olds.items():
        if key not in matched:
            c = old_calcs[i]
            d.removed.append(Change(_calc_label(c), str(c.get("title") or c.get("template_title") or ""), c.get("status", "—"), "—"))
    _compare_files(d.templates, _templates(old), _templates(new))
    _compare_files(d.data, _data(old), _data(new))
    ov, nv = _mapping(old.get("versions")), _mapping(new.get("versions"))
    for name in [*ov, *(n for n in nv if n not in ov)]:
        if ov.get(name) != nv.get(name):
            d.versions.append(Change("", name, str(ov.get(name, "—")), str(nv.get(name, "—"))))
    return d


# ----------------------------------------------------------------------------- printing


def diff_table(diff: RecordDiff, title: str | None = None) -> Any:
    """A rich Table of the changes (one row each; versions as a caption)."""
    from rich.table import Table

    t = Table(title=title or f"Changes from {diff.old_label} to {diff.new_label}", title_justify="left")
    same = diff.old_label == diff.new_label
    for col in ("What", "Calc", "Item", f"old ({diff.old_label})" if same else diff.old_label, f"new ({diff.new_label})" if same else diff.new_label, "Note"):
        t.add_column(col, overflow="fold")
    for kind, c in diff.rows():
        t.add_row(KINDS[kind], c.calc, c.item, c.old, c.new, c.note)
    if diff.versions:
        t.caption = "versions: " + "; ".join(f"{c.item} {c.old} → {c.new}" for c in diff.versions)
        t.caption_justify = "left"
    return t


def no_changes_text(diff: RecordDiff) -> str:
    """The sentence that stands for an empty table of changes."""
    return f"No changes in inputs, results, check status, calcs, templates or data since revision {diff.old_label}."


def diff_html(diff: RecordDiff, heading_level: int = 2) -> str:
    """An HTML fragment "Changes since revision X" (a section with one table; text escaped)."""
    e = html.escape
    h = f"h{heading_level}"
    parts = [f'<section class="changes"><{h}>Changes since revision {e(diff.old_label)}</{h}>']
    if not diff.changed:
        parts.append(f"<p>{e(no_changes_text(diff))}</p>")
    else:
        parts.append(
            f"<table><thead><tr><th>What</th><th>Calc</th><th>Item</th><th>Rev. {e(diff.old_label)}</th>"
            f"<th>Rev. {e(diff.new_label)}</th><th>Note</th></tr></thead><tbody>"
        )
        for kind, c in diff.rows():
            parts.append(
                f"<tr><td>{e(KINDS[kind])}</td><td>{e(c.calc)}</td><td>{e(c.item)}</td>"
                f"<td>{e(c.old)}</td><td>{e(c.new)}</td><td>{e(c.note)}</td></tr>"
            )
        parts.append("</tbody></table>")
        parts.append(f"<p>Results compared to a relative tolerance of {diff.rtol:g}.</p>")
    if diff.versions:
        parts.append("<p>Versions: " + "; ".join(f"{e(c.item)} {e(c.old)} → {e(c.new)}" for c in diff.versions) + "</p>")
    parts.append("</section>")
    return "".join(parts)
