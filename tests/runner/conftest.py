from __future__ import annotations

import textwrap
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
EXAMPLE = ROOT / "examples" / "harbor_ridge_condenser_stand.toml"

TINY_TEMPLATE = '''\
# %% [markdown]
# # Tiny test template

# %% tags=["parameters"]
P = "100 lbf"  # load; 0 < P <= 1 kip
L = "10 in"  # arm; 1 in to 10 ft
mode = "ok"  # what the second cell does; ok or fail

# %%
from calcpad import Sheet

second = Sheet("Second created")
second.given("L", L, "Arm")
first = None

# %%
if mode == "fail":
    raise ValueError("requested failure")
kinds = (type(P).__name__, type(L).__name__)
first = Sheet("First bound later")
first.given("P", P, "Load")
first.given("L", L, "Arm")
first.step("M", "P*L", "Moment", unit="lbf*in")
first.given("M_a", "2000 lbf*in", "Allowable moment")
first.check("Moment", demand="M", capacity="M_a")
'''


@pytest.fixture
def tiny_dir(tmp_path: Path) -> Path:
    d = tmp_path / "templates"
    d.mkdir()
    (d / "tiny.py").write_text(TINY_TEMPLATE, encoding="utf-8")
    return d


@pytest.fixture
def tiny_env(tiny_dir: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(tiny_dir))
    return tiny_dir


JOB_HEAD = textwrap.dedent(
    """\
    [job]
    number = "T-1"
    title = "Test job"
    client = "Client"
    site = "Site"
    engineer = "Engineer"
    checker = "Checker"
    revision = "0"
    date = 2025-01-01
    codes = ["AISC 360-16"]
    units = "US"
    """
)


def tiny_calc(member: str = "M1", P: str = '"100 lbf"', L: str = '"10 in"', mode: str = '"ok"', key: str = "member") -> str:
    value = f'"{member}"' if key == "member" else member
    return f'\n[[calcs]]\ntemplate = "tiny"\n{key} = {value}\n[calcs.inputs]\nP = {P}\nL = {L}\nmode = {mode}\n'
