//! From bytes to lines of text: size cap, byte-order marks, UTF-16, binary
//! detection and line splitting with a per-line length cap.
//!
//! Everything here is bounded: the input is refused before any work when it is
//! over [`MAX_FILE_BYTES`], lines are produced lazily (no per-line allocation)
//! and a line longer than [`MAX_LINE_BYTES`] stops the import at that line.

use super::{Fail, MAX_FILE_BYTES, MAX_LINE_BYTES};
use std::borrow::Cow;

const UTF8_BOM: &[u8] = &[0xEF, 0xBB, 0xBF];
const UTF16LE_BOM: &[u8] = &[0xFF, 0xFE];
const UTF16BE_BOM: &[u8] = &[0xFE, 0xFF];
const UTF32LE_BOM: &[u8] = &[0xFF, 0xFE, 0x00, 0x00];
const UTF32BE_BOM: &[u8] = &[0x00, 0x00, 0xFE, 0xFF];

/// Decode a whole file to text: UTF-8 (with or without BOM) or UTF-16 LE/BE
/// with BOM. Refuses oversized, empty, binary and badly encoded input.
pub(super) fn decode(bytes: &[u8]) -> Result<Cow<'_, str>, Fail> {
    // Length first, so that a huge input costs nothing.
    if bytes.len() > MAX_FILE_BYTES {
        return Err(Fail::file(format!(
            "file is {} bytes, more than the {} MiB limit for spectral tables",
            bytes.len(),
            MAX_FILE_BYTES / (1024 * 1024)
        )));
    }
    if bytes.is_empty() {
        return Err(Fail::file("file is empty"));
    }
    if bytes.starts_with(UTF32LE_BOM) || bytes.starts_with(UTF32BE_BOM) {
        return Err(Fail::file(
            "UTF-32 text is not supported; save the table as UTF-8 or UTF-16",
        ));
    }
    if let Some(rest) = bytes.strip_prefix(UTF8_BOM) {
        utf8(rest)
    } else if let Some(rest) = bytes.strip_prefix(UTF16LE_BOM) {
        utf16(rest, u16::from_le_bytes).map(Cow::Owned)
    } else if let Some(rest) = bytes.strip_prefix(UTF16BE_BOM) {
        utf16(rest, u16::from_be_bytes).map(Cow::Owned)
    } else {
        utf8(bytes)
    }
}

fn utf8(bytes: &[u8]) -> Result<Cow<'_, str>, Fail> {
    let nul = bytes.iter().position(|b| *b == 0);
    match std::str::from_utf8(bytes) {
        Ok(text) => match nul {
            // Valid UTF-8 can hold NUL; the line reader would report it as a
            // control character, but the binary-file hint is clearer here.
            Some(pos) => Err(nul_fail(bytes, pos)),
            None => Ok(Cow::Borrowed(text)),
        },
        Err(e) => {
            let bad = e.valid_up_to();
            match nul {
                Some(pos) if pos < bad => Err(nul_fail(bytes, pos)),
                _ => Err(Fail::at(
                    line_number_at(bytes, bad),
                    format!("invalid UTF-8 at byte {bad}: this is not a UTF-8 or UTF-16 text file"),
                )),
            }
        }
    }
}

fn nul_fail(bytes: &[u8], pos: usize) -> Fail {
    Fail::at(
        line_number_at(bytes, pos),
        format!(
            "NUL byte at byte {pos}: this looks like a binary file \
             (UTF-16 text needs a byte-order mark)"
        ),
    )
}

fn utf16(bytes: &[u8], unit: fn([u8; 2]) -> u16) -> Result<String, Fail> {
    if !bytes.len().is_multiple_of(2) {
        return Err(Fail::file(
            "UTF-16 text has an odd number of bytes: the file is cut short or not UTF-16",
        ));
    }
    let units = bytes.chunks_exact(2).map(|pair| unit([pair[0], pair[1]]));
    let mut text = String::with_capacity(bytes.len() / 2);
    for decoded in char::decode_utf16(units) {
        match decoded {
            Ok(c) => text.push(c),
            Err(e) => {
                return Err(Fail::at(
                    line_number_at(text.as_bytes(), text.len()),
                    format!(
                        "invalid UTF-16 (unpaired surrogate 0x{:04X})",
                        e.unpaired_surrogate()
                    ),
                ));
            }
        }
    }
    Ok(text)
}

/// 1-based number of the line that holds byte `pos`, counting `\r\n`, `\n`
/// and a lone `\r` each as one line break (as [`Lines`] does).
fn line_number_at(bytes: &[u8], pos: usize) -> usize {
    let head = &bytes[..pos.min(bytes.len())];
    let mut line = 1;
    for (i, b) in head.iter().enumerate() {
        match b {
            b'\n' => line += 1,
            b'\r' if bytes.get(i + 1) != Some(&b'\n') => line += 1,
            _ => {}
        }
    }
    line
}

/// Lines of a text with their 1-based numbers. Accepts `\n`, `\r\n` and a lone
/// `\r` as line ends. Fails on a line longer than [`MAX_LINE_BYTES`] or holding
/// a control character other than tab (binary data).
pub(super) struct Lines<'a> {
    rest: &'a str,
    line_no: usize,
}

impl<'a> Lines<'a> {
    pub(super) fn new(text: &'a str) -> Self {
        Lines {
            rest: text,
            line_no: 0,
        }
    }
}

impl<'a> Iterator for Lines<'a> {
    type Item = Result<(usize, &'a str), Fail>;

    fn next(&mut self) -> Option<Self::Item> {
        if self.rest.is_empty() {
            return None;
        }
        self.line_no += 1;
        let bytes = self.rest.as_bytes();
        let end = bytes
            .iter()
            .position(|b| *b == b'\n' || *b == b'\r')
            .unwrap_or(bytes.len());
        let line = &self.rest[..end];
        let next = match bytes.get(end) {
            Some(b'\r') if bytes.get(end + 1) == Some(&b'\n') => end + 2,
            Some(_) => end + 1,
            None => end,
        };
        self.rest = &self.rest[next..];
        if line.len() > MAX_LINE_BYTES {
            self.rest = "";
            return Some(Err(Fail::at(
                self.line_no,
                format!(
                    "line is {} bytes long, more than the {} KiB limit",
                    line.len(),
                    MAX_LINE_BYTES / 1024
                ),
            )));
        }
        if let Some(c) = line.chars().find(|c| c.is_control() && *c != '\t') {
            self.rest = "";
            let what = if c == '\0' {
                "NUL character".to_string()
            } else {
                format!("control character U+{:04X}", u32::from(c))
            };
            return Some(Err(Fail::at(
                self.line_no,
                format!("{what}: this looks like a binary file, not a text table"),
            )));
        }
        Some(Ok((self.line_no, line)))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lines(text: &str) -> Vec<(usize, &str)> {
        Lines::new(text).collect::<Result<Vec<_>, _>>().unwrap()
    }

    #[test]
    fn splits_lf_crlf_and_lone_cr() {
        assert_eq!(
            lines("a\nb\r\nc\rd"),
            vec![(1, "a"), (2, "b"), (3, "c"), (4, "d")]
        );
        assert_eq!(lines("a\n\nb\n"), vec![(1, "a"), (2, ""), (3, "b")]);
        assert_eq!(line_number_at(b"a\r\nb\rc\nd", 8), 4);
    }

    #[test]
    fn decodes_boms() {
        assert_eq!(decode(b"\xEF\xBB\xBF400,1").unwrap(), "400,1");
        let le: Vec<u8> = [0xFF, 0xFE]
            .into_iter()
            .chain("40µ".encode_utf16().flat_map(u16::to_le_bytes))
            .collect();
        assert_eq!(decode(&le).unwrap(), "40µ");
        let be: Vec<u8> = [0xFE, 0xFF]
            .into_iter()
            .chain("4\n0".encode_utf16().flat_map(u16::to_be_bytes))
            .collect();
        assert_eq!(decode(&be).unwrap(), "4\n0");
    }

    #[test]
    fn refuses_binary_and_bad_encodings() {
        assert_eq!(decode(b"").unwrap_err().line, 0);
        let nul = decode(b"400,1\n401,\x002").unwrap_err();
        assert_eq!(nul.line, 2);
        assert!(nul.message.contains("NUL"), "{}", nul.message);
        let latin1 = decode(b"a\nb\n\xB5m").unwrap_err();
        assert_eq!(latin1.line, 3);
        assert!(latin1.message.contains("UTF-8"));
        assert!(
            decode(&[0xFF, 0xFE, 0x34])
                .unwrap_err()
                .message
                .contains("odd")
        );
        // Unpaired high surrogate on the second line.
        let bad16 = decode(&[0xFF, 0xFE, b'1', 0, b'\n', 0, 0x00, 0xD8, b'2', 0]).unwrap_err();
        assert_eq!(bad16.line, 2);
        assert!(
            decode(&[0xFF, 0xFE, 0, 0, b'1', 0, 0, 0])
                .unwrap_err()
                .message
                .contains("UTF-32")
        );
        let ctl = Lines::new("ok\nx\x07y")
            .collect::<Result<Vec<_>, _>>()
            .unwrap_err();
        assert_eq!(ctl.line, 2);
        assert!(ctl.message.contains("U+0007"));
    }

    #[test]
    fn caps_line_length() {
        let long = format!("400,1\n{}\n", "1".repeat(MAX_LINE_BYTES + 1));
        let err = Lines::new(&long)
            .collect::<Result<Vec<_>, _>>()
            .unwrap_err();
        assert_eq!(err.line, 2);
        assert!(err.message.contains("limit"));
    }
}
