//! Pieces the panels share: the context every panel draws with, searchable
//! pickers and swatch painting.

use super::actions::Action;
use super::catalog::{self, Entry};
use super::command::Command;
use super::theme;
use super::view::ViewState;
use egui::containers::menu::{MenuButton, MenuConfig};
use egui::{Color32, PopupCloseBehavior, Rect, Sense, Stroke, Ui, Vec2};
use lampwright_plan::{Evaluation, Plan};

/// What a panel needs to draw: the plan and evaluation to read, and where
/// to put the user's commands and actions.
pub struct PanelCtx<'a> {
    /// The plan (read only: changes go through `out`).
    pub plan: &'a Plan,
    /// The evaluation on screen.
    pub eval: Option<&'a Evaluation>,
    /// The evaluation belongs to an earlier plan (the latest failed).
    pub stale: bool,
    /// Selections and filters.
    pub view: &'a mut ViewState,
    /// Commands to apply after drawing.
    pub out: &'a mut Vec<Command>,
    /// File and window actions to run after drawing.
    pub actions: &'a mut Vec<Action>,
    /// Set when a text field has keyboard focus (typing merges into one undo step).
    pub text_focus: &'a mut bool,
    /// The advisor's goal and latest answer.
    pub advisor: &'a mut super::advisor::AdvisorState,
}

impl PanelCtx<'_> {
    /// Queue a command.
    pub fn push(&mut self, command: Command) {
        self.out.push(command);
    }

    /// Note whether a text field's response has focus.
    pub fn track_focus(&mut self, response: &egui::Response) {
        if response.has_focus() {
            *self.text_focus = true;
        }
    }
}

/// A button that opens a searchable list of library entries grouped by group.
/// Returns the chosen entry.
pub fn entry_picker(
    ui: &mut Ui,
    button_text: &str,
    entries: &[Entry],
    search: &mut String,
    group_filter: Option<&str>,
) -> Option<Entry> {
    let config = MenuConfig::new().close_behavior(PopupCloseBehavior::CloseOnClickOutside);
    let (_, inner) = MenuButton::new(button_text).config(config).ui(ui, |ui| {
        ui.set_min_width(300.0);
        let field = ui
            .add(
                egui::TextEdit::singleline(search)
                    .hint_text("search name, group or note")
                    .desired_width(280.0),
            )
            .accessible_name("Search");
        field.request_focus();
        let found: Vec<&Entry> = catalog::search(entries, search)
            .into_iter()
            .filter(|e| group_filter.is_none_or(|g| e.group.eq_ignore_ascii_case(g)))
            .collect();
        let mut picked = None;
        egui::ScrollArea::vertical()
            .max_height(360.0)
            .show(ui, |ui| {
                if found.is_empty() {
                    ui.label(theme::caption("nothing matches"));
                }
                for group in catalog::groups(&found) {
                    ui.label(egui::RichText::new(&group).strong().color(theme::ACCENT));
                    for entry in found.iter().filter(|e| e.group == group) {
                        let response = ui.button(&entry.name);
                        let response = if entry.description.is_empty() {
                            response
                        } else {
                            response.on_hover_text(&entry.description)
                        };
                        if response.clicked() {
                            picked = Some((*entry).clone());
                        }
                    }
                }
            });
        if picked.is_some() {
            search.clear();
            ui.close();
        }
        picked
    });
    inner.and_then(|r| r.inner)
}

/// Paint one swatch filling `rect`; marks it when out of the display gamut.
pub fn paint_swatch(ui: &Ui, rect: Rect, rgb8: [u8; 3], in_gamut: bool) {
    let painter = ui.painter();
    painter.rect_filled(rect, 3.0, Color32::from_rgb(rgb8[0], rgb8[1], rgb8[2]));
    if !in_gamut {
        // A hatched corner: visible on any colour, does not hide the swatch.
        let size = 18.0_f32.min(rect.width() / 3.0);
        let corner = rect.right_top();
        let back = Color32::from_gray(20);
        let mark = Color32::from_gray(235);
        painter.add(egui::Shape::convex_polygon(
            vec![
                corner,
                corner + Vec2::new(-size, 0.0),
                corner + Vec2::new(0.0, size),
            ],
            back,
            Stroke::NONE,
        ));
        painter.text(
            corner + Vec2::new(-size * 0.3, size * 0.3),
            egui::Align2::CENTER_CENTER,
            "!",
            egui::FontId::proportional(11.0),
            mark,
        );
    }
}

/// A small coloured badge with text, e.g. the ΔE band.
pub fn badge(ui: &mut Ui, text: &str, fill: Color32) -> egui::Response {
    let galley = ui.painter().layout_no_wrap(
        text.to_owned(),
        egui::FontId::proportional(11.5),
        Color32::WHITE,
    );
    let size = galley.size() + Vec2::new(10.0, 4.0);
    let (rect, response) = ui.allocate_exact_size(size, Sense::hover());
    ui.painter().rect_filled(rect, 8.0, fill);
    ui.painter()
        .galley(rect.center() - galley.size() / 2.0, galley, Color32::WHITE);
    response
}

/// A numbered readout: caption above, value below.
pub fn readout(ui: &mut Ui, caption: &str, value: &str, hint: &str) -> egui::Response {
    theme::card()
        .inner_margin(egui::Margin::symmetric(8, 4))
        .show(ui, |ui| {
            ui.vertical(|ui| {
                ui.label(theme::caption(caption));
                ui.label(egui::RichText::new(value).size(15.5).strong());
            });
        })
        .response
        .on_hover_text(hint)
}

/// Colours for sources in plots and cards (our own palette, distinct on dark grey).
#[must_use]
pub fn source_color(index: usize) -> Color32 {
    const PALETTE: [Color32; 8] = [
        Color32::from_rgb(0xe0, 0xa4, 0x58),
        Color32::from_rgb(0x6f, 0xa8, 0xdc),
        Color32::from_rgb(0x9c, 0xc7, 0x6a),
        Color32::from_rgb(0xd4, 0x7f, 0xa6),
        Color32::from_rgb(0x8f, 0x8a, 0xe0),
        Color32::from_rgb(0x5f, 0xc4, 0xb8),
        Color32::from_rgb(0xd9, 0xcf, 0x6b),
        Color32::from_rgb(0xc9, 0x74, 0x5c),
    ];
    PALETTE[index % PALETTE.len()]
}
