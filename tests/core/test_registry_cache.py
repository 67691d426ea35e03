"""The unit registry's on-disk cache survives a virtual environment that moved or was deleted.

pint caches parsed definition files by content, and its cached ``default_en.txt`` names the
absolute path of ``constants_en.txt``. Seen here: a cache written by one environment made every
``import calcpad`` in a rebuilt environment fail with FileNotFoundError once the first was gone.
"""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
from pathlib import Path

import pint

import calcpad

ROOT = Path(calcpad.__file__).resolve().parent.parent
PROBE = "from calcpad.core.units import ureg; print(ureg('1 kip*ft').to('kip*in').magnitude)"


def _run(env_root: Path, cache: Path) -> subprocess.CompletedProcess[str]:
    env = dict(os.environ, XDG_CACHE_HOME=str(cache), PYTHONPATH=f"{ROOT}{os.pathsep}{env_root}")
    return subprocess.run([sys.executable, "-c", PROBE], env=env, capture_output=True, text=True, timeout=120)


def test_a_second_pint_installation_does_not_read_a_deleted_ones_cache(tmp_path):
    pint_dir = Path(pint.__file__).resolve().parent
    first, second, cache = tmp_path / "first", tmp_path / "second", tmp_path / "cache"
    shutil.copytree(pint_dir, first / "pint")
    done = _run(first, cache)
    assert done.returncode == 0, done.stderr
    assert float(done.stdout) == 12.0  # 1 kip-ft = 12 kip-in (unit fact)
    shutil.copytree(pint_dir, second / "pint")
    shutil.rmtree(first)  # the environment that wrote the cache is gone
    again = _run(second, cache)
    assert again.returncode == 0, again.stderr
    assert float(again.stdout) == 12.0
