"""Values written as text: the trade notations are read exactly, everything else is refused.

Expected values are worked by hand from the notation (12 in per ft, common practice) or built
with Python's ``fractions.Fraction``; units are compared with pint's own reading of a fixed
unit name (pint is the outside reference for unit identity). Nothing here is produced by
running calcpad's parser.
"""

from __future__ import annotations

import math
import tomllib
from fractions import Fraction

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calcpad.core.errors import CalcpadError, UnitInputError
from calcpad.core.sheet import Sheet
from calcpad.core.units import ACCEPTED_FORMS, Q_, parse_quantity, parse_unit, ureg
from calcpad.core.value_text import MAX_LENGTH, MAX_POWER

# ------------------------------------------------------------------ every probe class of issue 10

READ_EXACTLY = [
    # (text, magnitude, pint unit name as the reference)
    ("1 1/2 in", 1.5, "inch"),  # was read as 0.5 in
    ("1-1/2 in", 1.5, "inch"),
    ("3/16 in", 0.1875, "inch"),
    ("3'-6 1/2\"", 42.5, "inch"),  # was read as 33 in: 3 ft = 36 in, + 6.5 in
    ("3'-6-1/2\"", 42.5, "inch"),
    ("3'-6\"", 42.0, "inch"),
    ("3' 6\"", 42.0, "inch"),
    ("3'6\"", 42.0, "inch"),
    ("3 ft 6 in", 42.0, "inch"),  # was refused as "an area"
    ("3 ft 6-1/2 in", 42.5, "inch"),
    ("3 ft 6 1/2 in", 42.5, "inch"),
    ("3 feet 6 inches", 42.0, "inch"),
    ("-0'-6\"", -6.0, "inch"),  # was read as +6 in
    ("-3'-6\"", -42.0, "inch"),
    ("7'", 84.0, "inch"),
    ("3.5'", 42.0, "inch"),
    ("6\"", 6.0, "inch"),
    ("6 1/2\"", 6.5, "inch"),
    ("0'-0\"", 0.0, "inch"),
    ("1,200 lbf", 1200.0, "force_pound"),
    ("1,200.5 lbf", 1200.5, "force_pound"),
    ("12,000,000 lbf", 12e6, "force_pound"),
    ("1200 lbf", 1200.0, "force_pound"),
    ("1.5e3 psi", 1500.0, "pound_force_per_square_inch"),
    ("2E-3 in", 0.002, "inch"),
    (".5 in", 0.5, "inch"),
    ("-6 in", -6.0, "inch"),
    ("+6 in", 6.0, "inch"),
    ("84in", 84.0, "inch"),
    ("250 lb", 250.0, "force_pound"),  # a bare lb is a load (documented)
    ("250 lbs", 250.0, "force_pound"),
    ("250 pound", 250.0, "pound"),
    ("2 kips", 2.0, "kip"),
    ("2.5 kip*ft", 2.5, "kip*foot"),
    ("2.5 kip-ft", 2.5, "kip*foot"),
    ("2.5 kip·ft", 2.5, "kip*foot"),
    ("2.5 kN*m", 2.5, "kilonewton*meter"),
    ("12 lbf/ft", 12.0, "force_pound/foot"),
    ("3 kip/(ft*in)", 3.0, "kip/(foot*inch)"),
    ("4.5 in^4", 4.5, "inch**4"),
    ("4.5 in**4", 4.5, "inch**4"),
    ("4.5 in⁴", 4.5, "inch**4"),
    ("2.1 in²", 2.1, "inch**2"),
    ("12 psf", 12.0, "psf"),
    ("36 ksi", 36.0, "kip_per_square_inch"),
    ("250 MPa", 250.0, "megapascal"),
    ("12 kN/m^2", 12.0, "kilonewton/meter**2"),
    ("30°", 30.0, "degree"),
    ("5%", 5.0, "percent"),
    ("1½ in", 1.5, "inch"),
    ("3′-6½″", 42.5, "inch"),
    ("0.85", 0.85, ""),
    ("1/2", 0.5, ""),
]


@pytest.mark.parametrize("text, value, unit", READ_EXACTLY)
def test_trade_forms_read_exactly(text, value, unit):
    q = parse_quantity(text, "L")
    assert q.magnitude == value
    assert q.units == ureg.Unit(unit)


REFUSED = [
    # (text, words the message must carry: the reason or the targeted hint)
    ("3ft-6in", "write 3 ft 6 in or 3'-6\""),  # was read as 30 in
    ("1 200 lbf", "write 1,200 or 1200"),  # was read as 200 lbf
    ("1 000 lbf", "write 1,000 or 1000"),  # was read as 0
    ("0.5e in", "scientific notation"),  # was read as elementary charge times inch
    ("9^9^9 lbf", "not a calculation"),  # hung
    ("2**12**12 in", "not a calculation"),  # ate 2.3 GB
    ("1 in ** (2**100000)", f"whole number from 1 to {MAX_POWER}"),
    ("2 in^1.25", f"whole number from 1 to {MAX_POWER}"),
    ("2 in^7", f"whole number from 1 to {MAX_POWER}"),
    ("2 in^99999999999", f"whole number from 1 to {MAX_POWER}"),
    ("nan", "not a finite number"),
    ("inf in", "not a finite number"),
    ("-infinity", "not a finite number"),
    ("1e400 in", "too large"),
    ("1e-400 in", "too small"),
    ("1e999999999 in", "out of range"),
    ("1,2 in", "decimals take a point"),
    ("0,500 in", "commas separate thousands"),
    ("1,2000 lbf", "commas separate thousands"),
    ("1.2.3 in", "one decimal point"),
    ("3'-6", "inch mark"),
    ("3'-6 in", "inch mark"),
    ("3 ft 6", "write 3 ft 6 in"),
    ("3'-13\"", "less than 12"),
    ("3.5'-6\"", "whole number of feet"),
    ("1 3/2 in", "between 0 and 1"),
    ("1 1/0 in", "divides by zero"),
    ("1/0 in", "divides by zero"),
    ("1.5/2 in", "whole numbers"),
    ("3-4 in", "mixed number"),
    ("2*3 in", "not a calculation"),
    ("1/2/3 in", "not a calculation"),
    ("1e308*10 in", "not a calculation"),
    ("2 kip ft", "join units with * or - (kip*ft or kip-ft)"),
    ("84 in ft", "side by side"),
    ("2 in^4 ft", "side by side"),
    ("2 kip)", "one number and one unit"),
    ("2 kip/ft/ft", "kip/(ft*in)"),
    ("2 kip/ft*in", "kip/(ft*in)"),  # kip/(ft*in) or (kip/ft)*in? ambiguous: refused
    ("2 in^4^2", f"whole number from 1 to {MAX_POWER}"),
    ("2 kip-", "write units as"),
    ("84 in.", "without a period"),
    ("84 in4", "write in^4"),
    ("84 furlongz", "unknown unit"),
    ("84 kin", "unknown unit"),  # kilo-inch: prefixes belong to SI units only
    ("84 e", "physical constant"),
    ("5 c", "physical constant"),
    ("5 pi", "physical constant"),
    ("2 A", "not a unit of length, force"),
    ("in", "starts with a number"),
    ("", "empty"),
    ("   ", "empty"),
    ("-", "no number"),
    ("__import__('os')", "not part of a value"),
    ("1 in; rm -rf /", "not part of a value"),
    ("1" * (MAX_LENGTH + 1), "characters long"),
]


@pytest.mark.parametrize("text, words", REFUSED)
def test_everything_else_is_refused_with_a_targeted_message(text, words):
    with pytest.raises(UnitInputError) as err:
        parse_quantity(text, "calcs[2].inputs.L")
    msg = str(err.value)
    assert msg.startswith("calcs[2].inputs.L: ")  # names the field
    assert repr(text) in msg  # shows the value
    assert words in msg
    assert ACCEPTED_FORMS in msg  # lists the accepted forms


@pytest.mark.parametrize("number", [math.nan, math.inf, -math.inf, 10**400])
def test_non_finite_numbers_are_refused(number):
    with pytest.raises(UnitInputError, match="not a finite number"):
        parse_quantity(number, "FS_req")


def test_non_finite_quantity_is_refused():
    with pytest.raises(UnitInputError, match="not finite"):
        parse_quantity(Q_(math.nan, "in"), "L")


@pytest.mark.parametrize(
    "text, reference",
    [("kip*ft", "kip*foot"), ("kip-ft", "kip*foot"), ("in^4", "inch**4"), ("lbf/in", "force_pound/inch"), ("1/in", "1/inch"),
     ("ksi", "kip_per_square_inch"), ("lb", "force_pound"), ("", "dimensionless"), ("1", "dimensionless")],
)
def test_unit_strings(text, reference):
    assert parse_unit(text) == ureg.Unit(reference)


@pytest.mark.parametrize("text", ["84 in", "in^(4)", "kip**ft", "1/in/s", "ft in", "e", "2**12**12"])
def test_bad_unit_strings(text):
    with pytest.raises(UnitInputError, match="step 'M' unit"):
        parse_unit(text, "step 'M' unit")


# ------------------------------------------------------------------ the same reader everywhere


def test_sheet_given_and_set_read_feet_inches():
    sh = Sheet("leg")
    sh.given("L", "3'-6 1/2\"")
    assert sh["L"].to("inch").magnitude == 42.5
    sh.set(L="3 ft 6 in")
    assert sh["L"].to("inch").magnitude == 42.0
    with pytest.raises(UnitInputError, match="given 'L'"):
        sh.set(L="3ft-6in")
    with pytest.raises(UnitInputError, match="not a finite number"):
        sh.given("FS", math.nan)


def test_step_unit_lb_is_pound_force_where_shown():
    sh = Sheet("load")
    sh.given("P", "2 kip")
    sh.step("Q", "P", unit="lb")
    assert sh["Q"].magnitude == pytest.approx(2000.0)  # 1 kip = 1000 lbf by definition


JOB = """
[job]
number = "T-1"
title = "values"
client = "c"
site = "s"
engineer = "e"
revision = "A"
date = 2025-01-01

[[calcs]]
template = "leg_bending"
member = "L1"
[calcs.inputs]
P = {P}
N = "0 lbf"
L = "42 in"
leg = "custom"
D_o = "1.900 in"
t = "0.145 in"
F_y = "35 ksi"
FS_req = {FS}
"""


@pytest.mark.parametrize("bad_fs", ["nan", "inf", "1e400", "-inf"])
def test_job_file_non_finite_numbers_are_refused(bad_fs):
    from calcpad.runner.job import JobError, parse_job  # the runner reads job values with this parser

    assert not math.isfinite(tomllib.loads(f"x = {bad_fs}")["x"])  # TOML reads them as floats
    with pytest.raises(JobError) as err:
        parse_job(JOB.replace("{P}", '"85 lbf"').replace("{FS}", bad_fs))
    assert "calcs[1].inputs.FS_req" in str(err.value) and "finite" in str(err.value)


@pytest.mark.parametrize("bad_p", ['{ value = nan, unit = "lbf" }', '{ value = 1e400, unit = "lbf" }', '"9^9^9 lbf"', '"1 200 lbf"'])
def test_job_file_bad_values_are_refused(bad_p):
    from calcpad.runner.job import JobError, parse_job

    with pytest.raises(JobError) as err:
        parse_job(JOB.replace("{P}", bad_p).replace("{FS}", "1.67"))
    assert "calcs[1].inputs.P" in str(err.value)


def test_job_file_good_values_are_read():
    from calcpad.runner.job import parse_job

    job = parse_job(JOB.replace("{P}", '{ value = 1200, unit = "lbf" }').replace("{FS}", "1.67"))
    assert parse_quantity(job.calcs[0].inputs["P"]).to("lbf").magnitude == 1200.0
    job = parse_job(JOB.replace("{P}", '"1,200 lbf"').replace("{FS}", "1.67").replace('"42 in"', "\"3'-6 1/2\\\"\""))
    assert parse_quantity(job.calcs[0].inputs["L"]).to("inch").magnitude == 42.5


# ------------------------------------------------------------------ property tests

signs = st.sampled_from(["", "-"])
small_fractions = st.integers(min_value=2, max_value=64).flatmap(
    lambda d: st.tuples(st.integers(min_value=1, max_value=d - 1), st.just(d))
)


@st.composite
def decimal_numbers(draw):
    """A decimal as engineers write it, and its exact value."""
    whole = draw(st.integers(min_value=0, max_value=10**9))
    digits = draw(st.text(alphabet="0123456789", min_size=0, max_size=6))
    grouped = draw(st.booleans())
    text = f"{whole:,}" if grouped else str(whole)
    value = Fraction(whole)
    if digits:
        text += "." + digits
        value += Fraction(int(digits), 10 ** len(digits))
    return text, value


@st.composite
def scientific_numbers(draw):
    mantissa = draw(st.integers(min_value=1, max_value=9999))
    exponent = draw(st.integers(min_value=-30, max_value=30))
    e = draw(st.sampled_from(["e", "E"]))
    return f"{mantissa}{e}{exponent}", Fraction(mantissa) * Fraction(10) ** exponent


@st.composite
def fractions_and_mixed(draw):
    num, den = draw(small_fractions)
    whole = draw(st.integers(min_value=0, max_value=99))
    form = draw(st.sampled_from(["plain", "space", "dash"]))
    if form == "plain":
        return f"{num}/{den}", Fraction(num, den)
    sep = " " if form == "space" else "-"
    return f"{whole}{sep}{num}/{den}", whole + Fraction(num, den)


@st.composite
def feet_inches(draw):
    """Feet-inches in every documented form; the reading is 12 in per ft plus the inches."""
    feet = draw(st.integers(min_value=0, max_value=99))
    inches = draw(st.integers(min_value=0, max_value=11))
    frac = draw(st.none() | small_fractions)
    sign = draw(signs)
    if frac is None:
        inch_text, inch_value = str(inches), Fraction(inches)
    else:
        sep = draw(st.sampled_from([" ", "-"]))
        inch_text, inch_value = f"{inches}{sep}{frac[0]}/{frac[1]}", inches + Fraction(*frac)
    form = draw(st.sampled_from(["{f}'-{i}\"", "{f}' {i}\"", "{f}'{i}\"", "{f} ft {i} in", "{f}ft {i}in", "{f} feet {i} inches"]))
    text = sign + form.format(f=feet, i=inch_text)
    value = 12 * feet + inch_value
    return text, -value if sign else value


UNITS = [  # ways to write a unit, and pint's name for it
    (["in", "inch", "inches"], "inch"),
    (["ft", "foot", "feet"], "foot"),
    (["lbf", "lb", "lbs"], "force_pound"),
    (["kip", "kips"], "kip"),
    (["kip*ft", "kip-ft", "kip·ft", "kip * ft"], "kip*foot"),
    (["lbf*in", "lb-in", "lbf·in"], "force_pound*inch"),
    (["lbf/ft", "plf"], None),  # plf is its own unit; compared through its dimension below
    (["in^4", "in**4", "in⁴"], "inch**4"),
    (["in^2", "in²", "in**2"], "inch**2"),
    (["kN*m", "kN-m"], "kilonewton*meter"),
    (["psf"], "psf"),
    (["ksi"], "kip_per_square_inch"),
    (["MPa"], "megapascal"),
    (["kip/(ft*in)"], "kip/(foot*inch)"),
]


@st.composite
def units(draw):
    spellings, reference = draw(st.sampled_from(UNITS))
    return draw(st.sampled_from(spellings)), reference


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(number=st.one_of(decimal_numbers(), scientific_numbers(), fractions_and_mixed()), sign=signs, unit=units(),
       space=st.sampled_from([" ", "  "]))
def test_numbers_with_units_equal_their_independent_reading(number, sign, unit, space):
    text, value = number
    spelled, reference = unit
    q = parse_quantity(f"{sign}{text}{space}{spelled}")
    expected = float(-value if sign else value)
    assert q.magnitude == expected
    ref = ureg.Unit(reference) if reference else ureg.Unit("force_pound/foot")
    if reference:
        assert q.units == ref
    else:  # plf and lbf/ft: one pound-force per foot either way
        assert q.to(ref).magnitude == pytest.approx(expected, rel=1e-12)


@settings(max_examples=300, deadline=None)
@given(number=st.one_of(decimal_numbers(), scientific_numbers(), fractions_and_mixed()), sign=signs)
def test_plain_numbers_equal_their_independent_reading(number, sign):
    text, value = number
    q = parse_quantity(sign + text)
    assert q.dimensionless and q.magnitude == float(-value if sign else value)


@settings(max_examples=300, deadline=None)
@given(feet_inches())
def test_feet_inches_equal_their_independent_reading(case):
    text, inches = case
    q = parse_quantity(text)
    assert q.units == ureg.inch and q.magnitude == float(inches)


TRADE_ALPHABET = "0123456789 .,-+*/^()'\"eEinftlbkpsNmMPa%°²⁴·½−"


@settings(max_examples=1500, deadline=None)
@given(st.one_of(st.text(max_size=3 * MAX_LENGTH), st.text(alphabet=TRADE_ALPHABET, max_size=40)))
def test_any_text_is_read_or_refused_never_crashes(text):
    try:
        q = parse_quantity(text, "x")
    except UnitInputError as exc:
        assert str(exc).startswith("x: ")
        return
    except CalcpadError as exc:  # pragma: no cover - a failure message if another error leaks
        pytest.fail(f"{text!r}: unexpected {type(exc).__name__}: {exc}")
    assert len(text) <= MAX_LENGTH  # longer text is refused by rule before it is read
    assert math.isfinite(q.magnitude)
    assert set(q.dimensionality) <= {"[length]", "[mass]", "[time]"}  # units of structural calcs only


@settings(max_examples=300, deadline=None)
@given(st.text(alphabet="0123456789^*() ", min_size=3, max_size=40).filter(lambda s: "^" in s or "**" in s))
def test_powers_of_numbers_are_refused_by_rule(text):
    with pytest.raises(UnitInputError):
        parse_quantity(text + " in")


@pytest.mark.parametrize("table, inches", [('{ value = 84.1234567, unit = "in" }', 84.1234567), ('{ value = 84, unit = "in" }', 84.0),
                                           ('{ value = 6.000000001, unit = "in" }', 6.000000001)])
def test_job_value_tables_keep_every_digit(table, inches):
    from calcpad.runner.job import parse_job

    job = parse_job(JOB.replace("{P}", '"85 lbf"').replace("{FS}", "1.23456789").replace('"42 in"', table))
    assert parse_quantity(job.calcs[0].inputs["L"]).to("inch").magnitude == inches
    assert parse_quantity(job.calcs[0].inputs["FS_req"]).magnitude == 1.23456789


def test_template_range_bounds_use_the_same_reader():
    from calcpad.runner.template import parse_parameters

    params = parse_parameters('L = "84 in"  # leg length; 3\'-6 1/2" to 1,200 in\n', "test")
    L = params["L"]
    assert L.lower.value.to("inch").magnitude == 42.5 and L.upper.value.to("inch").magnitude == 1200.0
    assert L.quantity.to("inch").magnitude == 84.0


def test_what_if_panel_uses_the_same_reader():
    pytest.importorskip("ipywidgets")
    from calcpad.widgets import what_if

    sh = Sheet("leg")
    sh.given("P", "85 lbf")
    sh.given("L", "42 in")
    sh.step("M", "P*L")
    panel = what_if(sh)
    assert panel.set("L", "3'-6 1/2\"") is True
    assert sh["L"].to("inch").magnitude == 42.5
    assert panel.set("P", "1 200 lbf") is False and "write 1,200 or 1200" in panel.last_error
    assert panel.set("P", math.nan) is False and "finite" in panel.last_error
    assert sh["P"].to("lbf").magnitude == 85.0  # the last good value stays


def test_half_powers_of_units_read_exactly() -> None:
    # ACI 318-19 Eq. (17.6.2.2.1): N_b = k_c * lambda * sqrt(f'c) * h_ef^1.5 with k_c = 24 in
    # lbf/(psi^0.5 in^1.5); the unit is written with half powers.
    q = parse_quantity("24 lbf/(psi**0.5*in**1.5)")
    assert q.magnitude == 24.0
    assert q.units == ureg.lbf / (ureg.psi**0.5 * ureg.inch**1.5)
    assert parse_quantity("10 in^-1").units == 1 / ureg.inch
    for bad in ("2 in^0.25", "2 in^6.5", "2 in^7", "2 in^1.50"):
        with pytest.raises(CalcpadError):
            parse_quantity(bad)


@pytest.mark.parametrize("text", [".¹", "¹", "1¹ in", "²2 in"])
def test_superscript_digits_are_not_numbers(text: str) -> None:
    # found by the hypothesis test above in CI: str.isdigit() is True for '¹', the number pattern is not
    with pytest.raises(UnitInputError):
        parse_quantity(text, "x")


@pytest.mark.parametrize("text", [".511-2.5/", "1-1/", "3 1/", "2 in/"])
def test_text_that_stops_mid_value_is_refused(text: str) -> None:
    # found by a random token fuzz: the mixed-number rule read past the end
    with pytest.raises(UnitInputError):
        parse_quantity(text, "x")
