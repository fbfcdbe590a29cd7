//! White balance: per-channel gains that make a chosen neutral come out with
//! R = G = B, normalised so the green gain is 1.
//!
//! Modes ([`WhiteBalance`]):
//! - **Kelvin**: the neutral is a white under a Planckian radiator at that
//!   temperature below 4000 K, or CIE daylight at that CCT from 4000 K up
//!   (the camera's own response to that light, not a table).
//! - **Presets** ([`WbPreset`]), the project's choices: daylight = D55, cloudy =
//!   D65, shade = D75, tungsten = 3200 K Planckian (studio tungsten, common
//!   practice), incandescent = CIE illuminant A (2856 K household lamp),
//!   fluorescent = CIE F2 (cool-white halophosphate tube).
//! - **Grey card**: the neutral is a grey card in the scene light, either one of
//!   the subjects or an ideal spectrally flat card.
//! - **Grey world**: the neutral is the mean raw signal of the scene's subjects.
//! - **Brightest neutral**: the brightest subject whose raw chromaticity lies
//!   within [`NEAR_NEUTRAL_DISTANCE`] of the camera's white locus; if there is
//!   none, the brightest subject (white patch).
//!
//! # References
//! - Buchsbaum, G. (1980), *A spatial processor model for object colour
//!   perception*, J. Franklin Inst. 310(1), 1–26, doi:10.1016/0016-0032(80)90058-7 (grey world).
//! - Land, E. H. and McCann, J. J. (1971), *Lightness and Retinex theory*,
//!   J. Opt. Soc. Am. 61(1), 1–11, doi:10.1364/JOSA.61.000001 (brightest patch as white).
//! - CIE 15:2018 §4.1 and §4.1.2 (Planckian radiator, CIE daylight), Table 10 (F2).

// Author names such as McCann are not code identifiers.
#![allow(clippy::doc_markdown)]

use crate::error::{CameraError, Result};
use crate::locus::CameraLocus;
use crate::raw::{SubjectSignal, raw_of_light};
use crate::sensitivities::CameraSensitivities;
use lampwright_color::RelativeSpd;
use lampwright_color::illuminant::{StandardIlluminant, daylight, planckian};

/// Kelvin settings accepted, K.
pub const KELVIN_RANGE_K: (f64, f64) = (1000.0, 25_000.0);
/// From this CCT up, a Kelvin setting means CIE daylight; below it, a Planckian radiator.
pub const DAYLIGHT_FROM_K: f64 = 4000.0;
/// Largest distance from the camera's white locus (raw log-chromaticity) for a
/// subject to count as near-neutral in [`WhiteBalance::BrightestNeutral`]
/// (about 6 % in R/G or B/G; the project's choice).
pub const NEAR_NEUTRAL_DISTANCE: f64 = 0.06;

/// The light a Kelvin white-balance setting stands for: Planckian below
/// 4000 K, CIE daylight at or above (1000–25 000 K).
pub fn white_balance_light(cct_k: f64) -> Result<RelativeSpd> {
    if !(cct_k.is_finite() && (KELVIN_RANGE_K.0..=KELVIN_RANGE_K.1).contains(&cct_k)) {
        return Err(lampwright_color::ColorError::OutOfRange {
            what: "white-balance temperature (K)",
            value: cct_k,
            range: "1000–25 000 K",
        }
        .into());
    }
    Ok(if cct_k < DAYLIGHT_FROM_K {
        planckian(cct_k)?
    } else {
        daylight(cct_k)?
    })
}

/// Named white-balance presets (see the module docs for the lights chosen).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum WbPreset {
    /// CIE D55.
    Daylight,
    /// CIE D65.
    Cloudy,
    /// CIE D75.
    Shade,
    /// 3200 K Planckian radiator.
    Tungsten,
    /// CIE illuminant A (2856 K).
    Incandescent,
    /// CIE F2.
    Fluorescent,
}

impl WbPreset {
    /// Every preset.
    pub const ALL: [WbPreset; 6] = [
        WbPreset::Daylight,
        WbPreset::Cloudy,
        WbPreset::Shade,
        WbPreset::Tungsten,
        WbPreset::Incandescent,
        WbPreset::Fluorescent,
    ];

    /// Name for the user.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            WbPreset::Daylight => "Daylight (D55)",
            WbPreset::Cloudy => "Cloudy (D65)",
            WbPreset::Shade => "Shade (D75)",
            WbPreset::Tungsten => "Tungsten (3200 K)",
            WbPreset::Incandescent => "Incandescent (A, 2856 K)",
            WbPreset::Fluorescent => "Fluorescent (F2)",
        }
    }

    /// The light the preset balances for.
    pub fn light(self) -> Result<RelativeSpd> {
        Ok(match self {
            WbPreset::Daylight => StandardIlluminant::D55.spd()?,
            WbPreset::Cloudy => StandardIlluminant::D65.spd()?,
            WbPreset::Shade => StandardIlluminant::D75.spd()?,
            WbPreset::Tungsten => planckian(3200.0)?,
            WbPreset::Incandescent => StandardIlluminant::A.spd()?,
            WbPreset::Fluorescent => StandardIlluminant::F(2).spd()?,
        })
    }
}

/// How the camera's white balance is set.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(tag = "mode", rename_all = "kebab-case")]
pub enum WhiteBalance {
    /// A colour temperature setting, K (1000–25 000).
    Kelvin {
        /// The setting, K.
        cct_k: f64,
    },
    /// A named preset.
    Preset {
        /// Which one.
        preset: WbPreset,
    },
    /// Custom white balance from a grey card in the scene light.
    GreyCard {
        /// Index of the subject that is the card; `None` for an ideal
        /// spectrally flat card.
        subject: Option<usize>,
    },
    /// Automatic: the mean of the scene's subjects is taken as grey.
    GreyWorld,
    /// Automatic: the brightest near-neutral subject is taken as white.
    BrightestNeutral,
}

impl Default for WhiteBalance {
    fn default() -> Self {
        WhiteBalance::GreyCard { subject: None }
    }
}

impl WhiteBalance {
    /// Whether the gains depend on the subjects (so must be resolved per scene).
    #[must_use]
    pub fn depends_on_subjects(&self) -> bool {
        matches!(
            self,
            WhiteBalance::GreyCard { subject: Some(_) }
                | WhiteBalance::GreyWorld
                | WhiteBalance::BrightestNeutral
        )
    }
}

/// White-balance gains, green = 1.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct WbGains {
    /// Red gain.
    pub red: f64,
    /// Green gain (always 1).
    pub green: f64,
    /// Blue gain.
    pub blue: f64,
}

impl WbGains {
    /// Gains that make `neutral_raw` come out with R = G = B: `G/R, 1, G/B`.
    pub fn from_neutral_raw(neutral_raw: [f64; 3]) -> Result<WbGains> {
        let [r, g, b] = neutral_raw;
        let ok = |v: f64| v.is_finite() && v > 0.0;
        if !(ok(r) && ok(g) && ok(b)) {
            return Err(CameraError::InvalidInput(format!(
                "cannot white-balance on a neutral with raw signal [{r:.4}, {g:.4}, {b:.4}]: every channel must be positive"
            )));
        }
        Ok(WbGains {
            red: g / r,
            green: 1.0,
            blue: g / b,
        })
    }

    /// Balanced signal `[gᵣ·R, G, g_b·B]`.
    #[must_use]
    pub fn apply(&self, raw_rgb: [f64; 3]) -> [f64; 3] {
        [
            self.red * raw_rgb[0],
            self.green * raw_rgb[1],
            self.blue * raw_rgb[2],
        ]
    }

    /// The raw signal (G = 1) these gains treat as neutral.
    #[must_use]
    pub fn neutral_raw(&self) -> [f64; 3] {
        [self.green / self.red, 1.0, self.green / self.blue]
    }
}

/// What a white balance resolved to.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ResolvedWhiteBalance {
    /// The gains.
    pub gains: WbGains,
    /// The subject the gains were taken from, if any.
    pub reference_subject: Option<usize>,
}

/// Resolve a white-balance mode for `camera` in a scene whose perfect white
/// gives `scene_white_raw` and whose subjects give `subjects`.
///
/// Grey world and brightest neutral need at least one subject; a grey-card
/// subject index must be in range.
pub fn resolve_white_balance(
    mode: &WhiteBalance,
    camera: &CameraSensitivities,
    scene_white_raw: [f64; 3],
    subjects: &[SubjectSignal],
) -> Result<ResolvedWhiteBalance> {
    let plain = |gains| ResolvedWhiteBalance {
        gains,
        reference_subject: None,
    };
    match mode {
        WhiteBalance::Kelvin { cct_k } => Ok(plain(WbGains::from_neutral_raw(raw_of_light(
            camera,
            &white_balance_light(*cct_k)?,
        ))?)),
        WhiteBalance::Preset { preset } => Ok(plain(WbGains::from_neutral_raw(raw_of_light(
            camera,
            &preset.light()?,
        ))?)),
        WhiteBalance::GreyCard { subject: None } => {
            Ok(plain(WbGains::from_neutral_raw(scene_white_raw)?))
        }
        WhiteBalance::GreyCard { subject: Some(i) } => {
            let s = subjects.get(*i).ok_or_else(|| {
                CameraError::InvalidInput(format!(
                    "grey card is subject #{}, but the scene has {} subjects",
                    i + 1,
                    subjects.len()
                ))
            })?;
            Ok(ResolvedWhiteBalance {
                gains: WbGains::from_neutral_raw(s.raw_rgb)?,
                reference_subject: Some(*i),
            })
        }
        WhiteBalance::GreyWorld => {
            if subjects.is_empty() {
                return Err(CameraError::InvalidInput(
                    "grey-world white balance needs at least one subject".into(),
                ));
            }
            let mut mean = [0.0; 3];
            for s in subjects {
                for (m, v) in mean.iter_mut().zip(s.raw_rgb) {
                    *m += v / subjects.len() as f64;
                }
            }
            Ok(plain(WbGains::from_neutral_raw(mean)?))
        }
        WhiteBalance::BrightestNeutral => {
            let brightest = |candidates: &mut dyn Iterator<Item = usize>| {
                candidates
                    .filter(|i| {
                        subjects[*i]
                            .raw_rgb
                            .iter()
                            .all(|v| v.is_finite() && *v > 0.0)
                    })
                    .max_by(|a, b| subjects[*a].raw_rgb[1].total_cmp(&subjects[*b].raw_rgb[1]))
            };
            let locus = CameraLocus::for_camera(camera)?;
            let near_neutral = brightest(&mut (0..subjects.len()).filter(|i| {
                locus
                    .nearest(subjects[*i].raw_rgb)
                    .is_some_and(|m| m.distance <= NEAR_NEUTRAL_DISTANCE)
            }));
            let chosen = near_neutral.or_else(|| brightest(&mut (0..subjects.len()))).ok_or_else(|| {
                CameraError::InvalidInput("brightest-neutral white balance needs a subject with signal in every channel".into())
            })?;
            Ok(ResolvedWhiteBalance {
                gains: WbGains::from_neutral_raw(subjects[chosen].raw_rgb)?,
                reference_subject: Some(chosen),
            })
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::raw::SceneResponse;
    use lampwright_color::Reflectance;
    use lampwright_color::observer::Observer;

    fn cam() -> CameraSensitivities {
        CameraSensitivities::demo_cameras().unwrap()[1].clone()
    }

    #[test]
    fn kelvin_switches_from_planckian_to_daylight_at_4000() {
        let p = white_balance_light(3999.0).unwrap();
        let d = white_balance_light(4000.0).unwrap();
        assert!((p.at_nm(560.0) - 100.0).abs() < 1e-9 && (d.at_nm(560.0) - 100.0).abs() < 1e-6);
        // Daylight has a Duv above the Planckian locus: more green relative to red at similar CCT.
        assert!((p.at_nm(450.0) - d.at_nm(450.0)).abs() > 1.0);
        assert!(white_balance_light(900.0).is_err());
        assert!(white_balance_light(f64::NAN).is_err());
    }

    #[test]
    fn gains_are_green_normalised_and_neutralise() {
        let g = WbGains::from_neutral_raw([0.5, 1.0, 0.25]).unwrap();
        assert_eq!((g.red, g.green, g.blue), (2.0, 1.0, 4.0));
        let close = |a: [f64; 3], b: [f64; 3]| a.iter().zip(b).all(|(x, y)| (x - y).abs() < 1e-15);
        assert!(close(g.apply([0.5, 1.0, 0.25]), [1.0, 1.0, 1.0]));
        assert!(close(g.neutral_raw(), [0.5, 1.0, 0.25]));
        assert!(WbGains::from_neutral_raw([0.0, 1.0, 1.0]).is_err());
        assert!(WbGains::from_neutral_raw([f64::NAN, 1.0, 1.0]).is_err());
    }

    #[test]
    fn preset_matches_kelvin_and_scene_light() {
        let c = cam();
        let tungsten = resolve_white_balance(
            &WhiteBalance::Preset {
                preset: WbPreset::Tungsten,
            },
            &c,
            [1.0; 3],
            &[],
        )
        .unwrap();
        let kelvin =
            resolve_white_balance(&WhiteBalance::Kelvin { cct_k: 3200.0 }, &c, [1.0; 3], &[])
                .unwrap();
        assert!((tungsten.gains.red - kelvin.gains.red).abs() < 1e-12);
        // Tungsten needs more blue gain and less red gain than daylight.
        let day = resolve_white_balance(
            &WhiteBalance::Preset {
                preset: WbPreset::Daylight,
            },
            &c,
            [1.0; 3],
            &[],
        )
        .unwrap();
        assert!(
            tungsten.gains.blue > 1.5 * day.gains.blue && tungsten.gains.red < 0.8 * day.gains.red
        );
        // Under A, the flat grey card gives the incandescent preset's gains.
        let a = StandardIlluminant::A.spd().unwrap();
        let scene = SceneResponse::new(&c, &a, Observer::cie1931_2deg()).unwrap();
        let card = resolve_white_balance(&WhiteBalance::default(), &c, scene.white().raw_rgb, &[])
            .unwrap();
        let preset = resolve_white_balance(
            &WhiteBalance::Preset {
                preset: WbPreset::Incandescent,
            },
            &c,
            [1.0; 3],
            &[],
        )
        .unwrap();
        assert!(
            (card.gains.red - preset.gains.red).abs() < 1e-12
                && (card.gains.blue - preset.gains.blue).abs() < 1e-12
        );
        for p in WbPreset::ALL {
            assert!(p.light().is_ok(), "{}", p.name());
        }
    }

    #[test]
    fn automatic_modes_pick_their_neutral() {
        let c = cam();
        let light = StandardIlluminant::D65.spd().unwrap();
        let scene = SceneResponse::new(&c, &light, Observer::cie1931_2deg()).unwrap();
        let subjects = scene.subjects(&[
            Reflectance::from_fn(|wl| if wl > 580.0 { 0.9 } else { 0.05 }), // bright red
            Reflectance::from_fn(|_| 0.6),                                  // light grey
            Reflectance::from_fn(|_| 0.2),                                  // dark grey
            Reflectance::from_fn(|wl| if wl < 500.0 { 0.5 } else { 0.05 }), // blue
        ]);
        let bn = resolve_white_balance(
            &WhiteBalance::BrightestNeutral,
            &c,
            scene.white().raw_rgb,
            &subjects,
        )
        .unwrap();
        assert_eq!(bn.reference_subject, Some(1));
        let card = resolve_white_balance(
            &WhiteBalance::GreyCard { subject: Some(2) },
            &c,
            scene.white().raw_rgb,
            &subjects,
        )
        .unwrap();
        let flat = resolve_white_balance(
            &WhiteBalance::default(),
            &c,
            scene.white().raw_rgb,
            &subjects,
        )
        .unwrap();
        assert!(
            (card.gains.red - flat.gains.red).abs() < 1e-12
                && (bn.gains.blue - flat.gains.blue).abs() < 1e-12
        );
        // Grey world: the balanced mean of the subjects is neutral.
        let gw = resolve_white_balance(
            &WhiteBalance::GreyWorld,
            &c,
            scene.white().raw_rgb,
            &subjects,
        )
        .unwrap();
        let mut mean = [0.0; 3];
        for s in &subjects {
            let b = gw.gains.apply(s.raw_rgb);
            for k in 0..3 {
                mean[k] += b[k];
            }
        }
        assert!((mean[0] - mean[1]).abs() < 1e-12 && (mean[2] - mean[1]).abs() < 1e-12);
        // Errors, not panics, on impossible requests.
        assert!(resolve_white_balance(&WhiteBalance::GreyWorld, &c, [1.0; 3], &[]).is_err());
        assert!(
            resolve_white_balance(
                &WhiteBalance::GreyCard { subject: Some(9) },
                &c,
                [1.0; 3],
                &subjects
            )
            .is_err()
        );
        assert!(
            resolve_white_balance(&WhiteBalance::Kelvin { cct_k: -5.0 }, &c, [1.0; 3], &[])
                .is_err()
        );
    }

    #[test]
    fn brightest_neutral_falls_back_to_brightest() {
        let c = cam();
        let light = StandardIlluminant::D65.spd().unwrap();
        let scene = SceneResponse::new(&c, &light, Observer::cie1931_2deg()).unwrap();
        let subjects = scene.subjects(&[
            Reflectance::from_fn(|wl| if wl > 580.0 { 0.9 } else { 0.05 }),
            Reflectance::from_fn(|wl| if wl < 500.0 { 0.5 } else { 0.05 }),
        ]);
        let bn = resolve_white_balance(
            &WhiteBalance::BrightestNeutral,
            &c,
            scene.white().raw_rgb,
            &subjects,
        )
        .unwrap();
        let brighter = usize::from(subjects[0].raw_rgb[1] <= subjects[1].raw_rgb[1]);
        assert_eq!(bn.reference_subject, Some(brighter));
    }

    #[test]
    fn serde_form_is_tagged() {
        let s = serde_json::to_string(&WhiteBalance::Kelvin { cct_k: 5600.0 }).unwrap();
        assert_eq!(s, r#"{"mode":"kelvin","cct_k":5600.0}"#);
        let back: WhiteBalance =
            serde_json::from_str(r#"{"mode":"preset","preset":"tungsten"}"#).unwrap();
        assert_eq!(
            back,
            WhiteBalance::Preset {
                preset: WbPreset::Tungsten
            }
        );
    }
}
