//! Lampwright's look: a dark, strictly neutral grey so the swatches read true,
//! with one muted accent for selection and focus.

use egui::{Color32, CornerRadius, FontFamily, FontId, Stroke, TextStyle, Visuals};

/// Neutral greys (equal R, G, B so no tint sits next to a swatch).
pub mod grey {
    use egui::Color32;
    /// Window background.
    pub const BASE: Color32 = Color32::from_gray(30);
    /// Panels.
    pub const PANEL: Color32 = Color32::from_gray(36);
    /// Cards inside panels.
    pub const CARD: Color32 = Color32::from_gray(44);
    /// Card edges and separators.
    pub const EDGE: Color32 = Color32::from_gray(62);
    /// Secondary text: captions, units.
    pub const CAPTION: Color32 = Color32::from_gray(150);
    /// Main text.
    pub const TEXT: Color32 = Color32::from_gray(218);
    /// Mid grey behind swatches (about L* 50 so light and dark swatches both read).
    pub const SWATCH_SURROUND: Color32 = Color32::from_gray(119);
}

/// The accent: a quiet amber, used for selection and the mix point in plots.
pub const ACCENT: Color32 = Color32::from_rgb(0xc8, 0x9b, 0x4a);
/// Colour of warnings and error banners.
pub const WARNING: Color32 = Color32::from_rgb(0xd9, 0x82, 0x4a);
/// Background of the error banner.
pub const ERROR_FILL: Color32 = Color32::from_rgb(0x5a, 0x2a, 0x2a);

/// Apply the theme to a context.
pub fn apply(ctx: &egui::Context) {
    let mut visuals = Visuals::dark();
    visuals.panel_fill = grey::PANEL;
    visuals.window_fill = grey::PANEL;
    visuals.extreme_bg_color = Color32::from_gray(22);
    visuals.faint_bg_color = grey::CARD;
    visuals.override_text_color = Some(grey::TEXT);
    visuals.selection.bg_fill = Color32::from_rgb(0x6b, 0x55, 0x2e);
    visuals.selection.stroke = Stroke::new(1.0, ACCENT);
    visuals.hyperlink_color = ACCENT;
    visuals.widgets.noninteractive.bg_stroke = Stroke::new(1.0, grey::EDGE);
    visuals.widgets.inactive.weak_bg_fill = Color32::from_gray(52);
    visuals.widgets.inactive.bg_fill = Color32::from_gray(52);
    visuals.widgets.hovered.weak_bg_fill = Color32::from_gray(66);
    visuals.widgets.hovered.bg_fill = Color32::from_gray(66);
    visuals.widgets.active.weak_bg_fill = Color32::from_gray(80);
    visuals.widgets.active.bg_fill = Color32::from_gray(80);
    visuals.window_corner_radius = CornerRadius::same(6);
    // Always dark: a light surround would shift how the swatches look.
    ctx.set_theme(egui::Theme::Dark);
    ctx.set_visuals_of(egui::Theme::Dark, visuals);

    ctx.style_mut_of(egui::Theme::Dark, |style| {
        style.spacing.item_spacing = egui::vec2(8.0, 5.0);
        style.spacing.button_padding = egui::vec2(7.0, 3.0);
        style.spacing.slider_width = 150.0;
        style.text_styles.insert(
            TextStyle::Heading,
            FontId::new(18.0, FontFamily::Proportional),
        );
        style
            .text_styles
            .insert(TextStyle::Body, FontId::new(13.5, FontFamily::Proportional));
        style.text_styles.insert(
            TextStyle::Button,
            FontId::new(13.5, FontFamily::Proportional),
        );
        style.text_styles.insert(
            TextStyle::Small,
            FontId::new(11.0, FontFamily::Proportional),
        );
        style.text_styles.insert(
            TextStyle::Monospace,
            FontId::new(12.5, FontFamily::Monospace),
        );
    });
}

/// A frame for cards (one source, one readout, one swatch pair).
pub fn card() -> egui::Frame {
    egui::Frame::new()
        .fill(grey::CARD)
        .stroke(Stroke::new(1.0, grey::EDGE))
        .corner_radius(CornerRadius::same(5))
        .inner_margin(egui::Margin::same(8))
}

/// A caption in the secondary colour and small size.
#[must_use]
pub fn caption(text: impl Into<String>) -> egui::RichText {
    egui::RichText::new(text).small().color(grey::CAPTION)
}
