//! Inline SVG figures for the HTML report: the mixed spectrum, the eye-versus-
//! camera swatches and the chromaticity of the light beside the Planckian locus.
//!
//! Every text that comes from the plan passes through [`esc`].

use crate::evaluation::{Evaluation, SubjectResult};
use lampwright_color::cct::planckian_uv;
use lampwright_color::spectrum::grid_wavelength_nm;
use std::fmt::Write;

/// Escape text for HTML and SVG content and attribute values.
#[must_use]
pub fn esc(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c if c.is_control() && c != '\n' && c != '\t' => out.push(' '),
            c => out.push(c),
        }
    }
    out
}

/// Line colours for the sources (chosen to stay apart on a white page).
const PALETTE: [&str; 8] = [
    "#1f5fa8", "#c2571a", "#2e8b57", "#8a3ea8", "#b8860b", "#c0306a", "#4a7f8c", "#6b6b6b",
];

/// Marker colour of the mix in the chromaticity figure.
const MIX_COLOUR: &str = "#ffffff";

const PLOT_START_NM: f64 = 380.0;
const PLOT_END_NM: f64 = 780.0;

/// The mixed spectral irradiance of the main zone (filled) with each lit
/// source's share (lines), 380–780 nm, scaled to the mix's peak.
#[must_use]
pub fn spectrum_svg(eval: &Evaluation) -> String {
    let (w, h, left, bottom, top, right) = (640.0, 260.0, 48.0, 36.0, 14.0, 12.0);
    let plot_w = w - left - right;
    let plot_h = h - top - bottom;
    let mix = &eval.light.spectrum;
    let in_range = |i: usize| (PLOT_START_NM..=PLOT_END_NM).contains(&grid_wavelength_nm(i));
    let peak = mix
        .iter()
        .enumerate()
        .filter(|(i, _)| in_range(*i))
        .map(|(_, v)| *v)
        .fold(0.0_f64, f64::max);
    let x = |wl: f64| left + (wl - PLOT_START_NM) / (PLOT_END_NM - PLOT_START_NM) * plot_w;
    let y = |v: f64| {
        let f = if peak > 0.0 {
            (v / peak).clamp(0.0, 1.05)
        } else {
            0.0
        };
        top + plot_h * (1.0 - f / 1.05)
    };
    let path = |values: &[f64]| {
        let mut d = String::new();
        for (i, v) in values.iter().enumerate().filter(|(i, _)| in_range(*i)) {
            let cmd = if d.is_empty() { 'M' } else { 'L' };
            let _ = write!(d, "{cmd}{:.1},{:.1} ", x(grid_wavelength_nm(i)), y(*v));
        }
        d
    };
    let mut s = String::new();
    let _ = write!(
        s,
        r#"<svg class="figure" viewBox="0 0 {w} {h}" width="{w}" height="{h}" role="img" aria-label="Spectral irradiance of the mix at the subject">"#
    );
    // Axes and wavelength ticks.
    let _ = write!(
        s,
        r##"<rect x="{left}" y="{top}" width="{plot_w}" height="{plot_h}" fill="#fafafa" stroke="#999"/>"##
    );
    for wl in (400..=750).step_by(50) {
        let xx = x(f64::from(wl));
        let _ = write!(
            s,
            r##"<line x1="{xx:.1}" y1="{:.1}" x2="{xx:.1}" y2="{:.1}" stroke="#ddd"/><text x="{xx:.1}" y="{:.1}" text-anchor="middle" class="tick">{wl}</text>"##,
            top,
            top + plot_h,
            top + plot_h + 14.0
        );
    }
    let _ = write!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="middle" class="axis">Wavelength, nm</text>"#,
        left + plot_w / 2.0,
        h - 4.0
    );
    let _ = write!(
        s,
        r#"<text x="12" y="{:.1}" transform="rotate(-90 12 {:.1})" text-anchor="middle" class="axis">Relative irradiance</text>"#,
        top + plot_h / 2.0,
        top + plot_h / 2.0
    );
    if peak > 0.0 && mix.len() == lampwright_color::GRID_LEN {
        let d = path(mix);
        let _ = write!(
            s,
            r##"<path d="{d}L{:.1},{:.1} L{:.1},{:.1} Z" fill="#e8dcc0" stroke="#333" stroke-width="1.5"/>"##,
            x(PLOT_END_NM),
            top + plot_h,
            x(PLOT_START_NM),
            top + plot_h
        );
        for (k, src) in eval
            .sources
            .iter()
            .filter(|src| src.lit && src.spectrum.len() == lampwright_color::GRID_LEN)
            .enumerate()
        {
            let colour = PALETTE[k % PALETTE.len()];
            let _ = write!(
                s,
                r#"<g><title>{}</title><path d="{}" fill="none" stroke="{colour}" stroke-width="1.2"/></g>"#,
                esc(&src.name),
                path(&src.spectrum)
            );
        }
    } else {
        let _ = write!(
            s,
            r#"<text x="{:.1}" y="{:.1}" text-anchor="middle">No light reaches the subject</text>"#,
            left + plot_w / 2.0,
            top + plot_h / 2.0
        );
    }
    s.push_str("</svg>");
    s
}

/// Legend entries matching [`spectrum_svg`]'s source colours: (colour, name).
#[must_use]
pub fn spectrum_legend(eval: &Evaluation) -> Vec<(&'static str, String)> {
    eval.sources
        .iter()
        .filter(|src| src.lit && src.spectrum.len() == lampwright_color::GRID_LEN)
        .enumerate()
        .map(|(k, src)| (PALETTE[k % PALETTE.len()], src.name.clone()))
        .collect()
}

fn rgb(c: [u8; 3]) -> String {
    format!("rgb({},{},{})", c[0], c[1], c[2])
}

/// Eye (left) and camera (right) swatch of each subject, with its ΔE00.
#[must_use]
pub fn swatches_svg(subjects: &[SubjectResult]) -> String {
    let (cell_w, cell_h, cols) = (160.0, 104.0, 4usize);
    let rows = subjects.len().div_ceil(cols).max(1);
    let w = cell_w * cols as f64;
    let h = cell_h * rows as f64;
    let mut s = String::new();
    let _ = write!(
        s,
        r#"<svg class="figure" viewBox="0 0 {w} {h}" width="{w}" height="{h}" role="img" aria-label="Subjects as the eye sees them (left) and as the camera renders them (right)">"#
    );
    for (k, sub) in subjects.iter().enumerate() {
        let x0 = (k % cols) as f64 * cell_w + 4.0;
        let y0 = (k / cols) as f64 * cell_h + 4.0;
        let sw = (cell_w - 12.0) / 2.0;
        let name: String = sub.name.chars().take(24).collect();
        let flag = if sub.eye_in_gamut && sub.camera_in_gamut {
            ""
        } else {
            " *"
        };
        let _ = write!(
            s,
            r#"<g><title>{title}</title><rect x="{x0:.1}" y="{y0:.1}" width="{sw:.1}" height="56" fill="{eye}"/><rect x="{x1:.1}" y="{y0:.1}" width="{sw:.1}" height="56" fill="{cam}"/><text x="{x0:.1}" y="{ty:.1}" class="name">{name}</text><text x="{x0:.1}" y="{ty2:.1}" class="de">ΔE00 {de:.1}{flag}</text></g>"#,
            title = esc(&format!(
                "{}: eye L*a*b* {:.1} {:.1} {:.1}, camera {:.1} {:.1} {:.1}",
                sub.name,
                sub.eye_lab[0],
                sub.eye_lab[1],
                sub.eye_lab[2],
                sub.camera_lab[0],
                sub.camera_lab[1],
                sub.camera_lab[2]
            )),
            eye = rgb(sub.eye_rgb8),
            cam = rgb(sub.camera_rgb8),
            x1 = x0 + sw + 2.0,
            ty = y0 + 72.0,
            ty2 = y0 + 88.0,
            name = esc(&name),
            de = sub.de2000,
        );
    }
    s.push_str("</svg>");
    s
}

/// Temperatures marked on the locus, K.
const LOCUS_TICKS_K: [f64; 8] = [
    2000.0, 2700.0, 3200.0, 4000.0, 5000.0, 5600.0, 6500.0, 10000.0,
];

/// The CIE 1960 uv chromaticity of the mix and of each zone beside the
/// Planckian locus (1500–20 000 K), with isotemperature ticks.
///
/// # References
/// - CIE 15:2018 §9.4 (CIE 1960 UCS) and §9.5 (Planckian locus, CCT).
#[must_use]
pub fn chromaticity_svg(eval: &Evaluation) -> String {
    let mut locus: Vec<(f64, f64)> = Vec::new();
    let mut t = 1500.0_f64;
    while t <= 20_000.0 {
        if let Ok(uv) = planckian_uv(t) {
            locus.push((uv.u, uv.v));
        }
        t *= 1.02;
    }
    // The mix (the main zone) and every other zone, each with its marker colour.
    let mut points: Vec<(String, &str, f64, f64)> = Vec::new();
    if let Some([u, v]) = eval.light.uv {
        points.push(("Mix at the subject".into(), MIX_COLOUR, u, v));
    }
    for (k, z) in eval.zones.iter().enumerate().skip(1) {
        if let Some([u, v]) = z.light.uv {
            points.push((z.name.clone(), PALETTE[(k - 1) % PALETTE.len()], u, v));
        }
    }
    let all = locus
        .iter()
        .copied()
        .chain(points.iter().map(|p| (p.2, p.3)));
    let (mut u0, mut u1, mut v0, mut v1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for (u, v) in all.filter(|(u, v)| u.is_finite() && v.is_finite()) {
        u0 = u0.min(u);
        u1 = u1.max(u);
        v0 = v0.min(v);
        v1 = v1.max(v);
    }
    if u0 > u1 {
        (u0, u1, v0, v1) = (0.15, 0.45, 0.25, 0.40);
    }
    let pad = 0.015;
    let (u0, u1, v0, v1) = (u0 - pad, u1 + pad, v0 - pad, v1 + pad);
    let (w, h) = (420.0, 300.0);
    let margin = 28.0;
    // One scale for both axes keeps distances (and so Duv) true to the eye.
    let scale = ((w - 2.0 * margin) / (u1 - u0)).min((h - 2.0 * margin) / (v1 - v0));
    let px = |u: f64| margin + (u - u0) * scale;
    let py = |v: f64| h - margin - (v - v0) * scale;
    let mut s = String::new();
    let _ = write!(
        s,
        r##"<svg class="figure" viewBox="0 0 {w} {h}" width="{w}" height="{h}" role="img" aria-label="Chromaticity of the light in CIE 1960 uv with the Planckian locus"><rect x="0" y="0" width="{w}" height="{h}" fill="#fafafa" stroke="#999"/>"##
    );
    let mut d = String::new();
    for (u, v) in &locus {
        let cmd = if d.is_empty() { 'M' } else { 'L' };
        let _ = write!(d, "{cmd}{:.1},{:.1} ", px(*u), py(*v));
    }
    let _ = write!(
        s,
        r##"<path d="{d}" fill="none" stroke="#555" stroke-width="1.5"/>"##
    );
    for t in LOCUS_TICKS_K {
        if let Ok(uv) = planckian_uv(t) {
            let _ = write!(
                s,
                r##"<circle cx="{:.1}" cy="{:.1}" r="2" fill="#555"/><text x="{:.1}" y="{:.1}" class="tick">{t:.0} K</text>"##,
                px(uv.u),
                py(uv.v),
                px(uv.u) + 3.0,
                py(uv.v) + 13.0
            );
        }
    }
    // Markers, then a legend in the top-left corner (labels beside the
    // markers would collide when zones have similar whites).
    for (name, colour, u, v) in &points {
        let _ = write!(
            s,
            r##"<g><title>{}: u {u:.4}, v {v:.4}</title><circle cx="{:.1}" cy="{:.1}" r="5" fill="{colour}" stroke="#222"/></g>"##,
            esc(name),
            px(*u),
            py(*v)
        );
    }
    for (k, (name, colour, _, _)) in points.iter().enumerate() {
        let y = 34.0 + 15.0 * k as f64;
        let label: String = name.chars().take(32).collect();
        let _ = write!(
            s,
            r##"<circle cx="30" cy="{:.1}" r="4" fill="{colour}" stroke="#222"/><text x="40" y="{y:.1}" class="name">{}</text>"##,
            y - 4.0,
            esc(&label)
        );
    }
    let _ = write!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="end" class="axis">u (CIE 1960)</text><text x="8" y="16" class="axis">v</text></svg>"#,
        w - 6.0,
        h - 8.0
    );
    s
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::sample;

    #[test]
    fn escapes_markup_and_controls() {
        assert_eq!(
            esc("<a href=\"x\">'&'</a>\u{7}"),
            "&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt; "
        );
    }

    #[test]
    fn figures_are_balanced_svg() {
        let eval = sample::evaluation();
        for svg in [
            spectrum_svg(&eval),
            swatches_svg(&eval.subjects),
            chromaticity_svg(&eval),
        ] {
            assert!(svg.starts_with("<svg"));
            assert!(svg.ends_with("</svg>"));
            assert_eq!(svg.matches("<svg").count(), 1);
            assert!(!svg.contains("NaN") && !svg.contains("inf"));
        }
        let swatches = swatches_svg(&eval.subjects);
        assert!(swatches.contains("fill=\"rgb(193,147,127)\""));
        assert!(swatches.contains("ΔE00 7.9 *"), "out-of-gamut flag");
        assert!(!swatches.contains("<i>"));
    }

    #[test]
    fn locus_points_sit_on_the_locus() {
        // The 4000 K tick must be drawn where the mix at 4000 K, Duv 0 would be.
        let mut eval = sample::evaluation();
        let uv = planckian_uv(4000.0).unwrap();
        eval.light.uv = Some([uv.u, uv.v]);
        eval.zones.truncate(1);
        let svg = chromaticity_svg(&eval);
        let tick = svg
            .split("<circle")
            .find(|c| c.contains("4000 K"))
            .unwrap()
            .to_string();
        // The marker follows its title.
        let after_title = &svg[svg.find("<title>Mix at the subject: u").unwrap()..];
        let mix = after_title.split("<circle").nth(1).unwrap().to_string();
        let centre = |c: &str| {
            let cx: f64 = c
                .split("cx=\"")
                .nth(1)
                .unwrap()
                .split('"')
                .next()
                .unwrap()
                .parse()
                .unwrap();
            let cy: f64 = c
                .split("cy=\"")
                .nth(1)
                .unwrap()
                .split('"')
                .next()
                .unwrap()
                .parse()
                .unwrap();
            (cx, cy)
        };
        let (a, b) = (centre(&tick), centre(&mix));
        assert!(
            (a.0 - b.0).abs() < 0.11 && (a.1 - b.1).abs() < 0.11,
            "{a:?} {b:?}"
        );
    }
}
