"""The Jupyter kernel calcpad runs templates in: the one the set-up registers in the venv
(``python -m ipykernel install --sys-prefix --name calcpad``, see the Makefile).

Stored templates ask for it, ``calcpad run --notebooks`` runs in it and writes it into the kept
notebooks, and ``calcpad lab`` opens JupyterLab with it. When it is not registered (a plain
``pip install``), runs fall back to ``python3``, which is the same interpreter only when
calcpad is installed in the Jupyter environment.
"""

from __future__ import annotations

__all__ = ["KERNEL", "KERNEL_DISPLAY", "kernel_to_run", "kernelspec_metadata"]

#: Name of the kernelspec the set-up registers.
KERNEL = "calcpad"
#: Its display name.
KERNEL_DISPLAY = "calcpad (venv)"


def kernel_to_run() -> str:
    """``calcpad`` when that kernelspec is installed, else ``python3``."""
    from jupyter_client.kernelspec import KernelSpecManager  # lazy: only kernel runs need it

    return KERNEL if KERNEL in KernelSpecManager().find_kernel_specs() else "python3"


def kernelspec_metadata() -> dict[str, str]:
    """The ``kernelspec`` notebook metadata of calcpad's notebooks."""
    return {"name": KERNEL, "display_name": KERNEL_DISPLAY, "language": "python"}
