#!/usr/bin/env bash
# Build and run every cargo-fuzz target in fuzz/fuzz_targets for SECONDS each
# (default 60), one after another, and print the executions each reached.
#
#   scripts/fuzz.sh [SECONDS] [TARGET...]
#
# Installs cargo-fuzz if it is missing, builds on the stable toolchain with
# RUSTC_BOOTSTRAP=1 (libFuzzer instrumentation needs unstable flags), and seeds
# each target's corpus fuzz/corpus/<target>/ from the project's own data:
#
#   import_spectrum, import_into_plan   crates/color/tests/data (good and malformed tables)
#   plan_file                           crates/plan/tests/data, crates/plan/tests/fixtures/*.ron,
#                                       assets/demo/plans
#   window_prefs, recovery_scan         fuzz/seeds/<target> only
#
# plus fuzz/seeds/<target>/ for any target. The corpora grow as libFuzzer finds
# new paths and are not committed (fuzz/.gitignore); only the seeds are. A
# target with a dictionary fuzz/dicts/<target>.dict gets it. Crashing inputs are
# written to fuzz/artifacts/<target>/; turn each one into a regression test
# before fixing it. Each run's log is kept in fuzz/logs/<target>.log.
set -euo pipefail

seconds="${1:-60}"
shift || true
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root/fuzz"

if ! cargo fuzz --version >/dev/null 2>&1; then
    cargo install cargo-fuzz --locked
fi

export RUSTC_BOOTSTRAP=1
# Safe Rust only (unsafe_code is forbidden), so the address sanitizer adds
# little but cost; libFuzzer's coverage and panic detection do the work.
sanitizer="${FUZZ_SANITIZER:-none}"

if [ "$#" -gt 0 ]; then
    targets=("$@")
else
    targets=()
    for target_file in fuzz_targets/*.rs; do
        targets+=("$(basename "$target_file" .rs)")
    done
fi

# Copy the small files (under 64 KiB, libFuzzer's -max_len here) of the given
# folders or globs into a corpus, keeping what the corpus already holds.
seed() {
    local corpus="$1"
    shift
    local from
    for from in "$@"; do
        [ -e "$from" ] || continue
        find "$from" -type f -size -64k -exec cp -n {} "$corpus"/ \;
    done
}

mkdir -p logs
summary=()
status=0
for target in "${targets[@]}"; do
    corpus="corpus/$target"
    mkdir -p "$corpus" "artifacts/$target"
    case "$target" in
        import_spectrum | import_into_plan)
            seed "$corpus" "$root"/crates/color/tests/data ;;
        plan_file)
            seed "$corpus" "$root"/crates/plan/tests/data "$root"/assets/demo/plans \
                "$root"/crates/plan/tests/fixtures/*.ron ;;
    esac
    seed "$corpus" "seeds/$target"
    dict=()
    if [ -f "dicts/$target.dict" ]; then
        dict=("-dict=dicts/$target.dict")
    fi
    echo "== fuzzing $target for ${seconds}s (corpus: fuzz/$corpus, $(find "$corpus" -type f | wc -l) files)"
    cargo fuzz build --sanitizer "$sanitizer" --release "$target"
    log="logs/$target.log"
    result="no crash"
    started=$SECONDS
    if ! cargo fuzz run --sanitizer "$sanitizer" --release "$target" "$corpus" -- \
        -max_total_time="$seconds" -max_len=65536 -rss_limit_mb=2048 -timeout=10 \
        -print_final_stats=1 -artifact_prefix="artifacts/$target/" "${dict[@]}" 2>&1 | tee "$log"; then
        echo "!! $target found a failing input: see fuzz/artifacts/$target/" >&2
        result="FAILED (see fuzz/artifacts/$target/)"
        status=1
    fi
    elapsed=$((SECONDS - started))
    execs="$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -n 1)"
    cov="$(grep -Eo 'cov: [0-9]+ ft: [0-9]+ corp: [0-9]+' "$log" | tail -n 1)"
    summary+=("$(printf '%-18s %5ss  %12s executions  %-36s %s' \
        "$target" "$elapsed" "${execs:-?}" "${cov:-}" "$result")")
done

echo
echo "== summary (sanitizer: $sanitizer)"
printf '%s\n' "${summary[@]}"
exit "$status"
