"""Plain-text and Markdown printers (terminal, diffs, README snippets)."""

from __future__ import annotations

from calcpad.core.names import name_text
from calcpad.core.results import (
    BranchResult,
    CheckResult,
    FigureResult,
    FormulaResult,
    GivenResult,
    HeadingResult,
    SelectResult,
    SheetResult,
    TableResult,
    TextResult,
)
from calcpad.core.units import format_number
from calcpad.render.expressions import quantity_text, substituted_text, symbolic_text
from calcpad.render.rows import check_label, same_at_print, select_words

__all__ = ["sheet_markdown", "sheet_text", "step_text"]

_REL = {"<": "<", "<=": "≤", ">": ">", ">=": "≥"}
_FLIP = {"<": "≥", "<=": ">", ">": "≤", ">=": "<"}


def _formula(f: FormulaResult) -> str:
    sym = symbolic_text(f.expr)
    sub = substituted_text(f.expr, f.values, f.sigs, f.sig)
    res = quantity_text(f.value, f.sig)
    if f.expr.is_Number:  # a value written into the formula: "GC_r = 1.9", not "1.9 = 1.900"
        return f"{name_text(f.name)} = {sym}"
    parts = [name_text(f.name), sym] + ([sub] if sub not in (sym, res) else []) + [res]
    return " = ".join(parts)


def _side(expr: object, value: object) -> str:
    """One side of a branch test: ``KL_r = 85.3``, or just ``0.1`` when it is a number."""
    if getattr(expr, "is_Number", False):
        return symbolic_text(expr)
    return f"{symbolic_text(expr)} = {quantity_text(value)}"


def _with(line: str, desc: str, ref: str) -> str:
    lead = f"{desc}: " if desc else ""
    tail = f"   [{ref}]" if ref else ""
    return f"{lead}{line}{tail}"


def step_text(step: object) -> list[str]:
    """Lines of plain text for one step result."""
    if isinstance(step, GivenResult):
        return [_with(f"{name_text(step.name)} = {quantity_text(step.value, step.sig)}", step.description, step.source)]
    if isinstance(step, FormulaResult):
        return [] if step.hidden else [_with(_formula(step), step.description, step.ref)]
    if isinstance(step, BranchResult):
        cond = step.cases[step.tested].condition
        label = step.cases[step.chosen].label
        lines = []
        if cond is not None and step.condition_sides is not None and hasattr(cond, "rel_op"):
            lhs, rhs = step.condition_sides
            rel = _REL[cond.rel_op] if step.condition_held else _FLIP[cond.rel_op]
            test = f"{_side(cond.lhs, lhs)} {rel} {_side(cond.rhs, rhs)} → {label if step.words else 'use ' + label}"
            lines.append(_with(test, step.description, step.ref))
            if not step.words:
                lines.append("    " + _with(_formula(step.formula), "", label))
        elif step.words:
            lines.append(_with(label, step.description, step.ref))
        else:
            lines.append(_with(_formula(step.formula), step.description, label or step.ref))
        return lines
    if isinstance(step, SelectResult):
        names = ", ".join(name_text(c.name) for c in step.candidates)
        vals = ", ".join(quantity_text(c.value, step.sig) for c in step.candidates)
        gov = step.candidates[step.governing]
        ties = [c.label for c in step.candidates if c is not gov and same_at_print(gov.value, c.value, step.sig)]
        words = select_words(gov.label, ties)
        line = f"{name_text(step.name)} = {step.mode}({names}) = {step.mode}({vals}) = {quantity_text(step.value, step.sig)} — {words}"
        return [_with(line, step.description, step.ref)]
    if isinstance(step, CheckResult):
        d, cap = name_text(step.demand_name), name_text(step.capacity_name)
        if float(step.demand.magnitude) < 0:
            d = f"|{d}|"
        dq, cq = quantity_text(abs(step.demand), step.sig), quantity_text(step.capacity, step.sig)
        title = check_label(step)
        if step.required_fs is not None:
            rel = "≥" if step.ok else "<"
            line = (
                f"FS = {cap}/{d} = {cq}/{dq} = {format_number(step.fs, step.sig)} {rel} {format_number(step.required_fs, 3)}  {step.status}"
            )
            return [_with(line, title, step.ref)]
        rel = "≤" if step.ok else ">"
        lines = [
            _with(
                f"{d}/{cap} = {dq}/{cq} = {format_number(step.ratio, 3)} {rel} {format_number(step.limit, 3)}  {step.status}",
                title,
                step.ref,
            )
        ]
        if step.show_fs and step.fs is not None:
            lines.append(f"    FS = {cap}/{d} = {format_number(step.fs, step.sig)}")
        return lines
    if isinstance(step, HeadingResult):
        return ["", step.text.upper() if step.level == 1 else step.text, "-" * len(step.text)]
    if isinstance(step, TextResult):
        lead = {"assumption": "Assumption", "reference": "Reference"}.get(step.kind, "Note")
        return [f"{lead}: {step.text}"]
    if isinstance(step, TableResult):
        widths = [max(len(c), *(len(r[i]) for r in step.rows)) if step.rows else len(c) for i, c in enumerate(step.columns)]
        fmt = "  ".join(f"{{:>{w}}}" for w in widths)
        return [step.title, fmt.format(*step.columns), fmt.format(*("-" * w for w in widths))] + [fmt.format(*r) for r in step.rows]
    if isinstance(step, FigureResult):
        return [f"[Figure: {step.title}]"]
    return []


def sheet_text(result: SheetResult) -> str:
    """The whole sheet as plain text."""
    lines = [result.title, "=" * len(result.title)]
    for step in result.steps:
        lines.extend(step_text(step))
    return "\n".join(lines) + "\n"


def sheet_markdown(result: SheetResult) -> str:
    """The sheet as Markdown: headings and notes as text, each step as display math."""
    from calcpad.render.latex import row_math_latex
    from calcpad.render.rows import math_rows

    out = [f"# {result.title}", ""]
    for step in result.steps:
        if isinstance(step, HeadingResult):
            out += [f"{'#' * (step.level + 1)} {step.text}", ""]
        elif isinstance(step, TextResult):
            lead = {"assumption": "Assumption", "reference": "Reference"}.get(step.kind, "Note")
            out += [f"*{lead}:* {step.text}", ""]
        elif isinstance(step, TableResult):
            out += [f"**{step.title}**", "", "| " + " | ".join(step.columns) + " |", "|" + "---|" * len(step.columns)]
            out += ["| " + " | ".join(r) + " |" for r in step.rows] + [""]
        elif isinstance(step, FigureResult):
            out += [f"*Figure: {step.title}*", ""]
        else:
            rows = math_rows(step) or []
            for row in rows:
                label = f"**{row.label}**" if row.strong and row.label else row.label
                head = " — ".join(x for x in (label, f"[{row.ref}]" if row.ref else "") if x)
                if head:
                    out.append(head)
                out += [f"$$ {row_math_latex(row)} $$", ""]
    return "\n".join(out)
