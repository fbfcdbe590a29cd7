//! Raw camera signal: what each channel collects from a lit surface.
//!
//! For a surface of reflectance ρ(λ) under a light S(λ), channel `c` collects
//! `Σ_λ S(λ) ρ(λ) s̄_c(λ) Δλ` (Δλ = 1 nm, 360–830 nm). Exposure is normalised
//! so that the perfect reflecting diffuser under the scene light gives G = 1,
//! as if the camera were exposed for a white card; the light is whatever reaches
//! the subject (lamps already mixed, gels already applied).
//!
//! The eye's side is computed in the same pass: XYZ with the perfect
//! reflecting diffuser at Y = 1 (CIE 15:2018 eq. 7.1 scaled by 1/100).
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §7.1 (tristimulus summation).
//! - ISO 17321-1:2012, *Graphic technology and photography — Colour
//!   characterisation of digital still cameras (DSCs) — Part 1*, §4 (camera
//!   response as the integral of scene radiance and channel sensitivity).

use crate::error::{CameraError, Result};
use crate::fit_linear::is_positive;
use crate::sensitivities::CameraSensitivities;
use lampwright_color::observer::Observer;
use lampwright_color::weighted_sums::weighted_sums_6;
use lampwright_color::{GRID_LEN, Reflectance, RelativeSpd, Xyz};

/// Raw linear camera signal of one subject, `[R, G, B]`, with the perfect
/// white under the scene light at G = 1; and the eye's XYZ of the same subject
/// as lit (perfect white at Y = 1).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct SubjectSignal {
    /// Camera raw `[R, G, B]` (before white balance).
    pub raw_rgb: [f64; 3],
    /// CIE XYZ of the subject as lit, perfect white at Y = 1.
    pub xyz: Xyz,
}

/// One camera and one observer under one light, ready to integrate many subjects.
///
/// Building it multiplies the light into the six curves once, so each subject
/// then costs one pass over the grid.
#[derive(Debug, Clone)]
pub struct SceneResponse {
    /// Over the grid: `S·r̄/k_g, S·ḡ/k_g, S·b̄/k_g, S·x̄/k_y, S·ȳ/k_y, S·z̄/k_y`.
    weights: [Vec<f64>; 6],
    white: SubjectSignal,
}

impl SceneResponse {
    /// Prepare `camera` and `observer` under `light` (relative SPD at the subject).
    ///
    /// Refuses a light that cannot support colorimetry and a camera whose green
    /// channel collects nothing under it (exposure could not be set).
    pub fn new(
        camera: &CameraSensitivities,
        light: &RelativeSpd,
        observer: &Observer,
    ) -> Result<SceneResponse> {
        light.check_colorimetric("scene light")?;
        let l = light.values();
        let [r, g, b] = camera.channels().map(|c| c.values());
        let k_g: f64 = (0..GRID_LEN).map(|i| l[i] * g[i]).sum();
        let k_y: f64 = (0..GRID_LEN).map(|i| l[i] * observer.y_bar[i]).sum();
        if !is_positive(k_g) {
            return Err(CameraError::BlindCamera {
                camera: camera.name.clone(),
                reason: "its green channel collects nothing under this light".into(),
            });
        }
        if !is_positive(k_y) {
            return Err(CameraError::InvalidInput(
                "the scene light has no visible power".into(),
            ));
        }
        let weight = |c: &[f64; GRID_LEN], k: f64| -> Vec<f64> {
            l.iter().zip(c).map(|(l, c)| l * c / k).collect()
        };
        let weights = [
            weight(r, k_g),
            weight(g, k_g),
            weight(b, k_g),
            weight(&observer.x_bar, k_y),
            weight(&observer.y_bar, k_y),
            weight(&observer.z_bar, k_y),
        ];
        let mut response = SceneResponse {
            weights,
            white: SubjectSignal::default(),
        };
        response.white = response.integrate(&[&[1.0; GRID_LEN]])[0];
        Ok(response)
    }

    fn integrate(&self, reflectances: &[&[f64]]) -> Vec<SubjectSignal> {
        let w = &self.weights;
        weighted_sums_6(reflectances, [&w[0], &w[1], &w[2], &w[3], &w[4], &w[5]])
            .into_iter()
            .map(|acc| SubjectSignal {
                raw_rgb: [acc[0], acc[1], acc[2]],
                xyz: Xyz::new(acc[3], acc[4], acc[5]),
            })
            .collect()
    }

    /// Raw signal and XYZ of one subject.
    #[must_use]
    pub fn subject(&self, reflectance: &Reflectance) -> SubjectSignal {
        self.integrate(&[reflectance.values()])[0]
    }

    /// Raw signal and XYZ of each subject, in order.
    #[must_use]
    pub fn subjects(&self, reflectances: &[Reflectance]) -> Vec<SubjectSignal> {
        self.subjects_of(reflectances)
    }

    /// Raw signal and XYZ of each subject, in order (any collection of reflectances).
    #[must_use]
    pub fn subjects_of<'a>(
        &self,
        reflectances: impl IntoIterator<Item = &'a Reflectance>,
    ) -> Vec<SubjectSignal> {
        let rows: Vec<&[f64]> = reflectances
            .into_iter()
            .map(|r| r.values().as_slice())
            .collect();
        self.integrate(&rows)
    }

    /// The perfect reflecting diffuser: raw `[R, 1, B]` and XYZ with Y = 1.
    #[must_use]
    pub fn white(&self) -> SubjectSignal {
        self.white
    }
}

/// Unnormalised sums of many surfaces under one light, for one camera and
/// one observer: `Σ S·ρ·s̄_c` for the camera's R, G, B and `Σ S·ρ·x̄` etc. for
/// the eye, in that order, and the same for the light itself (a perfect white).
///
/// Linear in the light: the sums under `Σ wᵢ·Sᵢ` are `Σ wᵢ·sumsᵢ`
/// ([`SignalSums::mix`]), so a lighting plan integrates each source once and
/// mixes for every level. [`SignalSums::signals`] sets the exposure.
#[derive(Debug, Clone, PartialEq)]
pub struct SignalSums {
    /// The light on a perfect white: `[R, G, B, X, Y, Z]`.
    pub white: [f64; 6],
    /// Each surface, in order: `[R, G, B, X, Y, Z]`.
    pub surfaces: Vec<[f64; 6]>,
}

impl SignalSums {
    /// The sums of `reflectances` under `light` (any non-negative spectrum on
    /// the grid; no check: a dark light gives zero sums).
    #[must_use]
    pub fn of<'a>(
        camera: &CameraSensitivities,
        light: &[f64; GRID_LEN],
        observer: &Observer,
        reflectances: impl IntoIterator<Item = &'a Reflectance>,
    ) -> SignalSums {
        let [r, g, b] = camera.channels().map(|c| c.values());
        let weight =
            |c: &[f64; GRID_LEN]| -> Vec<f64> { light.iter().zip(c).map(|(l, c)| l * c).collect() };
        let w = [
            weight(r),
            weight(g),
            weight(b),
            weight(&observer.x_bar),
            weight(&observer.y_bar),
            weight(&observer.z_bar),
        ];
        let mut rows: Vec<&[f64]> = vec![&[1.0; GRID_LEN]];
        rows.extend(reflectances.into_iter().map(|r| r.values().as_slice()));
        let mut sums = weighted_sums_6(&rows, [&w[0], &w[1], &w[2], &w[3], &w[4], &w[5]]);
        let white = sums.remove(0);
        SignalSums {
            white,
            surfaces: sums,
        }
    }

    /// `Σ wᵢ·partᵢ` (all parts over the same surfaces); `None` for no parts.
    #[must_use]
    pub fn mix(parts: &[(f64, &SignalSums)]) -> Option<SignalSums> {
        let n = parts.first()?.1.surfaces.len();
        let mut out = SignalSums {
            white: [0.0; 6],
            surfaces: vec![[0.0; 6]; n],
        };
        for (w, p) in parts {
            for (o, v) in out.white.iter_mut().zip(&p.white) {
                *o += w * v;
            }
            for (acc, s) in out.surfaces.iter_mut().zip(&p.surfaces) {
                for (o, v) in acc.iter_mut().zip(s) {
                    *o += w * v;
                }
            }
        }
        Some(out)
    }

    /// Raw G and Y of the light itself (its exposure scale).
    #[must_use]
    pub fn scale(&self) -> (f64, f64) {
        (self.white[1], self.white[4])
    }

    /// The surfaces' signals with the camera divided by `raw_g` and the eye
    /// by `y`: with this light's own [`SignalSums::scale`], the perfect white
    /// reads G = 1 and Y = 1 as in [`SceneResponse`]; with another light's
    /// scale, the surfaces are at that light's exposure.
    #[must_use]
    pub fn signals(&self, (raw_g, y): (f64, f64)) -> Vec<SubjectSignal> {
        self.surfaces
            .iter()
            .map(|s| signal_of(s, raw_g, y))
            .collect()
    }

    /// The light's own perfect white, G = 1 and Y = 1.
    #[must_use]
    pub fn white_signal(&self) -> SubjectSignal {
        signal_of(&self.white, self.white[1], self.white[4])
    }
}

fn signal_of(s: &[f64; 6], raw_g: f64, y: f64) -> SubjectSignal {
    SubjectSignal {
        raw_rgb: [s[0] / raw_g, s[1] / raw_g, s[2] / raw_g],
        xyz: Xyz::new(s[3] / y, s[4] / y, s[5] / y),
    }
}

/// Raw signal `[R, G, B]` of one surface under one light, perfect white at G = 1.
pub fn raw_signal(
    camera: &CameraSensitivities,
    light: &RelativeSpd,
    reflectance: &Reflectance,
) -> Result<[f64; 3]> {
    Ok(SceneResponse::new(camera, light, Observer::cie1931_2deg())?
        .subject(reflectance)
        .raw_rgb)
}

/// Unnormalised camera response to a light seen directly (or on a perfect
/// white): `Σ S(λ) s̄_c(λ)` per channel. Only ratios between channels matter.
#[must_use]
pub fn raw_of_light(camera: &CameraSensitivities, light: &RelativeSpd) -> [f64; 3] {
    let l = light.values();
    camera
        .channels()
        .map(|c| c.values().iter().zip(l.iter()).map(|(s, e)| s * e).sum())
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_color::illuminant::StandardIlluminant;
    use lampwright_color::tristimulus::xyz_of_object;

    #[test]
    fn perfect_white_has_g_and_y_one() {
        let cam = CameraSensitivities::demo_cameras().unwrap()[0].clone();
        for ill in [
            StandardIlluminant::A,
            StandardIlluminant::D65,
            StandardIlluminant::F(11),
        ] {
            let s =
                SceneResponse::new(&cam, &ill.spd().unwrap(), Observer::cie1931_2deg()).unwrap();
            assert!((s.white().raw_rgb[1] - 1.0).abs() < 1e-12);
            assert!((s.white().xyz.y - 1.0).abs() < 1e-12);
        }
    }

    #[test]
    fn sums_match_the_scene_response_and_mix_linearly() {
        let cam = CameraSensitivities::demo_cameras().unwrap()[1].clone();
        let obs = Observer::cie1931_2deg();
        let a = StandardIlluminant::A.spd().unwrap();
        let f11 = StandardIlluminant::F(11).spd().unwrap();
        let refl = [
            Reflectance::from_fn(|wl| 0.2 + 0.6 * ((wl - 360.0) / 470.0)),
            Reflectance::from_fn(|wl| 0.5 + 0.4 * (wl / 40.0).sin()),
        ];
        let mixed = RelativeSpd::weighted_sum([(0.4, &a), (2.5, &f11)]);
        let parts = [a, f11].map(|l| SignalSums::of(&cam, l.values(), obs, &refl));
        let mix = SignalSums::mix(&[(0.4, &parts[0]), (2.5, &parts[1])]).unwrap();
        let scene = SceneResponse::new(&cam, &mixed, obs).unwrap();
        let want = scene.subjects(&refl);
        let got = mix.signals(mix.scale());
        for (g, w) in got.iter().zip(&want) {
            for k in 0..3 {
                assert!((g.raw_rgb[k] - w.raw_rgb[k]).abs() < 1e-12, "{g:?} {w:?}");
            }
            for (u, v) in g.xyz.to_array().iter().zip(w.xyz.to_array()) {
                assert!((u - v).abs() < 1e-12);
            }
        }
        let white = mix.white_signal();
        assert!((white.raw_rgb[1] - 1.0).abs() < 1e-15 && (white.xyz.y - 1.0).abs() < 1e-15);
        assert!((white.raw_rgb[0] - scene.white().raw_rgb[0]).abs() < 1e-12);
        // Another light's scale puts the surfaces at that light's exposure.
        let half = mix.signals((2.0 * mix.scale().0, 2.0 * mix.scale().1));
        assert!((half[0].raw_rgb[1] - got[0].raw_rgb[1] / 2.0).abs() < 1e-15);
        assert!(SignalSums::mix(&[]).is_none());
    }

    #[test]
    fn xyz_agrees_with_colour_crate() {
        // The eye's side must equal CIE 15 relative XYZ (colour crate) divided by 100.
        let cam = CameraSensitivities::colorimetric().unwrap();
        let light = StandardIlluminant::F(2).spd().unwrap();
        let refl = Reflectance::from_fn(|wl| 0.2 + 0.6 * ((wl - 360.0) / 470.0));
        let s = SceneResponse::new(&cam, &light, Observer::cie1931_2deg())
            .unwrap()
            .subject(&refl);
        let x = xyz_of_object(&light, &refl, Observer::cie1931_2deg(), "t").unwrap();
        for (a, b) in s.xyz.to_array().iter().zip(x.to_array()) {
            assert!((a - b / 100.0).abs() < 1e-12);
        }
    }

    #[test]
    fn raw_is_linear_in_reflectance_and_independent_of_light_level() {
        let cam = CameraSensitivities::demo_cameras().unwrap()[2].clone();
        let light = StandardIlluminant::A.spd().unwrap();
        let refl = Reflectance::from_fn(|wl| if wl > 550.0 { 0.7 } else { 0.1 });
        let a = raw_signal(&cam, &light, &refl).unwrap();
        let b = raw_signal(&cam, &light.scaled(37.0), &refl.scaled(0.5)).unwrap();
        for k in 0..3 {
            assert!((a[k] * 0.5 - b[k]).abs() < 1e-12);
        }
    }

    #[test]
    fn dark_light_is_refused() {
        let cam = CameraSensitivities::colorimetric().unwrap();
        assert!(
            SceneResponse::new(
                &cam,
                &RelativeSpd::from_fn(|_| 0.0),
                Observer::cie1931_2deg()
            )
            .is_err()
        );
        // Light only beyond the reach of a green channel that stops at 450 nm.
        let short = lampwright_color::Sensitivity::from_fn(|wl| if wl < 450.0 { 1.0 } else { 0.0 });
        let odd = CameraSensitivities::new("odd", cam.r.clone(), short, cam.b.clone()).unwrap();
        let deep_red = RelativeSpd::from_fn(|wl| if wl > 800.0 { 1.0 } else { 0.0 });
        let err = SceneResponse::new(&odd, &deep_red, Observer::cie1931_2deg()).unwrap_err();
        assert!(matches!(err, CameraError::BlindCamera { .. }), "{err}");
    }
}
