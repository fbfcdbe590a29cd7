//! The evaluation engine: a plan in, everything the crew needs to see out.
//!
//! `evaluate` is pure: the same plan always gives the same [`Evaluation`]. It
//! works in four steps:
//! 1. each source becomes an absolute spectral irradiance at the subject
//!    (lamp × dimmer × gels, scaled so that the unfiltered lamp gives the
//!    source's level in lux), with the weighted sums its light figures and
//!    the camera need (linear in the light, so taken once per source);
//! 2. each zone mixes the sources that reach it (one implicit zone when the
//!    plan has none), spectra and sums alike, and gets its light figures
//!    (lux, EV, CCT, Duv, CRI, TM-30, SSI) from the mixed sums;
//! 3. the camera gets one white balance and one matrix for the whole frame,
//!    as a real camera: the matrix from the main zone's light, automatic
//!    white balance metered over the subjects of every zone;
//! 4. every subject is rendered in every zone, eye versus camera.
//!
//! Nothing that leaves here is NaN: quantities that cannot be computed are
//! `None`, with a warning that says why.

use crate::error::{PlanError, Result};
use crate::evaluation::{
    Evaluation, LightFigures, SourceFigures, SubjectResult, Summary, Tm30Bins, ZoneEvaluation,
};
use crate::model::CameraRef;
use crate::model::{Plan, Source, SourceId, SourceRole, ZoneLevel};
use crate::render::{CameraStage, ZoneLight};
use crate::resolve;
use lampwright_camera::raw::SignalSums;
use lampwright_camera::{CameraSensitivities, SharedCamera, TrainingSet};
use lampwright_color::cct::{CctDuv, mired};
use lampwright_color::light_sums::LightSums;
use lampwright_color::observer::{Observer, v_lambda};
use lampwright_color::photometry::{ev100_from_illuminance_lux, illuminance_lux};
use lampwright_color::spaces::Uv1960;
use lampwright_color::spectrum::{Curve, GRID_LEN, SpectralIrradiance};
use lampwright_color::tristimulus::KM_LM_PER_W;
use std::collections::VecDeque;
use std::sync::Arc;

/// Below this illuminance a mix counts as dark: no colour figures.
pub const DARK_LUX: f64 = 1e-6;

/// Gel stacks losing more than this many stops get a warning.
pub const GEL_LOSS_WARNING_STOPS: f64 = 3.0;

/// Zones whose whites differ by more than this many mired get a warning.
pub const ZONE_MIRED_WARNING: f64 = 20.0;

/// Zones whose Duv differ by more than this get a warning.
pub const ZONE_DUV_WARNING: f64 = 0.006;

/// One source as light at the subject.
#[derive(Debug, Clone)]
pub struct SourceLight {
    /// The source's id.
    pub id: SourceId,
    /// Its name.
    pub name: String,
    /// Its role.
    pub role: SourceRole,
    /// Whether it lights the scene (on, and soloed when any is soloed).
    pub lit: bool,
    /// Spectral irradiance at the subject for 1 lux of the unfiltered lamp at
    /// full output, after the dimmer's colour shift and the gels (W·m⁻²·nm⁻¹ per lux;
    /// shared between evaluations that reuse the source).
    pub per_lux: Arc<SpectralIrradiance>,
    /// Level at full output before gels, lux.
    pub level_lux: f64,
    /// Light output factor of the dimmer (1 at full).
    pub dimmer_flux: f64,
    /// Fraction of illuminance the gels pass.
    pub gel_transmission: f64,
    /// Measured range of the lamp and gel data.
    pub coverage: lampwright_color::Coverage,
    /// The weighted sums of `per_lux` that the light figures need (mixed
    /// linearly per zone).
    pub sums: Arc<LightSums>,
    /// CCT and Duv of the source's own light (any level above zero).
    pub cct: Option<CctDuv>,
}

impl SourceLight {
    /// Illuminance after dimmer and gels at the source's own level, lux.
    #[must_use]
    pub fn illuminance_lux(&self) -> f64 {
        self.level_lux * self.dimmer_flux * self.gel_transmission
    }
}

/// Illuminance-equivalent of a curve's shape, `683 · Σ S(λ) V(λ) Δλ` (the core's
/// photometry on a relative spectrum, used to scale lamps to lux).
fn illuminance_of(curve: &Curve) -> f64 {
    KM_LM_PER_W * curve.dot(v_lambda())
}

/// Turn one source into light at the subject: lamp, dimmer, gels, and the
/// scale that makes the unfiltered lamp give the source's level in lux.
pub fn source_light(plan: &Plan, source: &Source) -> Result<SourceLight> {
    let context = resolve::source_context(source);
    if !source.level_lux.is_finite() || source.level_lux < 0.0 {
        return Err(PlanError::Invalid {
            field: format!("{context} level"),
            message: not_a_level(source.level_lux),
        });
    }
    let resolved = resolve::resolve_source(plan, source)?;
    resolved
        .lamp
        .spd
        .check_colorimetric(&context)
        .map_err(|e| PlanError::color_in(&context, e))?;
    let lamp_lux_per_unit = illuminance_of(&resolved.lamp.spd);
    if lamp_lux_per_unit <= 0.0 {
        return Err(PlanError::Invalid {
            field: context,
            message: "the lamp has no visible output".into(),
        });
    }
    let gel_transmission = illuminance_of(&resolved.filtered) / lamp_lux_per_unit;
    let per_lux = resolved.filtered.to_irradiance(1.0 / lamp_lux_per_unit);
    let sums =
        LightSums::of(&per_lux.to_relative()).map_err(|e| PlanError::color_in(&context, e))?;
    // As `cct_duv_of_spd` would: none for data that stop short of the visible range.
    let cct = per_lux
        .check_colorimetric(&context)
        .ok()
        .and_then(|()| sums.cct().ok());
    Ok(SourceLight {
        id: source.id,
        name: source.name.clone(),
        role: source.role,
        lit: plan.is_lit(source),
        per_lux: Arc::new(per_lux),
        level_lux: source.level_lux,
        dimmer_flux: resolved.lamp.flux_factor(),
        gel_transmission,
        coverage: resolved.filtered.coverage(),
        sums: Arc::new(sums),
        cct,
    })
}

/// A zone's mix: which sources at what pre-gel level.
#[derive(Debug, Clone)]
struct ZoneMix {
    id: u32,
    name: String,
    /// (index into resolved sources, level lux at full output before gels)
    parts: Vec<(usize, f64)>,
}

/// Why a level is refused, without quoting a non-finite number (the window
/// shows the message as it is).
fn not_a_level(lux: f64) -> String {
    if lux.is_nan() {
        "the level is not a number".into()
    } else if lux.is_infinite() {
        "the level is too large to compute (too many stops up, or too short a distance)".into()
    } else {
        format!("{lux} lux is not a level (use 0 or more)")
    }
}

fn zone_level_lux(source: &SourceLight, level: &ZoneLevel, zone: &str) -> Result<f64> {
    let lux = match level {
        ZoneLevel::AsSource => source.level_lux,
        ZoneLevel::Lux(l) => *l,
        ZoneLevel::Stops(s) => source.level_lux * s.exp2(),
        ZoneLevel::Distance {
            rated_lux_at_1m,
            distance_m,
        } => inverse_square_lux(*rated_lux_at_1m, *distance_m).ok_or_else(|| PlanError::Invalid {
            field: format!("zone '{zone}', source '{}'", source.name),
            message: format!(
                "rated {rated_lux_at_1m} lux at 1 m and distance {distance_m} m do not give a level (distance must be above 0)"
            ),
        })?,
    };
    if !lux.is_finite() || lux < 0.0 {
        return Err(PlanError::Invalid {
            field: format!("zone '{zone}', source '{}'", source.name),
            message: not_a_level(lux),
        });
    }
    Ok(lux)
}

/// Illuminance from a fixture's rated output at 1 m and its distance, by the
/// inverse-square law (common practice; holds when the distance is several
/// times the size of the source). `None` for a distance that is not positive.
#[must_use]
pub fn inverse_square_lux(rated_lux_at_1m: f64, distance_m: f64) -> Option<f64> {
    (distance_m > 0.0
        && distance_m.is_finite()
        && rated_lux_at_1m.is_finite()
        && rated_lux_at_1m >= 0.0)
        .then(|| rated_lux_at_1m / (distance_m * distance_m))
}

fn zone_mixes(plan: &Plan, sources: &[SourceLight]) -> Result<Vec<ZoneMix>> {
    if plan.zones.is_empty() {
        return Ok(vec![ZoneMix {
            id: 0,
            name: "Scene".into(),
            parts: sources
                .iter()
                .enumerate()
                .map(|(i, s)| (i, s.level_lux))
                .collect(),
        }]);
    }
    plan.zones
        .iter()
        .map(|zone| {
            let mut parts = Vec::new();
            for reach in &zone.reach {
                let Some(i) = sources.iter().position(|s| s.id == reach.source) else {
                    return Err(PlanError::Invalid {
                        field: format!("zone '{}'", zone.name),
                        message: format!(
                            "it refers to source #{} which is not in the plan",
                            reach.source
                        ),
                    });
                };
                parts.push((i, zone_level_lux(&sources[i], &reach.level, &zone.name)?));
            }
            Ok(ZoneMix {
                id: zone.id,
                name: zone.name.clone(),
                parts,
            })
        })
        .collect()
}

/// The lit parts of a zone's mix: (index into sources, weight on the
/// source's per-lux light).
fn lit_parts(sources: &[SourceLight], parts: &[(usize, f64)]) -> Vec<(usize, f64)> {
    parts
        .iter()
        .filter(|(i, _)| sources[*i].lit)
        .map(|(i, lux)| (*i, lux * sources[*i].dimmer_flux))
        .collect()
}

fn mix_spectrum(sources: &[SourceLight], lit: &[(usize, f64)]) -> SpectralIrradiance {
    SpectralIrradiance::weighted_sum(lit.iter().map(|(i, w)| (*w, &*sources[*i].per_lux)))
}

/// The light-figure sums of a zone's mix; `None` when nothing is lit.
fn mix_sums(sources: &[SourceLight], lit: &[(usize, f64)]) -> Option<LightSums> {
    let parts: Vec<(f64, &LightSums)> = lit.iter().map(|(i, w)| (*w, &*sources[*i].sums)).collect();
    LightSums::mix(&parts)
}

/// Light figures of a mix. Figures that cannot be computed are `None` and a
/// warning names the zone and the reason.
fn light_figures(
    mix: &SpectralIrradiance,
    sums: Option<&LightSums>,
    zone: &str,
    warnings: &mut Vec<String>,
) -> LightFigures {
    let lux = illuminance_lux(mix);
    let mut fig = LightFigures {
        spectrum: Arc::from(&mix.values()[..]),
        illuminance_lux: lux,
        ..LightFigures::default()
    };
    let Some(sums) = sums.filter(|_| lux > DARK_LUX) else {
        warnings.push(format!(
            "{zone}: no light reaches it (all sources off or at zero)"
        ));
        return fig;
    };
    fig.ev100 = ev100_from_illuminance_lux(lux).ok();
    if let Some((x, y)) = sums.xyz().chromaticity() {
        fig.xy = Some([x, y]);
        let uv = Uv1960::from_xy(x, y);
        fig.uv = Some([uv.u, uv.v]);
    }
    if let Err(e) = mix.check_colorimetric(zone) {
        warnings.push(e.to_string());
        return fig;
    }
    // One CCT serves CRI, TM-30 and SSI (each takes its reference at it).
    let cct = match sums.cct() {
        Ok(c) => {
            fig.cct_k = Some(c.cct_k);
            fig.duv = Some(c.duv);
            fig.mired = mired(c.cct_k).ok();
            c
        }
        Err(e) => {
            warnings.push(format!("{zone}: no CCT: {e}"));
            for what in ["CRI", "TM-30 figures", "SSI"] {
                warnings.push(format!("{zone}: no {what}: {e}"));
            }
            return fig;
        }
    };
    let quality = sums.quality(cct);
    match quality.cri {
        Ok(c) => {
            if !c.meaningful {
                warnings.push(format!(
                    "{zone}: the light is too far from the blackbody line for CRI to mean much (CIE 13.3)"
                ));
            }
            fig.cri_ra = Some(c.ra);
            fig.cri_r = Some(c.r);
        }
        Err(e) => warnings.push(format!("{zone}: no CRI: {e}")),
    }
    match quality.tm30 {
        Ok(t) => {
            fig.tm30_rf = Some(t.rf);
            fig.tm30_rg = Some(t.rg);
            fig.tm30_bins = Some(Tm30Bins {
                rf_hj: t.rf_hj,
                rcs_hj: t.rcs_hj,
                rhs_hj: t.rhs_hj,
                reference_ab: t.bin_reference_ab,
                test_ab: t.bin_test_ab,
            });
        }
        Err(e) => warnings.push(format!("{zone}: no TM-30 figures: {e}")),
    }
    match quality.ssi {
        Ok(s) => fig.ssi = Some(s.value),
        Err(e) => warnings.push(format!("{zone}: no SSI: {e}")),
    }
    fig
}

/// Summary statistics over the included subjects.
fn summarise(subjects: &[SubjectResult]) -> Summary {
    let mut included: Vec<&SubjectResult> = subjects.iter().filter(|s| s.included).collect();
    if included.is_empty() {
        return Summary::default();
    }
    included.sort_by(|a, b| a.de2000.total_cmp(&b.de2000));
    let n = included.len();
    let mean = included.iter().map(|s| s.de2000).sum::<f64>() / n as f64;
    // Nearest-rank 90th percentile.
    let rank = ((0.9 * n as f64).ceil() as usize).clamp(1, n);
    let worst = included[n - 1];
    Summary {
        mean_de2000: Some(mean),
        p90_de2000: Some(included[rank - 1].de2000),
        max_de2000: Some(worst.de2000),
        worst_subject: Some(worst.name.clone()),
    }
}

/// Evaluate a plan. Pure: the same plan gives the same evaluation.
pub fn evaluate(plan: &Plan) -> Result<Evaluation> {
    Evaluator::default().evaluate(plan)
}

/// Cached entries of each kind an [`Evaluator`] keeps (the oldest goes first).
const CACHE_ENTRIES: usize = 32;

/// What fixes a source's light apart from its level: lamp, dimmer and gels.
#[derive(Debug, Clone, PartialEq)]
struct SourceKey {
    lamp: crate::model::LampRef,
    dimmer_bits: u64,
    gels: Vec<crate::model::GelLayer>,
}

impl SourceKey {
    fn of(source: &Source) -> SourceKey {
        SourceKey {
            lamp: source.lamp.clone(),
            dimmer_bits: source.dimmer.to_bits(),
            gels: source.gels.clone(),
        }
    }
}

/// A zone's light figures and the warnings they raised, for one exact mix
/// (the figures hold the mixed spectrum, the key).
#[derive(Debug, Clone)]
struct ZoneEntry {
    name: String,
    figures: LightFigures,
    warnings: Vec<String>,
}

/// Keep at most [`CACHE_ENTRIES`], dropping the oldest.
fn remember<T>(cache: &mut VecDeque<T>, entry: T) {
    if cache.len() >= CACHE_ENTRIES {
        cache.pop_front();
    }
    cache.push_back(entry);
}

/// Evaluates a plan that is being edited, reusing the work an edit did not
/// touch: each source's filtered light and its sums for the light figures
/// (keyed by lamp, dimmer and gels), each source's subject and training
/// sums for the camera (keyed also by camera and subjects), each zone's
/// light figures (keyed by its exact mixed spectrum), the resolved subjects
/// and camera, the camera's quality figures and its set-up under an
/// unchanged main light. A level change therefore redoes only the
/// non-linear steps of the zones it touches and the camera. Every
/// result equals [`evaluate`]'s bit for bit: a cache only ever returns what
/// the same computation gave before, and the plan's embedded library is part
/// of every key (a change to it clears the caches).
#[derive(Default)]
pub struct Evaluator {
    custom: Option<crate::model::CustomLibrary>,
    sources: VecDeque<(SourceKey, SourceLight)>,
    zones: VecDeque<ZoneEntry>,
    cameras: VecDeque<(crate::model::CameraRef, crate::render::CameraQuality)>,
    camera_cache: crate::render::CameraCache,
    subject_sums: VecDeque<SubjectSumsEntry>,
    resolved_subjects: Vec<(crate::model::SubjectRef, Arc<resolve::ResolvedSubject>)>,
    resolved_camera: Option<(CameraRef, SharedCamera)>,
    training_sums: VecDeque<(SourceKey, CameraRef, Arc<SignalSums>)>,
    hits: u64,
    misses: u64,
}

/// One source's subject sums for one camera and list of subjects.
struct SubjectSumsEntry {
    source: SourceKey,
    camera: CameraRef,
    subjects: Vec<crate::model::SubjectRef>,
    sums: Arc<SignalSums>,
}

impl std::fmt::Debug for Evaluator {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("Evaluator")
            .field("sources", &self.sources.len())
            .field("zones", &self.zones.len())
            .field("hits", &self.hits)
            .field("misses", &self.misses)
            .finish_non_exhaustive()
    }
}

impl Evaluator {
    /// A new evaluator with empty caches.
    #[must_use]
    pub fn new() -> Evaluator {
        Evaluator::default()
    }

    /// Cache hits and misses so far (all kinds together).
    #[must_use]
    pub fn hits_and_misses(&self) -> (u64, u64) {
        (self.hits, self.misses)
    }

    fn sync_library(&mut self, plan: &Plan) {
        if self.custom.as_ref() != Some(&plan.custom) {
            *self = Evaluator {
                custom: Some(plan.custom.clone()),
                hits: self.hits,
                misses: self.misses,
                ..Evaluator::default()
            };
        }
    }

    fn source_light(&mut self, plan: &Plan, source: &Source) -> Result<SourceLight> {
        let key = SourceKey::of(source);
        let Some((_, cached)) = self.sources.iter().find(|(k, _)| *k == key) else {
            self.misses += 1;
            let light = source_light(plan, source)?;
            remember(&mut self.sources, (key, light.clone()));
            return Ok(light);
        };
        self.hits += 1;
        if !source.level_lux.is_finite() || source.level_lux < 0.0 {
            // The same refusal as a fresh computation.
            return source_light(plan, source);
        }
        Ok(SourceLight {
            id: source.id,
            name: source.name.clone(),
            role: source.role,
            lit: plan.is_lit(source),
            level_lux: source.level_lux,
            ..cached.clone()
        })
    }

    fn zone_figures(
        &mut self,
        mix: &SpectralIrradiance,
        sums: impl FnOnce() -> Option<LightSums>,
        zone: &str,
        warnings: &mut Vec<String>,
    ) -> LightFigures {
        let values = mix.values();
        if let Some(e) = self
            .zones
            .iter()
            .find(|e| e.name == zone && *e.figures.spectrum == values[..])
        {
            self.hits += 1;
            warnings.extend(e.warnings.iter().cloned());
            return e.figures.clone();
        }
        self.misses += 1;
        let mut own = Vec::new();
        // The sums are mixed only when the figures are not cached.
        let figures = light_figures(mix, sums().as_ref(), zone, &mut own);
        warnings.extend(own.iter().cloned());
        remember(
            &mut self.zones,
            ZoneEntry {
                name: zone.to_owned(),
                figures: figures.clone(),
                warnings: own,
            },
        );
        figures
    }

    fn camera_quality(
        &mut self,
        plan: &Plan,
        camera: &lampwright_camera::CameraSensitivities,
    ) -> Result<crate::render::CameraQuality> {
        if let Some((_, q)) = self.cameras.iter().find(|(r, _)| *r == plan.camera.camera) {
            self.hits += 1;
            return Ok(*q);
        }
        self.misses += 1;
        let q = crate::render::CameraQuality::of(camera)?;
        remember(&mut self.cameras, (plan.camera.camera.clone(), q));
        Ok(q)
    }

    /// A subject resolved (library entry or embedded data on the grid).
    fn subject(
        &mut self,
        plan: &Plan,
        subject: &crate::model::SubjectRef,
    ) -> Result<Arc<resolve::ResolvedSubject>> {
        if let Some((_, r)) = self.resolved_subjects.iter().find(|(k, _)| k == subject) {
            self.hits += 1;
            return Ok(Arc::clone(r));
        }
        self.misses += 1;
        let resolved = Arc::new(resolve::subject_reflectance(plan, subject)?);
        if self.resolved_subjects.len() >= crate::limits::MAX_SUBJECTS {
            self.resolved_subjects.clear();
        }
        self.resolved_subjects
            .push((subject.clone(), Arc::clone(&resolved)));
        Ok(resolved)
    }

    /// The plan's camera resolved.
    fn camera(&mut self, plan: &Plan) -> Result<SharedCamera> {
        if let Some((r, c)) = &self.resolved_camera
            && *r == plan.camera.camera
        {
            self.hits += 1;
            return Ok(c.clone());
        }
        self.misses += 1;
        let camera = SharedCamera::from(resolve::camera_sensitivities(plan, &plan.camera.camera)?);
        self.resolved_camera = Some((plan.camera.camera.clone(), camera.clone()));
        Ok(camera)
    }

    /// The subjects' camera and eye sums under one source's per-lux light.
    fn subject_sums(
        &mut self,
        plan: &Plan,
        source: &Source,
        light: &SourceLight,
        camera: &CameraSensitivities,
        subjects: &[Arc<resolve::ResolvedSubject>],
    ) -> Arc<SignalSums> {
        let key = SourceKey::of(source);
        let refs = || plan.subjects.iter().map(|e| &e.subject);
        if let Some(e) = self.subject_sums.iter().find(|e| {
            e.source == key
                && e.camera == plan.camera.camera
                && e.subjects.len() == plan.subjects.len()
                && e.subjects.iter().eq(refs())
        }) {
            self.hits += 1;
            return Arc::clone(&e.sums);
        }
        self.misses += 1;
        let sums = Arc::new(SignalSums::of(
            camera,
            light.per_lux.values(),
            Observer::cie1931_2deg(),
            subjects.iter().map(|s| &s.reflectance),
        ));
        remember(
            &mut self.subject_sums,
            SubjectSumsEntry {
                source: key,
                camera: plan.camera.camera.clone(),
                subjects: refs().cloned().collect(),
                sums: Arc::clone(&sums),
            },
        );
        sums
    }

    /// The training samples' camera and eye sums under one source's per-lux light.
    fn training_sums(
        &mut self,
        plan: &Plan,
        source: &Source,
        light: &SourceLight,
        camera: &CameraSensitivities,
    ) -> Result<Arc<SignalSums>> {
        let key = SourceKey::of(source);
        if let Some((_, _, sums)) = self
            .training_sums
            .iter()
            .find(|(k, c, _)| *k == key && *c == plan.camera.camera)
        {
            self.hits += 1;
            return Ok(Arc::clone(sums));
        }
        self.misses += 1;
        let sums = Arc::new(SignalSums::of(
            camera,
            light.per_lux.values(),
            Observer::cie1931_2deg(),
            TrainingSet::standard()?.reflectances(),
        ));
        remember(
            &mut self.training_sums,
            (key, plan.camera.camera.clone(), Arc::clone(&sums)),
        );
        Ok(sums)
    }

    /// The camera set up for the frame from each lit source's subject sums
    /// (and training sums for a scene profile), mixed per zone.
    fn camera_stage(
        &mut self,
        plan: &Plan,
        sources: &[SourceLight],
        lit: &[Vec<(usize, f64)>],
        zone_spectra: &[SpectralIrradiance],
        subjects: &[Arc<resolve::ResolvedSubject>],
    ) -> Result<CameraStage> {
        let camera_sens = self.camera(plan)?;
        let quality = self.camera_quality(plan, camera_sens.curves())?;
        // Each lit source's subject sums (and training sums for a scene
        // profile in the main zone), mixed per zone.
        let mut per_source: Vec<Option<Arc<SignalSums>>> = vec![None; sources.len()];
        for l in lit {
            for (i, _) in l {
                if per_source[*i].is_none() {
                    per_source[*i] = Some(self.subject_sums(
                        plan,
                        &plan.sources[*i],
                        &sources[*i],
                        camera_sens.curves(),
                        subjects,
                    ));
                }
            }
        }
        let zone_sums: Vec<Option<SignalSums>> = lit
            .iter()
            .map(|l| {
                let parts: Vec<(f64, &SignalSums)> = l
                    .iter()
                    .filter_map(|(i, w)| per_source[*i].as_deref().map(|s| (*w, s)))
                    .collect();
                SignalSums::mix(&parts)
            })
            .collect();
        let main_training = if plan.camera.matrix == crate::model::MatrixMode::SceneProfile {
            let mut parts = Vec::new();
            for (i, w) in lit.first().map_or(&[][..], Vec::as_slice) {
                parts.push((
                    *w,
                    self.training_sums(
                        plan,
                        &plan.sources[*i],
                        &sources[*i],
                        camera_sens.curves(),
                    )?,
                ));
            }
            let refs: Vec<(f64, &SignalSums)> = parts.iter().map(|(w, s)| (*w, &**s)).collect();
            SignalSums::mix(&refs)
        } else {
            None
        };
        let zone_inputs: Vec<ZoneLight<'_>> = zone_spectra
            .iter()
            .zip(&zone_sums)
            .map(|(spectrum, sums)| ZoneLight {
                spectrum,
                subjects: sums.as_ref(),
            })
            .collect();
        CameraStage::new(
            plan,
            &camera_sens,
            quality,
            &zone_inputs,
            main_training.as_ref(),
            &mut self.camera_cache,
        )
    }

    /// Evaluate `plan`, reusing cached work; the result equals [`evaluate`]'s.
    pub fn evaluate(&mut self, plan: &Plan) -> Result<Evaluation> {
        self.sync_library(plan);
        let mut warnings = Vec::new();
        let sources: Vec<SourceLight> = plan
            .sources
            .iter()
            .map(|s| self.source_light(plan, s))
            .collect::<Result<_>>()?;
        for (s, r) in plan.sources.iter().zip(&sources) {
            let loss = -r.gel_transmission.max(f64::MIN_POSITIVE).log2();
            if loss > GEL_LOSS_WARNING_STOPS {
                warnings.push(format!(
                    "source '{}': its gels cost {loss:.1} stops of light",
                    s.name
                ));
            }
            if r.coverage.start_nm > 380.0 || r.coverage.end_nm < 780.0 {
                warnings.push(format!(
                    "source '{}': its lamp and gel data cover only {:.0}–{:.0} nm; ends are extended",
                    s.name, r.coverage.start_nm, r.coverage.end_nm
                ));
            }
        }
        let mixes = zone_mixes(plan, &sources)?;
        let lit: Vec<Vec<(usize, f64)>> = mixes
            .iter()
            .map(|m| lit_parts(&sources, &m.parts))
            .collect();
        let zone_spectra: Vec<SpectralIrradiance> =
            lit.iter().map(|l| mix_spectrum(&sources, l)).collect();
        let zone_lights: Vec<LightFigures> = mixes
            .iter()
            .zip(&lit)
            .zip(&zone_spectra)
            .map(|((m, l), spd)| {
                self.zone_figures(spd, || mix_sums(&sources, l), &m.name, &mut warnings)
            })
            .collect();

        let subjects = plan
            .subjects
            .iter()
            .map(|s| self.subject(plan, &s.subject))
            .collect::<Result<Vec<_>>>()?;
        let camera = self.camera_stage(plan, &sources, &lit, &zone_spectra, &subjects)?;
        let mut zones = Vec::with_capacity(mixes.len());
        let mut metamers = Vec::new();
        let main_lux = zone_lights[0].illuminance_lux;
        for (z, (m, light)) in mixes.iter().zip(zone_lights).enumerate() {
            let rendered = camera.render(plan, z, &subjects, z == 0, &mut warnings);
            if zones.is_empty() {
                metamers = rendered.metamers;
            }
            let stops_from_main = (main_lux > DARK_LUX && light.illuminance_lux > DARK_LUX)
                .then(|| light.illuminance_lux.log2() - main_lux.log2());
            let mired_from_white_balance = match (light.mired, camera.figures().wb_cct_k) {
                (Some(zm), Some(wb)) => mired(wb).ok().map(|wm| zm - wm),
                _ => None,
            };
            zones.push(ZoneEvaluation {
                zone_id: m.id,
                name: m.name.clone(),
                light,
                stops_from_main,
                mired_from_white_balance,
                subjects: rendered.subjects,
            });
        }
        zone_warnings(&zones, &mut warnings);

        let main_parts = &mixes[0].parts;
        let source_figures = source_figures(&sources, main_parts);
        let main = &zones[0];
        let subjects_main = main.subjects.clone();
        let summary = summarise(&subjects_main);
        Ok(Evaluation {
            light: main.light.clone(),
            sources: source_figures,
            summary,
            metamers,
            camera: camera.figures().clone(),
            subjects: subjects_main,
            zones,
            // Warnings quote zone, source and subject names: one line each.
            warnings: warnings
                .iter()
                .map(|w| crate::error::one_line(w).into_owned())
                .collect(),
        })
    }
}

fn source_figures(sources: &[SourceLight], parts: &[(usize, f64)]) -> Vec<SourceFigures> {
    let level_in_main = |i: usize| parts.iter().find(|(k, _)| *k == i).map(|(_, l)| *l);
    let lux_of = |i: usize| {
        let s = &sources[i];
        level_in_main(i).map_or(0.0, |l| {
            if s.lit {
                l * s.dimmer_flux * s.gel_transmission
            } else {
                0.0
            }
        })
    };
    let key_lux = sources
        .iter()
        .enumerate()
        .filter(|(_, s)| s.role == SourceRole::Key && s.lit)
        .map(|(i, _)| lux_of(i))
        .fold(0.0, f64::max);
    sources
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let lux = lux_of(i);
            // The CCT of the source's own light, whatever its level above zero.
            let cct = s.cct.filter(|_| s.level_lux * s.dimmer_flux > 0.0);
            SourceFigures {
                source_id: s.id,
                name: s.name.clone(),
                lit: s.lit,
                illuminance_lux: lux,
                stops_from_key: (key_lux > DARK_LUX && lux > DARK_LUX && s.role != SourceRole::Key)
                    // A difference of logs: the ratio of two finite levels can overflow.
                    .then(|| lux.log2() - key_lux.log2()),
                gel_loss_stops: -s.gel_transmission.max(f64::MIN_POSITIVE).log2(),
                cct_k: cct.map(|c| c.cct_k),
                duv: cct.map(|c| c.duv),
                spectrum: if s.lit {
                    let w = level_in_main(i).unwrap_or(0.0) * s.dimmer_flux;
                    s.per_lux.values().iter().map(|v| v * w).collect()
                } else {
                    Arc::from([0.0; GRID_LEN])
                },
            }
        })
        .collect()
}

/// Warnings in the trade's words when zones' whites differ.
fn zone_warnings(zones: &[ZoneEvaluation], warnings: &mut Vec<String>) {
    let Some(main) = zones.first() else { return };
    for z in zones.iter().skip(1) {
        if let (Some(zm), Some(mm)) = (z.light.mired, main.light.mired) {
            let d = zm - mm;
            if d.abs() > ZONE_MIRED_WARNING {
                let (dir, look) = if d > 0.0 {
                    ("warmer", "orange")
                } else {
                    ("cooler", "blue")
                };
                warnings.push(format!(
                    "{} is {:.0} mired {dir} than the {}: it will read {look}",
                    z.name,
                    d.abs(),
                    main.name.to_lowercase()
                ));
            }
        }
        if let (Some(zd), Some(md)) = (z.light.duv, main.light.duv) {
            let d = zd - md;
            if d.abs() > ZONE_DUV_WARNING {
                let look = if d > 0.0 { "green" } else { "magenta" };
                warnings.push(format!(
                    "{} sits {:.3} Duv more {look} than the {}: it will read {look}",
                    z.name,
                    d.abs(),
                    main.name.to_lowercase()
                ));
            }
        }
    }
}
