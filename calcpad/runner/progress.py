"""A progress bar for runs that take a while (rich): shown only once a run has gone on for
``after`` seconds, so a short run prints nothing.

The CLI shows it on stderr when that is a terminal (never with ``--json``);
:func:`~calcpad.runner.execute.run_job`, :func:`~calcpad.runner.members.run_table` and
:func:`~calcpad.runner.sweep.sweep` show it in a Jupyter notebook (rich draws it in an output
widget there) when no other progress callback is given.
"""

from __future__ import annotations

import sys
import time
from collections.abc import Iterator
from contextlib import contextmanager
from typing import Any

__all__ = ["AFTER", "RunProgress", "in_notebook", "notebook_progress"]

#: Seconds a run goes before its bar appears.
AFTER = 2.0


def in_notebook() -> bool:
    """True inside a Jupyter kernel (IPython with a kernel), False in scripts, tests and the CLI."""
    ipython = sys.modules.get("IPython")
    shell = ipython.get_ipython() if ipython is not None else None  # type: ignore[attr-defined]
    return shell is not None and getattr(shell, "kernel", None) is not None


class RunProgress:
    """Counts done calcs; draws a bar (calcs done, elapsed time) once ``after`` seconds have passed.

    Args:
        total: Number of calcs.
        console: A rich ``Console`` (the CLI's stderr); default rich's own (a notebook's output).
        enabled: False draws nothing (still counts).
        label: What the bar says before the first calc is done.
        after: Seconds before the bar appears.
    """

    def __init__(self, total: int, console: Any = None, enabled: bool = True, label: str = "running calcs", after: float = AFTER) -> None:
        from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn

        self.bar = Progress(TextColumn("[progress.description]{task.description}"), BarColumn(), MofNCompleteColumn(),
                            TimeElapsedColumn(), console=console, transient=True, disable=not enabled)
        self.task = self.bar.add_task(label, total=total)
        self.start = time.perf_counter()
        self.after = after
        self.shown = False

    @property
    def console(self) -> Any:
        """The console the bar draws on (print messages through it so they appear above the bar)."""
        return self.bar.console

    def advance(self, text: str, n: int = 1) -> None:
        """``n`` more done (calcs, or a sweep's cases); ``text`` names the last."""
        self.bar.update(self.task, advance=n, description=text)
        if not self.shown and time.perf_counter() - self.start > self.after:
            self.bar.start()
            self.shown = True

    def close(self) -> None:
        """Remove the bar (if it was shown)."""
        self.bar.stop()


@contextmanager
def notebook_progress(total: int, label: str) -> Iterator[RunProgress | None]:
    """In a Jupyter notebook a :class:`RunProgress` of ``total`` (shown once the work has gone on
    for :data:`AFTER` seconds, removed at the end, also on an error); elsewhere None (scripts,
    tests and the CLI, which draws its own)."""
    if not in_notebook():
        yield None
        return
    bar = RunProgress(total, label=label)
    try:
        yield bar
    finally:
        bar.close()
