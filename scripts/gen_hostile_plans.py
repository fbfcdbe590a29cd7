#!/usr/bin/env python3
"""Write the hostile plan-file corpus used by crates/plan/tests/hostile_files.rs.

Each file is damaged or malicious in one way; loading it must give a clear,
one-line error (or, for the last group, load and then fail `check`), never a
panic or a hang. The expected message for each file is listed in the test.

Re-run with plain Python 3 (standard library only):
    python3 scripts/gen_hostile_plans.py
"""

import os
import random

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
OUT = os.path.join(ROOT, "crates", "plan", "tests", "data", "hostile")
DEMO = os.path.join(ROOT, "assets", "demo", "plans", "cafe-interview.ron")

SOURCE = (
    "Source(id: {i}, name: \"S{i}\", role: Key, lamp: Library(\"tungsten-3200\"), level_lux: 100.0, "
    "enabled: true, solo: false, gels: [], dimmer: 1.0, locked: false)"
)


def plan(body):
    return "Plan(\n    format_version: 1,\n" + body + ")\n"


def main():
    os.makedirs(OUT, exist_ok=True)
    with open(DEMO, encoding="utf-8") as f:
        demo = f.read()
    files = {
        "truncated.ron": demo[: len(demo) * 2 // 5],
        "empty.ron": "",
        "whitespace-only.ron": "  \n\t\n",
        "wrong-type-level.ron": plan("    sources: [Source(id: 1, name: \"Key\", level_lux: \"bright\")],\n"),
        "wrong-type-sources.ron": plan("    sources: 5,\n"),
        "unknown-role.ron": plan("    sources: [Source(id: 1, name: \"Key\", role: Spotlight)],\n"),
        "unknown-lamp-kind.ron": plan("    sources: [Source(id: 1, lamp: Candle(3)) ],\n"),
        "negative-id.ron": plan("    sources: [Source(id: -1)],\n"),
        "huge-integer.ron": plan("    sources: [Source(id: 99999999999999999999999999)],\n"),
        "duplicate-field.ron": plan("    name: \"a\",\n    name: \"b\",\n"),
        "trailing-garbage.ron": plan("    name: \"a\",\n") + "Plan(format_version: 1)\n",
        "not-a-plan.ron": "CameraSettings(camera: Colorimetric)\n",
        "json.ron": "{\"format_version\": 1, \"name\": \"x\"}\n",
        "unterminated-string.ron": plan("    name: \"no end,\n"),
        "future-version.ron": "Plan(\n    format_version: 2,\n    name: \"From the future\",\n)\n",
        "version-as-text.ron": "Plan(format_version: \"1\")\n",
        "negative-version.ron": "Plan(format_version: -1)\n",
        "no-version.ron": "Plan(name: \"Unversioned\")\n",
        "deep-nesting.ron": "Plan(format_version: 1, notes: " + "[" * 5000 + "]" * 5000 + ")\n",
        "deep-nesting-unknown-field.ron": "Plan(format_version: 1, extra: " + "(" * 5000 + ")" * 5000 + ")\n",
        "too-many-sources.ron": plan(
            "    sources: [\n" + "".join("        " + SOURCE.format(i=i) + ",\n" for i in range(1, 66)) + "    ],\n"
        ),
        "too-many-gels.ron": plan(
            "    sources: [Source(id: 1, gels: ["
            + ", ".join("GelLayer(gel: Library(\"nd-03\"), strength: 1.0)" for _ in range(9))
            + "])],\n"
        ),
        "huge-array.ron": plan(
            "    custom: CustomLibrary(lamps: [CustomSpectrum(id: \"big\", wavelengths_nm: ["
            + ",".join(str(380 + i) for i in range(12000))
            + "], values: ["
            + ",".join("1" for _ in range(12000))
            + "])]),\n"
        ),
        "long-name.ron": plan("    name: \"" + "x" * 300 + "\",\n"),
    }
    for name, text in files.items():
        with open(os.path.join(OUT, name), "w", encoding="utf-8", newline="\n") as f:
            f.write(text)
    binary = {
        "non-utf8.ron": b"Plan(\n    format_version: 1,\n    name: \"caf\xe9\",\n)\n",
        "utf16.ron": "\ufeffPlan(format_version: 1)\n".encode("utf-16-le"),
        "random-bytes.ron": bytes(random.Random(1).getrandbits(8) for _ in range(4096)),
        "nul-bytes.ron": b"Plan(\x00\x00\x00format_version: 1)",
    }
    for name, data in binary.items():
        with open(os.path.join(OUT, name), "wb") as f:
            f.write(data)
    # These load, but `lampwright check` must refuse them.
    loads = {
        "check-nan-level.ron": plan("    sources: [Source(id: 1, name: \"Key\", level_lux: NaN)],\n"),
        "check-infinite-strength.ron": plan(
            "    sources: [Source(id: 1, name: \"Key\", gels: [GelLayer(gel: Library(\"cto-full\"), strength: inf)])],\n"
        ),
        "check-unknown-ids.ron": plan(
            "    sources: [Source(id: 1, name: \"Key\", lamp: Library(\"xyz\"))],\n"
            "    subjects: [SubjectEntry(subject: Library(\"unicorn\"))],\n"
        ),
        "check-zone-missing-source.ron": plan(
            "    sources: [Source(id: 1, name: \"Key\")],\n"
            "    zones: [Zone(id: 1, name: \"Wall\", reach: [ZoneReach(source: 7, level: AsSource)])],\n"
        ),
        "check-custom-length-mismatch.ron": plan(
            "    custom: CustomLibrary(gels: [CustomSpectrum(id: \"g\", wavelengths_nm: [380.0, 580.0, 780.0], values: [0.5, 0.5])]),\n"
        ),
    }
    for name, text in loads.items():
        with open(os.path.join(OUT, name), "w", encoding="utf-8", newline="\n") as f:
            f.write(text)


if __name__ == "__main__":
    main()
