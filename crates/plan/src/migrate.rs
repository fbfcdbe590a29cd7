//! Earlier plan file formats and their migration to the current one.
//!
//! # Format version 0
//!
//! The first plan format had no zones and gave each light's level in stops
//! relative to 1000 lux (`level_stops`); it called the plan's name `title`,
//! the sources `lights` (without ids), switched lights with `on`, named the
//! back light `Rim`, wrote a Planckian lamp as `Blackbody(3200.0)`, listed
//! gels as `(id, strength)` pairs and subjects as bare library ids, and kept
//! the camera as a library id with an optional Kelvin white balance (grey card
//! when absent).
//!
//! Migration to version 1: `name = title`; lights become sources with ids
//! 1, 2, 3… in file order; `level_lux = 1000 · 2^level_stops`; `Rim` becomes
//! `Back`; no zones (every source reaches the one scene); subjects are
//! included with weight 1; everything else takes the version 1 defaults.

use crate::model::{
    CameraRef, CameraSettings, FORMAT_VERSION, GelLayer, GelRef, LampRef, Plan, Source, SourceRole,
    SubjectEntry, SubjectRef, WhiteBalanceSetting,
};
use serde::Deserialize;

/// The level that `level_stops = 0` meant in format version 0, lux.
pub const V0_REFERENCE_LUX: f64 = 1000.0;

/// A plan in format version 0.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(rename = "Plan")]
pub struct PlanV0 {
    /// Always 0.
    pub format_version: u32,
    /// The plan's name.
    #[serde(default)]
    pub title: String,
    /// Free notes.
    #[serde(default)]
    pub notes: String,
    /// The lights, in order.
    #[serde(default)]
    pub lights: Vec<LightV0>,
    /// Library subject ids.
    #[serde(default)]
    pub subjects: Vec<String>,
    /// Library camera id.
    #[serde(default = "default_camera")]
    pub camera: String,
    /// White balance in Kelvin; `None` meant a grey-card white balance.
    #[serde(default)]
    pub white_balance_k: Option<f64>,
}

fn default_camera() -> String {
    "demo-a".into()
}

fn yes() -> bool {
    true
}

fn one() -> f64 {
    1.0
}

/// A light in format version 0.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(rename = "Light")]
pub struct LightV0 {
    /// Name.
    pub name: String,
    /// Role.
    #[serde(default)]
    pub role: RoleV0,
    /// Lamp.
    pub lamp: LampV0,
    /// Level in stops relative to [`V0_REFERENCE_LUX`].
    #[serde(default)]
    pub level_stops: f64,
    /// Switched on.
    #[serde(default = "yes")]
    pub on: bool,
    /// Gels as (library id, strength), lamp side first.
    #[serde(default)]
    pub gels: Vec<(String, f64)>,
    /// Dimmer, fraction of full voltage.
    #[serde(default = "one")]
    pub dimmer: f64,
}

/// Light roles in format version 0.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Deserialize)]
pub enum RoleV0 {
    /// Key.
    #[default]
    Key,
    /// Fill.
    Fill,
    /// Rim (called Back from version 1).
    Rim,
    /// Background.
    Background,
    /// Ambient.
    Ambient,
    /// Practical.
    Practical,
}

/// Lamps in format version 0.
#[derive(Debug, Clone, PartialEq, Deserialize)]
pub enum LampV0 {
    /// Library lamp id.
    Library(String),
    /// Planckian at a temperature, K.
    Blackbody(f64),
}

/// Migrate a version 0 plan to the current format.
#[must_use]
pub fn v0_to_v1(old: PlanV0) -> Plan {
    let sources = old
        .lights
        .into_iter()
        .zip(1u32..)
        .map(|(light, id)| Source {
            id,
            name: light.name,
            role: match light.role {
                RoleV0::Key => SourceRole::Key,
                RoleV0::Fill => SourceRole::Fill,
                RoleV0::Rim => SourceRole::Back,
                RoleV0::Background => SourceRole::Background,
                RoleV0::Ambient => SourceRole::Ambient,
                RoleV0::Practical => SourceRole::Practical,
            },
            lamp: match light.lamp {
                LampV0::Library(id) => LampRef::Library(id),
                LampV0::Blackbody(cct_k) => LampRef::Blackbody { cct_k },
            },
            level_lux: V0_REFERENCE_LUX * light.level_stops.exp2(),
            enabled: light.on,
            solo: false,
            gels: light
                .gels
                .into_iter()
                .map(|(id, strength)| GelLayer {
                    gel: GelRef::Library(id),
                    strength,
                })
                .collect(),
            dimmer: light.dimmer,
            locked: false,
        })
        .collect();
    Plan {
        format_version: FORMAT_VERSION,
        name: old.title,
        notes: old.notes,
        sources,
        zones: Vec::new(),
        subjects: old
            .subjects
            .into_iter()
            .map(|id| SubjectEntry {
                subject: SubjectRef::Library(id),
                included: true,
                weight: 1.0,
            })
            .collect(),
        camera: CameraSettings {
            camera: CameraRef::Library(old.camera),
            white_balance: old
                .white_balance_k
                .map_or(WhiteBalanceSetting::GreyCard, WhiteBalanceSetting::Kelvin),
            ..CameraSettings::default()
        },
        ..Plan::default()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn stops_become_lux_and_rim_becomes_back() {
        let old = PlanV0 {
            format_version: 0,
            title: "Old".into(),
            notes: String::new(),
            lights: vec![
                LightV0 {
                    name: "Key".into(),
                    role: RoleV0::Key,
                    lamp: LampV0::Blackbody(3200.0),
                    level_stops: 1.0,
                    on: true,
                    gels: vec![("cto-full".into(), 0.5)],
                    dimmer: 1.0,
                },
                LightV0 {
                    name: "Rim".into(),
                    role: RoleV0::Rim,
                    lamp: LampV0::Library("daylight-d55".into()),
                    level_stops: -2.0,
                    on: false,
                    gels: Vec::new(),
                    dimmer: 1.0,
                },
            ],
            subjects: vec!["grey-card-18".into()],
            camera: "demo-b".into(),
            white_balance_k: Some(3200.0),
        };
        let plan = v0_to_v1(old);
        assert_eq!(plan.format_version, FORMAT_VERSION);
        assert_eq!(plan.name, "Old");
        assert_eq!(plan.sources[0].id, 1);
        assert_eq!(plan.sources[1].id, 2);
        assert!((plan.sources[0].level_lux - 2000.0).abs() < 1e-9);
        assert!((plan.sources[1].level_lux - 250.0).abs() < 1e-9);
        assert_eq!(plan.sources[1].role, SourceRole::Back);
        assert!(!plan.sources[1].enabled);
        assert_eq!(plan.sources[0].lamp, LampRef::Blackbody { cct_k: 3200.0 });
        assert!(plan.zones.is_empty());
        assert_eq!(plan.camera.camera, CameraRef::Library("demo-b".into()));
        assert_eq!(
            plan.camera.white_balance,
            WhiteBalanceSetting::Kelvin(3200.0)
        );
    }
}
