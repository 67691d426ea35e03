"""Keep template notebooks stored executed: the ``.py`` (jupytext percent) file is the source
reviewers read in diffs; the ``.ipynb`` beside it holds the outputs nbval compares.

``python -m calcpad.runner.store notebooks/*.py`` rebuilds each ``.ipynb`` from its ``.py``,
executes it in a fresh kernel of the current interpreter and writes it atomically. Cell ids
are numbered and execution timestamps dropped, so a re-store changes the file only where an
output changed.
"""

from __future__ import annotations

import os
import sys
import tempfile
from pathlib import Path

from calcpad.runner.kernel import KERNEL, kernel_to_run, kernelspec_metadata

__all__ = ["KERNEL", "main", "refresh_notebook"]  # KERNEL: the kernel stored templates ask for (runner.kernel)


def refresh_notebook(source: Path, timeout: int = 600) -> Path:
    """Rebuild and execute ``source`` (``.py``), writing ``source.with_suffix('.ipynb')``."""
    import jupytext  # lazy: notebook tooling is slow to import
    import nbformat
    from nbclient import NotebookClient

    nb = jupytext.read(source)
    nb.metadata["kernelspec"] = kernelspec_metadata()
    nb.metadata.pop("jupytext", None)
    client = NotebookClient(
        nb, timeout=timeout, kernel_name=kernel_to_run(), store_widget_state=False, resources={"metadata": {"path": str(source.parent)}}
    )
    client.execute()
    _stabilise(nb)
    target = source.with_suffix(".ipynb")
    fd, tmp = tempfile.mkstemp(dir=target.parent, suffix=".ipynb.tmp")
    with os.fdopen(fd, "w", encoding="utf-8") as fh:
        nbformat.write(nb, fh)
    os.chmod(tmp, 0o644)  # mkstemp makes 0600 files; notebooks are ordinary repo files
    os.replace(tmp, target)
    return target


def _stabilise(nb: object) -> None:
    """Number the cell ids and widget ids, drop per-run execution timestamps (quiet diffs)."""
    for i, cell in enumerate(nb.cells):  # type: ignore[attr-defined]
        cell["id"] = f"cell-{i:02d}"
        cell.get("metadata", {}).pop("execution", None)
        for out in cell.get("outputs", []):  # widget state is not stored: its random model id is noise
            view = out.get("data", {}).get("application/vnd.jupyter.widget-view+json")
            if view is not None:
                view["model_id"] = f"cell-{i:02d}-widget"


def main(argv: list[str] | None = None) -> int:
    """Refresh each notebook named on the command line."""
    args = argv if argv is not None else sys.argv[1:]
    for name in args:
        print(f"refreshing {name} ...", flush=True)
        refresh_notebook(Path(name))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
