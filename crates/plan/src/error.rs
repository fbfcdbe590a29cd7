//! The plan crate's error type.
//!
//! Every message is one line, says what is wrong and where (file and line, or
//! the field of the plan), and is meant to be shown to the user as it is.

use lampwright_camera::CameraError;
use lampwright_color::ColorError;
use std::borrow::Cow;
use std::path::{Path, PathBuf};
use thiserror::Error;

/// User text (a name, an id, a path) as it appears inside a one-line
/// message: control characters and line or paragraph separators become
/// spaces, so a damaged or hand-edited name cannot break the message's line.
#[must_use]
pub fn one_line(text: &str) -> Cow<'_, str> {
    let breaks = |c: char| c.is_control() || matches!(c, '\u{2028}' | '\u{2029}');
    if text.contains(breaks) {
        Cow::Owned(
            text.chars()
                .map(|c| if breaks(c) { ' ' } else { c })
                .collect(),
        )
    } else {
        Cow::Borrowed(text)
    }
}

/// A path as it appears inside a one-line message.
fn shown(path: &Path) -> String {
    one_line(&path.display().to_string()).into_owned()
}

/// Result with [`PlanError`].
pub type Result<T, E = PlanError> = std::result::Result<T, E>;

/// Which kind of library entry an id refers to.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum LibraryKind {
    /// A lamp spectrum.
    Lamp,
    /// A gel or filter transmittance.
    Gel,
    /// A subject reflectance.
    Subject,
    /// A camera's sensitivities.
    Camera,
}

impl LibraryKind {
    /// The word used in messages: "lamp", "gel", "subject", "camera".
    #[must_use]
    pub fn word(self) -> &'static str {
        match self {
            LibraryKind::Lamp => "lamp",
            LibraryKind::Gel => "gel",
            LibraryKind::Subject => "subject",
            LibraryKind::Camera => "camera",
        }
    }
}

impl std::fmt::Display for LibraryKind {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.word())
    }
}

/// Everything that can go wrong with a plan: reading and writing plan files,
/// structural limits, references to library entries, and the colour
/// computation underneath.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum PlanError {
    /// The operating system refused a read or write.
    #[error("{}: {}", shown(path), one_line(message))]
    Io {
        /// The file or folder.
        path: PathBuf,
        /// The system's message.
        message: String,
    },
    /// A plan file is not well-formed or has a field of the wrong type.
    #[error("{}: line {line}, column {column}: {}", shown(path), one_line(message))]
    Parse {
        /// The file (or a label such as "<memory>").
        path: PathBuf,
        /// 1-based line.
        line: usize,
        /// 1-based column.
        column: usize,
        /// What is wrong.
        message: String,
    },
    /// A plan file is not UTF-8 text.
    #[error(
        "{}: not UTF-8 text (first invalid byte at line {line}, byte offset {offset}); plan files are UTF-8 RON",
        shown(path)
    )]
    NotUtf8 {
        /// The file.
        path: PathBuf,
        /// 1-based line of the first invalid byte.
        line: usize,
        /// Byte offset of the first invalid byte.
        offset: usize,
    },
    /// A plan file is larger than plans may be.
    #[error(
        "{}: the file is {size_bytes} bytes; plan files are limited to {limit_bytes} bytes",
        shown(path)
    )]
    TooLarge {
        /// The file.
        path: PathBuf,
        /// Its size.
        size_bytes: u64,
        /// The limit.
        limit_bytes: u64,
    },
    /// A plan file was written by a newer Lampwright, or carries a version that never existed.
    #[error(
        "{}: plan format version {found} is not one this Lampwright reads (it reads versions 0 to {newest}){hint}",
        shown(path)
    )]
    UnsupportedVersion {
        /// The file.
        path: PathBuf,
        /// The version in the file.
        found: u64,
        /// The newest version this build reads.
        newest: u32,
        /// Advice, starting with "; " (empty when none).
        hint: String,
    },
    /// A plan exceeds a structural limit (counts, lengths, nesting).
    #[error(
        "{}: {what} is {found}, more than the limit of {limit}",
        one_line(field)
    )]
    Limit {
        /// Where in the plan, e.g. "sources[3].gels" or "name".
        field: String,
        /// What was counted, e.g. "number of gels".
        what: &'static str,
        /// The count found.
        found: usize,
        /// The limit.
        limit: usize,
    },
    /// A plan refers to a library entry or embedded spectrum that does not exist.
    #[error("{}: unknown {kind} '{}'", one_line(context), one_line(id))]
    UnknownId {
        /// Where the reference is, e.g. "source 'Key'".
        context: String,
        /// What kind of entry.
        kind: LibraryKind,
        /// The id that was not found.
        id: String,
    },
    /// A value in the plan is not acceptable (non-finite, negative, inconsistent).
    #[error("{}: {}", one_line(field), one_line(message))]
    Invalid {
        /// Where in the plan, e.g. `sources[0].level_lux` or "source 'Key'".
        field: String,
        /// What is wrong.
        message: String,
    },
    /// A colour computation failed, with the part of the plan it was for.
    /// The colour error is part of the message, not a separate cause, so a
    /// report of the whole chain says it once.
    #[error("{}: {}", one_line(context), one_line(&error.to_string()))]
    ColorIn {
        /// Which part of the plan, e.g. "subject 'Tomato'".
        context: String,
        /// The colour error.
        error: ColorError,
    },
    /// A colour computation failed.
    #[error("{}", one_line(&.0.to_string()))]
    Color(ColorError),
    /// A camera computation failed.
    #[error("{}", one_line(&.0.to_string()))]
    Camera(CameraError),
    /// A plan could not be written as text (should not happen for valid plans).
    #[error("could not write the plan as RON: {}", one_line(.0))]
    Serialize(String),
}

// By hand rather than `#[from]`: the message above already is the colour or
// camera error's own (made one line), so it is not repeated as a source.
impl From<ColorError> for PlanError {
    fn from(e: ColorError) -> Self {
        PlanError::Color(e)
    }
}

impl From<CameraError> for PlanError {
    fn from(e: CameraError) -> Self {
        PlanError::Camera(e)
    }
}

impl PlanError {
    /// Attach the part of the plan a colour error belongs to.
    #[must_use]
    pub fn color_in(context: impl Into<String>, source: ColorError) -> PlanError {
        PlanError::ColorIn {
            context: context.into(),
            error: source,
        }
    }

    /// An I/O error on `path`.
    #[must_use]
    pub fn io(path: impl Into<PathBuf>, err: &std::io::Error) -> PlanError {
        PlanError::Io {
            path: path.into(),
            message: err.to_string(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_colour_error_is_said_once() {
        let e = PlanError::color_in(
            "subject 'Tomato'",
            ColorError::NotColorimetric {
                what: "reflectance".into(),
                reason: "it is zero at every wavelength".into(),
            },
        );
        let text = e.to_string();
        assert_eq!(
            text.matches("zero at every wavelength").count(),
            1,
            "{text}"
        );
        // No separate cause: printing the whole chain repeats nothing.
        assert!(std::error::Error::source(&e).is_none());
    }

    #[test]
    fn messages_name_place_and_problem() {
        let e = PlanError::Parse {
            path: "plans/shoot.ron".into(),
            line: 12,
            column: 5,
            message: "expected a number".into(),
        };
        assert_eq!(
            e.to_string(),
            "plans/shoot.ron: line 12, column 5: expected a number"
        );
        let e = PlanError::UnknownId {
            context: "source 'Key'".into(),
            kind: LibraryKind::Lamp,
            id: "xyz".into(),
        };
        assert_eq!(e.to_string(), "source 'Key': unknown lamp 'xyz'");
        let e = PlanError::Limit {
            field: "sources".into(),
            what: "number of sources",
            found: 65,
            limit: 64,
        };
        assert_eq!(
            e.to_string(),
            "sources: number of sources is 65, more than the limit of 64"
        );
    }

    #[test]
    fn colour_errors_keep_their_message() {
        let c = ColorError::InvalidInput("lengths differ".into());
        assert_eq!(
            PlanError::from(c.clone()).to_string(),
            "invalid input: lengths differ"
        );
        assert_eq!(
            PlanError::color_in("subject 'Tomato'", c).to_string(),
            "subject 'Tomato': invalid input: lengths differ"
        );
    }
}
