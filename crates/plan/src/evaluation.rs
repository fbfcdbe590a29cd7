//! What the evaluation engine returns for a plan: everything the window, the
//! report and the advisor show. Plain data, no NaN: quantities that cannot be
//! computed are `None` with a warning saying why.

use serde::Serialize;
use std::sync::Arc;

/// Number of hue bins in TM-30.
pub const TM30_BINS: usize = 16;

/// The evaluation of a whole plan.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct Evaluation {
    /// Figures of the main zone's mix (the whole scene when the plan has no zones).
    pub light: LightFigures,
    /// Each source's share at the subject in the main zone.
    pub sources: Vec<SourceFigures>,
    /// Every zone (one, named after the scene, when the plan has no zones).
    pub zones: Vec<ZoneEvaluation>,
    /// Subjects in the main zone, eye versus camera, in plan order.
    pub subjects: Vec<SubjectResult>,
    /// Summary over the included subjects of the main zone.
    pub summary: Summary,
    /// Pairs of subjects that match to one observer but not to the other.
    pub metamers: Vec<MetamerPair>,
    /// The camera's figures under this light.
    pub camera: CameraFigures,
    /// Plain-language warnings for the crew.
    pub warnings: Vec<String>,
}

/// Figures of one light mix.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct LightFigures {
    /// Mixed spectral irradiance at the subject, W·m⁻²·nm⁻¹, 360–830 nm at 1 nm
    /// (shared, not copied, between evaluations that reuse it).
    pub spectrum: Arc<[f64]>,
    /// Illuminance, lux.
    pub illuminance_lux: f64,
    /// Incident exposure value at ISO 100 (None when dark).
    pub ev100: Option<f64>,
    /// CIE 1931 xy of the mix.
    pub xy: Option<[f64; 2]>,
    /// CIE 1960 uv of the mix.
    pub uv: Option<[f64; 2]>,
    /// Correlated colour temperature, K (Ohno 2014).
    pub cct_k: Option<f64>,
    /// Distance from the Planckian locus in CIE 1960 uv, positive = green.
    pub duv: Option<f64>,
    /// Mired (10⁶ / CCT).
    pub mired: Option<f64>,
    /// CIE 13.3 general colour rendering index.
    pub cri_ra: Option<f64>,
    /// CIE 13.3 special indices R1–R14 (R9 is index 8).
    pub cri_r: Option<[f64; 14]>,
    /// TM-30 fidelity index Rf.
    pub tm30_rf: Option<f64>,
    /// TM-30 gamut index Rg.
    pub tm30_rg: Option<f64>,
    /// TM-30 per-bin figures.
    pub tm30_bins: Option<Tm30Bins>,
    /// Spectral Similarity Index against the default reference.
    pub ssi: Option<i32>,
}

/// TM-30 hue-bin figures and colour-vector data.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct Tm30Bins {
    /// Local fidelity Rf,hj.
    pub rf_hj: [f64; TM30_BINS],
    /// Local chroma shift Rcs,hj (fraction, +0.1 = 10 % more saturated).
    pub rcs_hj: [f64; TM30_BINS],
    /// Local hue shift Rhs,hj (radians).
    pub rhs_hj: [f64; TM30_BINS],
    /// Reference average a′b′ per bin.
    pub reference_ab: [[f64; 2]; TM30_BINS],
    /// Test average a′b′ per bin.
    pub test_ab: [[f64; 2]; TM30_BINS],
}

/// One source's share of a mix.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct SourceFigures {
    /// The source's id in the plan.
    pub source_id: u32,
    /// Its name.
    pub name: String,
    /// Whether it lights the scene (on, and soloed when any is soloed).
    pub lit: bool,
    /// Its illuminance at the subject after gels and dimmer, lux.
    pub illuminance_lux: f64,
    /// Its level relative to the key, stops (None for the key itself or when dark).
    pub stops_from_key: Option<f64>,
    /// Light lost to its gels, stops.
    pub gel_loss_stops: f64,
    /// Its CCT after gels and dimmer, K.
    pub cct_k: Option<f64>,
    /// Its Duv after gels and dimmer.
    pub duv: Option<f64>,
    /// Its spectral irradiance contribution, W·m⁻²·nm⁻¹, 360–830 nm at 1 nm.
    pub spectrum: Arc<[f64]>,
}

/// The evaluation of one zone.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct ZoneEvaluation {
    /// The zone's id (0 for the implicit single zone).
    pub zone_id: u32,
    /// Its name.
    pub name: String,
    /// Its mix.
    pub light: LightFigures,
    /// Level relative to the main zone, stops.
    pub stops_from_main: Option<f64>,
    /// Mired shift of this zone's white from the camera's white balance
    /// (positive = warmer than the white balance).
    pub mired_from_white_balance: Option<f64>,
    /// Subjects in this zone.
    pub subjects: Vec<SubjectResult>,
}

/// One subject, eye versus camera.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct SubjectResult {
    /// Index in the plan's subject list.
    pub index: usize,
    /// Name.
    pub name: Arc<str>,
    /// Group (skin, food, fabric, foliage, neutrals, products, custom ...).
    pub group: Arc<str>,
    /// Counts for the summary and the advisor.
    pub included: bool,
    /// CIELAB (D65) of what the eye sees.
    pub eye_lab: [f64; 3],
    /// CIELAB (D65) of what the camera renders.
    pub camera_lab: [f64; 3],
    /// 8-bit display colour of the eye's view (clamped).
    pub eye_rgb8: [u8; 3],
    /// 8-bit display colour of the camera's rendering (clamped).
    pub camera_rgb8: [u8; 3],
    /// Eye colour lies inside the display gamut.
    pub eye_in_gamut: bool,
    /// Camera colour lies inside the display gamut.
    pub camera_in_gamut: bool,
    /// CIEDE2000 between eye and camera.
    pub de2000: f64,
}

/// Summary of eye-versus-camera differences.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct Summary {
    /// Mean CIEDE2000 over included subjects.
    pub mean_de2000: Option<f64>,
    /// 90th percentile.
    pub p90_de2000: Option<f64>,
    /// Largest.
    pub max_de2000: Option<f64>,
    /// Name of the subject with the largest difference.
    pub worst_subject: Option<Arc<str>>,
}

/// A pair of subjects that match to one observer but not the other.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MetamerPair {
    /// First subject's name.
    pub a: Arc<str>,
    /// Second subject's name.
    pub b: Arc<str>,
    /// ΔE00 between them to the eye.
    pub eye_de2000: f64,
    /// ΔE00 between them on the camera.
    pub camera_de2000: f64,
    /// True: the eye sees a match the camera breaks; false: the reverse.
    pub eye_matches: bool,
}

/// The camera's figures.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct CameraFigures {
    /// Camera name.
    pub name: String,
    /// Sensitivities r, g, b on the grid (peak-normalised), for plotting.
    pub sensitivities: Arc<[Vec<f64>; 3]>,
    /// Luther residual (0 = a linear mix of the CIE functions).
    pub luther_residual: f64,
    /// Vora–Trussell µ-factor (1 = colorimetric).
    pub mu_factor: f64,
    /// White-balance gains applied to raw r, g, b (g = 1).
    pub wb_gains: [f64; 3],
    /// CCT the white balance is set for, K (when it corresponds to one).
    pub wb_cct_k: Option<f64>,
    /// The 3×3 matrix applied (rows map white-balanced RGB to X, Y, Z).
    pub matrix: [[f64; 3]; 3],
}
