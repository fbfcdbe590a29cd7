//! Every change the window makes to a plan, as data.
//!
//! Widgets never edit the [`Plan`] directly: they emit a [`Command`], and
//! [`apply`] is the one place where a plan changes. That keeps undo exact
//! (the history stores whole plans taken just before each command) and lets
//! slider drags merge into one undo step (see [`Command::coalesce_key`]).

use lampwright_plan::{
    Adaptation, CameraRef, Display, FitMethod, GelLayer, GelRef, Kit, LampRef, MatrixMode, Plan,
    Source, SourceId, SourceRole, SubjectEntry, SubjectRef, WhiteBalanceSetting, Zone, ZoneId,
    ZoneLevel, ZoneReach,
};

/// Most sources a plan edited in the window may hold: the plan file's own
/// limit, so whatever opens can be edited and saved, and the window refuses
/// no more than a file would.
pub const MAX_SOURCES: usize = lampwright_plan::limits::MAX_SOURCES;
/// Most gels stacked on one source.
pub const MAX_GELS: usize = lampwright_plan::limits::MAX_GEL_STACK;
/// Most subjects in one plan.
pub const MAX_SUBJECTS: usize = lampwright_plan::limits::MAX_SUBJECTS;
/// Most zones.
pub const MAX_ZONES: usize = lampwright_plan::limits::MAX_ZONES;

/// An edit of one source.
#[derive(Debug, Clone, PartialEq)]
pub enum SourceEdit {
    /// Rename.
    Name(String),
    /// Change the role.
    Role(SourceRole),
    /// Choose another lamp.
    Lamp(LampRef),
    /// Set the level at the subject, lux (full output, no gels).
    LevelLux(f64),
    /// Switch on or off.
    Enabled(bool),
    /// Solo on or off.
    Solo(bool),
    /// Dimmer as a fraction of full voltage (filament lamps).
    Dimmer(f64),
    /// Lock against the advisor.
    Locked(bool),
    /// Add a gel at the end of the stack (furthest from the lamp).
    AddGel(GelLayer),
    /// Swap the gel at a position for another.
    SetGel(usize, GelRef),
    /// Set a gel's strength (fraction of the full gel).
    GelStrength(usize, f64),
    /// Move a gel one place towards the lamp (`true`) or away from it.
    MoveGel(usize, bool),
    /// Take a gel off.
    RemoveGel(usize),
}

/// One user action on the plan.
#[derive(Debug, Clone, PartialEq)]
pub enum Command {
    /// Rename the plan.
    PlanName(String),
    /// Replace the plan's notes.
    PlanNotes(String),
    /// Add a source (its id is assigned on apply).
    AddSource(Box<Source>),
    /// Add a copy of a source right after it.
    DuplicateSource(SourceId),
    /// Remove a source and its zone reaches.
    RemoveSource(SourceId),
    /// Edit one source.
    Source(SourceId, SourceEdit),
    /// Add a subject.
    AddSubject(SubjectRef),
    /// Remove the subject at an index.
    RemoveSubject(usize),
    /// Include or exclude a subject from the summary and the advisor.
    SubjectIncluded(usize, bool),
    /// Set a subject's weight for the advisor.
    SubjectWeight(usize, f64),
    /// Choose the camera.
    Camera(CameraRef),
    /// Set the white balance.
    WhiteBalance(WhiteBalanceSetting),
    /// Choose the matrix mode.
    Matrix(MatrixMode),
    /// Choose the matrix fit.
    Fit(FitMethod),
    /// Adapted or as lit.
    Adaptation(Adaptation),
    /// Display colour space.
    Display(Display),
    /// Add a zone with a name (id assigned on apply); every lit source reaches it at its own level.
    AddZone(String),
    /// Rename a zone.
    RenameZone(ZoneId, String),
    /// Remove a zone.
    RemoveZone(ZoneId),
    /// Set how much a zone counts in the advisor's camera-fidelity goal.
    ZoneWeight(ZoneId, f64),
    /// Set (Some) or remove (None) a source's reach into a zone.
    Reach {
        /// Zone.
        zone: ZoneId,
        /// Source.
        source: SourceId,
        /// Level, or `None` when the source does not reach the zone.
        level: Option<ZoneLevel>,
    },
    /// Set what the advisor may use.
    Kit(Kit),
    /// Replace the whole plan by an edited copy (imports go through the plan
    /// crate's own functions on a copy, then land here so undo covers them).
    ReplacePlan(Box<Plan>),
}

/// Identifies edits that merge into one undo step while a drag or a typing
/// burst goes on (same control, same target).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CoalesceKey {
    /// Plan name.
    PlanName,
    /// Plan notes.
    PlanNotes,
    /// A source's name.
    SourceName(SourceId),
    /// A source's level.
    SourceLevel(SourceId),
    /// A source's dimmer.
    SourceDimmer(SourceId),
    /// A gel's strength.
    GelStrength(SourceId, usize),
    /// A subject's weight.
    SubjectWeight(usize),
    /// The white-balance Kelvin slider.
    WhiteBalance,
    /// A zone's name.
    ZoneName(ZoneId),
    /// A zone's fidelity weight.
    ZoneWeight(ZoneId),
    /// A source's level in a zone.
    Reach(ZoneId, SourceId),
}

impl Command {
    /// The key under which repeated edits merge into one undo step, if any.
    #[must_use]
    pub fn coalesce_key(&self) -> Option<CoalesceKey> {
        match self {
            Command::PlanName(_) => Some(CoalesceKey::PlanName),
            Command::PlanNotes(_) => Some(CoalesceKey::PlanNotes),
            Command::Source(id, edit) => match edit {
                SourceEdit::Name(_) => Some(CoalesceKey::SourceName(*id)),
                SourceEdit::LevelLux(_) => Some(CoalesceKey::SourceLevel(*id)),
                SourceEdit::Dimmer(_) => Some(CoalesceKey::SourceDimmer(*id)),
                SourceEdit::GelStrength(i, _) => Some(CoalesceKey::GelStrength(*id, *i)),
                _ => None,
            },
            Command::SubjectWeight(i, _) => Some(CoalesceKey::SubjectWeight(*i)),
            Command::WhiteBalance(WhiteBalanceSetting::Kelvin(_)) => {
                Some(CoalesceKey::WhiteBalance)
            }
            Command::RenameZone(id, _) => Some(CoalesceKey::ZoneName(*id)),
            Command::ZoneWeight(id, _) => Some(CoalesceKey::ZoneWeight(*id)),
            Command::Reach {
                zone,
                source,
                level: Some(ZoneLevel::Lux(_) | ZoneLevel::Stops(_) | ZoneLevel::Distance { .. }),
            } => Some(CoalesceKey::Reach(*zone, *source)),
            _ => None,
        }
    }
}

/// Why a command could not be applied. The plan is left unchanged.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CommandError(pub String);

impl std::fmt::Display for CommandError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.0)
    }
}

fn finite_non_negative(value: f64, what: &str) -> Result<f64, CommandError> {
    if value.is_finite() && value >= 0.0 {
        Ok(value)
    } else {
        Err(CommandError(format!(
            "{what} must be a number of zero or more"
        )))
    }
}

/// Most lux a level may be set to in the window: ten thousand times full
/// sunlight. Far beyond it the engine's sums overflow to infinity.
pub const MAX_LEVEL_LUX: f64 = 1e9;
/// Most stops a zone may be set above or below a source.
pub const MAX_ZONE_STOPS: f64 = 60.0;
/// Shortest distance a zone may be from a source, m.
pub const MIN_DISTANCE_M: f64 = 1e-3;

fn level_lux(value: f64, what: &str) -> Result<f64, CommandError> {
    let value = finite_non_negative(value, what)?;
    if value <= MAX_LEVEL_LUX {
        Ok(value)
    } else {
        Err(CommandError(format!("{what} must be at most 1e9 lx")))
    }
}

fn check_level(level: &ZoneLevel) -> Result<(), CommandError> {
    match level {
        ZoneLevel::AsSource => Ok(()),
        ZoneLevel::Lux(lux) => level_lux(*lux, "zone illuminance").map(|_| ()),
        ZoneLevel::Stops(stops) => {
            if stops.is_finite() && stops.abs() <= MAX_ZONE_STOPS {
                Ok(())
            } else {
                Err(CommandError(
                    "zone level in stops must be −60 to +60".into(),
                ))
            }
        }
        ZoneLevel::Distance {
            rated_lux_at_1m,
            distance_m,
        } => {
            level_lux(*rated_lux_at_1m, "rated illuminance at 1 m")?;
            if distance_m.is_finite() && *distance_m >= MIN_DISTANCE_M {
                Ok(())
            } else {
                Err(CommandError("distance must be at least 1 mm".into()))
            }
        }
    }
}

/// Colour temperatures the generic lamps take in the window (the pickers'
/// ranges; CIE daylight is defined from 4000 K to 25 000 K).
const BLACKBODY_RANGE_K: std::ops::RangeInclusive<f64> = 1000.0..=20_000.0;
const DAYLIGHT_RANGE_K: std::ops::RangeInclusive<f64> = 4000.0..=25_000.0;

fn check_lamp(lamp: LampRef) -> Result<LampRef, CommandError> {
    let (cct_k, range, what) = match &lamp {
        LampRef::Blackbody { cct_k } => (*cct_k, BLACKBODY_RANGE_K, "black-body"),
        LampRef::Daylight { cct_k } => (*cct_k, DAYLIGHT_RANGE_K, "CIE daylight"),
        LampRef::Library(_) | LampRef::Custom(_) => return Ok(lamp),
    };
    if range.contains(&cct_k) {
        Ok(lamp)
    } else {
        Err(CommandError(format!(
            "a {what} lamp takes {:.0} K to {:.0} K",
            range.start(),
            range.end()
        )))
    }
}

fn source_mut(plan: &mut Plan, id: SourceId) -> Result<&mut Source, CommandError> {
    plan.source_mut(id)
        .ok_or_else(|| CommandError(format!("no source with id {id} in the plan")))
}

fn subject_mut(plan: &mut Plan, index: usize) -> Result<&mut SubjectEntry, CommandError> {
    plan.subjects
        .get_mut(index)
        .ok_or_else(|| CommandError(format!("no subject number {}", index + 1)))
}

fn zone_mut(plan: &mut Plan, id: ZoneId) -> Result<&mut Zone, CommandError> {
    plan.zones
        .iter_mut()
        .find(|z| z.id == id)
        .ok_or_else(|| CommandError(format!("no zone with id {id} in the plan")))
}

fn apply_source_edit(source: &mut Source, edit: SourceEdit) -> Result<(), CommandError> {
    match edit {
        SourceEdit::Name(name) => source.name = name,
        SourceEdit::Role(role) => source.role = role,
        SourceEdit::Lamp(lamp) => source.lamp = check_lamp(lamp)?,
        SourceEdit::LevelLux(lux) => source.level_lux = level_lux(lux, "level")?,
        SourceEdit::Enabled(on) => source.enabled = on,
        SourceEdit::Solo(on) => source.solo = on,
        SourceEdit::Dimmer(fraction) => {
            let fraction = finite_non_negative(fraction, "dimmer")?;
            source.dimmer = fraction.min(1.0);
        }
        SourceEdit::Locked(on) => source.locked = on,
        SourceEdit::AddGel(layer) => {
            if source.gels.len() >= MAX_GELS {
                return Err(CommandError(format!(
                    "a source takes at most {MAX_GELS} gels in this window"
                )));
            }
            finite_non_negative(layer.strength, "gel strength")?;
            source.gels.push(layer);
        }
        SourceEdit::SetGel(index, gel) => gel_mut(source, index)?.gel = gel,
        SourceEdit::GelStrength(index, strength) => {
            let strength = finite_non_negative(strength, "gel strength")?;
            gel_mut(source, index)?.strength = strength;
        }
        SourceEdit::MoveGel(index, towards_lamp) => {
            gel_mut(source, index)?;
            let other = if towards_lamp {
                index.checked_sub(1)
            } else {
                Some(index + 1).filter(|&i| i < source.gels.len())
            };
            if let Some(other) = other {
                source.gels.swap(index, other);
            }
        }
        SourceEdit::RemoveGel(index) => {
            gel_mut(source, index)?;
            source.gels.remove(index);
        }
    }
    Ok(())
}

fn gel_mut(source: &mut Source, index: usize) -> Result<&mut GelLayer, CommandError> {
    let name = source.name.clone();
    source
        .gels
        .get_mut(index)
        .ok_or_else(|| CommandError(format!("source '{name}' has no gel number {}", index + 1)))
}

/// Apply one command to a plan. On error the plan is unchanged.
pub fn apply(plan: &mut Plan, command: Command) -> Result<(), CommandError> {
    match command {
        Command::PlanName(name) => plan.name = name,
        Command::PlanNotes(notes) => plan.notes = notes,
        Command::AddSource(source) => add_source(plan, *source)?,
        Command::DuplicateSource(id) => duplicate_source(plan, id)?,
        Command::RemoveSource(id) => {
            let before = plan.sources.len();
            plan.sources.retain(|s| s.id != id);
            if plan.sources.len() == before {
                return Err(CommandError(format!("no source with id {id} in the plan")));
            }
            for zone in &mut plan.zones {
                zone.reach.retain(|r| r.source != id);
            }
        }
        Command::Source(id, edit) => {
            // Edit a copy so a failing edit leaves the plan untouched.
            let mut edited = source_mut(plan, id)?.clone();
            apply_source_edit(&mut edited, edit)?;
            *source_mut(plan, id)? = edited;
        }
        Command::AddSubject(subject) => {
            if plan.subjects.len() >= MAX_SUBJECTS {
                return Err(CommandError(format!(
                    "a plan holds at most {MAX_SUBJECTS} subjects"
                )));
            }
            plan.subjects.push(SubjectEntry {
                subject,
                ..SubjectEntry::default()
            });
        }
        Command::RemoveSubject(index) => {
            subject_mut(plan, index)?;
            plan.subjects.remove(index);
        }
        Command::SubjectIncluded(index, on) => subject_mut(plan, index)?.included = on,
        Command::SubjectWeight(index, weight) => {
            let weight = finite_non_negative(weight, "weight")?;
            subject_mut(plan, index)?.weight = weight;
        }
        Command::Camera(camera) => plan.camera.camera = camera,
        Command::WhiteBalance(wb) => {
            if let WhiteBalanceSetting::Kelvin(k) = wb
                && !(k.is_finite() && (1000.0..=25_000.0).contains(&k))
            {
                return Err(CommandError(
                    "white balance must be 1000 K to 25 000 K".into(),
                ));
            }
            plan.camera.white_balance = wb;
        }
        Command::Matrix(mode) => plan.camera.matrix = mode,
        Command::Fit(fit) => plan.camera.fit = fit,
        Command::Adaptation(a) => plan.viewing.adaptation = a,
        Command::Display(d) => plan.viewing.display = d,
        Command::AddZone(name) => add_zone(plan, name)?,
        Command::RenameZone(id, name) => zone_mut(plan, id)?.name = name,
        Command::ZoneWeight(id, weight) => {
            let weight = finite_non_negative(weight, "zone weight")?;
            zone_mut(plan, id)?.weight = weight;
        }
        Command::RemoveZone(id) => {
            zone_mut(plan, id)?;
            plan.zones.retain(|z| z.id != id);
        }
        Command::Reach {
            zone,
            source,
            level,
        } => set_reach(plan, zone, source, level)?,
        Command::Kit(kit) => {
            finite_non_negative(kit.max_stops_lost, "light lost")?;
            if kit.max_stack == 0 || usize::from(kit.max_stack) > MAX_GELS {
                return Err(CommandError(format!(
                    "gels per source must be 1 to {MAX_GELS}"
                )));
            }
            plan.kit = kit;
        }
        Command::ReplacePlan(new_plan) => *plan = *new_plan,
    }
    Ok(())
}

fn add_source(plan: &mut Plan, mut source: Source) -> Result<(), CommandError> {
    if plan.sources.len() >= MAX_SOURCES {
        return Err(CommandError(format!(
            "a plan holds at most {MAX_SOURCES} sources"
        )));
    }
    level_lux(source.level_lux, "level")?;
    source.id = plan.next_source_id();
    // A new light reaches the main zone (the first), where the summary is
    // read; the other zones are the user's call.
    if let Some(main) = plan.zones.first_mut() {
        main.reach.push(ZoneReach {
            source: source.id,
            level: ZoneLevel::AsSource,
        });
    }
    plan.sources.push(source);
    Ok(())
}

fn duplicate_source(plan: &mut Plan, id: SourceId) -> Result<(), CommandError> {
    if plan.sources.len() >= MAX_SOURCES {
        return Err(CommandError(format!(
            "a plan holds at most {MAX_SOURCES} sources"
        )));
    }
    let position = plan
        .sources
        .iter()
        .position(|s| s.id == id)
        .ok_or_else(|| CommandError(format!("no source with id {id} in the plan")))?;
    let mut copy = plan.sources[position].clone();
    copy.id = plan.next_source_id();
    copy.name = format!("{} copy", copy.name);
    copy.solo = false;
    // The copy reaches the same zones at the same levels.
    for zone in &mut plan.zones {
        let reach: Vec<ZoneReach> = zone
            .reach
            .iter()
            .filter(|r| r.source == id)
            .map(|r| ZoneReach {
                source: copy.id,
                level: r.level.clone(),
            })
            .collect();
        zone.reach.extend(reach);
    }
    plan.sources.insert(position + 1, copy);
    Ok(())
}

fn add_zone(plan: &mut Plan, name: String) -> Result<(), CommandError> {
    if plan.zones.len() >= MAX_ZONES {
        return Err(CommandError(format!(
            "a plan holds at most {MAX_ZONES} zones"
        )));
    }
    let id = plan.next_zone_id();
    let reach = plan
        .sources
        .iter()
        .map(|s| ZoneReach {
            source: s.id,
            level: ZoneLevel::AsSource,
        })
        .collect();
    plan.zones.push(Zone {
        id,
        name,
        reach,
        ..Zone::default()
    });
    Ok(())
}

fn set_reach(
    plan: &mut Plan,
    zone: ZoneId,
    source: SourceId,
    level: Option<ZoneLevel>,
) -> Result<(), CommandError> {
    if plan.source(source).is_none() {
        return Err(CommandError(format!(
            "no source with id {source} in the plan"
        )));
    }
    if let Some(level) = &level {
        check_level(level)?;
    }
    let zone = zone_mut(plan, zone)?;
    match level {
        None => zone.reach.retain(|r| r.source != source),
        Some(level) => {
            if let Some(r) = zone.reach.iter_mut().find(|r| r.source == source) {
                r.level = level;
            } else {
                zone.reach.push(ZoneReach { source, level });
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_window_adds_sources_up_to_the_file_limit_and_the_plan_still_validates() {
        let mut plan = Plan::default();
        for _ in 0..MAX_SOURCES {
            apply(&mut plan, Command::AddSource(Box::default())).unwrap();
        }
        let refused = apply(&mut plan, Command::AddSource(Box::default())).unwrap_err();
        assert!(
            refused.0.contains(&MAX_SOURCES.to_string()),
            "{}",
            refused.0
        );
        assert_eq!(plan.sources.len(), lampwright_plan::limits::MAX_SOURCES);
        // What the window can build, a plan file holds.
        assert!(lampwright_plan::limits::check_limits(&plan).is_ok());
    }

    fn two_sources() -> Plan {
        let mut plan = Plan::default();
        apply(&mut plan, Command::AddSource(Box::default())).unwrap();
        apply(
            &mut plan,
            Command::AddSource(Box::new(Source {
                name: "Fill".into(),
                role: SourceRole::Fill,
                ..Source::default()
            })),
        )
        .unwrap();
        plan
    }

    #[test]
    fn added_sources_get_fresh_ids() {
        let plan = two_sources();
        assert_eq!(
            plan.sources.iter().map(|s| s.id).collect::<Vec<_>>(),
            vec![1, 2]
        );
    }

    #[test]
    fn bad_numbers_are_refused_and_change_nothing() {
        let mut plan = two_sources();
        let before = plan.clone();
        for lux in [f64::NAN, f64::INFINITY, -1.0, 1.1e9, 1e300] {
            assert!(apply(&mut plan, Command::Source(1, SourceEdit::LevelLux(lux))).is_err());
        }
        assert!(apply(&mut plan, Command::Source(99, SourceEdit::Enabled(false))).is_err());
        assert!(apply(&mut plan, Command::Source(1, SourceEdit::RemoveGel(0))).is_err());
        for lamp in [
            LampRef::Daylight { cct_k: 1e300 },
            LampRef::Daylight { cct_k: 3000.0 },
            LampRef::Blackbody { cct_k: f64::NAN },
            LampRef::Blackbody { cct_k: 0.0 },
        ] {
            assert!(apply(&mut plan, Command::Source(1, SourceEdit::Lamp(lamp))).is_err());
        }
        assert!(
            apply(
                &mut plan,
                Command::WhiteBalance(WhiteBalanceSetting::Kelvin(f64::NAN))
            )
            .is_err()
        );
        assert_eq!(plan, before);
    }

    #[test]
    fn gels_reorder_and_remove() {
        let mut plan = two_sources();
        for id in ["a", "b", "c"] {
            let layer = GelLayer {
                gel: GelRef::Library(id.into()),
                strength: 1.0,
            };
            apply(&mut plan, Command::Source(1, SourceEdit::AddGel(layer))).unwrap();
        }
        apply(&mut plan, Command::Source(1, SourceEdit::MoveGel(2, true))).unwrap();
        apply(&mut plan, Command::Source(1, SourceEdit::MoveGel(0, true))).unwrap(); // already first: no-op
        apply(&mut plan, Command::Source(1, SourceEdit::RemoveGel(0))).unwrap();
        let ids: Vec<_> = plan.sources[0]
            .gels
            .iter()
            .map(|g| match &g.gel {
                GelRef::Library(id) | GelRef::Custom(id) => id.clone(),
            })
            .collect();
        assert_eq!(ids, vec!["c", "b"]);
    }

    #[test]
    fn removing_a_source_removes_its_reach() {
        let mut plan = two_sources();
        apply(&mut plan, Command::AddZone("Shadow".into())).unwrap();
        assert_eq!(plan.zones[0].reach.len(), 2);
        apply(&mut plan, Command::RemoveSource(2)).unwrap();
        assert_eq!(plan.zones[0].reach.len(), 1);
        assert_eq!(plan.zones[0].reach[0].source, 1);
    }

    #[test]
    fn a_new_source_reaches_the_main_zone_only() {
        let mut plan = two_sources();
        apply(&mut plan, Command::AddZone("Key side".into())).unwrap();
        apply(&mut plan, Command::AddZone("Background".into())).unwrap();
        apply(&mut plan, Command::AddSource(Box::default())).unwrap();
        assert!(plan.zones[0].reach.iter().any(|r| r.source == 3));
        assert!(!plan.zones[1].reach.iter().any(|r| r.source == 3));
    }

    #[test]
    fn duplicate_copies_reach_and_clears_solo() {
        let mut plan = two_sources();
        apply(&mut plan, Command::AddZone("Key side".into())).unwrap();
        apply(&mut plan, Command::Source(2, SourceEdit::Solo(true))).unwrap();
        apply(&mut plan, Command::DuplicateSource(2)).unwrap();
        assert_eq!(plan.sources.len(), 3);
        assert_eq!(plan.sources[2].name, "Fill copy");
        assert!(!plan.sources[2].solo);
        assert!(plan.zones[0].reach.iter().any(|r| r.source == 3));
    }

    #[test]
    fn slider_edits_share_a_key_but_toggles_do_not() {
        let a = Command::Source(1, SourceEdit::LevelLux(10.0));
        let b = Command::Source(1, SourceEdit::LevelLux(20.0));
        assert_eq!(a.coalesce_key(), b.coalesce_key());
        assert!(a.coalesce_key().is_some());
        assert_ne!(
            a.coalesce_key(),
            Command::Source(2, SourceEdit::LevelLux(1.0)).coalesce_key()
        );
        assert!(
            Command::Source(1, SourceEdit::Enabled(true))
                .coalesce_key()
                .is_none()
        );
    }
}
