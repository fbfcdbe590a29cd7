#!/usr/bin/env bash
# Rebuild the release binary and capture the window in a virtual display, so the
# screenshots in docs/user-guide.md show the current window.
#
# Needs xvfb (xvfb-run), imagemagick (import) and, optionally, xdotool:
#   apt-get install -y xvfb imagemagick xdotool
# Each state opens a fresh window on the built-in demo plan, with an empty
# settings folder so remembered preferences do not leak into the pictures.
# LAMPWRIGHT_VIEW picks the tabs (see ViewState::apply_start_view); the script
# also prints the first-frame time and the resident memory of each run.
set -euo pipefail
cd "$(dirname "$0")/.."

cargo build --release --bin lampwright
target_dir="${CARGO_TARGET_DIR:-target}"
bin="$(pwd)/${target_dir}/release/lampwright"
out="$(pwd)/docs/screenshots"
mkdir -p "$out"
settle_s="${SETTLE_S:-6}"

shoot() {
    local name="$1" view="$2"
    local home
    home="$(mktemp -d)"
    xvfb-run -a -s "-screen 0 1440x900x24" bash -c '
        set -eu
        XDG_DATA_HOME="$4/data" XDG_CONFIG_HOME="$4/config" \
            LAMPWRIGHT_VIEW="$2" LAMPWRIGHT_LOG_FIRST_FRAME=1 LAMPWRIGHT_NO_SYSTEM_DIALOGS=1 \
            "$1" 2>"$4/stderr.txt" &
        pid=$!
        # Park the pointer in a corner so no tooltip covers the picture.
        sleep 1
        xdotool mousemove 1439 899 2>/dev/null || true
        sleep "$5"
        import -window root "$3"
        rss_kib=$(awk "/VmRSS/ {print \$2}" "/proc/$pid/status")
        kill "$pid"
        wait "$pid" 2>/dev/null || true
        echo "$(basename "$3"): $(grep -h "first frame" "$4/stderr.txt" | sed "s/^lampwright: //"); resident memory $((rss_kib / 1024)) MiB"
    ' _ "$bin" "$view" "$out/$name.png" "$home" "$settle_s"
    rm -rf "$home"
}

shoot main "central=eye,plots=spectrum,editor=lights"
shoot plots-chromaticity "central=eye,plots=chromaticity,editor=camera"
shoot zones "central=zones,plots=tm30,editor=zones,subject=0"
shoot shift-map "central=eye,plots=shift,editor=subjects,subject=2"
shoot advisor "central=eye,plots=chromaticity,editor=advisor,advise=quality"
echo "screenshots written to docs/screenshots/"
