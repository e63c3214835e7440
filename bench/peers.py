#!/usr/bin/python3
"""The Python peers of termtide's benchmark: the term tables an analyst would
otherwise script, each written to OUT as "term<TAB>count" lines.

    peers.py re      OUT FILE...   re + collections.Counter, termtide's word rules
    peers.py re-w    OUT FILE...   re + collections.Counter, the short idiom \\w+
    peers.py html    OUT FILE...   html.parser + re + collections.Counter, termtide's rules
    peers.py sklearn OUT FILE...   scikit-learn CountVectorizer, default settings

"termtide's word rules" are the rules `termtide count --help` states, written
again independently here (as in the Python cross-check of tests/test_cli.c,
widened from ASCII to Unicode letters and the typographic apostrophe): a word
is a run of letters and digits, joined into one word by a hyphen, by an
apostrophe (' or U+2019) between letters, or by . or , between digits;
case-folded; a possessive 's dropped; typographic apostrophes unified; words
without a letter are numbers and left out. Stop-words are not removed, so the
table equals `termtide count --no-stopwords --total-only`; bench/README.md
says where the rules and UAX #29 could part (nowhere in the generated corpus).

The per-term clean-up (apostrophes, possessives, numbers) runs once per
distinct term, not per token, which is the fast way to write it in Python.
"""
import collections
import re
import sys

WORD = re.compile(r"[^\W_]+(?:(?:-|(?<=[^\W\d_])['\u2019](?=[^\W\d_])|(?<=\d)[.,](?=\d))[^\W_]+)*")
LETTER = re.compile(r"[^\W\d_]")


def finish(raw):
    """Applies the per-term rules to a Counter of raw words."""
    out = collections.Counter()
    for t, n in raw.items():
        t = t.replace("\u2019", "'")
        if t.endswith("'s"):
            t = t[:-2]
        if LETTER.search(t):
            out[t] += n
    return out


def count_re(files):
    raw = collections.Counter()
    for path in files:
        with open(path, encoding="utf-8") as f:
            raw.update(WORD.findall(f.read().casefold()))
    return finish(raw)


def count_re_w(files):
    c = collections.Counter()
    pat = re.compile(r"\w+")
    for path in files:
        with open(path, encoding="utf-8") as f:
            c.update(pat.findall(f.read().lower()))
    return c


def count_html(files):
    from html.parser import HTMLParser

    # What a reader does not see: scripts, styles, the page title and the
    # inline XBRL header (hidden facts). Text pieces are joined by a newline,
    # as table cells and blocks end words.
    skip_tags = {"script", "style", "title", "ix:header"}

    class Text(HTMLParser):
        def __init__(self):
            super().__init__(convert_charrefs=True)
            self.skip = 0
            self.parts = []

        def handle_starttag(self, tag, attrs):
            if tag in skip_tags:
                self.skip += 1

        def handle_endtag(self, tag):
            if tag in skip_tags and self.skip:
                self.skip -= 1

        def handle_data(self, data):
            if not self.skip:
                self.parts.append(data)

    raw = collections.Counter()
    for path in files:
        p = Text()
        with open(path, encoding="utf-8") as f:
            p.feed(f.read())
        p.close()
        raw.update(WORD.findall("\n".join(p.parts).casefold()))
    return finish(raw)


def count_sklearn(files):
    from sklearn.feature_extraction.text import CountVectorizer

    v = CountVectorizer(input="filename", encoding="utf-8")
    x = v.fit_transform(files)
    sums = x.sum(axis=0).A1
    return dict(zip(v.get_feature_names_out(), (int(n) for n in sums)))


def search_re(rules_file, files):
    """Hits per rule of a termtide watch-list (name<TAB>pattern lines whose
    patterns are plain phrases with \\s+), by Python's re, caseless, over each
    file's text (the bench corpus has one paragraph a line, so line breaks
    never split a phrase)."""
    rules = []
    for line in open(rules_file, encoding="utf-8"):
        if line.strip() and not line.startswith("#"):
            name, pat = line.rstrip("\n").split("\t")[:2]
            rules.append((name, re.compile(pat, re.IGNORECASE)))
    hits = {name: 0 for name, _ in rules}
    for path in files:
        text = open(path, encoding="utf-8").read()
        for name, rx in rules:
            hits[name] += sum(1 for _ in rx.finditer(text))
    return hits


def main():
    if len(sys.argv) < 4:
        sys.exit(__doc__)
    mode, out, files = sys.argv[1], sys.argv[2], sys.argv[3:]
    if mode == "search":
        table = search_re(files[0], files[1:])
        with open(out, "w", encoding="utf-8") as f:
            for name in sorted(table):
                f.write(f"{name}\t{table[name]}\n")
        return
    fn = {"re": count_re, "re-w": count_re_w, "html": count_html, "sklearn": count_sklearn}[mode]
    table = fn(files)
    with open(out, "w", encoding="utf-8") as f:
        for term, n in sorted(table.items(), key=lambda kv: (-kv[1], kv[0])):
            f.write(f"{term}\t{n}\n")


if __name__ == "__main__":
    main()
