//! The rendering-quality goal from the search model's sums: TM-30 Rf and Rg
//! and CIE 13.3 R9 without rebuilding the spectrum.
//!
//! The test light's side is linear in the sources' levels: the XYZ (CIE 1964
//! 10°, 380–780 nm, CIE 224's range) of the 99 colour evaluation samples and
//! of the light, and the XYZ (CIE 1931 2°, 360–830 nm) of the light and of
//! test colour sample 9 — 309 numbers per source option ([`QUALITY_WIDTH`]).
//! The reference's side depends only on the CCT, so it is computed once per
//! node of a 0.5 mired grid and shared by every candidate whose CCT falls
//! there (a reference off by at most 0.25 mired moves Rf by a few hundredths).
//! Then per candidate: CAM02-UCS of the 99 samples, ΔE′, Rf; the 16 hue-bin
//! averages and Rg; the von Kries step and U*V*W* difference of R9 — the
//! same formulas as `lampwright_color::tm30` and `lampwright_color::cri`.
//! Final figures always come from the full evaluation.
//!
//! **Screening.** The columns are ordered so that 16 samples — in each TM-30
//! hue bin, the one of highest chroma under a 4000 K reference — come first.
//! [`FastQuality::screen`] computes Rf and Rg from those 16 alone (with R9 in
//! full): a proxy six times cheaper that the search uses to pick which of a
//! sweep's candidates to score in full ([`FastQuality::figures`]).
//!
//! # References
//! - ANSI/IES TM-30-20; CIE 224:2017, doi:10.25039/TR.224.2017 (Rf, Rg, bins).
//! - CIE 13.3-1995 §5 (von Kries in CIE 1960 (u, v), U*V*W*, Ri = 100 − 4.6 ΔE).

use crate::error::{PlanError, Result};
use lampwright_camera::TrainingSet;
use lampwright_color::cam02::{Cam02Ucs, delta_e_cam02ucs};
use lampwright_color::cct::cct_ohno2014;
use lampwright_color::cri::{cri_reference, test_colour_samples};
use lampwright_color::observer::Observer;
use lampwright_color::spaces::Uv1960;
use lampwright_color::spectrum::{GRID_START_NM, Reflectance};
use lampwright_color::tm30::{TM30_BINS, TM30_CES_COUNT, rf_from_delta_e, tm30_reference};
use lampwright_color::tristimulus::{Xyz, xyz_sums};
use std::collections::HashMap;

/// Numbers per source option for the quality goal.
pub(crate) const QUALITY_WIDTH: usize = 9 + 3 * TM30_CES_COUNT;

/// Offset of test colour sample 9's XYZ.
const TCS9: usize = 3;
/// Offset of the light's 10° XYZ (380–780 nm).
const WHITE10: usize = 6;
/// Offset of the samples' 10° XYZ.
const CES: usize = 9;

/// CIE 224 window on the grid.
const WINDOW: std::ops::RangeInclusive<usize> =
    (380 - GRID_START_NM as usize)..=(780 - GRID_START_NM as usize);

/// Reference nodes per mired.
const NODES_PER_MIRED: f64 = 2.0;

/// Reference nodes per mired for the screening proxy.
const SCREEN_NODES_PER_MIRED: f64 = 0.5;

/// Reference CCT at which the screening samples are chosen, K.
const SCREEN_REFERENCE_K: f64 = 4000.0;

/// The reflectances the quality columns use.
pub(crate) struct QualitySamples {
    ces: Vec<Reflectance>,
    tcs9: Reflectance,
    /// Column offset of each CES's XYZ (screening samples first).
    offset: Vec<usize>,
    /// The screening samples, one per hue bin in bin order.
    screen: Vec<usize>,
    /// Per CES, `ρ·x̄₁₀, ρ·ȳ₁₀, ρ·z̄₁₀` over the CIE 224 window.
    ces_rows: Vec<[Vec<f64>; 3]>,
    /// `x̄₁₀, ȳ₁₀, z̄₁₀` over the CIE 224 window.
    white10: [Vec<f64>; 3],
}

impl QualitySamples {
    /// The 99 CES (CIE 224) and TCS09 (CIE 13.3).
    pub fn load() -> Result<QualitySamples> {
        let training = TrainingSet::standard().map_err(PlanError::Camera)?;
        // The standard training set starts with CES01–CES99 read from the same
        // CIE 224 table TM-30 uses.
        let ces = training
            .reflectances()
            .get(..TM30_CES_COUNT)
            .map(<[Reflectance]>::to_vec)
            .ok_or_else(|| PlanError::Invalid {
                field: "advisor".into(),
                message: "the standard training set lacks the 99 CIE 224 samples".into(),
            })?;
        let tcs9 = test_colour_samples()?
            .get(8)
            .cloned()
            .ok_or_else(|| PlanError::Invalid {
                field: "advisor".into(),
                message: "CIE 13.3 test colour sample 9 is missing".into(),
            })?;
        let o10 = Observer::cie1964_10deg();
        let cmf = [&o10.x_bar, &o10.y_bar, &o10.z_bar];
        let white10 = cmf.map(|c| c[WINDOW].to_vec());
        let ces_rows = ces
            .iter()
            .map(|r| cmf.map(|c| WINDOW.map(|i| r.values()[i] * c[i]).collect()))
            .collect();
        let mut samples = QualitySamples {
            ces,
            tcs9,
            offset: (0..TM30_CES_COUNT).map(|j| CES + 3 * j).collect(),
            screen: Vec::new(),
            ces_rows,
            white10,
        };
        // One sample per hue bin, the most chromatic under a 4000 K reference.
        let node =
            RefNode::new(&samples, SCREEN_REFERENCE_K).ok_or_else(|| PlanError::Invalid {
                field: "advisor".into(),
                message: "the TM-30 reference at 4000 K could not be computed".into(),
            })?;
        let mut best: [Option<(usize, f64)>; TM30_BINS] = [None; TM30_BINS];
        for (j, (jab, b)) in node.jab.iter().zip(&node.bin).enumerate() {
            let chroma = jab[1].hypot(jab[2]);
            if best[*b].is_none_or(|(_, c)| chroma > c) {
                best[*b] = Some((j, chroma));
            }
        }
        samples.screen = best.iter().flatten().map(|(j, _)| *j).collect();
        let mut order: Vec<usize> = samples.screen.clone();
        order.extend((0..TM30_CES_COUNT).filter(|j| !samples.screen.contains(j)));
        for (slot, j) in order.iter().enumerate() {
            samples.offset[*j] = CES + 3 * slot;
        }
        Ok(samples)
    }

    /// Columns the screening proxy needs (a prefix of the full columns).
    pub fn screen_width(&self) -> usize {
        CES + 3 * self.screen.len()
    }

    /// The quality columns at grid index `i` (before the lamp factor).
    pub fn columns(&self, i: usize, row: &mut [f64]) {
        let o2 = Observer::cie1931_2deg();
        let o10 = Observer::cie1964_10deg();
        row[0] = o2.x_bar[i];
        row[1] = o2.y_bar[i];
        row[2] = o2.z_bar[i];
        let r9 = self.tcs9.values()[i];
        row[TCS9] = r9 * o2.x_bar[i];
        row[TCS9 + 1] = r9 * o2.y_bar[i];
        row[TCS9 + 2] = r9 * o2.z_bar[i];
        let inside = WINDOW.contains(&i);
        let w = if inside { 1.0 } else { 0.0 };
        row[WHITE10] = w * o10.x_bar[i];
        row[WHITE10 + 1] = w * o10.y_bar[i];
        row[WHITE10 + 2] = w * o10.z_bar[i];
        for (s, o) in self.ces.iter().zip(&self.offset) {
            let rho = w * s.values()[i];
            let o = *o;
            row[o] = rho * o10.x_bar[i];
            row[o + 1] = rho * o10.y_bar[i];
            row[o + 2] = rho * o10.z_bar[i];
        }
    }
}

/// CIE 13.3 §5.5 adaptation functions: c = (4 − u − 10v)/v, d = (1.708v + 0.404 − 1.481u)/v.
fn c_d(uv: Uv1960) -> (f64, f64) {
    (
        (4.0 - uv.u - 10.0 * uv.v) / uv.v,
        (1.708 * uv.v + 0.404 - 1.481 * uv.u) / uv.v,
    )
}

/// CIE 1964 U*V*W* (CIE 13.3 eqs. 8–9).
fn uvw_1964(y: f64, uv: Uv1960, white: Uv1960) -> [f64; 3] {
    let w = 25.0 * y.cbrt() - 17.0;
    [13.0 * w * (uv.u - white.u), 13.0 * w * (uv.v - white.v), w]
}

/// CIE 13.3 R9's reference side at one CCT.
struct R9Reference {
    /// (u, v) of the reference white.
    white_uv: Uv1960,
    /// CIE 13.3 c, d of the reference white.
    white_cd: (f64, f64),
    /// U*V*W* of TCS09 under the reference.
    tcs9_uvw: [f64; 3],
}

impl R9Reference {
    fn new(samples: &QualitySamples, cct_k: f64) -> Option<R9Reference> {
        let (cri_spd, _) = cri_reference(cct_k).ok()?;
        let o2 = Observer::cie1931_2deg();
        let wr = xyz_sums(cri_spd.values(), o2);
        if !positive(wr.y) {
            return None;
        }
        let sr = xyz_sums((&cri_spd * &samples.tcs9).values(), o2).scaled(100.0 / wr.y);
        let uv_r = Uv1960::from_xyz(wr);
        Some(R9Reference {
            white_uv: uv_r,
            white_cd: c_d(uv_r),
            tcs9_uvw: uvw_1964(sr.y, Uv1960::from_xyz(sr), uv_r),
        })
    }
}

/// The TM-30 reference at `cct_k`: CAM02-UCS J′a′b′ of the samples `which`.
fn reference_jab(
    samples: &QualitySamples,
    cct_k: f64,
    which: &mut dyn Iterator<Item = usize>,
) -> Option<Vec<(usize, [f64; 3])>> {
    let (spd, _, _) = tm30_reference(cct_k).ok()?;
    let l = &spd.values()[WINDOW];
    let white = samples.white10.each_ref().map(|row| dot(row, l));
    if !positive(white[1]) {
        return None;
    }
    let k = 100.0 / white[1];
    let ucs = Cam02Ucs::tm30(Xyz::new(white[0] * k, 100.0, white[2] * k)).ok()?;
    Some(
        which
            .map(|j| {
                let rows = &samples.ces_rows[j];
                let xyz = Xyz::new(
                    dot(&rows[0], l) * k,
                    dot(&rows[1], l) * k,
                    dot(&rows[2], l) * k,
                );
                (j, ucs.jab(xyz))
            })
            .collect(),
    )
}

/// Whether `x` is a positive number (false for NaN).
pub(crate) fn positive(x: f64) -> bool {
    x > 0.0
}

fn dot(a: &[f64], b: &[f64]) -> f64 {
    a.iter().zip(b).map(|(x, y)| x * y).sum()
}

/// The reference's side at one CCT node, for the full figures.
struct RefNode {
    jab: Vec<[f64; 3]>,
    bin: Vec<usize>,
    count: [usize; TM30_BINS],
    area_r: f64,
    r9: R9Reference,
}

/// The reference's side at one CCT node, for the screening proxy.
struct ScreenNode {
    jab: Vec<[f64; 3]>,
    area_r: f64,
    r9: R9Reference,
}

fn area(pts: &[[f64; 2]; TM30_BINS]) -> f64 {
    (0..TM30_BINS)
        .map(|i| {
            let (a, b) = (pts[i], pts[(i + 1) % TM30_BINS]);
            a[0] * b[1] - a[1] * b[0]
        })
        .sum::<f64>()
        / 2.0
}

impl RefNode {
    fn new(samples: &QualitySamples, cct_k: f64) -> Option<RefNode> {
        let jabs = reference_jab(samples, cct_k, &mut (0..TM30_CES_COUNT))?;
        let mut jab = Vec::with_capacity(TM30_CES_COUNT);
        let mut bin = Vec::with_capacity(TM30_CES_COUNT);
        let mut count = [0usize; TM30_BINS];
        let mut sums = [[0.0; 2]; TM30_BINS];
        for (_, j) in jabs {
            let hue = j[2].atan2(j[1]).to_degrees().rem_euclid(360.0);
            let b = ((hue / 22.5).floor() as usize).min(TM30_BINS - 1);
            count[b] += 1;
            sums[b][0] += j[1];
            sums[b][1] += j[2];
            jab.push(j);
            bin.push(b);
        }
        if count.contains(&0) {
            return None;
        }
        let avg: [[f64; 2]; TM30_BINS] =
            std::array::from_fn(|b| [sums[b][0] / count[b] as f64, sums[b][1] / count[b] as f64]);
        Some(RefNode {
            jab,
            bin,
            count,
            area_r: area(&avg),
            r9: R9Reference::new(samples, cct_k)?,
        })
    }
}

impl ScreenNode {
    fn new(samples: &QualitySamples, cct_k: f64) -> Option<ScreenNode> {
        let jab: Vec<[f64; 3]> =
            reference_jab(samples, cct_k, &mut samples.screen.iter().copied())?
                .into_iter()
                .map(|(_, j)| j)
                .collect();
        let mut pts = [[0.0; 2]; TM30_BINS];
        for (p, j) in pts.iter_mut().zip(&jab) {
            *p = [j[1], j[2]];
        }
        Some(ScreenNode {
            jab,
            area_r: area(&pts),
            r9: R9Reference::new(samples, cct_k)?,
        })
    }
}

/// Rf, Rg and R9 of candidates from their quality sums.
pub(crate) struct FastQuality {
    samples: QualitySamples,
    nodes: HashMap<i64, Option<RefNode>>,
    screen_nodes: HashMap<i64, Option<ScreenNode>>,
}

/// Node key of a CCT on a grid of `per_mired` nodes per mired, and the node's CCT.
fn node_key(cct_k: f64, per_mired: f64) -> (i64, f64) {
    let key = (1e6 / cct_k * per_mired).round() as i64;
    (key, 1e6 * per_mired / key as f64)
}

impl FastQuality {
    /// Ready to score.
    pub fn new(samples: QualitySamples) -> FastQuality {
        FastQuality {
            samples,
            nodes: HashMap::new(),
            screen_nodes: HashMap::new(),
        }
    }

    /// The samples (for the model's columns).
    pub fn samples(&self) -> &QualitySamples {
        &self.samples
    }

    /// CCT and (u, v) of a light with 2° XYZ `wt`.
    fn cct_uv(wt: Xyz) -> Option<(f64, Uv1960)> {
        if !positive(wt.y) {
            return None;
        }
        let uv_t = Uv1960::from_xyz(wt);
        Some((cct_ohno2014(uv_t).ok()?.cct_k, uv_t))
    }

    /// `(Rf, Rg, R9)` of a mix given its [`QUALITY_WIDTH`] sums; `None` when the
    /// light has no CCT or a step fails.
    pub fn figures(&mut self, mixed: &[f64]) -> Option<(f64, f64, f64)> {
        let wt = Xyz::new(mixed[0], mixed[1], mixed[2]);
        let (cct_k, uv_t) = Self::cct_uv(wt)?;
        let (key, node_k) = node_key(cct_k, NODES_PER_MIRED);
        let samples = &self.samples;
        let node = self
            .nodes
            .entry(key)
            .or_insert_with(|| RefNode::new(samples, node_k))
            .as_ref()?;
        let ucs = test_ucs(mixed)?;
        let mut sum_de = 0.0;
        let mut sums = [[0.0; 2]; TM30_BINS];
        for (j, (r, b)) in node.jab.iter().zip(&node.bin).enumerate() {
            let t = ucs.jab(&mixed[self.samples.offset[j]..]);
            sum_de += delta_e_cam02ucs(t, *r);
            sums[*b][0] += t[1];
            sums[*b][1] += t[2];
        }
        let rf = rf_from_delta_e(sum_de / TM30_CES_COUNT as f64);
        let avg: [[f64; 2]; TM30_BINS] = std::array::from_fn(|b| {
            [
                sums[b][0] / node.count[b] as f64,
                sums[b][1] / node.count[b] as f64,
            ]
        });
        let rg = 100.0 * area(&avg) / node.area_r;
        let r9 = r9_of(&node.r9, mixed, wt, uv_t);
        (rf.is_finite() && rg.is_finite() && r9.is_finite()).then_some((rf, rg, r9))
    }

    /// The screening proxy of `(Rf, Rg, R9)` from the first
    /// [`QualitySamples::screen_width`] sums: Rf and Rg from one sample per
    /// hue bin, R9 in full.
    pub fn screen(&mut self, mixed: &[f64]) -> Option<(f64, f64, f64)> {
        let wt = Xyz::new(mixed[0], mixed[1], mixed[2]);
        let (cct_k, uv_t) = Self::cct_uv(wt)?;
        let (key, node_k) = node_key(cct_k, SCREEN_NODES_PER_MIRED);
        let samples = &self.samples;
        let node = self
            .screen_nodes
            .entry(key)
            .or_insert_with(|| ScreenNode::new(samples, node_k))
            .as_ref()?;
        let ucs = test_ucs(mixed)?;
        let mut sum_de = 0.0;
        let mut test = [[0.0; 2]; TM30_BINS];
        for (slot, (j, r)) in samples.screen.iter().zip(&node.jab).enumerate() {
            let t = ucs.jab(&mixed[samples.offset[*j]..]);
            sum_de += delta_e_cam02ucs(t, *r);
            test[slot] = [t[1], t[2]];
        }
        let n = samples.screen.len().max(1) as f64;
        let rf = rf_from_delta_e(sum_de / n);
        let rg = 100.0 * area(&test) / node.area_r;
        let r9 = r9_of(&node.r9, mixed, wt, uv_t);
        (rf.is_finite() && rg.is_finite() && r9.is_finite()).then_some((rf, rg, r9))
    }
}

/// CAM02-UCS for the test light's 10° white (scaled to Y = 100).
struct TestUcs {
    ucs: Cam02Ucs,
    k: f64,
}

impl TestUcs {
    fn jab(&self, xyz: &[f64]) -> [f64; 3] {
        self.ucs
            .jab(Xyz::new(xyz[0] * self.k, xyz[1] * self.k, xyz[2] * self.k))
    }
}

fn test_ucs(mixed: &[f64]) -> Option<TestUcs> {
    let w10 = Xyz::new(mixed[WHITE10], mixed[WHITE10 + 1], mixed[WHITE10 + 2]);
    if !positive(w10.y) {
        return None;
    }
    let k = 100.0 / w10.y;
    Some(TestUcs {
        ucs: Cam02Ucs::tm30(w10.scaled(k)).ok()?,
        k,
    })
}

/// CIE 13.3 R9: the test colour von Kries-adapted to the reference, U*V*W*.
fn r9_of(node: &R9Reference, mixed: &[f64], wt: Xyz, uv_t: Uv1960) -> f64 {
    let (ct, dt) = c_d(uv_t);
    let (cr, dr) = node.white_cd;
    let st = Xyz::new(mixed[TCS9], mixed[TCS9 + 1], mixed[TCS9 + 2]).scaled(100.0 / wt.y);
    let (cti, dti) = c_d(Uv1960::from_xyz(st));
    let (kc, kd) = (cr / ct * cti, dr / dt * dti);
    let den = 16.518 + 1.481 * kc - kd;
    let adapted = Uv1960 {
        u: (10.872 + 0.404 * kc - 4.0 * kd) / den,
        v: 5.520 / den,
    };
    let e_t = uvw_1964(st.y, adapted, node.white_uv);
    let e_r = node.tcs9_uvw;
    let de9 =
        ((e_t[0] - e_r[0]).powi(2) + (e_t[1] - e_r[1]).powi(2) + (e_t[2] - e_r[2]).powi(2)).sqrt();
    100.0 - 4.6 * de9
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_color::illuminant::StandardIlluminant;

    #[test]
    fn matches_the_full_metrics_on_standard_lamps() {
        // Against lampwright_color's own TM-30 and CRI (which are checked
        // against colour-science 0.4.7 in the colour crate's reference tests).
        let samples = QualitySamples::load().unwrap();
        let mut fast = FastQuality::new(QualitySamples::load().unwrap());
        for ill in [
            StandardIlluminant::F(2),
            StandardIlluminant::F(11),
            StandardIlluminant::A,
            StandardIlluminant::D65,
        ] {
            let spd = ill.spd().unwrap();
            let mut mixed = vec![0.0; QUALITY_WIDTH];
            let mut row = vec![0.0; QUALITY_WIDTH];
            for i in 0..lampwright_color::GRID_LEN {
                samples.columns(i, &mut row);
                for (m, r) in mixed.iter_mut().zip(&row) {
                    *m += spd.values()[i] * r;
                }
            }
            let (rf, rg, r9) = fast.figures(&mixed).unwrap();
            let t = lampwright_color::tm30::tm30(&spd).unwrap();
            let c = lampwright_color::cri::cri_cie133(&spd).unwrap();
            // The reference node sits within 0.25 mired of the lamp's CCT.
            assert!(
                (rf - t.rf).abs() < 0.05,
                "{}: Rf {rf} vs {}",
                ill.name(),
                t.rf
            );
            assert!(
                (rg - t.rg).abs() < 0.05,
                "{}: Rg {rg} vs {}",
                ill.name(),
                t.rg
            );
            assert!(
                (r9 - c.r[8]).abs() < 0.2,
                "{}: R9 {r9} vs {}",
                ill.name(),
                c.r[8]
            );
        }
    }
}
