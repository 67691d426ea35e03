"""Child process for the kill/interrupt/concurrency tests: runs ``calcpad run`` in a loop.

Usage: python tests/runner/run_child.py LOOPS OUT JOB [JOB ...]
       python tests/runner/run_child.py issue OUT REVISION BY

``os.replace`` is slowed (20 ms before and after each rename) to widen the windows between the
steps of a write, so a signal at a random time lands inside one often. Prints ``ready`` once the
heavy imports are done; exits with the first non-zero exit code, else 0.
"""

from __future__ import annotations

import os
import sys
import time

import calcpad.runner.execute  # heavy imports before "ready"
import calcpad.runner.outfolder  # noqa: F401
from calcpad.cli import exit_with, main

_replace = os.replace


def _slow_replace(src, dst, *args, **kwargs):  # type: ignore[no-untyped-def]
    time.sleep(0.02)
    _replace(src, dst, *args, **kwargs)
    time.sleep(0.02)


if __name__ == "__main__":
    os.replace = _slow_replace
    if sys.argv[1] == "issue":
        print("ready", flush=True)
        exit_with(main(["issue", sys.argv[2], "--revision", sys.argv[3], "--by", sys.argv[4]]))
    loops, out, jobs = int(sys.argv[1]), sys.argv[2], sys.argv[3:]
    print("ready", flush=True)
    try:
        for i in range(loops):
            rc = main(["run", jobs[i % len(jobs)], "--out", out, "--wait", "60", "--no-pdf"])
            if rc:
                exit_with(rc)  # as the console script ends
    except KeyboardInterrupt:  # a signal between two runs of this harness loop, outside calcpad's main()
        print("calcpad: interrupted", file=sys.stderr)
        exit_with(130)
    sys.exit(0)
