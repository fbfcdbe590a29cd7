//! `exp`, `ln`, powers, `atan2` and `sin` over whole arrays, written so that the compiler
//! vectorises them (no calls, no branches in the main loop), and run through
//! `pulp`'s run-time dispatch so that AVX2/FMA is used where the processor
//! has it. They serve the hot loops that apply the same non-linearity to many
//! colours at once (CAM02-UCS of the 99 TM-30 samples, CIELAB cube roots).
//!
//! Method (the classic one of Cody & Waite and of fdlibm):
//! - `exp`: x = k·ln 2 + r with |r| ≤ ½ ln 2 (ln 2 split in a high and a low
//!   part so that r is exact to the last bits), exp r by its Taylor series
//!   to r¹³/13! (truncation below 4e-18 relative), times 2ᵏ built in the
//!   exponent bits.
//! - `ln`: x = m·2ᵉ with m in [√½, √2); with s = (m − 1)/(m + 1),
//!   ln m = 2·atanh s = 2s·(1 + s²/3 + s⁴/5 + …) to s²²/23 (truncation below
//!   1e-18 for |s| ≤ 0.1716), plus e·ln 2 in two parts.
//! - Inputs the fast path does not cover (zero, subnormal, negative, infinite
//!   or NaN for `ln`; beyond ±708 for `exp`) are recomputed afterwards with
//!   the standard library, lane by lane, so every input gets the standard
//!   answer's meaning.
//!
//! Polynomials are evaluated by Estrin's scheme (pairs, then pairs of pairs:
//! a short chain of dependent steps instead of Horner's one step a term),
//! with fused multiply–adds where the instruction set has them.
//!
//! Accuracy: within 4 × 10⁻¹⁶ relative (two to three units in the last place)
//! of the standard library on the unit
//! tests' samples over the whole range. Reference: W. J. Cody and W. Waite,
//! *Software Manual for the Elementary Functions* (Prentice-Hall, 1980),
//! chapters 5 (ln) and 6 (exp).

/// ln 2 in two parts (fdlibm's split): the high part has trailing zero bits,
/// so k·`LN2_HI` is exact for |k| < 2¹¹.
const LN2_HI: f64 = f64::from_bits(0x3FE6_2E42_FEE0_0000);
const LN2_LO: f64 = f64::from_bits(0x3DEA_39EF_3579_3C76);
const LOG2_E: f64 = std::f64::consts::LOG2_E;
/// 1.5 · 2⁵²: adding it rounds to an integer held in the low mantissa bits.
const ROUND_SHIFT: f64 = 6_755_399_441_055_744.0;
/// 2⁵² as bits and as a number: builds a double from a small integer.
const TWO52_BITS: u64 = 0x4330_0000_0000_0000;
const TWO52: f64 = 4_503_599_627_370_496.0;
/// Where the fast `exp` stops (2ᵏ stays a normal number).
const EXP_LIMIT: f64 = 708.0;

/// 1/n! for n = 2 … 13.
const EXP_COEFFS: [f64; 12] = [
    1.0 / 2.0,
    1.0 / 6.0,
    1.0 / 24.0,
    1.0 / 120.0,
    1.0 / 720.0,
    1.0 / 5040.0,
    1.0 / 40_320.0,
    1.0 / 362_880.0,
    1.0 / 3_628_800.0,
    1.0 / 39_916_800.0,
    1.0 / 479_001_600.0,
    1.0 / 6_227_020_800.0,
];

/// `a·b + c`, fused (one rounding) when `FUSED`: only instantiated as fused
/// inside kernels compiled for an instruction set with FMA (see [`fused`]).
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn madd<const FUSED: bool>(a: f64, b: f64, c: f64) -> f64 {
    if FUSED { a.mul_add(b, c) } else { a * b + c }
}

/// `c[0] + c[1]·x + … + c[11]·x¹¹` by Estrin's scheme: neighbouring
/// coefficients paired with x, the pairs paired with x², those with x⁴
/// and x⁸ — four dependent steps instead of Horner's eleven.
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn estrin12<const FUSED: bool>(x: f64, c: &[f64; 12]) -> f64 {
    let x2 = x * x;
    let x4 = x2 * x2;
    let x8 = x4 * x4;
    let a = |i: usize| madd::<FUSED>(c[i + 1], x, c[i]);
    let b0 = madd::<FUSED>(a(2), x2, a(0));
    let b1 = madd::<FUSED>(a(6), x2, a(4));
    let b2 = madd::<FUSED>(a(10), x2, a(8));
    madd::<FUSED>(b2, x8, madd::<FUSED>(b1, x4, b0))
}

/// `c[0] + … + c[23]·x²³` by Estrin's scheme: two halves of twelve
/// ([`estrin12`]) joined by x¹².
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn estrin24<const FUSED: bool>(x: f64, c: &[f64; 24]) -> f64 {
    let (lo, hi) = c.split_at(12);
    let (lo, hi): (&[f64; 12], &[f64; 12]) = (
        lo.try_into().unwrap_or(&[0.0; 12]),
        hi.try_into().unwrap_or(&[0.0; 12]),
    );
    let x4 = (x * x) * (x * x);
    let x12 = x4 * x4 * x4;
    madd::<FUSED>(estrin12::<FUSED>(x, hi), x12, estrin12::<FUSED>(x, lo))
}

/// Whether the instruction set `S` stands for has fused multiply–add (the
/// AVX2 level on x86-64, every 64-bit ARM). Elsewhere a fused multiply–add
/// would be a slow library call, so kernels use a multiply and an add.
fn fused<S: pulp::Simd>() -> bool {
    #[cfg(target_arch = "x86_64")]
    {
        std::any::TypeId::of::<S>() == std::any::TypeId::of::<pulp::x86::V3>()
    }
    #[cfg(target_arch = "aarch64")]
    {
        true
    }
    #[cfg(not(any(target_arch = "x86_64", target_arch = "aarch64")))]
    {
        false
    }
}

/// exp for |x| ≤ 708 (no special cases).
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn exp_core<const FUSED: bool>(x: f64) -> f64 {
    let x = x.clamp(-EXP_LIMIT, EXP_LIMIT);
    let shifted = x * LOG2_E + ROUND_SHIFT;
    let k = shifted - ROUND_SHIFT;
    let r = (x - k * LN2_HI) - k * LN2_LO;
    let p = estrin12::<FUSED>(r, &EXP_COEFFS);
    let e_r = 1.0 + madd::<FUSED>(r * r, p, r);
    // k sits in the low bits of `shifted`; 2ᵏ is (k + 1023) in the exponent field.
    let k_int = shifted.to_bits().wrapping_sub(ROUND_SHIFT.to_bits());
    let scale = f64::from_bits(k_int.wrapping_add(1023) << 52);
    e_r * scale
}

/// 1/(2n + 1) for n = 1 … 11 (and a zero: twelve terms for [`estrin12`]).
const LN_COEFFS: [f64; 12] = [
    1.0 / 3.0,
    1.0 / 5.0,
    1.0 / 7.0,
    1.0 / 9.0,
    1.0 / 11.0,
    1.0 / 13.0,
    1.0 / 15.0,
    1.0 / 17.0,
    1.0 / 19.0,
    1.0 / 21.0,
    1.0 / 23.0,
    0.0,
];

/// ln for positive normal finite x (no special cases).
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn ln_core<const FUSED: bool>(x: f64) -> f64 {
    let bits = x.to_bits();
    let mantissa = f64::from_bits((bits & 0x000F_FFFF_FFFF_FFFF) | 0x3FF0_0000_0000_0000);
    let exponent_field = f64::from_bits(TWO52_BITS | (bits >> 52)) - TWO52;
    let high = mantissa > std::f64::consts::SQRT_2;
    let m = if high { mantissa * 0.5 } else { mantissa };
    let e = exponent_field - 1023.0 + if high { 1.0 } else { 0.0 };
    let s = (m - 1.0) / (m + 1.0);
    let z = s * s;
    let p = estrin12::<FUSED>(z, &LN_COEFFS);
    let ln_m = 2.0 * s + 2.0 * s * z * p;
    e * LN2_HI + (e * LN2_LO + ln_m)
}

/// Runs `fused` or `plain` (the same function with and without fused
/// multiply–adds) over `x` in place under the best instruction set
/// available; both are function items, so they inline into the dispatched loop.
fn in_place<F: Fn(f64) -> f64, G: Fn(f64) -> f64>(x: &mut [f64], fused: F, plain: G) {
    pulp::Arch::new().dispatch(Unary { x, fused, plain });
}

/// `x[i] = f(x[i])` as a pulp kernel. A kernel type (rather than a closure)
/// is always inlined into pulp's feature-enabled entry point, so the loop
/// is compiled for the chosen instruction set.
struct Unary<'a, F, G> {
    x: &'a mut [f64],
    fused: F,
    plain: G,
}

impl<F: Fn(f64) -> f64, G: Fn(f64) -> f64> pulp::WithSimd for Unary<'_, F, G> {
    type Output = ();
    #[allow(clippy::inline_always)] // must inline into the dispatched function
    #[inline(always)]
    fn with_simd<S: pulp::Simd>(self, _simd: S) {
        if fused::<S>() {
            for v in self.x.iter_mut() {
                *v = (self.fused)(*v);
            }
        } else {
            for v in self.x.iter_mut() {
                *v = (self.plain)(*v);
            }
        }
    }
}

/// `y[i] = f(y[i], x[i])` as a pulp kernel (see [`Unary`]).
struct Binary<'a, F, G> {
    y: &'a mut [f64],
    x: &'a [f64],
    fused: F,
    plain: G,
}

impl<F: Fn(f64, f64) -> f64, G: Fn(f64, f64) -> f64> pulp::WithSimd for Binary<'_, F, G> {
    type Output = ();
    #[allow(clippy::inline_always)] // must inline into the dispatched function
    #[inline(always)]
    fn with_simd<S: pulp::Simd>(self, _simd: S) {
        if fused::<S>() {
            for (v, x) in self.y.iter_mut().zip(self.x) {
                *v = (self.fused)(*v, *x);
            }
        } else {
            for (v, x) in self.y.iter_mut().zip(self.x) {
                *v = (self.plain)(*v, *x);
            }
        }
    }
}

/// `exp` of every element, in place.
pub fn exp_in_place(x: &mut [f64]) {
    // The common case has no special values: no copy needed to fix them up.
    if x.iter().all(|v| v.abs() <= EXP_LIMIT) {
        in_place(x, exp_core::<true>, exp_core::<false>);
        return;
    }
    let original: Vec<f64> = x.to_vec();
    in_place(x, exp_core::<true>, exp_core::<false>);
    for (v, o) in x.iter_mut().zip(original) {
        if o.is_nan() || o.abs() > EXP_LIMIT {
            *v = o.exp();
        }
    }
}

/// Whether `ln_core` covers `v` (positive, normal, finite).
fn ln_covers(v: f64) -> bool {
    v.is_normal() && v > 0.0
}

/// `ln` of every element, in place.
pub fn ln_in_place(x: &mut [f64]) {
    if x.iter().all(|v| ln_covers(*v)) {
        in_place(x, ln_core::<true>, ln_core::<false>);
        return;
    }
    let original: Vec<f64> = x.to_vec();
    in_place(x, ln_core::<true>, ln_core::<false>);
    for (v, o) in x.iter_mut().zip(original) {
        if !ln_covers(o) {
            *v = o.ln();
        }
    }
}

/// `x^p` for positive normal x and |p| ≤ 0.95 as one kernel: |p·ln x| stays
/// within `exp_core`'s range, so no fix-up is needed.
struct PowKernel<'a> {
    x: &'a mut [f64],
    p: f64,
}

impl pulp::WithSimd for PowKernel<'_> {
    type Output = ();
    #[allow(clippy::inline_always)] // must inline into the dispatched function
    #[inline(always)]
    fn with_simd<S: pulp::Simd>(self, _simd: S) {
        let p = self.p;
        if fused::<S>() {
            for v in self.x.iter_mut() {
                *v = exp_core::<true>(p * ln_core::<true>(*v));
            }
        } else {
            for v in self.x.iter_mut() {
                *v = exp_core::<false>(p * ln_core::<false>(*v));
            }
        }
    }
}

/// `x^p` of every element for x ≥ 0 (as `exp(p·ln x)`), 0 for x ≤ 0 and NaN
/// for NaN, in place.
pub fn pow_nonnegative_in_place(x: &mut [f64], p: f64) {
    // One pass, no copies, when every value is in the kernel's range (the
    // same operations as the general path, so the same results).
    if p.abs() <= 0.95 && x.iter().all(|v| ln_covers(*v)) {
        pulp::Arch::new().dispatch(PowKernel { x, p });
        return;
    }
    let original: Vec<f64> = x.to_vec();
    ln_in_place(x);
    for v in x.iter_mut() {
        *v *= p;
    }
    exp_in_place(x);
    for (v, o) in x.iter_mut().zip(original) {
        if o <= 0.0 {
            *v = 0.0;
        }
    }
}

/// (−1)ⁿ/(2n + 1) for n = 1 … 23: atan u = u·(1 + Σ cₙ u²ⁿ) for |u| ≤ √2 − 1
/// (truncation below 1e-18), and a zero: 24 terms for [`estrin24`].
const ATAN_COEFFS: [f64; 24] = {
    let mut c = [0.0; 24];
    let mut n = 0;
    while n < 23 {
        let sign = if n % 2 == 0 { -1.0 } else { 1.0 };
        c[n] = sign / (2 * n + 3) as f64;
        n += 1;
    }
    c
};

/// atan2 for finite (y, x) not both zero (no special cases).
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn atan2_core<const FUSED: bool>(y: f64, x: f64) -> f64 {
    use std::f64::consts::{FRAC_PI_2, FRAC_PI_4, PI};
    let (ax, ay) = (x.abs(), y.abs());
    let swap = ay > ax;
    let (num, den) = if swap { (ax, ay) } else { (ay, ax) };
    let t = num / den;
    // atan t = π/4 + atan((t − 1)/(t + 1)) brings t ∈ (√2 − 1, 1] to |u| ≤ √2 − 1.
    let reduce = t > std::f64::consts::SQRT_2 - 1.0;
    let u = if reduce { (t - 1.0) / (t + 1.0) } else { t };
    let z = u * u;
    let p = estrin24::<FUSED>(z, &ATAN_COEFFS);
    let atan_u = u + u * z * p;
    let a = if reduce { FRAC_PI_4 + atan_u } else { atan_u };
    let a = if swap { FRAC_PI_2 - a } else { a };
    let a = if x < 0.0 { PI - a } else { a };
    if y < 0.0 { -a } else { a }
}

/// `atan2(y[i], x[i])` for every i, written over `y`.
///
/// # Panics
/// When `y` and `x` differ in length.
pub fn atan2_in_place(y: &mut [f64], x: &[f64]) {
    assert_eq!(y.len(), x.len(), "atan2_in_place needs equal lengths");
    let original: Vec<f64> = y.to_vec();
    pulp::Arch::new().dispatch(Binary {
        y: &mut *y,
        x,
        fused: atan2_core::<true>,
        plain: atan2_core::<false>,
    });
    for ((v, o), x) in y.iter_mut().zip(original).zip(x) {
        // Zeros (signed), infinities and NaN take the standard answer.
        if !(o.is_finite() && x.is_finite()) || (o == 0.0 || *x == 0.0) {
            *v = o.atan2(*x);
        }
    }
}

/// (−1)ⁿ/(2n + 1)! for n = 1 … 12: sin x = x·(1 + Σ cₙ x²ⁿ) for |x| ≤ π/2
/// (truncation below 1e-21).
const SIN_COEFFS: [f64; 12] = {
    let mut c = [0.0; 12];
    let mut n = 0;
    let mut fact = 1.0;
    let mut k = 1.0;
    while n < 12 {
        // (2n + 3)! from (2n + 1)!
        fact *= (k + 1.0) * (k + 2.0);
        k += 2.0;
        c[n] = if n % 2 == 0 { -1.0 / fact } else { 1.0 / fact };
        n += 1;
    }
    c
};

/// sin for |x| ≤ π/2 (larger arguments are clamped there).
#[allow(clippy::inline_always)] // must inline into the dispatched loop to vectorise
#[inline(always)]
fn sin_core<const FUSED: bool>(v: f64) -> f64 {
    let t = v.clamp(-std::f64::consts::FRAC_PI_2, std::f64::consts::FRAC_PI_2);
    let z = t * t;
    let p = estrin12::<FUSED>(z, &SIN_COEFFS);
    t + t * z * p
}

/// `sin` of every element, in place (the series for |x| ≤ π/2, the standard
/// library beyond).
pub fn sin_in_place(x: &mut [f64]) {
    let original: Vec<f64> = x.to_vec();
    in_place(x, sin_core::<true>, sin_core::<false>);
    for (v, o) in x.iter_mut().zip(original) {
        if o.is_nan() || o.abs() > std::f64::consts::FRAC_PI_2 {
            *v = o.sin();
        }
    }
}

#[cfg(test)]
#[allow(clippy::float_cmp)] // Exact special values are the properties under test.
mod tests {
    use super::*;

    /// Deterministic samples spread over `lo..hi` (log-spaced when `log`).
    fn samples(lo: f64, hi: f64, n: usize, log: bool) -> Vec<f64> {
        (0..n)
            .map(|i| {
                // A fixed irrational stride visits the interval evenly.
                let u = (i as f64 * 0.618_033_988_749_894_9).fract();
                if log {
                    (lo.ln() + u * (hi.ln() - lo.ln())).exp()
                } else {
                    lo + u * (hi - lo)
                }
            })
            .collect()
    }

    fn worst_relative(got: &[f64], want: &[f64]) -> f64 {
        got.iter()
            .zip(want)
            .map(|(g, w)| if g == w { 0.0 } else { (g - w).abs() / w.abs() })
            .fold(0.0, f64::max)
    }

    #[test]
    fn exp_matches_the_standard_library() {
        let x = samples(-707.9, 707.9, 20_000, false);
        let mut got = x.clone();
        exp_in_place(&mut got);
        let want: Vec<f64> = x.iter().map(|v| v.exp()).collect();
        let w = worst_relative(&got, &want);
        assert!(w < 2e-16 * 2.0, "worst relative error {w:e}");
        let small = samples(-1.0, 1.0, 5000, false);
        let mut got = small.clone();
        exp_in_place(&mut got);
        let want: Vec<f64> = small.iter().map(|v| v.exp()).collect();
        assert!(worst_relative(&got, &want) < 4e-16);
    }

    #[test]
    fn ln_matches_the_standard_library() {
        let x = samples(1e-300, 1e300, 20_000, true);
        let mut got = x.clone();
        ln_in_place(&mut got);
        let want: Vec<f64> = x.iter().map(|v| v.ln()).collect();
        let w = worst_relative(&got, &want);
        assert!(w < 4e-16, "worst relative error {w:e}");
        // Near 1, where ln is small, the absolute error matters.
        let near = samples(0.9, 1.1, 5000, false);
        let mut got = near.clone();
        ln_in_place(&mut got);
        for (g, v) in got.iter().zip(&near) {
            assert!((g - v.ln()).abs() <= 4e-16 * v.ln().abs() + 1e-19, "{v}");
        }
    }

    #[test]
    fn special_inputs_keep_their_standard_meaning() {
        // The split of ln 2 adds up to it (fdlibm's constants).
        assert!((LN2_HI + LN2_LO - std::f64::consts::LN_2).abs() < 1e-17);
        let mut e = [
            0.0,
            -0.0,
            800.0,
            -800.0,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NAN,
        ];
        exp_in_place(&mut e);
        assert_eq!(e[0], 1.0);
        assert_eq!(e[1], 1.0);
        assert_eq!(e[2], f64::INFINITY);
        assert_eq!(e[3], 0.0);
        assert_eq!(e[4], f64::INFINITY);
        assert_eq!(e[5], 0.0);
        assert!(e[6].is_nan());
        let mut l = [1.0, 0.0, -1.0, 5e-324, f64::INFINITY, f64::NAN, 2.0];
        ln_in_place(&mut l);
        assert_eq!(l[0], 0.0);
        assert_eq!(l[1], f64::NEG_INFINITY);
        assert!(l[2].is_nan());
        assert!((l[3] - 5e-324f64.ln()).abs() < 1e-12);
        assert_eq!(l[4], f64::INFINITY);
        assert!(l[5].is_nan());
        assert_eq!(l[6], std::f64::consts::LN_2);
        let mut p = [0.0, -2.0, 1.0, 8.0, f64::NAN, 0.25];
        pow_nonnegative_in_place(&mut p, 1.0 / 3.0);
        assert_eq!(&p[..3], &[0.0, 0.0, 1.0]);
        assert!((p[3] - 2.0).abs() < 1e-15);
        assert!(p[4].is_nan());
        assert!((p[5] - 0.25f64.powf(1.0 / 3.0)).abs() < 1e-16);
    }

    #[test]
    fn atan2_matches_the_standard_library() {
        let ys = samples(-50.0, 50.0, 4000, false);
        let xs: Vec<f64> = samples(-50.0, 50.0, 4001, false)[1..].to_vec();
        let mut got = ys.clone();
        atan2_in_place(&mut got, &xs);
        for ((g, y), x) in got.iter().zip(&ys).zip(&xs) {
            let want = y.atan2(*x);
            assert!(
                (g - want).abs() <= 8e-16 * want.abs().max(1e-3),
                "atan2({y}, {x}): {g} vs {want}"
            );
        }
        // Axes, diagonals and special values.
        let x = [
            1.0,
            -1.0,
            0.0,
            0.0,
            1.0,
            -1.0,
            0.0,
            f64::INFINITY,
            2.0,
            1e-300,
        ];
        let mut y = [0.0, 0.0, 1.0, -1.0, 1.0, -1.0, 0.0, 1.0, f64::NAN, 1e300];
        let want: Vec<f64> = y.iter().zip(&x).map(|(y, x)| y.atan2(*x)).collect();
        atan2_in_place(&mut y, &x);
        for (g, w) in y.iter().zip(&want) {
            assert!(
                (g - w).abs() < 1e-15 || (g.is_nan() && w.is_nan()),
                "{g} vs {w}"
            );
        }
    }

    #[test]
    fn sin_matches_the_standard_library() {
        let x = samples(-10.0, 10.0, 5000, false);
        let mut got = x.clone();
        sin_in_place(&mut got);
        for (g, v) in got.iter().zip(&x) {
            assert!(
                (g - v.sin()).abs() <= 3e-16 * v.sin().abs().max(1e-3),
                "sin {v}"
            );
        }
        let mut special = [0.0, f64::NAN, f64::INFINITY];
        sin_in_place(&mut special);
        assert_eq!(special[0], 0.0);
        assert!(special[1].is_nan() && special[2].is_nan());
    }

    #[test]
    fn kernels_without_fused_multiply_add_agree() {
        // The plain variant, run as on a processor without FMA (pulp's scalar
        // level; on 64-bit ARM that level is fused too).
        let scalar = pulp::Scalar::new();
        let x = samples(1e-12, 1e6, 4000, true);
        let mut got = x.clone();
        pulp::WithSimd::with_simd(
            PowKernel {
                x: &mut got,
                p: 0.42,
            },
            scalar,
        );
        let want: Vec<f64> = x.iter().map(|v| v.powf(0.42)).collect();
        assert!(worst_relative(&got, &want) < 2e-15);
        let e = samples(-707.9, 707.9, 4000, false);
        let mut got = e.clone();
        pulp::WithSimd::with_simd(
            Unary {
                x: &mut got,
                fused: exp_core::<true>,
                plain: exp_core::<false>,
            },
            scalar,
        );
        let want: Vec<f64> = e.iter().map(|v| v.exp()).collect();
        assert!(worst_relative(&got, &want) < 4e-16);
        let y = samples(-50.0, 50.0, 4000, false);
        let mut got = y.clone();
        let xs: Vec<f64> = samples(-50.0, 50.0, 4001, false)[1..].to_vec();
        pulp::WithSimd::with_simd(
            Binary {
                y: &mut got,
                x: &xs,
                fused: atan2_core::<true>,
                plain: atan2_core::<false>,
            },
            scalar,
        );
        for ((g, y), x) in got.iter().zip(&y).zip(&xs) {
            let want = y.atan2(*x);
            assert!((g - want).abs() <= 8e-16 * want.abs().max(1e-3));
        }
    }

    #[test]
    fn powers_match_powf() {
        let x = samples(1e-12, 1e6, 10_000, true);
        for p in [0.42, 0.9, 1.0 / 3.0, 1.0 / 2.4, 0.73] {
            let mut got = x.clone();
            pow_nonnegative_in_place(&mut got, p);
            let want: Vec<f64> = x.iter().map(|v| v.powf(p)).collect();
            let w = worst_relative(&got, &want);
            assert!(w < 2e-15, "p = {p}: worst relative error {w:e}");
        }
    }
}
