//! The plan editor on the left: lights, subjects, camera and viewing, zones.

mod advisor;
mod camera;
mod lights;
mod subjects;
mod zones;

use super::view::EditorTab;
use super::widgets::PanelCtx;

/// Draw the editor.
pub fn ui(ui: &mut egui::Ui, cx: &mut PanelCtx<'_>) {
    ui.add_space(4.0);
    ui.horizontal_wrapped(|ui| {
        for tab in EditorTab::ALL {
            ui.selectable_value(&mut cx.view.editor_tab, tab, tab.title());
        }
    });
    ui.separator();
    egui::ScrollArea::vertical()
        .id_salt("editor-scroll")
        .auto_shrink([false, false])
        .show(ui, |ui| match cx.view.editor_tab {
            EditorTab::Lights => lights::ui(ui, cx),
            EditorTab::Subjects => subjects::ui(ui, cx),
            EditorTab::Camera => camera::ui(ui, cx),
            EditorTab::Zones => zones::ui(ui, cx),
            EditorTab::Advisor => advisor::ui(ui, cx),
        });
}
