"""Run template code without it displaying anything in the notebook that runs it.

Templates call ``calcpad.widgets.show(sheet)``; in a Jupyter kernel that displays the sheet. When
the runner executes a template for a calc, a member table, a design search or a sweep from a
notebook, those displays would land in the user's cell (six per calc: a 10,000-member table
would put 60,000 sheets into one output). The runner does not import the widgets face; the
widgets read :data:`NO_DISPLAY_ENV` and display nothing while it is set.
"""

from __future__ import annotations

import contextlib
import os
from collections.abc import Iterator

__all__ = ["NO_DISPLAY_ENV", "no_display"]

NO_DISPLAY_ENV = "CALCPAD_NO_DISPLAY"


@contextlib.contextmanager
def no_display() -> Iterator[None]:
    """Inside this block ``show``/``show_summary`` display nothing; the setting before it comes back after."""
    before = os.environ.get(NO_DISPLAY_ENV)
    os.environ[NO_DISPLAY_ENV] = "1"
    try:
        yield
    finally:
        if before is None:
            os.environ.pop(NO_DISPLAY_ENV, None)
        else:
            os.environ[NO_DISPLAY_ENV] = before
