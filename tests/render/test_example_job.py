"""Every word from its owner, and reader-facing values, on every calc of the example job.

The job file (examples/harbor_ridge_condenser_stand.toml) is the outside reference for titles,
marks and typed values; the materials catalog (calcpad/eng/data/materials.toml, each grade with
its ASTM source) for material labels.
"""

from __future__ import annotations

import math
import re

from calcpad.eng.materials import get_material

ALL_MARKS = {"CS-2", "CF-1", "L1", "L2", "L3", "L4", "SP1", "SP2", "SP3", "C1", "C2", "B1", "KB1", "KB2", "CU-2", "C3", "B4"}


def _sheets(outcomes):
    for o in outcomes:
        assert o.error is None, o.error
        for s in o.sheets:
            yield o.calc, s["record"], s["html"]


def test_sheet_titles_carry_the_calcs_mark_and_title_only(example_run) -> None:
    job, outcomes, _ = example_run
    assert len(job.calcs) == 11
    for calc, rec, _ in _sheets(outcomes):
        title = rec["title"]
        assert title.startswith(f"{calc.member} - {calc.title}"), title
        others = {m for m in ALL_MARKS - {calc.member} if re.search(rf"(?<![\w-]){re.escape(m)}(?![\w-])", title)}
        assert not others, f"{title!r} names {others}"
        assert rec["meta"]["member"] == calc.member


def test_no_template_names_a_mark_or_a_project() -> None:
    from pathlib import Path

    root = Path(__file__).resolve().parents[2] / "notebooks"
    for path in root.glob("*.py"):
        text = path.read_text(encoding="utf-8")
        for word in ("Harbor Ridge", "Kestrel", "Northfield", "Northgate", "CU-2", "Post C3", "Cross member B4", "Knee brace KB1", "Leg L2"):
            assert word not in text, f"{path.name} contains {word!r}"


def test_material_labels_name_the_catalog_grade_of_the_value_used(example_run) -> None:
    _, outcomes, _ = example_run
    seen = labelled = 0
    for calc, rec, _ in _sheets(outcomes):
        for name, inp in rec["inputs"].items():
            if not name.startswith("F_y") or inp["unit"] != "ksi":
                continue
            desc_html = _
            seen += 1
            # the label shown beside F_y names a grade whose catalog F_y is the value used
            label = _source_of(desc_html, name)
            if label is None:  # a value a check derived without a label of its own
                continue
            labelled += 1
            if label == "as given":
                continue
            grades = [g.strip() for g in label.split(" or ")]
            assert any(math.isclose(get_material(g).Fy, inp["value"], rel_tol=0.01) for g in grades), (calc.member, name, label, inp)
    assert seen >= 13 and labelled >= 8


def _source_of(html: str, name: str) -> str | None:
    """The reference printed on the row of given ``name`` (its source label)."""
    from calcpad.core.names import name_mathml

    marker = f"<math display=\"inline\">{name_mathml(name)}<mo>=</mo>"
    row = html[: html.index(marker)]
    row = row[row.rindex('<div class="step') :]
    m = re.search(r'<span class="ref">\[([^\]]*)\]</span>', row)
    return m.group(1) if m else None


def test_ratio_is_demand_over_capacity_in_every_record(example_run) -> None:
    _, outcomes, _ = example_run
    n = 0
    for _, rec, _ in _sheets(outcomes):
        for ch in rec["checks"]:
            n += 1
            assert ch["demand"]["unit"] == ch["capacity"]["unit"], ch
            assert ch["demand"]["value"] >= 0
            assert math.isclose(ch["ratio"], ch["demand"]["value"] / ch["capacity"]["value"], rel_tol=1e-9), ch
    assert n >= 49


def test_one_unit_per_kind_inside_each_printed_ratio(example_run) -> None:
    _, outcomes, _ = example_run
    n = 0
    for _, rec, html in _sheets(outcomes):
        checks = "".join(part.split("</math>")[0] for part in html.split('<div class="step check">')[1:])
        for frac in re.findall(r"<mfrac><mrow><mrow><mn>[^<]*</mn><mspace[^>]*/>(.*?)</mrow></mrow><mrow><mrow><mn>[^<]*</mn><mspace[^>]*/>(.*?)</mrow></mrow></mfrac>", checks):
            top, bottom = frac
            n += 1
            assert top == bottom, (rec["title"], top, bottom)
    assert n >= 40  # check ratios with units were found


def test_slenderness_prints_as_kl_over_r(example_run) -> None:
    _, outcomes, _ = example_run
    found = False
    for _, _, html in _sheets(outcomes):
        if 'mathvariant="italic">KL</mi>' in html:
            found = True
            assert '<mi mathvariant="italic">KL</mi><mo>/</mo><mi>r</mi>' in html
            assert "<msub><mi mathvariant=\"italic\">KL</mi><mi>r</mi></msub>" not in html
    assert found


def test_internal_class_markers_print_in_words(example_run) -> None:
    _, outcomes, _ = example_run
    for _, _, html in _sheets(outcomes):
        assert not re.search(r"<mi>class</mi>", html)
        assert "class_" not in re.sub(r'class="[^"]*"', "", html)


def test_typed_trailing_zeros_are_kept(example_run) -> None:
    # the job types D_o = "1.900 in" for the CS-1 legs: printed as typed
    _, outcomes, _ = example_run
    calc, _rec, html = next((c, r, h) for c, r, h in _sheets(outcomes) if c.member == "L1")
    assert calc.inputs["D_o"] == "1.900 in"
    assert "<mn>1.900</mn>" in html


def test_governs_only_when_strictly_smaller(example_run) -> None:
    _, outcomes, _ = example_run
    for _, _, html in _sheets(outcomes):
        for row in html.split('<div class="step')[1:]:
            if "governs" not in row:
                continue
            values = re.findall(r"<mi>min</mi><mo>\(</mo>(.*?)<mo>\)</mo>", row)
            if len(values) < 2:
                continue
            nums = re.findall(r"<mn>([^<]*)</mn>", values[1])
            assert len(set(nums)) == len(nums) or nums.count(min(nums, key=lambda x: float(x.replace(",", "")))) == 1, row[:300]


def test_assumptions_reach_the_result_model_and_the_print(example_run) -> None:
    _, outcomes, _ = example_run
    for calc, rec, html in _sheets(outcomes):
        assert rec["assumptions"], (calc.template.name, rec["title"])
        for text in rec["assumptions"]:
            assert text.replace("&", "&amp;").replace("'", "&#x27;") in html
    repair = [r for c, r, _ in _sheets(outcomes) if c.template.name == "reinforce_bent_leg"]
    assert any("straightened" in a for r in repair for a in r["assumptions"])
    stand = next(r for c, r, _ in _sheets(outcomes) if c.template.name == "wind_rooftop_stand")
    assert any("stiff block pinned to rails" in a for a in stand["assumptions"])  # the job's stated attachment


def test_job_basis_is_validated_and_kept(example_run) -> None:
    import tomllib

    from calcpad.runner.job import JobError, parse_job
    from calcpad.runner.record import job_record
    from tests.render.conftest import EXAMPLE

    job, outcomes, _ = example_run
    raw = tomllib.loads(EXAMPLE.read_text(encoding="utf-8"))["job"]["basis"]
    assert job.info.basis == raw and len(raw) == 4
    assert job_record(job, outcomes, "inprocess", 0.0)["job"]["basis"] == raw
    text = EXAMPLE.read_text(encoding="utf-8")
    bad = text.replace("basis = [", "basis = [3, ", 1)
    try:
        parse_job(bad, "bad.toml")
    except JobError as exc:
        assert "job.basis" in str(exc) and "expected a text or a list of non-empty texts" in str(exc)
    else:
        raise AssertionError("a number in basis was accepted")


def test_text_inputs_stay_text_in_the_record(example_run) -> None:
    from calcpad.runner.record import job_record

    job, outcomes, _ = example_run
    rec = job_record(job, outcomes, "inprocess", 0.0)
    stand = next(c for c in rec["calcs"] if c["template"] == "wind_rooftop_stand")
    assert stand["inputs"]["exposure"] == {"typed": "C", "value": "C", "unit": None}  # not 1.0 coulomb


def test_negative_demand_is_checked_by_magnitude_with_the_sign_explained(example_run) -> None:
    _, outcomes, _ = example_run
    found = 0
    for _, rec, html in _sheets(outcomes):
        for ch in rec["checks"]:
            if ch["demand_signed"]["value"] < 0:
                found += 1
                assert ch["demand"]["value"] == -ch["demand_signed"]["value"]
                assert "acts in the negative direction; its magnitude is checked" in html
    assert found >= 1


def test_zero_internal_steps_are_left_out_of_the_print(example_run) -> None:
    _, outcomes, _ = example_run
    posts = [(r, h) for c, r, h in _sheets(outcomes) if c.template.name in ("post_combined", "canopy_frame")
             and any(n.startswith("A_x") for n in r["results"])]
    assert posts  # the canopy frame's HSS posts
    for rec, html in posts:
        zero = [n for n, v in rec["results"].items() if n.startswith("A_x") and v["value"] == 0.0]
        assert zero  # the HSS flanges are fully effective: A_x = 0 is recorded
        assert "Ineffective flange area" not in html
