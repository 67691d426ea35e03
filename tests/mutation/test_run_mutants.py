"""The mutation tool's own rules (no mutant is run here): list validation and stale detection."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).parent))
from run_mutants import DEFAULT_LIST, Mutant, load_mutants, report, stale_reason


def _write(tmp_path: Path, text: str) -> Path:
    p = tmp_path / "m.toml"
    p.write_text(text, encoding="utf-8")
    return p


def test_shipped_list_is_valid_and_large_enough():
    mutants = load_mutants(DEFAULT_LIST)
    assert len(mutants) >= 60
    assert len({m.id for m in mutants}) == len(mutants)


@pytest.mark.parametrize(
    ("body", "message"),
    [('id = "a"\nfile = "f"\noriginal = "x"\nreplacement = "y"', "missing 'tests'"),
     ('id = "a"\nfile = "f"\noriginal = "x"\nreplacement = "x"\ntests = ["t"]', "equals the original"),
     ('id = "a"\nfile = "f"\noriginal = "x"\nreplacement = "y"\ntests = "t"', "non-empty list")],
)
def test_bad_entries_are_refused(tmp_path, body, message):
    with pytest.raises(ValueError, match=message):
        load_mutants(_write(tmp_path, "[[mutant]]\n" + body + "\n"))


def test_duplicate_ids_are_refused(tmp_path):
    one = '[[mutant]]\nid = "a"\nfile = "f"\noriginal = "x"\nreplacement = "y"\ntests = ["t"]\n'
    with pytest.raises(ValueError, match="duplicate id"):
        load_mutants(_write(tmp_path, one + one))


def test_missing_or_ambiguous_original_is_stale(tmp_path):
    (tmp_path / "src.py").write_text("a = 0.9\nb = 0.9\nc = 1.67\n", encoding="utf-8")
    (tmp_path / "t.py").write_text("", encoding="utf-8")
    twice = Mutant("twice", "src.py", "0.9", "0.8", ("t.py",))
    missing = Mutant("missing", "src.py", "2.00", "1.67", ("t.py",))
    once = Mutant("once", "src.py", "1.67", "1.5", ("t.py",))
    no_test = Mutant("no_test", "src.py", "1.67", "1.5", ("nope.py",))
    assert "found 2 times" in stale_reason(twice, tmp_path)
    assert "found 0 times" in stale_reason(missing, tmp_path)
    assert stale_reason(once, tmp_path) == ""
    assert "not found" in stale_reason(no_test, tmp_path)


def test_report_counts_stale_as_failure():
    from run_mutants import Outcome

    m = Mutant("m", "f", "a", "b", ("t",))
    assert report([Outcome(m, "killed")], 0.95, log=lambda s: None) == 0
    assert report([Outcome(m, "killed"), Outcome(m, "stale", "gone")], 0.95, log=lambda s: None) == 1
    assert report([Outcome(m, "killed"), Outcome(m, "survived")], 0.95, log=lambda s: None) == 1
