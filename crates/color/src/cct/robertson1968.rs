//! Robertson's (1968) CCT method: interpolation between isotemperature lines.
//!
//! # References
//! - Robertson, A. R. (1968). Computation of correlated color temperature and
//!   distribution temperature. *JOSA* 58(11), 1528–1535. doi:10.1364/JOSA.58.001528

use super::locus::{locus_normal, planckian_uv_from_mired};
use super::ohno2014::planckian_uv_tabulated;
use super::{CctDuv, check_result, check_uv, kelvin_from_mired};
use crate::error::{ColorError, Result};
use crate::spaces::Uv1960;
use std::sync::LazyLock;

/// One isotemperature line of Robertson's method: mired, (u, v) on the locus, slope t.
struct Isotherm {
    mired: f64,
    u: f64,
    v: f64,
    /// Unit direction (du, dv) of the isotherm, pointing to positive Duv.
    dir: (f64, f64),
}

/// Robertson's 31 reciprocal temperatures (0–600 mired: every 10 to 100, then
/// every 25), continued every 25 mired to 1050 mired so that 1000 K is covered.
/// Positions and slopes are computed from the locus itself (1931 2°, 1 nm,
/// c2 = 1.4388e-2 m·K) rather than taken from Robertson's 1968 table, whose
/// values rest on the 1931 data at 5 nm and an older c2.
static ISOTHERMS: LazyLock<Vec<Isotherm>> = LazyLock::new(|| {
    let mireds = (0..=10)
        .map(|i| f64::from(i) * 10.0)
        .chain((5..=42).map(|i| f64::from(i) * 25.0));
    mireds
        .map(|m| {
            let (u, v) = planckian_uv_from_mired(m);
            let h = 0.01;
            let (u0, v0) = planckian_uv_from_mired(m + h);
            let (u1, v1) = planckian_uv_from_mired((m - h).max(0.0));
            let (du, dv) = (u1 - u0, v1 - v0);
            let len = du.hypot(dv);
            let (nu, nv) = (-dv / len, du / len);
            let dir = if nv < 0.0 { (-nu, -nv) } else { (nu, nv) };
            Isotherm {
                mired: m,
                u,
                v,
                dir,
            }
        })
        .collect()
});

/// CCT and Duv from CIE 1960 (u, v) by Robertson's (1968) method: the signed
/// distances of the point to neighbouring isotemperature lines give the
/// reciprocal temperature by linear interpolation in mired.
///
/// The isotherms are Robertson's 31 mired values continued to 1050 mired,
/// recomputed from the current locus (see the source). Duv is the signed
/// distance to the Planckian point at the resulting CCT.
/// colour-science 0.4.7 (`uv_to_CCT_Robertson1968`) uses the 1968 table
/// (0–600 mired only); it differs from Ohno (2014) by up to about 1 K.
///
/// Errors as [`cct_ohno2014`].
///
/// # References
/// - Robertson, A. R. (1968). *JOSA* 58(11), 1528–1535. doi:10.1364/JOSA.58.001528
/// - Wyszecki & Stiles (1982), *Color Science*, 2nd ed., §3.11 (the 31 isotherms).
pub fn cct_robertson1968(uv: Uv1960) -> Result<CctDuv> {
    let (u, v) = check_uv(uv)?;
    let lines = &*ISOTHERMS;
    // Signed distance along the locus direction: distance from the isotherm line.
    let dist = |l: &Isotherm| {
        // Perpendicular to the isotherm = along the locus.
        let (tu, tv) = (l.dir.1, -l.dir.0);
        (u - l.u) * tu + (v - l.v) * tv
    };
    let mut prev = dist(&lines[0]);
    for i in 1..lines.len() {
        let d = dist(&lines[i]);
        if prev == 0.0 || prev.signum() != d.signum() {
            let (a, b) = (&lines[i - 1], &lines[i]);
            let denom = prev - d;
            let frac = if denom.abs() < f64::MIN_POSITIVE {
                0.0
            } else {
                prev / denom
            };
            let m = a.mired + (b.mired - a.mired) * frac;
            let cct_k = kelvin_from_mired(m)?;
            // The locus point from the 0.1 % table, the normal from the two
            // isotherms' directions: no spectral sums in the hot path.
            let (pu, pv) =
                planckian_uv_tabulated(cct_k).unwrap_or_else(|| planckian_uv_from_mired(m));
            let (du, dv) = (
                a.dir.0 + (b.dir.0 - a.dir.0) * frac,
                a.dir.1 + (b.dir.1 - a.dir.1) * frac,
            );
            let len = du.hypot(dv);
            let (nu, nv) = if len > 0.0 {
                (du / len, dv / len)
            } else {
                locus_normal(cct_k)?
            };
            let duv = (u - pu) * nu + (v - pv) * nv;
            return check_result(CctDuv { cct_k, duv });
        }
        prev = d;
    }
    Err(ColorError::OutOfRange {
        what: "CCT (K)",
        value: 0.0,
        range: "1000–20 000 K (the point lies beyond every isotemperature line)",
    })
}
