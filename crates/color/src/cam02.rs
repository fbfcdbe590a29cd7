//! CIECAM02 colour appearance model (forward direction) and the CAM02-UCS
//! uniform colour space J′a′b′.
//!
//! Everything that depends only on the white and the viewing conditions is
//! computed once in [`Cam02::new`]; per stimulus the model costs one 3 × 3
//! product and a handful of powers. TM-30 / CIE 224 evaluate about two hundred
//! stimuli per lamp, so build a [`Cam02Ucs`] once per white and call
//! [`Cam02Ucs::jab`].
//!
//! Input XYZ are relative, on the white's scale (conventionally Yw = 100).
//!
//! # References
//! - CIE 159:2004, *A colour appearance model for colour management systems:
//!   CIECAM02*, §2 (forward model, eqs. 2.1–2.28; unique-hue data, Table 2.2;
//!   surround parameters, Table 1).
//! - Moroney, N., Fairchild, M. D., Hunt, R. W. G., Li, C., Luo, M. R., Newman, T.
//!   (2002), "The CIECAM02 color appearance model", *Proc. IS&T/SID 10th Color
//!   Imaging Conference*, 23–27.
//! - Luo, M. R., Li, C. (2013), "CIECAM02 and its recent developments", in
//!   *Advanced Color Image Processing and Analysis*, Springer, 19–58,
//!   DOI 10.1007/978-1-4419-6190-7 (odd extension of the compression to negative responses).
//! - Luo, M. R., Cui, G., Li, C. (2006), "Uniform colour spaces based on CIECAM02
//!   colour appearance model", *Color Res. Appl.* 31(4):320–330, DOI 10.1002/col.20227
//!   (CAM02-UCS: KL = 1, c1 = 0.007, c2 = 0.0228).
//! - ANSI/IES TM-30-20 and CIE 224:2017, *Colour fidelity index for accurate
//!   scientific use*: CAM02-UCS with LA = 100 cd/m², Yb = 20, average surround, D = 1.

use crate::adaptation::{Cat, degree_of_adaptation_cie159};
use crate::batch_math::{ln_in_place, pow_nonnegative_in_place};
use crate::error::{ColorError, Result};
use crate::spaces::hue_angle_deg;
use crate::tristimulus::Xyz;
use nalgebra::Matrix3;

/// Surround of the viewing field: factor F of the degree of adaptation,
/// impact c of the surround and chromatic induction factor Nc.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Surround {
    /// F, maximum degree of adaptation (0.8–1.0).
    pub f: f64,
    /// c, exponential non-linearity of the surround (0.525–0.69).
    pub c: f64,
    /// Nc, chromatic induction factor (0.8–1.0).
    pub nc: f64,
}

impl Surround {
    /// Average surround (surface colours): F = 1.0, c = 0.69, Nc = 1.0 (CIE 159:2004 Table 1).
    pub const AVERAGE: Surround = Surround {
        f: 1.0,
        c: 0.69,
        nc: 1.0,
    };
    /// Dim surround (television): F = 0.9, c = 0.59, Nc = 0.9 (CIE 159:2004 Table 1).
    pub const DIM: Surround = Surround {
        f: 0.9,
        c: 0.59,
        nc: 0.9,
    };
    /// Dark surround (projection in a dark room): F = 0.8, c = 0.525, Nc = 0.8 (CIE 159:2004 Table 1).
    pub const DARK: Surround = Surround {
        f: 0.8,
        c: 0.525,
        nc: 0.8,
    };
}

/// Viewing conditions of CIECAM02.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ViewingConditions {
    /// Luminance of the adapting field LA in cd/m² (often 20 % of the white's luminance).
    pub la_cd_m2: f64,
    /// Luminance factor of the background Yb, on the white's scale (Yw = 100 → typically 20).
    pub yb: f64,
    /// Surround.
    pub surround: Surround,
    /// Discount the illuminant: full adaptation, D = 1 (as for surface colours
    /// judged as objects, and in TM-30 / CIE 224).
    pub discount_illuminant: bool,
}

impl ViewingConditions {
    /// The conditions of TM-30 / CIE 224: LA = 100 cd/m², Yb = 20, average
    /// surround, D = 1.
    pub const TM30: ViewingConditions = ViewingConditions {
        la_cd_m2: 100.0,
        yb: 20.0,
        surround: Surround::AVERAGE,
        discount_illuminant: true,
    };
}

/// The CIECAM02 correlates of one stimulus.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Cam02Appearance {
    /// Lightness J (0–100 for surface colours).
    pub j: f64,
    /// Chroma C.
    pub c: f64,
    /// Hue angle h in degrees, 0 ≤ h < 360.
    pub h_deg: f64,
    /// Hue quadrature H, 0–400 (0/400 unique red, 100 yellow, 200 green, 300 blue).
    pub hue_quadrature: f64,
    /// Colourfulness M.
    pub m: f64,
    /// Saturation s.
    pub s: f64,
    /// Brightness Q.
    pub q: f64,
}

/// Hunt–Pointer–Estévez cone space normalised to equal energy (CIE 159:2004 eq. 2.11).
fn hpe_matrix() -> Matrix3<f64> {
    Matrix3::new(
        0.38971, 0.68898, -0.07868, //
        -0.22981, 1.18340, 0.04641, //
        0.0, 0.0, 1.0,
    )
}

/// `x^y` for `y > 0` as `exp(y·ln x)`, 0 for `x ≤ 0`.
///
/// In the per-sample path this replaces `powf`, which costs about 1.7× an
/// `ln` plus an `exp` on the reference machine; the relative error stays
/// within a few 1e-16 for the arguments met here (|y·ln x| < 40).
fn pow_positive(x: f64, y: f64) -> f64 {
    if x > 0.0 { (y * x.ln()).exp() } else { 0.0 }
}

/// cos 2 and sin 2 (2 rad, from the eccentricity factor ¼[cos(h + 2) + 3.8]).
const COS_2: f64 = -0.416_146_836_547_142_4;
const SIN_2: f64 = 0.909_297_426_825_681_7;

/// Intermediate results shared by the full model and the UCS shortcut.
struct Core {
    /// Opponent dimensions a, b and their magnitude.
    a: f64,
    b: f64,
    r: f64,
    /// √(J/100) = (A/Aw)^(cz/2).
    sqrt_j_100: f64,
    /// Lightness J.
    j: f64,
    /// Chroma C.
    c: f64,
}

/// CIECAM02 for one white and one set of viewing conditions, with every
/// white-dependent term precomputed.
#[derive(Debug, Clone, PartialEq)]
pub struct Cam02 {
    /// XYZ → adapted, HPE-space responses: M(HPE) · M(CAT02)⁻¹ · diag(D gains) · M(CAT02).
    to_hpe: [[f64; 3]; 3],
    /// FL / 100.
    fl_100: f64,
    /// FL^0.25.
    fl_quarter: f64,
    n_bb: f64,
    /// Achromatic response of the white Aw.
    a_w: f64,
    /// c·z, the lightness exponent.
    cz: f64,
    c_surround: f64,
    /// (50000/13) · Nc · Ncb.
    t_factor: f64,
    /// (1.64 − 0.29ⁿ)^0.73.
    chroma_factor: f64,
}

impl Cam02 {
    /// Prepare the model for `white` (XYZ of the adopted white, Y > 0, usually
    /// 100) under `conditions`.
    ///
    /// # References
    /// CIE 159:2004 eqs. 2.1–2.10 and 2.19 (for Aw).
    pub fn new(white: Xyz, conditions: ViewingConditions) -> Result<Cam02> {
        let ViewingConditions {
            la_cd_m2,
            yb,
            surround,
            discount_illuminant,
        } = conditions;
        let positive = |v: f64| v.is_finite() && v > 0.0;
        if !positive(la_cd_m2) {
            return Err(ColorError::OutOfRange {
                what: "adapting luminance L_A (cd/m²)",
                value: la_cd_m2,
                range: "> 0",
            });
        }
        if !positive(yb) {
            return Err(ColorError::OutOfRange {
                what: "background luminance factor Yb",
                value: yb,
                range: "> 0",
            });
        }
        for (what, v) in [
            ("surround F", surround.f),
            ("surround c", surround.c),
            ("surround Nc", surround.nc),
        ] {
            if !positive(v) {
                return Err(ColorError::OutOfRange {
                    what,
                    value: v,
                    range: "> 0",
                });
            }
        }
        let m_cat02 = Cat::Cat02.matrix();
        let rgb_w = m_cat02 * nalgebra::Vector3::new(white.x, white.y, white.z);
        if !(white.is_finite() && white.y > 0.0 && rgb_w.iter().all(|v| *v > 0.0)) {
            return Err(ColorError::InvalidInput(format!(
                "white X={}, Y={}, Z={} cannot serve as the CIECAM02 adopted white \
                 (it needs Y > 0 and positive CAT02 responses)",
                white.x, white.y, white.z
            )));
        }

        // Eqs. 2.4–2.10: viewing-condition parameters.
        let n = yb / white.y;
        let k = 1.0 / (5.0 * la_cd_m2 + 1.0);
        let k4 = k.powi(4);
        let fl = 0.2 * k4 * (5.0 * la_cd_m2) + 0.1 * (1.0 - k4).powi(2) * (5.0 * la_cd_m2).cbrt();
        let n_bb = 0.725 * n.recip().powf(0.2);
        let n_cb = n_bb;
        let z = 1.48 + n.sqrt();
        // Eq. 2.3 (or D = 1 when the illuminant is discounted).
        let d = if discount_illuminant {
            1.0
        } else {
            degree_of_adaptation_cie159(surround.f, la_cd_m2)
        };
        // Eq. 2.5: Rc = [Yw·D/Rw + (1 − D)] R, folded into one matrix with eq. 2.11.
        let gains = rgb_w.map(|rw| white.y * d / rw + 1.0 - d);
        let to_hpe =
            hpe_matrix() * Cat::Cat02.inverse_matrix() * Matrix3::from_diagonal(&gains) * m_cat02;
        let mut cam = Cam02 {
            to_hpe: [
                [to_hpe[(0, 0)], to_hpe[(0, 1)], to_hpe[(0, 2)]],
                [to_hpe[(1, 0)], to_hpe[(1, 1)], to_hpe[(1, 2)]],
                [to_hpe[(2, 0)], to_hpe[(2, 1)], to_hpe[(2, 2)]],
            ],
            fl_100: fl / 100.0,
            fl_quarter: fl.powf(0.25),
            n_bb,
            a_w: 1.0,
            cz: surround.c * z,
            c_surround: surround.c,
            t_factor: 50_000.0 / 13.0 * surround.nc * n_cb,
            chroma_factor: (1.64 - 0.29f64.powf(n)).powf(0.73),
        };
        let [ra, ga, ba] = cam.compressed(white);
        cam.a_w = (2.0 * ra + ga + ba / 20.0 - 0.305) * n_bb;
        if !(cam.a_w.is_finite() && cam.a_w > 0.0) {
            return Err(ColorError::Numerical(format!(
                "the achromatic response of the white is {} under these viewing conditions",
                cam.a_w
            )));
        }
        Ok(cam)
    }

    /// Post-adaptation compressed responses R′a, G′a, B′a (eqs. 2.11–2.15),
    /// odd-symmetric for negative inputs.
    fn compressed(&self, xyz: Xyz) -> [f64; 3] {
        let m = &self.to_hpe;
        let v = [xyz.x, xyz.y, xyz.z];
        let row = |r: &[f64; 3]| r[0] * v[0] + r[1] * v[1] + r[2] * v[2];
        [row(&m[0]), row(&m[1]), row(&m[2])].map(|x| {
            let p = pow_positive(self.fl_100 * x.abs(), 0.42);
            (400.0 * p / (27.13 + p)).copysign(x) + 0.1
        })
    }

    fn core(&self, xyz: Xyz) -> Core {
        let [ra, ga, ba] = self.compressed(xyz);
        // Eqs. 2.16–2.17.
        let a = ra - 12.0 * ga / 11.0 + ba / 11.0;
        let b = (ra + ga - 2.0 * ba) / 9.0;
        let r = (a * a + b * b).sqrt();
        // Eqs. 2.19–2.20. A below zero (only for stimuli outside the spectrum locus)
        // is taken as black, so that J is never NaN.
        let achromatic = ((2.0 * ra + ga + ba / 20.0 - 0.305) * self.n_bb).max(0.0);
        let ratio = achromatic / self.a_w;
        let sqrt_j_100 = pow_positive(ratio, self.cz / 2.0);
        let j = 100.0 * sqrt_j_100 * sqrt_j_100;
        // Eq. 2.18: e_t = ¼[cos(h + 2) + 3.8], h in radians; cos(h + 2) from a, b directly.
        let denom = ra + ga + 21.0 / 20.0 * ba;
        let t = if r > 0.0 && denom > 0.0 {
            let cos_h2 = (a * COS_2 - b * SIN_2) / r;
            let e_t = 0.25 * (cos_h2 + 3.8);
            self.t_factor * e_t * r / denom
        } else {
            0.0
        };
        // Eq. 2.24.
        let c = pow_positive(t, 0.9) * sqrt_j_100 * self.chroma_factor;
        Core {
            a,
            b,
            r,
            sqrt_j_100,
            j,
            c,
        }
    }

    /// All correlates of `xyz` (on the white's scale).
    ///
    /// # References
    /// CIE 159:2004 eqs. 2.11–2.28; hue quadrature from Table 2.2 with
    /// h′ = h + 360° below h₁ = 20.14°.
    #[must_use]
    pub fn appearance(&self, xyz: Xyz) -> Cam02Appearance {
        let core = self.core(xyz);
        let h_deg = if core.r > 0.0 {
            hue_angle_deg(core.a, core.b)
        } else {
            0.0
        };
        // Eqs. 2.22, 2.25, 2.26.
        let q = (4.0 / self.c_surround) * core.sqrt_j_100 * (self.a_w + 4.0) * self.fl_quarter;
        let m = core.c * self.fl_quarter;
        let s = if q > 0.0 { 100.0 * (m / q).sqrt() } else { 0.0 };
        Cam02Appearance {
            j: core.j,
            c: core.c,
            h_deg,
            hue_quadrature: hue_quadrature_cie159(h_deg),
            m,
            s,
            q,
        }
    }
}

/// Hue quadrature H from the hue angle h in degrees (CIE 159:2004 eq. 2.21 and
/// Table 2.2: unique red 20.14°, yellow 90.00°, green 164.25°, blue 237.53°,
/// eccentricities 0.8, 0.7, 1.0, 1.2).
///
/// The reference package splits the last segment at 360° with e = 0.856 and so
/// differs from this for 237.53° ≤ h < 20.14° (wrapping); the CIE text is
/// followed here.
#[must_use]
pub fn hue_quadrature_cie159(h_deg: f64) -> f64 {
    const HUE: [f64; 5] = [20.14, 90.00, 164.25, 237.53, 380.14];
    const ECC: [f64; 5] = [0.8, 0.7, 1.0, 1.2, 0.8];
    const QUAD: [f64; 5] = [0.0, 100.0, 200.0, 300.0, 400.0];
    let h = h_deg.rem_euclid(360.0);
    let h = if h < HUE[0] { h + 360.0 } else { h };
    let i = (0..4).rev().find(|&i| h >= HUE[i]).unwrap_or(0);
    let from = (h - HUE[i]) / ECC[i];
    let to = (HUE[i + 1] - h) / ECC[i + 1];
    QUAD[i] + 100.0 * from / (from + to)
}

/// CAM02-UCS J′a′b′ from CIECAM02 J, M and h (degrees).
///
/// J′ = 1.7 J / (1 + 0.007 J), M′ = ln(1 + 0.0228 M) / 0.0228, a′ = M′ cos h, b′ = M′ sin h.
///
/// # References
/// Luo, Cui & Li (2006), DOI 10.1002/col.20227, eqs. 4–5 and Table 2 (UCS: KL = 1,
/// c1 = 0.007, c2 = 0.0228).
#[must_use]
pub fn cam02_ucs_from_jmh(j: f64, m: f64, h_deg: f64) -> [f64; 3] {
    let (s, c) = h_deg.to_radians().sin_cos();
    let mp = m_prime(m);
    [j_prime(j), mp * c, mp * s]
}

const UCS_C1: f64 = 0.007;
const UCS_C2: f64 = 0.0228;

fn j_prime(j: f64) -> f64 {
    (1.0 + 100.0 * UCS_C1) * j / (1.0 + UCS_C1 * j)
}

fn m_prime(m: f64) -> f64 {
    // ln(1 + x) rather than ln_1p: the absolute error of M′ stays below 1e-14
    // and `ln` is about twice as fast.
    (1.0 + UCS_C2 * m).ln() / UCS_C2
}

/// CAM02-UCS for one white and viewing conditions: the fast path used by
/// TM-30 / CIE 224.
#[derive(Debug, Clone, PartialEq)]
pub struct Cam02Ucs {
    cam: Cam02,
}

impl Cam02Ucs {
    /// Prepare for `white` (Y > 0, usually 100) under `conditions`.
    pub fn new(white: Xyz, conditions: ViewingConditions) -> Result<Cam02Ucs> {
        Ok(Cam02Ucs {
            cam: Cam02::new(white, conditions)?,
        })
    }

    /// Prepare with the TM-30 / CIE 224 conditions ([`ViewingConditions::TM30`]).
    pub fn tm30(white: Xyz) -> Result<Cam02Ucs> {
        Cam02Ucs::new(white, ViewingConditions::TM30)
    }

    /// The underlying CIECAM02 model.
    #[must_use]
    pub fn cam02(&self) -> &Cam02 {
        &self.cam
    }

    /// J′, a′, b′ of `xyz` (on the white's scale).
    ///
    /// Same result as [`Cam02::appearance`] followed by [`cam02_ucs_from_jmh`],
    /// without computing the hue angle: cos h and sin h are a/|ab| and b/|ab|.
    #[must_use]
    pub fn jab(&self, xyz: Xyz) -> [f64; 3] {
        let core = self.cam.core(xyz);
        let m = core.c * self.cam.fl_quarter;
        let jp = j_prime(core.j);
        if core.r > 0.0 {
            let k = m_prime(m) / core.r;
            [jp, k * core.a, k * core.b]
        } else {
            [jp, 0.0, 0.0]
        }
    }
}

impl Cam02Ucs {
    /// J′, a′, b′ of many colours: the same as [`Cam02Ucs::jab`] on each (to
    /// a few units in the last place), with the powers and logarithms of all
    /// colours computed together by the vectorised [`crate::batch_math`].
    #[must_use]
    pub fn jab_many(&self, xyz: &[Xyz]) -> Vec<[f64; 3]> {
        let cam = &self.cam;
        let n = xyz.len();
        // Eqs. 2.11–2.15: |F_L·R/100|^0.42 for the three channels of every
        // colour; channel by channel (R of all colours, then G, then B) so
        // the stages below run over contiguous values.
        let mut linear = vec![0.0; 3 * n];
        for (k, row) in cam.to_hpe.iter().enumerate() {
            for (o, x) in linear[k * n..(k + 1) * n].iter_mut().zip(xyz) {
                *o = row[0] * x.x + row[1] * x.y + row[2] * x.z;
            }
        }
        let mut p: Vec<f64> = linear.iter().map(|x| cam.fl_100 * x.abs()).collect();
        pow_positive_many(&mut p, 0.42);
        // Eqs. 2.16–2.20 and the eccentricity term of 2.23, vectorised.
        let mut stage = OpponentStage {
            cam,
            linear: &linear,
            p: &p,
            ratio: vec![0.0; n],
            t: vec![0.0; n],
            a: vec![0.0; n],
            b: vec![0.0; n],
            r: vec![0.0; n],
        };
        stage = pulp::Arch::new().dispatch(stage);
        let OpponentStage {
            mut ratio,
            mut t,
            a,
            b,
            r,
            ..
        } = stage;
        pow_positive_many(&mut ratio, cam.cz / 2.0);
        pow_positive_many(&mut t, 0.9);
        // Eq. 2.24 and the UCS compression of M (ln(1 + c₂·M)).
        let mut m_arg: Vec<f64> = t
            .iter()
            .zip(&ratio)
            .map(|(t, sqrt_j)| 1.0 + UCS_C2 * (t * sqrt_j * cam.chroma_factor * cam.fl_quarter))
            .collect();
        ln_in_place(&mut m_arg);
        (0..n)
            .map(|i| {
                let sqrt_j = ratio[i];
                let jp = j_prime(100.0 * sqrt_j * sqrt_j);
                if r[i] > 0.0 {
                    let k = m_arg[i] / UCS_C2 / r[i];
                    [jp, k * a[i], k * b[i]]
                } else {
                    [jp, 0.0, 0.0]
                }
            })
            .collect()
    }
}

/// Eqs. 2.16–2.20 and the eccentricity term of 2.23 for many colours, from
/// the cone responses (`linear`, channel-major) and their compressed powers
/// (`p`): the achromatic ratio `A/A_w`, the factor t, and a, b, √(a² + b²).
/// A pulp kernel, so the loop (its divisions and square roots included) runs
/// on the widest vectors the processor has; the arithmetic is the one-colour
/// path's, operation for operation.
struct OpponentStage<'a> {
    cam: &'a Cam02,
    linear: &'a [f64],
    p: &'a [f64],
    ratio: Vec<f64>,
    t: Vec<f64>,
    a: Vec<f64>,
    b: Vec<f64>,
    r: Vec<f64>,
}

impl<'a> pulp::WithSimd for OpponentStage<'a> {
    type Output = OpponentStage<'a>;
    #[allow(clippy::inline_always)] // must inline into the dispatched function
    #[inline(always)]
    fn with_simd<S: pulp::Simd>(mut self, _simd: S) -> OpponentStage<'a> {
        let n = self.ratio.len();
        let cam = self.cam;
        let (p, linear) = (self.p, self.linear);
        let (pr, pg, pb) = (&p[..n], &p[n..2 * n], &p[2 * n..3 * n]);
        let (lr, lg, lb) = (&linear[..n], &linear[n..2 * n], &linear[2 * n..3 * n]);
        let compress = |q: f64, sign: f64| (400.0 * q / (27.13 + q)).copysign(sign) + 0.1;
        for i in 0..n {
            let ra = compress(pr[i], lr[i]);
            let ga = compress(pg[i], lg[i]);
            let ba = compress(pb[i], lb[i]);
            let a = ra - 12.0 * ga / 11.0 + ba / 11.0;
            let b = (ra + ga - 2.0 * ba) / 9.0;
            let r = (a * a + b * b).sqrt();
            let achromatic = ((2.0 * ra + ga + ba / 20.0 - 0.305) * cam.n_bb).max(0.0);
            self.ratio[i] = achromatic / cam.a_w;
            let denom = ra + ga + 21.0 / 20.0 * ba;
            let cos_h2 = (a * COS_2 - b * SIN_2) / r;
            let t = cam.t_factor * 0.25 * (cos_h2 + 3.8) * r / denom;
            self.t[i] = if r > 0.0 && denom > 0.0 { t } else { 0.0 };
            self.a[i] = a;
            self.b[i] = b;
            self.r[i] = r;
        }
        self
    }
}

/// `x^p` for x > 0 and 0 otherwise (NaN included), in place, as [`pow_positive`].
fn pow_positive_many(x: &mut [f64], p: f64) {
    for v in x.iter_mut() {
        if v.is_nan() {
            *v = 0.0;
        }
    }
    pow_nonnegative_in_place(x, p);
}

/// CAM02-UCS J′a′b′ of `xyz` under the TM-30 / CIE 224 conditions (10° observer
/// XYZ with the white at Y = 100, LA = 100 cd/m², Yb = 20, average surround,
/// D = 1). Builds the model on every call; for many samples under one white,
/// use [`Cam02Ucs::tm30`] once and [`Cam02Ucs::jab`].
pub fn cam02_ucs_tm30(xyz: Xyz, xyz_white: Xyz) -> Result<[f64; 3]> {
    Ok(Cam02Ucs::tm30(xyz_white)?.jab(xyz))
}

/// Colour difference ΔE′ in CAM02-UCS (KL = 1): the Euclidean distance of J′a′b′.
///
/// # References
/// Luo, Cui & Li (2006), DOI 10.1002/col.20227, eq. 6; CIE 224:2017 (ΔE′ of the fidelity index).
#[must_use]
pub fn delta_e_cam02ucs(jab1: [f64; 3], jab2: [f64; 3]) -> f64 {
    let d = [jab1[0] - jab2[0], jab1[1] - jab2[1], jab1[2] - jab2[2]];
    (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    const WHITE: Xyz = Xyz::new(95.05, 100.0, 108.88);

    fn worked_example() -> Cam02Appearance {
        let vc = ViewingConditions {
            la_cd_m2: 318.31,
            yb: 20.0,
            surround: Surround::AVERAGE,
            discount_illuminant: false,
        };
        Cam02::new(WHITE, vc)
            .unwrap()
            .appearance(Xyz::new(19.01, 20.0, 21.78))
    }

    #[test]
    fn many_at_once_equal_one_at_a_time() {
        let ucs = Cam02Ucs::tm30(Xyz::new(95.047, 100.0, 108.883)).unwrap();
        let mut colours = vec![
            Xyz::new(0.0, 0.0, 0.0),
            Xyz::new(95.047, 100.0, 108.883),
            Xyz::new(-1.0, 0.5, 2.0),
            Xyz::new(1e-9, 1e-9, 1e-9),
            Xyz::new(400.0, 300.0, 10.0),
        ];
        for i in 0..300 {
            let u = f64::from(i);
            colours.push(Xyz::new(
                50.0 + 45.0 * (u * 0.37).sin(),
                40.0 + 39.0 * (u * 0.11).cos(),
                60.0 + 55.0 * (u * 0.23).sin(),
            ));
        }
        let many = ucs.jab_many(&colours);
        assert_eq!(many.len(), colours.len());
        for (c, got) in colours.iter().zip(&many) {
            let want = ucs.jab(*c);
            for k in 0..3 {
                assert!(
                    (got[k] - want[k]).abs() <= 1e-13 * (1.0 + want[k].abs()),
                    "{c:?}: {got:?} vs {want:?}"
                );
            }
        }
    }

    #[test]
    fn moroney_worked_example() {
        // CIECAM02 worked example (sample 19.01/20.00/21.78 under 95.05/100/108.88,
        // LA = 318.31 cd/m², Yb = 20, average): J = 41.73, C = 0.10, h = 219.0,
        // H = 278.1, M = 0.11, s = 2.36, Q = 195.37. Recalled from memory; the same
        // figures are printed in the reference package's documentation.
        let a = worked_example();
        assert!((a.j - 41.73).abs() < 0.005, "J {}", a.j);
        assert!((a.c - 0.10).abs() < 0.005, "C {}", a.c);
        assert!((a.h_deg - 219.0).abs() < 0.05, "h {}", a.h_deg);
        assert!(
            (a.hue_quadrature - 278.1).abs() < 0.05,
            "H {}",
            a.hue_quadrature
        );
        assert!((a.m - 0.11).abs() < 0.005, "M {}", a.m);
        assert!((a.s - 2.36).abs() < 0.005, "s {}", a.s);
        assert!((a.q - 195.37).abs() < 0.005, "Q {}", a.q);
    }

    #[test]
    fn white_has_j_100_and_no_chroma_when_discounted() {
        let cam = Cam02::new(WHITE, ViewingConditions::TM30).unwrap();
        let a = cam.appearance(WHITE);
        assert!((a.j - 100.0).abs() < 1e-10);
        // With D = 1 the white's adapted responses are equal: a = b = 0 up to the
        // rounding of the published matrices (HPE rows sum to 1.00001, 0.99999, 1).
        assert!(a.c < 0.02, "C {}", a.c);
        let jab = Cam02Ucs::tm30(WHITE).unwrap().jab(WHITE);
        assert!((jab[0] - 100.0).abs() < 1e-10);
    }

    #[test]
    fn black_is_defined() {
        let ucs = Cam02Ucs::tm30(WHITE).unwrap();
        // A = (2·0.1 + 0.1 + 0.1/20 − 0.305)·Nbb = 0 up to rounding.
        let jab = ucs.jab(Xyz::default());
        assert!(jab.iter().all(|v| v.abs() < 1e-12), "{jab:?}");
        let a = ucs.cam02().appearance(Xyz::default());
        assert!(a.j < 1e-12 && a.c < 1e-12 && a.s.is_finite() && a.hue_quadrature.is_finite());
    }

    #[test]
    fn hue_quadrature_at_unique_hues() {
        for (h, quad) in [
            (20.14, 0.0),
            (90.0, 100.0),
            (164.25, 200.0),
            (237.53, 300.0),
        ] {
            assert!((hue_quadrature_cie159(h) - quad).abs() < 1e-9, "{h}");
        }
        assert!((hue_quadrature_cie159(20.14 - 1e-9) - 400.0).abs() < 1e-6);
    }

    #[test]
    fn constants_and_fast_power() {
        assert!((COS_2 - 2f64.cos()).abs() < 1e-16 && (SIN_2 - 2f64.sin()).abs() < 1e-16);
        for x in [1e-6, 0.01, 0.5, 1.0, 3.7, 250.0] {
            for y in [0.42, 0.9, 0.7] {
                let (got, want) = (pow_positive(x, y), x.powf(y));
                assert!(
                    (got - want).abs() <= 1e-15 * want,
                    "{x}^{y}: {got} vs {want}"
                );
            }
        }
        assert!(pow_positive(0.0, 0.42).to_bits() == 0 && pow_positive(-1.0, 0.42).to_bits() == 0);
    }

    #[test]
    fn ucs_formulas() {
        // Luo et al. (2006) eqs. 4–5 evaluated by hand: J = 50 → J′ = 85/1.35 = 62.963;
        // M = 0 → M′ = 0.
        let jab = cam02_ucs_from_jmh(50.0, 0.0, 123.0);
        assert!((jab[0] - 85.0 / 1.35).abs() < 1e-12 && jab[1] == 0.0 && jab[2] == 0.0);
        let jab = cam02_ucs_from_jmh(50.0, 10.0, 90.0);
        assert!((jab[2] - (1.228f64).ln() / 0.0228).abs() < 1e-12 && jab[1].abs() < 1e-12);
        assert!((delta_e_cam02ucs([0.0, 3.0, 0.0], [0.0, 0.0, 4.0]) - 5.0).abs() < 1e-12);
    }

    #[test]
    fn bad_conditions_are_refused() {
        let mut vc = ViewingConditions::TM30;
        vc.la_cd_m2 = 0.0;
        assert!(Cam02::new(WHITE, vc).is_err());
        let mut vc = ViewingConditions::TM30;
        vc.yb = f64::NAN;
        assert!(Cam02::new(WHITE, vc).is_err());
        let mut vc = ViewingConditions::TM30;
        vc.surround.c = 0.0;
        assert!(Cam02::new(WHITE, vc).is_err());
        assert!(Cam02::new(Xyz::default(), ViewingConditions::TM30).is_err());
        assert!(cam02_ucs_tm30(WHITE, Xyz::new(1.0, -1.0, 1.0)).is_err());
    }

    proptest! {
        #[test]
        fn fast_path_equals_full_model(x in 0.0..120.0f64, y in 0.0..120.0f64, z in 0.0..120.0f64) {
            let ucs = Cam02Ucs::tm30(WHITE).unwrap();
            let xyz = Xyz::new(x, y, z);
            let a = ucs.cam02().appearance(xyz);
            let want = cam02_ucs_from_jmh(a.j, a.m, a.h_deg);
            let got = ucs.jab(xyz);
            for k in 0..3 {
                prop_assert!((got[k] - want[k]).abs() < 1e-9, "{got:?} vs {want:?}");
            }
        }

        #[test]
        fn finite_for_any_finite_input(x in -200.0..200.0f64, y in -200.0..200.0f64, z in -200.0..200.0f64) {
            let ucs = Cam02Ucs::tm30(WHITE).unwrap();
            let xyz = Xyz::new(x, y, z);
            let a = ucs.cam02().appearance(xyz);
            for v in [a.j, a.c, a.h_deg, a.hue_quadrature, a.m, a.s, a.q] {
                prop_assert!(v.is_finite());
            }
            prop_assert!(ucs.jab(xyz).iter().all(|v| v.is_finite()));
        }
    }
}
