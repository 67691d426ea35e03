"""Plant deliberate bugs in a copy of calcpad, one at a time, and see whether pytest notices.

Our own small tool (no mutation-testing framework): each entry of ``mutants.toml`` names a
file under the project root, an exact original text (which must occur exactly once in that
file), its replacement and the test paths to run. The tool copies ``calcpad/``, ``tests/`` and
``pyproject.toml`` into a temporary folder, checks that the listed tests pass there unmutated
(baseline), then for each mutant writes the mutated file, runs
pytest (``-x -q``) on the mutant's tests in the copy and restores the file. To save the import
time of numpy/sympy/pint/pandas on every run, each run is a ``fork`` of the tool after it has
imported them once (calcpad itself is imported fresh by each child, from the copy).

A mutant is *killed* when pytest exits non-zero, *survived* when it exits 0, and *stale* when
its original text is missing or ambiguous (a code change elsewhere; fix the list, never count
it as a pass). The real worktree is never written to.

Usage: ``python tests/mutation/run_mutants.py [--list FILE] [--only ID ...] [--timeout S]``.
Exit code 0 when no mutant is stale and the kill rate is at least ``--min-rate`` (default 0.95).
"""

from __future__ import annotations

import argparse
import os
import shutil
import signal
import subprocess
import sys
import tempfile
import time
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
DEFAULT_LIST = Path(__file__).with_name("mutants.toml")
COPIED = ("calcpad", "tests", "pyproject.toml")


@dataclass(frozen=True)
class Mutant:
    """One deliberate bug: replace ``original`` by ``replacement`` in ``file``, run ``tests``."""

    id: str
    file: str
    original: str
    replacement: str
    tests: tuple[str, ...]
    what: str = ""


@dataclass
class Outcome:
    """Result of one mutant: ``status`` is killed, survived, stale or timeout."""

    mutant: Mutant
    status: str
    detail: str = ""
    seconds: float = 0.0
    extra: dict = field(default_factory=dict)


def load_mutants(path: Path) -> list[Mutant]:
    """Read the mutant list; raise ValueError naming the entry when a field is missing or wrong."""
    data = tomllib.loads(path.read_text(encoding="utf-8"))
    out: list[Mutant] = []
    seen: set[str] = set()
    for i, entry in enumerate(data.get("mutant", []), start=1):
        where = f"{path.name}: mutant {i} ({entry.get('id', '?')})"
        for key in ("id", "file", "original", "replacement", "tests"):
            if key not in entry:
                raise ValueError(f"{where}: missing '{key}'")
        tests = entry["tests"]
        if isinstance(tests, str) or not tests or not all(isinstance(t, str) for t in tests):
            raise ValueError(f"{where}: 'tests' must be a non-empty list of test paths")
        if entry["original"] == entry["replacement"]:
            raise ValueError(f"{where}: replacement equals the original")
        if entry["id"] in seen:
            raise ValueError(f"{where}: duplicate id")
        seen.add(entry["id"])
        out.append(Mutant(entry["id"], entry["file"], entry["original"], entry["replacement"], tuple(tests), entry.get("what", "")))
    return out


def stale_reason(m: Mutant, root: Path) -> str:
    """Why the mutant cannot be applied to the sources under ``root`` ('' when it can)."""
    src = root / m.file
    if not src.is_file():
        return f"file {m.file} not found"
    count = src.read_text(encoding="utf-8").count(m.original)
    if count != 1:
        return f"original text found {count} times in {m.file} (must be exactly once)"
    missing = [t for t in m.tests if not (root / t.split("::")[0]).exists()]
    if missing:
        return f"test path(s) not found: {', '.join(missing)}"
    return ""


#: Third-party modules the tests import, loaded once in the parent so each forked run skips them
#: (calcpad itself is never imported by the parent: each child imports the mutated copy).
WARM_MODULES = ("numpy", "scipy", "scipy.optimize", "sympy", "pint", "pandas", "matplotlib", "pytest", "hypothesis")


def warm_up() -> None:
    """Import the heavy third-party modules once (a missing optional one is skipped)."""
    import importlib

    os.environ.setdefault("MPLBACKEND", "Agg")
    for name in WARM_MODULES:
        try:
            importlib.import_module(name)
        except ImportError:
            pass


def _pytest_args(tests: tuple[str, ...]) -> list[str]:
    return ["-x", "-q", "-p", "no:cacheprovider", "-p", "no:randomly", *tests]


def run_pytest(work: Path, tests: tuple[str, ...], timeout: float) -> tuple[int | None, str]:
    """Run pytest on ``tests`` inside the copy; (exit code or None on timeout, last output line).

    With ``os.fork`` (POSIX) the run is a forked child of this warmed-up process, which imports
    calcpad from the copy and calls ``pytest.main``; otherwise a fresh ``python -m pytest``.
    """
    if not hasattr(os, "fork"):
        return _run_subprocess(work, tests, timeout)
    with tempfile.TemporaryFile() as out:
        pid = os.fork()
        if pid == 0:  # child: never returns
            code = 3
            try:
                os.dup2(out.fileno(), 1)
                os.dup2(out.fileno(), 2)
                os.chdir(work)
                sys.path.insert(0, str(work))
                os.environ["PYTHONDONTWRITEBYTECODE"] = "1"
                sys.dont_write_bytecode = True
                import calcpad

                if not Path(calcpad.__file__).resolve().is_relative_to(work.resolve()):
                    print(f"calcpad imported from {calcpad.__file__}, not the copy", flush=True)
                    os._exit(4)
                import pytest

                code = int(pytest.main(_pytest_args(tests)))
                sys.stdout.flush()
                sys.stderr.flush()
            finally:
                os._exit(code)
        deadline = time.monotonic() + timeout
        status = None
        while status is None:
            done, st = os.waitpid(pid, os.WNOHANG)
            if done:
                status = st
            elif time.monotonic() > deadline:
                os.kill(pid, signal.SIGKILL)
                os.waitpid(pid, 0)
                return None, f"timeout after {timeout:g} s"
            else:
                time.sleep(0.05)
        out.seek(0)
        lines = [ln for ln in out.read().decode("utf-8", "replace").splitlines() if ln.strip()]
    code = os.waitstatus_to_exitcode(status)
    if code == 4:
        raise RuntimeError(lines[-1] if lines else "the copy's calcpad was not imported")
    return code, lines[-1] if lines else ""


def _run_subprocess(work: Path, tests: tuple[str, ...], timeout: float) -> tuple[int | None, str]:
    env = dict(os.environ, PYTHONPATH=str(work), PYTHONDONTWRITEBYTECODE="1", MPLBACKEND="Agg")
    cmd = [sys.executable, "-m", "pytest", *_pytest_args(tests)]
    try:
        proc = subprocess.run(cmd, cwd=work, env=env, capture_output=True, text=True, timeout=timeout, check=False)
    except subprocess.TimeoutExpired:
        return None, f"timeout after {timeout:g} s"
    lines = [ln for ln in (proc.stdout + proc.stderr).splitlines() if ln.strip()]
    return proc.returncode, lines[-1] if lines else ""


def copy_project(root: Path, dest: Path) -> None:
    """Copy the parts of the project the tests need (never the .venv or build output)."""
    ignore = shutil.ignore_patterns("__pycache__", "*.pyc", ".pytest_cache")
    for name in COPIED:
        src = root / name
        if src.is_dir():
            shutil.copytree(src, dest / name, ignore=ignore)
        else:
            shutil.copy2(src, dest / name)


def imports_copy(work: Path) -> bool:
    """True when ``import calcpad`` inside the copy loads the copy (not the installed worktree)."""
    env = dict(os.environ, PYTHONPATH=str(work))
    out = subprocess.run([sys.executable, "-c", "import calcpad, pathlib; print(pathlib.Path(calcpad.__file__).resolve())"],
                         cwd=work, env=env, capture_output=True, text=True, check=False).stdout.strip()
    return out.startswith(str(work.resolve()))


def run(mutants: list[Mutant], root: Path, timeout: float, log=lambda s: print(s, flush=True)) -> list[Outcome]:
    """Apply each mutant in a temporary copy of ``root`` and run its tests."""
    outcomes: list[Outcome] = []
    live = []
    for m in mutants:
        reason = stale_reason(m, root)
        if reason:
            outcomes.append(Outcome(m, "stale", reason))
        else:
            live.append(m)
    with tempfile.TemporaryDirectory(prefix="calcpad-mutants-") as tmp:
        work = Path(tmp)
        copy_project(root, work)
        if not imports_copy(work):
            raise RuntimeError("the copy's calcpad is not the one imported; check PYTHONPATH / the editable install")
        baseline = sorted({t for m in live for t in m.tests})
        code, last = run_pytest(work, tuple(baseline), timeout * 4)
        if code != 0:
            raise RuntimeError(f"baseline: the listed tests fail without any mutant ({last})")
        log(f"baseline: {len(baseline)} test paths pass unmutated ({last})")
        for i, m in enumerate(live, start=1):
            target = work / m.file
            text = target.read_text(encoding="utf-8")
            target.write_text(text.replace(m.original, m.replacement, 1), encoding="utf-8")
            t0 = time.perf_counter()
            try:
                code, last = run_pytest(work, m.tests, timeout)
            finally:
                target.write_text(text, encoding="utf-8")
            status = "timeout" if code is None else ("survived" if code == 0 else "killed")
            o = Outcome(m, status, last, time.perf_counter() - t0)
            outcomes.append(o)
            log(f"[{i:3d}/{len(live)}] {status:8s} {m.id} ({o.seconds:.1f} s)")
    return outcomes


def report(outcomes: list[Outcome], min_rate: float, log=print) -> int:
    """Print the kill rate, survivors and stale mutants; return the exit code."""
    ran = [o for o in outcomes if o.status != "stale"]
    killed = [o for o in ran if o.status in ("killed", "timeout")]
    survivors = [o for o in ran if o.status == "survived"]
    stale = [o for o in outcomes if o.status == "stale"]
    rate = len(killed) / len(ran) if ran else 0.0
    log("")
    log(f"mutants: {len(outcomes)} listed, {len(ran)} run, {len(killed)} killed, {len(survivors)} survived, {len(stale)} stale")
    log(f"kill rate (pytest only): {rate:.1%}")
    for o in survivors:
        log(f"  SURVIVED {o.mutant.id}: {o.mutant.file}: {o.mutant.original!r} -> {o.mutant.replacement!r}"
            + (f" — {o.mutant.what}" if o.mutant.what else ""))
    for o in stale:
        log(f"  STALE    {o.mutant.id}: {o.detail}")
    return 0 if not stale and ran and rate >= min_rate else 1


def main(argv: list[str] | None = None) -> int:
    """Command line entry point."""
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--list", type=Path, default=DEFAULT_LIST, help="mutant list (TOML)")
    ap.add_argument("--only", nargs="*", default=None, help="run only these mutant ids")
    ap.add_argument("--timeout", type=float, default=300.0, help="seconds per mutant before it counts as killed (hang)")
    ap.add_argument("--min-rate", type=float, default=0.95, help="kill rate needed for exit code 0")
    args = ap.parse_args(argv)
    try:
        mutants = load_mutants(args.list)
    except (ValueError, tomllib.TOMLDecodeError, OSError) as exc:
        print(f"mutant list: {exc}", file=sys.stderr)
        return 2
    if args.only:
        unknown = sorted(set(args.only) - {m.id for m in mutants})
        if unknown:
            print(f"--only: unknown mutant id(s): {', '.join(unknown)}", file=sys.stderr)
            return 2
        mutants = [m for m in mutants if m.id in args.only]
    # a plain kill stops the running pytest and removes the temporary copy (as Ctrl-C does)
    signal.signal(signal.SIGTERM, lambda *_: (_ for _ in ()).throw(KeyboardInterrupt()))
    warm_up()
    try:
        outcomes = run(mutants, ROOT, args.timeout)
    except RuntimeError as exc:
        print(f"mutation run stopped: {exc}", file=sys.stderr)
        return 2
    return report(outcomes, args.min_rate)


if __name__ == "__main__":
    sys.exit(main())
