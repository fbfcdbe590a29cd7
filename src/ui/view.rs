//! What the window is looking at: tabs, selections, search fields and
//! filters. None of it is part of the plan.

/// Tabs of the plan editor on the left.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum EditorTab {
    /// Light sources.
    #[default]
    Lights,
    /// Subjects.
    Subjects,
    /// Camera and viewing.
    Camera,
    /// Zones of the scene.
    Zones,
    /// Suggestions for a goal.
    Advisor,
}

impl EditorTab {
    /// All tabs in order.
    pub const ALL: [EditorTab; 5] = [
        EditorTab::Lights,
        EditorTab::Subjects,
        EditorTab::Camera,
        EditorTab::Zones,
        EditorTab::Advisor,
    ];

    /// Tab title.
    #[must_use]
    pub fn title(self) -> &'static str {
        match self {
            EditorTab::Lights => "Lights",
            EditorTab::Subjects => "Subjects",
            EditorTab::Camera => "Camera & viewing",
            EditorTab::Zones => "Zones",
            EditorTab::Advisor => "Advisor",
        }
    }
}

/// What the central area shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum CentralView {
    /// Eye-versus-camera swatches of every subject.
    #[default]
    Swatches,
    /// One subject across the zones.
    AcrossZones,
    /// Methods and cautions.
    Methods,
}

impl CentralView {
    /// All views in order.
    pub const ALL: [CentralView; 3] = [
        CentralView::Swatches,
        CentralView::AcrossZones,
        CentralView::Methods,
    ];

    /// Tab title.
    #[must_use]
    pub fn title(self) -> &'static str {
        match self {
            CentralView::Swatches => "Eye vs camera",
            CentralView::AcrossZones => "Across zones",
            CentralView::Methods => "Methods & cautions",
        }
    }
}

/// Plot tabs.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum PlotTab {
    /// Mixed spectrum and each source's share.
    #[default]
    Spectrum,
    /// Selected subject's reflectance over the light.
    Reflectance,
    /// Camera sensitivities beside the CIE 1931 functions.
    Sensitivities,
    /// CIE 1960 uv with the Planckian locus.
    Chromaticity,
    /// TM-30 colour-vector graphic and hue-bin chroma shifts.
    Tm30,
    /// a*b* shifts from eye to camera.
    ShiftMap,
}

impl PlotTab {
    /// All tabs in order.
    pub const ALL: [PlotTab; 6] = [
        PlotTab::Spectrum,
        PlotTab::Reflectance,
        PlotTab::Sensitivities,
        PlotTab::Chromaticity,
        PlotTab::Tm30,
        PlotTab::ShiftMap,
    ];

    /// Tab title.
    #[must_use]
    pub fn title(self) -> &'static str {
        match self {
            PlotTab::Spectrum => "Spectrum",
            PlotTab::Reflectance => "Subject × light",
            PlotTab::Sensitivities => "Camera vs observer",
            PlotTab::Chromaticity => "Chromaticity (uv)",
            PlotTab::Tm30 => "TM-30 vectors",
            PlotTab::ShiftMap => "Shift map (a*b*)",
        }
    }
}

/// Selections, search fields and filters.
#[derive(Debug, Clone, Default)]
pub struct ViewState {
    /// Editor tab.
    pub editor_tab: EditorTab,
    /// Central view.
    pub central: CentralView,
    /// Plot tab.
    pub plot_tab: PlotTab,
    /// Subject picked for the reflectance plot and the zone view (plan index).
    pub selected_subject: Option<usize>,
    /// Search text of lamp pickers.
    pub lamp_search: String,
    /// Search text of gel pickers.
    pub gel_search: String,
    /// Search text of the subject picker.
    pub subject_search: String,
    /// Swatch filter: only this group.
    pub filter_group: Option<String>,
    /// Swatch filter: only ΔE00 at or above this (0 = no filter).
    pub filter_min_de: f64,
    /// Swatch filter: only included subjects.
    pub filter_included_only: bool,
    /// Name for the next zone.
    pub new_zone_name: String,
}

impl ViewState {
    /// Apply a start-up view description such as
    /// `"plots=chromaticity,central=zones,editor=subjects,subject=3"`
    /// (used to open the window on a given state for screenshots). Unknown
    /// parts are ignored.
    pub fn apply_start_view(&mut self, spec: &str) {
        for part in spec.split(',') {
            let Some((key, value)) = part.split_once('=') else {
                continue;
            };
            let value = value.trim().to_lowercase();
            match key.trim() {
                "plots" => {
                    if let Some(tab) = PlotTab::ALL
                        .into_iter()
                        .find(|t| slug(t.title()).starts_with(&value))
                    {
                        self.plot_tab = tab;
                    }
                }
                "central" => {
                    if let Some(view) = CentralView::ALL
                        .into_iter()
                        .find(|v| slug(v.title()).contains(&value))
                    {
                        self.central = view;
                    }
                }
                "editor" => {
                    if let Some(tab) = EditorTab::ALL
                        .into_iter()
                        .find(|t| slug(t.title()).starts_with(&value))
                    {
                        self.editor_tab = tab;
                    }
                }
                "subject" => {
                    if let Ok(index) = value.parse::<usize>() {
                        self.selected_subject = Some(index);
                    }
                }
                _ => {}
            }
        }
    }
}

fn slug(title: &str) -> String {
    title
        .to_lowercase()
        .chars()
        .filter(char::is_ascii_alphanumeric)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn start_view_picks_tabs() {
        let mut view = ViewState::default();
        view.apply_start_view(
            "plots=chromaticity,central=zones,editor=subjects,subject=2,bogus=1,junk",
        );
        assert_eq!(view.plot_tab, PlotTab::Chromaticity);
        assert_eq!(view.central, CentralView::AcrossZones);
        assert_eq!(view.editor_tab, EditorTab::Subjects);
        assert_eq!(view.selected_subject, Some(2));
        view.apply_start_view("plots=tm30,central=methods");
        assert_eq!(view.plot_tab, PlotTab::Tm30);
        assert_eq!(view.central, CentralView::Methods);
    }
}
