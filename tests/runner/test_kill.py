"""Signals and concurrency: kill -9 and Ctrl-C at random points, two runs into one folder."""

from __future__ import annotations

import hashlib
import json
import os
import random
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.runner.outfolder import read_manifest

from .conftest import JOB_HEAD, ROOT, tiny_calc

EXPECTED_FILES = {"record.json", "submittal.html"}


def _snapshot(root: Path) -> dict[str, bytes]:
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


def _job(folder: Path, revision: str, P: str) -> Path:
    path = folder / f"job_{revision}.toml"
    path.write_text(JOB_HEAD.replace('revision = "0"', f'revision = "{revision}"') + tiny_calc(P=f'"{P}"'))
    return path


def _child(loops: int | str, out: Path, *jobs: Path | str, env: dict[str, str]) -> subprocess.Popen[str]:
    # run as a file, like the `calcpad` console script (under `python -m`, CPython may end a process
    # that caught a KeyboardInterrupt by SIGINT instead of its exit code; a shell shows 130 either way)
    cmd = [sys.executable, str(Path(__file__).with_name("run_child.py")), str(loops), str(out), *map(str, jobs)]
    proc = subprocess.Popen(cmd, cwd=ROOT, env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    assert proc.stdout is not None and proc.stdout.readline().strip() == "ready"
    return proc


def _assert_consistent(out: Path, issued: dict[str, bytes], user: dict[str, bytes]) -> None:
    """Every revision folder present is complete and is what the manifest says calcpad wrote."""
    manifest = read_manifest(out)
    assert manifest is not None
    assert _snapshot(out / "rev-A") == issued
    assert (out / "notes.txt").read_bytes() == user["notes.txt"]
    for folder in out.glob("rev-*"):
        rev = folder.name.removeprefix("rev-")
        assert {p.name for p in folder.iterdir()} >= EXPECTED_FILES, folder
        json.loads((folder / "record.json").read_text())
        assert (folder / "submittal.html").read_text().rstrip().endswith("</html>")
        entry = manifest["revisions"][rev]
        for p in folder.iterdir():
            digest = hashlib.sha256(p.read_bytes()).hexdigest()
            rel = f"{folder.name}/{p.name}"
            assert digest in (entry["files"].get(rel), entry.get("replacing", {}).get(rel)), rel


@pytest.fixture
def issued_out(tmp_path: Path, tiny_env: Path, monkeypatch: pytest.MonkeyPatch) -> tuple[Path, dict[str, bytes], dict[str, bytes], dict[str, str]]:
    """An output folder with an issued revision A and a user's file beside the revisions."""
    monkeypatch.chdir(tmp_path)
    out = tmp_path / "out"
    assert main(["run", str(_job(tmp_path, "A", "100 lbf")), "--out", str(out)]) == 0
    assert main(["issue", str(out), "--by", "J. Smith, P.E."]) == 0
    (out / "notes.txt").write_text("transmittal notes\n")
    env = {**os.environ, "CALCPAD_TEMPLATES": str(tiny_env), "PYTHONPATH": str(ROOT)}
    return out, _snapshot(out / "rev-A"), {"notes.txt": (out / "notes.txt").read_bytes()}, env


@pytest.mark.parametrize("seed", range(5))
def test_kill_9_at_random_points(issued_out: tuple[Path, dict[str, bytes], dict[str, bytes], dict[str, str]], tmp_path: Path, seed: int) -> None:
    out, issued, user, env = issued_out
    jobs = (_job(tmp_path, "B", "120 lbf"), _job(tmp_path, "C", "140 lbf"))
    proc = _child(1000, out, *jobs, env=env)
    time.sleep(random.Random(seed).uniform(0.05, 1.5))
    proc.send_signal(signal.SIGKILL)
    proc.wait(timeout=30)
    assert proc.returncode == -signal.SIGKILL, proc.stderr.read() if proc.stderr else ""
    _assert_consistent(out, issued, user)
    # the next run cleans what the kill left and completes
    assert main(["run", str(jobs[0]), "--out", str(out)]) == 0
    _assert_consistent(out, issued, user)
    assert not [p.name for p in out.iterdir() if p.name.startswith((".calcpad-tmp", ".calcpad-old", ".calcpad-manifest-"))]
    manifest = read_manifest(out)
    assert manifest is not None and manifest["latest"] == "B" and all("replacing" not in e for e in manifest["revisions"].values())


def test_ctrl_c_at_random_points(issued_out: tuple[Path, dict[str, bytes], dict[str, bytes], dict[str, str]], tmp_path: Path) -> None:
    """One run (about 0.25 s after the imports, most of it writing) gets SIGINT at a random time."""
    out, issued, user, env = issued_out
    job = _job(tmp_path, "B", "120 lbf")
    rng = random.Random(7)
    codes = []
    for _ in range(4):
        proc = _child(1, out, job, env=env)
        time.sleep(rng.uniform(0.0, 0.25))
        proc.send_signal(signal.SIGINT)
        _, err = proc.communicate(timeout=30)
        codes.append(proc.returncode)
        assert proc.returncode in (0, 130), err
        if proc.returncode == 130:
            assert err == "calcpad: interrupted\n"
        _assert_consistent(out, issued, user)
    assert codes.count(130) >= 2, codes


def test_two_concurrent_runs_both_end_cleanly(issued_out: tuple[Path, dict[str, bytes], dict[str, bytes], dict[str, str]], tmp_path: Path) -> None:
    out, issued, user, env = issued_out
    job = _job(tmp_path, "B", "120 lbf")
    procs = [_child(4, out, job, env=env), _child(4, out, job, env=env)]
    for p in procs:
        _, err = p.communicate(timeout=120)
        assert p.returncode == 0, err
    _assert_consistent(out, issued, user)
    assert not [p.name for p in out.iterdir() if p.name.startswith((".calcpad-tmp", ".calcpad-old"))]
    assert json.loads((out / "rev-B" / "record.json").read_text())["calcs"][0]["inputs"]["P"] == {"typed": "120 lbf", "value": 120.0, "unit": "lbf"}


@pytest.mark.parametrize("seed", range(3))
def test_kill_9_while_issuing(issued_out: tuple[Path, dict[str, bytes], dict[str, bytes], dict[str, str]], tmp_path: Path, seed: int) -> None:
    """Killed while issuing B: B is intact, and either not yet issued or sealed once `issue` is repeated."""
    out, issued, user, env = issued_out
    job = _job(tmp_path, "B", "120 lbf")
    assert main(["run", str(job), "--out", str(out)]) == 0
    written = _snapshot(out / "rev-B")
    proc = _child("issue", out, "B", "K. Lee", env=env)
    time.sleep(random.Random(200 + seed).uniform(0.0, 0.15))
    proc.send_signal(signal.SIGKILL)
    proc.wait(timeout=30)
    after = _snapshot(out / "rev-B")
    assert {k: v for k, v in after.items() if k != "issued.json"} == written
    if "issued.json" in after:  # the kill came after issued.json: the revision counts as issued
        assert main(["run", str(job), "--out", str(out)]) == 2
    assert main(["issue", str(out), "--revision", "B", "--by", "K. Lee"]) in (0, 2)  # 2: already issued
    manifest = read_manifest(out)
    assert manifest is not None and manifest["revisions"]["B"]["issued"]["by"] == "K. Lee"
    assert all((p.stat().st_mode & 0o222) == 0 for p in [out / "rev-B", *(out / "rev-B").iterdir()])
    assert main(["run", str(job), "--out", str(out)]) == 2
    _assert_consistent(out, issued, user)


def test_ctrl_c_during_start_up(tmp_path: Path, tiny_env: Path) -> None:
    """The heavy imports happen inside main(): Ctrl-C while calcpad starts is 'interrupted', exit 130."""
    job = _job(tmp_path, "B", "120 lbf")
    env = {**os.environ, "CALCPAD_TEMPLATES": str(tiny_env), "PYTHONPATH": str(ROOT)}
    code = (
        "import sys, calcpad.cli as cli\n"
        "print('ready' if 'sympy' not in sys.modules and 'pint' not in sys.modules else 'heavy', flush=True)\n"
        f"sys.exit(cli.main(['run', {str(job)!r}, '--out', {str(tmp_path / 'out')!r}]))\n"
    )
    rng = random.Random(11)
    for _ in range(3):
        proc = subprocess.Popen([sys.executable, "-c", code], cwd=tmp_path, env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        assert proc.stdout is not None and proc.stdout.readline().strip() == "ready"
        time.sleep(rng.uniform(0.0, 0.3))
        proc.send_signal(signal.SIGINT)
        _, err = proc.communicate(timeout=60)
        assert (proc.returncode, err) == (130, "calcpad: interrupted\n")
        assert not (tmp_path / "out").exists()
