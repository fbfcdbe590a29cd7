//! How numbers are shown: one precision per quantity, units always.
//!
//! CCT to 10 K, Duv to 0.001, Ra/R9/Rf/Rg to integers, ΔE to 0.1, lux to three
//! significant figures, stops to 0.1.

use egui::Color32;

/// A missing figure.
pub const DASH: &str = "—";

/// CCT rounded to 10 K, e.g. "3210 K".
#[must_use]
pub fn cct(cct_k: Option<f64>) -> String {
    match cct_k.filter(|k| k.is_finite()) {
        Some(k) => format!("{:.0} K", (k / 10.0).round() * 10.0),
        None => DASH.into(),
    }
}

/// Duv to 0.001 with its sign, e.g. "+0.004".
#[must_use]
pub fn duv(duv: Option<f64>) -> String {
    match duv.filter(|d| d.is_finite()) {
        Some(d) => {
            let rounded = (d * 1000.0).round() / 1000.0;
            if rounded == 0.0 {
                "0.000".into()
            } else {
                signed(rounded, 3)
            }
        }
        None => DASH.into(),
    }
}

/// What a Duv means to the eye. Within ±0.002 of the locus a tint is hard to
/// see (common practice; ANSI C78.377 tolerances are wider).
#[must_use]
pub fn duv_meaning(duv: Option<f64>) -> &'static str {
    match duv.filter(|d| d.is_finite()) {
        Some(d) if d > 0.002 => "green tint",
        Some(d) if d < -0.002 => "magenta tint",
        Some(_) => "on the blackbody line",
        None => "",
    }
}

/// An illuminance with sensible precision, e.g. "1200 lx", "45.2 lx".
#[must_use]
pub fn lux(lux: f64) -> String {
    if !lux.is_finite() {
        return DASH.into();
    }
    format!("{} lx", significant(lux, 3))
}

/// Outside 1e-4 to 1e7 numbers are shown with a power of ten: written out,
/// a level of 10³⁰⁰ lx would be a line of 300 digits.
const PLAIN_MAGNITUDES: std::ops::RangeInclusive<i32> = -4..=6;

/// A value to `digits` significant figures, for readouts: plain between
/// 1e-4 and 1e7, else with a power of ten, as "1.98e12".
#[must_use]
pub fn significant(value: f64, digits: i32) -> String {
    if value == 0.0 || !value.is_finite() {
        return "0".into();
    }
    let magnitude = value.abs().log10().floor() as i32;
    if !PLAIN_MAGNITUDES.contains(&magnitude) {
        return times_ten_to(value, digits);
    }
    let decimals = (digits - 1 - magnitude).max(0) as usize;
    let factor = 10f64.powi(magnitude - digits + 1);
    let rounded = if magnitude >= digits - 1 {
        (value / factor).round() * factor
    } else {
        value
    };
    format!("{rounded:.decimals$}")
}

/// "1.98e12", "2.50e−9": `digits` significant figures and a power of ten
/// (true minus signs; the window's font has no superscript minus).
fn times_ten_to(value: f64, digits: i32) -> String {
    let decimals = (digits - 1).max(0) as usize;
    format!("{value:.decimals$e}").replace('-', "−")
}

/// How number fields (drag values) show their number: as egui does, but with
/// an exponent ("1.980e15") beyond what reads at a glance, which the field's
/// parser reads back.
#[must_use]
pub fn field_number(value: f64, decimals: std::ops::RangeInclusive<usize>) -> String {
    let magnitude = value.abs();
    if value != 0.0 && value.is_finite() && !(1e-6..1e9).contains(&magnitude) {
        format!("{value:.3e}")
    } else {
        egui::emath::format_with_decimals_in_range(value, decimals)
    }
}

/// Stops to 0.1 with sign, e.g. "−1.5 stops".
#[must_use]
pub fn stops(stops: Option<f64>) -> String {
    match stops.filter(|s| s.is_finite()) {
        Some(s) => {
            let rounded = (s * 10.0).round() / 10.0;
            let unit = if (rounded.abs() - 1.0).abs() < 1e-9 {
                "stop"
            } else {
                "stops"
            };
            if rounded == 0.0 {
                format!("0.0 {unit}")
            } else {
                format!("{} {unit}", signed(rounded, 1))
            }
        }
        None => DASH.into(),
    }
}

/// A number with an explicit sign and a true minus sign.
#[must_use]
pub fn signed(value: f64, decimals: usize) -> String {
    let text = format!("{:.decimals$}", value.abs());
    if value < 0.0 {
        format!("−{text}")
    } else {
        format!("+{text}")
    }
}

/// An integer figure (CRI, TM-30), or a dash.
#[must_use]
pub fn integer(value: Option<f64>) -> String {
    match value.filter(|v| v.is_finite()) {
        Some(v) => {
            let rounded = v.round();
            if rounded < 0.0 {
                format!("−{:.0}", -rounded)
            } else {
                format!("{:.0}", rounded.abs())
            }
        }
        None => DASH.into(),
    }
}

/// ΔE to 0.1.
#[must_use]
pub fn delta_e(value: f64) -> String {
    if value.is_finite() {
        format!("{value:.1}")
    } else {
        DASH.into()
    }
}

/// Bands of eye-versus-camera difference used for the badges. Lampwright's
/// own scheme: the edges follow the usual reading of CIEDE2000 (about 1 is a
/// just-noticeable difference side by side; common practice).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DeltaEBand {
    /// Below 1: side by side, most people see no difference.
    Match,
    /// 1 to 2: seen side by side by a trained eye.
    Slight,
    /// 2 to 3.5: seen side by side by most people.
    Visible,
    /// 3.5 to 6: seen without a side-by-side.
    Clear,
    /// 6 and above: a different colour.
    Strong,
}

impl DeltaEBand {
    /// The band a CIEDE2000 value falls in.
    #[must_use]
    pub fn of(de2000: f64) -> DeltaEBand {
        match de2000 {
            d if d < 1.0 => DeltaEBand::Match,
            d if d < 2.0 => DeltaEBand::Slight,
            d if d < 3.5 => DeltaEBand::Visible,
            d if d < 6.0 => DeltaEBand::Clear,
            _ => DeltaEBand::Strong,
        }
    }

    /// Short word on the badge.
    #[must_use]
    pub fn word(self) -> &'static str {
        match self {
            DeltaEBand::Match => "match",
            DeltaEBand::Slight => "slight",
            DeltaEBand::Visible => "visible",
            DeltaEBand::Clear => "clear",
            DeltaEBand::Strong => "strong",
        }
    }

    /// Badge colour (our own palette, muted so it does not compete with the swatches).
    #[must_use]
    pub fn color(self) -> Color32 {
        match self {
            DeltaEBand::Match => Color32::from_rgb(0x3f, 0x7f, 0x86),
            DeltaEBand::Slight => Color32::from_rgb(0x6a, 0x86, 0x3e),
            DeltaEBand::Visible => Color32::from_rgb(0xa8, 0x8a, 0x2a),
            DeltaEBand::Clear => Color32::from_rgb(0xb8, 0x63, 0x2c),
            DeltaEBand::Strong => Color32::from_rgb(0xa3, 0x3d, 0x62),
        }
    }

    /// What the band means, for tooltips and the legend.
    #[must_use]
    pub fn meaning(self) -> &'static str {
        match self {
            DeltaEBand::Match => "below 1: side by side, hardly anyone sees it",
            DeltaEBand::Slight => "1–2: a trained eye sees it side by side",
            DeltaEBand::Visible => "2–3.5: most people see it side by side",
            DeltaEBand::Clear => "3.5–6: seen without a side-by-side",
            DeltaEBand::Strong => "6 and above: reads as a different colour",
        }
    }

    /// All bands, mildest first.
    pub const ALL: [DeltaEBand; 5] = [
        DeltaEBand::Match,
        DeltaEBand::Slight,
        DeltaEBand::Visible,
        DeltaEBand::Clear,
        DeltaEBand::Strong,
    ];
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn precisions_follow_the_house_rules() {
        assert_eq!(cct(Some(3214.9)), "3210 K");
        assert_eq!(cct(Some(3215.0)), "3220 K");
        assert_eq!(cct(None), "—");
        assert_eq!(duv(Some(0.00449)), "+0.004");
        assert_eq!(duv(Some(-0.0121)), "−0.012");
        assert_eq!(duv(Some(0.0004)), "0.000");
        assert_eq!(integer(Some(94.6)), "95");
        assert_eq!(integer(Some(-26.4)), "−26");
        assert_eq!(integer(Some(-0.4)), "0");
        assert_eq!(delta_e(3.449), "3.4");
        assert_eq!(lux(1234.0), "1230 lx");
        assert_eq!(lux(45.26), "45.3 lx");
        assert_eq!(lux(0.5), "0.500 lx");
        assert_eq!(lux(1.98e302), "1.98e302 lx");
        assert_eq!(lux(2.5e-9), "2.50e−9 lx");
        assert_eq!(lux(0.000_123_4), "0.000123 lx");
        assert_eq!(lux(9_876_543.0), "9880000 lx");
        assert_eq!(lux(12_345_678.0), "1.23e7 lx");
        assert_eq!(stops(Some(-1.54)), "−1.5 stops");
        assert_eq!(stops(Some(1.0)), "+1.0 stop");
    }

    #[test]
    fn field_numbers_read_back() {
        for value in [0.0, 1.5, 1000.0, 2.5e-9, 1e300, -4.0e12] {
            let text = field_number(value, 0..=3);
            assert!(text.len() < 16, "{text}");
            let back: f64 = text.parse().unwrap();
            assert!((back - value).abs() <= value.abs() * 1e-3, "{text}");
        }
        assert_eq!(field_number(1234.5, 0..=1), "1234.5");
    }

    #[test]
    fn duv_words() {
        assert_eq!(duv_meaning(Some(0.006)), "green tint");
        assert_eq!(duv_meaning(Some(-0.006)), "magenta tint");
        assert_eq!(duv_meaning(Some(0.001)), "on the blackbody line");
    }

    #[test]
    fn bands_cover_the_edges() {
        assert_eq!(DeltaEBand::of(0.99), DeltaEBand::Match);
        assert_eq!(DeltaEBand::of(1.0), DeltaEBand::Slight);
        assert_eq!(DeltaEBand::of(3.5), DeltaEBand::Clear);
        assert_eq!(DeltaEBand::of(40.0), DeltaEBand::Strong);
    }
}
