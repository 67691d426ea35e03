"""README examples stay true: the member-check example runs and prints what the README shows."""

from __future__ import annotations

import re
import subprocess
import sys
from pathlib import Path

README = Path(__file__).resolve().parent.parent / "README.md"


def _section(title: str) -> str:
    text = README.read_text(encoding="utf-8")
    start = text.index(f"## {title}")
    end = text.find("\n## ", start + 1)
    return text[start : end if end != -1 else len(text)]


def test_member_check_example_prints_what_the_readme_shows():
    section = _section("Member checks in a few lines")
    code = re.search(r"```python\n(.*?)```", section, re.S).group(1)
    shown = re.search(r"prints[^\n]*\n\n```\n(.*?)```", section, re.S).group(1)
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=300, check=False)
    assert run.returncode == 0, run.stderr
    assert run.stdout.strip().splitlines() == shown.strip().splitlines()
