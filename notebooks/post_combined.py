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
plate_t = "3/4 in"  # base plate thickness; 1/4 in to 3 in
plate_grade = "A36"  # base plate steel, materials catalog name
f_c = "3000 psi"  # concrete compressive strength f'c; 2500 psi to 8000 psi
rod_d = "3/4 in"  # anchor rod diameter (ASTM F1554 Gr 36, two rods on the tension side); 1/2 in to 2 in
rod_f = "3.75 in"  # plate centre to the anchor rod line; 1 in to 18 in
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.widgets import show, show_summary
from calcpad.eng.checks import add_base_plate_check, check_member
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import get_section

shape = get_section(post)
steel = hss_material(grade, shape) if "A500" in grade.upper() else get_material(grade)

sh = Sheet(calc_heading(f"Post {post}: axial and lateral load", calc_title, member_mark), method=method, meta={"member": member_mark})
sh.assume("The post is a cantilever fixed at its base plate and free at its top, where the axial and lateral loads act.")
sh.assume("Second-order effects are small or already in the moment (fixed-free post, K from Commentary Table C-A-7.1).")
sh.assume("Anchorage in the concrete (ACI 318 Chapter 17), welds and shear transfer at the base are checked elsewhere.")
sh.heading("Loads and geometry")
sh.given("P_top", P, "Axial compression at top of post")
sh.given("H_top", H, "Lateral load at top of post")
sh.given("L_post", L, "Post height, base to load")
sh.step("M_base", "H_top*L_post", "Moment at the base", unit="kip*ft", ref="cantilever, statics")
sh.step("V_base", "H_top", "Shear at the base", unit="kip", ref="cantilever, statics")
sh.assume(f"Loads combined for {method}; second-order effects neglected or included in the loads.")
result = check_member(sh, shape, material=steel, L="L_post", K=float(K), P="P_top", M_x="M_base", V="V_base")
add_base_plate_check(sh, shape, P="P_top", M="M_base", B=plate_B, N=plate_N, t_p=plate_t, f_c=f_c, f=rod_f, d_rod=rod_d,
                     material=plate_grade, suffix="plate")
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
