#!/usr/bin/env bash
# What CI does, runnable by anyone: formatting, lints with warnings as errors,
# the layering rule, then the test suite (the README's test command).
set -euo pipefail
cd "$(dirname "$0")/.."

echo "== toolchain"
cargo --version
rustc --version

echo "== formatting"
cargo fmt --all --check

echo "== layering: library crates must not depend on the GUI"
for crate in lampwright-color lampwright-camera lampwright-plan; do
  if cargo tree -p "$crate" -e normal --prefix none 2>/dev/null | grep -Eq '^(egui|eframe|egui_plot|rfd|winit) '; then
    echo "error: $crate depends on a GUI crate" >&2
    exit 1
  fi
done
if cargo tree -p lampwright-color -e normal --prefix none | grep -Eq '^lampwright-(camera|plan) '; then
  echo "error: lampwright-color depends on a crate above it" >&2; exit 1
fi
if cargo tree -p lampwright-camera -e normal --prefix none | grep -Eq '^lampwright-plan '; then
  echo "error: lampwright-camera depends on lampwright-plan" >&2; exit 1
fi

echo "== clippy (warnings are errors)"
cargo clippy --workspace --all-targets -- -D warnings

echo "== tests (README: cargo test --workspace)"
cargo test --workspace
