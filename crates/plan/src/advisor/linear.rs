//! The search model: everything the goals need, precomputed so that each
//! candidate costs a few small sums.
//!
//! Light at the subject is linear in the sources' levels, and a gel multiplies
//! one source only. So for each source and each gel stack it may carry, the
//! quantities the goals need are computed once, per lux of the unfiltered lamp:
//! the XYZ of the light (CIE 1931 2°) and, for the fidelity goal, the camera's
//! raw white and each subject's XYZ and raw signal — 3 + 3 + 6 × subjects
//! numbers ([`Projected`]). A zone's mix is then `Σ level × projection`.
//!
//! Projections integrate `lamp(λ)·T(λ)·w(λ)` by folding the product
//! `lamp·w` onto knots every `step` nm with hat (linear-interpolation) weights,
//! so that a stack's transmittance is only needed at the knots:
//! `Σ_λ lamp·T·w ≈ Σ_k T(λ_k)·Ŵ_k`. With a 1 nm step this is the exact 1 nm
//! sum; with 5 nm it is exact for transmittances linear between knots and off
//! by `h²/8·T″` otherwise, which for the smooth dye curves of gels is far below
//! what changes a ranking. The final figures always come from a full
//! evaluation, never from this model.
//!
//! # References
//! - CIE 15:2018 §7.1 (tristimulus summation), §7.2.2 (interpolation of spectral data).

use crate::engine::{DARK_LUX, SourceLight, inverse_square_lux, source_light};
use crate::error::{PlanError, Result};
use crate::model::{Plan, ZoneLevel};
use lampwright_camera::CameraSensitivities;
use lampwright_color::observer::{Observer, v_lambda};
use lampwright_color::spectrum::GRID_LEN;
use lampwright_color::tristimulus::KM_LM_PER_W;
use lampwright_color::{Reflectance, RelativeSpd};

/// Knots every `step` grid points, hat-function weights in between.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Knots {
    step: usize,
    count: usize,
}

impl Knots {
    /// Knots every `step_nm` nm (1 = the exact grid). Steps that do not divide
    /// the 470 nm span are rounded down to one that does.
    pub fn new(step_nm: usize) -> Knots {
        let span = GRID_LEN - 1;
        let step = (1..=step_nm.max(1))
            .rev()
            .find(|s| span.is_multiple_of(*s))
            .unwrap_or(1);
        Knots {
            step,
            count: span / step + 1,
        }
    }

    /// Number of knots.
    pub fn count(self) -> usize {
        self.count
    }

    /// Values of a grid curve at the knots.
    pub fn sample(self, values: &[f64; GRID_LEN], out: &mut Vec<f64>) {
        out.clear();
        out.extend(values.iter().step_by(self.step));
    }

    /// (knot, weight) pairs a grid point contributes to.
    fn hat(self, i: usize) -> [(usize, f64); 2] {
        let k = i / self.step;
        let r = i % self.step;
        if r == 0 {
            [(k, 1.0), (k, 0.0)]
        } else {
            let t = r as f64 / self.step as f64;
            [(k, 1.0 - t), (k + 1, t)]
        }
    }
}

/// The numbers each projection carries, as columns over the grid: column
/// `d` at grid index `i` is a weight `w_d(λ_i)` (a colour-matching function,
/// or one times a reflectance); the projection of a filtered lamp is
/// `Σ_λ lamp(λ)·T(λ)·w_d(λ)`. Columns 0–2 are always x̄, ȳ, z̄ (CIE 1931 2°).
pub(crate) struct Columns<'a> {
    /// Numbers per projection.
    pub width: usize,
    /// Fills one grid index's row of weights.
    pub fill: &'a dyn Fn(usize, &mut [f64]),
}

/// Columns of the white goal: x̄, ȳ, z̄.
pub(crate) fn white_columns(i: usize, row: &mut [f64]) {
    let o = Observer::cie1931_2deg();
    row[0] = o.x_bar[i];
    row[1] = o.y_bar[i];
    row[2] = o.z_bar[i];
}

/// Columns of the fidelity goal: x̄, ȳ, z̄, the camera's r̄, ḡ, b̄, then per
/// subject ρ·x̄, ρ·ȳ, ρ·z̄, ρ·r̄, ρ·ḡ, ρ·b̄.
pub(crate) fn fidelity_columns(
    camera: &CameraSensitivities,
    subjects: &[Reflectance],
    i: usize,
    row: &mut [f64],
) {
    white_columns(i, row);
    let [r, g, b] = camera.channels().map(|c| c.values()[i]);
    row[3] = r;
    row[4] = g;
    row[5] = b;
    for (j, refl) in subjects.iter().enumerate() {
        let rho = refl.values()[i];
        let o = 6 + 6 * j;
        for k in 0..6 {
            row[o + k] = row[k] * rho;
        }
    }
}

/// What one source with one gel stack gives per lux of its unfiltered lamp.
#[derive(Debug, Clone)]
pub(crate) struct Projected {
    /// `[X, Y, Z]` (2°, W·m⁻² weighted) of the light, then, with the camera
    /// block, raw `[R, G, B]` of the perfect white, then per subject
    /// `[X, Y, Z, R, G, B]`.
    pub values: Vec<f64>,
}

/// One source's lamp folded with every weight the layout needs.
#[derive(Debug)]
pub(crate) struct SourceBasis {
    /// `knots × width`, row-major by knot.
    weights: Vec<f64>,
    /// `lamp(λ)·ȳ(λ) / Σ lamp·ȳ`: a stack passes `Σ lamp_y·T` of the light.
    lamp_y: Box<[f64; GRID_LEN]>,
    /// The dimmed lamp per lux (W·m⁻²·nm⁻¹ per lux), unfiltered.
    pub lamp_per_lux: Box<[f64; GRID_LEN]>,
}

/// The precomputed model of a plan.
#[derive(Debug)]
pub(crate) struct LinearModel {
    knots: Knots,
    width: usize,
    sources: Vec<SourceBasis>,
    /// Per zone, per source: lux at full output before gels × dimmer flux
    /// (0 when the source does not reach the zone or does not light).
    pub zone_coefficients: Vec<Vec<f64>>,
}

/// Lux of a zone reach at the source's own level, as the engine computes it.
fn reach_lux(source: &SourceLight, level: &ZoneLevel) -> f64 {
    match level {
        ZoneLevel::AsSource => source.level_lux,
        ZoneLevel::Lux(l) => *l,
        ZoneLevel::Stops(s) => source.level_lux * s.exp2(),
        ZoneLevel::Distance {
            rated_lux_at_1m,
            distance_m,
        } => inverse_square_lux(*rated_lux_at_1m, *distance_m).unwrap_or(0.0),
    }
}

impl LinearModel {
    /// Build the model of `plan` for `columns`, with knots every `step_nm` nm.
    pub fn new(plan: &Plan, columns: &Columns<'_>, step_nm: usize) -> Result<LinearModel> {
        let knots = Knots::new(step_nm);
        let obs = Observer::cie1931_2deg();
        let resolved: Vec<SourceLight> = plan
            .sources
            .iter()
            .map(|s| source_light(plan, s))
            .collect::<Result<_>>()?;
        let width = columns.width.max(3);
        let mut grid_columns = vec![0.0; GRID_LEN * width];
        for (i, row) in grid_columns.chunks_exact_mut(width).enumerate() {
            (columns.fill)(i, row);
        }
        let mut sources = Vec::with_capacity(plan.sources.len());
        for (source, res) in plan.sources.iter().zip(&resolved) {
            let dimmed = crate::resolve::dimmed_lamp(plan, source)?;
            let lamp = dimmed.spd.values();
            // The evaluation's normalisation: lux of the unfiltered lamp with V(λ).
            let lamp_lux: f64 =
                KM_LM_PER_W * lamp.iter().zip(v_lambda()).map(|(l, y)| l * y).sum::<f64>();
            if !(lamp_lux.is_finite() && lamp_lux > 0.0) {
                return Err(PlanError::Invalid {
                    field: format!("source '{}'", res.name),
                    message: "the lamp has no visible output".into(),
                });
            }
            let mut per_lux = Box::new([0.0; GRID_LEN]);
            for (p, l) in per_lux.iter_mut().zip(lamp) {
                *p = l / lamp_lux;
            }
            let mut lamp_y = Box::new([0.0; GRID_LEN]);
            for i in 0..GRID_LEN {
                lamp_y[i] = KM_LM_PER_W * per_lux[i] * obs.y_bar[i];
            }
            let mut weights = vec![0.0; knots.count() * width];
            for (i, cols) in grid_columns.chunks_exact(width).enumerate() {
                let p = per_lux[i];
                if p == 0.0 {
                    continue;
                }
                for (k, w) in knots.hat(i) {
                    if w != 0.0 {
                        let dst = &mut weights[k * width..(k + 1) * width];
                        for (d, v) in dst.iter_mut().zip(cols) {
                            *d += w * p * v;
                        }
                    }
                }
            }
            sources.push(SourceBasis {
                weights,
                lamp_y,
                lamp_per_lux: per_lux,
            });
        }
        let lit_coefficient = |i: usize, lux: f64| {
            let r = &resolved[i];
            if r.lit { lux * r.dimmer_flux } else { 0.0 }
        };
        let zone_coefficients = if plan.zones.is_empty() {
            vec![
                (0..resolved.len())
                    .map(|i| lit_coefficient(i, resolved[i].level_lux))
                    .collect(),
            ]
        } else {
            let mut coefs = Vec::new();
            for zone in &plan.zones {
                let mut c = vec![0.0; resolved.len()];
                for reach in &zone.reach {
                    if let Some(i) = resolved.iter().position(|r| r.id == reach.source) {
                        c[i] += lit_coefficient(i, reach_lux(&resolved[i], &reach.level));
                    }
                }
                coefs.push(c);
            }
            coefs
        };
        Ok(LinearModel {
            knots,
            width,
            sources,
            zone_coefficients,
        })
    }

    /// Numbers per projection.
    pub fn width(&self) -> usize {
        self.width
    }

    /// The first `columns` numbers of the projection of source `s` through `t`
    /// (the screening prefix; all of them when `columns` ≥ the width).
    pub fn project_prefix(&self, s: usize, t: &[f64; GRID_LEN], columns: usize) -> Projected {
        let basis = &self.sources[s];
        let width = self.width;
        let n = columns.min(width);
        let mut tk = Vec::with_capacity(self.knots.count());
        self.knots.sample(t, &mut tk);
        let mut values = vec![0.0; n];
        for (k, tv) in tk.iter().enumerate() {
            if *tv == 0.0 {
                continue;
            }
            let row = &basis.weights[k * width..k * width + n];
            for (v, w) in values.iter_mut().zip(row) {
                *v += tv * w;
            }
        }
        Projected { values }
    }

    /// Fraction of source `s`'s illuminance that transmittance `t` passes
    /// (exact 1 nm sum with V(λ)).
    pub fn transmission(&self, s: usize, t: &[f64; GRID_LEN]) -> f64 {
        self.sources[s]
            .lamp_y
            .iter()
            .zip(t)
            .map(|(a, b)| a * b)
            .sum()
    }

    /// The 1 nm spectrum per lux of source `s` through transmittance `t`.
    pub fn filtered_per_lux(&self, s: usize, t: &[f64; GRID_LEN]) -> [f64; GRID_LEN] {
        let mut out = [0.0; GRID_LEN];
        for ((o, l), tv) in out
            .iter_mut()
            .zip(self.sources[s].lamp_per_lux.iter())
            .zip(t)
        {
            *o = l * tv;
        }
        out
    }
}

/// A zone's mix: `Σ weightₛ × projectionₛ` over the first `width` numbers.
pub(crate) fn mix(width: usize, parts: &[(f64, &Projected)], out: &mut Vec<f64>) {
    out.clear();
    out.resize(width, 0.0);
    for (w, p) in parts {
        if *w == 0.0 {
            continue;
        }
        for (o, v) in out.iter_mut().zip(&p.values) {
            *o += w * v;
        }
    }
}

/// Illuminance of a mix, lux (`683 × Y`).
pub(crate) fn mix_lux(mixed: &[f64]) -> f64 {
    KM_LM_PER_W * mixed[1]
}

/// Whether a mix is too dark for colour figures.
pub(crate) fn is_dark(mixed: &[f64]) -> bool {
    mix_lux(mixed) <= DARK_LUX
}

/// The mix of several filtered spectra as a relative SPD.
pub(crate) fn spectrum_of(parts: &[(f64, &[f64; GRID_LEN])]) -> Result<RelativeSpd> {
    let mut v = [0.0; GRID_LEN];
    for (w, s) in parts {
        for (o, x) in v.iter_mut().zip(s.iter()) {
            *o += w * x;
        }
    }
    Ok(RelativeSpd::from_grid(v, lampwright_color::Coverage::FULL)?)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn knots_divide_the_span() {
        assert_eq!(Knots::new(1).count(), GRID_LEN);
        assert_eq!(Knots::new(5).count(), 95);
        // 4 does not divide 470: falls back to 2.
        assert_eq!(Knots::new(4).count(), 236);
    }

    #[test]
    fn hat_weights_sum_to_one_and_reproduce_lines() {
        let k = Knots::new(5);
        for i in 0..GRID_LEN {
            let h = k.hat(i);
            assert!((h[0].1 + h[1].1 - 1.0).abs() < 1e-12);
            // A straight line is reproduced exactly from its knot values.
            let line = |x: f64| 0.3 + 0.001 * x;
            let got = h[0].1 * line((h[0].0 * 5) as f64) + h[1].1 * line((h[1].0 * 5) as f64);
            assert!((got - line(i as f64)).abs() < 1e-12);
        }
    }
}
