"""Small jobs and helpers shared by the record, verify and diff tests."""

from __future__ import annotations

import math
import shutil
from pathlib import Path
from typing import Any

from calcpad.runner.execute import run_job
from calcpad.runner.job import parse_job
from calcpad.runner.record import job_record, record_text

ROOT = Path(__file__).resolve().parents[2]

HEAD = """\
# A small job (invented): two posts of a fictional loading-dock rail and a rooftop stand.
[job]
number = "RV-7"
title = "Dock rail posts"
client = "Fictional Fabricators"
site = "Bay 4"
engineer = "A. Engineer"
checker = ""
revision = "{revision}"
date = 2025-05-06
"""

LEG = """
[[calcs]]
template = "leg_bending"
member = "{mark}"
[calcs.inputs]
P = "{P}"   # lateral load
N = "0 lbf"
L = "30 in"
leg = "custom"
D_o = "1.900 in"
t = "0.145 in"
F_y = "35 ksi"
FS_req = 1.67
"""

WIND = """
[[calcs]]
template = "wind_rooftop_stand"
member = "CS-9"
[calcs.inputs]
V = "115 mph"
exposure = "C"
h_roof = "28 ft"
B_bldg = "120 ft"
L_bldg = "240 ft"
W_unit = "450 lbf"
unit_L = "48 in"
unit_W = "36 in"
unit_H = "42 in"
H_leg = "24 in"
attachment = "pinned to rails"
D_o = "2.375 in"
t_nom = "0.154 in"
F_y = "35 ksi"
E_s = "29000 ksi"
FS_req = 1.67
K_leg = "2.0"
S_DS = 0.42
a_p = 2.5
R_p = 6.0
I_p = 1.0
Omega_0p = 2.0
plate_B = "8 in"
plate_t = "1/2 in"
plate_grade = "A36"
rod_d = "1/2 in"
rod_f = "2.75 in"
anchor_h_ef = "6 in"
f_c = "3000 psi"
pad_edge = "6 in"
pad_depth = "10 in"
"""


def job_text(legs: dict[str, str], wind: bool = True, revision: str = "A") -> str:
    """A job with one leg_bending calc per ``mark: load`` and optionally one wind stand."""
    return HEAD.format(revision=revision) + "".join(LEG.format(mark=m, P=p) for m, p in legs.items()) + (WIND if wind else "")


def run_text(text: str, source: str = "job.toml") -> dict[str, Any]:
    """Run a job text in-process and return its record."""
    job = parse_job(text, source)
    return job_record(job, run_job(job), "inprocess", 0.0)


def write_record(record: dict[str, Any], folder: Path) -> Path:
    """Write ``record`` as ``folder/record.json`` (as the runner does) and return the folder."""
    folder.mkdir(parents=True, exist_ok=True)
    (folder / "record.json").write_text(record_text(record), encoding="utf-8")
    return folder


def copy_template(name: str, folder: Path) -> Path:
    """Copy a shipped template source into a user template folder."""
    folder.mkdir(parents=True, exist_ok=True)
    return Path(shutil.copy(ROOT / "notebooks" / f"{name}.py", folder / f"{name}.py"))


def tube_ratio(P_lbf: float, L_in: float = 30.0, D_o: float = 1.900, t: float = 0.145, F_y_ksi: float = 35.0, FS: float = 1.67) -> tuple[float, float, float]:
    """Hand calc of a cantilever tube (common practice): M = P L, sigma = M c / I, ratio = FS sigma / F_y,
    with the design wall 0.93 t of AISC 360-16 B4.2 and no axial load (so B2 = 1, App. 8).

    Returns (M in lbf*in, sigma in ksi, ratio).
    """
    t = 0.93 * t
    I = math.pi / 64 * (D_o**4 - (D_o - 2 * t) ** 4)
    M = P_lbf * L_in
    sigma = M * (D_o / 2) / I / 1000.0
    return M, sigma, FS * sigma / F_y_ksi
