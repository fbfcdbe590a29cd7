#!/usr/bin/env python3
"""Generate the INVENTED demo library tables of Lampwright.

Writes three files, 360-830 nm at 1 nm, one column per library entry (the
column name is the entry's id):

- assets/demo/lamps.csv     relative spectral power of invented lamps
- assets/demo/gels.csv      transmittance (0-1) of invented gels and filters
- assets/demo/subjects.csv  reflectance factor (0-1) of invented subjects

Everything here is made up by the Lampwright project from smooth textbook
shapes (Gaussians, logistic steps, power laws). None of it is a measurement of
a real lamp, filter or material, and none of it copies a maker's catalogue.
The shapes only imitate the general character of each kind of thing so that
the app can show, for example, how a cheap LED tube's green spike or a sodium
street light's narrow spectrum changes colours for the eye and for a camera.

Lamps whose colour must land on a chosen white (the phosphor LEDs, the LED
tube, the RGB and RGBW panels) mix three components whose weights are solved
so that the mix has exactly the chromaticity aimed at: a point on the Planckian
locus at the nominal CCT, moved by the aimed Duv along the normal in CIE 1960
uv. The solve uses the CIE 1931 2 degree colour-matching functions from the
committed asset assets/standard/cie1931_2deg_cmfs.csv (CIE 15:2018) and
Planck's law with c2 = 1.4388e-2 m K.

The ideal conversion gels (CTO, CTB) are ratios of two Planckian spectra,
normalised so that their largest value between 380 and 780 nm is 1 (values
beyond are capped at 1): full CTO turns a 5500 K Planckian source into 3200 K,
full CTB turns 3200 K into 5500 K (the pairing is common practice for the
trade's "full" conversion). ND filters are flat at 10^-density.

Re-run (Python 3.11+, numpy pinned):
    python3 -m venv .venv && .venv/bin/pip install numpy==2.2.6
    .venv/bin/python scripts/gen_demo_library.py
"""

import os

import numpy as np

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
OUT_DIR = os.path.join(ROOT, "assets", "demo")
CMF_PATH = os.path.join(ROOT, "assets", "standard", "cie1931_2deg_cmfs.csv")

WL = np.arange(360.0, 831.0, 1.0)
C2 = 1.4388e-2
GENERATOR = "scripts/gen_demo_library.py (Python 3, numpy 2.2.6)"


# ---------------------------------------------------------------- shapes


def gauss(centre, sigma, height=1.0):
    return height * np.exp(-((WL - centre) ** 2) / (2.0 * sigma * sigma))


def agauss(centre, left, right, height=1.0):
    """Asymmetric Gaussian: width `left` below the peak, `right` above."""
    s = np.where(WL < centre, left, right)
    return height * np.exp(-((WL - centre) ** 2) / (2.0 * s * s))


def step_up(centre, width):
    """Logistic step from 0 to 1 around `centre` (nm)."""
    return 1.0 / (1.0 + np.exp(-(WL - centre) / width))


def step_down(centre, width):
    return 1.0 - step_up(centre, width)


def planck(t_k):
    wl = WL * 1e-9
    m = wl ** -5 / np.expm1(C2 / (wl * t_k))
    return m / m[WL == 560.0][0]


# ---------------------------------------------------------------- colorimetry for the white solves


def load_cmfs():
    rows = []
    with open(CMF_PATH, encoding="utf-8") as f:
        for line in f:
            line = line.strip()
            if not line or line.startswith("#") or line.startswith("wavelength"):
                continue
            rows.append([float(c) for c in line.split(",")])
    table = np.array(rows)
    if not np.array_equal(table[:, 0], WL):
        raise SystemExit("CMF table is not 360-830 nm at 1 nm")
    return table[:, 1:4]


CMF = load_cmfs()


def xyz(spd):
    return spd @ CMF


def uv1960(x, y, z):
    d = x + 15.0 * y + 3.0 * z
    return np.array([4.0 * x / d, 6.0 * y / d])


def target_xyz(cct_k, duv):
    """XYZ (Y = 1) of the point at `duv` from the Planckian locus at `cct_k`."""
    uv0 = uv1960(*xyz(planck(cct_k)))
    uv1 = uv1960(*xyz(planck(cct_k + 1.0)))
    tangent = (uv1 - uv0) / np.linalg.norm(uv1 - uv0)
    normal = np.array([-tangent[1], tangent[0]])  # points towards +v (green) on this part of the locus
    if normal[1] < 0:
        normal = -normal
    u, v = uv0 + duv * normal
    x = 3.0 * u / (2.0 * u - 8.0 * v + 4.0)
    y = 2.0 * v / (2.0 * u - 8.0 * v + 4.0)
    return np.array([x / y, 1.0, (1.0 - x - y) / y])


def mix_to_white(components, cct_k, duv, fixed=None):
    """Weights of three components (plus an optional fixed part) so the mix
    has the target chromaticity; the result is scaled to a peak of 1."""
    fixed = np.zeros_like(WL) if fixed is None else fixed
    a = np.column_stack([xyz(c) for c in components])
    t = target_xyz(cct_k, duv)
    # Solve for weights w and overall scale s: A w + xyz(fixed) = s t, with
    # the fixed part's contribution counted at scale 1 and Y of the mix = s.
    # Unknowns w1..w3 and s; fix s by requiring the fixed part be 10 % of Y
    # when there is one, otherwise s = 1.
    f = xyz(fixed)
    s = f[1] / 0.10 if f[1] > 0 else 1.0
    w = np.linalg.solve(a, s * t - f)
    if np.any(w < 0):
        raise SystemExit(f"negative weight {w} for white {cct_k} K, Duv {duv}")
    spd = fixed + sum(wi * c for wi, c in zip(w, components))
    return spd / spd.max()


# ---------------------------------------------------------------- lamps


def phosphor_led_budget(cct_k):
    """Blue pump + one broad yellow phosphor + an orange phosphor that stops
    short of the deep red: about Ra 80 with a weak R9."""
    pump = gauss(452.0, 10.0)
    yellow = agauss(545.0, 45.0, 60.0)
    orange = agauss(615.0, 40.0, 45.0)
    return mix_to_white([pump, yellow, orange], cct_k, 0.002)


def phosphor_led_high_fidelity(cct_k):
    """Blue pump with a little cyan filler + broad green phosphor + broad red
    phosphor reaching the deep red: a smooth, full spectrum (about Ra 95)."""
    pump = gauss(452.0, 10.0) + 0.15 * gauss(485.0, 16.0)
    green = agauss(530.0, 45.0, 50.0)
    red = agauss(640.0, 45.0, 50.0)
    return mix_to_white([pump, green, red], cct_k, 0.0)


def led_tube_cheap():
    """Cool-white tube: blue pump, a yellow phosphor and a narrow green spike,
    landing well above the Planckian locus (Duv about +0.012)."""
    pump = gauss(449.0, 9.0)
    yellow = agauss(565.0, 40.0, 58.0)
    spike = gauss(543.0, 5.0)
    return mix_to_white([pump, yellow, spike], 5100.0, 0.012)


def rgb_panel():
    """Three narrow LED bands set to a 5600 K white."""
    return mix_to_white([gauss(458.0, 9.0), gauss(523.0, 14.0), gauss(628.0, 8.0)], 5600.0, 0.0)


def rgbw_panel():
    """RGB bands plus a phosphor white channel (fixed share) set to 5600 K."""
    white = gauss(451.0, 9.5, 0.55) + agauss(556.0, 38.0, 62.0)
    return mix_to_white([gauss(458.0, 9.0), gauss(523.0, 14.0), gauss(628.0, 8.0)], 5600.0, 0.0, fixed=white)


def discharge_daylight():
    """Daylight-balanced discharge: a hot continuum plus many narrow
    emission lines from metal additives (positions drawn once from a seeded
    generator, so the table is reproducible)."""
    rng = np.random.default_rng(5600)
    continuum = planck(5750.0) * (0.85 + 0.15 * step_up(420.0, 15.0))
    lines = np.zeros_like(WL)
    for centre in rng.uniform(400.0, 690.0, size=48):
        lines += gauss(centre, 1.2, rng.uniform(0.15, 0.6))
    spd = continuum / continuum.max() + 0.55 * lines
    return spd / spd.max()


def mercury_street():
    """Clear mercury-vapour lamp: the Hg lines at 404.7, 435.8, 546.1 and
    577/579 nm (line positions are physics, heights invented) over a weak continuum."""
    lines = (
        gauss(404.7, 1.3, 0.45)
        + gauss(435.8, 1.3, 0.85)
        + gauss(546.1, 1.3, 1.0)
        + gauss(577.0, 1.3, 0.45)
        + gauss(579.1, 1.3, 0.5)
    )
    continuum = 0.025 + 0.02 * gauss(600.0, 90.0)
    spd = lines + continuum
    return spd / spd.max()


def lamps():
    return [
        ("discharge-daylight", discharge_daylight(), "continuum of a 5750 K Planckian x (0.85 + 0.15 step at 420 nm) plus 48 narrow lines (sigma 1.2 nm) at seeded random positions 400-690 nm"),
        ("mercury-street", mercury_street(), "Hg lines 404.7, 435.8, 546.1, 577.0, 579.1 nm (sigma 1.3 nm, invented heights) over a weak continuum"),
        ("led-2700-budget", phosphor_led_budget(2700.0), "blue pump 452 nm + yellow phosphor 545 nm + orange phosphor 615 nm, weights solved for 2700 K, Duv +0.002"),
        ("led-3200-budget", phosphor_led_budget(3200.0), "as led-2700-budget, solved for 3200 K, Duv +0.002"),
        ("led-4000-budget", phosphor_led_budget(4000.0), "as led-2700-budget, solved for 4000 K, Duv +0.002"),
        ("led-5600-budget", phosphor_led_budget(5600.0), "as led-2700-budget, solved for 5600 K, Duv +0.002"),
        ("led-2700-hifi", phosphor_led_high_fidelity(2700.0), "blue pump 452 nm with cyan filler 485 nm + green phosphor 530 nm + red phosphor 640 nm, solved for 2700 K, Duv 0"),
        ("led-3200-hifi", phosphor_led_high_fidelity(3200.0), "as led-2700-hifi, solved for 3200 K, Duv 0"),
        ("led-4000-hifi", phosphor_led_high_fidelity(4000.0), "as led-2700-hifi, solved for 4000 K, Duv 0"),
        ("led-5600-hifi", phosphor_led_high_fidelity(5600.0), "as led-2700-hifi, solved for 5600 K, Duv 0"),
        ("led-tube-cheap", led_tube_cheap(), "blue pump 449 nm + yellow phosphor 565 nm + green spike 543 nm (sigma 5 nm), solved for 5100 K, Duv +0.012 (clear of the 5000 K switch between CRI reference illuminants)"),
        ("led-rgb-panel", rgb_panel(), "LED bands 458 / 523 / 628 nm (sigma 9 / 14 / 8 nm), solved for 5600 K, Duv 0"),
        ("led-rgbw-panel", rgbw_panel(), "the RGB bands plus a phosphor white (10 % of Y), solved for 5600 K, Duv 0"),
    ]


# ---------------------------------------------------------------- gels


def conversion(from_k, to_k):
    ratio = planck(to_k) / planck(from_k)
    visible = (WL >= 380.0) & (WL <= 780.0)
    return np.minimum(ratio / ratio[visible].max(), 1.0)


def gels():
    return [
        ("cto-full", conversion(5500.0, 3200.0), "ideal conversion: Planck(3200 K) / Planck(5500 K), peak in 380-780 nm = 1"),
        ("ctb-full", conversion(3200.0, 5500.0), "ideal conversion: Planck(5500 K) / Planck(3200 K), peak in 380-780 nm = 1"),
        ("plus-green-full", 0.9 * (0.62 + 0.38 * gauss(560.0, 55.0)), "0.9 x (0.62 + 0.38 x Gaussian at 560 nm, sigma 55 nm): adds green along the normal to the Planckian locus (about +0.012 Duv on 4000 K)"),
        ("minus-green-full", 0.9 * (1.0 - 0.32 * gauss(560.0, 50.0)), "0.9 x (1 - 0.32 x Gaussian at 560 nm, sigma 50 nm): a magenta that removes green (about -0.012 Duv on 4000 K)"),
        ("nd-03", np.full_like(WL, 10.0 ** -0.3), "flat 10^-0.3 (one stop)"),
        ("nd-06", np.full_like(WL, 10.0 ** -0.6), "flat 10^-0.6 (two stops)"),
        ("nd-09", np.full_like(WL, 10.0 ** -0.9), "flat 10^-0.9 (three stops)"),
        ("diffusion-neutral", np.full_like(WL, 0.9), "flat 0.9 (only the light lost is modelled, not the spread)"),
        ("effect-deep-blue", 0.02 + 0.6 * gauss(455.0, 28.0) + 0.5 * step_up(715.0, 12.0), "Gaussian at 455 nm plus the far-red leak dyes have"),
        ("effect-amber", 0.03 + 0.87 * step_up(560.0, 14.0), "logistic cut-on at 560 nm"),
        ("effect-red", 0.01 + 0.88 * step_up(608.0, 8.0), "steep logistic cut-on at 608 nm"),
        ("effect-teal", 0.03 + 0.75 * gauss(495.0, 38.0) + 0.45 * step_up(725.0, 14.0), "Gaussian at 495 nm plus a far-red leak"),
        ("effect-lavender", 0.35 + 0.45 * step_down(470.0, 18.0) + 0.45 * step_up(610.0, 20.0) - 0.1 * gauss(540.0, 30.0), "passes blue-violet and red, holds back green"),
        ("effect-rose", 0.3 + 0.6 * step_up(590.0, 18.0) + 0.25 * gauss(420.0, 30.0), "red cut-on at 590 nm with a partial violet pass"),
    ]


# ---------------------------------------------------------------- subjects

MELANIN_OD = (WL / 500.0) ** -2.0  # melanin absorbance rises steadily towards short wavelengths


def blood_od():
    """Optical density shape of oxygenated blood: Soret band near 415 nm and
    the two Q bands near 542 and 577 nm (positions are physics, heights invented)."""
    return 1.0 * gauss(416.0, 14.0) + 0.42 * gauss(542.0, 11.0) + 0.45 * gauss(577.0, 9.0) + 0.12 * gauss(560.0, 40.0)


def skin(melanin, blood, scatter=0.68, yellow=0.0):
    """Two-layer skin: a melanin epidermis over a blood-bearing dermis that
    scatters more at long wavelengths. `yellow` adds carotene-like absorption
    near 480 nm (golden and olive undertones)."""
    dermis = scatter * (0.55 + 0.45 * step_up(590.0, 30.0))
    return dermis * np.exp(-melanin * MELANIN_OD - blood * blood_od() - yellow * gauss(480.0, 30.0))


def flat(v):
    return np.full_like(WL, v)


def subjects():
    return [
        ("skin-light-pink", skin(0.25, 0.55, 0.72), "melanin 0.25, blood 0.55 (pink undertone)"),
        ("skin-light-neutral", skin(0.35, 0.4, 0.7, 0.1), "melanin 0.35, blood 0.4, carotene-like 0.1"),
        ("skin-medium-olive", skin(0.6, 0.3, 0.62, 0.35), "melanin 0.6, blood 0.3, carotene-like 0.35 (olive undertone)"),
        ("skin-medium-golden", skin(0.65, 0.4, 0.66, 0.2), "melanin 0.65, blood 0.4, carotene-like 0.2 (golden undertone)"),
        ("skin-tan", skin(0.95, 0.4, 0.6, 0.1), "melanin 0.95, blood 0.4, carotene-like 0.1"),
        ("skin-brown", skin(1.35, 0.35, 0.55), "melanin 1.35, blood 0.35"),
        ("skin-deep-warm", skin(1.8, 0.3, 0.5, 0.1), "melanin 1.8, blood 0.3, carotene-like 0.1 (warm undertone)"),
        ("skin-deep-cool", skin(2.1, 0.45, 0.45), "melanin 2.1, blood 0.45 (cool, red-violet undertone)"),
        ("hair-dark-brown", 0.025 + 0.12 * step_up(640.0, 60.0) * (WL / 700.0) ** 2, "dark eumelanin: slow rise towards the red"),
        ("hair-blonde", 0.06 + 0.5 * step_up(560.0, 55.0), "light pheomelanin: broad rise from green to red"),
        ("lips", 0.07 + 0.38 * step_up(600.0, 16.0) - 0.03 * gauss(542.0, 12.0) - 0.03 * gauss(577.0, 9.0), "red cut-on near 600 nm with haemoglobin dips"),
        ("tomato", 0.05 + 0.62 * step_up(600.0, 10.0) + 0.03 * gauss(450.0, 20.0), "lycopene red: steep cut-on at 600 nm"),
        ("chili-red", 0.04 + 0.5 * step_up(615.0, 9.0), "deeper red than tomato: cut-on at 615 nm"),
        ("lemon", 0.06 + 0.72 * step_up(505.0, 14.0) - 0.05 * gauss(680.0, 12.0), "yellow: cut-on at 505 nm, small chlorophyll trace at 680 nm"),
        ("orange-fruit", 0.05 + 0.68 * step_up(560.0, 13.0), "orange: cut-on at 560 nm"),
        ("leafy-greens", 0.04 + 0.1 * gauss(550.0, 28.0) - 0.02 * gauss(675.0, 12.0) + 0.5 * step_up(715.0, 10.0), "chlorophyll green peak at 550 nm, red-edge rise at 715 nm"),
        ("bread-crust", 0.05 + 0.45 * step_up(600.0, 55.0) * (WL / 700.0), "Maillard brown: slow rise to the red"),
        ("coffee", 0.03 + 0.12 * step_up(640.0, 40.0), "dark brown"),
        ("cream", 0.62 + 0.2 * step_up(470.0, 20.0), "pale warm white"),
        ("denim", 0.05 + 0.18 * gauss(470.0, 40.0) + 0.35 * step_up(700.0, 14.0), "indigo: blue lobe and the near-infrared rise indigo dye has"),
        ("white-shirt", 0.8 + 0.08 * step_up(430.0, 15.0), "cotton white without brightener"),
        ("red-wool", 0.04 + 0.5 * step_up(605.0, 14.0) + 0.04 * gauss(420.0, 20.0), "dyed red fibre"),
        ("black-fabric", 0.03 + 0.015 * step_up(700.0, 20.0), "black cloth"),
        ("khaki", 0.12 + 0.22 * step_up(540.0, 40.0), "muted yellow-brown"),
        ("foliage", 0.05 + 0.09 * gauss(552.0, 26.0) - 0.025 * gauss(675.0, 12.0) + 0.45 * step_up(712.0, 11.0), "leaf: chlorophyll window at 552 nm and red edge at 712 nm"),
        ("dry-grass", 0.08 + 0.3 * step_up(560.0, 40.0) + 0.1 * step_up(700.0, 20.0), "straw: broad rise through yellow"),
        ("grey-card-18", flat(0.18), "flat 0.18"),
        ("white-card", flat(0.9), "flat 0.9"),
        ("black-card", flat(0.04), "flat 0.04"),
        ("product-red", 0.03 + 0.82 * step_up(618.0, 7.0), "saturated red: steep cut-on at 618 nm, so almost nothing of the 589 nm sodium light is reflected"),
        ("product-cyan", 0.05 + 0.7 * gauss(490.0, 45.0), "cyan"),
        ("product-purple", 0.06 + 0.42 * gauss(440.0, 28.0) + 0.42 * step_up(680.0, 12.0), "blue lobe plus a deep-red lobe above 680 nm: cameras with more far-red response than the eye render it too red"),
        ("product-yellow", 0.05 + 0.8 * step_up(520.0, 10.0), "saturated yellow"),
        ("sky-blue", 0.12 + 0.5 * gauss(460.0, 50.0) - 0.05 * step_up(620.0, 20.0), "painted sky blue"),
        ("glaze-celadon", 0.32 + 0.22 * gauss(520.0, 45.0) - 0.08 * step_up(620.0, 25.0), "pale grey-green glaze"),
        ("glaze-cobalt", 0.04 + 0.45 * gauss(450.0, 28.0) + 0.2 * step_up(700.0, 15.0), "cobalt blue glaze with the far-red lobe cobalt pigments have"),
        ("glaze-white", 0.76 + 0.06 * step_up(500.0, 30.0), "warm white glaze"),
        ("glaze-tenmoku", 0.04 + 0.1 * step_up(620.0, 45.0), "iron brown-black glaze"),
        ("glaze-copper-red", 0.03 + 0.55 * step_up(625.0, 12.0) + 0.04 * gauss(430.0, 20.0), "copper red glaze"),
    ]


# ---------------------------------------------------------------- output


def write(name, header, entries, lo, hi):
    for id_, values, _ in entries:
        if not np.all(np.isfinite(values)):
            raise SystemExit(f"{name}: {id_} has non-finite values")
        if values.min() < lo - 1e-12 or values.max() > hi + 1e-12:
            raise SystemExit(f"{name}: {id_} leaves [{lo}, {hi}]: {values.min()} .. {values.max()}")
    path = os.path.join(OUT_DIR, name)
    with open(path, "w", encoding="utf-8", newline="\n") as f:
        for line in header:
            f.write(f"# {line}\n")
        for id_, _, how in entries:
            f.write(f"# {id_}: {how}\n")
        f.write(f"# Generated by {GENERATOR}; do not edit by hand.\n")
        f.write("wavelength_nm," + ",".join(e[0] for e in entries) + "\n")
        for i, wl in enumerate(WL):
            f.write(f"{wl:.0f}," + ",".join(f"{e[1][i]:.6g}" for e in entries) + "\n")


def main():
    write(
        "lamps.csv",
        [
            "INVENTED demo lamp spectra, made up by the Lampwright project; NOT measurements of any real lamp or product.",
            "Relative spectral power, 360-830 nm at 1 nm, each column scaled to a peak of 1; column name = library id.",
        ],
        lamps(),
        0.0,
        1.0,
    )
    write(
        "gels.csv",
        [
            "INVENTED demo gel and filter transmittances, made up by the Lampwright project; NOT measurements of any real filter or catalogue.",
            "Transmittance 0-1 of the FULL-strength gel, 360-830 nm at 1 nm; column name = library id.",
        ],
        gels(),
        0.0,
        1.0,
    )
    write(
        "subjects.csv",
        [
            "INVENTED demo subject reflectances, made up by the Lampwright project; NOT measurements of any real material or chart.",
            "Reflectance factor 0-1, 360-830 nm at 1 nm; column name = library id.",
        ],
        subjects(),
        0.0,
        1.0,
    )


if __name__ == "__main__":
    main()
