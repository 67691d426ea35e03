# %% [markdown]
# # Design chart: longest leg for each pipe size and lateral load
#
# The leg-bending template (cantilever tube, yield-based combined stress with the AISC 360-16
# Appendix 8 amplifier) swept over a grid of lateral load x leg length for several pipe sizes on
# its compiled sheet. For each size and load the chart shows the longest leg with every check OK;
# the table below it holds the same numbers. A grid point passes when every check ratio is within
# its limit; between grid points read the chart conservatively (the next shorter length).
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern. A chart is a screening aid: the member's own calc is the record.*

# %% tags=["parameters"]
sizes = "Pipe 1 Std, Pipe 1-1/4 Std, Pipe 1-1/2 Std, Pipe 2 Std, Pipe 2-1/2 Std"  # pipe sizes, one curve each (catalog designations, comma-separated)
N = "100 lbf"  # axial compression in the leg, service level (ASD); 0 lbf to 20 kip
P_min = "50 lbf"  # smallest lateral load on the chart; > 0 lbf
P_max = "400 lbf"  # largest lateral load on the chart; > 0 lbf
L_min = "12 in"  # shortest leg on the chart; 6 in to 30 ft
L_max = "96 in"  # longest leg on the chart; 6 in to 30 ft
F_y = "35 ksi"  # specified minimum yield stress of the pipe (ASTM A53 Gr B: 35 ksi)
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad.runner.sweep import design_chart, steps, sweep
from calcpad.runner.template import find_template, load_template

legs = load_template(find_template("leg_bending"))
chart = sweep(
    legs,
    {"N": N, "F_y": F_y, "FS_req": FS_req},
    {"leg": [s.strip() for s in sizes.split(",")], "P": steps(P_min, P_max, 15), "L": steps(L_min, L_max, 43)},
    envelope="L",
)
print(f"{chart.cases} grid points, {chart.passed} with every check OK")

# %%
design_chart(chart, x="P", curves="leg", title=f"Longest leg with every check OK (N = {N}, F_y = {F_y}, FS = {FS_req})")

# %%
longest = chart.envelope.pivot(index="P", columns="leg", values="max L [in]").reindex(index=chart.axes["P"], columns=chart.axes["leg"])
longest.round(1)

# %% [markdown]
# ## A chart reading checked by the full calc
#
# The longest leg the chart gives for the middle size and the middle load, run through the
# leg-bending template the ordinary way: every check passes (at the grid's next length up, one
# does not).

# %%
from calcpad.runner.build import SheetBuilder
from calcpad.widgets import show, show_summary

size, load = chart.axes["leg"][len(chart.axes["leg"]) // 2], chart.axes["P"][len(chart.axes["P"]) // 2]
L_chart = float(chart.envelope[(chart.envelope["leg"] == size) & (chart.envelope["P"] == load)]["max L [in]"].iloc[0])
values = {name: p.default for name, p in legs.parameters.items()}
values.update({"leg": size, "P": load, "L": f"{L_chart:g} in", "N": N, "F_y": F_y, "FS_req": FS_req, "calc_title": "Design chart reading"})
(reading,) = SheetBuilder(legs).sheets(values)
view = show(reading)

# %%
show_summary(reading)
