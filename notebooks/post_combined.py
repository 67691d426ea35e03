# %% [markdown]
# # Post under axial and lateral load: compression, flexure and interaction (AISC 360-16)
#
# The post is a cantilever carrying an axial load and a lateral load at its top. This template
# checks it per AISC 360-16 for every applicable limit state: compression (E3, E7 for slender
# walls), flexure at the base (F7 for rectangular HSS, F8 for round HSS, F2 for W-shapes), shear
# (G4/G5/G2) and the combined-force interaction H1-1a/H1-1b, names the governing ratio, and
# checks the base plate for concrete bearing, plate bending and anchor rod tension (AISC 360-16
# J8, AISC Design Guide 1).
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
method = "ASD"  # design method, ASD (service load combinations) or LRFD (factored loads); ASD or LRFD
post = "HSS4x4x1/4"  # post section, catalog designation: square/rectangular/round HSS, pipe or W-shape
grade = "A500 Gr C"  # post steel, materials catalog name (A500: round/shaped picked from the post)
P = "6.5 kip"  # axial compression at the top of the post (combined for the method); 0 to 200 kip
H = "0.45 kip"  # lateral load at the top of the post (combined for the method); 0 to 20 kip
L = "11 ft"  # post height from base plate to load; 3 ft to 30 ft
K = "2.1"  # effective length factor; 0.5 to 2.5 (2.1 for fixed base, free top)
plate_B = "10 in"  # base plate width (across the moment); 4 in to 36 in
plate_N = "10 in"  # base plate length (along the moment); 4 in to 36 in
plate_t = "7/8 in"  # base plate thickness; 1/4 in to 3 in
plate_grade = "A36"  # base plate steel, materials catalog name
f_c = "3000 psi"  # concrete compressive strength f'c; 2500 psi to 8000 psi
rod_d = "3/4 in"  # anchor rod diameter (ASTM F1554 Gr 36, two rods on the tension side); 1/2 in to 2 in
rod_f = "3.75 in"  # plate centre to the anchor rod line (four rods, square pattern 2f x 2f); 1 in <= rod_f < plate_N/2
anchor_h_ef = "12 in"  # anchor rod embedment h_ef, cast-in with a heavy hex nut; 4 in to 25 in
pier_edge = "8 in"  # edge distance from the anchor rods to each face of the pier; 2 in to 48 in
pier_depth = "36 in"  # depth of the concrete pier below the plate; 8 in to 120 in
anchor_load_factor = "1.6"  # ASD only: combined service loads to strength level for ACI 318 (1.6 common practice); 1.0 to 2.0
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.widgets import show, show_summary
from calcpad.eng.checks import add_anchorage_check, add_base_plate_check, add_second_order, check_member
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import get_section

shape = get_section(post)
steel = hss_material(grade, shape) if "A500" in grade.upper() else get_material(grade)

sh = Sheet(calc_heading(f"Post {post}: axial and lateral load", calc_title, member_mark), method=method, meta={"member": member_mark})
sh.assume("The post is a cantilever fixed at its base plate and free at its top, where the axial and lateral loads act.")
sh.assume("Effective length method with K from Commentary Table C-A-7.1 (fixed-free post).")
sh.assume("Anchorage to the concrete pier by ACI 318-19 Chapter 17 for four cast-in headed rods (no earthquake in these "
          "combinations); welds of the post to the plate are checked elsewhere.")
sh.heading("Loads and geometry")
sh.given("P_top", P, "Axial compression at top of post")
sh.given("H_top", H, "Lateral load at top of post")
sh.given("L_post", L, "Post height, base to load")
sh.step("M_base", "H_top*L_post", "Moment at the base", unit="kip*ft", ref="cantilever, statics")
sh.step("V_base", "H_top", "Shear at the base", unit="kip", ref="cantilever, statics")
sh.assume(f"Loads combined for {method}. Second-order effects by AISC 360-16 Appendix 8: the base moment is a sway "
          "(lateral translation) moment amplified by B2; the post is the whole sway system (R_M = 0.85).")
P_r, M_r = add_second_order(sh, shape, material=steel, P_nt="P_top", M_lt="M_base", L="L_post", sway="cantilever")
result = check_member(sh, shape, material=steel, L="L_post", K=float(K), P=P_r, M_x=M_r, V="V_base")
add_base_plate_check(sh, shape, P="P_top", M=M_r, B=plate_B, N=plate_N, t_p=plate_t, f_c=f_c, f=rod_f, d_rod=rod_d,
                     material=plate_grade, suffix="plate")
sh.step("s_rods", "2*f_a_plate", "Anchor rod spacing (square pattern)", unit="in")
add_anchorage_check(sh, d_a=rod_d, h_ef=anchor_h_ef, f_c="f_c_plate", c_x1=pier_edge, c_x2=pier_edge, c_y1=pier_edge,
                    c_y2=pier_edge, h_a=pier_depth, N_ua="T_a_plate", V_ua="V_base", n_x=2, n_y=2, s_x="s_rods", s_y="s_rods",
                    tension_rows=1, load_factor=None if method == "LRFD" else float(anchor_load_factor), suffix="anchor")
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What if
#
# Every parameter has a control with its stated range; the sheet and the summary above redraw in
# place. Loads and height change the sheet directly; the section, grades, plate and K re-run the
# cells above. A value outside its range, or one the sheet cannot take, is refused with its
# message and the last good values stay. "Sensitivity" ranks the inputs by their effect on the
# ratios; "What would it take?" finds the load or height at which the governing check reaches
# 1.0, or the lightest passing post of the same family; "Export job block" gives the values as a
# job-file calc.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="post_combined", bind={"P": "P_top", "H": "H_top", "L": "L_post"}, values=globals())
panel

# %%
panel.set("H_top", "0.6 kip")
interaction_at_0_6_kip = round(next(c.ratio for c in panel.sheet.summary() if c.title == "Axial + flexure interaction"), 3)
panel.reset()  # back to this template's parameters, so the stored sheet is the one above
interaction_at_0_6_kip
