//! The camera's own white locus: where the raw signal of a white lies for
//! lights along the Planckian locus (below 4000 K) and CIE daylight (4000 K and
//! above), and the colour temperature a camera infers from a neutral.
//!
//! Points are kept in log-chromaticity `(ln R/G, ln B/G)` of the raw signal,
//! every 5 mired from 40 mired (25 000 K) to 1000 mired (1000 K). A neutral's
//! estimated CCT is found by projecting its log-chromaticity onto the nearest
//! segment of this polyline and interpolating in mired; the distance to the
//! polyline says how plausible it is that the patch is a neutral under some
//! ordinary light.
//!
//! # References
//! - CIE 15:2018 §4.1 (Planckian radiator), §4.1.2 (CIE daylight, 4000–25 000 K).
//! - Finlayson, G. D. & Hordley, S. D. (2001), *Colour constancy at a pixel*,
//!   J. Opt. Soc. Am. A 18(2), 253–264, doi:10.1364/JOSAA.18.000253 (Planckian
//!   lights form a curve in camera log-chromaticity).

use crate::error::{CameraError, Result};
use crate::raw::raw_of_light;
use crate::sensitivities::{CameraSensitivities, SharedCamera};
use crate::white_balance::white_balance_light;
use std::collections::HashMap;
use std::sync::{Arc, LazyLock, Mutex, PoisonError};

/// Mired range of the locus: 40 mired (25 000 K) to 1000 mired (1000 K).
pub const LOCUS_MIRED_RANGE: (f64, f64) = (40.0, 1000.0);
/// Spacing of locus points, mired.
pub const LOCUS_STEP_MIRED: f64 = 5.0;

/// A camera's white locus in raw log-chromaticity.
#[derive(Debug, Clone, PartialEq)]
pub struct CameraLocus {
    mired: Vec<f64>,
    points: Vec<[f64; 2]>,
}

/// The nearest point of the locus to a neutral.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct LocusMatch {
    /// Estimated correlated colour temperature, K.
    pub cct_k: f64,
    /// Distance from the locus in raw log-chromaticity (≈ relative channel error).
    pub distance: f64,
}

static LOCUS_CACHE: LazyLock<Mutex<HashMap<u64, Arc<CameraLocus>>>> =
    LazyLock::new(|| Mutex::new(HashMap::new()));

/// Raw log-chromaticity `(ln R/G, ln B/G)`; `None` unless all channels are positive and finite.
#[must_use]
pub fn log_chromaticity(raw_rgb: [f64; 3]) -> Option<[f64; 2]> {
    let [r, g, b] = raw_rgb;
    let ok = |v: f64| v.is_finite() && v > 0.0;
    (ok(r) && ok(g) && ok(b)).then(|| [(r / g).ln(), (b / g).ln()])
}

impl CameraLocus {
    /// Compute the locus of `camera` (about 200 lights; use [`CameraLocus::for_camera`] to cache).
    pub fn new(camera: &CameraSensitivities) -> Result<CameraLocus> {
        let steps =
            ((LOCUS_MIRED_RANGE.1 - LOCUS_MIRED_RANGE.0) / LOCUS_STEP_MIRED).round() as usize;
        let mut mired = Vec::with_capacity(steps + 1);
        let mut points = Vec::with_capacity(steps + 1);
        for i in 0..=steps {
            let m = LOCUS_MIRED_RANGE.0 + LOCUS_STEP_MIRED * i as f64;
            let light = white_balance_light(1e6 / m)?;
            let p = log_chromaticity(raw_of_light(camera, &light)).ok_or_else(|| {
                CameraError::BlindCamera {
                    camera: camera.name.clone(),
                    reason: format!("a channel sees nothing of a {:.0} K light", 1e6 / m),
                }
            })?;
            mired.push(m);
            points.push(p);
        }
        Ok(CameraLocus { mired, points })
    }

    /// The locus of `camera`, computed once per set of curves and kept for the run.
    pub fn for_camera(camera: &CameraSensitivities) -> Result<Arc<CameraLocus>> {
        CameraLocus::for_shared_curves(camera, camera.fingerprint())
    }

    /// [`CameraLocus::for_camera`] of a camera already fingerprinted.
    pub(crate) fn for_shared(camera: &SharedCamera) -> Result<Arc<CameraLocus>> {
        CameraLocus::for_shared_curves(camera.curves(), camera.fingerprint())
    }

    fn for_shared_curves(camera: &CameraSensitivities, key: u64) -> Result<Arc<CameraLocus>> {
        if let Some(hit) = LOCUS_CACHE
            .lock()
            .unwrap_or_else(PoisonError::into_inner)
            .get(&key)
        {
            return Ok(Arc::clone(hit));
        }
        let locus = Arc::new(CameraLocus::new(camera)?);
        LOCUS_CACHE
            .lock()
            .unwrap_or_else(PoisonError::into_inner)
            .insert(key, Arc::clone(&locus));
        Ok(locus)
    }

    /// Nearest locus point to the raw signal of a neutral; `None` when the
    /// signal has a non-positive channel.
    #[must_use]
    pub fn nearest(&self, neutral_raw: [f64; 3]) -> Option<LocusMatch> {
        let q = log_chromaticity(neutral_raw)?;
        let mut best: Option<(f64, f64)> = None;
        for (seg, m) in self.points.windows(2).zip(self.mired.windows(2)) {
            let (a, b) = (seg[0], seg[1]);
            let d = [b[0] - a[0], b[1] - a[1]];
            let len2 = d[0] * d[0] + d[1] * d[1];
            let t = if len2 > 0.0 {
                (((q[0] - a[0]) * d[0] + (q[1] - a[1]) * d[1]) / len2).clamp(0.0, 1.0)
            } else {
                0.0
            };
            let p = [a[0] + t * d[0], a[1] + t * d[1]];
            // Squared distances while searching; one square root at the end.
            let distance2 = (q[0] - p[0]).powi(2) + (q[1] - p[1]).powi(2);
            if best.is_none_or(|(_, b2)| distance2 < b2) {
                best = Some((m[0] + t * (m[1] - m[0]), distance2));
            }
        }
        best.map(|(mired, distance2)| LocusMatch {
            cct_k: 1e6 / mired,
            distance: distance2.sqrt(),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn recovers_the_temperature_of_locus_lights() {
        let cam = &CameraSensitivities::demo_cameras().unwrap()[0];
        let locus = CameraLocus::for_camera(cam).unwrap();
        for t in [2000.0, 2856.0, 3200.0, 4500.0, 5600.0, 6504.0, 9000.0] {
            let raw = raw_of_light(cam, &white_balance_light(t).unwrap());
            let m = locus.nearest(raw).unwrap();
            // Linear interpolation between 5-mired points: within 0.3 mired.
            assert!((1e6 / m.cct_k - 1e6 / t).abs() < 0.3, "{t}: {}", m.cct_k);
            assert!(m.distance < 1e-3);
        }
        // A green patch is far from the locus.
        assert!(locus.nearest([0.3, 1.0, 0.3]).unwrap().distance > 0.3);
        assert!(locus.nearest([0.0, 1.0, 0.3]).is_none());
    }

    #[test]
    fn cache_returns_the_same_locus() {
        let cam = CameraSensitivities::colorimetric().unwrap();
        let a = CameraLocus::for_camera(&cam).unwrap();
        let b = CameraLocus::for_camera(&cam).unwrap();
        assert!(Arc::ptr_eq(&a, &b));
    }
}
