#!/usr/bin/env bash
# Compare Lampwright's lamp-metric speed with colour-science 0.4.7 on the same spectra.
#
# 1. Makes .venv-bench (gitignored) with colour-science 0.4.7 and SciPy 1.14.1.
# 2. Times colour-science (scripts/bench_vs_colour_science.py).
# 3. Runs the criterion bench crates/color/benches/metrics.rs.
# 4. Writes the medians and ratios into docs/performance.md, replacing the
#    section between the "lamp-metrics" markers (appending it the first time).
#
# Usage: scripts/bench_vs_colour_science.sh            (from the repository root)
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -x .venv-bench/bin/python ]; then
  python3 -m venv .venv-bench
  .venv-bench/bin/pip install --quiet colour-science==0.4.7 scipy==1.14.1
fi
mkdir -p target
# Older OpenBLAS builds need these on some processors, but they slow current NumPy;
# unset them for this timing only.
env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE .venv-bench/bin/python scripts/bench_vs_colour_science.py > target/bench_colour_science.json

cargo bench -p lampwright-color --bench metrics -- --warm-up-time 2 --measurement-time 5 "lamp_report|cct_duv_of_spd|cct_from_uv"

python3 - <<'PY'
import datetime, json, os, platform, re
cs = json.load(open("target/bench_colour_science.json"))
def crit(group, name):
    p = os.path.join("target", "criterion", group, name, "new", "estimates.json")
    return json.load(open(p))["median"]["point_estimate"] * 1e-9
names = ["A", "F2", "LED-B3", "D65"]
cpu = "unknown CPU"
try:
    for line in open("/proc/cpuinfo"):
        if line.startswith("model name"):
            cpu = line.split(":", 1)[1].strip(); break
except OSError:
    pass
load = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
rows = []
for n in names:
    lw_r, cs_r = crit("lamp_report", n), cs["median_s"][f"report/{n}"]
    lw_c, cs_c = crit("cct_duv_of_spd", n), cs["median_s"][f"cct/{n}"]
    rows.append(f"| {n} | {lw_r*1e6:.1f} µs | {cs_r*1e3:.2f} ms | {cs_r/lw_r:.0f}× | {lw_c*1e6:.2f} µs | {cs_c*1e3:.2f} ms | {cs_c/lw_c:.0f}× |")
uv_o, uv_r = crit("cct_from_uv", "ohno2014"), crit("cct_from_uv", "robertson1968")
missed = []
for n in names:
    lw_r, cs_r = crit("lamp_report", n), cs["median_s"][f"report/{n}"]
    if lw_r >= 40e-6 or cs_r / lw_r < 500:
        missed.append(f"report {n}")
    if crit("cct_duv_of_spd", n) >= 2e-6:
        missed.append(f"CCT/Duv {n}")
verdict = ("Every spectrum meets all three in this run." if not missed
           else "Missed in this run: " + ", ".join(missed) + ".")
section = f"""<!-- lamp-metrics:start -->
## Lamp metrics (`crates/color/benches/metrics.rs`)

`scripts/bench_vs_colour_science.sh`, {datetime.date.today().isoformat()}, {cpu}, {os.cpu_count()} cores, load
average {load:.1f} when the table was written (other builds running make every figure an upper
bound). Medians: criterion for Lampwright (release profile); colour-science {cs['colour_science']}
(NumPy {cs['numpy']}, Python {cs['python']}) timed with `time.perf_counter`, median of ≥ 20 calls,
same 1 nm spectra. "Report" is everything `lamp_report` computes: XYZ, xy, uv, u′v′, CCT/Duv,
CRI (Ra, R1–R14), TM-30 (Rf, Rg, 99 samples, 16 bins), SSI and LER; for colour-science the
equivalent calls (`uv_to_CCT_Ohno2013`, `colour_rendering_index`,
`colour_fidelity_index_ANSIIESTM3018`, `spectral_similarity_index`, `luminous_efficacy`).

| spectrum | report, Lampwright | report, colour-science | ratio | CCT/Duv from spectrum, Lampwright | CCT/Duv, colour-science | ratio |
| --- | --- | --- | --- | --- | --- | --- |
""" + "\n".join(rows) + f"""

CCT from (u, v) alone: Ohno 2014 {uv_o*1e9:.0f} ns, Robertson 1968 {uv_r*1e9:.0f} ns.

Targets: the report under 40 µs and at least 500× faster than colour-science, CCT/Duv under
2 µs, per spectrum. {verdict}

How: the reference side of CRI, TM-30 and SSI at the lamp's CCT comes from tables over mired
(Planckian) and from the CIE daylight basis S0, S1, S2 (docs/methods.md, "Reference side"), so
a report builds no reference spectrum and sums the samples under the test light only; those
sums (≈ 0.14 M multiply–adds) use AVX2 with FMA when the processor has it, chosen at run time,
and SSE2 otherwise. What remains is mostly CAM02-UCS of the 99 samples under the test light
(about eleven `exp`/`ln` each). See `parts_f2/*` in the same bench for the split.
<!-- lamp-metrics:end -->
"""
path = "docs/performance.md"
text = open(path, encoding="utf-8").read()
if "<!-- lamp-metrics:start -->" in text:
    text = re.sub(r"<!-- lamp-metrics:start -->.*?<!-- lamp-metrics:end -->\n", lambda m: section, text, flags=re.S)
else:
    text = text.rstrip("\n") + "\n\n" + section
open(path, "w", encoding="utf-8").write(text)
print(section)
PY
