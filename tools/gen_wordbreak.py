#!/usr/bin/python3
"""Generates src/wordbreak_data.h, the character tables of the segment stage.

Run from the repository root with Debian's Python:

    /usr/bin/python3 tools/gen_wordbreak.py            # writes src/wordbreak_data.h
    /usr/bin/python3 tools/gen_wordbreak.py --check    # exits 1 if the file is stale

Inputs (Debian package unicode-data, Unicode 15.0):
  /usr/share/unicode/auxiliary/WordBreakProperty.txt  Word_Break (UAX #29, table 3)
  /usr/share/unicode/emoji/emoji-data.txt             Extended_Pictographic (UTS #51),
                                                      used by rule WB3c
  /usr/share/unicode/UnicodeData.txt                  General_Category, for the letter bit
  /usr/share/unicode/PropList.txt                     Sentence_Terminal, for the terminal bit

Each code point gets one byte:
  bits 0-4  its Word_Break value (TTI_WB_OTHER .. TTI_WB_WSEGSPACE)
  bit 5     Extended_Pictographic
  bit 6     letter: General_Category L*, or Word_Break ALetter, Hebrew_Letter or
            Katakana, and not Extend/Format/ZWJ (a combining letter-like mark must
            not turn a segment such as " <mark>" into a word)
  bit 7     sentence terminal: Sentence_Terminal=Yes, plus U+2026 HORIZONTAL
            ELLIPSIS (not Sentence_Terminal in Unicode, but it ends sentences in
            the prose termtide reads)

The bytes are stored as a two-stage table: stage1[cp >> SHIFT] names a block of
2**SHIFT bytes in stage2; identical blocks are stored once. The script picks the
SHIFT that gives the smallest tables. The first 128 bytes of stage2 are the ASCII
block, so the ASCII fast path indexes stage2 directly.

The Unicode version is read from the first line of WordBreakProperty.txt, and the
other files must carry the same major.minor version.
"""

import os
import re
import sys

UCD = "/usr/share/unicode"
WB_FILE = UCD + "/auxiliary/WordBreakProperty.txt"
EMOJI_FILE = UCD + "/emoji/emoji-data.txt"
UDATA_FILE = UCD + "/UnicodeData.txt"
PROPLIST_FILE = UCD + "/PropList.txt"
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "src", "wordbreak_data.h")

MAX_CP = 0x10FFFF

# Order matters only in that OTHER is 0 (the default for unlisted code points).
WB_VALUES = [
    "Other", "CR", "LF", "Newline", "Extend", "ZWJ", "Regional_Indicator", "Format",
    "Katakana", "Hebrew_Letter", "ALetter", "Single_Quote", "Double_Quote",
    "MidNumLet", "MidLetter", "MidNum", "Numeric", "ExtendNumLet", "WSegSpace",
]
assert len(WB_VALUES) <= 32

BIT_EXTPICT = 0x20
BIT_LETTER = 0x40
BIT_TERMINAL = 0x80

EXTRA_TERMINALS = [0x2026]  # HORIZONTAL ELLIPSIS, see the module comment


def parse_ranges(path):
    """Yields (first, last, value) from a UCD property file."""
    with open(path, encoding="utf-8") as f:
        for line in f:
            line = line.split("#", 1)[0].strip()
            if not line:
                continue
            cps, value = [x.strip() for x in line.split(";")[:2]]
            if ".." in cps:
                a, b = cps.split("..")
                yield int(a, 16), int(b, 16), value
            else:
                yield int(cps, 16), int(cps, 16), value


def file_version(path):
    """The version in a UCD file's first line, e.g. 'WordBreakProperty-15.0.0.txt'."""
    with open(path, encoding="utf-8") as f:
        head = f.read(2000)
    m = re.search(r"-(\d+\.\d+\.\d+)\.txt", head)
    if m:
        return m.group(1)
    m = re.search(r"Emoji Version (\d+\.\d+)", head)
    if m:
        return m.group(1)
    sys.exit("gen_wordbreak: no version found in " + path)


def general_categories(path):
    """A dict cp -> general category, expanding the First/Last ranges."""
    gc = {}
    first = None
    with open(path, encoding="utf-8") as f:
        for line in f:
            fields = line.rstrip("\n").split(";")
            cp, name, cat = int(fields[0], 16), fields[1], fields[2]
            if name.endswith(", First>"):
                first = cp
                continue
            if name.endswith(", Last>"):
                for c in range(first, cp + 1):
                    gc[c] = cat
                first = None
                continue
            gc[cp] = cat
    return gc


def build():
    version = file_version(WB_FILE)
    major_minor = ".".join(version.split(".")[:2])
    for other in (EMOJI_FILE, PROPLIST_FILE):
        v = file_version(other)
        if not (v + ".").startswith(major_minor + "."):
            sys.exit("gen_wordbreak: %s is version %s, WordBreakProperty is %s" % (other, v, version))

    wb_index = {name: i for i, name in enumerate(WB_VALUES)}
    prop = bytearray(MAX_CP + 1)
    for a, b, value in parse_ranges(WB_FILE):
        if value not in wb_index:
            sys.exit("gen_wordbreak: unknown Word_Break value " + value)
        for c in range(a, b + 1):
            if prop[c]:
                sys.exit("gen_wordbreak: U+%04X listed twice" % c)
            prop[c] = wb_index[value]

    data = bytearray(prop)
    n_extpict = 0
    for a, b, value in parse_ranges(EMOJI_FILE):
        if value == "Extended_Pictographic":
            for c in range(a, b + 1):
                data[c] |= BIT_EXTPICT
                n_extpict += 1

    letter_wb = {wb_index["ALetter"], wb_index["Hebrew_Letter"], wb_index["Katakana"]}
    ignorable_wb = {wb_index["Extend"], wb_index["Format"], wb_index["ZWJ"]}
    gc = general_categories(UDATA_FILE)
    n_letter = 0
    for c in range(MAX_CP + 1):
        p = prop[c]
        if p in ignorable_wb:
            continue
        if p in letter_wb or gc.get(c, "Cn").startswith("L"):
            data[c] |= BIT_LETTER
            n_letter += 1

    terminals = set(EXTRA_TERMINALS)
    for a, b, value in parse_ranges(PROPLIST_FILE):
        if value == "Sentence_Terminal":
            terminals.update(range(a, b + 1))
    for c in terminals:
        if data[c] & BIT_LETTER or prop[c] in ignorable_wb:
            sys.exit("gen_wordbreak: terminal U+%04X is a letter or ignorable" % c)
        data[c] |= BIT_TERMINAL

    # Every decimal digit must be Word_Break Numeric: the tokenizer treats
    # Numeric as "digit" and relies on this.
    for c, cat in gc.items():
        if cat == "Nd" and prop[c] != wb_index["Numeric"]:
            sys.exit("gen_wordbreak: Nd U+%04X is not Numeric" % c)

    return version, data, n_extpict, n_letter, len(terminals)


def two_stage(data, shift):
    size = 1 << shift
    blocks = {}
    stage1 = []
    stage2 = bytearray()
    for start in range(0, len(data), size):
        block = bytes(data[start:start + size])
        if block not in blocks:
            blocks[block] = len(blocks)
            stage2 += block
        stage1.append(blocks[block])
    return stage1, stage2


def c_array(values, per_line=16):
    out = []
    for i in range(0, len(values), per_line):
        out.append("    " + ", ".join("%d" % v for v in values[i:i + per_line]) + ",")
    return "\n".join(out)


def render(version, data, n_extpict, n_letter, n_term):
    best = None
    for shift in range(7, 11):  # >= 7: block 0 must cover ASCII
        stage1, stage2 = two_stage(data, shift)
        width = 1 if max(stage1) < 256 else 2
        total = len(stage1) * width + len(stage2)
        if best is None or total < best[0]:
            best = (total, shift, stage1, stage2, width)
    total, shift, stage1, stage2, width = best
    s1type = "uint8_t" if width == 1 else "uint16_t"

    run_props = {WB_VALUES.index(v): bit for v, bit in
                 (("ALetter", BIT_LETTER), ("Numeric", 0x01), ("ExtendNumLet", 0x02))}
    ascii_run = [0] * 256
    for b in range(0x80):
        p = data[b] & 0x1F
        if p in run_props:
            ascii_run[b] = run_props[p]
            if p == WB_VALUES.index("ALetter"):
                assert data[b] & BIT_LETTER

    enum_lines = "\n".join(
        "    TTI_WB_%s = %d," % (name.upper(), i) for i, name in enumerate(WB_VALUES))
    lines = [
        "/* termtide — Word_Break, Extended_Pictographic, letter and sentence-terminal",
        " * classes of every code point, for the segment stage (src/segment.c).",
        " *",
        " * GENERATED by tools/gen_wordbreak.py from Debian's unicode-data files",
        " * (WordBreakProperty.txt, emoji-data.txt, UnicodeData.txt, PropList.txt,",
        " * Unicode %s). Do not edit; rerun the script. See the script for the" % version,
        " * meaning of each bit.",
        " *",
        " * %d Extended_Pictographic, %d letter and %d terminal code points;" % (n_extpict, n_letter, n_term),
        " * two-stage table, %d-byte blocks, %d bytes in all. */" % (1 << shift, total),
        "#ifndef TT_WORDBREAK_DATA_H",
        "#define TT_WORDBREAK_DATA_H",
        "",
        "#include <stdint.h>",
        "",
        '#define TT_UNICODE_VERSION "%s"' % version,
        "",
        "/* Word_Break property values (UAX #29, table 3), in bits 0-4. */",
        "enum tti_wb_prop {",
        enum_lines,
        "};",
        "",
        "#define TTI_WB_PROP_MASK 0x1Fu",
        "#define TTI_WB_EXTPICT 0x%02Xu  /* Extended_Pictographic (UTS #51) */" % BIT_EXTPICT,
        "#define TTI_WB_LETTER 0x%02Xu   /* a letter or ideograph */" % BIT_LETTER,
        "#define TTI_WB_TERMINAL 0x%02Xu /* ends a sentence */" % BIT_TERMINAL,
        "",
        "#define TTI_WB_SHIFT %d" % shift,
        "#define TTI_WB_MAX_CP 0x%X" % MAX_CP,
        "",
        "static const %s tti_wb_stage1[%d] = {" % (s1type, len(stage1)),
        c_array(stage1),
        "};",
        "",
        "/* Block 0 holds U+0000..; its first 128 bytes are the ASCII table. */",
        "static const uint8_t tti_wb_stage2[%d] = {" % len(stage2),
        c_array(stage2),
        "};",
        "",
        "/* The ASCII fast path inside a word: for each byte, 0 unless it is an ASCII",
        " * ALetter, Numeric or ExtendNumLet (which never break from one another, WB5,",
        " * WB8-WB10, WB13a, WB13b); else TTI_WB_LETTER for a letter, TTI_WB_RUN_DIGIT",
        " * for a digit, TTI_WB_RUN_OTHER for the rest ('_'). Bytes >= 0x80 are 0. */",
        "#define TTI_WB_RUN_DIGIT 0x01u",
        "#define TTI_WB_RUN_OTHER 0x02u",
        "static const uint8_t tti_wb_ascii_run[256] = {",
        c_array(ascii_run),
        "};",
        "",
        "/* The class byte of a code point (<= TTI_WB_MAX_CP). */",
        "static inline unsigned tti_wb_class(uint32_t cp)",
        "{",
        "    return tti_wb_stage2[((uint32_t)tti_wb_stage1[cp >> TTI_WB_SHIFT] << TTI_WB_SHIFT) |",
        "                         (cp & ((1u << TTI_WB_SHIFT) - 1u))];",
        "}",
        "",
        "#endif",
        "",
    ]
    assert shift >= 7, "ASCII fast path needs the first block to cover 0..0x7F"
    return "\n".join(lines)


def main():
    version, data, n_extpict, n_letter, n_term = build()
    text = render(version, data, n_extpict, n_letter, n_term)
    out = os.path.normpath(OUT)
    if len(sys.argv) > 1 and sys.argv[1] == "--check":
        with open(out, encoding="utf-8") as f:
            if f.read() != text:
                sys.exit("gen_wordbreak: %s is stale; rerun the script" % out)
        return
    tmp = out + ".tmp"
    with open(tmp, "w", encoding="utf-8") as f:
        f.write(text)
    os.replace(tmp, out)
    print("gen_wordbreak: wrote %s (Unicode %s)" % (out, version))


if __name__ == "__main__":
    main()
