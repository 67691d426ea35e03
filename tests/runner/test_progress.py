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


class _SeenBar:
    """Stands for RunProgress in a notebook: records what it was told."""

    made: list[_SeenBar] = []

    def __init__(self, total: int, label: str = "") -> None:
        self.total, self.label, self.done, self.closed = total, label, 0, False
        _SeenBar.made.append(self)

    def advance(self, text: str, n: int = 1) -> None:
        self.done += n

    def close(self) -> None:
        self.closed = True


def _as_in_a_notebook(monkeypatch) -> list[_SeenBar]:
    from calcpad.runner import progress

    _SeenBar.made = []
    monkeypatch.setattr(progress, "in_notebook", lambda: True)
    monkeypatch.setattr(progress, "RunProgress", _SeenBar)
    return _SeenBar.made


def test_a_member_table_and_a_sweep_in_a_notebook_count_on_a_bar(monkeypatch, tmp_path):
    from calcpad.runner.members import run_table
    from calcpad.runner.sweep import steps, sweep
    from calcpad.runner.template import find_template, load_template

    made = _as_in_a_notebook(monkeypatch)
    table = tmp_path / "posts.csv"
    table.write_text("mark,P [lbf],L [in],leg\nA1,120,36,Pipe 2 Std\nA2,200,48,Pipe 2 Std\nA3,90,30,Pipe 1-1/2 Std\n", encoding="utf-8")
    frame = run_table("leg_bending", table, {"F_y": "35 ksi"})
    assert len(frame) == 3
    tpl = load_template(find_template("leg_bending"))
    res = sweep(tpl, {}, {"P": steps("50 lbf", "200 lbf", 4), "L": steps("12 in", "48 in", 5)}, envelope="L", chunk_cases=7)
    assert res.cases == 20
    # one bar each, told of every calc and every grid case, and removed at the end
    assert [(b.label, b.total, b.done, b.closed) for b in made] == [
        ("member table posts.csv", 3, 3, True), ("sweep of leg_bending", 20, 20, True)]
    made.clear()
    sweep(tpl, {}, {"P": steps("50 lbf", "200 lbf", 4)}, progress=False)  # asked for none: none
    assert made == []
