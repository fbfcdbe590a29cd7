//! Chromatic adaptation transforms (CATs) of the von Kries type.
//!
//! A CAT maps XYZ to cone-like responses with a 3 × 3 matrix M, scales each
//! response by the ratio of the destination to the source white, and maps
//! back: `M_adapt = M⁻¹ · diag(ρ_dst / ρ_src) · M` (full adaptation, D = 1).
//! Scaling the rows of M by any positive constants leaves `M_adapt` unchanged,
//! so the normalisation of a cone matrix (to D65 or to equal energy) does not
//! matter for adaptation (see the test `row_normalisation_cancels`).
//!
//! # References
//! - von Kries, J. (1902), "Chromatic adaptation", Festschrift der Albrecht-Ludwigs-Universität;
//!   the diagonal-gain model.
//! - Hunt–Pointer–Estévez cone fundamentals, normalised to D65 as tabulated by
//!   CIE 109-1994 (*A method of predicting corresponding colours under different chromatic
//!   and illuminance adaptations*) and Fairchild, M. D. (2013), *Color Appearance Models*,
//!   3rd ed., Wiley, ch. 9 (the "von Kries" matrix used here).
//! - Lam, K. M. (1985), *Metamerism and colour constancy*, doctoral thesis, University of
//!   Bradford; the linearised Bradford matrix (Lindbloom, B., "Chromatic Adaptation",
//!   brucelindbloom.com, lists it with adaptation matrices between standard whites).
//! - CIE 159:2004, *A colour appearance model for colour management systems: CIECAM02*,
//!   §2 (CAT02 matrix; degree of adaptation D, eq. 2.3).
//! - Li, C., Li, Z., Wang, Z., Xu, Y., Luo, M. R., Cui, G., Melgosa, M., Brill, M. H.,
//!   Pointer, M. (2017), "Comprehensive color solutions: CAM16, CAT16, and CAM16-UCS",
//!   *Color Res. Appl.* 42(6):703–718, DOI 10.1002/col.22131 (CAT16 matrix, eqs. 1–5).

use crate::error::{ColorError, Result};
use crate::tristimulus::Xyz;
use nalgebra::{Matrix3, Vector3};

/// Which cone-response matrix a von Kries-type adaptation uses.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
pub enum Cat {
    /// Hunt–Pointer–Estévez cone fundamentals normalised to D65 (classic von Kries).
    VonKries,
    /// Linearised Bradford (Lam 1985), the usual choice for ICC profiles.
    #[default]
    Bradford,
    /// CAT02 of CIECAM02 (CIE 159:2004).
    Cat02,
    /// CAT16 of CAM16 (Li et al. 2017).
    Cat16,
}

impl Cat {
    /// Every transform, for menus and tests.
    pub const ALL: [Cat; 4] = [Cat::VonKries, Cat::Bradford, Cat::Cat02, Cat::Cat16];

    /// Short name for display.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            Cat::VonKries => "von Kries",
            Cat::Bradford => "Bradford",
            Cat::Cat02 => "CAT02",
            Cat::Cat16 => "CAT16",
        }
    }

    /// The XYZ → cone-response matrix (rows: long, medium, short).
    #[must_use]
    pub fn matrix(self) -> Matrix3<f64> {
        match self {
            // Hunt–Pointer–Estévez normalised to D65 (CIE 109-1994; Fairchild 2013 ch. 9).
            Cat::VonKries => Matrix3::new(
                0.40024, 0.70760, -0.08081, //
                -0.22630, 1.16532, 0.04570, //
                0.0, 0.0, 0.91822,
            ),
            // Lam (1985), linearised.
            Cat::Bradford => Matrix3::new(
                0.8951, 0.2664, -0.1614, //
                -0.7502, 1.7135, 0.0367, //
                0.0389, -0.0685, 1.0296,
            ),
            // CIE 159:2004 eq. 2.2.
            Cat::Cat02 => Matrix3::new(
                0.7328, 0.4296, -0.1624, //
                -0.7036, 1.6975, 0.0061, //
                0.0030, 0.0136, 0.9834,
            ),
            // Li et al. (2017) eq. 1.
            Cat::Cat16 => Matrix3::new(
                0.401288, 0.650173, -0.051461, //
                -0.250268, 1.204414, 0.045854, //
                -0.002079, 0.048952, 0.953127,
            ),
        }
    }

    /// The cone-response → XYZ matrix (inverse of [`Cat::matrix`]).
    #[must_use]
    pub fn inverse_matrix(self) -> Matrix3<f64> {
        // All four matrices are well conditioned (det ≈ 0.4–2.6); the fallback
        // is unreachable but keeps release code free of panics.
        self.matrix()
            .try_inverse()
            .unwrap_or_else(Matrix3::identity)
    }
}

fn cone_response(cat: Cat, xyz: Xyz) -> Vector3<f64> {
    cat.matrix() * Vector3::new(xyz.x, xyz.y, xyz.z)
}

fn checked_white(cat: Cat, white: Xyz, role: &str) -> Result<Vector3<f64>> {
    let rho = cone_response(cat, white);
    if !(white.is_finite() && white.y > 0.0 && rho.iter().all(|r| r.is_finite() && *r > 0.0)) {
        return Err(ColorError::InvalidInput(format!(
            "{role} white X={}, Y={}, Z={} is not a usable white for {} adaptation \
             (it needs Y > 0 and positive cone responses)",
            white.x,
            white.y,
            white.z,
            cat.name()
        )));
    }
    Ok(rho)
}

/// Matrix adapting XYZ seen under `src_white` to corresponding XYZ under
/// `dst_white`, with full adaptation (D = 1): `M⁻¹ · diag(ρ_dst / ρ_src) · M`.
/// The source white maps exactly onto the destination white. Whites are XYZ on
/// any common scale; they must have Y > 0 and positive cone responses.
///
/// # References
/// von Kries (1902); matrices as listed on [`Cat`]. Lindbloom's table gives the
/// Bradford D65 → D50 result this reproduces (see tests).
pub fn chromatic_adaptation_matrix(
    cat: Cat,
    src_white: Xyz,
    dst_white: Xyz,
) -> Result<Matrix3<f64>> {
    let rho_src = checked_white(cat, src_white, "source")?;
    let rho_dst = checked_white(cat, dst_white, "destination")?;
    let gains = rho_dst.component_div(&rho_src);
    Ok(cat.inverse_matrix() * Matrix3::from_diagonal(&gains) * cat.matrix())
}

/// Matrix for incomplete adaptation with degree of adaptation `degree_d` in
/// [0, 1]: each cone gain is `D · ρ_dst/ρ_src + (1 − D) · Y_dst / Y_src`.
///
/// D = 1 gives [`chromatic_adaptation_matrix`]; D = 0 only rescales to the
/// destination's luminance, with no change of chromaticity. For whites of equal
/// Y this is the one-step CAT16 of Li et al. (2017, eq. 5, with the adapting
/// white as the reference white) and equals the two-step form of Zhai & Luo
/// (2018) with D = 1 on the destination side; for unequal Y it differs from
/// those only by the overall factor Y(dst) / Y(src), chosen here so that the source
/// white lands on the destination white's luminance.
///
/// # References
/// Li et al. (2017), DOI 10.1002/col.22131; CIE 159:2004 §2 (D);
/// Zhai, Q., Luo, M. R. (2018), "Study of chromatic adaptation via neutral white
/// matches on different viewing media", *Opt. Express* 26(6):7724–7739, DOI 10.1364/OE.26.007724.
pub fn chromatic_adaptation_matrix_partial(
    cat: Cat,
    src_white: Xyz,
    dst_white: Xyz,
    degree_d: f64,
) -> Result<Matrix3<f64>> {
    if !(degree_d.is_finite() && (0.0..=1.0).contains(&degree_d)) {
        return Err(ColorError::OutOfRange {
            what: "degree of adaptation D",
            value: degree_d,
            range: "0–1",
        });
    }
    let rho_src = checked_white(cat, src_white, "source")?;
    let rho_dst = checked_white(cat, dst_white, "destination")?;
    let y_ratio = dst_white.y / src_white.y;
    let gains = rho_dst
        .component_div(&rho_src)
        .map(|g| degree_d * g + (1.0 - degree_d) * y_ratio);
    Ok(cat.inverse_matrix() * Matrix3::from_diagonal(&gains) * cat.matrix())
}

/// Degree of adaptation D of CIECAM02/CAT02 from the surround factor F (1.0
/// average, 0.9 dim, 0.8 dark) and the adapting luminance `la_cd_m2` (cd/m²):
/// `D = F [1 − (1/3.6) exp((−L_A − 42)/92)]`, clipped to [0, 1].
///
/// # References
/// CIE 159:2004 eq. 2.3.
#[must_use]
pub fn degree_of_adaptation_cie159(surround_f: f64, la_cd_m2: f64) -> f64 {
    (surround_f * (1.0 - (1.0 / 3.6) * ((-la_cd_m2 - 42.0) / 92.0).exp())).clamp(0.0, 1.0)
}

/// `matrix · xyz`.
#[must_use]
pub fn apply_matrix(matrix: &Matrix3<f64>, xyz: Xyz) -> Xyz {
    let v = matrix * Vector3::new(xyz.x, xyz.y, xyz.z);
    Xyz::new(v.x, v.y, v.z)
}

/// Corresponding colour of `xyz` (seen under `src_white`) under `dst_white`,
/// full adaptation. For many colours, build the matrix once with
/// [`chromatic_adaptation_matrix`] and use [`apply_matrix`].
pub fn adapt_xyz(cat: Cat, xyz: Xyz, src_white: Xyz, dst_white: Xyz) -> Result<Xyz> {
    Ok(apply_matrix(
        &chromatic_adaptation_matrix(cat, src_white, dst_white)?,
        xyz,
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    // The reference whites of Lindbloom's tables: D65 and D50, Y = 1.
    const D65: Xyz = Xyz::new(0.95047, 1.0, 1.08883);
    const D50: Xyz = Xyz::new(0.96422, 1.0, 0.82521);

    #[test]
    fn bradford_d65_to_d50_matches_lindbloom() {
        // Lindbloom, "Chromatic Adaptation" (brucelindbloom.com), Bradford D65 → D50,
        // published to 7 decimals.
        let want = Matrix3::new(
            1.0478112, 0.0228866, -0.0501270, //
            0.0295424, 0.9904844, -0.0170491, //
            -0.0092345, 0.0150436, 0.7521316,
        );
        let got = chromatic_adaptation_matrix(Cat::Bradford, D65, D50).unwrap();
        assert!((got - want).amax() < 5e-8, "{got}");
        // And back (Lindbloom, D50 → D65).
        let want_back = Matrix3::new(
            0.9555766, -0.0230393, 0.0631636, //
            -0.0282895, 1.0099416, 0.0210077, //
            0.0122982, -0.0204830, 1.3299098,
        );
        let back = chromatic_adaptation_matrix(Cat::Bradford, D50, D65).unwrap();
        assert!((back - want_back).amax() < 5e-8, "{back}");
    }

    #[test]
    fn white_maps_to_white_and_identity_for_same_white() {
        for cat in Cat::ALL {
            let w = adapt_xyz(cat, D65, D65, D50).unwrap();
            assert!(
                (w.x - D50.x).abs() < 1e-12
                    && (w.y - D50.y).abs() < 1e-12
                    && (w.z - D50.z).abs() < 1e-12
            );
            let m = chromatic_adaptation_matrix(cat, D65, D65).unwrap();
            assert!((m - Matrix3::identity()).amax() < 1e-12, "{}", cat.name());
        }
    }

    #[test]
    fn row_normalisation_cancels() {
        // diag(s)·M in place of M gives the same adaptation matrix.
        let m = Cat::VonKries.matrix();
        let s = Matrix3::from_diagonal(&Vector3::new(1.7, 0.3, 2.9));
        let scaled = s * m;
        let gains = |w: Xyz| scaled * Vector3::new(w.x, w.y, w.z);
        let direct = scaled.try_inverse().unwrap()
            * Matrix3::from_diagonal(&gains(D50).component_div(&gains(D65)))
            * scaled;
        let ours = chromatic_adaptation_matrix(Cat::VonKries, D65, D50).unwrap();
        assert!((direct - ours).amax() < 1e-12);
    }

    #[test]
    fn partial_adaptation_limits() {
        for cat in Cat::ALL {
            let full = chromatic_adaptation_matrix(cat, D65, D50).unwrap();
            let p1 = chromatic_adaptation_matrix_partial(cat, D65, D50, 1.0).unwrap();
            assert!((full - p1).amax() < 1e-14);
            // D = 0 with whites of unequal Y: a pure luminance scaling.
            let p0 = chromatic_adaptation_matrix_partial(cat, D65, D50.scaled(2.0), 0.0).unwrap();
            assert!((p0 - Matrix3::identity() * 2.0).amax() < 1e-12);
        }
    }

    #[test]
    fn bad_inputs_are_refused() {
        assert!(chromatic_adaptation_matrix(Cat::Cat02, Xyz::default(), D50).is_err());
        assert!(
            chromatic_adaptation_matrix(Cat::Cat02, D65, Xyz::new(f64::NAN, 1.0, 1.0)).is_err()
        );
        assert!(chromatic_adaptation_matrix(Cat::Bradford, D65, Xyz::new(-1.0, 1.0, 1.0)).is_err());
        assert!(chromatic_adaptation_matrix_partial(Cat::Cat16, D65, D50, 1.5).is_err());
        assert!(chromatic_adaptation_matrix_partial(Cat::Cat16, D65, D50, f64::NAN).is_err());
    }

    #[test]
    fn degree_of_adaptation_values() {
        // CIE 159:2004 eq. 2.3 evaluated independently (Python math module):
        // F = 1, L_A = 318.31 cd/m² → D = 1 − exp(−360.31/92)/3.6 = 0.99446878.
        assert!((degree_of_adaptation_cie159(1.0, 318.31) - 0.994_468_78).abs() < 1e-8);
        // Very dark adapting field with a dark surround: D = 0.8·(1 − e^(−42/92)/3.6) ≈ 0.624.
        let d = degree_of_adaptation_cie159(0.8, 0.0);
        assert!((d - 0.8 * (1.0 - (-42.0f64 / 92.0).exp() / 3.6)).abs() < 1e-15);
        assert!((0.0..=1.0).contains(&degree_of_adaptation_cie159(1.0, 1e9)));
    }
}
