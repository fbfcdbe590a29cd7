#!/usr/bin/env python3
"""Time colour-science 0.4.7 on the lamp-metric computations Lampwright benchmarks.

Same spectra as crates/color/benches/metrics.rs (columns A, F2, LED-B3, D65 of
crates/color/tests/fixtures/metrics_spectra_colour047.csv, 1 nm, 360-830 nm).
For each spectrum:
- "cct": XYZ (1931 2-degree, 1 nm 360-830 nm) -> uv -> uv_to_CCT_Ohno2013;
- "report": xy, uv, u'v', CCT/Duv, colour_rendering_index (Ra, Ri),
  colour_fidelity_index_ANSIIESTM3018 (Rf, Rg, bins), spectral_similarity_index
  against the default reference, luminous efficacy.
Prints JSON with the median seconds per call (caches of colour-science warm).

Run through scripts/bench_vs_colour_science.sh (which makes the venv).
"""

import json
import os
import statistics
import sys
import time
import warnings

import colour
import numpy as np
from colour import SpectralDistribution, SpectralShape
from colour.quality import colour_fidelity_index_ANSIIESTM3018, colour_rendering_index, spectral_similarity_index
from colour.temperature import CCT_to_xy_CIE_D, uv_to_CCT_Ohno2013

assert colour.__version__ == "0.4.7", colour.__version__
warnings.filterwarnings("ignore")

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
CSV = os.path.join(ROOT, "crates", "color", "tests", "fixtures", "metrics_spectra_colour047.csv")
NAMES = ["A", "F2", "LED-B3", "D65"]
GRID = SpectralShape(360, 830, 1)
WL = GRID.wavelengths
CMFS = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"]


def load():
    rows = [l for l in open(CSV, encoding="utf-8").read().splitlines() if not l.startswith("#")]
    header = rows[0].split(",")
    data = np.array([[float(c) for c in r.split(",")] for r in rows[1:]])
    return {n: data[:, header.index(n)] for n in NAMES}


def cct(values):
    xyz = CMFS.values.T @ values
    uv = colour.UCS_to_uv(colour.XYZ_to_UCS(xyz))
    return uv_to_CCT_Ohno2013(uv, cmfs=CMFS)


def report(values):
    xyz = CMFS.values.T @ values
    xy = colour.XYZ_to_xy(xyz)
    uv = colour.UCS_to_uv(colour.XYZ_to_UCS(xyz))
    upvp = colour.Luv_to_uv(colour.XYZ_to_Luv(xyz))
    t, duv = uv_to_CCT_Ohno2013(uv, cmfs=CMFS)
    ra = colour_rendering_index(SpectralDistribution(values, WL), additional_data=True)
    tm = colour_fidelity_index_ANSIIESTM3018(SpectralDistribution(values, WL), additional_data=True)
    if t < 4000:
        ref = colour.sd_blackbody(t, GRID)
    else:
        ref = colour.sd_CIE_illuminant_D_series(CCT_to_xy_CIE_D(t)).copy().align(GRID)
    ssi = spectral_similarity_index(SpectralDistribution(values, WL), ref)
    ler = colour.luminous_efficacy(SpectralDistribution(values, WL))
    return xy, upvp, duv, ra.Q_a, tm.R_g, ssi, ler


def median_seconds(fn, arg, min_total=2.0, min_runs=20):
    fn(arg)  # warm caches
    times = []
    start = time.perf_counter()
    while len(times) < min_runs or time.perf_counter() - start < min_total:
        t0 = time.perf_counter()
        fn(arg)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


spectra = load()
out = {"colour_science": colour.__version__, "numpy": np.__version__, "python": sys.version.split()[0], "median_s": {}}
for name, values in spectra.items():
    out["median_s"][f"cct/{name}"] = median_seconds(cct, values)
    out["median_s"][f"report/{name}"] = median_seconds(report, values, min_total=4.0)
json.dump(out, sys.stdout, indent=1)
print()
