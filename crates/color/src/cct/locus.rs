//! The Planckian locus in CIE 1960 (u, v): points, normals, isotemperature lines.
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §9.5 (Planckian locus, isotemperature lines).
//! - Planck's law with c2 = 1.4388 × 10⁻² m·K (CIE 15:2018 §3.1).

use super::mired;
use crate::error::{ColorError, Result};
use crate::illuminant::{C2_M_K, PLANCKIAN_RANGE_K};
use crate::observer::Observer;
use crate::spaces::Uv1960;
use crate::spectrum::{GRID_LEN, grid_wavelength_nm};
use crate::tristimulus::xyz_sums;

/// c2 in nm·K.
const C2_NM_K: f64 = C2_M_K * 1e9;

/// (u, v) of a Planckian radiator given its reciprocal temperature in mired;
/// `mired = 0` is the limit T → ∞ (Rayleigh–Jeans, λ⁻⁴). Summed at 1 nm over
/// 360–830 nm with the CIE 1931 2° observer.
pub(crate) fn planckian_uv_from_mired(mired: f64) -> (f64, f64) {
    let obs = Observer::cie1931_2deg();
    let inv_t = mired * 1e-6;
    let mut spd = [0.0; GRID_LEN];
    for (i, s) in spd.iter_mut().enumerate() {
        let wl = grid_wavelength_nm(i);
        // Relative scale only: λ in units of 500 nm keeps numbers near 1.
        let wl_rel = wl / 500.0;
        *s = if inv_t == 0.0 {
            wl_rel.powi(-4)
        } else {
            wl_rel.powi(-5) / (C2_NM_K * inv_t / wl).exp_m1() * (C2_NM_K * inv_t / 500.0)
        };
    }
    let uv = Uv1960::from_xyz(xyz_sums(&spd, obs));
    (uv.u, uv.v)
}

/// CIE 1960 (u, v) of the Planckian radiator at `t_k` (CIE 1931 2° observer,
/// 1 nm sums over 360–830 nm, c2 = 1.4388 × 10⁻² m·K).
///
/// Valid for 100 K – 1 000 000 K (the range of [`crate::illuminant::planckian`]);
/// used for the CCT tables and for plotting the locus.
pub fn planckian_uv(t_k: f64) -> Result<Uv1960> {
    if !(t_k.is_finite() && (PLANCKIAN_RANGE_K.0..=PLANCKIAN_RANGE_K.1).contains(&t_k)) {
        return Err(ColorError::OutOfRange {
            what: "Planckian temperature (K)",
            value: t_k,
            range: "100–1 000 000 K",
        });
    }
    let (u, v) = planckian_uv_from_mired(1e6 / t_k);
    Ok(Uv1960 { u, v })
}

/// Unit normal to the Planckian locus at `t_k`, pointing to positive Duv (up in v).
pub(crate) fn locus_normal(t_k: f64) -> Result<(f64, f64)> {
    // Central difference in mired: well conditioned at any temperature.
    let m = mired(t_k)?;
    let h = (m * 1e-4).max(1e-6);
    let (u0, v0) = planckian_uv_from_mired(m + h);
    let (u1, v1) = planckian_uv_from_mired((m - h).max(0.0));
    let (du, dv) = (u1 - u0, v1 - v0);
    let len = du.hypot(dv);
    if len == 0.0 || !len.is_finite() {
        return Err(ColorError::Numerical(format!(
            "Planckian locus has no direction at {t_k} K"
        )));
    }
    // u falls monotonically with T, so the normal's v component is never zero.
    let (nu, nv) = (-dv / len, du / len);
    Ok(if nv < 0.0 { (-nu, -nv) } else { (nu, nv) })
}

/// The point at `cct_k` and `duv`: the Planckian point moved `duv` along the
/// isotemperature line (perpendicular to the locus in (u, v)).
///
/// The inverse of [`cct_ohno2014`]; valid wherever [`planckian_uv`] is.
pub fn uv_from_cct_duv(cct_k: f64, duv: f64) -> Result<Uv1960> {
    if !duv.is_finite() {
        return Err(ColorError::InvalidInput(
            "Duv is not a finite number".into(),
        ));
    }
    let p = planckian_uv(cct_k)?;
    let (nu, nv) = locus_normal(cct_k)?;
    Ok(Uv1960 {
        u: p.u + duv * nu,
        v: p.v + duv * nv,
    })
}

/// End points of the isotemperature line of `t_k` from Duv = −`duv_span`
/// to Duv = +`duv_span` in (u, v), for plotting.
pub fn isotemperature_line_uv(t_k: f64, duv_span: f64) -> Result<[Uv1960; 2]> {
    if !(duv_span.is_finite() && duv_span >= 0.0) {
        return Err(ColorError::InvalidInput(format!(
            "isotemperature line half-length {duv_span} must be a finite number ≥ 0"
        )));
    }
    Ok([
        uv_from_cct_duv(t_k, -duv_span)?,
        uv_from_cct_duv(t_k, duv_span)?,
    ])
}
