//! Colour differences in CIELAB: ΔE*ab (CIE 1976), ΔE*94 (CIE 1994) and
//! ΔE00 (CIEDE2000).
//!
//! All three take two [`Lab`] values computed against the same white and return
//! a non-negative finite number for finite input. ΔE94 is asymmetric: its first
//! argument is the reference (standard) colour, whose chroma sets the weights.
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §8.3 (ΔE*ab, eq. 8.19; CIEDE2000, eqs. 8.25–8.43).
//!   DOI 10.25039/TR.015.2018.
//! - CIE 116-1995, *Industrial colour-difference evaluation* (ΔE*94).
//! - CIE 142-2001, *Improvement to industrial colour-difference evaluation* (CIEDE2000).
//! - Sharma, G., Wu, W., Dalal, E. N. (2005), "The CIEDE2000 color-difference formula:
//!   implementation notes, supplementary test data, and mathematical observations",
//!   *Color Res. Appl.* 30(1):21–30. DOI 10.1002/col.20070.

use crate::batch_math::{atan2_in_place, exp_in_place, sin_in_place};
use crate::error::{ColorError, Result};
use crate::spaces::{Lab, hue_angle_deg};

/// Hue differences within this many degrees of 180° count as exactly 180°.
///
/// At exactly 180° CIEDE2000's mean hue switches branch (Sharma et al. 2005,
/// observation on the discontinuity; their test pair 14 sits on it). For two
/// exactly opposite hues `atan2` may return angles whose difference is 180° ±
/// a few ulp, which would pick the branch by rounding; treating such ties as
/// 180° gives the answer of exact arithmetic, as tabulated by Sharma et al.
const HUE_TIE_DEG: f64 = 1e-9;

/// √(a² + b²). Lab components are far from overflow, so this skips the
/// scaling `hypot` does (which costs several times more).
fn chroma(a: f64, b: f64) -> f64 {
    (a * a + b * b).sqrt()
}

/// CIE 1976 colour difference ΔE*ab: the Euclidean distance in CIELAB.
///
/// # References
/// CIE 15:2018 §8.3.1, eq. 8.19.
#[must_use]
pub fn delta_e_cie1976(lab1: Lab, lab2: Lab) -> f64 {
    let (dl, da, db) = (lab2.l - lab1.l, lab2.a - lab1.a, lab2.b - lab1.b);
    (dl * dl + da * da + db * db).sqrt()
}

/// Application constants of ΔE*94: kL, K1, K2 (kC = kH = 1, SL = 1).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cie1994Weights {
    k_l: f64,
    k1: f64,
    k2: f64,
}

impl Cie1994Weights {
    /// Graphic arts: kL = 1, K1 = 0.045, K2 = 0.015 (CIE 116-1995).
    pub const GRAPHIC_ARTS: Cie1994Weights = Cie1994Weights {
        k_l: 1.0,
        k1: 0.045,
        k2: 0.015,
    };
    /// Textiles: kL = 2, K1 = 0.048, K2 = 0.014 (CIE 116-1995).
    pub const TEXTILES: Cie1994Weights = Cie1994Weights {
        k_l: 2.0,
        k1: 0.048,
        k2: 0.014,
    };

    /// Other constants; kL must be positive and K1, K2 non-negative and finite.
    pub fn new(k_l: f64, k1: f64, k2: f64) -> Result<Cie1994Weights> {
        if !(k_l.is_finite() && k_l > 0.0) {
            return Err(ColorError::OutOfRange {
                what: "ΔE94 kL",
                value: k_l,
                range: "> 0",
            });
        }
        for (what, v) in [("ΔE94 K1", k1), ("ΔE94 K2", k2)] {
            if !(v.is_finite() && v >= 0.0) {
                return Err(ColorError::OutOfRange {
                    what,
                    value: v,
                    range: "≥ 0",
                });
            }
        }
        Ok(Cie1994Weights { k_l, k1, k2 })
    }
}

/// CIE 1994 colour difference ΔE*94 with the graphic-arts constants
/// (kL = 1, K1 = 0.045, K2 = 0.015). `reference` is the standard colour:
/// its chroma C*ab,1 sets SC = 1 + K1·C*ab,1 and SH = 1 + K2·C*ab,1, so the
/// function is not symmetric.
///
/// # References
/// CIE 116-1995; CIE 15:2018 §8.3.2.
#[must_use]
pub fn delta_e_cie1994(reference: Lab, sample: Lab) -> f64 {
    delta_e_cie1994_weighted(reference, sample, Cie1994Weights::GRAPHIC_ARTS)
}

/// ΔE*94 with chosen application constants; see [`delta_e_cie1994`].
#[must_use]
pub fn delta_e_cie1994_weighted(reference: Lab, sample: Lab, weights: Cie1994Weights) -> f64 {
    let c1 = chroma(reference.a, reference.b);
    let c2 = chroma(sample.a, sample.b);
    let dl = reference.l - sample.l;
    let dc = c1 - c2;
    let (da, db) = (reference.a - sample.a, reference.b - sample.b);
    // ΔH² = Δa² + Δb² − ΔC², which rounding can push a hair below zero.
    let dh2 = (da * da + db * db - dc * dc).max(0.0);
    let sc = 1.0 + weights.k1 * c1;
    let sh = 1.0 + weights.k2 * c1;
    let tl = dl / weights.k_l;
    let tc = dc / sc;
    (tl * tl + tc * tc + dh2 / (sh * sh)).sqrt()
}

/// Parametric factors kL, kC, kH of CIEDE2000 (all 1 under the reference conditions).
#[derive(Debug, Clone, Copy, PartialEq)]
#[allow(clippy::struct_field_names)] // kL, kC, kH are the published symbols.
pub struct Ciede2000Weights {
    k_l: f64,
    k_c: f64,
    k_h: f64,
}

impl Default for Ciede2000Weights {
    fn default() -> Self {
        Ciede2000Weights::REFERENCE
    }
}

impl Ciede2000Weights {
    /// kL = kC = kH = 1 (CIE 142-2001 reference conditions).
    pub const REFERENCE: Ciede2000Weights = Ciede2000Weights {
        k_l: 1.0,
        k_c: 1.0,
        k_h: 1.0,
    };

    /// Other factors; each must be positive and finite (common practice for
    /// textiles is kL = 2).
    pub fn new(k_l: f64, k_c: f64, k_h: f64) -> Result<Ciede2000Weights> {
        for (what, v) in [
            ("CIEDE2000 kL", k_l),
            ("CIEDE2000 kC", k_c),
            ("CIEDE2000 kH", k_h),
        ] {
            if !(v.is_finite() && v > 0.0) {
                return Err(ColorError::OutOfRange {
                    what,
                    value: v,
                    range: "> 0",
                });
            }
        }
        Ok(Ciede2000Weights { k_l, k_c, k_h })
    }
}

/// CIEDE2000 colour difference ΔE00 with kL = kC = kH = 1. Symmetric in its
/// arguments.
///
/// # References
/// CIE 142-2001; CIE 15:2018 §8.3.3; Sharma, Wu & Dalal (2005),
/// DOI 10.1002/col.20070 (eqs. 1–22 and their implementation notes, which this
/// follows, including h′ = 0 for a′ = b = 0 and the zero-chroma rules for Δh′ and h̄′).
#[must_use]
pub fn delta_e_ciede2000(lab1: Lab, lab2: Lab) -> f64 {
    delta_e_ciede2000_weighted(lab1, lab2, Ciede2000Weights::REFERENCE)
}

/// CIEDE2000 hue difference Δh′ and mean hue h̄′ in degrees from h′1, h′2 in
/// [0, 360) and the product C′1·C′2 (Sharma et al. 2005, eqs. 10 and 14, with
/// their zero-chroma rules: Δh′ = 0 and h̄′ = h′1 + h′2).
fn hue_difference_and_mean(h1: f64, h2: f64, chroma_product: f64) -> (f64, f64) {
    let h_sum = h1 + h2;
    if chroma_product == 0.0 {
        return (0.0, h_sum);
    }
    let d = h2 - h1;
    if d.abs() <= 180.0 + HUE_TIE_DEG {
        (d, f64::midpoint(h1, h2))
    } else {
        let dh = if d > 180.0 { d - 360.0 } else { d + 360.0 };
        let mean = if h_sum < 360.0 {
            f64::midpoint(h_sum, 360.0)
        } else {
            f64::midpoint(h_sum, -360.0)
        };
        (dh, mean)
    }
}

/// CIEDE2000 hue weighting (Sharma et al. 2005 eq. 15) from the sine and
/// cosine of h̄′, by the multiple-angle identities:
/// T(h̄′) = 1 − 0.17 cos(h̄′ − 30°) + 0.24 cos 2h̄′ + 0.32 cos(3h̄′ + 6°) − 0.20 cos(4h̄′ − 63°).
fn hue_weight_t(s1: f64, c1: f64) -> f64 {
    // cos/sin of 30°, 6°, 63°.
    const C30: f64 = 0.866_025_403_784_438_6;
    const S30: f64 = 0.5;
    const C6: f64 = 0.994_521_895_368_273_3;
    const S6: f64 = 0.104_528_463_267_653_47;
    const C63: f64 = 0.453_990_499_739_546_8;
    const S63: f64 = 0.891_006_524_188_367_9;
    let (c2, s2) = (2.0 * c1 * c1 - 1.0, 2.0 * s1 * c1);
    let (c3, s3) = (c1 * (4.0 * c1 * c1 - 3.0), s1 * (3.0 - 4.0 * s1 * s1));
    let (c4, s4) = (2.0 * c2 * c2 - 1.0, 2.0 * s2 * c2);
    1.0 - 0.17 * (c1 * C30 + s1 * S30) + 0.24 * c2 + 0.32 * (c3 * C6 - s3 * S6)
        - 0.20 * (c4 * C63 + s4 * S63)
}

/// Below this length of the sum of the two unit hue vectors the hues are
/// treated as (nearly) opposite and the angle-based rules decide the mean hue.
const OPPOSITE_HUES: f64 = 1e-6;

/// ΔH′, h̄′ (degrees, [0, 360)) and (sin h̄′, cos h̄′) of two colours with
/// non-zero chroma whose hues are not opposite, without hue angles:
/// ΔH′ = 2√(C′1C′2)·sin(Δh′/2), with sin Δh′ and cos Δh′ from the cross and
/// dot products of the unit hue vectors; h̄′ is the direction of their sum,
/// which bisects the shorter arc, as Sharma et al.'s rules for h̄′ do.
fn hue_terms_by_vectors(
    one: (f64, f64, f64),
    two: (f64, f64, f64),
) -> Option<(f64, f64, (f64, f64))> {
    let v = hue_vector_terms(one, two)?;
    Some((
        v.d_big_h,
        mean_hue_deg(v.sb.atan2(v.sa)),
        (v.sin_h, v.cos_h),
    ))
}

/// What the hue vectors give without an angle: ΔH′ and the sum of the unit
/// hue vectors (its direction is h̄′).
#[derive(Debug, Clone, Copy)]
struct HueVectorTerms {
    d_big_h: f64,
    /// Sum of the unit hue vectors, a′ and b′ components.
    sa: f64,
    sb: f64,
    sin_h: f64,
    cos_h: f64,
}

/// [`HueVectorTerms`] of two colours with non-zero chroma; `None` when their
/// hues are (nearly) opposite.
fn hue_vector_terms(one: (f64, f64, f64), two: (f64, f64, f64)) -> Option<HueVectorTerms> {
    let (terms, norm) = hue_vector_terms_unchecked(one, two);
    (norm >= OPPOSITE_HUES).then_some(terms)
}

/// [`hue_vector_terms`] without the checks, and the length of the hue-vector
/// sum (meaningless unless both chromas are positive and the length is at
/// least [`OPPOSITE_HUES`]). Branch-free, so that many pairs vectorise.
#[allow(clippy::inline_always)] // inlines into the vectorised batch loop
#[inline(always)]
fn hue_vector_terms_unchecked(
    (a1p, b1, c1p): (f64, f64, f64),
    (a2p, b2, c2p): (f64, f64, f64),
) -> (HueVectorTerms, f64) {
    let (u1a, u1b) = (a1p / c1p, b1 / c1p);
    let (u2a, u2b) = (a2p / c2p, b2 / c2p);
    let (sa, sb) = (u1a + u2a, u1b + u2b);
    let norm = chroma(sa, sb);
    // sin Δh′ and cos Δh′ of the unit vectors; sin(Δh′/2) by whichever
    // half-angle form is well conditioned (no cancellation for small Δh′).
    let cross = u1a * u2b - u1b * u2a;
    let dot = u1a * u2a + u1b * u2b;
    let half_sin = if dot >= 0.0 {
        cross / (2.0 * (1.0 + dot)).sqrt()
    } else {
        (0.5 * (1.0 - dot)).sqrt().copysign(cross)
    };
    (
        HueVectorTerms {
            d_big_h: 2.0 * (c1p * c2p).sqrt() * half_sin,
            sa,
            sb,
            sin_h: sb / norm,
            cos_h: sa / norm,
        },
        norm,
    )
}

/// h̄′ in degrees, [0, 360), from the angle of the hue-vector sum (radians).
fn mean_hue_deg(angle_rad: f64) -> f64 {
    let mut h_bar = angle_rad.to_degrees();
    if h_bar < 0.0 {
        h_bar += 360.0;
    }
    if h_bar >= 360.0 {
        h_bar -= 360.0;
    }
    h_bar
}

/// ΔH′, h̄′ and (sin h̄′, cos h̄′) from hue angles, with Sharma et al.'s rules
/// for zero chroma and opposite hues.
fn hue_terms_by_angles(
    (a1p, b1, c1p): (f64, f64, f64),
    (a2p, b2, c2p): (f64, f64, f64),
) -> (f64, f64, (f64, f64)) {
    let hue = |ap: f64, b: f64| {
        if ap == 0.0 && b == 0.0 {
            0.0
        } else {
            hue_angle_deg(ap, b)
        }
    };
    let chroma_product = c1p * c2p;
    let (dhp, h_bar) = hue_difference_and_mean(hue(a1p, b1), hue(a2p, b2), chroma_product);
    let d_big_h = 2.0 * chroma_product.sqrt() * (dhp.to_radians() / 2.0).sin();
    (d_big_h, h_bar, h_bar.to_radians().sin_cos())
}

/// CIEDE2000 with chosen parametric factors; see [`delta_e_ciede2000`].
#[must_use]
pub fn delta_e_ciede2000_weighted(lab1: Lab, lab2: Lab, weights: Ciede2000Weights) -> f64 {
    ciede2000(lab1, lab2, weights, true)
}

/// CIEDE2000; `by_vectors` takes the hue terms from the hue vectors where
/// they are defined (same result, fewer trigonometric calls) instead of from
/// the hue angles everywhere.
fn ciede2000(lab1: Lab, lab2: Lab, weights: Ciede2000Weights, by_vectors: bool) -> f64 {
    let p = Primed::of(lab1, lab2);
    let (d_big_h, h_bar, (sin_h, cos_h)) = (by_vectors && p.one.2 > 0.0 && p.two.2 > 0.0)
        .then(|| hue_terms_by_vectors(p.one, p.two))
        .flatten()
        .unwrap_or_else(|| hue_terms_by_angles(p.one, p.two));
    let rotation_sin = (2.0 * rotation_deg(h_bar)).to_radians().sin();
    p.finish(d_big_h, (sin_h, cos_h), rotation_sin, weights)
}

/// Δθ of the rotation term, degrees: 30·exp(−((h̄′ − 275°)/25°)²).
fn rotation_deg(h_bar: f64) -> f64 {
    30.0 * (-((h_bar - 275.0) / 25.0).powi(2)).exp()
}

/// The two colours with a′ rescaled (Sharma et al. 2005, eqs. 2–6).
struct Primed {
    lab1: Lab,
    lab2: Lab,
    /// (a′, b, C′) of each colour.
    one: (f64, f64, f64),
    two: (f64, f64, f64),
}

impl Primed {
    #[allow(clippy::inline_always)] // inlines into the vectorised batch loop
    #[inline(always)]
    fn of(lab1: Lab, lab2: Lab) -> Primed {
        const POW25_7: f64 = 6_103_515_625.0; // 25⁷
        let c1 = chroma(lab1.a, lab1.b);
        let c2 = chroma(lab2.a, lab2.b);
        let c_bar7 = f64::midpoint(c1, c2).powi(7);
        let g = 0.5 * (1.0 - (c_bar7 / (c_bar7 + POW25_7)).sqrt());
        let a1p = (1.0 + g) * lab1.a;
        let a2p = (1.0 + g) * lab2.a;
        Primed {
            lab1,
            lab2,
            one: (a1p, lab1.b, chroma(a1p, lab1.b)),
            two: (a2p, lab2.b, chroma(a2p, lab2.b)),
        }
    }

    /// ΔE00 from ΔH′, (sin h̄′, cos h̄′) and sin(2Δθ) (eqs. 7–22).
    #[allow(clippy::inline_always)] // inlines into the vectorised batch loop
    #[inline(always)]
    fn finish(
        &self,
        d_big_h: f64,
        (sin_h, cos_h): (f64, f64),
        rotation_sin: f64,
        weights: Ciede2000Weights,
    ) -> f64 {
        const POW25_7: f64 = 6_103_515_625.0; // 25⁷
        let (lab1, lab2) = (self.lab1, self.lab2);
        let (c1p, c2p) = (self.one.2, self.two.2);
        let dl = lab2.l - lab1.l;
        let dc = c2p - c1p;
        let l_bar = f64::midpoint(lab1.l, lab2.l);
        let c_bar_p = f64::midpoint(c1p, c2p);
        let t = hue_weight_t(sin_h, cos_h);
        let c_bar_p7 = c_bar_p.powi(7);
        let r_c = 2.0 * (c_bar_p7 / (c_bar_p7 + POW25_7)).sqrt();
        let l50 = (l_bar - 50.0).powi(2);
        let s_l = 1.0 + 0.015 * l50 / (20.0 + l50).sqrt();
        let s_c = 1.0 + 0.045 * c_bar_p;
        let s_h = 1.0 + 0.015 * c_bar_p * t;
        let r_t = -rotation_sin * r_c;
        let tl = dl / (weights.k_l * s_l);
        let tc = dc / (weights.k_c * s_c);
        let th = d_big_h / (weights.k_h * s_h);
        // The quadratic form is positive semi-definite (|R_T| ≤ 2); clamp rounding.
        (tl * tl + tc * tc + th * th + r_t * tc * th)
            .max(0.0)
            .sqrt()
    }
}

/// CIEDE2000 (kL = kC = kH = 1) of many pairs: the same as
/// [`delta_e_ciede2000`] on each pair (to a few units in the last place),
/// with the `atan2`, `exp` and `sin` of all pairs computed together by the
/// vectorised [`crate::batch_math`]. Pairs whose hue terms need the angle
/// rules (a neutral colour, opposite hues) take the one-pair path.
#[must_use]
pub fn delta_e_ciede2000_many(pairs: &[(Lab, Lab)]) -> Vec<f64> {
    let weights = Ciede2000Weights::REFERENCE;
    // Stage 1, branch-free over all pairs: primed chromas and hue-vector terms.
    let primed: Vec<Primed> = pairs.iter().map(|(a, b)| Primed::of(*a, *b)).collect();
    let (terms, valid): (Vec<HueVectorTerms>, Vec<bool>) = primed
        .iter()
        .map(|p| {
            let (t, norm) = hue_vector_terms_unchecked(p.one, p.two);
            (t, p.one.2 > 0.0 && p.two.2 > 0.0 && norm >= OPPOSITE_HUES)
        })
        .unzip();
    // Stage 2: h̄′ from atan2, the rotation Δθ from exp, sin 2Δθ.
    let mut angle: Vec<f64> = terms.iter().map(|t| t.sb).collect();
    let across: Vec<f64> = terms.iter().map(|t| t.sa).collect();
    atan2_in_place(&mut angle, &across);
    let mut gauss: Vec<f64> = angle
        .iter()
        .map(|a| -((mean_hue_deg(*a) - 275.0) / 25.0).powi(2))
        .collect();
    exp_in_place(&mut gauss);
    let mut rotation: Vec<f64> = gauss
        .iter()
        .map(|g| (2.0 * 30.0 * g).to_radians())
        .collect();
    sin_in_place(&mut rotation);
    // Stage 3: the weighted quadratic form; pairs that need the angle rules
    // (a neutral colour, opposite hues) take the one-pair path.
    let mut out: Vec<f64> = primed
        .iter()
        .zip(&terms)
        .zip(&rotation)
        .map(|((p, t), r)| p.finish(t.d_big_h, (t.sin_h, t.cos_h), *r, weights))
        .collect();
    for ((o, ok), (lab1, lab2)) in out.iter_mut().zip(&valid).zip(pairs) {
        if !ok {
            *o = ciede2000(*lab1, *lab2, weights, true);
        }
    }
    out
}

/// Whether ΔE00 (kL = 1) between two colours is surely at least `threshold`,
/// judged from lightness alone with no division or square root: the rest of
/// the quadratic form, ΔC′² + ΔH′² + `R_T`·ΔC′·ΔH′ (scaled) with |`R_T`| ≤ 2, is
/// never negative, so ΔE00 ≥ |ΔL| / `S_L`; and `S_L` = 1 + 0.015·d²/√(20 + d²)
/// ≤ 1 + 0.015·d with d = |L̄ − 50|. True when |ΔL| ≥ threshold·(1 + 0.015·d),
/// with a relative margin of 1e-12 for rounding. A screen for pairwise
/// searches: `false` says nothing.
#[must_use]
pub fn ciede2000_surely_at_least(lab1: Lab, lab2: Lab, threshold: f64) -> bool {
    let d = (f64::midpoint(lab1.l, lab2.l) - 50.0).abs();
    (lab2.l - lab1.l).abs() >= threshold * (1.0 + 0.015 * d) * (1.0 + 1e-12)
}

#[cfg(test)]
#[allow(clippy::float_cmp)] // Exact zeros and identical results are the properties under test.
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn lab() -> impl Strategy<Value = Lab> {
        (0.0..100.0f64, -128.0..128.0f64, -128.0..128.0f64).prop_map(|(l, a, b)| Lab::new(l, a, b))
    }

    proptest! {
        #[test]
        fn hue_vectors_give_the_angle_formulas_result(l1 in lab(), l2 in lab()) {
            // Two algebraically equal forms of Sharma et al. (2005) eqs. 10–15.
            let w = Ciede2000Weights::REFERENCE;
            let fast = ciede2000(l1, l2, w, true);
            let slow = ciede2000(l1, l2, w, false);
            prop_assert!((fast - slow).abs() <= 1e-9 * slow.max(1.0), "{} vs {}", fast, slow);
            for t in [0.5, 1.0, 3.0] {
                prop_assert!(!ciede2000_surely_at_least(l1, l2, t) || fast >= t);
            }
        }

        #[test]
        fn many_pairs_at_once_equal_one_at_a_time(pairs in proptest::collection::vec((lab(), lab()), 0..40)) {
            // Neutral and identical colours take the one-pair path inside.
            let mut pairs = pairs;
            pairs.push((Lab::new(50.0, 0.0, 0.0), Lab::new(60.0, 10.0, -5.0)));
            pairs.push((Lab::new(50.0, 20.0, 0.0), Lab::new(50.0, -20.0, 0.0)));
            pairs.push((Lab::new(70.0, 5.0, 5.0), Lab::new(70.0, 5.0, 5.0)));
            let many = delta_e_ciede2000_many(&pairs);
            prop_assert_eq!(many.len(), pairs.len());
            for ((a, b), got) in pairs.iter().zip(&many) {
                let want = delta_e_ciede2000(*a, *b);
                prop_assert!((got - want).abs() <= 1e-12 * want.max(1.0), "{} vs {}", got, want);
            }
        }

        #[test]
        fn near_opposite_and_equal_hues_agree(l in 0.0..100.0f64, c in 0.01..100.0f64, h in 0.0..360.0f64, eps in -1e-5..1e-5f64) {
            let w = Ciede2000Weights::REFERENCE;
            let at = |deg: f64| Lab::new(l, c * deg.to_radians().cos(), c * deg.to_radians().sin());
            for other in [h + 180.0 + eps, h + eps, h + 180.0] {
                let (fast, slow) = (ciede2000(at(h), at(other), w, true), ciede2000(at(h), at(other), w, false));
                prop_assert!((fast - slow).abs() <= 1e-7 * slow.max(1.0), "{} vs {}", fast, slow);
            }
        }
    }

    #[test]
    fn cie1976_is_euclidean() {
        // 3-4-12 → 13 (Pythagorean quadruple).
        let d = delta_e_cie1976(Lab::new(50.0, 0.0, 0.0), Lab::new(53.0, 4.0, 12.0));
        assert!((d - 13.0).abs() < 1e-12);
    }

    #[test]
    fn cie1994_reduces_to_lightness_for_neutrals() {
        // Two neutrals: C = 0, so SC = SH = 1 and ΔE94 = |ΔL| / kL (CIE 116-1995 definitions).
        let (a, b) = (Lab::new(40.0, 0.0, 0.0), Lab::new(43.0, 0.0, 0.0));
        assert!((delta_e_cie1994(a, b) - 3.0).abs() < 1e-12);
        assert!((delta_e_cie1994_weighted(a, b, Cie1994Weights::TEXTILES) - 1.5).abs() < 1e-12);
    }

    #[test]
    fn cie1994_is_asymmetric_by_design() {
        let (r, s) = (Lab::new(50.0, 60.0, 0.0), Lab::new(50.0, 0.0, 0.0));
        // Reference chroma 60: SC = 1 + 0.045·60 = 3.7 → ΔE94 = 60/3.7; swapped: SC = 1 → 60.
        assert!((delta_e_cie1994(r, s) - 60.0 / 3.7).abs() < 1e-12);
        assert!((delta_e_cie1994(s, r) - 60.0).abs() < 1e-12);
    }

    #[test]
    fn ciede2000_weights_scale_lightness() {
        // Lightness-only difference at L̄ = 50 (SL = 1): ΔE00 = |ΔL| / kL.
        let (a, b) = (Lab::new(49.0, 0.0, 0.0), Lab::new(51.0, 0.0, 0.0));
        assert!((delta_e_ciede2000(a, b) - 2.0).abs() < 1e-12);
        let w = Ciede2000Weights::new(2.0, 1.0, 1.0).unwrap();
        assert!((delta_e_ciede2000_weighted(a, b, w) - 1.0).abs() < 1e-12);
    }

    #[test]
    fn invalid_weights_are_refused() {
        assert!(Ciede2000Weights::new(0.0, 1.0, 1.0).is_err());
        assert!(Ciede2000Weights::new(1.0, f64::NAN, 1.0).is_err());
        assert!(Cie1994Weights::new(-1.0, 0.045, 0.015).is_err());
        assert!(Cie1994Weights::new(1.0, 0.045, f64::INFINITY).is_err());
        assert!(Cie1994Weights::new(1.0, 0.045, 0.015).is_ok());
    }

    #[test]
    fn negative_zero_a_has_hue_zero() {
        // Sharma et al. (2005) note: h′ = 0 when a′ = b = 0, whatever the sign of zero.
        let d1 = delta_e_ciede2000(Lab::new(50.0, -0.0, 0.0), Lab::new(50.0, 2.0, 1.0));
        let d2 = delta_e_ciede2000(Lab::new(50.0, 0.0, 0.0), Lab::new(50.0, 2.0, 1.0));
        assert_eq!(d1, d2);
    }

    #[test]
    fn hue_weight_matches_direct_form() {
        for i in 0..=720 {
            let h = f64::from(i) * 0.5;
            let direct = 1.0 - 0.17 * (h - 30.0).to_radians().cos()
                + 0.24 * (2.0 * h).to_radians().cos()
                + 0.32 * (3.0 * h + 6.0).to_radians().cos()
                - 0.20 * (4.0 * h - 63.0).to_radians().cos();
            let (s, c) = h.to_radians().sin_cos();
            assert!((hue_weight_t(s, c) - direct).abs() < 1e-14, "{h}");
        }
    }

    #[test]
    fn opposite_hues_take_the_exact_arithmetic_branch() {
        // Sharma et al. (2005) pair 14: h′1 ≈ 90.0345°, h′2 = h′1 + 180° exactly; the
        // mean hue is (h′1 + h′2)/2 ≈ 180.03°. A difference rounded up by a few ulp
        // must not move it to ≈ 0.03°.
        let h1 = 90.034_511_938_077_54;
        for h2 in [h1 + 180.0, h1 + 180.0 + 3e-14, h1 + 180.0 - 3e-14] {
            let (dh, mean) = hue_difference_and_mean(h1, h2, 6.2);
            assert!((mean - 180.0345).abs() < 1e-4, "{h2}: {mean}");
            assert!((dh.abs() - 180.0).abs() < 1e-12);
        }
        // Clearly beyond 180° the other branch applies (eq. 14).
        let (dh, mean) = hue_difference_and_mean(10.0, 200.0, 1.0);
        assert!((dh + 170.0).abs() < 1e-12 && (mean - 285.0).abs() < 1e-12);
        let (dh, mean) = hue_difference_and_mean(200.0, 350.0, 1.0);
        assert!((dh - 150.0).abs() < 1e-12 && (mean - 275.0).abs() < 1e-12);
        let (dh, mean) = hue_difference_and_mean(300.0, 100.0, 1.0);
        assert!((dh - 160.0).abs() < 1e-12 && (mean - 20.0).abs() < 1e-12);
        // Zero chroma: Δh′ = 0, h̄′ = h′1 + h′2.
        assert_eq!(hue_difference_and_mean(0.0, 120.0, 0.0), (0.0, 120.0));
    }

    proptest! {
        #[test]
        fn identical_colours_have_zero_difference(a in lab()) {
            prop_assert_eq!(delta_e_cie1976(a, a), 0.0);
            prop_assert_eq!(delta_e_cie1994(a, a), 0.0);
            prop_assert_eq!(delta_e_ciede2000(a, a), 0.0);
        }

        #[test]
        fn ciede2000_is_symmetric(a in lab(), b in lab()) {
            let (d1, d2) = (delta_e_ciede2000(a, b), delta_e_ciede2000(b, a));
            prop_assert!((d1 - d2).abs() <= 1e-12 * d1.max(1.0), "{d1} vs {d2}");
        }

        #[test]
        fn ciede2000_symmetric_at_opposite_hues(l in 0.0..100.0f64, c in 0.0..100.0f64, h in 0.0..360.0f64) {
            // Exactly opposite hues sit on the mean-hue discontinuity.
            let (s, co) = h.to_radians().sin_cos();
            let (a, b) = (Lab::new(l, c * co, c * s), Lab::new(l, -c * co, -c * s));
            prop_assert!((delta_e_ciede2000(a, b) - delta_e_ciede2000(b, a)).abs() < 1e-12);
        }

        #[test]
        fn differences_are_finite_and_non_negative(a in lab(), b in lab()) {
            for d in [delta_e_cie1976(a, b), delta_e_cie1994(a, b), delta_e_ciede2000(a, b)] {
                prop_assert!(d.is_finite() && d >= 0.0);
            }
        }
    }
}
