#!/usr/bin/env bash
# Run every cargo-fuzz target in fuzz/fuzz_targets for SECONDS each (default 60).
#
#   scripts/fuzz.sh [SECONDS]
#
# Installs cargo-fuzz if it is missing, builds on the stable toolchain with
# RUSTC_BOOTSTRAP=1 (libFuzzer instrumentation needs unstable flags), seeds each
# target's corpus fuzz/corpus/<target> from the test data under
# crates/*/tests/data, and prints libFuzzer's final statistics. Crashing inputs
# are written to fuzz/artifacts/<target>/; turn each one into a corpus file and
# a regression test before fixing it.
set -euo pipefail

seconds="${1:-60}"
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root/fuzz"

if ! cargo fuzz --version >/dev/null 2>&1; then
    cargo install cargo-fuzz --locked
fi

export RUSTC_BOOTSTRAP=1
# Safe Rust only (unsafe_code is forbidden), so the address sanitizer adds
# little but cost; libFuzzer's coverage and panic detection do the work.
sanitizer="${FUZZ_SANITIZER:-none}"

status=0
for target_file in fuzz_targets/*.rs; do
    target="$(basename "$target_file" .rs)"
    corpus="corpus/$target"
    mkdir -p "$corpus" "artifacts/$target"
    # Seed from the project's own test data (good and malformed tables).
    find "$root"/crates/*/tests/data -type f -size -64k -exec cp -n {} "$corpus"/ \; 2>/dev/null || true
    echo "== fuzzing $target for ${seconds}s (corpus: fuzz/$corpus, $(ls "$corpus" | wc -l) files)"
    cargo fuzz build --sanitizer "$sanitizer" --release "$target"
    if ! cargo fuzz run --sanitizer "$sanitizer" --release "$target" "$corpus" -- \
        -max_total_time="$seconds" -max_len=65536 -rss_limit_mb=2048 -print_final_stats=1 \
        -artifact_prefix="artifacts/$target/"; then
        echo "!! $target found a failing input: see fuzz/artifacts/$target/" >&2
        status=1
    fi
done
exit "$status"
