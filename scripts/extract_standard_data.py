#!/usr/bin/env python3
"""Extract the standard tables Lampwright embeds into assets/standard/.

Every table comes from the Python package colour-science (BSD-3-Clause),
pinned below, which carries the CIE publications' data. Nothing is retyped.
Each CSV starts with '#' lines naming the original standard and the package
version; the first non-comment line is the header.

Re-run with:  python3 -m venv .venv && .venv/bin/pip install colour-science==0.4.7 scipy==1.14.1
              .venv/bin/python scripts/extract_standard_data.py
Brand-named data sets of the package (named cameras, branded charts,
brand-named lamps) are deliberately not extracted.
"""

import os

import colour
import numpy as np
from colour.colorimetry import SDS_BASIS_FUNCTIONS_CIE_ILLUMINANT_D_SERIES as D_BASIS
from colour.quality import SDS_TCS
from colour.quality.cfi2017 import load_TCS_CIE2017

PINNED = "0.4.7"
assert colour.__version__ == PINNED, f"expected colour-science {PINNED}, got {colour.__version__}"

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "assets", "standard")
os.makedirs(OUT, exist_ok=True)


def fmt(v):
    return f"{float(v):.10g}"


def write(name, source_lines, header, wavelengths, columns):
    path = os.path.join(OUT, name)
    with open(path, "w", encoding="utf-8", newline="\n") as f:
        for line in source_lines:
            f.write(f"# {line}\n")
        f.write(f"# Extracted with colour-science {PINNED} by scripts/extract_standard_data.py; do not edit by hand.\n")
        f.write(",".join(header) + "\n")
        for i, wl in enumerate(wavelengths):
            f.write(",".join([fmt(wl)] + [fmt(c[i]) for c in columns]) + "\n")
    print("wrote", path)


def cmfs(key, name, source):
    m = colour.MSDS_CMFS[key]
    write(name, [source, "Columns: wavelength in nm; x_bar, y_bar, z_bar."],
          ["wavelength_nm", "x_bar", "y_bar", "z_bar"], m.wavelengths, [m.values[:, k] for k in range(3)])


cmfs("CIE 1931 2 Degree Standard Observer", "cie1931_2deg_cmfs.csv",
     "CIE 1931 2 degree standard observer colour-matching functions, 360-830 nm at 1 nm (CIE 15:2018 / CIE 018:2019). y_bar is V(lambda).")
cmfs("CIE 1964 10 Degree Standard Observer", "cie1964_10deg_cmfs.csv",
     "CIE 1964 10 degree supplementary standard observer colour-matching functions, 360-830 nm at 1 nm (CIE 15:2018).")

wl = D_BASIS["S0"].wavelengths
write("cie_daylight_basis.csv",
      ["CIE daylight basis functions S0, S1, S2, 300-830 nm at 5 nm (CIE 15:2018, Table 6)."],
      ["wavelength_nm", "S0", "S1", "S2"], wl, [D_BASIS[k].values for k in ("S0", "S1", "S2")])

# Illuminant A and the D-series tables as the package carries them (300-780 nm, 5 nm).
# Lampwright computes A from its defining formula and D from the basis to reach 830 nm;
# these tables are kept to check those computations against the published values.
ad = ["A", "D50", "D55", "D65", "D75"]
write("cie_illuminants_a_d.csv",
      ["CIE standard illuminant A and CIE illuminants D50, D55, D65, D75, relative spectral power, 300-780 nm at 5 nm (CIE 15:2018, Tables 5 and 7 as carried by colour-science; CIE publishes to 830 nm)."],
      ["wavelength_nm"] + ad, colour.SDS_ILLUMINANTS["A"].wavelengths,
      [colour.SDS_ILLUMINANTS[k].values for k in ad])

fl = [f"FL{i}" for i in range(1, 13)] + [f"FL3.{i}" for i in range(1, 16)]
hp = [f"HP{i}" for i in range(1, 6)]
led = ["LED-B1", "LED-B2", "LED-B3", "LED-B4", "LED-B5", "LED-BH1", "LED-RGB1", "LED-V1", "LED-V2"]
w = colour.SDS_ILLUMINANTS["FL1"].wavelengths
for k in fl + hp + led:
    assert np.allclose(colour.SDS_ILLUMINANTS[k].wavelengths, w)
# colour-science keys the F series as FL1..FL12; the CIE names them F1..F12.
names = [k.replace("FL", "F", 1) if k.startswith("FL") and "." not in k else k for k in fl] + hp + led
write("cie_illuminants_f_hp_led.csv",
      ["CIE illuminants F1-F12, FL3.1-FL3.15, HP1-HP5 and the LED series (LED-B1..B5, LED-BH1, LED-RGB1, LED-V1, LED-V2), relative spectral power, 380-780 nm at 5 nm (CIE 15:2018, Tables 10, 11, 12 and 13)."],
      ["wavelength_nm"] + names, w, [colour.SDS_ILLUMINANTS[k].values for k in fl + hp + led])

tcs = SDS_TCS["CIE 1995"]
keys = [f"TCS{i:02d}" for i in range(1, 15)]
write("cie133_tcs.csv",
      ["CIE 13.3-1995 test colour samples TCS01-TCS14, spectral radiance factor, 360-830 nm at 5 nm (CIE 13.3-1995, Table 1 / CIE 15)."],
      ["wavelength_nm"] + keys, tcs[keys[0]].wavelengths, [tcs[k].values for k in keys])

ces = load_TCS_CIE2017(colour.SpectralShape(380, 780, 1))
write("cie224_ces99.csv",
      ["CIE 224:2017 / ANSI/IES TM-30-20 colour evaluation samples CES01-CES99, spectral reflectance factor, 380-780 nm at 1 nm (CIE 224:2017, data file tcs_cfi2017_1_nm as carried by colour-science)."],
      ["wavelength_nm"] + [f"CES{i:02d}" for i in range(1, 100)], ces.wavelengths, [ces.values[:, k] for k in range(99)])
