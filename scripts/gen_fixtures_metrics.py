#!/usr/bin/env python3
"""Reference values for Lampwright's light-source metrics, from colour-science.

Writes two files into crates/color/tests/fixtures/:

- metrics_spectra_colour047.csv: every spectrum tested, at 1 nm over 360-830 nm
  (Lampwright's grid), so that the Rust tests evaluate exactly the same data.
    * the CIE tables (F1-F12, FL3.1-FL3.15, HP1-HP5, LED series) interpolated
      from 5 nm with colour-science's Sprague interpolator and end values
      repeated outside 380-780 nm (the same convention as Lampwright's resampler);
    * CIE illuminant A from its formula, and D50/D55/D65/D75 at 360-830 nm;
    * invented synthetic lamps (marked 'synthetic'): RGB LED mixes of
      Gaussians, phosphor-converted LEDs, narrow-line (spiky) sources and
      filtered tungsten. They are not measurements of any product.
- metrics_colour047.json: colour-science's figures for each spectrum.

Conventions (see docs/methods.md):
- xy, uv and CCT tables: 1931 2-degree observer summed at 1 nm over 360-830 nm
  (colour-science's default stops at 780 nm; the full CMFs are passed here).
- CCT/Duv: uv_to_CCT_Ohno2013 (no 0.99991 factor, 0.1 % table) and
  uv_to_CCT_Robertson1968 (31-line table).
- CRI: colour_rendering_index, which reshapes everything to 360-780 nm and takes
  the CCT by Robertson; Lampwright sums 360-830 nm and uses Ohno.
- TM-30: colour_fidelity_index_ANSIIESTM3018 (380-780 nm, as CIE 224 and
  Lampwright do); its CCT table stops at 780 nm.
- SSI: spectral_similarity_index(round_result=False) against the default
  reference (Planckian below 4000 K, CIE daylight at and above) at the CCT found
  here.

Re-run with:  python3 -m venv .venv && .venv/bin/pip install colour-science==0.4.7 scipy==1.14.1
              .venv/bin/python scripts/gen_fixtures_metrics.py
"""

import json
import os
import warnings

import colour
import numpy as np
from colour import SpectralDistribution, SpectralShape
from colour.quality import (
    colour_fidelity_index_ANSIIESTM3018,
    colour_rendering_index,
    spectral_similarity_index,
)
from colour.temperature import (
    CCT_to_xy_CIE_D,
    uv_to_CCT_Ohno2013,
    uv_to_CCT_Robertson1968,
)

PINNED = "0.4.7"
assert colour.__version__ == PINNED, f"expected colour-science {PINNED}, got {colour.__version__}"
warnings.filterwarnings("ignore")

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "crates", "color", "tests", "fixtures")
os.makedirs(OUT, exist_ok=True)

GRID = SpectralShape(360, 830, 1)
WL = GRID.wavelengths
CMFS = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"]
assert CMFS.shape == GRID


def on_grid(sd):
    """Sprague to 1 nm (uniform data), end values repeated, over 360-830 nm."""
    sd = sd.copy()
    sd.interpolator = colour.SpragueInterpolator
    sd.extrapolator = colour.Extrapolator
    sd.extrapolator_kwargs = {"method": "Constant", "left": None, "right": None}
    return sd.align(GRID).values.copy()


def gauss(centre, fwhm):
    s = fwhm / 2.3548200450309493
    return np.exp(-0.5 * ((WL - centre) / s) ** 2)


def planck(t):
    return colour.sd_blackbody(t, GRID).values


spectra = {}
for k in [f"FL{i}" for i in range(1, 13)]:
    spectra["F" + k[2:]] = on_grid(colour.SDS_ILLUMINANTS[k])
for k in [f"FL3.{i}" for i in range(1, 16)] + [f"HP{i}" for i in range(1, 6)] + [
    "LED-B1", "LED-B2", "LED-B3", "LED-B4", "LED-B5", "LED-BH1", "LED-RGB1", "LED-V1", "LED-V2"
]:
    spectra[k] = on_grid(colour.SDS_ILLUMINANTS[k])
spectra["A"] = colour.sd_CIE_standard_illuminant_A(GRID).values
for name, t in [("D50", 5000), ("D55", 5500), ("D65", 6500), ("D75", 7500)]:
    # CIE D series from the basis at the nominal CCT scaled to today's c2.
    xy = CCT_to_xy_CIE_D(t * 1.4388 / 1.4380)
    spectra[name] = colour.sd_CIE_illuminant_D_series(xy).copy().align(GRID).values.copy()

# Invented synthetic lamps (not measurements of any product).
for i, (b, g, r, wb, wg, wr) in enumerate([
    (1.0, 1.1, 1.0, 20, 30, 18),
    (0.8, 1.0, 1.2, 22, 35, 20),
    (1.2, 1.0, 0.7, 18, 28, 16),
]):
    spectra[f"synthetic RGB LED {i + 1}"] = b * gauss(455, wb) + g * gauss(530, wg) + r * gauss(625, wr)
spectra["synthetic RGBA LED"] = gauss(455, 20) + 1.1 * gauss(530, 32) + 0.7 * gauss(595, 18) + 0.9 * gauss(630, 18)
for i, (blue, p1, p2, c1, c2) in enumerate([
    (0.9, 1.0, 0.0, 560, 0),
    (0.6, 1.0, 0.6, 545, 625),
    (0.35, 0.8, 1.0, 550, 630),
    (0.25, 0.6, 1.0, 555, 640),
    (0.5, 1.0, 0.4, 540, 610),
]):
    s = blue * gauss(450, 20) + p1 * gauss(c1, 110)
    if p2:
        s = s + p2 * gauss(c2, 90)
    spectra[f"synthetic phosphor LED {i + 1}"] = s
spectra["synthetic violet-pumped LED"] = 0.5 * gauss(410, 15) + 0.3 * gauss(460, 30) + gauss(560, 100) + 0.8 * gauss(630, 80)
for i, lines in enumerate([
    [(436, 1.0), (546, 1.5), (578, 0.6), (611, 2.0)],
    [(450, 0.8), (490, 0.4), (545, 1.8), (588, 0.6), (612, 2.2), (660, 0.3)],
]):
    s = 0.02 * np.ones_like(WL)
    for c, a in lines:
        s = s + a * gauss(c, 3)
    spectra[f"synthetic narrow-line {i + 1}"] = s
def logistic(x0, w):
    return 1 / (1 + np.exp(-(WL - x0) / w))
spectra["synthetic tungsten + blue filter"] = planck(3200) * (0.25 + 0.75 * (1 - logistic(520, 35)))
spectra["synthetic tungsten + amber filter"] = planck(4500) * (0.3 + 0.7 * logistic(500, 30))
spectra["synthetic tungsten + green filter"] = planck(3000) * (0.55 + 0.45 * gauss(540, 120))
spectra["synthetic tungsten 2000 K"] = planck(2000)
spectra["synthetic daylight + magenta filter"] = (
    colour.sd_CIE_illuminant_D_series(CCT_to_xy_CIE_D(5600)).copy().align(GRID).values * (1 - 0.35 * gauss(540, 80))
)
spectra["synthetic green line only"] = 0.001 + gauss(530, 10)  # far off the locus: no CCT

for k, v in spectra.items():
    assert v.shape == (471,), k
    assert np.all(np.isfinite(v)), k


def uv_of(s):
    xyz = CMFS.values.T @ s
    return colour.UCS_to_uv(colour.XYZ_to_UCS(xyz)), colour.XYZ_to_xy(xyz), xyz


def default_ssi_reference(cct):
    if cct < 4000:
        return colour.sd_blackbody(cct, GRID)
    return colour.sd_CIE_illuminant_D_series(CCT_to_xy_CIE_D(cct)).copy().align(GRID)


records = []
for name, s in spectra.items():
    uv, xy, xyz = uv_of(s)
    cct_o, duv_o = uv_to_CCT_Ohno2013(uv, cmfs=CMFS)
    cct_r, duv_r = uv_to_CCT_Robertson1968(uv)
    rec = {
        "name": name,
        "xy": [float(xy[0]), float(xy[1])],
        "uv": [float(uv[0]), float(uv[1])],
        "cct_ohno_k": float(cct_o),
        "duv_ohno": float(duv_o),
        "cct_robertson_k": float(cct_r),
        "duv_robertson": float(duv_r),
        "has_cct": bool(1000 <= cct_o <= 20000 and abs(duv_o) <= 0.05),
    }
    if rec["has_cct"]:
        # colour-science trims its input in place in the TM-30 code path, so every
        # call gets a fresh SpectralDistribution.
        cri = colour_rendering_index(SpectralDistribution(s, WL, name=name), additional_data=True)
        rec["ra"] = float(cri.Q_a)
        rec["r"] = [float(cri.Q_as[i].Q_a) for i in range(1, 15)]
        tm = colour_fidelity_index_ANSIIESTM3018(SpectralDistribution(s, WL, name=name), additional_data=True)
        rec["rf"] = float(tm.R_f)
        rec["rg"] = float(tm.R_g)
        rec["rf_hj"] = [float(v) for v in tm.R_fs]
        rec["rcs_hj"] = [float(v) for v in tm.R_cs]
        rec["rhs_hj"] = [float(v) for v in tm.R_hs]
        rec["rf_cces"] = [float(v) for v in tm.R_s]
        rec["tm30_cct_k"] = float(tm.CCT)
        rec["tm30_bins"] = [int(v) for v in tm.bins]
        ref = default_ssi_reference(cct_o)
        rec["ssi_unrounded"] = float(
            spectral_similarity_index(SpectralDistribution(s, WL, name=name), ref, round_result=False)
        )
    records.append(rec)

with open(os.path.join(OUT, "metrics_spectra_colour047.csv"), "w", encoding="utf-8", newline="\n") as f:
    f.write("# Spectra for the light-source metric fixtures, 360-830 nm at 1 nm.\n")
    f.write("# CIE tables (CIE 15:2018) interpolated with colour-science 0.4.7 (Sprague, end values repeated);\n")
    f.write("# columns named 'synthetic ...' are invented test lamps, not measurements of any product.\n")
    f.write(f"# Generated by scripts/gen_fixtures_metrics.py with colour-science {PINNED}; do not edit by hand.\n")
    f.write(",".join(["wavelength_nm"] + [n.replace(",", " ") for n in spectra]) + "\n")
    for i, w in enumerate(WL):
        f.write(",".join([f"{w:g}"] + [f"{spectra[n][i]:.9g}" for n in spectra]) + "\n")

with open(os.path.join(OUT, "metrics_colour047.json"), "w", encoding="utf-8", newline="\n") as f:
    json.dump(
        {
            "generator": "scripts/gen_fixtures_metrics.py",
            "colour_science": PINNED,
            "source": "colour-science 0.4.7: uv_to_CCT_Ohno2013, uv_to_CCT_Robertson1968, colour_rendering_index, "
            "colour_fidelity_index_ANSIIESTM3018, spectral_similarity_index; spectra in metrics_spectra_colour047.csv",
            "records": records,
        },
        f,
        indent=1,
    )
    f.write("\n")
print(f"wrote {len(records)} records")
