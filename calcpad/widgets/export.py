"""A panel's current values written as a job-file calc block (TOML text).

The block carries every template parameter (the job loader requires them all), so pasting it
under a ``[job]`` table gives a job that reproduces the panel's sheet.
"""

from __future__ import annotations

import json
from collections.abc import Mapping

__all__ = ["calc_block", "toml_value"]


def toml_value(value: str | int | float) -> str:
    """A TOML literal: a basic string (JSON escaping is valid TOML for these) or a number."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    return json.dumps(str(value), ensure_ascii=False)


def calc_block(template: str, values: Mapping[str, str | int | float], member: str = "M1", title: str = "",
               descriptions: Mapping[str, str] | None = None) -> str:
    """``[[calcs]]`` with ``template``, ``member``, optional ``title`` and ``[calcs.inputs]``."""
    lines = ["[[calcs]]", f"template = {toml_value(template)}", f"member = {toml_value(member)}"]
    if title:
        lines.append(f"title = {toml_value(title)}")
    lines.append("[calcs.inputs]")
    for name, value in values.items():
        note = (descriptions or {}).get(name, "")
        lines.append(f"{name} = {toml_value(value)}" + (f"  # {note}" if note else ""))
    return "\n".join(lines) + "\n"
