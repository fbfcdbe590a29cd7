//! Display colours of the comparison: XYZ (D65 white, Y = 1) to linear sRGB
//! or Display P3, with a gamut flag. Encoding to display code values is done
//! on demand, since most callers only need the swatch of a few subjects.
//!
//! Lampwright's D65 white (1 nm summation, chromaticity 0.31271, 0.32902) and
//! the displays' specified D65 (0.3127, 0.3290) differ in the fifth decimal;
//! colours are carried across with CAT16 so that the perfect white lands on
//! RGB = (1, 1, 1) exactly instead of a hair outside the gamut.
//!
//! # References
//! - IEC 61966-2-1:1999 (sRGB); W3C CSS Color Module Level 4 (2022), `display-p3`
//!   (as implemented in the colour crate's `rgb` module).
//! - Li, C. et al. (2017), doi:10.1002/col.22131 (CAT16).

use crate::calibration::d65_white;
use crate::error::Result;
use lampwright_color::Xyz;
use lampwright_color::adaptation::{Cat, apply_matrix, chromatic_adaptation_matrix};
use lampwright_color::rgb::{D65_XY, DisplayP3, LinearRgb, RgbSpace, Srgb};
use nalgebra::Matrix3;

/// Which display the swatches are computed for.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
#[serde(rename_all = "kebab-case")]
pub enum DisplaySpace {
    /// sRGB (IEC 61966-2-1).
    #[default]
    Srgb,
    /// Display P3 (P3 primaries, D65, sRGB transfer function).
    DisplayP3,
}

impl DisplaySpace {
    /// Name for the user.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            DisplaySpace::Srgb => Srgb::NAME,
            DisplaySpace::DisplayP3 => DisplayP3::NAME,
        }
    }
}

/// A colour on a display: light-linear RGB (1 = display white) and whether it
/// lies inside the display's gamut.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct DisplayColor {
    /// The display space.
    pub space: DisplaySpace,
    /// Linear RGB, not clamped.
    pub linear_rgb_unclamped: [f64; 3],
    /// Every component within [0, 1] (colour crate's tolerance).
    pub in_gamut: bool,
}

impl DisplayColor {
    /// Transfer-encoded values (sRGB curve for both spaces), not clamped.
    #[must_use]
    pub fn encoded_unclamped(&self) -> [f64; 3] {
        let [r, g, b] = self.linear_rgb_unclamped;
        let e = LinearRgb::<Srgb>::new(r, g, b).encode_unclamped();
        [e.r, e.g, e.b]
    }

    /// 8-bit code values for a swatch (clipped in linear light, then encoded).
    #[must_use]
    pub fn to_rgb8_clamped(&self) -> [u8; 3] {
        let [r, g, b] = self.linear_rgb_unclamped;
        LinearRgb::<Srgb>::new(r, g, b).to_rgb8_clamped()
    }
}

/// XYZ (Lampwright's D65 white, Y = 1) → display colours.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DisplayTransform {
    space: DisplaySpace,
    /// CAT16 from Lampwright's D65 to the display's D65, then XYZ → linear RGB.
    rgb_from_xyz: Matrix3<f64>,
}

impl DisplayTransform {
    /// Prepare the transform for `space`.
    pub fn new(space: DisplaySpace) -> Result<DisplayTransform> {
        let (x, y) = D65_XY;
        let display_white = Xyz::new(x / y, 1.0, (1.0 - x - y) / y);
        let cat = chromatic_adaptation_matrix(Cat::Cat16, d65_white()?, display_white)?;
        let to_rgb = match space {
            DisplaySpace::Srgb => Srgb::matrices().xyz_to_rgb,
            DisplaySpace::DisplayP3 => DisplayP3::matrices().xyz_to_rgb,
        };
        Ok(DisplayTransform {
            space,
            rgb_from_xyz: to_rgb * cat,
        })
    }

    /// The display colour of `xyz`.
    #[must_use]
    pub fn color(&self, xyz: Xyz) -> DisplayColor {
        let v = apply_matrix(&self.rgb_from_xyz, xyz).to_array();
        let in_gamut = LinearRgb::<Srgb>::new(v[0], v[1], v[2]).in_gamut();
        DisplayColor {
            space: self.space,
            linear_rgb_unclamped: v,
            in_gamut,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn white_is_exactly_display_white() {
        for space in [DisplaySpace::Srgb, DisplaySpace::DisplayP3] {
            let t = DisplayTransform::new(space).unwrap();
            let c = t.color(d65_white().unwrap());
            assert!(c.in_gamut, "{}", space.name());
            for v in c.linear_rgb_unclamped {
                assert!((v - 1.0).abs() < 1e-12);
            }
            assert_eq!(c.to_rgb8_clamped(), [255, 255, 255]);
        }
    }

    #[test]
    fn p3_holds_colours_srgb_cannot() {
        // A saturated green: the sRGB green primary pushed towards 520 nm.
        let green = Xyz::new(0.22, 0.55, 0.08);
        let s = DisplayTransform::new(DisplaySpace::Srgb)
            .unwrap()
            .color(green);
        let p = DisplayTransform::new(DisplaySpace::DisplayP3)
            .unwrap()
            .color(green);
        assert!(!s.in_gamut && p.in_gamut, "{s:?} {p:?}");
        // IEC 61966-2-1: mid-grey linear 0.2 encodes to 0.4845 (eq. 8 inverse form).
        let grey = DisplayTransform::new(DisplaySpace::Srgb)
            .unwrap()
            .color(d65_white().unwrap().scaled(0.2));
        for e in grey.encoded_unclamped() {
            assert!((e - 0.484_529).abs() < 1e-5, "{e}");
        }
    }
}
