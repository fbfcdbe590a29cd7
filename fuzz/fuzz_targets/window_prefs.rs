//! Fuzz the window's preferences as the app reads them at start-up: eframe's
//! storage file (a RON map of keys to RON strings) and then the preferences
//! value under its key, read with `eframe::get_value` exactly as `App::new`
//! does; the input is tried both as the whole storage file and as the stored
//! value itself.
//!
//! Asserted: nothing panics; unreadable preferences fall back to the defaults
//! (`get_value` gives `None`); preferences that read are written back and read
//! back equal; remembering a file keeps the recent lists within their limit.

#![no_main]

use eframe::Storage;
use lampwright::ui::prefs::{Prefs, RECENT_LIMIT, STORAGE_KEY};
use libfuzzer_sys::fuzz_target;
use std::collections::HashMap;
use std::path::Path;

/// eframe's file storage in memory: the same key/value map it reads from disk.
#[derive(Default)]
struct MapStorage(HashMap<String, String>);

impl Storage for MapStorage {
    fn get_string(&self, key: &str) -> Option<String> {
        self.0.get(key).cloned()
    }

    fn set_string(&mut self, key: &str, value: String) {
        self.0.insert(key.to_owned(), value);
    }

    fn remove_string(&mut self, key: &str) {
        self.0.remove(key);
    }

    fn flush(&mut self) {}
}

fn exercise(storage: &mut MapStorage) {
    let Some(mut prefs) = eframe::get_value::<Prefs>(storage, STORAGE_KEY) else {
        return;
    };
    eframe::set_value(storage, STORAGE_KEY, &prefs);
    let again: Prefs =
        eframe::get_value(storage, STORAGE_KEY).expect("preferences written back read back");
    assert_eq!(again, prefs, "preferences change across a write and a read");

    let _ = prefs.last_folder();
    prefs.remember_file(Path::new("plans/shoot.ron"));
    assert!(prefs.recent_files.len() <= RECENT_LIMIT);
    assert!(prefs.recent_folders.len() <= RECENT_LIMIT);
    assert_eq!(prefs.last_folder(), Some(Path::new("plans")));
}

fuzz_target!(|data: &[u8]| {
    // The storage file, as eframe reads it (a file it cannot parse is ignored).
    if let Ok(kv) = ron::de::from_reader::<_, HashMap<String, String>>(data) {
        exercise(&mut MapStorage(kv));
    }
    // The stored value itself.
    if let Ok(text) = std::str::from_utf8(data) {
        let mut storage = MapStorage::default();
        storage.set_string(STORAGE_KEY, text.to_owned());
        exercise(&mut storage);
    }
});
