#!/usr/bin/env python3
"""Write the spectral-import test corpus: crates/color/tests/data/{good,malformed}/.

All data are invented for testing (no measured or brand data). Good files follow
simple formulas that crates/color/tests/import_corpus.rs recomputes on its own:
value of column k (0-based) at wavelength wl = (k + 1) * (wl - 300) / 1000.
Malformed files hold one defect each, named by the file.

Re-run from the repository root: python3 scripts/gen_import_corpus.py
(standard library only; output is deterministic).
"""

import os

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "crates", "color", "tests", "data")
GOOD = os.path.join(ROOT, "good")
BAD = os.path.join(ROOT, "malformed")
NOTE = "# invented test data for the spectral importer, written by scripts/gen_import_corpus.py"


def value(k, wl):
    return (k + 1) * (wl - 300) / 1000


def fmt(x, decimals=4):
    return f"{x:.{decimals}f}"


def rows(wavelengths, ncols, sep=",", decimal=".", scale=1.0, wl_decimals=0, decimals=4):
    out = []
    for wl in wavelengths:
        cells = [fmt(wl, wl_decimals)] + [fmt(scale * value(k, wl), decimals) for k in range(ncols)]
        out.append(sep.join(c.replace(".", decimal) for c in cells))
    return out


def steps(start, end, step):
    return list(range(start, end + 1, step))


def write(folder, name, data):
    os.makedirs(folder, exist_ok=True)
    if isinstance(data, str):
        data = data.encode("utf-8")
    with open(os.path.join(folder, name), "wb") as f:
        f.write(data)


def text(lines, end="\n"):
    return end.join(lines) + end


def good():
    g = {}
    g["comma_header_1nm.csv"] = text([NOTE, "# lamp, relative, 1 nm", "wavelength_nm,lamp"] + rows(steps(360, 830, 1), 1))
    g["comma_space_2nm.csv"] = text(
        [NOTE, "Wavelength (nm), Key (W/m2/nm), Fill (W/m2/nm)"] + rows(steps(380, 780, 2), 2, sep=", ")
    )
    g["semicolon_decimal_comma_5nm.csv"] = text(
        [NOTE, "nm;Patch A;Patch B"] + rows(steps(380, 780, 5), 2, sep=";", decimal=",")
    )
    g["tab_decimal_comma_10nm.txt"] = text(rows(steps(380, 780, 10), 1, sep="\t", decimal=","))
    g["no_header_5nm.csv"] = text(rows(steps(380, 780, 5), 3))
    g["quoted_header.csv"] = text(
        [NOTE, '"Wavelength [nm]","Lamp ""A"", warm (W/m2/nm)","Lamp B"'] + rows(steps(380, 780, 5), 2)
    )
    # A dark sample in percent: the header, not the maximum, says percent.
    g["percent_header.csv"] = text([NOTE, "nm,R (%)"] + rows(steps(380, 780, 10), 1, scale=2.0))
    g["percent_by_max.csv"] = text([NOTE, "nm,T"] + rows(steps(380, 780, 10), 1, scale=100.0, decimals=2))
    g["decreasing_10nm.csv"] = text([NOTE, "nm,lamp"] + rows(list(reversed(steps(380, 780, 10))), 1))
    irregular = [380 + 2.5 * i + 0.1 * (i % 4) for i in range(161)]
    g["irregular_steps.csv"] = text([NOTE, "nm,a,b"] + rows(irregular, 2, wl_decimals=1, decimals=5))
    g["camera_rgb.csv"] = text([NOTE, "nm,r,g,b"] + rows(steps(380, 780, 5), 3))
    noisy = rows(steps(380, 780, 10), 1)
    for i in (0, 1, 3):  # dark noise near the blue end, within 1 % of the maximum 0.48
        noisy[i] = f"{380 + 10 * i},-0.0010"
    g["dark_noise.csv"] = text([NOTE, "nm,lamp"] + noisy)
    g["all_zero.csv"] = text([NOTE, "nm,lamp"] + [f"{wl},0" for wl in steps(380, 780, 10)])
    g["narrow_range.csv"] = text([NOTE, "nm,R"] + rows(steps(400, 700, 10), 1))
    le_text = text(
        [NOTE, "Wellenlänge (nm);Lampe (µW/cm²/nm)"] + rows(steps(380, 780, 5), 1, sep=";", decimal=","), end="\r\n"
    )
    g["utf16le_bom.csv"] = b"\xff\xfe" + le_text.encode("utf-16-le")
    be_text = text([NOTE, "nm\tfilter"] + rows(steps(380, 780, 10), 1, sep="\t"))
    g["utf16be_bom.csv"] = b"\xfe\xff" + be_text.encode("utf-16-be")
    g["crlf_bom.csv"] = b"\xef\xbb\xbf" + text([NOTE, "nm,lamp"] + rows(steps(380, 780, 5), 1), end="\r\n").encode()
    g["units_line.csv"] = text([NOTE, "nm,Key,Fill", "nm,W/m2/nm,[counts]"] + rows(steps(380, 780, 5), 2))
    g["cr_only.csv"] = text([NOTE, "nm,lamp"] + rows(steps(380, 780, 10), 1), end="\r")
    aligned = [f"{wl:>6d}   {value(0, wl):>8.4f}  {value(1, wl):>8.4f}" for wl in steps(380, 780, 5)]
    g["whitespace_separated.txt"] = text([NOTE, "#", "  nm     value_a   value_b"] + aligned)
    spreadsheet = [r + ",," for r in rows(steps(380, 780, 10), 2)]
    spreadsheet.insert(20, ",,,")
    g["trailing_separators.csv"] = text([",Patch 1,Patch 2,,"] + spreadsheet)
    sci = [f"{wl},{value(0, wl) * 1e-3:.4E}" for wl in steps(380, 780, 5)]
    g["scientific_notation.csv"] = text([NOTE, "Wavelength,Irradiance [W/(m2 nm)]"] + sci)
    for name, data in g.items():
        write(GOOD, name, data)


def bad():
    head = [NOTE, "nm,a,b"]  # lines 1-2; data start on line 3
    base = rows(steps(380, 780, 10), 2)
    b = {}

    def with_row(index, row, header=head, data=base):
        r = list(data)
        r[index] = row
        return text(header + r)

    b["empty.csv"] = b""
    b["blank_and_comments_only.csv"] = text([NOTE, "", "   ", "# nothing else"])
    b["header_only.csv"] = text(head)
    b["nan_value.csv"] = with_row(2, "400,nan,0.2")  # line 5
    b["inf_value.csv"] = with_row(3, "410,0.1,inf")  # line 6
    b["infinity_wavelength.csv"] = with_row(1, "Infinity,0.1,0.2")  # line 4
    b["empty_cell.csv"] = with_row(1, "390,,0.2")  # line 4
    b["short_row.csv"] = with_row(2, "400,0.1")  # line 5
    b["long_row.csv"] = with_row(2, "400,0.1,0.2,0.3")  # line 5
    b["text_in_cell.csv"] = with_row(4, "420,n/a,0.2")  # line 7
    b["unit_in_cell.csv"] = with_row(3, "410,0.12 W/m2,0.2")  # line 6
    b["wavelength_with_unit.csv"] = with_row(0, "380nm,0.1,0.2")  # line 3
    b["mixed_separators.csv"] = with_row(5, "430;0.1;0.2")  # line 8
    b["tab_and_semicolon_on_one_line.csv"] = with_row(2, "400\t0.1;0.2")  # line 5
    b["header_separator_differs.csv"] = text([NOTE, "nm;a;b"] + base)  # line 3
    b["decimal_comma_with_comma_separator.csv"] = text(
        [NOTE] + [f"{wl},0,{int(round(value(0, wl) * 1000)):03d}" for wl in steps(380, 780, 10)]
    )  # line 2: "0,080" read as "0", "080"
    b["decimal_comma_extra_cells.csv"] = text([NOTE, "nm,a", "380,0,08", "390,0,09"])  # line 3
    b["quoted_decimal_comma_comma_separator.csv"] = text([NOTE, "nm,a", '380,"0,08"', '390,"0,09"'])  # line 3
    b["mixed_decimal_marks.csv"] = text([NOTE, "nm;a", "380;0,08", "390;0.09"])  # line 4
    b["thousands_separator.csv"] = text([NOTE, "nm;counts", "380;1.234,5", "390;1.240,0"])  # line 3
    b["duplicate_wavelength.csv"] = with_row(6, "430,0.1,0.2")  # line 9 repeats 430
    b["non_monotonic.csv"] = with_row(6, "425,0.1,0.2")  # line 9 (after 430)
    b["large_negative.csv"] = with_row(10, "480,-0.05,0.2")  # line 13; max 0.48, 1 % = 0.0048
    b["micrometres.csv"] = text([NOTE, "um,a"] + [f"{wl / 1000:.3f},0.5" for wl in steps(380, 780, 10)])  # line 3
    b["wavelength_too_low.csv"] = text([NOTE, "nm,a", "150,0.1"] + rows(steps(380, 780, 10), 1))  # line 3
    b["wavelength_too_high.csv"] = text([NOTE, "nm,a"] + rows(steps(380, 780, 10), 1) + ["3000,0.1"])  # line 44
    b["nul_bytes.csv"] = text(head + base[:3]).encode() + b"410,0.1\x00,0.2\n"  # line 6
    b["binary_control_chars.bin"] = text(head).encode() + b"\x01\x02\x03\x04 BIN\n"  # line 3
    b["invalid_utf8.csv"] = NOTE.encode() + b"\nnm,\xb5W/cm2\n380,1\n"  # line 2 (Latin-1 micro sign)
    b["utf16_without_bom.csv"] = text(head + base).encode("utf-16-le")  # line 1
    b["utf16_odd_length.csv"] = b"\xff\xfe" + text(head + base).encode("utf-16-le")[:-1]  # line 0
    b["utf16_unpaired_surrogate.csv"] = b"\xff\xfe" + "nm,a\n380,1\n".encode("utf-16-le") + b"\x00\xd8"  # line 3
    b["utf32_bom.csv"] = b"\xff\xfe\x00\x00" + text(head).encode("utf-32-le")  # line 0
    b["long_line.csv"] = text(head + ["380," + "1" * 70000 + ",0.2"])  # line 3
    b["too_many_columns.csv"] = text(
        [NOTE, ",".join(["nm"] + [f"c{i}" for i in range(70)])] + [",".join([str(wl)] + ["0.5"] * 70) for wl in (380, 390)]
    )  # line 2
    b["camera_two_columns.csv"] = text([NOTE, "nm,r,g"] + rows(steps(380, 780, 10), 2))  # line 2
    b["camera_four_columns.csv"] = text(rows(steps(380, 780, 10), 4))  # line 1, no header
    b["only_wavelength_column.csv"] = text([NOTE] + [str(wl) for wl in steps(380, 780, 10)])  # line 2
    b["single_row.csv"] = text([NOTE, "nm,a", "550,1"])  # line 3
    b["unterminated_quote.csv"] = text([NOTE, '"nm,"a"', "380,1", "390,1"])  # line 2
    b["text_after_closing_quote.csv"] = text([NOTE, '"nm" x,a', "380,1", "390,1"])  # line 2
    b["implausibly_large.csv"] = with_row(2, "400,1e300,0.2")  # line 5
    b["text_row_after_data.csv"] = text(head + base + ["end of data,x,y"])  # line 44
    for name, data in b.items():
        write(BAD, name, data)


if __name__ == "__main__":
    good()
    bad()
