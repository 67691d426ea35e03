"""Weight per foot is a force per length (lbf/ft), the repository's convention for weights and
line loads (a user's ``lb`` is pound-force; in pint ``lb`` is the pound mass).

Expected rows are counted from the AISC Shapes Database v16.0 pipe rows (``data/aisc_pipe.csv``)
read here with csv; 1 lb/ft = 1.48816 kg/m (0.45359237 kg / 0.3048 m).
"""

from __future__ import annotations

import csv
from importlib import resources

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections import find_sections, get_section
from calcpad.eng.sections.catalog import as_quantities


def _pipe_weights() -> list[float]:
    text = resources.files("calcpad.eng.sections").joinpath("data", "aisc_pipe.csv").read_text(encoding="utf-8")
    return [float(r["weight"]) for r in csv.DictReader(ln for ln in text.splitlines() if ln.strip() and not ln.startswith("#"))]


@pytest.mark.parametrize("limit", [5.0, "5 lbf/ft", "5 lb/ft", "0.005 kip/ft", f"{5 * 0.45359237 / 0.3048} kg/m"])
def test_weight_limits_in_force_or_mass_per_length(limit: object) -> None:
    expected = sum(w <= 5.0 for w in _pipe_weights())
    assert len(find_sections("pipe", max={"weight": limit})) == expected


def test_weight_quantities_are_lbf_per_ft() -> None:
    row = find_sections("pipe").iloc[0]
    q = as_quantities(row, ["weight"])["weight"]
    assert str(q.units) == "force_pound / foot" and q.magnitude == min(_pipe_weights())
    assert str(get_section("Pipe 2 Std").props.quantity("weight").units) == "force_pound / foot"


def test_a_weight_limit_of_another_kind_is_refused() -> None:
    with pytest.raises(InputError, match="limit on weight: '5 in'; expected a value in units of lbf/ft"):
        find_sections("pipe", max={"weight": "5 in"})
