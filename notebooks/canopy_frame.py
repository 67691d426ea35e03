# %% [markdown]
# # Knee-braced canopy frame: one frame model for the posts, the beam and the knee braces
#
# A canopy frame line: two posts on base plates, a beam between their tops and a knee brace
# from each post to the beam. One 2D frame model (direct stiffness) carries the dead, live and
# wind loads for every ASCE 7-16 combination of the design method, so the brace forces enter the
# posts and the beam they frame into. The template checks the posts and the beam to AISC 360-16
# (compression, flexure, shear, H1, with B2 of Appendix 8 from the frame's story stiffness), the
# beam's deflection and the frame's sway, compares the knee-brace forces with the force the brace
# calc checks (the single-angle brace and its welds are a calc of their own), and checks the post
# base: base plate (J8, AISC Design Guide 1), the anchor rods under uplift with moment and the
# anchorage to the pier (ACI 318-19 Chapter 17).
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
method = "ASD"  # design method, ASD (service load combinations) or LRFD (factored loads); ASD or LRFD
post = "HSS4x4x1/4"  # post section, catalog designation (square/rectangular/round HSS, pipe or W-shape)
post_grade = "A500 Gr C"  # post steel, materials catalog name (A500: round/shaped picked from the post)
beam = "W8x18"  # beam section, catalog designation
beam_grade = "A992"  # beam steel, materials catalog name
brace = "L2x2x1/4"  # knee brace section, catalog designation (checked in its own calc)
post_marks = "P-L, P-R"  # marks of the left and right posts, as on the drawings
beam_mark = "BM"  # mark of the beam
brace_marks = "KB-L, KB-R"  # marks of the left and right knee braces
H = "10 ft"  # post height, base plate to the beam centreline; 6 ft to 30 ft
span = "12 ft"  # beam span between post centrelines; 4 ft to 40 ft
kb_v = "2 ft"  # knee brace: from the beam down the post to the brace work point; 6 in to H/2
kb_h = "2.5 ft"  # knee brace: from the post along the beam to the brace work point; 6 in to span/3
beam_to_post = "pinned"  # beam-to-post connection: pinned (shear tab; the knee braces give the frame action) or moment; pinned or moment
w_D = "120 lbf/ft"  # dead load on the beam (roof panels and self-weight); 0 to 3 kip/ft
P_Dtop = "1.0 kip"  # dead load at each post top (roof framing of the next bay); 0 to 50 kip
P_L = "0.8 kip"  # live load at midspan (service load); 0 to 30 kip
P_Ltop = "0.4 kip"  # live load at each post top; 0 to 30 kip
H_W = "0.6 kip"  # wind: lateral force at the windward post top (nominal W, ASCE 7-16 Ch. 27 or 29); 0 to 20 kip
w_Wup = "60 lbf/ft"  # wind: uplift on the beam (nominal W, acting with H_W); 0 to 2 kip/ft
K_post = "2.1"  # effective length factor of the posts (out of plane fixed-free: 2.1); 0.5 to 2.5
L_b = "6 ft"  # unbraced length of the beam's compression flange; > 0, at most span
C_b = "1.0"  # lateral-torsional buckling modification factor of the beam; 1.0 (conservative) to 3.0
defl_limit = "240"  # beam deflection limit under D + L as span / N; 120 to 600
brace_force = "1.9 kip"  # force the knee brace calc checks, in compression and in tension (combined for the method); > 0
plate_B = "10 in"  # post base plate width; 4 in to 36 in
plate_N = "10 in"  # post base plate length (in the frame's plane); 4 in to 36 in
plate_t = "3/4 in"  # base plate thickness; 1/4 in to 3 in
plate_grade = "A36"  # base plate steel, materials catalog name
f_c = "3000 psi"  # concrete compressive strength f'c of the piers; 2500 psi to 8000 psi
rod_d = "3/4 in"  # anchor rod diameter (four cast-in F1554 Gr 36 rods, square pattern); 1/2 in to 2 in
rod_f = "3.75 in"  # plate centre to each rod line (square pattern 2f x 2f); 1 in to 18 in
anchor_h_ef = "12 in"  # anchor rod embedment h_ef (heavy hex nut); 4 in to 25 in
pier_edge = "6 in"  # anchor rods to each face of the pier; 2 in to 48 in
pier_depth = "36 in"  # depth of the concrete pier below the plate; 8 in to 120 in
anchor_load_factor = "1.6"  # ASD only: combined service loads to strength level for ACI 318 (1.6 common practice); 1.0 to 2.0
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from IPython.display import Image, display

from calcpad import Q_, Sheet, calc_heading
from calcpad.core.errors import InputError
from calcpad.core.units import parse_quantity
from calcpad.eng.analysis.frame import Frame, add_frame_results
from calcpad.eng.analysis.serviceability import add_deflection_check, add_result_given
from calcpad.eng.checks import (add_anchorage_check, add_base_plate_check, add_leg_base_uplift_check, add_second_order,
                                check_frame_member, frame_member_forces)
from calcpad.eng.loads.combinations import basic_combinations
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import get_section


def marks(text, n, field):
    """The job's marks, in order (``"C1, C2"``)."""
    out = [m.strip() for m in str(text).split(",") if m.strip()]
    if len(out) != n:
        raise InputError(f"{field}: got {text!r}; expected {n} marks separated by commas")
    return out


post_l, post_r = marks(post_marks, 2, "post_marks")
(beam_m,) = marks(beam_mark, 1, "beam_mark")
kb_l, kb_r = marks(brace_marks, 2, "brace_marks")
post_shape, beam_shape, brace_shape = get_section(post), get_section(beam), get_section(brace)


def steel_of(grade, shape):
    return hss_material(grade, shape) if "A500" in grade.upper() else get_material(grade)


post_steel, beam_steel = steel_of(post_grade, post_shape), steel_of(beam_grade, beam_shape)
pinned = beam_to_post.strip().lower().startswith("pinned")

sh = Sheet(calc_heading("Knee-braced canopy frame: analysis, posts and beam", calc_title, member_mark), method=method,
           meta={"member": member_mark})
sh.assume(f"One frame line: posts {post_l} and {post_r} fixed at their base plates, beam {beam_m} "
          f"{'pinned to the post tops (shear connections)' if pinned else 'moment-connected to the post tops'}, knee braces "
          f"{kb_l} and {kb_r} pinned at both ends (axial members); first-order elastic analysis, B2 of AISC 360-16 Appendix 8 "
          "for second-order effects.")
sh.assume("Wind: a lateral force at the windward post top with uplift on the beam, both reversed together (-W); dead and "
          "live loads as stated. Posts checked with K for a fixed-free post out of the frame's plane (conservative in plane).")
sh.heading("Geometry and loads")
sh.given("H", H, "Post height, base plate to beam centreline")
sh.given("L_s", span, "Beam span between post centrelines")
sh.given("a_v", kb_v, "Knee brace: beam to brace point on the post")
sh.given("a_h", kb_h, "Knee brace: post to brace point on the beam")
sh.step("L_kb", "sqrt(a_v**2 + a_h**2)", "Knee brace length between work points", unit="ft", ref="geometry")
sh.given("w_D", w_D, "Dead load on the beam")
sh.given("P_Dt", P_Dtop, "Dead load at each post top")
sh.given("P_L", P_L, "Live load at midspan")
sh.given("P_Lt", P_Ltop, "Live load at each post top")
sh.given("H_W", H_W, "Wind: lateral force at the windward post top (nominal)")
sh.given("w_Wu", w_Wup, "Wind: uplift on the beam (nominal)")
if not (0 < sh["a_v"].to("in").magnitude < sh["H"].to("in").magnitude and 0 < 2 * sh["a_h"].to("in").magnitude
        < sh["L_s"].to("in").magnitude):
    raise InputError("kb_v / kb_h: the knee brace points must lie on the post below its top and on the beam short of midspan")

# %% [markdown]
# The frame model: nodes at the bases, the brace points, the post tops and midspan; the beam in
# four pieces. Load cases D, L, W and Hs (1 kip of story shear for the story stiffness of B2).

# %%
E_s = Q_(29000.0, "ksi")
h_in, s_in = sh["H"].to("in").magnitude, sh["L_s"].to("in").magnitude
av, ah = sh["a_v"].to("in").magnitude, sh["a_h"].to("in").magnitude
props = {"post": {"E": E_s, "A": Q_(post_shape.props.A, "in^2"), "I": Q_(post_shape.props.Ix, "in^4")},
         "beam": {"E": E_s, "A": Q_(beam_shape.props.A, "in^2"), "I": Q_(beam_shape.props.Ix, "in^4")},
         "brace": {"E": E_s, "A": Q_(brace_shape.props.A, "in^2"), "I": Q_(brace_shape.props.Ix, "in^4")}}
fr = Frame("lbf", "in")
for n, x, y in (("A", 0, 0), ("P1", 0, h_in - av), ("T1", 0, h_in), ("Q1", ah, h_in), ("M", s_in / 2, h_in),
                ("Q2", s_in - ah, h_in), ("T2", s_in, h_in), ("P2", s_in, h_in - av), ("B", s_in, 0)):
    fr.node(n, x, y)
posts = {post_l: [f"{post_l} lower", f"{post_l} upper"], post_r: [f"{post_r} lower", f"{post_r} upper"]}
fr.member(posts[post_l][0], "A", "P1", **props["post"])
fr.member(posts[post_l][1], "P1", "T1", **props["post"])
fr.member(posts[post_r][0], "B", "P2", **props["post"])
fr.member(posts[post_r][1], "P2", "T2", **props["post"])
beam_parts = [f"{beam_m} {p}" for p in ("end L", "mid L", "mid R", "end R")]
for part, (n1, n2) in zip(beam_parts, (("T1", "Q1"), ("Q1", "M"), ("M", "Q2"), ("Q2", "T2")), strict=True):
    fr.member(part, n1, n2, **props["beam"], release_start=pinned and n1 == "T1", release_end=pinned and n2 == "T2")
fr.member(kb_l, "P1", "Q1", **props["brace"], release_start=True, release_end=True)
fr.member(kb_r, "P2", "Q2", **props["brace"], release_start=True, release_end=True)
fr.support("A", "fixed")
fr.support("B", "fixed")
for part in beam_parts:
    fr.member_load("D", part, -sh["w_D"])
    fr.member_load("W", part, sh["w_Wu"])
for node in ("T1", "T2"):
    fr.node_load("D", node, Fy=-sh["P_Dt"])
    fr.node_load("L", node, Fy=-sh["P_Lt"])
    fr.node_load("Hs", node, Fx=Q_(0.5, "kip"))
fr.node_load("L", "M", Fy=-sh["P_L"])
fr.node_load("W", "T1", Fx=sh["H_W"])
combos = basic_combinations(method, ["D", "L", "W"])
names = [c.name for c in combos]
for c in combos:
    fr.combination(c.name, c.factors)
res = fr.solve()

sh.heading(f"Frame analysis ({method} combinations of ASCE 7-16 Sec. {'2.4.1' if method == 'ASD' else '2.3.1'})")
sh.note("Combinations: " + "; ".join(f"{c.name} = {c.label()} ({c.ref})" for c in combos))
M_gov, case_gov, _ = max((res.envelope(m, "M", cases=names) for m in posts[post_l] + posts[post_r]), key=lambda t: abs(t[0]))
shown = [case_gov]
sh.note(f"Reaction and member-force tables for {case_gov}, the combination governing the posts; every combination is "
        "checked below (tables of the governing ratio per combination).")
add_frame_results(sh, res, shown, figure_case=case_gov, members=posts[post_l] + posts[post_r] + beam_parts + [kb_l, kb_r])

sh.heading("Second-order effects: story stiffness of the frame")
sh.given("E_s", E_s, "Modulus of elasticity", source="AISC 360-16 B3 (common practice)")
P_story = max(sum(res.reaction(n, c)[1].to("lbf").magnitude for n in ("A", "B")) for c in names)
add_result_given(sh, "P_st", Q_(max(P_story, 0.0), "lbf"), "Largest total gravity load on the frame", "frame analysis, reactions")
add_result_given(sh, "Delta_Hs", abs(res.displacement("T1", "Hs")[0]), "Post-top drift under 1 kip of story shear", "frame analysis, Hs")
sh.given("H_s", "1 kip", "Story shear of the stiffness case")
sh.step("HL_D", "H_s*H/Delta_Hs", "Story stiffness term H L/Δ_H", unit="kip", ref="AISC 360-16 Eq. A-8-7")
add_second_order(sh, post_shape, P_nt="P_st", L="H", sway="given", HL_Delta="HL_D", P_story="P_st", E="E_s", suffix="st")

sh.heading(f"Posts {post_l}, {post_r} (AISC 360-16, forces from the frame with B2)")
check_frame_member(sh, res, posts[post_l] + posts[post_r], post_shape, L="H", K=float(K_post), cases=names, B2="B_2_st",
                   material=post_steel, suffix="post")
sh.heading(f"Beam {beam_m} (AISC 360-16, forces from the frame with B2)")
check_frame_member(sh, res, beam_parts, beam_shape, L="L_s", L_b=L_b, C_b=float(C_b), cases=names, B2="B_2_st",
                   material=beam_steel, suffix="beam")

sh.heading(f"Knee braces {kb_l}, {kb_r}: forces for the brace calc")
brace_rows = [(frame_member_forces(res, m, c).P, m, c) for m in (kb_l, kb_r) for c in names]
Pc, mc, cc = max(brace_rows, key=lambda r: r[0].to("lbf").magnitude)
Pt, mt, ct = min(brace_rows, key=lambda r: r[0].to("lbf").magnitude)
add_result_given(sh, "P_kbc", Q_(max(Pc.to("lbf").magnitude, 0.0), "lbf"), f"Largest brace compression ({mc})", f"frame analysis, {cc}")
add_result_given(sh, "P_kbt", Q_(max(-Pt.to("lbf").magnitude, 0.0), "lbf"), f"Largest brace tension ({mt})", f"frame analysis, {ct}")
sh.step("P_kbc2", "B_2_st*P_kbc", "Brace compression, second order", unit="kip", ref="AISC 360-16 Eq. A-8-2")
sh.step("P_kbt2", "B_2_st*P_kbt", "Brace tension, second order", unit="kip", ref="AISC 360-16 Eq. A-8-2")
sh.given("P_kbd", brace_force, "Force the knee brace calc checks (compression and tension)", source="job: knee brace calc")
sh.check("Knee brace compression within the brace calc's force", demand="P_kbc2", capacity="P_kbd", ref="frame analysis")
sh.check("Knee brace tension within the brace calc's force", demand="P_kbt2", capacity="P_kbd", ref="frame analysis")
sh.note(f"The knee braces ({brace}) and their end welds are checked in their own calc for the force stated above; these two "
        "checks keep that force at or above what the frame gives them.")

sh.heading("Serviceability")
sh.note("Deflection and sway under the service loads D + L and D ± 0.6W (ASCE 7-16 Commentary to Appendix C), by "
        "superposing the frame's load cases.")


def service_v(node, factors, k):
    """Displacement component k of node under the service load sum of the given case factors."""
    return sum(f * res.displacement(node, case)[k] for case, f in factors.items())


DL = {"D": 1.0, "L": 1.0}
add_result_given(sh, "Delta_b", abs(service_v("M", DL, 1) - (service_v("T1", DL, 1) + service_v("T2", DL, 1)) / 2),
                 "Beam midspan deflection relative to the post tops, D + L", "frame analysis")
add_deflection_check(sh, "Delta_b", "L_s", f"L/{float(defl_limit):g}", title="Beam deflection under D + L", suffix="b")
sway = max(abs(service_v("T1", {"D": 1.0, "W": w}, 0)) for w in (0.6, -0.6))
add_result_given(sh, "Delta_s", sway, "Post-top sway under D + 0.6W", "frame analysis")
add_deflection_check(sh, "Delta_s", "H", "H/100", title="Frame sway H/100 (common practice for a canopy)", suffix="s")
sh

# %% [markdown]
# ## Post base: base plate, anchor rods and anchorage to the pier
#
# The base reactions of the post whose base moment governs, amplified by B2, go to the base plate
# (bearing and thickness by AISC Design Guide 1); the case with the largest rod tension (uplift
# with moment, four rods) is checked too, and the larger rod tension goes to the anchorage.

# %%
base_rows = []  # (|M|, case, node, post, P compression +, V)
for node, p in (("A", post_l), ("B", post_r)):
    for c in names:
        Rx, Ry, Mz = res.reaction(node, c)
        base_rows.append((abs(Mz.to("lbf*in").magnitude), c, node, p, Ry.to("lbf").magnitude, abs(Rx.to("lbf").magnitude)))
f_in = parse_quantity(rod_f, "rod_f").to("in").magnitude
M_row = max(base_rows, key=lambda r: r[0])
T_row = max(base_rows, key=lambda r: -r[4] / 4 + r[0] / (4 * f_in))
bp = Sheet(calc_heading("Knee-braced canopy frame: post base", calc_title, member_mark, "post base"), method=method,
           meta={"member": member_mark})
bp.assume("Four cast-in headed anchor rods in a square pattern in a concrete pier; the post is fixed at its base plate "
          "(as in the frame model).")
bp.assume("Base reactions from the frame analysis, the moment amplified by B2 of the frame (sway moment, AISC 360-16 "
          "Appendix 8); a net uplift is taken as zero bearing force for the base plate (the rods carry it, checked below).")
bp.given("B_2", sh["B_2_st"].to("").magnitude, "Sway amplifier of the frame", source="frame sheet, AISC 360-16 App. 8", sig=4)
src = f"frame analysis, {M_row[1]}, base of {M_row[3]}"
add_result_given(bp, "M_1", Q_(M_row[0], "lbf*in"), f"Base moment, post {M_row[3]}", src)
add_result_given(bp, "P_1", Q_(max(M_row[4], 0.0), "lbf"), f"Axial compression at the base, post {M_row[3]} (uplift as 0)", src)
add_result_given(bp, "V_1", Q_(M_row[5], "lbf"), f"Base shear, post {M_row[3]}", src)
bp.step("M_2", "B_2*M_1", "Base moment, second order", unit="kip*in", ref="AISC 360-16 Eq. A-8-1")
add_base_plate_check(bp, post_shape, P="P_1", M="M_2", B=plate_B, N=plate_N, t_p=plate_t, f_c=f_c, f=rod_f, d_rod=rod_d,
                     material=plate_grade, suffix="plate")
src = f"frame analysis, {T_row[1]}, base of {T_row[3]}"
bp.heading("Anchor rods under uplift with moment")
add_result_given(bp, "N_u", Q_(-T_row[4], "lbf"), f"Axial tension at the base, post {T_row[3]} (uplift +)", src)
add_result_given(bp, "M_u", Q_(T_row[0], "lbf*in"), f"Base moment, post {T_row[3]}", src)
add_result_given(bp, "V_u", Q_(T_row[5], "lbf"), f"Base shear, post {T_row[3]}", src)
bp.step("M_u2", "B_2*M_u", "Base moment, second order", unit="kip*in", ref="AISC 360-16 Eq. A-8-1")
bp.given("M_0", "0 lbf*in", "Moment about the other plate axis (plane frame)")
d_leg = f"{max(post_shape.width, post_shape.depth):.4f} in"
add_leg_base_uplift_check(bp, N_t="N_u", M_x="M_u2", M_y="M_0", f=rod_f, t_p=plate_t, D_leg=d_leg, material=plate_grade,
                          suffix="up")
bp.step("s_rods", "2*f_a_plate", "Anchor rod spacing (square pattern)", unit="in")
bp.step("N_rods", "max(T_a_plate, 2*T_r_up)", "Tension on the tension-side rods: the larger of the two cases", unit="kip",
        ref="AISC Design Guide 1; elastic rod group")
bp.step("V_rods", "max(V_1, V_u)", "Shear at the base, the larger of the two cases", unit="kip")
add_anchorage_check(bp, d_a=rod_d, h_ef=anchor_h_ef, f_c="f_c_plate", c_x1=pier_edge, c_x2=pier_edge, c_y1=pier_edge,
                    c_y2=pier_edge, h_a=pier_depth, N_ua="N_rods", V_ua="V_rods", n_x=2, n_y=2, s_x="s_rods", s_y="s_rods",
                    tension_rows=1, load_factor=None if method == "LRFD" else float(anchor_load_factor), suffix="anchor")
bp

# %% [markdown]
# The frame with its loads and deflected shape, and the bending moments, for the combination that
# governs the posts (the same figures go into the submittal).

# %%
display(*(Image(f.png) for f in sh.evaluate().figures if f.title.startswith(("Frame model", "Bending moment"))))  # as drawn once for the sheet

# %%
sh.summary_frame()
