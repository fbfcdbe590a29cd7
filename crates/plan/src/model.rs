//! The lighting plan document: what the user builds, edits and saves.
//!
//! A plan names its light sources (lamp, level, gels, dimmer), the zones of the
//! scene they reach, the subjects that matter, the camera and how to view the
//! result. Spectra the user imported travel inside the plan ([`CustomLibrary`])
//! so that a plan file opens the same on another machine.

use serde::{Deserialize, Serialize};

/// Current plan file format version. Every earlier version keeps loading
/// through [`crate::files`] migrations.
pub const FORMAT_VERSION: u32 = 1;

/// A lighting plan.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct Plan {
    /// File format version (see [`FORMAT_VERSION`]).
    pub format_version: u32,
    /// Plan title, e.g. "Night market portrait".
    pub name: String,
    /// Free notes for the crew.
    pub notes: String,
    /// Light sources on set.
    pub sources: Vec<Source>,
    /// Parts of the scene with their own mix. Empty: one zone that every
    /// enabled source reaches at its own level.
    pub zones: Vec<Zone>,
    /// Subjects whose colour matters.
    pub subjects: Vec<SubjectEntry>,
    /// The camera and its processing.
    pub camera: CameraSettings,
    /// How results are shown.
    pub viewing: Viewing,
    /// What the advisor may use.
    pub kit: Kit,
    /// Spectra imported by the user, embedded in the plan.
    pub custom: CustomLibrary,
}

impl Default for Plan {
    fn default() -> Self {
        Plan {
            format_version: FORMAT_VERSION,
            name: "Untitled plan".into(),
            notes: String::new(),
            sources: Vec::new(),
            zones: Vec::new(),
            subjects: Vec::new(),
            camera: CameraSettings::default(),
            viewing: Viewing::default(),
            kit: Kit::default(),
            custom: CustomLibrary::default(),
        }
    }
}

/// Stable identifier of a source within a plan (survives reordering; zones refer to it).
pub type SourceId = u32;

/// What a source does in the lighting scheme. The key sets the reference for
/// levels in stops and for the key:fill ratio.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum SourceRole {
    /// Main light.
    #[default]
    Key,
    /// Fill light.
    Fill,
    /// Back, rim or hair light.
    Back,
    /// Light on the background.
    Background,
    /// Light that is already there (street, venue, window).
    Ambient,
    /// A lamp in shot.
    Practical,
}

impl SourceRole {
    /// All roles, for pickers.
    pub const ALL: [SourceRole; 6] = [
        SourceRole::Key,
        SourceRole::Fill,
        SourceRole::Back,
        SourceRole::Background,
        SourceRole::Ambient,
        SourceRole::Practical,
    ];

    /// The trade's word for the role.
    #[must_use]
    pub fn label(self) -> &'static str {
        match self {
            SourceRole::Key => "Key",
            SourceRole::Fill => "Fill",
            SourceRole::Back => "Back",
            SourceRole::Background => "Background",
            SourceRole::Ambient => "Ambient",
            SourceRole::Practical => "Practical",
        }
    }
}

/// One light on set.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct Source {
    /// Stable id (unique within the plan).
    pub id: SourceId,
    /// Name the crew uses, e.g. "Key", "Street sodium".
    pub name: String,
    /// Role in the scheme.
    pub role: SourceRole,
    /// The lamp's spectrum.
    pub lamp: LampRef,
    /// Illuminance this source gives at the subject, at full output and with no gels, in lux.
    pub level_lux: f64,
    /// Switched on.
    pub enabled: bool,
    /// When any source is soloed, only soloed sources light the scene.
    pub solo: bool,
    /// Gels and filters in front of the lamp, lamp side first.
    pub gels: Vec<GelLayer>,
    /// Dimmer setting as a fraction of full voltage (1 = full). Applies to
    /// filament lamps only (colour shifts with voltage); other lamps ignore it.
    pub dimmer: f64,
    /// The advisor must not change this source.
    pub locked: bool,
}

impl Default for Source {
    fn default() -> Self {
        Source {
            id: 0,
            name: "Source".into(),
            role: SourceRole::Key,
            lamp: LampRef::Blackbody { cct_k: 3200.0 },
            level_lux: 1000.0,
            enabled: true,
            solo: false,
            gels: Vec::new(),
            dimmer: 1.0,
            locked: false,
        }
    }
}

/// Where a lamp spectrum comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum LampRef {
    /// An entry of the built-in lamp library, by id.
    Library(String),
    /// A Planckian (black-body) radiator at a colour temperature, K.
    Blackbody {
        /// Colour temperature, K.
        cct_k: f64,
    },
    /// CIE daylight at a correlated colour temperature, K (4000–25 000 K).
    Daylight {
        /// Correlated colour temperature, K.
        cct_k: f64,
    },
    /// A spectrum embedded in the plan ([`CustomLibrary::lamps`]), by id.
    Custom(String),
}

/// A gel or filter at a strength.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GelLayer {
    /// Which gel.
    pub gel: GelRef,
    /// Fraction of the full gel: 1/8, 1/4, 1/2, 3/4, 1 or any value ≥ 0;
    /// transmittance is T^strength (dye density scales with the amount of dye).
    pub strength: f64,
}

/// Where a gel's transmittance comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum GelRef {
    /// An entry of the built-in gel library, by id.
    Library(String),
    /// A transmittance embedded in the plan ([`CustomLibrary::gels`]), by id.
    Custom(String),
}

/// Stable identifier of a zone within a plan.
pub type ZoneId = u32;

/// A named part of the scene with its own mix of light.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct Zone {
    /// Stable id.
    pub id: ZoneId,
    /// Name, e.g. "Key side", "Shadow side", "Background".
    pub name: String,
    /// Which sources reach this zone, and how strongly. Sources not listed do not reach it.
    pub reach: Vec<ZoneReach>,
    /// How much this zone counts in the advisor's camera-fidelity goal,
    /// relative to the other zones (0 leaves it out; 1 when the file does not say).
    pub weight: f64,
}

impl Default for Zone {
    fn default() -> Self {
        Zone {
            id: 0,
            name: "Zone".into(),
            reach: Vec::new(),
            weight: 1.0,
        }
    }
}

/// One source's contribution to a zone.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ZoneReach {
    /// The source.
    pub source: SourceId,
    /// Its level in this zone.
    pub level: ZoneLevel,
}

/// How a source's level in a zone is given.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum ZoneLevel {
    /// The source's own level (`level_lux`), unchanged.
    AsSource,
    /// Illuminance at the zone, lux.
    Lux(f64),
    /// Stops relative to the source's own level (−1 = half the light).
    Stops(f64),
    /// From the fixture's rated output and its distance by the inverse-square
    /// law (holds when the distance is several times the source's size).
    Distance {
        /// Rated illuminance at 1 m, lux (as makers state it).
        rated_lux_at_1m: f64,
        /// Distance to the zone, m.
        distance_m: f64,
    },
}

/// A subject in the plan.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct SubjectEntry {
    /// Which reflectance.
    pub subject: SubjectRef,
    /// Counts for the summary and the advisor.
    pub included: bool,
    /// Weight in the advisor's fidelity goal (e.g. skin ×2).
    pub weight: f64,
}

impl Default for SubjectEntry {
    fn default() -> Self {
        SubjectEntry {
            subject: SubjectRef::Library("grey-card-18".into()),
            included: true,
            weight: 1.0,
        }
    }
}

/// Where a subject's reflectance comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum SubjectRef {
    /// An entry of the built-in subject library, by id.
    Library(String),
    /// A reflectance embedded in the plan ([`CustomLibrary::subjects`]), by id.
    Custom(String),
}

/// The camera and its processing.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct CameraSettings {
    /// Which sensitivities.
    pub camera: CameraRef,
    /// White balance.
    pub white_balance: WhiteBalanceSetting,
    /// Which colour-correction matrix.
    pub matrix: MatrixMode,
    /// How matrices are fitted.
    pub fit: FitMethod,
}

impl Default for CameraSettings {
    fn default() -> Self {
        CameraSettings {
            camera: CameraRef::Library("demo-a".into()),
            white_balance: WhiteBalanceSetting::GreyCard,
            matrix: MatrixMode::Factory,
            fit: FitMethod::WhitePreserving,
        }
    }
}

/// Where a camera's sensitivities come from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum CameraRef {
    /// A built-in demo camera, by id.
    Library(String),
    /// The ideal colorimetric camera (a linear mix of the CIE 1931 functions).
    Colorimetric,
    /// Sensitivities embedded in the plan ([`CustomLibrary::cameras`]), by id.
    Custom(String),
}

/// White-balance modes a photographer knows.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum WhiteBalanceSetting {
    /// Kelvin preset (Planckian below 4000 K, CIE daylight at and above).
    Kelvin(f64),
    /// Named preset.
    Preset(WbPreset),
    /// Custom white balance from a neutral grey card in the scene.
    GreyCard,
    /// Automatic: grey world over the scene's subjects.
    AutoGreyWorld,
    /// Automatic: brightest near-neutral subject.
    AutoBrightestNeutral,
}

/// Named white-balance presets.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum WbPreset {
    /// Daylight.
    Daylight,
    /// Cloudy.
    Cloudy,
    /// Shade.
    Shade,
    /// Tungsten.
    Tungsten,
    /// Fluorescent.
    Fluorescent,
}

/// Which colour-correction matrix the camera applies.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum MatrixMode {
    /// Fitted once under D65, as a camera ships.
    #[default]
    Factory,
    /// Two factory matrices (D65 and A) interpolated by the scene's CCT in mired.
    DualIlluminant,
    /// Fitted under the plan's own light, as if a target were shot on set.
    SceneProfile,
}

/// How a matrix is fitted.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum FitMethod {
    /// Plain least squares.
    Linear,
    /// Least squares with neutral mapped exactly to neutral.
    #[default]
    WhitePreserving,
    /// Refined to minimise CIEDE2000.
    De2000,
    /// Root-polynomial, degree 2 (exposure-invariant).
    RootPoly,
}

/// How results are viewed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(default)]
pub struct Viewing {
    /// Eye adapted to the scene white, or colours as lit.
    pub adaptation: Adaptation,
    /// Display colour space of the swatches.
    pub display: Display,
}

/// Eye adaptation for the eye-side swatches.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum Adaptation {
    /// Adapted to the scene white (CAT16 to D65).
    #[default]
    Adapted,
    /// As lit: no adaptation, colours of the light show.
    AsLit,
}

/// Display colour space.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum Display {
    /// sRGB (IEC 61966-2-1).
    #[default]
    Srgb,
    /// Display P3.
    DisplayP3,
}

/// What the advisor may use.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct Kit {
    /// Library gel ids the crew has; empty means the whole library.
    pub gels: Vec<String>,
    /// Most gels stacked on one source.
    pub max_stack: u8,
    /// Most light a source may lose to gels and level changes, stops.
    pub max_stops_lost: f64,
}

impl Default for Kit {
    fn default() -> Self {
        Kit {
            gels: Vec::new(),
            max_stack: 2,
            max_stops_lost: 2.0,
        }
    }
}

/// Spectra imported by the user, embedded in the plan.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(default)]
pub struct CustomLibrary {
    /// Lamp spectra (relative).
    pub lamps: Vec<CustomSpectrum>,
    /// Gel transmittances (0–1).
    pub gels: Vec<CustomSpectrum>,
    /// Subject reflectances (0–1).
    pub subjects: Vec<CustomSubject>,
    /// Camera sensitivities.
    pub cameras: Vec<CustomCamera>,
}

/// A measured spectrum as imported (not resampled), so nothing is lost.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(default)]
pub struct CustomSpectrum {
    /// Id referred to by the plan.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Wavelengths, nm, increasing.
    pub wavelengths_nm: Vec<f64>,
    /// Values at those wavelengths.
    pub values: Vec<f64>,
    /// Where it came from (file name, instrument, date).
    pub note: String,
}

/// A measured subject reflectance.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(default)]
pub struct CustomSubject {
    /// The spectrum.
    pub spectrum: CustomSpectrum,
    /// Group, e.g. "skin", "food", "fabric".
    pub group: String,
}

/// Measured camera sensitivities.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(default)]
pub struct CustomCamera {
    /// Id referred to by the plan.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Wavelengths, nm, increasing.
    pub wavelengths_nm: Vec<f64>,
    /// Red channel.
    pub r: Vec<f64>,
    /// Green channel.
    pub g: Vec<f64>,
    /// Blue channel.
    pub b: Vec<f64>,
    /// Where it came from.
    pub note: String,
}

impl Plan {
    /// The next unused source id.
    #[must_use]
    pub fn next_source_id(&self) -> SourceId {
        self.sources
            .iter()
            .map(|s| s.id)
            .max()
            .map_or(1, |m| m.saturating_add(1))
    }

    /// The next unused zone id.
    #[must_use]
    pub fn next_zone_id(&self) -> ZoneId {
        self.zones
            .iter()
            .map(|z| z.id)
            .max()
            .map_or(1, |m| m.saturating_add(1))
    }

    /// The source with this id.
    #[must_use]
    pub fn source(&self, id: SourceId) -> Option<&Source> {
        self.sources.iter().find(|s| s.id == id)
    }

    /// The source with this id, mutably.
    pub fn source_mut(&mut self, id: SourceId) -> Option<&mut Source> {
        self.sources.iter_mut().find(|s| s.id == id)
    }

    /// Whether a source lights the scene, taking on/off and solo into account.
    #[must_use]
    pub fn is_lit(&self, source: &Source) -> bool {
        let any_solo = self.sources.iter().any(|s| s.solo && s.enabled);
        source.enabled && (!any_solo || source.solo)
    }
}
