//! Turning a plan's references into typed spectra.
//!
//! A plan names lamps, gels, subjects and cameras by library id, by formula
//! (Planckian, CIE daylight) or by id into its own embedded spectra
//! ([`CustomLibrary`](crate::model::CustomLibrary)). The functions here look
//! them up, resample embedded data onto the 360–830 nm grid, apply gel
//! strengths and the tungsten dimmer, and say exactly which part of the plan
//! is at fault when something is missing ("source 'Key': unknown lamp 'xyz'").

use crate::error::{LibraryKind, PlanError, Result};
use crate::library;
use crate::model::{CameraRef, CustomSpectrum, GelRef, LampRef, Plan, Source, SubjectRef};
use lampwright_camera::CameraSensitivities;
use lampwright_color::illuminant::{daylight, planckian};
use lampwright_color::{Reflectance, RelativeSpd, Sensitivity, Transmittance};
use std::sync::Arc;

/// Exponent of the filament temperature's dependence on voltage:
/// `T = T_full · V^0.42` (common practice for tungsten filaments, from memory).
pub const DIMMER_CCT_EXPONENT: f64 = 0.42;
/// Exponent of the luminous flux's dependence on voltage:
/// `Φ = Φ_full · V^3.4` (common practice for tungsten filaments, from memory).
pub const DIMMER_FLUX_EXPONENT: f64 = 3.4;
/// Below this voltage fraction the colour is computed as at this fraction
/// (the lamp gives less than 4·10⁻⁵ of its light there, so the colour no
/// longer matters, and the filament temperature stays inside Planck's range).
pub const DIMMER_COLOUR_FLOOR: f64 = 0.05;

fn unknown(context: &str, kind: LibraryKind, id: &str) -> PlanError {
    PlanError::UnknownId {
        context: context.to_string(),
        kind,
        id: id.to_string(),
    }
}

fn find_custom<'a>(list: &'a [CustomSpectrum], id: &str) -> Option<&'a CustomSpectrum> {
    list.iter().find(|s| s.id == id)
}

/// Display name of a lamp reference (the library or embedded name, or a
/// description of the formula). Unknown ids show as the id itself.
#[must_use]
pub fn lamp_name(plan: &Plan, lamp: &LampRef) -> String {
    match lamp {
        LampRef::Library(id) => {
            library::lamp(id).map_or_else(|| id.clone(), |l| l.name.to_string())
        }
        LampRef::Blackbody { cct_k } => format!("Planckian {cct_k:.0} K"),
        LampRef::Daylight { cct_k } => format!("CIE daylight {cct_k:.0} K"),
        LampRef::Custom(id) => find_custom(&plan.custom.lamps, id)
            .map_or_else(|| id.clone(), |s| non_empty(&s.name, id)),
    }
}

fn non_empty(name: &str, id: &str) -> String {
    if name.trim().is_empty() {
        id.to_string()
    } else {
        name.to_string()
    }
}

/// Filament temperature at full voltage, K, when the lamp is a filament lamp
/// whose colour follows the dimmer: library lamps with a filament temperature,
/// and Planckian references (a Planckian source in a plan stands for a filament).
#[must_use]
pub fn lamp_filament_cct_k(lamp: &LampRef) -> Option<f64> {
    match lamp {
        LampRef::Library(id) => library::lamp(id).and_then(|l| l.filament_cct_k),
        LampRef::Blackbody { cct_k } => Some(*cct_k),
        LampRef::Daylight { .. } | LampRef::Custom(_) => None,
    }
}

fn lamp_spd_in(plan: &Plan, lamp: &LampRef, context: &str) -> Result<RelativeSpd> {
    match lamp {
        LampRef::Library(id) => library::lamp(id)
            .ok_or_else(|| unknown(context, LibraryKind::Lamp, id))?
            .spectrum()
            .cloned(),
        LampRef::Blackbody { cct_k } => {
            planckian(*cct_k).map_err(|e| PlanError::color_in(context, e))
        }
        LampRef::Daylight { cct_k } => {
            daylight(*cct_k).map_err(|e| PlanError::color_in(context, e))
        }
        LampRef::Custom(id) => {
            let s = find_custom(&plan.custom.lamps, id)
                .ok_or_else(|| unknown(context, LibraryKind::Lamp, id))?;
            RelativeSpd::from_samples(&s.wavelengths_nm, &s.values)
                .map_err(|e| PlanError::color_in(format!("{context}: embedded lamp '{id}'"), e))
        }
    }
}

/// The lamp's relative spectral power at full output, on the grid.
pub fn lamp_spd(plan: &Plan, lamp: &LampRef) -> Result<RelativeSpd> {
    lamp_spd_in(plan, lamp, "lamp")
}

/// What a dimmer does to a filament lamp.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DimmerEffect {
    /// Fraction of full voltage, 0–1.
    pub voltage_fraction: f64,
    /// Filament temperature at this voltage, K.
    pub filament_cct_k: f64,
    /// Fraction of full luminous flux at this voltage.
    pub flux_factor: f64,
}

/// The tungsten dimmer rule: filament temperature `T = T_full·V^0.42` and
/// luminous flux `Φ = Φ_full·V^3.4`, for a voltage fraction `V` in 0–1.
/// Below [`DIMMER_COLOUR_FLOOR`] the temperature is taken at the floor.
///
/// # References
/// - Common practice for tungsten-halogen and incandescent lamps (exponents
///   from memory; lamp makers quote similar power laws for voltage derating).
pub fn tungsten_dimmer(filament_full_cct_k: f64, voltage_fraction: f64) -> Result<DimmerEffect> {
    if !voltage_fraction.is_finite() || !(0.0..=1.0).contains(&voltage_fraction) {
        return Err(PlanError::Invalid {
            field: "dimmer".into(),
            message: format!("{voltage_fraction} is not a voltage fraction between 0 and 1"),
        });
    }
    if !filament_full_cct_k.is_finite() || filament_full_cct_k <= 0.0 {
        return Err(PlanError::Invalid {
            field: "filament temperature".into(),
            message: format!("{filament_full_cct_k} K is not a temperature"),
        });
    }
    Ok(DimmerEffect {
        voltage_fraction,
        filament_cct_k: filament_full_cct_k
            * voltage_fraction
                .max(DIMMER_COLOUR_FLOOR)
                .powf(DIMMER_CCT_EXPONENT),
        flux_factor: voltage_fraction.powf(DIMMER_FLUX_EXPONENT),
    })
}

/// A source's lamp after its dimmer, before its gels.
#[derive(Debug, Clone, PartialEq)]
pub struct DimmedLamp {
    /// Relative spectral power (shape only; the level comes from the plan).
    pub spd: RelativeSpd,
    /// The dimmer's effect, for filament lamps (`None`: the dimmer is ignored).
    pub dimmer: Option<DimmerEffect>,
}

impl DimmedLamp {
    /// Factor on the source's level from the dimmer (1 for non-filament lamps).
    #[must_use]
    pub fn flux_factor(&self) -> f64 {
        self.dimmer.map_or(1.0, |d| d.flux_factor)
    }
}

/// How the plan names a source in messages: `source 'Key'`.
#[must_use]
pub fn source_context(source: &Source) -> String {
    format!("source '{}'", source.name)
}

/// The source's lamp spectrum after the dimmer.
///
/// For a Planckian lamp (library or plan) the dimmed spectrum is Planckian at
/// the dimmed filament temperature; for a tabulated filament lamp (CIE A) it is
/// the table × `Planck(T′)/Planck(T)`. Other lamps ignore the dimmer.
pub fn dimmed_lamp(plan: &Plan, source: &Source) -> Result<DimmedLamp> {
    let context = source_context(source);
    let full = lamp_spd_in(plan, &source.lamp, &context)?;
    let Some(filament_k) = lamp_filament_cct_k(&source.lamp) else {
        return Ok(DimmedLamp {
            spd: full,
            dimmer: None,
        });
    };
    let effect = tungsten_dimmer(filament_k, source.dimmer).map_err(|e| match e {
        PlanError::Invalid { field, message } => PlanError::Invalid {
            field: format!("{context} {field}"),
            message,
        },
        other => other,
    })?;
    if (effect.filament_cct_k - filament_k).abs() < 1e-9 {
        return Ok(DimmedLamp {
            spd: full,
            dimmer: Some(effect),
        });
    }
    let is_planckian = match &source.lamp {
        LampRef::Blackbody { .. } => true,
        LampRef::Library(id) => library::lamp(id)
            .is_some_and(|l| matches!(l.spectrum, library::LampSpectrum::Planckian { .. })),
        _ => false,
    };
    let dimmed = planckian(effect.filament_cct_k).map_err(|e| PlanError::color_in(&context, e))?;
    let spd = if is_planckian {
        dimmed
    } else {
        let reference = planckian(filament_k).map_err(|e| PlanError::color_in(&context, e))?;
        let ratio = Transmittance::from_fn(|wl| dimmed.at_nm(wl) / reference.at_nm(wl));
        &full * &ratio
    };
    Ok(DimmedLamp {
        spd,
        dimmer: Some(effect),
    })
}

/// Display name of a gel reference.
#[must_use]
pub fn gel_name(plan: &Plan, gel: &GelRef) -> String {
    match gel {
        GelRef::Library(id) => library::gel(id).map_or_else(|| id.clone(), |g| g.name.to_string()),
        GelRef::Custom(id) => find_custom(&plan.custom.gels, id)
            .map_or_else(|| id.clone(), |s| non_empty(&s.name, id)),
    }
}

fn gel_in(plan: &Plan, gel: &GelRef, context: &str) -> Result<Transmittance> {
    match gel {
        GelRef::Library(id) => library::gel(id)
            .ok_or_else(|| unknown(context, LibraryKind::Gel, id))?
            .transmittance()
            .cloned(),
        GelRef::Custom(id) => {
            let s = find_custom(&plan.custom.gels, id)
                .ok_or_else(|| unknown(context, LibraryKind::Gel, id))?;
            Transmittance::from_samples(&s.wavelengths_nm, &s.values)
                .map_err(|e| PlanError::color_in(format!("{context}: embedded gel '{id}'"), e))
        }
    }
}

/// A gel's full-strength transmittance on the grid.
pub fn gel_transmittance(plan: &Plan, gel: &GelRef) -> Result<Transmittance> {
    gel_in(plan, gel, "gel")
}

/// The combined transmittance of a source's gel stack, each layer at its
/// strength (`T^f`); clear glass when there are no gels.
pub fn gel_stack(plan: &Plan, source: &Source) -> Result<Transmittance> {
    let context = source_context(source);
    let mut total = Transmittance::clear();
    for (i, layer) in source.gels.iter().enumerate() {
        if !layer.strength.is_finite() || layer.strength < 0.0 {
            return Err(PlanError::Invalid {
                field: format!("{context} gel {}", i + 1),
                message: format!(
                    "strength {} is not a fraction of at least 0",
                    layer.strength
                ),
            });
        }
        let t = gel_in(plan, &layer.gel, &context)?;
        total = &total * &t.strength(layer.strength);
    }
    Ok(total)
}

/// A source resolved to spectra.
#[derive(Debug, Clone, PartialEq)]
pub struct ResolvedSource {
    /// The lamp after its dimmer.
    pub lamp: DimmedLamp,
    /// The gel stack's combined transmittance.
    pub gels: Transmittance,
    /// Light leaving the gels: `lamp.spd × gels` (relative).
    pub filtered: RelativeSpd,
}

/// Resolve a source: lamp, dimmer and gels.
pub fn resolve_source(plan: &Plan, source: &Source) -> Result<ResolvedSource> {
    let lamp = dimmed_lamp(plan, source)?;
    let gels = gel_stack(plan, source)?;
    let filtered = &lamp.spd * &gels;
    Ok(ResolvedSource {
        lamp,
        gels,
        filtered,
    })
}

/// A subject resolved to its reflectance.
#[derive(Debug, Clone, PartialEq)]
pub struct ResolvedSubject {
    /// Display name (shared with every result that names it).
    pub name: Arc<str>,
    /// Group (skin, food, ... or the embedded subject's group, "custom" when empty).
    pub group: Arc<str>,
    /// Reflectance on the grid.
    pub reflectance: Reflectance,
}

/// A subject's name, group and reflectance.
pub fn subject_reflectance(plan: &Plan, subject: &SubjectRef) -> Result<ResolvedSubject> {
    let context = "subject";
    match subject {
        SubjectRef::Library(id) => {
            let item =
                library::subject(id).ok_or_else(|| unknown(context, LibraryKind::Subject, id))?;
            Ok(ResolvedSubject {
                name: item.name.into(),
                group: item.group.into(),
                reflectance: item.reflectance()?.clone(),
            })
        }
        SubjectRef::Custom(id) => {
            let s = plan
                .custom
                .subjects
                .iter()
                .find(|s| s.spectrum.id == *id)
                .ok_or_else(|| unknown(context, LibraryKind::Subject, id))?;
            let reflectance =
                Reflectance::from_samples(&s.spectrum.wavelengths_nm, &s.spectrum.values)
                    .map_err(|e| PlanError::color_in(format!("embedded subject '{id}'"), e))?;
            Ok(ResolvedSubject {
                name: non_empty(&s.spectrum.name, id).into(),
                group: if s.group.trim().is_empty() {
                    "custom".into()
                } else {
                    s.group.as_str().into()
                },
                reflectance,
            })
        }
    }
}

/// The camera's sensitivities.
pub fn camera_sensitivities(plan: &Plan, camera: &CameraRef) -> Result<CameraSensitivities> {
    match camera {
        CameraRef::Library(id) => library::camera(id)?
            .cloned()
            .ok_or_else(|| unknown("camera", LibraryKind::Camera, id)),
        CameraRef::Colorimetric => Ok(CameraSensitivities::colorimetric()?),
        CameraRef::Custom(id) => {
            let c = plan
                .custom
                .cameras
                .iter()
                .find(|c| c.id == *id)
                .ok_or_else(|| unknown("camera", LibraryKind::Camera, id))?;
            let what = format!("embedded camera '{id}'");
            let channel = |values: &[f64]| {
                Sensitivity::from_samples(&c.wavelengths_nm, values)
                    .map_err(|e| PlanError::color_in(&what, e))
            };
            Ok(CameraSensitivities::new(
                non_empty(&c.name, id),
                channel(&c.r)?,
                channel(&c.g)?,
                channel(&c.b)?,
            )?)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{CustomCamera, CustomSubject, GelLayer};
    use lampwright_color::cct::{CctMethod, cct_duv_of_spd};

    fn source(lamp: LampRef) -> Source {
        Source {
            name: "Key".into(),
            lamp,
            ..Source::default()
        }
    }

    #[test]
    fn unknown_ids_name_the_source() {
        let plan = Plan::default();
        let s = source(LampRef::Library("xyz".into()));
        assert_eq!(
            resolve_source(&plan, &s).unwrap_err().to_string(),
            "source 'Key': unknown lamp 'xyz'"
        );
        let mut s = source(LampRef::Blackbody { cct_k: 3200.0 });
        s.gels.push(GelLayer {
            gel: GelRef::Custom("mine".into()),
            strength: 1.0,
        });
        assert_eq!(
            resolve_source(&plan, &s).unwrap_err().to_string(),
            "source 'Key': unknown gel 'mine'"
        );
        assert!(subject_reflectance(&plan, &SubjectRef::Library("nope".into())).is_err());
        assert!(camera_sensitivities(&plan, &CameraRef::Library("nope".into())).is_err());
    }

    #[test]
    fn dimmer_rule_follows_the_power_laws() {
        // T ∝ V^0.42 and Φ ∝ V^3.4 (common practice, from memory):
        // at 70 % voltage a 3200 K lamp runs at 3200·0.7^0.42 ≈ 2754.8 K and gives 0.7^3.4 ≈ 29.8 % of its light.
        let e = tungsten_dimmer(3200.0, 0.7).unwrap();
        assert!(
            (e.filament_cct_k - 2754.8).abs() < 0.1,
            "{}",
            e.filament_cct_k
        );
        assert!((e.flux_factor - 0.2977).abs() < 1e-3, "{}", e.flux_factor);
        assert!(tungsten_dimmer(3200.0, 1.5).is_err());
        assert!(tungsten_dimmer(3200.0, f64::NAN).is_err());
        let off = tungsten_dimmer(3200.0, 0.0).unwrap();
        assert!(off.flux_factor.abs() < 1e-12 && off.filament_cct_k > 100.0);
    }

    #[test]
    fn dimmed_tungsten_is_warmer_and_other_lamps_ignore_the_dimmer() {
        let plan = Plan::default();
        for lamp in [
            LampRef::Library("tungsten-3200".into()),
            LampRef::Library("cie-a".into()),
            LampRef::Blackbody { cct_k: 3200.0 },
        ] {
            let mut s = source(lamp.clone());
            s.dimmer = 0.7;
            let d = dimmed_lamp(&plan, &s).unwrap();
            let effect = d.dimmer.unwrap();
            let cct = cct_duv_of_spd(&d.spd, CctMethod::Ohno2014).unwrap().cct_k;
            assert!(
                (cct - effect.filament_cct_k).abs() < 5.0,
                "{lamp:?}: {cct} vs {}",
                effect.filament_cct_k
            );
        }
        let mut s = source(LampRef::Library("led-3200-hifi".into()));
        s.dimmer = 0.5;
        let d = dimmed_lamp(&plan, &s).unwrap();
        assert!(d.dimmer.is_none());
        assert!((d.flux_factor() - 1.0).abs() < 1e-12);
    }

    #[test]
    fn gel_stack_multiplies_layers_at_their_strengths() {
        let plan = Plan::default();
        let mut s = source(LampRef::Blackbody { cct_k: 3200.0 });
        for (gel, strength) in [("nd-03", 1.0), ("nd-06", 0.5)] {
            s.gels.push(GelLayer {
                gel: GelRef::Library(gel.into()),
                strength,
            });
        }
        let t = gel_stack(&plan, &s).unwrap();
        // 10^-0.3 · (10^-0.6)^0.5 = 10^-0.6 (the table keeps six significant digits)
        assert!((t.at_nm(550.0) - 10f64.powf(-0.6)).abs() < 1e-6);
        s.gels[1].strength = -1.0;
        assert!(gel_stack(&plan, &s).is_err());
    }

    #[test]
    fn embedded_spectra_are_resampled_and_named() {
        let mut plan = Plan::default();
        plan.custom.subjects.push(CustomSubject {
            spectrum: CustomSpectrum {
                id: "paint".into(),
                name: "Wall paint".into(),
                wavelengths_nm: vec![380.0, 480.0, 580.0, 680.0, 780.0],
                values: vec![0.2, 0.3, 0.4, 0.5, 0.6],
                note: String::new(),
            },
            group: String::new(),
        });
        let r = subject_reflectance(&plan, &SubjectRef::Custom("paint".into())).unwrap();
        assert_eq!(&*r.name, "Wall paint");
        assert_eq!(&*r.group, "custom");
        assert!((r.reflectance.at_nm(580.0) - 0.4).abs() < 1e-9);
        plan.custom.lamps.push(CustomSpectrum {
            id: "bad".into(),
            wavelengths_nm: vec![400.0, 500.0],
            values: vec![1.0],
            ..CustomSpectrum::default()
        });
        let e = lamp_spd(&plan, &LampRef::Custom("bad".into()))
            .unwrap_err()
            .to_string();
        assert!(e.starts_with("lamp: embedded lamp 'bad'"), "{e}");
        let wl: Vec<f64> = (0..=40).map(|i| 380.0 + 10.0 * f64::from(i)).collect();
        let bump = |c: f64| {
            wl.iter()
                .map(|w| (-((w - c) / 40.0).powi(2)).exp())
                .collect::<Vec<_>>()
        };
        plan.custom.cameras.push(CustomCamera {
            id: "cam".into(),
            name: String::new(),
            wavelengths_nm: wl.clone(),
            r: bump(600.0),
            g: bump(540.0),
            b: bump(450.0),
            note: String::new(),
        });
        let cam = camera_sensitivities(&plan, &CameraRef::Custom("cam".into())).unwrap();
        assert_eq!(cam.name, "cam");
        assert!(camera_sensitivities(&plan, &CameraRef::Colorimetric).is_ok());
    }
}
