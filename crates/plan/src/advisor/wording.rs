//! Moves written as a crew says them on set: "add 1/4 minus green to Key",
//! "drop Fill 2/3 stop", "white balance 3900 K".
//!
//! Gel strengths are named in eighths ("1/8", "1/4", "3/8", "1/2", "5/8",
//! "3/4", "7/8", "full"); levels in thirds of a stop ("1/3 stop",
//! "1 2/3 stops"), the steps crews work in (common practice).

use super::moves::Move;
use crate::library;
use crate::model::{GelRef, MatrixMode, Plan, SourceId, WbPreset, WhiteBalanceSetting};

/// A gel strength in the trade's fractions: "1/8", "1/4", …, "full"; other
/// values as a decimal ("0.3").
#[must_use]
pub fn strength_words(strength: f64) -> String {
    let eighths = strength * 8.0;
    let k = eighths.round();
    if (eighths - k).abs() > 1e-6 || !(1.0..=8.0).contains(&k) {
        return format!("{strength:.2}")
            .trim_end_matches('0')
            .trim_end_matches('.')
            .to_string();
    }
    match k as u8 {
        8 => "full".into(),
        4 => "1/2".into(),
        2 => "1/4".into(),
        6 => "3/4".into(),
        n => format!("{n}/8"),
    }
}

/// A level change in thirds of a stop: "1/3 stop", "2/3 stop", "1 stop",
/// "1 1/3 stops", "2 stops". The sign is left to the verb.
#[must_use]
pub fn stops_words(stops: f64) -> String {
    let thirds = (stops.abs() * 3.0).round() as u32;
    let (whole, rest) = (thirds / 3, thirds % 3);
    match (whole, rest) {
        (0, r) => format!("{r}/3 stop"),
        (1, 0) => "1 stop".into(),
        (w, 0) => format!("{w} stops"),
        (w, r) => format!("{w} {r}/3 stops"),
    }
}

/// The short name a crew uses for a gel: "CTO", "minus green", "ND 0.3",
/// "amber"; embedded gels by their name.
#[must_use]
pub fn gel_words(plan: &Plan, gel: &GelRef) -> String {
    match gel {
        GelRef::Library(id) => library::gel(id).map_or_else(|| id.clone(), |g| short_name(g.name)),
        GelRef::Custom(id) => plan.custom.gels.iter().find(|g| &g.id == id).map_or_else(
            || id.clone(),
            |g| {
                if g.name.is_empty() {
                    id.clone()
                } else {
                    g.name.clone()
                }
            },
        ),
    }
}

/// "CTO full (daylight to tungsten)" → "CTO"; "Minus green full (magenta)" →
/// "minus green"; "Amber (effect)" → "amber"; "ND 0.3 (one stop)" → "ND 0.3".
fn short_name(name: &str) -> String {
    let base = name.split(" (").next().unwrap_or(name).trim();
    let base = base.strip_suffix(" full").unwrap_or(base);
    let mut chars = base.chars();
    match (chars.next(), chars.next()) {
        // Lower-case a capitalised word ("Minus"), keep acronyms ("CTO", "ND").
        (Some(first), Some(second)) if first.is_uppercase() && second.is_lowercase() => {
            first.to_lowercase().chain(base.chars().skip(1)).collect()
        }
        _ => base.to_string(),
    }
}

fn source_words(plan: &Plan, id: SourceId) -> String {
    plan.source(id)
        .map_or_else(|| format!("source #{id}"), |s| s.name.clone())
}

/// The white-balance setting as a crew says it: "3900 K", "grey card",
/// "tungsten preset", "auto (grey world)".
#[must_use]
pub fn white_balance_words(wb: &WhiteBalanceSetting) -> String {
    match wb {
        WhiteBalanceSetting::Kelvin(k) => format!("{:.0} K", (k / 10.0).round() * 10.0),
        WhiteBalanceSetting::Preset(p) => format!(
            "{} preset",
            match p {
                WbPreset::Daylight => "daylight",
                WbPreset::Cloudy => "cloudy",
                WbPreset::Shade => "shade",
                WbPreset::Tungsten => "tungsten",
                WbPreset::Fluorescent => "fluorescent",
            }
        ),
        WhiteBalanceSetting::GreyCard => "custom from a grey card".into(),
        WhiteBalanceSetting::AutoGreyWorld => "auto (grey world)".into(),
        WhiteBalanceSetting::AutoBrightestNeutral => "auto (brightest neutral)".into(),
    }
}

/// One move in the crew's words.
#[must_use]
pub fn move_words(plan: &Plan, m: &Move) -> String {
    match m {
        Move::AddGel {
            source,
            gel,
            strength,
        } => format!(
            "add {} {} to {}",
            strength_words(*strength),
            gel_words(plan, gel),
            source_words(plan, *source)
        ),
        Move::RemoveGel {
            source,
            gel,
            strength,
        } => format!(
            "take the {} {} off {}",
            strength_words(*strength),
            gel_words(plan, gel),
            source_words(plan, *source)
        ),
        Move::ChangeGel {
            source,
            gel,
            from,
            to,
        } => format!(
            "change {}'s {} {} to {} {}",
            source_words(plan, *source),
            strength_words(*from),
            gel_words(plan, gel),
            strength_words(*to),
            gel_words(plan, gel)
        ),
        Move::Level { source, stops } => {
            let verb = if *stops < 0.0 { "drop" } else { "bring up" };
            format!(
                "{verb} {} {}",
                source_words(plan, *source),
                stops_words(*stops)
            )
        }
        Move::SwitchOff { source } => format!("switch {} off", source_words(plan, *source)),
        Move::WhiteBalance { to } => format!("white balance {}", white_balance_words(to)),
        Move::Matrix { to } => match to {
            MatrixMode::SceneProfile => {
                "profile the camera under this light (shoot a chart, scene matrix)".into()
            }
            MatrixMode::Factory => "use the camera's factory matrix".into(),
            MatrixMode::DualIlluminant => "use the camera's dual-illuminant matrix".into(),
        },
    }
}

/// All moves joined the way a crew reads them out: "add 1/4 minus green to
/// Key; drop Fill 2/3 stop; white balance 3900 K".
#[must_use]
pub fn moves_sentence(plan: &Plan, moves: &[Move]) -> String {
    moves
        .iter()
        .map(|m| move_words(plan, m))
        .collect::<Vec<_>>()
        .join("; ")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Source;

    #[test]
    fn strengths_in_eighths() {
        let words: Vec<String> = (1..=8)
            .map(|k| strength_words(f64::from(k) / 8.0))
            .collect();
        assert_eq!(
            words,
            ["1/8", "1/4", "3/8", "1/2", "5/8", "3/4", "7/8", "full"]
        );
        assert_eq!(strength_words(0.3), "0.3");
        assert_eq!(strength_words(1.5), "1.5");
    }

    #[test]
    fn stops_in_thirds() {
        assert_eq!(stops_words(-1.0 / 3.0), "1/3 stop");
        assert_eq!(stops_words(-2.0 / 3.0), "2/3 stop");
        assert_eq!(stops_words(1.0), "1 stop");
        assert_eq!(stops_words(-4.0 / 3.0), "1 1/3 stops");
        assert_eq!(stops_words(2.0), "2 stops");
    }

    #[test]
    fn short_gel_names() {
        assert_eq!(short_name("CTO full (daylight to tungsten)"), "CTO");
        assert_eq!(short_name("Minus green full (magenta)"), "minus green");
        assert_eq!(short_name("ND 0.3 (one stop)"), "ND 0.3");
        assert_eq!(short_name("Amber (effect)"), "amber");
    }

    #[test]
    fn a_crew_sentence() {
        let plan = Plan {
            sources: vec![
                Source {
                    id: 1,
                    name: "Key".into(),
                    ..Source::default()
                },
                Source {
                    id: 2,
                    name: "Fill".into(),
                    ..Source::default()
                },
            ],
            ..Plan::default()
        };
        let moves = [
            Move::AddGel {
                source: 1,
                gel: GelRef::Library("minus-green-full".into()),
                strength: 0.25,
            },
            Move::Level {
                source: 2,
                stops: -2.0 / 3.0,
            },
            Move::WhiteBalance {
                to: WhiteBalanceSetting::Kelvin(3900.0),
            },
        ];
        assert_eq!(
            moves_sentence(&plan, &moves),
            "add 1/4 minus green to Key; drop Fill 2/3 stop; white balance 3900 K"
        );
    }
}
