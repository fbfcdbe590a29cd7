//! Lampwright's window, as a library so that headless UI tests and benchmarks
//! can drive the real app. The `lampwright` binary opens it with no arguments.

pub mod ui;
