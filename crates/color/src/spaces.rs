//! Colour spaces derived from CIE XYZ: chromaticity (xyY, CIE 1960 uv, CIE 1976
//! u′v′), CIELAB, CIELUV and the cylindrical LCh of CIELAB.
//!
//! Every conversion is total on finite input: divisions that vanish for black
//! (X + Y + Z = 0) or for a degenerate white give a stated value instead of NaN.
//! The guards follow the reference package's zero-division handling (a ratio
//! whose denominator is zero is taken as zero) except where a more useful value
//! is documented (xyY of black takes the white's chromaticity).
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §7.3 (x, y), §8.1 (CIE 1976 UCS u′v′),
//!   §8.2.1 (CIELAB, eqs. 8.6–8.13), §8.2.2 (CIELUV), §8.2.3 (chroma and hue
//!   angle). DOI 10.25039/TR.015.2018.
//! - CIE 1960 UCS (u, v): MacAdam, D. L. (1937), *J. Opt. Soc. Am.* 27(8):294–299,
//!   DOI 10.1364/JOSA.27.000294; adopted by the CIE in 1960 and still used for
//!   CCT and Duv (CIE 15:2018 §9.4), with v = (2/3) v′.

use crate::tristimulus::Xyz;

/// CIELAB threshold ε = (6/29)³ = 216/24389 (CIE 15:2018 eq. 8.11, exact form).
pub const LAB_EPSILON: f64 = 216.0 / 24389.0;
/// CIELAB slope κ = (29/3)³ = 24389/27 of the linear segment near black.
pub const LAB_KAPPA: f64 = 24389.0 / 27.0;

/// `a / b`, or 0 when `b` is 0 (the reference package's zero-division rule).
fn div_or_zero(a: f64, b: f64) -> f64 {
    if b == 0.0 { 0.0 } else { a / b }
}

/// Chromaticity (x, y) with the Y tristimulus value.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Xyy {
    /// Chromaticity coordinate x = X / (X + Y + Z).
    pub x: f64,
    /// Chromaticity coordinate y = Y / (X + Y + Z).
    pub y: f64,
    /// Tristimulus value Y (same scale as the XYZ it came from).
    pub big_y: f64,
}

impl Xyy {
    /// xyY of `xyz`. Black (X + Y + Z ≤ 0) takes the chromaticity of
    /// `white_for_black` with Y = 0, so that a ramp to black keeps its hue.
    ///
    /// # References
    /// CIE 15:2018 §7.3, eq. 7.11.
    #[must_use]
    pub fn from_xyz(xyz: Xyz, white_for_black: Xyz) -> Xyy {
        match (xyz.chromaticity(), white_for_black.chromaticity()) {
            (Some((x, y)), _) => Xyy { x, y, big_y: xyz.y },
            (None, Some((x, y))) => Xyy { x, y, big_y: 0.0 },
            (None, None) => Xyy {
                x: 0.0,
                y: 0.0,
                big_y: 0.0,
            },
        }
    }

    /// Back to XYZ: X = xY/y, Z = (1 − x − y)Y/y. A zero y gives black.
    #[must_use]
    pub fn to_xyz(self) -> Xyz {
        if self.y == 0.0 {
            return Xyz::default();
        }
        let k = self.big_y / self.y;
        Xyz::new(self.x * k, self.big_y, (1.0 - self.x - self.y) * k)
    }
}

/// CIE 1960 UCS chromaticity (u, v), the plane of CCT and Duv.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Uv1960 {
    /// u = 4X / (X + 15Y + 3Z).
    pub u: f64,
    /// v = 6Y / (X + 15Y + 3Z).
    pub v: f64,
}

impl Uv1960 {
    /// From XYZ. Black (X + 15Y + 3Z = 0) gives (0, 0).
    ///
    /// # References
    /// MacAdam (1937), DOI 10.1364/JOSA.27.000294; CIE 15:2018 §9.4.
    #[must_use]
    pub fn from_xyz(xyz: Xyz) -> Uv1960 {
        let d = xyz.x + 15.0 * xyz.y + 3.0 * xyz.z;
        Uv1960 {
            u: div_or_zero(4.0 * xyz.x, d),
            v: div_or_zero(6.0 * xyz.y, d),
        }
    }

    /// From chromaticity (x, y): u = 4x / (−2x + 12y + 3), v = 6y / (−2x + 12y + 3).
    /// A zero denominator (off the physical plane) gives (0, 0).
    #[must_use]
    pub fn from_xy(x: f64, y: f64) -> Uv1960 {
        let d = -2.0 * x + 12.0 * y + 3.0;
        Uv1960 {
            u: div_or_zero(4.0 * x, d),
            v: div_or_zero(6.0 * y, d),
        }
    }

    /// Chromaticity (x, y): x = 3u / (2u − 8v + 4), y = 2v / (2u − 8v + 4).
    /// A zero denominator gives (0, 0).
    #[must_use]
    pub fn to_xy(self) -> (f64, f64) {
        let d = 2.0 * self.u - 8.0 * self.v + 4.0;
        (div_or_zero(3.0 * self.u, d), div_or_zero(2.0 * self.v, d))
    }

    /// The same chromaticity in CIE 1976 u′v′ (u′ = u, v′ = 1.5 v).
    #[must_use]
    pub fn to_uv_prime(self) -> UvPrime {
        UvPrime {
            u: self.u,
            v: 1.5 * self.v,
        }
    }

    /// Euclidean distance in the 1960 plane (e.g. Duv magnitude, CIE 13.3 ΔC).
    #[must_use]
    pub fn distance(self, other: Uv1960) -> f64 {
        (self.u - other.u).hypot(self.v - other.v)
    }
}

/// CIE 1976 UCS chromaticity (u′, v′).
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct UvPrime {
    /// u′ = 4X / (X + 15Y + 3Z).
    pub u: f64,
    /// v′ = 9Y / (X + 15Y + 3Z).
    pub v: f64,
}

impl UvPrime {
    /// From XYZ. Black (X + 15Y + 3Z = 0) gives (0, 0).
    ///
    /// # References
    /// CIE 15:2018 §8.1, eqs. 8.1–8.2.
    #[must_use]
    pub fn from_xyz(xyz: Xyz) -> UvPrime {
        let d = xyz.x + 15.0 * xyz.y + 3.0 * xyz.z;
        UvPrime {
            u: div_or_zero(4.0 * xyz.x, d),
            v: div_or_zero(9.0 * xyz.y, d),
        }
    }

    /// From chromaticity (x, y): u′ = 4x / (−2x + 12y + 3), v′ = 9y / (−2x + 12y + 3).
    #[must_use]
    pub fn from_xy(x: f64, y: f64) -> UvPrime {
        let d = -2.0 * x + 12.0 * y + 3.0;
        UvPrime {
            u: div_or_zero(4.0 * x, d),
            v: div_or_zero(9.0 * y, d),
        }
    }

    /// Chromaticity (x, y): x = 9u′ / (6u′ − 16v′ + 12), y = 4v′ / (6u′ − 16v′ + 12).
    #[must_use]
    pub fn to_xy(self) -> (f64, f64) {
        let d = 6.0 * self.u - 16.0 * self.v + 12.0;
        (div_or_zero(9.0 * self.u, d), div_or_zero(4.0 * self.v, d))
    }

    /// The same chromaticity in CIE 1960 uv (v = v′ / 1.5).
    #[must_use]
    pub fn to_uv1960(self) -> Uv1960 {
        Uv1960 {
            u: self.u,
            v: self.v / 1.5,
        }
    }
}

/// CIE 1960 (u, v) of `xyz` as a plain pair, or `None` when X + 15Y + 3Z is
/// not positive (black, or not a physical stimulus). Use [`Uv1960::from_xyz`]
/// for the typed, always-defined form.
///
/// # References
/// MacAdam (1937), DOI 10.1364/JOSA.27.000294; CIE 15:2018 §9.4.
#[must_use]
pub fn uv1960_from_xyz(xyz: Xyz) -> Option<(f64, f64)> {
    let d = xyz.x + 15.0 * xyz.y + 3.0 * xyz.z;
    (d > 0.0 && d.is_finite()).then(|| (4.0 * xyz.x / d, 6.0 * xyz.y / d))
}

/// CIE 1976 (u′, v′) of `xyz` as a plain pair, or `None` when X + 15Y + 3Z is
/// not positive. Use [`UvPrime::from_xyz`] for the typed, always-defined form.
///
/// # References
/// CIE 15:2018 §8.1, eqs. 8.1–8.2.
#[must_use]
pub fn uv_prime_from_xyz(xyz: Xyz) -> Option<(f64, f64)> {
    let d = xyz.x + 15.0 * xyz.y + 3.0 * xyz.z;
    (d > 0.0 && d.is_finite()).then(|| (4.0 * xyz.x / d, 9.0 * xyz.y / d))
}

/// CIELAB forward companding f(t) (CIE 15:2018 eqs. 8.9–8.12).
fn lab_f(t: f64) -> f64 {
    if t > LAB_EPSILON {
        // exp(ln t / 3) is about 1.5× faster than `cbrt` here and agrees with it
        // to a few 1e-16 relative (t > ε > 0, so ln is defined).
        (t.ln() / 3.0).exp()
    } else {
        (LAB_KAPPA * t + 16.0) / 116.0
    }
}

/// Inverse of [`lab_f`].
fn lab_f_inv(f: f64) -> f64 {
    let t = f * f * f;
    if t > LAB_EPSILON {
        t
    } else {
        (116.0 * f - 16.0) / LAB_KAPPA
    }
}

/// CIE 1976 L*a*b* (CIELAB) relative to a reference white.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Lab {
    /// Lightness L*, 0 (black) to 100 (the white).
    pub l: f64,
    /// a*, red (+) – green (−).
    pub a: f64,
    /// b*, yellow (+) – blue (−).
    pub b: f64,
}

impl Lab {
    /// From components.
    #[must_use]
    pub const fn new(l: f64, a: f64, b: f64) -> Lab {
        Lab { l, a, b }
    }

    /// CIELAB of `xyz` relative to `white` (same scale, e.g. both Y = 100).
    /// A white component of zero makes that ratio zero instead of infinite.
    ///
    /// L* = 116 f(Y/Yn) − 16, a* = 500 [f(X/Xn) − f(Y/Yn)], b* = 200 [f(Y/Yn) − f(Z/Zn)],
    /// with f(t) = t^(1/3) above (6/29)³ and the linear segment below it.
    ///
    /// # References
    /// CIE 15:2018 §8.2.1, eqs. 8.6–8.12.
    #[must_use]
    pub fn from_xyz(xyz: Xyz, white: Xyz) -> Lab {
        let fx = lab_f(div_or_zero(xyz.x, white.x));
        let fy = lab_f(div_or_zero(xyz.y, white.y));
        let fz = lab_f(div_or_zero(xyz.z, white.z));
        Lab {
            l: 116.0 * fy - 16.0,
            a: 500.0 * (fx - fy),
            b: 200.0 * (fy - fz),
        }
    }

    /// CIELAB of many colours against one white: the same as
    /// [`Lab::from_xyz`] on each (to a few units in the last place), with
    /// the cube roots of all colours computed together by the vectorised
    /// [`crate::batch_math`].
    #[must_use]
    pub fn many_from_xyz(xyz: &[Xyz], white: Xyz) -> Vec<Lab> {
        let t: Vec<f64> = xyz
            .iter()
            .flat_map(|c| {
                [
                    div_or_zero(c.x, white.x),
                    div_or_zero(c.y, white.y),
                    div_or_zero(c.z, white.z),
                ]
            })
            .collect();
        // The cube root as exp((1/3)·ln t), over the values above ε.
        let mut f: Vec<f64> = t
            .iter()
            .map(|t| if *t > LAB_EPSILON { *t } else { 1.0 })
            .collect();
        crate::batch_math::pow_nonnegative_in_place(&mut f, 1.0 / 3.0);
        for (f, t) in f.iter_mut().zip(&t) {
            if *t <= LAB_EPSILON || t.is_nan() {
                *f = lab_f(*t);
            }
        }
        f.chunks_exact(3)
            .map(|c| Lab {
                l: 116.0 * c[1] - 16.0,
                a: 500.0 * (c[0] - c[1]),
                b: 200.0 * (c[1] - c[2]),
            })
            .collect()
    }

    /// Back to XYZ on the scale of `white` (CIE 15:2018 §8.2.1, inverse equations).
    #[must_use]
    pub fn to_xyz(self, white: Xyz) -> Xyz {
        let fy = (self.l + 16.0) / 116.0;
        let fx = fy + self.a / 500.0;
        let fz = fy - self.b / 200.0;
        Xyz::new(
            lab_f_inv(fx) * white.x,
            lab_f_inv(fy) * white.y,
            lab_f_inv(fz) * white.z,
        )
    }

    /// Cylindrical form (L*, C*ab, hab).
    #[must_use]
    pub fn to_lch(self) -> Lch {
        Lch::from_lab(self)
    }

    /// As an array `[L*, a*, b*]`.
    #[must_use]
    pub const fn to_array(self) -> [f64; 3] {
        [self.l, self.a, self.b]
    }
}

/// CIE 1976 L*u*v* (CIELUV) relative to a reference white.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Luv {
    /// Lightness L* (as in CIELAB).
    pub l: f64,
    /// u* = 13 L* (u′ − u′n).
    pub u: f64,
    /// v* = 13 L* (v′ − v′n).
    pub v: f64,
}

impl Luv {
    /// CIELUV of `xyz` relative to `white` (same scale). Black gives (0, 0, 0).
    ///
    /// # References
    /// CIE 15:2018 §8.2.2, eqs. 8.14–8.16.
    #[must_use]
    pub fn from_xyz(xyz: Xyz, white: Xyz) -> Luv {
        let l = 116.0 * lab_f(div_or_zero(xyz.y, white.y)) - 16.0;
        let uv = UvPrime::from_xyz(xyz);
        let uvn = UvPrime::from_xyz(white);
        Luv {
            l,
            u: 13.0 * l * (uv.u - uvn.u),
            v: 13.0 * l * (uv.v - uvn.v),
        }
    }

    /// Back to XYZ on the scale of `white`. L* = 0 gives black.
    #[must_use]
    pub fn to_xyz(self, white: Xyz) -> Xyz {
        let y = lab_f_inv((self.l + 16.0) / 116.0) * white.y;
        if self.l == 0.0 || y == 0.0 {
            return Xyz::default();
        }
        let uvn = UvPrime::from_xyz(white);
        let u = self.u / (13.0 * self.l) + uvn.u;
        let v = self.v / (13.0 * self.l) + uvn.v;
        if v == 0.0 {
            return Xyz::default();
        }
        // From u′ = 4X/D, v′ = 9Y/D: X = 9uY/(4v), Z = (12 − 3u − 20v) Y / (4v).
        Xyz::new(
            9.0 * u * y / (4.0 * v),
            y,
            (12.0 - 3.0 * u - 20.0 * v) * y / (4.0 * v),
        )
    }
}

/// CIELAB in cylindrical form: lightness, chroma C*ab and hue angle hab.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Lch {
    /// Lightness L*.
    pub l: f64,
    /// Chroma C*ab = √(a*² + b*²).
    pub c: f64,
    /// Hue angle hab in degrees, 0 ≤ h < 360 (0 for a neutral).
    pub h_deg: f64,
}

impl Lch {
    /// From CIELAB.
    ///
    /// # References
    /// CIE 15:2018 §8.2.3, eqs. 8.17–8.18.
    #[must_use]
    pub fn from_lab(lab: Lab) -> Lch {
        Lch {
            l: lab.l,
            c: lab.a.hypot(lab.b),
            h_deg: hue_angle_deg(lab.a, lab.b),
        }
    }

    /// Back to CIELAB.
    #[must_use]
    pub fn to_lab(self) -> Lab {
        let (s, c) = self.h_deg.to_radians().sin_cos();
        Lab {
            l: self.l,
            a: self.c * c,
            b: self.c * s,
        }
    }
}

/// Hue angle atan2(b, a) in degrees, in [0, 360). (0, 0) gives 0.
#[must_use]
pub fn hue_angle_deg(a: f64, b: f64) -> f64 {
    let h = b.atan2(a).to_degrees();
    let h = if h < 0.0 { h + 360.0 } else { h };
    // -tiny + 360 rounds to exactly 360.
    if h >= 360.0 { h - 360.0 } else { h }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    const D65: Xyz = Xyz::new(95.047, 100.0, 108.883);

    #[test]
    fn many_labs_at_once_equal_one_at_a_time() {
        let white = Xyz::new(95.047, 100.0, 108.883);
        let mut colours = vec![
            Xyz::new(0.0, 0.0, 0.0),
            white,
            Xyz::new(0.5, 0.4, 0.3),
            Xyz::new(-2.0, 1e-9, 300.0),
            Xyz::new(f64::NAN, 1.0, 1.0),
        ];
        for i in 0..200 {
            let u = f64::from(i);
            colours.push(Xyz::new(
                50.0 + 49.0 * (u * 0.3).sin(),
                50.0 + 49.0 * (u * 0.7).cos(),
                55.0 + 54.0 * (u * 0.5).sin(),
            ));
        }
        let many = Lab::many_from_xyz(&colours, white);
        for (c, got) in colours.iter().zip(&many) {
            let want = Lab::from_xyz(*c, white);
            for (g, w) in [(got.l, want.l), (got.a, want.a), (got.b, want.b)] {
                assert!(
                    (g - w).abs() <= 1e-12 * (1.0 + w.abs()) || (g.is_nan() && w.is_nan()),
                    "{c:?}: {got:?} vs {want:?}"
                );
            }
        }
    }

    #[test]
    fn white_is_l100_and_neutral() {
        let lab = Lab::from_xyz(D65, D65);
        assert!((lab.l - 100.0).abs() < 1e-12 && lab.a.abs() < 1e-12 && lab.b.abs() < 1e-12);
        let luv = Luv::from_xyz(D65, D65);
        assert!((luv.l - 100.0).abs() < 1e-12 && luv.u.abs() < 1e-12 && luv.v.abs() < 1e-12);
    }

    #[test]
    fn cielab_mid_grey_and_breakpoint() {
        // CIE 15:2018 eq. 8.6: Y/Yn = 0.18 → L* = 116·0.18^(1/3) − 16 = 49.496 (common practice: 18 % grey ≈ L* 49.5).
        let lab = Lab::from_xyz(D65.scaled(0.18), D65);
        assert!((lab.l - 49.4961).abs() < 1e-4, "{}", lab.l);
        // Both branches meet at ε: L* = 8 (κ·ε = 8 exactly).
        let at = LAB_EPSILON;
        let l_lin = LAB_KAPPA * at;
        let l_cbrt = 116.0 * at.cbrt() - 16.0;
        assert!((l_lin - 8.0).abs() < 1e-12 && (l_cbrt - 8.0).abs() < 1e-12);
    }

    #[test]
    fn black_is_defined() {
        let black = Xyz::default();
        let lab = Lab::from_xyz(black, D65);
        assert_eq!((lab.l, lab.a, lab.b), (0.0, 0.0, 0.0));
        let luv = Luv::from_xyz(black, D65);
        assert_eq!((luv.l, luv.u, luv.v), (0.0, 0.0, 0.0));
        assert_eq!(Uv1960::from_xyz(black), Uv1960::default());
        assert_eq!(UvPrime::from_xyz(black), UvPrime::default());
        assert_eq!(uv1960_from_xyz(black), None);
        assert_eq!(uv_prime_from_xyz(black), None);
        let xyy = Xyy::from_xyz(black, D65);
        let (wx, wy) = D65.chromaticity().unwrap();
        assert_eq!((xyy.x, xyy.y, xyy.big_y), (wx, wy, 0.0));
        assert_eq!(xyy.to_xyz(), Xyz::new(0.0, 0.0, 0.0));
        assert_eq!(Luv::default().to_xyz(D65), Xyz::default());
        let lch = Lab::default().to_lch();
        assert_eq!((lch.c, lch.h_deg), (0.0, 0.0));
        // A degenerate white does not produce NaN.
        let lab = Lab::from_xyz(D65, Xyz::default());
        assert!(lab.l.is_finite() && lab.a.is_finite() && lab.b.is_finite());
    }

    #[test]
    fn uv_planes_agree() {
        // v′ = 1.5 v (CIE 15:2018 §8.1); the xy route equals the XYZ route.
        let xyz = Xyz::new(41.24, 21.26, 1.93);
        let uv = Uv1960::from_xyz(xyz);
        let up = UvPrime::from_xyz(xyz);
        assert!((up.v - 1.5 * uv.v).abs() < 1e-15 && (up.u - uv.u).abs() < 1e-15);
        let (x, y) = xyz.chromaticity().unwrap();
        let uv2 = Uv1960::from_xy(x, y);
        assert!(uv.distance(uv2) < 1e-14);
        let (x2, y2) = up.to_xy();
        assert!((x - x2).abs() < 1e-14 && (y - y2).abs() < 1e-14);
        assert!(up.to_uv1960().distance(uv) < 1e-15);
        assert_eq!(uv1960_from_xyz(xyz), Some((uv.u, uv.v)));
        assert_eq!(uv_prime_from_xyz(xyz), Some((up.u, up.v)));
    }

    #[test]
    fn lch_hue_quadrants() {
        for (a, b, h) in [
            (1.0, 0.0, 0.0),
            (0.0, 1.0, 90.0),
            (-1.0, 0.0, 180.0),
            (0.0, -1.0, 270.0),
        ] {
            let lch = Lab::new(50.0, a, b).to_lch();
            assert!((lch.h_deg - h).abs() < 1e-12, "{a} {b}");
        }
        assert!(hue_angle_deg(1.0, -1e-300) < 360.0);
    }

    fn xyz_strategy() -> impl Strategy<Value = Xyz> {
        (0.0..150.0f64, 0.0..150.0f64, 0.0..150.0f64).prop_map(|(x, y, z)| Xyz::new(x, y, z))
    }

    proptest! {
        #[test]
        fn lab_round_trip(xyz in xyz_strategy()) {
            let back = Lab::from_xyz(xyz, D65).to_xyz(D65);
            prop_assert!((back.x - xyz.x).abs() < 1e-9 && (back.y - xyz.y).abs() < 1e-9 && (back.z - xyz.z).abs() < 1e-9);
        }

        #[test]
        fn luv_round_trip(xyz in xyz_strategy()) {
            prop_assume!(xyz.y > 1e-6);
            let back = Luv::from_xyz(xyz, D65).to_xyz(D65);
            prop_assert!((back.x - xyz.x).abs() < 1e-8 && (back.y - xyz.y).abs() < 1e-9 && (back.z - xyz.z).abs() < 1e-8,
                "{xyz:?} -> {back:?}");
        }

        #[test]
        fn xyy_round_trip(xyz in xyz_strategy()) {
            prop_assume!(xyz.y > 1e-6);
            let back = Xyy::from_xyz(xyz, D65).to_xyz();
            prop_assert!((back.x - xyz.x).abs() < 1e-9 && (back.z - xyz.z).abs() < 1e-9);
        }

        #[test]
        fn lch_round_trip(l in 0.0..100.0f64, a in -150.0..150.0f64, b in -150.0..150.0f64) {
            let lch = Lab::new(l, a, b).to_lch();
            prop_assert!((0.0..360.0).contains(&lch.h_deg));
            let back = lch.to_lab();
            prop_assert!((back.a - a).abs() < 1e-10 && (back.b - b).abs() < 1e-10);
        }

        #[test]
        fn uv_round_trip(xyz in xyz_strategy()) {
            prop_assume!(xyz.y > 1e-6);
            let (x, y) = xyz.chromaticity().unwrap();
            let (x1, y1) = Uv1960::from_xyz(xyz).to_xy();
            let (x2, y2) = UvPrime::from_xyz(xyz).to_xy();
            prop_assert!((x1 - x).abs() < 1e-12 && (y1 - y).abs() < 1e-12);
            prop_assert!((x2 - x).abs() < 1e-12 && (y2 - y).abs() < 1e-12);
        }

        #[test]
        fn never_nan(x in -1e3..1e3f64, y in -1e3..1e3f64, z in -1e3..1e3f64) {
            let xyz = Xyz::new(x, y, z);
            let lab = Lab::from_xyz(xyz, D65);
            let luv = Luv::from_xyz(xyz, D65);
            let uv = Uv1960::from_xyz(xyz);
            let xyy = Xyy::from_xyz(xyz, D65);
            for v in [lab.l, lab.a, lab.b, luv.l, luv.u, luv.v, uv.u, uv.v, xyy.x, xyy.y, lab.to_lch().h_deg] {
                prop_assert!(!v.is_nan());
            }
        }
    }
}
