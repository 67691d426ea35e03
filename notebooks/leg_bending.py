# %% [markdown]
# # Leg in bending: cantilever tube, yield-based check
#
# A leg of a light frame fixed at its base and loaded sideways at its top acts as a cantilever.
# This template shows the base moment, the tube's section properties, the bending stress and the
# factor of safety against yield, each as formula = substituted values = result.
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
P = "85 lbf"  # lateral load at the top of the leg; 0 < P <= 20 kip
L = "42 in"  # leg length from base to load; 6 in to 30 ft
D_o = "1.900 in"  # tube outside diameter; > 0
t = "0.145 in"  # tube wall thickness; 0 < t < D_o/2
F_y = "35 ksi"  # specified minimum yield stress of the tube (ASTM A53 Gr B: 35 ksi)
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.eng.materials import ROUND_TUBE_GRADES, grade_label
from calcpad.widgets import show, show_summary

sh = Sheet(calc_heading("Leg bending at base", calc_title, member_mark), meta={"member": member_mark})
sh.assume("The leg is a cantilever fixed at its base and loaded sideways at its top.")
sh.assume("First-yield check of the bending stress at the base with a factor of safety; axial load, buckling and the base connection are checked elsewhere.")
sh.heading("Inputs")
sh.given("P", P, "Lateral load at top of leg")
sh.given("L", L, "Leg length, base to load")
sh.given("D_o", D_o, "Outside diameter")
sh.given("t", t, "Wall thickness")
sh.given("F_y", F_y, "Yield stress", source=grade_label(F_y, ROUND_TUBE_GRADES))
sh.heading("Section properties")
sh.step("D_i", "D_o - 2*t", "Inside diameter")
sh.step("I", "pi/64*(D_o**4 - D_i**4)", "Moment of inertia", unit="in^4")
sh.step("c", "D_o/2", "Extreme fibre distance")
sh.heading("Demand and check")
sh.step("M", "P*L", "Base moment", ref="cantilever, statics")
sh.step("sigma_b", "M*c/I", "Bending stress at base", unit="ksi")
sh.check("Bending stress vs yield", demand="sigma_b", capacity="F_y", required_fs=FS_req, ref="yield-based, common practice")
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What-if
#
# Each parameter has a control with its stated range; the sheet and the summary above redraw in
# place. A value outside its range, or one the sheet cannot take, is refused with its message and
# the last good values stay. "Sensitivity" ranks the inputs by their effect on the ratio; "What
# would it take?" gives the load or length at which the check reaches 1.0; "Export job block"
# gives the values as a job-file calc.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="leg_bending", bind=["P", "L", "D_o", "t", "F_y"], values=globals())
panel

# %%
panel.set("P", "120 lbf")
ratio_at_120_lbf = round(panel.sheet.summary()[0].ratio, 3)
panel.reset()  # back to this template's parameters, so the stored sheet is the one above
ratio_at_120_lbf
