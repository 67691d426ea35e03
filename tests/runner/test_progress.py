"""The run progress bar: drawn only after its delay, never when disabled, and off outside notebooks."""

from __future__ import annotations

import io
import time

from rich.console import Console

from calcpad.runner.progress import RunProgress, in_notebook


def _console() -> tuple[Console, io.StringIO]:
    buf = io.StringIO()
    return Console(file=buf, force_terminal=True, width=100), buf


def test_bar_appears_after_its_delay_and_counts_calcs():
    con, buf = _console()
    bar = RunProgress(3, console=con, after=0.0)
    for name in ("leg_bending L1", "leg_bending L2", "leg_bending L3"):
        time.sleep(0.01)
        bar.advance(name)
    time.sleep(0.2)  # let the refresh thread draw
    bar.close()
    out = buf.getvalue()
    assert "3/3" in out and "leg_bending" in out


def test_short_run_and_disabled_bar_draw_nothing():
    for kwargs in ({"after": 60.0}, {"after": 0.0, "enabled": False}):
        con, buf = _console()
        bar = RunProgress(2, console=con, **kwargs)
        time.sleep(0.01)
        bar.advance("a")
        bar.advance("b")
        bar.close()
        assert "2/2" not in buf.getvalue(), kwargs


def test_not_a_notebook_under_pytest():
    assert in_notebook() is False
