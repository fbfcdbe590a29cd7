//! Exports from the window: the swatch sheet as a PNG drawn from the
//! evaluation's 8-bit display colours (not a screenshot), and reports.

use super::format::{self, DeltaEBand};
use egui::epaint::text::{FontDefinitions, Fonts, TextOptions};
use egui::{Color32, FontId};
use image::{Rgba, RgbaImage};
use lampwright_plan::{Display, Evaluation, Plan};
use std::path::Path;

pub use lampwright_plan::report::ReportFormat;

/// Menu label of a report format.
#[must_use]
pub fn report_label(format: ReportFormat) -> &'static str {
    match format {
        ReportFormat::Text => "plain text",
        ReportFormat::Json => "JSON",
        ReportFormat::Csv => "CSV",
        ReportFormat::Html => "HTML",
    }
}

/// Write a report of the plan and its evaluation.
pub fn report(
    plan: &Plan,
    eval: Option<&Evaluation>,
    format: ReportFormat,
    path: &Path,
) -> Result<(), String> {
    let eval = eval.ok_or("the plan has not been evaluated")?;
    let text =
        lampwright_plan::report::render_report(plan, eval, format).map_err(|e| e.to_string())?;
    std::fs::write(path, text).map_err(|e| format!("{}: {e}", path.display()))
}

// Sheet geometry, pixels.
const COLUMNS: u32 = 4;
const CARD_W: u32 = 320;
const CARD_H: u32 = 190;
const SWATCH_W: u32 = 140;
const SWATCH_H: u32 = 110;
const MARGIN: u32 = 24;
const HEADER_H: u32 = 78;
const BACKGROUND: [u8; 3] = [40, 40, 40];
const SURROUND: [u8; 3] = [119, 119, 119];

/// Render the swatch sheet to an image.
#[must_use]
pub fn swatch_sheet(plan: &Plan, eval: &Evaluation) -> RgbaImage {
    let n = eval.subjects.len() as u32;
    let rows = n.div_ceil(COLUMNS).max(1);
    let width = MARGIN * 2 + COLUMNS * CARD_W;
    let height = HEADER_H + MARGIN + rows * CARD_H;
    let mut img = RgbaImage::from_pixel(width, height, rgba(BACKGROUND));
    let mut text = TextPainter::new();

    text.draw(
        &mut img,
        MARGIN as i32,
        14,
        &plan.name,
        22.0,
        [235, 235, 235],
    );
    let light = &eval.light;
    let display = match plan.viewing.display {
        Display::Srgb => "sRGB",
        Display::DisplayP3 => "Display P3 values (untagged PNG)",
    };
    let summary = format!(
        "Light: {} · Duv {} · {} · mean ΔE00 {} · worst {}    Left: eye   Right: camera   ({display})",
        format::cct(light.cct_k),
        format::duv(light.duv),
        format::lux(light.illuminance_lux),
        eval.summary
            .mean_de2000
            .map_or_else(|| format::DASH.to_owned(), format::delta_e),
        eval.summary
            .max_de2000
            .map_or_else(|| format::DASH.to_owned(), format::delta_e),
    );
    text.draw(&mut img, MARGIN as i32, 46, &summary, 14.0, [190, 190, 190]);

    for (i, subject) in eval.subjects.iter().enumerate() {
        let col = i as u32 % COLUMNS;
        let row = i as u32 / COLUMNS;
        let x = MARGIN + col * CARD_W;
        let y = HEADER_H + row * CARD_H;
        fill(&mut img, x, y, CARD_W - 12, CARD_H - 12, SURROUND);
        let sx = x + 8;
        let sy = y + 8;
        fill(&mut img, sx, sy, SWATCH_W, SWATCH_H, subject.eye_rgb8);
        fill(
            &mut img,
            sx + SWATCH_W + 4,
            sy,
            SWATCH_W,
            SWATCH_H,
            subject.camera_rgb8,
        );
        if !subject.eye_in_gamut {
            corner_mark(&mut img, sx + SWATCH_W, sy);
        }
        if !subject.camera_in_gamut {
            corner_mark(&mut img, sx + 2 * SWATCH_W + 4, sy);
        }
        let band = DeltaEBand::of(subject.de2000);
        let badge = band.color();
        fill(
            &mut img,
            sx,
            sy + SWATCH_H + 6,
            8,
            44,
            [badge.r(), badge.g(), badge.b()],
        );
        let name = if subject.included {
            subject.name.to_string()
        } else {
            format!("{} (excluded)", subject.name)
        };
        text.draw(
            &mut img,
            (sx + 16) as i32,
            (sy + SWATCH_H + 6) as i32,
            &name,
            15.0,
            [20, 20, 20],
        );
        let de = format!("ΔE00 {} · {}", format::delta_e(subject.de2000), band.word());
        text.draw(
            &mut img,
            (sx + 16) as i32,
            (sy + SWATCH_H + 28) as i32,
            &de,
            14.0,
            [30, 30, 30],
        );
    }
    img
}

/// Write the swatch sheet PNG.
pub fn swatch_sheet_png(plan: &Plan, eval: &Evaluation, path: &Path) -> Result<(), String> {
    if eval.subjects.is_empty() {
        return Err("the plan has no subjects".into());
    }
    swatch_sheet(plan, eval)
        .save_with_format(path, image::ImageFormat::Png)
        .map_err(|e| format!("{}: {e}", path.display()))
}

fn rgba(c: [u8; 3]) -> Rgba<u8> {
    Rgba([c[0], c[1], c[2], 255])
}

fn fill(img: &mut RgbaImage, x: u32, y: u32, w: u32, h: u32, c: [u8; 3]) {
    for yy in y..(y + h).min(img.height()) {
        for xx in x..(x + w).min(img.width()) {
            img.put_pixel(xx, yy, rgba(c));
        }
    }
}

/// Out-of-gamut mark: a dark triangle in the swatch's top-right corner.
fn corner_mark(img: &mut RgbaImage, right: u32, top: u32) {
    let size = 18;
    for dy in 0..size {
        for dx in 0..(size - dy) {
            let x = right - 1 - dx;
            let y = top + dy;
            if x < img.width() && y < img.height() {
                img.put_pixel(x, y, rgba([20, 20, 20]));
            }
        }
    }
}

/// Draws text into an image with egui's own fonts, laid out by epaint and
/// copied glyph by glyph from its font atlas.
struct TextPainter {
    fonts: Fonts,
}

impl TextPainter {
    fn new() -> TextPainter {
        TextPainter {
            fonts: Fonts::new(TextOptions::default(), FontDefinitions::default()),
        }
    }

    fn draw(&mut self, img: &mut RgbaImage, x: i32, y: i32, text: &str, size: f32, color: [u8; 3]) {
        let galley = self.fonts.with_pixels_per_point(1.0).layout_no_wrap(
            text.to_owned(),
            FontId::proportional(size),
            Color32::WHITE,
        );
        let atlas = self.fonts.image();
        let [atlas_w, atlas_h] = atlas.size;
        for row in &galley.rows {
            for glyph in &row.glyphs {
                let uv = glyph.uv_rect;
                if uv.is_nothing() {
                    continue;
                }
                let left = x as f32 + row.pos.x + glyph.pos.x + uv.offset.x;
                let top = y as f32 + row.pos.y + glyph.pos.y + uv.offset.y;
                let (left, top) = (left.round() as i64, top.round() as i64);
                for ty in uv.min[1]..uv.max[1] {
                    for tx in uv.min[0]..uv.max[0] {
                        let (tx, ty) = (usize::from(tx), usize::from(ty));
                        if tx >= atlas_w || ty >= atlas_h {
                            continue;
                        }
                        let coverage = f32::from(atlas.pixels[ty * atlas_w + tx].a()) / 255.0;
                        if coverage <= 0.0 {
                            continue;
                        }
                        let px = left + (tx - usize::from(uv.min[0])) as i64;
                        let py = top + (ty - usize::from(uv.min[1])) as i64;
                        if px < 0
                            || py < 0
                            || px >= i64::from(img.width())
                            || py >= i64::from(img.height())
                        {
                            continue;
                        }
                        let pixel = img.get_pixel_mut(px as u32, py as u32);
                        for (channel, ink) in pixel.0.iter_mut().zip(color) {
                            let under = f32::from(*channel);
                            *channel = (under + (f32::from(ink) - under) * coverage).round() as u8;
                        }
                    }
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_plan::SubjectResult;

    fn subject(name: &str, eye: [u8; 3], camera: [u8; 3]) -> SubjectResult {
        SubjectResult {
            name: name.into(),
            included: true,
            eye_rgb8: eye,
            camera_rgb8: camera,
            eye_in_gamut: true,
            camera_in_gamut: false,
            de2000: 4.2,
            ..SubjectResult::default()
        }
    }

    #[test]
    fn sheet_carries_the_evaluation_colours_and_text() {
        let eval = Evaluation {
            subjects: vec![
                subject("Red", [200, 30, 40], [190, 40, 60]),
                subject("Leaf", [60, 120, 40], [70, 110, 50]),
            ],
            ..Evaluation::default()
        };
        let img = swatch_sheet(&Plan::default(), &eval);
        assert_eq!(img.width(), MARGIN * 2 + COLUMNS * CARD_W);
        // Centre of the first eye swatch and of the second camera swatch.
        let cx = MARGIN + 8 + SWATCH_W / 2;
        let cy = HEADER_H + 8 + SWATCH_H / 2;
        assert_eq!(img.get_pixel(cx, cy).0, [200, 30, 40, 255]);
        assert_eq!(
            img.get_pixel(MARGIN + CARD_W + 8 + SWATCH_W + 4 + SWATCH_W / 2, cy)
                .0,
            [70, 110, 50, 255]
        );
        // The out-of-gamut camera swatch has its corner mark.
        assert_eq!(
            img.get_pixel(MARGIN + 8 + 2 * SWATCH_W + 4 - 2, HEADER_H + 9)
                .0,
            [20, 20, 20, 255]
        );
        // Text was drawn into the header: some pixels there are neither background nor missing.
        let header_ink = (0..img.width())
            .flat_map(|x| (10..40).map(move |y| (x, y)))
            .filter(|&(x, y)| img.get_pixel(x, y).0[0] > 120)
            .count();
        assert!(
            header_ink > 50,
            "plan name should be drawn, found {header_ink} ink pixels"
        );
    }
}
