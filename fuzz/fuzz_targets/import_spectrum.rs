//! Fuzz the spectral importer with every table kind: it must never panic, and
//! whatever it accepts must be a well-formed table.

#![no_main]

use lampwright_color::import::{SpectrumKind, import_bytes};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    for kind in SpectrumKind::ALL {
        match import_bytes("fuzz.csv", data, kind) {
            Ok(table) => {
                let n = table.wavelengths_nm.len();
                assert!(n >= 2);
                assert!(table.wavelengths_nm.windows(2).all(|w| w[0] < w[1]));
                for column in &table.columns {
                    assert_eq!(column.values.len(), n);
                    assert!(column.values.iter().all(|v| v.is_finite() && *v >= 0.0));
                }
            }
            Err(e) => assert!(!e.to_string().contains('\n')),
        }
    }
});
