//! Display RGB: sRGB and Display P3, linear and encoded, as distinct types.
//!
//! [`LinearRgb<S>`] holds light-linear values (1 = the display's white) and
//! [`EncodedRgb<S>`] the transfer-encoded values a display receives; the space
//! `S` ([`Srgb`] or [`DisplayP3`]) is part of the type, so values of different
//! spaces or encodings cannot be mixed by accident.
//!
//! XYZ ↔ linear RGB matrices are derived from the primaries and the white
//! chromaticity (SMPTE RP 177 method) rather than copied, and checked against
//! the matrices published with the standard. XYZ is relative to D65 with the
//! white at Y = 1; adapt other whites first (see [`crate::adaptation`]).
//!
//! Conversions from XYZ are `_unclamped`: the result may lie outside [0, 1]
//! ([`LinearRgb::in_gamut`] tells). Only the 8-bit swatch conversion clamps.
//!
//! # References
//! - IEC 61966-2-1:1999, *Default RGB colour space — sRGB*: primaries, D65 white,
//!   transfer function (§5.2, eqs. 5–6 and 8–9) and the XYZ ↔ RGB matrices.
//! - SMPTE EG 432-1:2010, *Digital Source Processing — Color Processing for D-Cinema*
//!   (P3 primaries); W3C CSS Color Module Level 4 (2022), `display-p3`: P3 primaries
//!   with D65 white and the sRGB transfer function, which also extends the
//!   transfer function to negative values by odd symmetry.
//! - SMPTE RP 177-1993, *Derivation of Basic Television Color Equations* (matrix from primaries).

use crate::error::{ColorError, Result};
use crate::tristimulus::Xyz;
use nalgebra::{Matrix3, Vector3};
use std::marker::PhantomData;
use std::sync::LazyLock;

/// Tolerance of [`LinearRgb::in_gamut`]: components in [−1e-6, 1 + 1e-6] count as inside.
pub const GAMUT_TOLERANCE: f64 = 1e-6;

/// CIE 15 chromaticity of D65 as specified by IEC 61966-2-1 (x = 0.3127, y = 0.3290).
pub const D65_XY: (f64, f64) = (0.3127, 0.3290);

/// The two matrices of an RGB space.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RgbMatrices {
    /// Linear RGB → XYZ (white at Y = 1).
    pub rgb_to_xyz: Matrix3<f64>,
    /// XYZ → linear RGB.
    pub xyz_to_rgb: Matrix3<f64>,
}

/// An additive RGB display space: primaries, white and transfer function.
pub trait RgbSpace: Copy + Default + std::fmt::Debug + PartialEq + 'static {
    /// Display name.
    const NAME: &'static str;
    /// Chromaticities (x, y) of the red, green and blue primaries.
    const PRIMARIES_XY: [(f64, f64); 3];
    /// Chromaticity of the white.
    const WHITE_XY: (f64, f64);
    /// Matrices derived from the primaries and white (computed once).
    fn matrices() -> &'static RgbMatrices;
}

/// sRGB (IEC 61966-2-1): primaries R (0.64, 0.33), G (0.30, 0.60), B (0.15, 0.06), D65.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Srgb;

/// Display P3: P3 primaries R (0.680, 0.320), G (0.265, 0.690), B (0.150, 0.060)
/// (SMPTE EG 432-1), D65 white and the sRGB transfer function (CSS Color 4).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct DisplayP3;

static SRGB_MATRICES: LazyLock<RgbMatrices> =
    LazyLock::new(|| matrices_or_identity(Srgb::PRIMARIES_XY, Srgb::WHITE_XY));
static DISPLAY_P3_MATRICES: LazyLock<RgbMatrices> =
    LazyLock::new(|| matrices_or_identity(DisplayP3::PRIMARIES_XY, DisplayP3::WHITE_XY));

fn matrices_or_identity(primaries: [(f64, f64); 3], white: (f64, f64)) -> RgbMatrices {
    // The built-in primaries are valid (tested), so the fallback is never used;
    // it keeps release code free of panics.
    rgb_matrices_from_primaries(primaries, white).unwrap_or(RgbMatrices {
        rgb_to_xyz: Matrix3::identity(),
        xyz_to_rgb: Matrix3::identity(),
    })
}

impl RgbSpace for Srgb {
    const NAME: &'static str = "sRGB";
    const PRIMARIES_XY: [(f64, f64); 3] = [(0.64, 0.33), (0.30, 0.60), (0.15, 0.06)];
    const WHITE_XY: (f64, f64) = D65_XY;
    fn matrices() -> &'static RgbMatrices {
        &SRGB_MATRICES
    }
}

impl RgbSpace for DisplayP3 {
    const NAME: &'static str = "Display P3";
    const PRIMARIES_XY: [(f64, f64); 3] = [(0.680, 0.320), (0.265, 0.690), (0.150, 0.060)];
    const WHITE_XY: (f64, f64) = D65_XY;
    fn matrices() -> &'static RgbMatrices {
        &DISPLAY_P3_MATRICES
    }
}

/// XYZ ↔ linear RGB matrices from primary and white chromaticities: the
/// columns are the primaries' XYZ (Y = 1) scaled so that RGB = (1, 1, 1) gives
/// the white with Y = 1.
///
/// # References
/// SMPTE RP 177-1993 §3.3.
pub fn rgb_matrices_from_primaries(
    primaries_xy: [(f64, f64); 3],
    white_xy: (f64, f64),
) -> Result<RgbMatrices> {
    let xyz_of = |(x, y): (f64, f64)| -> Result<Vector3<f64>> {
        if !(x.is_finite() && y.is_finite() && y > 0.0) {
            return Err(ColorError::InvalidInput(format!(
                "chromaticity ({x}, {y}) cannot define an RGB primary or white"
            )));
        }
        Ok(Vector3::new(x / y, 1.0, (1.0 - x - y) / y))
    };
    let p = Matrix3::from_columns(&[
        xyz_of(primaries_xy[0])?,
        xyz_of(primaries_xy[1])?,
        xyz_of(primaries_xy[2])?,
    ]);
    let w = xyz_of(white_xy)?;
    let singular = || ColorError::Numerical("the primaries are collinear: no RGB space".into());
    let scale = p.try_inverse().ok_or_else(singular)? * w;
    let rgb_to_xyz = p * Matrix3::from_diagonal(&scale);
    let xyz_to_rgb = rgb_to_xyz.try_inverse().ok_or_else(singular)?;
    Ok(RgbMatrices {
        rgb_to_xyz,
        xyz_to_rgb,
    })
}

/// sRGB transfer function, linear → encoded (IEC 61966-2-1 eq. 8 inverse form):
/// 12.92·v for v ≤ 0.0031308, else 1.055·v^(1/2.4) − 0.055. Negative values are
/// mirrored (CSS Color 4 extension).
#[must_use]
pub fn srgb_encode(linear: f64) -> f64 {
    let v = linear.abs();
    let e = if v <= 0.0031308 {
        12.92 * v
    } else {
        1.055 * v.powf(1.0 / 2.4) - 0.055
    };
    e.copysign(linear)
}

/// sRGB transfer function, encoded → linear (IEC 61966-2-1 eqs. 5–6):
/// V/12.92 for V ≤ 0.04045, else ((V + 0.055)/1.055)^2.4. Negative values are mirrored.
#[must_use]
pub fn srgb_decode(encoded: f64) -> f64 {
    let v = encoded.abs();
    let l = if v <= 0.04045 {
        v / 12.92
    } else {
        ((v + 0.055) / 1.055).powf(2.4)
    };
    l.copysign(encoded)
}

/// 8-bit code of one clamped linear value, as [`LinearRgb::to_rgb8_clamped`].
fn code8(linear: f64) -> u8 {
    to_u8(srgb_encode(if linear.is_nan() {
        0.0
    } else {
        linear.clamp(0.0, 1.0)
    }))
}

/// For code k = 1 … 255, the smallest linear value whose 8-bit code is at
/// least k (bisection over the bit patterns of positive doubles, whose order
/// is their numeric order). The code is monotone in the value, so a value's
/// code is the number of thresholds at or below it — exactly what
/// [`code8`] gives, without a power per value.
static CODE8_THRESHOLDS: LazyLock<Vec<f64>> = LazyLock::new(|| {
    (1..=255u16)
        .map(|k| {
            let (mut lo, mut hi) = (0.0f64.to_bits(), 1.0f64.to_bits());
            while hi - lo > 1 {
                let mid = lo + (hi - lo) / 2;
                if u16::from(code8(f64::from_bits(mid))) >= k {
                    hi = mid;
                } else {
                    lo = mid;
                }
            }
            f64::from_bits(hi)
        })
        .collect()
});

/// Buckets of [`CODE8_THRESHOLDS`] over [0, 1]: 2¹² of equal width.
const CODE8_BUCKETS: usize = 4096;

/// Per bucket b, the number of thresholds at or below b/4096: the code of
/// the bucket's lowest value. No bucket holds more than two thresholds (the
/// closest lie 1/(255·12.92) ≈ 3.0e-4 apart, more than a bucket's 2.4e-4).
static CODE8_BUCKET_START: LazyLock<Vec<u8>> = LazyLock::new(|| {
    (0..=CODE8_BUCKETS)
        .map(|b| {
            let v = b as f64 / CODE8_BUCKETS as f64;
            u8::try_from(CODE8_THRESHOLDS.partition_point(|t| *t <= v)).unwrap_or(u8::MAX)
        })
        .collect()
});

/// 8-bit swatch values of many light-linear triples at once, each exactly as
/// [`LinearRgb::to_rgb8_clamped`] gives it (clamped to [0, 1] in linear
/// light, NaN as 0, sRGB-encoded, rounded), by counting the 255 code
/// thresholds at or below the value (from its bucket's start) instead of a
/// power per value.
#[must_use]
pub fn rgb8_clamped_many(linear: &[[f64; 3]]) -> Vec<[u8; 3]> {
    let thresholds = &*CODE8_THRESHOLDS;
    let starts = &*CODE8_BUCKET_START;
    let code = |v: f64| {
        let v = if v.is_nan() { 0.0 } else { v.clamp(0.0, 1.0) };
        // v·4096 is exact, so the bucket's lower edge is at or below v.
        let bucket = (v * CODE8_BUCKETS as f64) as usize;
        let mut code = starts.get(bucket).copied().unwrap_or(u8::MAX);
        while let Some(t) = thresholds.get(usize::from(code)) {
            if *t > v {
                break;
            }
            // Below 255 here: `thresholds` has 255 entries.
            code += 1;
        }
        code
    };
    linear
        .iter()
        .map(|[r, g, b]| [code(*r), code(*g), code(*b)])
        .collect()
}

/// Light-linear RGB in space `S` (1 = the display white's component).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct LinearRgb<S: RgbSpace> {
    /// Red.
    pub r: f64,
    /// Green.
    pub g: f64,
    /// Blue.
    pub b: f64,
    space: PhantomData<S>,
}

/// Transfer-encoded RGB in space `S` (0–1 for displayable colours).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct EncodedRgb<S: RgbSpace> {
    /// Red.
    pub r: f64,
    /// Green.
    pub g: f64,
    /// Blue.
    pub b: f64,
    space: PhantomData<S>,
}

/// Linear sRGB.
pub type LinearSrgb = LinearRgb<Srgb>;
/// Encoded sRGB (what an sRGB display or file expects).
pub type EncodedSrgb = EncodedRgb<Srgb>;
/// Linear Display P3.
pub type LinearDisplayP3 = LinearRgb<DisplayP3>;
/// Encoded Display P3.
pub type EncodedDisplayP3 = EncodedRgb<DisplayP3>;

fn to_u8(encoded: f64) -> u8 {
    // Clamped first, so the cast cannot overflow; NaN casts to 0.
    (encoded.clamp(0.0, 1.0) * 255.0).round() as u8
}

impl<S: RgbSpace> LinearRgb<S> {
    /// From components.
    #[must_use]
    pub const fn new(r: f64, g: f64, b: f64) -> Self {
        LinearRgb {
            r,
            g,
            b,
            space: PhantomData,
        }
    }

    /// Linear RGB of `xyz` (relative to D65, white at Y = 1), not clamped: may be
    /// out of gamut (see [`LinearRgb::in_gamut`]).
    #[must_use]
    pub fn from_xyz_unclamped(xyz: Xyz) -> Self {
        let v = S::matrices().xyz_to_rgb * Vector3::new(xyz.x, xyz.y, xyz.z);
        Self::new(v.x, v.y, v.z)
    }

    /// XYZ relative to D65 with the white at Y = 1.
    #[must_use]
    pub fn to_xyz(self) -> Xyz {
        let v = S::matrices().rgb_to_xyz * Vector3::new(self.r, self.g, self.b);
        Xyz::new(v.x, v.y, v.z)
    }

    /// Whether every component lies in [0, 1] within [`GAMUT_TOLERANCE`].
    #[must_use]
    pub fn in_gamut(self) -> bool {
        [self.r, self.g, self.b]
            .iter()
            .all(|v| (-GAMUT_TOLERANCE..=1.0 + GAMUT_TOLERANCE).contains(v))
    }

    /// Components clamped to [0, 1] (hard clip per channel; changes hue for
    /// out-of-gamut colours).
    #[must_use]
    pub fn clamped(self) -> Self {
        let c = |v: f64| if v.is_nan() { 0.0 } else { v.clamp(0.0, 1.0) };
        Self::new(c(self.r), c(self.g), c(self.b))
    }

    /// Encoded with the sRGB transfer function, not clamped (negative values mirrored).
    #[must_use]
    pub fn encode_unclamped(self) -> EncodedRgb<S> {
        EncodedRgb::new(
            srgb_encode(self.r),
            srgb_encode(self.g),
            srgb_encode(self.b),
        )
    }

    /// 8-bit encoded values for a display swatch: clamped to [0, 1] in linear
    /// light, encoded, rounded to 0–255.
    #[must_use]
    pub fn to_rgb8_clamped(self) -> [u8; 3] {
        let e = self.clamped().encode_unclamped();
        [to_u8(e.r), to_u8(e.g), to_u8(e.b)]
    }
}

impl<S: RgbSpace> EncodedRgb<S> {
    /// From components.
    #[must_use]
    pub const fn new(r: f64, g: f64, b: f64) -> Self {
        EncodedRgb {
            r,
            g,
            b,
            space: PhantomData,
        }
    }

    /// From 8-bit code values (0–255 → 0–1).
    #[must_use]
    pub fn from_rgb8(rgb: [u8; 3]) -> Self {
        let f = |v: u8| f64::from(v) / 255.0;
        Self::new(f(rgb[0]), f(rgb[1]), f(rgb[2]))
    }

    /// Back to linear light.
    #[must_use]
    pub fn decode(self) -> LinearRgb<S> {
        LinearRgb::new(
            srgb_decode(self.r),
            srgb_decode(self.g),
            srgb_decode(self.b),
        )
    }

    /// 8-bit code values, each clamped to [0, 1] and rounded.
    #[must_use]
    pub fn to_rgb8_clamped(self) -> [u8; 3] {
        [to_u8(self.r), to_u8(self.g), to_u8(self.b)]
    }
}

#[cfg(test)]
#[allow(clippy::float_cmp)] // Exact zero and exact mirroring are the properties under test.
mod tests {
    #[test]
    fn many_swatches_equal_one_at_a_time() {
        let mut triples: Vec<[f64; 3]> = (0..20_000)
            .map(|i| {
                let t = f64::from(i) / 19_999.0;
                [t * 1.2 - 0.1, t * t, (1.0 - t).powi(3) * 1.05]
            })
            .collect();
        triples.push([f64::NAN, f64::INFINITY, f64::NEG_INFINITY]);
        triples.push([0.0031308, 0.0031309, 1.0]);
        // Every code boundary and the double just below it.
        for t in CODE8_THRESHOLDS.iter() {
            let below = f64::from_bits(t.to_bits() - 1);
            triples.push([*t, below, *t * 0.5]);
        }
        let many = rgb8_clamped_many(&triples);
        for (t, m) in triples.iter().zip(&many) {
            let one = LinearRgb::<Srgb>::new(t[0], t[1], t[2]).to_rgb8_clamped();
            assert_eq!(*m, one, "{t:?}");
        }
    }

    use super::*;
    use proptest::prelude::*;

    #[test]
    fn srgb_matrix_matches_iec_61966_2_1() {
        // IEC 61966-2-1:1999 eq. 7 (RGB → XYZ), published to 4 decimals.
        let iec = Matrix3::new(
            0.4124, 0.3576, 0.1805, //
            0.2126, 0.7152, 0.0722, //
            0.0193, 0.1192, 0.9505,
        );
        let m = Srgb::matrices().rgb_to_xyz;
        assert!((m - iec).amax() < 5e-5, "{m}");
        // IEC 61966-2-1 XYZ → RGB (eq. 9 inverse), published to 4 decimals. The
        // standard computed it from the rounded forward matrix, so ours (from the
        // exact primaries) differs by up to 4e-4; the inverse of the published
        // forward matrix reproduces the published inverse to rounding.
        let iec_inv = Matrix3::new(
            3.2406, -1.5372, -0.4986, //
            -0.9689, 1.8758, 0.0415, //
            0.0557, -0.2040, 1.0570,
        );
        assert!((Srgb::matrices().xyz_to_rgb - iec_inv).amax() < 5e-4);
        assert!((iec.try_inverse().unwrap() - iec_inv).amax() < 5e-5);
    }

    #[test]
    fn white_is_rgb_one() {
        let (x, y) = D65_XY;
        let white = Xyz::new(x / y, 1.0, (1.0 - x - y) / y);
        for rgb in [
            LinearSrgb::from_xyz_unclamped(white).to_array(),
            LinearDisplayP3::from_xyz_unclamped(white).to_array(),
        ] {
            assert!(rgb.iter().all(|v| (v - 1.0).abs() < 1e-12), "{rgb:?}");
        }
    }

    #[test]
    fn transfer_function_breakpoints() {
        // IEC 61966-2-1: linear segment slope 12.92 up to 0.0031308 (encoded 0.04045),
        // power 1/2.4 with offset 0.055 above. The published constants meet to 1e-7.
        assert!((srgb_encode(0.0031308) - 0.04045).abs() < 1e-7);
        assert!((srgb_decode(0.04045) - 0.0031308).abs() < 1e-7);
        let above = 1.055 * 0.0031308f64.powf(1.0 / 2.4) - 0.055;
        assert!((above - 12.92 * 0.0031308).abs() < 1e-7);
        assert_eq!(srgb_encode(0.0), 0.0);
        assert!((srgb_encode(1.0) - 1.0).abs() < 1e-15);
        assert!((srgb_decode(1.0) - 1.0).abs() < 1e-15);
        // 18 % grey encodes to 0.4614 (117.6 of 255) — common practice.
        assert!((srgb_encode(0.18) - 0.461_356).abs() < 1e-6);
        assert_eq!(srgb_encode(-0.5), -srgb_encode(0.5));
    }

    #[test]
    fn gamut_detection() {
        assert!(LinearSrgb::new(0.0, 0.5, 1.0).in_gamut());
        assert!(LinearSrgb::new(-0.9e-6, 0.5, 1.0 + 0.9e-6).in_gamut());
        assert!(!LinearSrgb::new(-2e-6, 0.5, 0.5).in_gamut());
        assert!(!LinearSrgb::new(0.5, 1.0 + 2e-6, 0.5).in_gamut());
        assert!(!LinearSrgb::new(f64::NAN, 0.5, 0.5).in_gamut());
        // Display P3's pure green is outside sRGB but inside P3.
        let p3_green = LinearDisplayP3::new(0.0, 1.0, 0.0);
        assert!(p3_green.in_gamut());
        assert!(!LinearSrgb::from_xyz_unclamped(p3_green.to_xyz()).in_gamut());
    }

    #[test]
    fn swatch_bytes() {
        assert_eq!(
            LinearSrgb::new(1.0, 0.0, 0.18).to_rgb8_clamped(),
            [255, 0, 118]
        );
        assert_eq!(
            LinearSrgb::new(2.0, -1.0, f64::NAN).to_rgb8_clamped(),
            [255, 0, 0]
        );
        assert_eq!(
            EncodedSrgb::from_rgb8([0, 128, 255]).to_rgb8_clamped(),
            [0, 128, 255]
        );
    }

    #[test]
    fn degenerate_primaries_are_refused() {
        assert!(rgb_matrices_from_primaries([(0.3, 0.3), (0.4, 0.4), (0.5, 0.5)], D65_XY).is_err());
        assert!(
            rgb_matrices_from_primaries([(0.64, 0.0), (0.3, 0.6), (0.15, 0.06)], D65_XY).is_err()
        );
    }

    impl<S: RgbSpace> LinearRgb<S> {
        fn to_array(self) -> [f64; 3] {
            [self.r, self.g, self.b]
        }
    }

    proptest! {
        #[test]
        fn encode_decode_round_trip(v in -2.0..2.0f64) {
            prop_assert!((srgb_decode(srgb_encode(v)) - v).abs() < 1e-12);
        }

        #[test]
        fn xyz_round_trip(x in 0.0..1.0f64, y in 0.0..1.0f64, z in 0.0..1.0f64) {
            let xyz = Xyz::new(x, y, z);
            let back = LinearDisplayP3::from_xyz_unclamped(xyz).to_xyz();
            prop_assert!((back.x - x).abs() < 1e-12 && (back.y - y).abs() < 1e-12 && (back.z - z).abs() < 1e-12);
            let rgb = EncodedSrgb::new(x, y, z).decode().encode_unclamped();
            prop_assert!((rgb.r - x).abs() < 1e-12 && (rgb.g - y).abs() < 1e-12 && (rgb.b - z).abs() < 1e-12);
        }
    }
}
