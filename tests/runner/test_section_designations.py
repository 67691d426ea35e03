"""A section designation that names nothing is caught when the job is read, not when the calc runs.

Job inputs, member-table cells, ``--set`` values (one template and a job's ``MARK.NAME``) and the
Python lookup all give the same message: the value, where it was written, and the closest names
of the catalog and of the shop table. The designations are AISC Shapes Database names (HSS4x4x1/4,
W8x18, Pipe 1-1/2 Std); the misspellings are invented. The shop row is the invented size of
``test_shop_sections_job.py`` (the dimensions of an L2-1/2x2-1/2x1/4, AISC Manual 15th ed.
Table 1-7: A = 1.19 in^2, 4.1 lb/ft, from memory).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.eng.sections import UnknownSectionError, get_section, read_shop_table, shop_table_in_use
from calcpad.runner.job import JobError, load_job

from .conftest import JOB_HEAD
from .test_shop_sections_job import BRACE, SHOP

POST = """
[[calcs]]
template = "post_combined"
member = "{mark}"
[calcs.inputs]
method = "ASD"
post = "{post}"
grade = "A500 Gr C"
P = "6.5 kip"
H = "0.45 kip"
L = "11 ft"
K = "2.1"
plate_B = "10 in"
plate_N = "10 in"
plate_t = "7/8 in"
plate_grade = "A36"
f_c = "3000 psi"
rod_d = "3/4 in"
rod_f = "3.75 in"
anchor_h_ef = "12 in"
pier_edge = "8 in"
pier_depth = "36 in"
anchor_load_factor = "1.6"
"""

LEGS_CALC = """
[[calcs]]
template = "leg_bending"
table = "legs.csv"
[calcs.inputs]
N = "0 lbf"
D_o = "1.900 in"
t = "0.145 in"
F_y = "35 ksi"
FS_req = 1.67
"""


def _write(tmp_path: Path, body: str, shop: str | None = SHOP, legs: str | None = None) -> Path:
    head = JOB_HEAD
    if shop is not None:
        (tmp_path / "kyf_sections.csv").write_text(shop, encoding="utf-8")
        head += 'shop_sections = "kyf_sections.csv"\n'
    if legs is not None:
        (tmp_path / "legs.csv").write_text(legs, encoding="utf-8")
    job = tmp_path / "job.toml"
    job.write_text(head + body, encoding="utf-8")
    return job


def _problems(job: Path) -> dict[str, str]:
    with pytest.raises(JobError) as err:
        load_job(job)
    return dict(err.value.problems)


def test_every_unknown_designation_is_listed_with_calc_field_value_and_suggestions(tmp_path: Path) -> None:
    body = POST.format(mark="P1", post="HSS4x4x1/5") + POST.format(mark="P2", post="HSS4x4x1/4") + \
        BRACE.replace("L2-1/2x2-1/2x1/4 KYF", "L2-1/2x2-1/2x1/4 KYG")
    problems = _problems(_write(tmp_path, body))
    assert set(problems) == {"calcs[1].inputs.post", "calcs[3].inputs.brace"}  # the good calc between them is not listed
    post = problems["calcs[1].inputs.post"]
    assert "'HSS4x4x1/5' is in neither the catalog nor the shop table kyf_sections.csv" in post
    assert "did you mean" in post and "'HSS4x4x1/4'" in post
    brace = problems["calcs[3].inputs.brace"]
    assert "'L2-1/2x2-1/2x1/4 KYG'" in brace and "did you mean 'L2-1/2x2-1/2x1/4 KYF'" in brace  # the shop's own name


def test_cli_exits_2_and_writes_nothing(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = _write(tmp_path, POST.format(mark="P1", post="W8x19"), shop=None)
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out), "--no-pdf"]) == 2
    assert not out.exists()
    err = capsys.readouterr().err
    assert "calcs[1].inputs.post" in err and "'W8x19' is not in the catalog" in err and "'W8x18'" in err


def test_shop_designations_and_metric_names_are_known(tmp_path: Path) -> None:
    body = POST.format(mark="P1", post="HSS102x102x6.4") + BRACE  # AISC metric name of HSS4x4x1/4; the shop's angle
    job = load_job(_write(tmp_path, body))
    assert [c.inputs.get("post", c.inputs.get("brace")) for c in job.calcs] == ["HSS102x102x6.4", "L2-1/2x2-1/2x1/4 KYF"]


def test_a_word_the_parameter_offers_is_left_to_the_template(tmp_path: Path) -> None:
    # leg_bending: "catalog designation of a pipe or round HSS ..., or custom for D_o and t"
    legs = "mark,P [lbf],L [in],leg\nA1,120,30,custom\nA2,120,30,Pipe 1-1/2 Std\n"
    job = load_job(_write(tmp_path, LEGS_CALC, shop=None, legs=legs))
    assert [c.inputs["leg"] for c in job.calcs] == ["custom", "Pipe 1-1/2 Std"]
    legs = "mark,P [lbf],L [in],leg\nA1,120,30,bespoke\n"  # a word it does not offer
    problems = _problems(_write(tmp_path, LEGS_CALC, shop=None, legs=legs))
    message = problems["calcs[1].table legs.csv row 2, column D (leg)"]
    assert "'bespoke' is not in the catalog" in message
    assert "'custom'" in message  # the message names the word the parameter does accept


def test_member_table_cells_name_catalog_or_shop_sections(tmp_path: Path) -> None:
    legs = "mark,P [lbf],L [in],leg\nA1,120,30,Pipe 1-1/2 Std\nA2,120,30,Pipe 1-1/2 Sdt\nA3,120,30,Pipe 1-1/2 Std\nA4,90,30,HSS1.9x0.145\n"
    problems = _problems(_write(tmp_path, LEGS_CALC, shop=None, legs=legs))
    assert list(problems) == ["calcs[1].table legs.csv row 3, column D (leg)"]
    message = problems["calcs[1].table legs.csv row 3, column D (leg)"]
    assert "'Pipe 1-1/2 Sdt' is not in the catalog; did you mean 'Pipe 1-1/2 Std'" in message
    assert message.endswith(", or 'custom' (this parameter accepts it)?")


SHOP_TUBE = """# source: Kestrel Yard Fabricators stock tube (invented for the tests)
designation,family,od [in],t_nom [in],A [in^2],weight [lb/ft]
Tube 1.9x0.150 KYF,hss_round,1.9,0.150,0.772,2.80
"""  # A = pi (OD - t) t with t = 0.93 x 0.150 (AISC 360-16 B4.2); weight 3.40 lb/ft per in^2 at the nominal wall


def test_member_table_accepts_a_shop_row(tmp_path: Path) -> None:
    legs = "mark,P [lbf],L [in],leg\nA1,120,30,Tube 1.9x0.150 KYF\nA2,120,30,Tube 1.9x0.150 KYZ\n"
    problems = _problems(_write(tmp_path, LEGS_CALC, shop=SHOP_TUBE, legs=legs))
    assert list(problems) == ["calcs[1].table legs.csv row 3, column D (leg)"]
    assert "did you mean 'Tube 1.9x0.150 KYF'" in problems["calcs[1].table legs.csv row 3, column D (leg)"]


def test_an_unreadable_shop_table_does_not_also_report_its_names(tmp_path: Path) -> None:
    problems = _problems(_write(tmp_path, BRACE, shop=SHOP.replace("1.19", "-1.19")))
    assert all(loc.startswith("job.shop_sections") for loc in problems)


def test_set_on_one_template_is_checked(capsys: pytest.CaptureFixture[str], tmp_path: Path) -> None:
    out = tmp_path / "out"
    assert main(["run", "post_combined", "--set", "post=HSS4x4x1/5", "--out", str(out), "--no-pdf"]) == 2
    assert not out.exists()
    err = capsys.readouterr().err
    assert "--set post" in err and "'HSS4x4x1/5' is not in the catalog" in err


def test_set_on_a_job_is_checked_against_its_shop_table(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = _write(tmp_path, BRACE)
    out = tmp_path / "out"
    assert main(["run", str(job), "--set", "KB9.brace=L2-1/2x2-1/2x1/4 KYX", "--out", str(out), "--no-pdf"]) == 2
    assert not out.exists()
    err = capsys.readouterr().err
    assert "--set KB9.brace" in err and "did you mean 'L2-1/2x2-1/2x1/4 KYF'" in err


def test_the_api_raises_the_same_error_with_the_shop_names() -> None:
    with pytest.raises(UnknownSectionError) as err:
        get_section("HSS4x4x1/5")
    assert str(err.value).startswith("section designation: 'HSS4x4x1/5' is not in the catalog; did you mean")
    assert "HSS4x4x1/4" in err.value.suggestions
    table = read_shop_table(SHOP, "kyf_sections.csv")
    with shop_table_in_use(table), pytest.raises(UnknownSectionError) as err:
        get_section("L2-1/2x2-1/2x1/4 KYG")
    assert "is in neither the catalog nor the shop table kyf_sections.csv" in str(err.value)
    assert err.value.suggestions[0] == "L2-1/2x2-1/2x1/4 KYF"
