"""Start a template of your own: ``calcpad template new NAME`` writes ``NAME.py`` (jupytext
percent format) with a parameters cell with ranges, a sheet shown live, its summary, and a
what-if cell; ``calcpad template store NAME`` executes it and writes the paired ``.ipynb``.

The scaffold is a working calc (a cantilever bracket in bending, yield-based check) meant to be
edited: every part a template needs is there once. It never overwrites a file.
"""

from __future__ import annotations

import keyword
import re
from pathlib import Path

from calcpad.core.errors import InputError

__all__ = ["new_template", "scaffold_text"]

_NAME = re.compile(r"^[a-z][a-z0-9_]*$")

_TEXT = '''\
# %% [markdown]
# # {title}
#
# *Describe the member, its supports and loads, and the assumptions here.*
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
P = "250 lbf"  # load at the tip of the bracket; 0 < P <= 10 kip
a = "18 in"  # arm from the support to the load; 2 in to 10 ft
b = "2 in"  # bar width; 1/2 in to 12 in
d = "3 in"  # bar depth (in the plane of bending); 1/2 in to 12 in
F_y = "36 ksi"  # specified minimum yield stress (ASTM A36: 36 ksi); 25 ksi to 100 ksi
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0

# %%
from calcpad import Sheet
from calcpad.widgets import show, show_summary

sh = Sheet("{title}")
sh.heading("Inputs")
sh.given("P", P, "Load at the tip")
sh.given("a", a, "Arm, support to load")
sh.given("b", b, "Bar width")
sh.given("d", d, "Bar depth")
sh.given("F_y", F_y, "Yield stress", source="ASTM A36")
sh.heading("Demand and check")
sh.step("M", "P*a", "Moment at the support", unit="kip*in", ref="cantilever, statics")
sh.step("S", "b*d**2/6", "Elastic section modulus", unit="in^3", ref="rectangle, common practice")
sh.step("f_b", "M/S", "Bending stress", unit="ksi")
sh.check("Bending stress vs yield", demand="f_b", capacity="F_y", required_fs=FS_req, ref="yield-based, common practice")
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What if
#
# Each parameter has a control with its stated range; the sheet and summary above redraw in
# place. "Sensitivity", "What would it take?" and "Export job block" answer the next questions.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="{name}", bind=["P", "a", "b", "d", "F_y"], values=globals())
panel

# %%
panel.set("P", "400 lbf")
ratio_at_400_lbf = round(panel.sheet.summary()[0].ratio, 3)
panel.reset()  # back to the parameters above, so the stored sheet is the one shown
ratio_at_400_lbf
'''


def scaffold_text(name: str, title: str = "") -> str:
    """The text of a new template ``name`` (a working cantilever bracket calc to edit)."""
    title = title or name.replace("_", " ").capitalize()
    return _TEXT.replace("{title}", title.replace('"', "'")).replace("{name}", name)


def new_template(name: str, folder: Path, title: str = "") -> Path:
    """Write ``folder/NAME.py``; never overwrites. Raises InputError for a bad or taken name."""
    if not _NAME.match(name) or keyword.iskeyword(name):
        raise InputError(f"template name {name!r}: expected lower-case letters, digits and '_', starting with a letter (e.g. 'bracket_bending')")
    path = folder / f"{name}.py"
    taken = [p for p in (path, path.with_suffix(".ipynb")) if p.exists()]
    if taken:
        raise InputError(f"template {name!r}: {taken[0]} already exists; not overwriting it (choose another name)")
    folder.mkdir(parents=True, exist_ok=True)
    try:
        with open(path, "x", encoding="utf-8") as fh:
            fh.write(scaffold_text(name, title))
    except FileExistsError:
        raise InputError(f"template {name!r}: {path} already exists; not overwriting it") from None
    return path
