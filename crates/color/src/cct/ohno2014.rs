//! Ohno's (2014) combined triangular / parabolic CCT method.
//!
//! # References
//! - Ohno, Y. (2014). Practical use and calculation of CCT and Duv.
//!   *LEUKOS* 10(1), 47–55. doi:10.1080/15502724.2014.839020

use super::locus::planckian_uv_from_mired;
use super::{CctDuv, check_result, check_uv};
use crate::error::{ColorError, Result};
use crate::spaces::Uv1960;
use std::sync::LazyLock;

/// Ohno (2014) §3: the parabolic solution on a 1 % table is low by a
/// systematic 0.009 %, corrected by this factor.
pub const OHNO2014_PARABOLIC_CORRECTION: f64 = 0.99991;

/// Ohno (2014): below this |Duv| the triangular solution is used.
const OHNO2014_TRIANGULAR_DUV: f64 = 0.002;

/// Planckian table: temperatures in geometric progression and their (u, v).
struct PlanckTable {
    t_k: Vec<f64>,
    u: Vec<f64>,
    v: Vec<f64>,
}

impl PlanckTable {
    fn geometric(start_k: f64, end_k: f64, ratio: f64) -> PlanckTable {
        let mut t_k = Vec::new();
        let mut t = start_k;
        while t <= end_k * ratio {
            t_k.push(t);
            t *= ratio;
        }
        let (u, v) = t_k.iter().map(|t| planckian_uv_from_mired(1e6 / t)).unzip();
        PlanckTable { t_k, u, v }
    }

    fn dist2(&self, i: usize, u: f64, v: f64) -> f64 {
        let (du, dv) = (self.u[i] - u, self.v[i] - v);
        du * du + dv * dv
    }

    /// Index of the nearest entry in `lo..hi`.
    fn nearest(&self, u: f64, v: f64, lo: usize, hi: usize) -> usize {
        let mut best = lo;
        let mut best_d = f64::INFINITY;
        for i in lo..hi {
            let d = self.dist2(i, u, v);
            if d < best_d {
                best_d = d;
                best = i;
            }
        }
        best
    }
}

/// Ohno's table of 1 % steps, the spacing for which his parabolic correction was derived.
/// Spans 900–22 000 K so that every CCT in [`CCT_RANGE_K`] has neighbours on both sides.
static TABLE_1PCT: LazyLock<PlanckTable> =
    LazyLock::new(|| PlanckTable::geometric(900.0, 22_000.0, 1.01));
/// The cascade: 0.1 % steps, searched only between the 1 % neighbours.
static TABLE_01PCT: LazyLock<PlanckTable> =
    LazyLock::new(|| PlanckTable::geometric(900.0, 22_000.0, 1.001));

/// (u, v) of the Planckian locus at `t_k` by quadratic interpolation in ln T on
/// the 0.1 % table (agrees with the direct sum to about 1e-10); `None` outside
/// the table (900–22 000 K). Saves the 471 exponentials of a direct sum.
pub(crate) fn planckian_uv_tabulated(t_k: f64) -> Option<(f64, f64)> {
    let t = &*TABLE_01PCT;
    let n = t.t_k.len();
    if n < 3 || !(t.t_k[0]..=t.t_k[n - 1]).contains(&t_k) {
        return None;
    }
    let i = t.t_k.partition_point(|x| *x < t_k).clamp(1, n - 2);
    let x = t_k.ln();
    let (x0, x1, x2) = (t.t_k[i - 1].ln(), t.t_k[i].ln(), t.t_k[i + 1].ln());
    let l0 = (x - x1) * (x - x2) / ((x0 - x1) * (x0 - x2));
    let l1 = (x - x0) * (x - x2) / ((x1 - x0) * (x1 - x2));
    let l2 = (x - x0) * (x - x1) / ((x2 - x0) * (x2 - x1));
    Some((
        l0 * t.u[i - 1] + l1 * t.u[i] + l2 * t.u[i + 1],
        l0 * t.v[i - 1] + l1 * t.v[i] + l2 * t.v[i + 1],
    ))
}
/// Triangular solution (Ohno 2014 eqs. 3–6) on the entries `m − 1`, `m + 1`.
fn triangular(t: &PlanckTable, m: usize, u: f64, v: f64) -> CctDuv {
    let (p, n) = (m - 1, m + 1);
    let dp = t.dist2(p, u, v).sqrt();
    let dn = t.dist2(n, u, v).sqrt();
    let l = (t.u[n] - t.u[p]).hypot(t.v[n] - t.v[p]);
    let x = (dp * dp - dn * dn + l * l) / (2.0 * l);
    let cct_k = t.t_k[p] + (t.t_k[n] - t.t_k[p]) * x / l;
    let v_x = t.v[p] + (t.v[n] - t.v[p]) * x / l;
    let duv = (dp * dp - x * x).max(0.0).sqrt() * (v - v_x).signum();
    CctDuv { cct_k, duv }
}

/// Parabolic solution (Ohno 2014 eqs. 7–11) on the entries `m − 1`, `m`, `m + 1`:
/// the vertex T of the parabola through the three distances, and its Duv.
/// No correction factor is applied here.
fn parabolic(t: &PlanckTable, m: usize, u: f64, v: f64, sign: f64) -> CctDuv {
    let (tp, ti, tn) = (t.t_k[m - 1], t.t_k[m], t.t_k[m + 1]);
    let dp = t.dist2(m - 1, u, v).sqrt();
    let di = t.dist2(m, u, v).sqrt();
    let dn = t.dist2(m + 1, u, v).sqrt();
    let x = (tn - ti) * (tp - tn) * (ti - tp);
    let a = (tp * (dn - di) + ti * (dp - dn) + tn * (di - dp)) / x;
    let b = -(tp * tp * (dn - di) + ti * ti * (dp - dn) + tn * tn * (di - dp)) / x;
    let c = -(dp * (tn - ti) * ti * tn + di * (tp - tn) * tp * tn + dn * (ti - tp) * tp * ti) / x;
    let t_x = -b / (2.0 * a);
    CctDuv {
        cct_k: t_x,
        duv: sign * (a * t_x * t_x + b * t_x + c),
    }
}

/// CCT and Duv from CIE 1960 (u, v) by Ohno's (2014) combined method.
///
/// 1. Nearest entry `m` of a Planckian table in 1 % steps (Ohno's recommended
///    spacing), then the nearest entry of a 0.1 % table between the 1 %
///    neighbours (a one-step cascade).
/// 2. |Duv| < 0.002: triangular solution on the 0.1 % neighbours.
///    Otherwise: parabolic solution on the 1 % neighbours with T multiplied by
///    0.99991 as the paper prescribes. That factor removes the parabola's
///    systematic bias at 1 % spacing; on a finer table it would over-correct
///    (by up to 1.8 K at 20 000 K), which is why T comes from the 1 % table.
///    Duv comes from the same parabola on the 0.1 % neighbours: at 1 % spacing
///    the parabola's Duv is off by up to 3 × 10⁻⁵ just above |Duv| = 0.002,
///    where the distance curve is still far from a parabola.
///
/// colour-science 0.4.7 (`uv_to_CCT_Ohno2013`) uses a single 0.1 % table and
/// omits the correction factor; the two agree within 0.5 K over the valid range.
///
/// Errors: [`ColorError::OutOfRange`] outside [`CCT_RANGE_K`] or beyond
/// |Duv| = [`DUV_LIMIT`]; [`ColorError::InvalidInput`] for non-finite or non-positive (u, v).
///
/// # References
/// - Ohno, Y. (2014). *LEUKOS* 10(1), 47–55. doi:10.1080/15502724.2014.839020
pub fn cct_ohno2014(uv: Uv1960) -> Result<CctDuv> {
    let (u, v) = check_uv(uv)?;
    let coarse = &*TABLE_1PCT;
    let n = coarse.t_k.len();
    let m = coarse.nearest(u, v, 0, n);
    if m == 0 || m + 1 >= n {
        // The nearest Planckian point is at the end of the table: far outside the range.
        let t_k = coarse.t_k[m];
        return Err(ColorError::OutOfRange {
            what: "CCT (K)",
            value: t_k,
            range: "1000–20 000 K",
        });
    }
    let fine = &*TABLE_01PCT;
    let lo = fine.t_k.partition_point(|t| *t < coarse.t_k[m - 1]);
    let hi = fine
        .t_k
        .partition_point(|t| *t <= coarse.t_k[m + 1])
        .min(fine.t_k.len());
    let k = fine.nearest(u, v, lo, hi).clamp(1, fine.t_k.len() - 2);
    let tri = triangular(fine, k, u, v);
    let result = if tri.duv.abs() < OHNO2014_TRIANGULAR_DUV {
        tri
    } else {
        let sign = if tri.duv < 0.0 { -1.0 } else { 1.0 };
        CctDuv {
            cct_k: parabolic(coarse, m, u, v, sign).cct_k * OHNO2014_PARABOLIC_CORRECTION,
            duv: parabolic(fine, k, u, v, sign).duv,
        }
    };
    check_result(result)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::cct::{CctMethod, cct_duv, cct_robertson1968, planckian_uv, uv_from_cct_duv};

    #[test]
    fn tabulated_locus_matches_direct_sum() {
        for i in 0..200 {
            let t = 950.0 * (22.0_f64).powf(f64::from(i) / 200.0);
            let (u, v) = planckian_uv_tabulated(t).unwrap();
            let p = planckian_uv(t).unwrap();
            assert!((u - p.u).abs() < 1e-9 && (v - p.v).abs() < 1e-9, "{t}");
        }
        assert!(planckian_uv_tabulated(500.0).is_none());
    }

    #[test]
    fn planckian_points_return_their_temperature() {
        // Ohno (2014): a point on the locus has CCT = T and Duv = 0.
        for i in 0..=60 {
            let t = 1000.0 * (20.0_f64).powf(f64::from(i) / 60.0);
            let uv = planckian_uv(t).unwrap();
            let r = cct_duv(uv, CctMethod::Ohno2014).unwrap();
            assert!((r.cct_k - t).abs() < 0.5, "{t}: {r:?}");
            assert!(r.duv.abs() < 1e-5, "{t}: {r:?}");
            // Robertson: exact on its isotherms, within 0.1 mired between them.
            let r = cct_duv(uv, CctMethod::Robertson1968).unwrap();
            assert!((1e6 / r.cct_k - 1e6 / t).abs() < 0.1, "{t}: {r:?}");
            assert!(r.duv.abs() < 1e-5, "{t}: {r:?}");
        }
    }

    /// Exhaustive reference: golden-section search of the distance to the locus in mired.
    fn exhaustive(uv: Uv1960) -> CctDuv {
        let Uv1960 { u, v } = uv;
        let d = |m: f64| {
            let (pu, pv) = planckian_uv_from_mired(m);
            (pu - u).hypot(pv - v)
        };
        let (mut a, mut b) = (40.0, 1100.0);
        // Coarse bracket first.
        let mut best = a;
        let mut k = a;
        while k <= b {
            if d(k) < d(best) {
                best = k;
            }
            k += 2.0;
        }
        a = best - 2.0;
        b = best + 2.0;
        let g = (5.0_f64.sqrt() - 1.0) / 2.0;
        for _ in 0..100 {
            let c = b - g * (b - a);
            let e = a + g * (b - a);
            if d(c) < d(e) { b = e } else { a = c }
        }
        let m = f64::midpoint(a, b);
        let (pu, pv) = planckian_uv_from_mired(m);
        let s = if v > pv { 1.0 } else { -1.0 };
        CctDuv {
            cct_k: 1e6 / m,
            duv: s * (pu - u).hypot(pv - v),
        }
    }

    #[test]
    fn ohno_is_within_one_kelvin_of_exhaustive_search() {
        for i in 0..=24 {
            let t = 1002.0 * (19.95_f64).powf(f64::from(i) / 24.0);
            for duv in [
                -0.0499, -0.03, -0.01, -0.004, -0.0019, -0.0005, 0.0, 0.0005, 0.0019, 0.0021,
                0.004, 0.01, 0.03, 0.0499,
            ] {
                let uv = uv_from_cct_duv(t, duv).unwrap();
                let want = exhaustive(uv);
                let got = cct_ohno2014(uv).unwrap();
                assert!(
                    (got.cct_k - want.cct_k).abs() < 1.0,
                    "T {t} Duv {duv}: {got:?} vs {want:?}"
                );
                assert!(
                    (got.duv - want.duv).abs() < 1e-5,
                    "T {t} Duv {duv}: {got:?} vs {want:?}"
                );
                assert!((got.duv - duv).abs() < 2e-5, "T {t} Duv {duv}: {got:?}");
                let rob = cct_robertson1968(uv).unwrap();
                // Robertson interpolates linearly in mired between isotherms 10–25 mired
                // apart: its error grows with Duv and mired, to 0.2 mired at |Duv| = 0.05.
                let mired_err = (1e6 / rob.cct_k - 1e6 / want.cct_k).abs();
                assert!(
                    mired_err < 0.2,
                    "Robertson T {t} Duv {duv}: {rob:?} vs {want:?}"
                );
                assert!(
                    (rob.duv - want.duv).abs() < 1e-5,
                    "Robertson T {t} Duv {duv}: {rob:?} vs {want:?}"
                );
            }
        }
    }
}
