"""Template inspection: cells (jupytext as the oracle), parameters cell by ast only, ranges."""

from __future__ import annotations

from pathlib import Path

import jupytext
import pytest

from calcpad.core.errors import InputError, UnitInputError
from calcpad.core.units import parse_quantity
from calcpad.runner.template import TemplateError, find_template, list_templates, load_template, parse_parameters, read_percent

from .conftest import ROOT

TEMPLATES = sorted((ROOT / "notebooks").glob("*.py"))


@pytest.mark.parametrize("path", TEMPLATES, ids=lambda p: p.stem)
def test_percent_reader_matches_jupytext(path: Path) -> None:
    # Oracle: jupytext's own reader of the percent format.
    ours = read_percent(path.read_text(encoding="utf-8"))
    theirs = jupytext.read(path).cells
    assert [(c.kind, c.source, c.tags) for c in ours] == [(c.cell_type, c.source, list(c.metadata.get("tags", []))) for c in theirs]


def test_leg_bending_parameters() -> None:
    tpl = load_template(ROOT / "notebooks" / "leg_bending.py")
    assert tpl.parameters_cell == 2
    assert list(tpl.parameters) == ["P", "N", "L", "leg", "D_o", "t", "F_y", "FS_req", "member_mark", "calc_title", "calc_note"]
    L = tpl.parameters["L"]
    assert (L.default, L.kind, L.unit, L.description) == ("42 in", "quantity", "in", "leg length from base to load")
    assert L.lower.value == parse_quantity("6 in") and L.upper.value == parse_quantity("30 ft")
    assert tpl.parameters["FS_req"].kind == "number"
    assert tpl.parameters["t"].upper.ref == "D_o" and tpl.parameters["t"].upper.factor == 0.5


def test_ipynb_and_py_give_the_same_parameters() -> None:
    a = load_template(ROOT / "notebooks" / "leg_bending.py")
    b = load_template(ROOT / "notebooks" / "leg_bending.ipynb")
    assert {n: (p.default, p.range_text) for n, p in a.parameters.items()} == {n: (p.default, p.range_text) for n, p in b.parameters.items()}
    assert a.parameters_cell == b.parameters_cell


def test_parameters_cell_is_never_executed(tmp_path: Path) -> None:
    marker = tmp_path / "ran"
    src = f'P = "1 lbf"  # load\nX = __import__("os").system("touch {marker}")\n'
    with pytest.raises(TemplateError, match="not a literal"):
        parse_parameters(src, "template 't'")
    assert not marker.exists()


def test_parameters_cell_rejects_statements() -> None:
    with pytest.raises(TemplateError, match="line 1"):
        parse_parameters("import os\n", "template 't'")
    with pytest.raises(TemplateError, match="twice"):
        parse_parameters('a = "1 in"\na = "2 in"\n', "template 't'")


def test_ranges_and_units() -> None:
    params = parse_parameters(
        'P = "85 lbf"  # load; 0 < P <= 20 kip\nV = "115 mph"  # wind speed; 85 to 200 mph\n'
        'exp = "C"  # exposure; B, C or D\nD = "2 in"  # diameter; > 0\nt = "0.1 in"  # wall; 0 < t < D/2\n',
        "template 't'",
    )
    vals = {n: parse_quantity(p.default) for n, p in params.items() if p.kind != "text"}
    P = params["P"]
    P.check_range("20 kip", vals, "x")  # inclusive upper bound
    for bad in ("0 lbf", "20.1 kip"):
        with pytest.raises(InputError, match="outside the stated range"):
            P.check_range(bad, vals, "x")
    with pytest.raises(InputError):
        params["V"].check_range("80 mph", vals, "x")  # the bare 85 borrows mph
    params["V"].check_range("85 mph", vals, "x")
    assert params["exp"].choices == ["B", "C", "D"]
    with pytest.raises(InputError, match="not one of"):
        params["exp"].coerce("E", "x")
    with pytest.raises(InputError):
        params["t"].check_range("1 in", vals, "x")  # 1 in is D/2 for D = 2 in: excluded
    with pytest.raises(UnitInputError, match="length"):
        params["D"].coerce("84 lbf", "x")


def test_template_lookup_suggests_names() -> None:
    assert "leg_bending" in list_templates()
    with pytest.raises(TemplateError, match="did you mean 'leg_bending'"):
        find_template("leg_bendng")
