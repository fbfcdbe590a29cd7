//! The help page inside the window: what each figure means, with its
//! standard, and the cautions.

use super::theme;
use egui::{RichText, Ui};

/// Figures and their standards: (figure, meaning, standard).
pub const METHODS: [(&str, &str, &str); 12] = [
    (
        "Eye vs camera swatches",
        "Left: the subject as a person sees it under the plan's light (adapted to the scene white, or as lit). \
         Right: the same subject through the camera's sensitivities, white balance and matrix. Both are shown in \
         the chosen display space; a corner mark means the colour lies outside it and was clipped.",
        "CIE 015:2018 colorimetry; CAT16 (Li et al. 2017) for adaptation; IEC 61966-2-1 (sRGB), SMPTE EG 432-1 (Display P3)",
    ),
    (
        "ΔE00",
        "CIEDE2000 colour difference between the eye's and the camera's colour. About 1 is a just-noticeable \
         difference side by side. The badge bands are Lampwright's own reading aid.",
        "CIE 142-2001 / ISO/CIE 11664-6:2014; Sharma, Wu & Dalal 2005 test data",
    ),
    (
        "CCT",
        "Correlated colour temperature: the black body whose colour is closest in CIE 1960 uv. Shown to 10 K.",
        "Ohno 2014, LEUKOS 10(1):47–55, doi:10.1080/15502724.2014.839020; CIE 015:2018",
    ),
    (
        "Duv",
        "Signed distance from the blackbody line in CIE 1960 uv: positive reads green, negative magenta. \
         Within about ±0.002 the tint is hard to see.",
        "ANSI C78.377-2017; Ohno 2014",
    ),
    (
        "Mired",
        "1 000 000 / CCT. Colour-correction gels shift a light by a roughly fixed number of mired.",
        "common practice",
    ),
    (
        "Illuminance, EV",
        "Lux at the subject from the lit sources; incident exposure value at ISO 100.",
        "CIE 015:2018 (Km = 683 lm/W); ISO 2720:1974 incident-meter calibration",
    ),
    (
        "Key : fill",
        "Stops between the key and the brightest lit fill, after gels (with no fill, the ambient light).",
        "common practice",
    ),
    (
        "CRI Ra, R9",
        "Average colour shift of eight test colours against a reference light (Ra), and of a saturated red (R9). Integers.",
        "CIE 13.3-1995",
    ),
    (
        "TM-30 Rf, Rg",
        "Fidelity (Rf) over 99 colour samples and gamut (Rg, 100 = as saturated as the reference). The vector \
         graphic shows each of 16 hue bins moving from the reference circle; bars show the chroma shift per bin.",
        "ANSI/IES TM-30-20; CIE 224:2017",
    ),
    (
        "SSI",
        "Spectral Similarity Index: how closely the spectrum follows a reference, 0–100.",
        "Academy of Motion Picture Arts and Sciences, SSI (2020); SMPTE ST 2122",
    ),
    (
        "Luther residual, µ-factor",
        "How far the camera's sensitivities are from a linear mix of the eye's colour-matching functions. \
         0 residual and µ = 1 mean the camera sees colour as the eye does.",
        "Luther 1927; Vora & Trussell 1993, JOSA A 10(7):1499",
    ),
    (
        "Chromaticity diagram",
        "CIE 1960 uv with the Planckian locus, isotemperature lines, the mix point and each zone's point.",
        "CIE 015:2018; Robertson 1968 isotemperature lines",
    ),
];

/// The cautions, shown in the window and in the user guide.
pub const CAUTIONS: [&str; 5] = [
    "Lamps and gels get hot. Keep gels at the distance the maker states, never on a bare bulb.",
    "Mains power and dimmers are for qualified people, under local electrical codes.",
    "Discharge lamps (HMI, metal halide, sodium, mercury) can emit ultraviolet; use them with their lenses and housings.",
    "Lampwright predicts colour, not photobiological or electrical safety.",
    "Defer to local codes and licensed practice.",
];

/// Draw the page.
pub fn ui(ui: &mut Ui) {
    egui::ScrollArea::vertical().id_salt("help-scroll").auto_shrink([false, false]).show(ui, |ui| {
        ui.set_max_width(ui.available_width().min(860.0));
        ui.heading("Cautions");
        theme::card().fill(egui::Color32::from_gray(50)).show(ui, |ui| {
            ui.set_width(ui.available_width());
            for caution in CAUTIONS {
                ui.label(format!("• {caution}"));
            }
        });
        ui.add_space(12.0);
        ui.heading("What the figures mean");
        ui.label(theme::caption(
            "Colour is computed on a 1 nm grid from 360 to 830 nm with the CIE 1931 2° observer. \
             Demo lamps, gels, subjects and cameras are invented, not measurements of products.",
        ));
        ui.add_space(4.0);
        for (figure, meaning, standard) in METHODS {
            ui.add_space(6.0);
            ui.label(RichText::new(figure).strong());
            ui.add(egui::Label::new(meaning).wrap());
            ui.add(egui::Label::new(theme::caption(standard)).wrap());
        }
        ui.add_space(12.0);
        ui.heading("Keys and files");
        ui.label(
            "Ctrl+N new · Ctrl+O open · Ctrl+S save · Ctrl+Shift+S save as · Ctrl+Z undo · Ctrl+Shift+Z or Ctrl+Y redo · \
             drop a .ron plan to open it or a .csv spectrum to import it.",
        );
    });
}
