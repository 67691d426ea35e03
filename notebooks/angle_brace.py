# %% [markdown]
# # Single-angle brace welded by one leg: compression, tension and end welds (AISC 360-16)
#
# A single angle loaded at its ends through one leg is eccentrically loaded; AISC 360-16 E5 lets
# it be checked as an axial member with an effective slenderness that accounts for the
# eccentricity. The template checks the brace in compression (E5, E3, E7 for slender legs), in
# tension (D2 with the shear lag factor of Table D3.1 case 2 for longitudinal welds) and the two
# longitudinal fillet welds at each end, with the gusset plate along them (J2, J4.2) and its block
# shear (J4.3).
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
method = "ASD"  # design method, ASD (service load combinations) or LRFD (factored loads); ASD or LRFD
brace = "L2-1/2x2-1/2x1/4"  # single angle, catalog designation (leg ratio below 1.7)
grade = "A36"  # brace steel, materials catalog name
connected_leg = "long"  # leg welded to the gusset plates; long or short
P_c = "3.4 kip"  # brace compression (combined for the method); 0 to 60 kip
P_t = "2.9 kip"  # brace tension under the reversed load (combined for the method); 0 to 60 kip
L = "5 ft"  # brace length between work points; 1 ft to 20 ft
weld_size = "3/16 in"  # fillet weld leg size; 1/8 in to 5/16 in
weld_length = "3 in"  # length of each of the two longitudinal welds at an end; 1-1/2 in to 12 in
F_EXX = "70 ksi"  # filler metal classification strength; 60 ksi to 80 ksi
gusset_t = "3/8 in"  # gusset plate thickness; 1/4 in to 1 in
gusset_grade = "A36"  # gusset plate steel, materials catalog name
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.widgets import show, show_summary
from calcpad.eng.checks import add_block_shear_check, add_compression_check, add_fillet_weld_check, add_tension_check
from calcpad.eng.materials import get_material
from calcpad.eng.sections import get_section

shape = get_section(brace)
steel = get_material(grade)
# eccentricity of the connection: from the face of the welded leg to the centroid of the angle
x_bar = shape.props.xc if (connected_leg == "long") == (shape.d >= shape.b) else shape.props.yc

sh = Sheet(calc_heading(f"Single-angle brace {brace}", calc_title, member_mark), method=method, meta={"member": member_mark})
sh.assume("The brace is welded at both ends through the same leg, with no load between its ends (AISC 360-16 E5 conditions).")
sh.assume("The two end welds share the force equally.")
sh.assume("The gusset's other limit states (Whitmore section, buckling) and the members it joins are checked elsewhere.")
sh.heading("Brace forces and geometry")
sh.given("P_comp", P_c, "Brace compression")
sh.given("P_tens", P_t, "Brace tension (load reversed)")
sh.given("L_br", L, "Brace length between work points")
sh.assume(f"Forces combined for {method}; the angle is welded at both ends through its {connected_leg} leg (AISC 360-16 E5).")
add_compression_check(sh, shape, P="P_comp", L="L_br", material=steel, connected_leg=connected_leg)

sh.heading("Shear lag at the welded end", 2)
sh.given("x_bar", f"{x_bar!r} in", "Connection eccentricity, welded leg face to centroid", source=brace, sig=4)
sh.given("l_w", weld_length, "Length of the longitudinal welds")
sh.step("U_sl", "1 - x_bar/l_w", "Shear lag factor, longitudinal welds", ref="AISC 360-16 Table D3.1 case 2")
add_tension_check(sh, shape, T="P_tens", U="U_sl", material=steel)

sh.heading("End connection", 2)
sh.step("R_end", "max(P_comp, P_tens)", "Force through the end welds", unit="kip")
sh.given("t_leg", f"{shape.t:g} in", "Angle leg thickness", source=brace)
sh.given("t_gus", gusset_t, "Gusset plate thickness")
sh.step("t_thin", "min(t_leg, t_gus)", "Thinner part joined", unit="in")
add_fillet_weld_check(sh, R="R_end", w=weld_size, L="l_w", t_p="t_thin", t_e="t_leg", F_EXX=F_EXX, n=2,
                      base_t="t_gus", base_material=gusset_grade)

sh.heading("Gusset plate: block shear along the welds", 2)
gusset = get_material(gusset_grade)
sh.given("b_leg", f"{(shape.d if connected_leg == 'long' else shape.b):g} in", "Width of the welded leg (weld line to weld line)",
         source=brace)
sh.step("A_gvg", "2*l_w*t_gus", "Gross shear area of the gusset along both welds", unit="in^2", ref="AISC 360-16 J4.3")
sh.step("A_ntg", "b_leg*t_gus", "Tension area of the gusset across the end of the welds", unit="in^2", ref="AISC 360-16 J4.3")
add_block_shear_check(sh, R="R_end", A_gv="A_gvg", A_nt="A_ntg", F_y=f"{gusset.Fy!r} ksi", F_u=f"{gusset.Fu!r} ksi", suffix="gusset")
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What if
#
# Every parameter has a control with its stated range; the sheet and the summary above redraw in
# place. Forces, length, weld length and gusset thickness change the sheet directly; the angle,
# grades and connected leg re-run the cells above. A value outside its range, or one the sheet
# cannot take, is refused with its message and the last good values stay.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="angle_brace", bind={"P_c": "P_comp", "P_t": "P_tens", "L": "L_br", "weld_length": "l_w", "gusset_t": "t_gus"}, values=globals())
panel

# %%
panel.set("L_br", "8 ft")
compression_ratio_at_8_ft = round(next(c.ratio for c in panel.sheet.summary() if c.title == "Axial compression"), 3)
panel.reset()  # back to this template's parameters, so the stored sheet is the one above
compression_ratio_at_8_ft
