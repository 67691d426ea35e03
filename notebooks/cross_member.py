# %% [markdown]
# # Simply supported cross member: flexure, shear and deflection (AISC 360-16)
#
# A simply supported member with a uniform load and a point load at midspan. The template works
# the maximum moment, shear and deflection with the beam formulas as steps, then checks flexure
# (F2 with lateral-torsional buckling for W-shapes and channels, F9 for tees and F10 for equal-leg
# angles with the conservative side assumed and stated, F7/F8 for HSS), shear (G2/G3/G4/G5) and the live
# deflection against a span limit such as L/240.
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
method = "ASD"  # design method, ASD (service load combinations) or LRFD (factored loads); ASD or LRFD
member = "W8x18"  # cross member section, catalog designation: W, C/MC, WT, equal-leg angle, rectangular/round HSS or pipe
grade = "A992"  # steel, materials catalog name (A500: round/shaped picked from the section)
span = "12 ft"  # span between supports; 2 ft to 40 ft
w = "180 lbf/ft"  # uniform load including self weight; 0 to 3 kip/ft
P = "1.6 kip"  # point load at midspan; 0 to 30 kip
L_b = "6 ft"  # unbraced length of the compression flange; > 0, at most the span
C_b = "1.30"  # lateral-torsional buckling modification factor; 1.0 (conservative) to 3.0
defl_limit = "240"  # deflection limit as span / N; 120 to 600
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.widgets import show, show_summary
from calcpad.eng.checks import add_flexure_check, add_shear_check
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import get_section

shape = get_section(member)
steel = hss_material(grade, shape) if "A500" in grade.upper() else get_material(grade)

sh = Sheet(calc_heading(f"Simple-span member {member}", calc_title, member_mark), method=method, meta={"member": member_mark})
sh.assume("Pinned ends (simple shear connections); loads combined for the design method for strength.")
sh.assume("The deflection uses the loads entered: enter service loads for the deflection check.")
sh.assume("The compression flange is braced at the ends and at intervals of L_b.")
sh.heading("Loads and span")
sh.given("L", span, "Span")
sh.given("w", w, "Uniform load")
sh.given("P_mid", P, "Point load at midspan")
sh.given("E", f"{steel.E:g} ksi", "Modulus of elasticity", source=steel.name)
sh.given("I_x", f"{shape.props.Ix!r} in^4", "Moment of inertia about x", source=member, sig=4)
sh.heading("Beam formulas (simple span)")
sh.step("M_max", "w*L**2/8 + P_mid*L/4", "Maximum moment, at midspan", unit="kip*ft", ref="simple beam, uniform + central point load")
sh.step("V_max", "w*L/2 + P_mid/2", "Maximum shear, at the supports", unit="kip", ref="simple beam, statics")
sh.step("Delta", "5*w*L**4/(384*E*I_x) + P_mid*L**3/(48*E*I_x)", "Midspan deflection", unit="in",
        ref="simple beam, elastic (common practice)")
sh.given("N_defl", float(defl_limit), "Deflection limit denominator (span/N)", source="chosen limit; IBC Table 1604.3 lists typical values")
sh.step("Delta_allow", "L/N_defl", "Allowable deflection", unit="in")
sh.check("Deflection", demand="Delta", capacity="Delta_allow", ref="serviceability, span/N")
add_flexure_check(sh, shape, M="M_max", L_b=L_b, C_b=float(C_b), material=steel)
# round HSS shear (G5) uses the distance from maximum to zero shear, half the span here
L_v = "L_v" if shape.kind == "round tube" else None
if L_v:
    sh.step("L_v", "L/2", "Distance from maximum to zero shear", unit="ft")
add_shear_check(sh, shape, V="V_max", L_v=L_v, material=steel)
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What if
#
# Every parameter has a control with its stated range; the sheet and the summary above redraw in
# place. Span, loads and the deflection limit change the sheet directly; the section, grade,
# unbraced length and C_b re-run the cells above.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="cross_member", bind={"span": "L", "w": "w", "P": "P_mid", "defl_limit": "N_defl"}, values=globals())
panel

# %%
panel.set("L", "16 ft")
deflection_at_16_ft = round(next(c.ratio for c in panel.sheet.summary() if c.title == "Deflection"), 3)
panel.reset()  # back to this template's parameters, so the stored sheet is the one above
deflection_at_16_ft
