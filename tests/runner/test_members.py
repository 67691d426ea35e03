"""Member tables in job files: rows checked against the template, every problem with its row."""

from __future__ import annotations

import textwrap
from pathlib import Path

import pandas as pd
import pytest

from calcpad.cli import main
from calcpad.runner.job import JobError, load_job

JOB = textwrap.dedent("""\
    [job]
    number = "T-7"
    title = "Table test (invented)"
    client = "Ferncliff Fabricators (fictional)"
    site = "Yard 2"
    engineer = "E. Example"
    revision = "A"
    date = 2025-03-14

    [[calcs]]
    template = "leg_bending"
    table = "{table}"
    title = "Legs from a table"
    [calcs.inputs]
    D_o = "1.900 in"
    t = "0.145 in"
    F_y = "35 ksi"
    FS_req = 1.67
    """)

GOOD = "mark,P [lbf],N [lbf],L [in],leg\nA1,120,115,30,Pipe 1-1/2 Std\nA2,150,115,36,Pipe 1-1/2 Std\nA3,90,40,2 ft,Pipe 1-1/4 Std\n"


def _job(tmp_path: Path, table: str, text: str | bytes, job: str = JOB) -> Path:
    p = tmp_path / table
    if isinstance(text, bytes):
        p.write_bytes(text)
    else:
        p.write_text(text, encoding="utf-8")
    jp = tmp_path / "job.toml"
    jp.write_text(job.format(table=table), encoding="utf-8")
    return jp


def test_rows_become_calcs_with_header_units_and_cell_units(tmp_path: Path) -> None:
    job = load_job(_job(tmp_path, "legs.csv", GOOD))
    assert [c.member for c in job.calcs] == ["A1", "A2", "A3"]
    assert [c.row for c in job.calcs] == [2, 3, 4]
    assert job.calcs[0].inputs["P"] == "120 lbf"
    assert job.calcs[2].inputs["L"] == "2 ft"  # a cell's own unit is kept
    assert job.calcs[2].inputs["leg"] == "Pipe 1-1/4 Std"
    assert job.calcs[0].inputs["F_y"] == "35 ksi"  # shared value from [calcs.inputs]


def test_bad_table_is_refused_with_every_problem_and_its_row(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    bad = "mark,P [lbf],L [in],leg\nA1,abc,30,Pipe 1-1/2 Std\nA2,150,,Pipe 9 Std\nA3,150,36 kg,W99x1\n"
    jp = _job(tmp_path, "bad.csv", bad)
    with pytest.raises(JobError) as err:
        load_job(jp)
    text = str(err.value)
    assert "missing column 'N'" in text
    assert "row 2, column B (P): 'abc'" in text
    assert "row 3, column C (L): empty cell" in text
    assert "row 3, column D (leg): section designation: 'Pipe 9 Std' is not in the catalog; did you mean" in text
    assert "row 4, column C (L): '36 kg' is a mass" in text
    assert "row 4, column D (leg): section designation: 'W99x1' is not in the catalog" in text
    out = tmp_path / "out"
    assert main(["run", str(jp), "--out", str(out), "--no-pdf"]) == 2
    assert not out.exists()  # nothing written
    assert "row 2, column B" in capsys.readouterr().err


def test_unknown_column_and_duplicate_marks(tmp_path: Path) -> None:
    bad = "mark,P [lbf],N [lbf],L [in],leg,Q\nA1,120,115,30,Pipe 1-1/2 Std,1\nA1,120,115,30,Pipe 1-1/2 Std,1\n"
    with pytest.raises(JobError) as err:
        load_job(_job(tmp_path, "dup.csv", bad))
    assert "column F: 'Q' is not a parameter" in str(err.value)
    assert "row 3, column A (mark): duplicate member mark 'A1' (also in row 2)" in str(err.value)


def test_out_of_range_cell_names_its_row(tmp_path: Path) -> None:
    bad = "mark,P [lbf],N [lbf],L [in],leg\nA1,120,115,3,Pipe 1-1/2 Std\n"  # L from 6 in (template range)
    with pytest.raises(JobError) as err:
        load_job(_job(tmp_path, "short.csv", bad))
    assert "row 2, column D (L)" in str(err.value)


def test_excel_table_reads_like_csv(tmp_path: Path) -> None:
    frame = pd.DataFrame({"mark": ["A1", "A2"], "P [lbf]": [120, 150.5], "N [lbf]": [115, 115], "L [in]": [30, 36], "leg": ["Pipe 1-1/2 Std"] * 2})
    frame.to_excel(tmp_path / "legs.xlsx", index=False, sheet_name="Legs")
    jp = tmp_path / "job.toml"
    jp.write_text(JOB.format(table="legs.xlsx").replace('table = "legs.xlsx"', 'table = "legs.xlsx"\ntable_sheet = "Legs"'), encoding="utf-8")
    job = load_job(jp)
    assert [c.inputs["P"] for c in job.calcs] == ["120 lbf", "150.5 lbf"]


def test_results_table_files_and_verify(tmp_path: Path) -> None:
    jp = _job(tmp_path, "legs.csv", GOOD)
    out = tmp_path / "out"
    assert main(["run", str(jp), "--out", str(out), "--no-pdf"]) == 0
    rev = out / "rev-A"
    frame = pd.read_csv(rev / "results-legs.csv")
    assert list(frame["mark"]) == ["A1", "A2", "A3"]
    assert "Combined stress vs yield" in frame.columns and "governing ratio" in frame.columns
    # governing ratio is the largest check ratio of the row
    checks = [c for c in frame.columns if c not in ("mark", "template", "governing check", "governing ratio", "governing sheet", "status", "error")]
    assert (frame[checks].max(axis=1) - frame["governing ratio"]).abs().max() < 1e-12
    assert pd.read_excel(rev / "results-legs.xlsx")["mark"].tolist() == ["A1", "A2", "A3"]
    manifest = (out / ".calcpad-manifest.json").read_text()
    assert "rev-A/results-legs.csv" in manifest and "rev-A/results-legs.xlsx" in manifest
    assert "Member table legs.csv" in (rev / "submittal.html").read_text()
    (tmp_path / "legs.csv").unlink()  # verify re-runs from the cells kept in the record
    assert main(["verify", str(out)]) == 0


def test_run_table_returns_the_results_frame(tmp_path: Path) -> None:
    from calcpad.runner.members import run_table

    (tmp_path / "legs.csv").write_text(GOOD, encoding="utf-8")
    frame = run_table("leg_bending", tmp_path / "legs.csv", {"F_y": "35 ksi"})
    assert list(frame["mark"]) == ["A1", "A2", "A3"] and set(frame["status"]) == {"OK"}
    # A1 and the README/example value: P = 120 lbf, N = 115 lbf, L = 30 in on Pipe 1-1/2 Std; the
    # governing ratio is the yield check, sigma/(F_y/FS): checked by hand below with the section's
    # design wall (AISC 360-16 B4.2: 0.93 t) and cantilever statics (M = P L), B2 ~ 1.
    import math
    D, t = 1.900, 0.93 * 0.145
    Di = D - 2 * t
    A, I = math.pi / 4 * (D**2 - Di**2), math.pi / 64 * (D**4 - Di**4)
    sigma = 115 / A + 120 * 30 * (D / 2) / I  # psi, first order
    assert frame.loc[0, "governing check"] == "Combined stress vs yield"
    assert frame.loc[0, "governing ratio"] == pytest.approx(sigma / (35000 / 1.67), rel=0.01)  # B2 adds < 1 %
    with pytest.raises(Exception, match="row 2, column B"):
        (tmp_path / "bad.csv").write_text("mark,P [lbf]\nA1,x\n", encoding="utf-8")
        run_table("leg_bending", tmp_path / "bad.csv")


def test_results_workbook_is_byte_reproducible(tmp_path: Path) -> None:
    import time

    jp = _job(tmp_path, "legs.csv", GOOD)
    assert main(["run", str(jp), "--out", str(tmp_path / "one"), "--no-pdf"]) == 0
    time.sleep(2.1)  # zip entry times have a 2 s resolution: a clock-dependent writer would differ now
    assert main(["run", str(jp), "--out", str(tmp_path / "two"), "--no-pdf"]) == 0
    one, two = (tmp_path / "one" / "rev-A" / "results-legs.xlsx").read_bytes(), (tmp_path / "two" / "rev-A" / "results-legs.xlsx").read_bytes()
    assert one == two
    assert (tmp_path / "one" / "rev-A" / "results-legs.csv").read_bytes() == (tmp_path / "two" / "rev-A" / "results-legs.csv").read_bytes()
    import io
    import zipfile

    from openpyxl import load_workbook

    with zipfile.ZipFile(io.BytesIO(one)) as z:
        assert {i.date_time for i in z.infolist()} == {(1980, 1, 1, 0, 0, 0)}
    wb = load_workbook(io.BytesIO(one))
    assert wb.properties.created.date().isoformat() == wb.properties.modified.date().isoformat() == "2025-03-14"  # the job's date
    # the workbook holds what the CSV holds
    csv_frame, xlsx_frame = pd.read_csv(tmp_path / "one" / "rev-A" / "results-legs.csv"), pd.read_excel(io.BytesIO(one))
    pd.testing.assert_frame_equal(csv_frame, xlsx_frame, check_dtype=False)


TWO_TABLES = JOB + textwrap.dedent("""\

    [[calcs]]
    template = "leg_bending"
    table = "{second}"
    title = "More legs"
    [calcs.inputs]
    D_o = "1.900 in"
    t = "0.145 in"
    F_y = "35 ksi"
    FS_req = 1.67
    """)


def test_tables_of_the_same_name_in_two_folders_write_two_results(tmp_path: Path) -> None:
    for folder, marks in (("north", "N"), ("south", "S")):
        (tmp_path / folder).mkdir()
        (tmp_path / folder / "legs.csv").write_text(GOOD.replace("A", marks), encoding="utf-8")
    jp = tmp_path / "job.toml"
    jp.write_text(TWO_TABLES.format(table="north/legs.csv", second="south/legs.csv"), encoding="utf-8")
    assert main(["run", str(jp), "--out", str(tmp_path / "out"), "--no-pdf"]) == 0
    rev = tmp_path / "out" / "rev-A"
    assert pd.read_csv(rev / "results-north_legs.csv")["mark"].tolist() == ["N1", "N2", "N3"]
    assert pd.read_csv(rev / "results-south_legs.csv")["mark"].tolist() == ["S1", "S2", "S3"]
    assert "results-north_legs.csv and .xlsx" in (rev / "submittal.html").read_text(encoding="utf-8")


def test_tables_that_would_write_the_same_results_are_refused(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "legs.csv").write_text(GOOD, encoding="utf-8")
    pd.read_csv(tmp_path / "legs.csv").assign(mark=lambda f: f["mark"].str.replace("A", "B")).to_excel(tmp_path / "legs.xlsx", index=False)
    jp = tmp_path / "job.toml"
    jp.write_text(TWO_TABLES.format(table="legs.csv", second="legs.xlsx"), encoding="utf-8")
    assert main(["run", str(jp), "--out", str(tmp_path / "out"), "--no-pdf"]) == 2
    err = capsys.readouterr().err
    assert "'legs.csv' and 'legs.xlsx' would both write results-legs.csv" in err and "Traceback" not in err
    assert not (tmp_path / "out").exists()  # refused before anything ran or was written


def test_custom_section_rows_take_their_dimensions_from_columns(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    # leg_bending offers "custom for D_o and t", as a calc without a table does (leg = "custom")
    table = "mark,P [lbf],N [lbf],L [in],leg,D_o [in],t [in]\nC1,120,115,30,custom,2.000,0.120\nC2,120,115,30,Pipe 1-1/2 Std,1.900,0.145\n"
    job = load_job(_job(tmp_path, "legs.csv", table))
    assert [c.inputs["leg"] for c in job.calcs] == ["custom", "Pipe 1-1/2 Std"]
    assert job.calcs[0].inputs["D_o"] == "2.000 in" and job.calcs[0].inputs["t"] == "0.120 in"
    from calcpad.runner.execute import run_job

    o = run_job(job)[0]
    assert o.error is None
    results = o.sheets[0]["record"]["results"]
    # design wall 0.93 t (AISC 360-16 B4.2) and I = pi/64 (D^4 - D_i^4) of a round tube (by hand)
    import math
    t = 0.93 * 0.120
    di = 2.000 - 2 * t
    assert results["t"]["value"] == pytest.approx(t, rel=1e-4)
    assert results["I"]["value"] == pytest.approx(math.pi / 64 * (2.000**4 - di**4), rel=1e-3)
    # a dimension cell of a custom row goes through the value parser like any cell
    bad = "mark,P [lbf],N [lbf],L [in],leg,D_o [in],t [in]\nC1,120,115,30,custom,2 kg,0.120\nC2,120,115,30,square,2.0,0.12\n"
    with pytest.raises(JobError) as exc:
        load_job(_job(tmp_path, "bad.csv", bad))
    text = str(exc.value)
    assert "row 2, column F (D_o)" in text and "kg" in text
    assert "row 3, column E (leg)" in text and "'square' is not in the catalog" in text  # a word the template does not offer


def test_repeated_values_are_each_checked_on_their_own_row(tmp_path: Path) -> None:
    # leg_bending: 0 < t < D_o/2 (a bound naming another column) and L from 1 in up (template range)
    table = ("mark,P [lbf],N [lbf],L [in],leg,D_o [in],t [in]\n"
             "R1,120,115,30,custom,2.0,0.5\n"     # t = 0.5 < 2.0/2: in range
             "R2,120,115,30,custom,0.8,0.5\n"     # the same t, but 0.5 >= 0.8/2: out of range
             "R3,120,115,30,custom,0.8,0.5\n"     # the same again: reported on its own row too
             "R4,120,115,-5,custom,2.0,0.5\n"     # L below its range
             "R5,120,115,-5,custom,2.0,0.5\n")
    with pytest.raises(JobError) as exc:
        load_job(_job(tmp_path, "legs.csv", table))
    text = str(exc.value)
    assert "row 2," not in text
    for row in (3, 4):
        assert f"row {row}, column G (t)" in text
    for row in (5, 6):
        assert f"row {row}, column D (L)" in text


def test_two_sheets_of_one_workbook_are_refused(tmp_path: Path) -> None:
    # the job keeps its tables by file name (record, verify, results files): two sheets of one
    # workbook would be kept as one, so a second sheet is refused with what to do
    with pd.ExcelWriter(tmp_path / "legs.xlsx") as xl:
        pd.DataFrame({"mark": ["A1"], "P [lbf]": [120], "N [lbf]": [115], "L [in]": [30], "leg": ["Pipe 1-1/2 Std"]}).to_excel(xl, index=False, sheet_name="North")
        pd.DataFrame({"mark": ["B1"], "P [lbf]": [150], "N [lbf]": [115], "L [in]": [36], "leg": ["Pipe 1-1/2 Std"]}).to_excel(xl, index=False, sheet_name="South")
    text = TWO_TABLES.format(table="legs.xlsx", second="legs.xlsx")
    text = text.replace('table = "legs.xlsx"\ntitle = "Legs from a table"', 'table = "legs.xlsx"\ntable_sheet = "North"\ntitle = "Legs from a table"')
    text = text.replace('table = "legs.xlsx"\ntitle = "More legs"', 'table = "legs.xlsx"\ntable_sheet = "South"\ntitle = "More legs"')
    (tmp_path / "job.toml").write_text(text, encoding="utf-8")
    with pytest.raises(JobError) as exc:
        load_job(tmp_path / "job.toml")
    assert "calcs[2].table" in str(exc.value) and "another sheet" in str(exc.value)
