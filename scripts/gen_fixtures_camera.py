#!/usr/bin/env python3
"""Write crates/camera/tests/fixtures/camera_fits_colour047.json.

Reference values for the camera crate's colour-correction fits, computed
independently of Lampwright's Rust code from the same committed assets:

- assets/demo/cameras.csv (invented demo cameras, 360-830 nm at 1 nm),
- assets/standard/cie1931_2deg_cmfs.csv (CIE 1931 2 degree CMFs, 1 nm),
- assets/standard/cie224_ces99.csv (CES01-CES99, 380-780 nm at 1 nm),
- assets/standard/cie133_tcs.csv (TCS01-TCS14, 360-830 nm at 5 nm),
- assets/standard/cie_illuminants_f_hp_led.csv (F2, 380-780 nm at 5 nm),
- CIE illuminant A from its defining formula (colour-science's sd_CIE_standard_illuminant_A).

Every spectrum is brought to Lampwright's grid, 360-830 nm at 1 nm, the way
Lampwright does it: 5 nm data by Sprague interpolation (CIE 167:2005,
colour-science's SpragueInterpolator), end values repeated outside the
measured range. Sums are plain sums at 1 nm (no 5 nm shortcut, no 780 nm cut).

For each camera and light: raw RGB = sum(light * reflectance * sensitivity),
scaled so the perfect white has G = 1; XYZ = sum(light * reflectance * cmf),
scaled so the perfect white has Y = 1. Then
- the plain least-squares 3x3 matrix by numpy.linalg.lstsq,
- the white-preserving matrix by the closed form of the constrained problem
  M = M_ls + (x_w - M_ls w) (G^-1 w)^T / (w^T G^-1 w), G = A^T A
  (a different route from Lampwright's KKT solve),
- the degree-2 root-polynomial 3x6 matrix by numpy.linalg.lstsq,
- CIEDE2000 of each sample for the plain matrix, CIELAB against the light's
  own white (colour.XYZ_to_Lab, colour.delta_E with method "CIE 2000").

Re-run with:  python3 -m venv .venv && .venv/bin/pip install colour-science==0.4.7 scipy==1.14.1
              .venv/bin/python scripts/gen_fixtures_camera.py
"""

import json
import os

import colour
import numpy as np
from colour.colorimetry import sd_CIE_standard_illuminant_A

PINNED = "0.4.7"
assert colour.__version__ == PINNED, f"expected colour-science {PINNED}, got {colour.__version__}"

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
OUT = os.path.join(ROOT, "crates", "camera", "tests", "fixtures", "camera_fits_colour047.json")
GRID = np.arange(360, 831, 1.0)
SHAPE = colour.SpectralShape(360, 830, 1)


def read_table(rel):
    """Committed asset CSV: '#' lines, a header, numeric rows."""
    with open(os.path.join(ROOT, rel), encoding="utf-8") as f:
        lines = [l.strip() for l in f if l.strip() and not l.startswith("#")]
    header = lines[0].split(",")
    data = np.array([[float(c) for c in l.split(",")] for l in lines[1:]])
    return header[1:], data[:, 0], data[:, 1:]


def to_grid(wavelengths, values):
    """Lampwright's resampling: exact copy at 1 nm, Sprague for coarser uniform data, ends repeated."""
    step = wavelengths[1] - wavelengths[0]
    if abs(step - 1.0) < 1e-9:
        out = np.interp(GRID, wavelengths, values)  # same nodes; outside: end values repeated
        return out
    sd = colour.SpectralDistribution(dict(zip(wavelengths, values)))
    inside = sd.copy().interpolate(colour.SpectralShape(wavelengths[0], wavelengths[-1], 1),
                                   interpolator=colour.SpragueInterpolator)
    return np.interp(GRID, inside.wavelengths, inside.values)


def fit_case(light, sens, refl, cmf):
    """Raw RGB, XYZ and the fits for one camera under one light (see the module docs)."""
    k_y = np.sum(light * cmf[:, 1])
    xyz = (refl.T * light) @ cmf / k_y
    white_xyz = light @ cmf / k_y
    k_g = np.sum(light * sens[:, 1])
    rgb = (refl.T * light) @ sens / k_g
    white_rgb = light @ sens / k_g
    x_ls, *_ = np.linalg.lstsq(rgb, xyz, rcond=None)
    m_ls = x_ls.T
    g_inv_w = np.linalg.solve(rgb.T @ rgb, white_rgb)
    m_wp = m_ls + np.outer(white_xyz - m_ls @ white_rgb, g_inv_w) / (white_rgb @ g_inv_w)
    terms = np.stack([rgb[:, 0], rgb[:, 1], rgb[:, 2], np.sqrt(rgb[:, 0] * rgb[:, 1]),
                      np.sqrt(rgb[:, 1] * rgb[:, 2]), np.sqrt(rgb[:, 0] * rgb[:, 2])], axis=1)
    x_rp, *_ = np.linalg.lstsq(terms, xyz, rcond=None)
    xy_w = colour.XYZ_to_xy(white_xyz)
    lab_ref = colour.XYZ_to_Lab(xyz, xy_w)
    lab_fit = colour.XYZ_to_Lab(rgb @ m_ls.T, xy_w)
    de = colour.delta_E(lab_ref, lab_fit, method="CIE 2000")
    return {
        "white_rgb": white_rgb.tolist(),
        "white_xyz": white_xyz.tolist(),
        "first_sample_rgb": rgb[0].tolist(),
        "first_sample_xyz": xyz[0].tolist(),
        "linear_matrix": m_ls.tolist(),
        "white_preserving_matrix": m_wp.tolist(),
        "root_poly_matrix": x_rp.T.tolist(),
        "linear_de2000": de.tolist(),
    }


def main():
    _, wl, cmf_raw = read_table("assets/standard/cie1931_2deg_cmfs.csv")
    cmf = np.stack([to_grid(wl, cmf_raw[:, k]) for k in range(3)], axis=1)

    names, wl, cams = read_table("assets/demo/cameras.csv")
    cameras = []
    for k in range(0, len(names), 3):
        cameras.append((names[k].rsplit("|", 1)[0], np.stack([to_grid(wl, cams[:, k + j]) for j in range(3)], axis=1)))

    samples, refl = [], []
    for rel in ("assets/standard/cie224_ces99.csv", "assets/standard/cie133_tcs.csv"):
        n, w, v = read_table(rel)
        samples += n
        refl += [to_grid(w, v[:, j]) for j in range(v.shape[1])]
    refl = np.stack(refl, axis=1)  # 471 x 113

    n, w, v = read_table("assets/standard/cie_illuminants_f_hp_led.csv")
    lights = {
        "A": sd_CIE_standard_illuminant_A(SHAPE).values,
        "F2": to_grid(w, v[:, n.index("F2")]),
    }

    cases = []
    for light_name, light in lights.items():
        for cam_name, sens in cameras:
            case = fit_case(light, sens, refl, cmf)
            cases.append({"camera": cam_name, "light": light_name, **case})

    # The case the command-line test runs: demo camera A, illuminant A, TCS01-TCS14 only.
    tcs = [i for i, n in enumerate(samples) if n.startswith("TCS")]
    cli_case = {"camera": cameras[0][0], "light": "A", "samples": [samples[i] for i in tcs],
                **fit_case(lights["A"], cameras[0][1], refl[:, tcs], cmf)}

    doc = {
        "generator": "scripts/gen_fixtures_camera.py",
        "colour_science": colour.__version__,
        "numpy": np.__version__,
        "source": "numpy.linalg.lstsq and colour-science 0.4.7 CIELAB/CIEDE2000 on the committed assets; "
                  "grid 360-830 nm at 1 nm, Sprague for 5 nm data, ends repeated",
        "samples": samples,
        "cases": cases,
        "cli_case": cli_case,
    }
    with open(OUT, "w", encoding="utf-8", newline="\n") as f:
        json.dump(doc, f, indent=1)
        f.write("\n")
    print("wrote", OUT)


if __name__ == "__main__":
    main()
