#!/usr/bin/python3
"""Seeded generator of English-like filing prose for termtide's benchmark.

Written for this project; the words are made up or plain English, the
companies, people and figures invented. A vocabulary of a few thousand words
(plain filing words first, then made-up words from syllables) is drawn with
Zipf-like weights (rank r weighs 1/r^1.07, common practice for word
frequencies), with a long tail of rare made-up words so that the number of
distinct terms keeps growing with the corpus, more slowly than the corpus
(see TAIL_N). Sentences have capitalised starts, possessives (typographic and
ASCII apostrophes), hyphenated compounds (from a fixed list of 3,000, also
Zipf-weighted), numbers, dollar amounts,
percentages, dates, typographic quotes and dashes, parentheses and a little
non-ASCII (accented names, the euro sign). With --html the same prose is
wrapped in pages with headings, paragraphs, statement tables full of figures,
inline-XBRL-style tags, entities, a hidden XBRL header, styles and scripts.

Every document has its own seed (derived from --seed, the kind and its
index), so document i is the same whatever the corpus size: the 0.1x corpus
is the first tenth of the 1x corpus, and the 5x corpus holds the 1x corpus.
Files already present with the expected name are kept, which makes growing a
corpus cheap; the vocabulary depends on --seed only.

Usage: gen_corpus.py [--html] [--seed 7] [--doc-mb 0.5] [--jobs 2] --docs N OUTDIR
       gen_corpus.py [--html] [--seed 7] --single --mb 20 OUTFILE
Writes OUTDIR/doc-00001.txt (or .htm) ... doc-N, each about --doc-mb MB.
Nothing it writes is committed (bench/scratch/ is ignored by git).
"""
import argparse
import bisect
import itertools
import multiprocessing
import os
import random

BASE = """the of and to in a is that for on with as by at from be are was this which or an
will our we its it not have has had were been their they may could would should other
such these those more than also into any all over under during within after before
revenue revenues sales cost costs margin margins gross net income loss losses expense
expenses operating quarter quarters annual fiscal year years period periods million
billion thousand percent increase increased decrease decreased compared prior primarily
due result results customer customers supplier suppliers supply chain demand orders
backlog inventory inventories shipment shipments product products segment segments
market markets price prices pricing volume volumes growth decline risk risks factors
uncertainty uncertain litigation lawsuit claim claims settlement court regulatory
regulation compliance covenant covenants credit facility debt borrowings liquidity
capital cash flows flow investing financing dividend share shares stock equity holders
management believes expects anticipates estimates intends plans continue continued
significant material adverse impact effect effects condition conditions financial
statements report reporting control controls internal weakness remediation audit
committee board directors officer officers employees workforce plant plants facility
facilities production capacity utilization freight logistics distribution warehouse
contract contracts agreement agreements term terms rate rates interest tax taxes
benefit benefits pension obligations commitments contingencies goodwill impairment
depreciation amortization assets liabilities receivable receivables payable accrued
restructuring charges severance acquisition acquisitions divestiture integration
strategy strategic initiatives program programs development research engineering
technology systems information security cyber incident incidents disruption disruptions
shortage shortages delay delays expedite expedited premium premiums recovery recovered
improved improvement improvements strong stronger weak weaker stable steady moderate
favorable unfavorable offset partially largely substantially approximately respectively
can must do does did so if but when where while because although however therefore
new first second third fourth last next current previous total average higher lower
""".split()

PREFIXES = ["re", "un", "pre", "over", "under", "co", "sub", "inter", "non", "multi"]
SYLL = ["ka", "lo", "mer", "tis", "van", "dor", "pel", "quin", "ras", "tel", "bro", "fen",
        "gal", "hur", "jax", "lum", "nor", "pra", "sel", "tor", "ulm", "vek", "wis", "zan",
        "ab", "cre", "di", "est", "for", "gri", "ham", "ind", "ol", "pur", "st", "ven"]
SUFFIXES = ["tion", "ment", "ness", "ity", "ing", "ed", "er", "al", "ous", "ive", "ly", "s"]
# Invented names with accents, and a few non-ASCII words, for the "little
# non-ASCII" of real filings.
NAMES = ["Núñez", "Lefèvre", "Sørensen", "Müller-Oya", "Đorić", "Ibáñez", "Château-Brume",
         "Ólafsdóttir", "Kovačić", "Brønd", "Açaí-Lune", "Zoë"]
FIXED_COMPOUNDS = ["off-balance-sheet", "year-over-year", "long-term", "short-term",
                   "mark-to-market", "non-cash", "pre-tax", "after-tax", "third-party",
                   "follow-on", "work-in-process", "fixed-price"]
MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August",
          "September", "October", "November", "December"]

# Kinds of token and their share of all tokens (0 = a plain vocabulary word;
# the others are spelled out in Prose.special).
KINDS = [(0, 0.83), (1, 0.03), (2, 0.012), (3, 0.01), (4, 0.015), (5, 0.006), (6, 0.015),
         (7, 0.004), (8, 0.004), (9, 0.002), (10, 0.008), (11, 0.006), (12, 0.004),
         (13, 0.004), (14, 0.02), (15, 0.03)]

# The long tail (kind 15): rare words (names of things, technical terms,
# misspellings) drawn from 5 million made-up words with a steeper power law
# (rank r weighs r^-1.2). A fixed vocabulary would saturate and make the
# number of distinct terms stop growing; a uniform tail would make it grow
# in proportion to the corpus. This tail makes it grow like real text, more
# slowly than the corpus (Heaps' law; exponent about 0.7 here): about 97,000
# distinct terms in 200 MB, about 304,000 in 1 GB.
TAIL_N = 5_000_000
TAIL_S = 1.2
TAIL_SPACE = len(SYLL) ** 4 * (len(SUFFIXES) + 1)


def tail_word(rank):
    """The made-up word of a tail rank: four syllables and a suffix, from a
    permutation of the rank (distinct ranks give distinct words)."""
    i = (rank * 2654435761) % TAIL_SPACE
    suffix = i % (len(SUFFIXES) + 1)
    i //= len(SUFFIXES) + 1
    w = []
    for _ in range(4):
        w.append(SYLL[i % len(SYLL)])
        i //= len(SYLL)
    return "".join(w) + (SUFFIXES[suffix - 1] if suffix else "")


def make_compounds(seed, vocab, size=3000):
    """The corpus' hyphenated compounds: the common fixed ones, then pairs
    of content words (past the 60 commonest), each drawn once."""
    rng = random.Random(f"{seed}-compounds")
    out = list(FIXED_COMPOUNDS)
    seen = set(out)
    content = vocab[60:]
    cum = list(itertools.accumulate(1.0 / (r ** 1.07) for r in range(1, len(content) + 1)))
    while len(out) < size:
        a, b = rng.choices(content, cum_weights=cum, k=2)
        c = f"{a}-{b}"
        if a != b and c not in seen:
            seen.add(c)
            out.append(c)
    return out


def make_vocab(seed, size=4000):
    rng = random.Random(f"{seed}-vocab")
    words = list(dict.fromkeys(BASE))
    seen = set(words)
    while len(words) < size:
        w = "".join(rng.choice(SYLL) for _ in range(rng.randint(1, 3)))
        if rng.random() < 0.3:
            w = rng.choice(PREFIXES) + w
        if rng.random() < 0.6:
            w += rng.choice(SUFFIXES)
        if len(w) > 1 and w not in seen:
            seen.add(w)
            words.append(w)
    return words


class Prose:
    """Sentences and paragraphs from one document's random stream."""

    def __init__(self, vocab, compounds, rng):
        self.rng = rng
        self.vocab = vocab
        self.compounds = compounds
        self.ccum = list(itertools.accumulate(1.0 / (r ** 1.07) for r in range(1, len(compounds) + 1)))
        self.tail_a = TAIL_N ** (1.0 - TAIL_S) - 1.0
        self.cum = list(itertools.accumulate(1.0 / (r ** 1.07) for r in range(1, len(vocab) + 1)))
        self.kinds = [k for k, _ in KINDS]
        self.kcum = list(itertools.accumulate(w for _, w in KINDS))

    def word(self):
        return self.vocab[bisect.bisect_left(self.cum, self.rng.random() * self.cum[-1])]

    def content_word(self):
        """A word past the 60 commonest (mostly function words), for compounds,
        possessives and names of things."""
        lo = self.cum[59]
        return self.vocab[bisect.bisect_left(self.cum, lo + self.rng.random() * (self.cum[-1] - lo))]

    def special(self, kind, w):
        rng = self.rng
        if kind == 1:  # a count, with thousands separators
            return f"{rng.randint(1, 999):,}" + rng.choice(["", ",000", ",500"])
        if kind == 2:
            return f"${rng.randint(1, 900)}.{rng.randint(0, 9)} " + rng.choice(["million", "billion"])
        if kind == 3:
            return f"{rng.randint(0, 40)}.{rng.randint(0, 9)}%"
        if kind == 4:
            return self.compounds[bisect.bisect_left(self.ccum, rng.random() * self.ccum[-1])]
        if kind == 5:
            return rng.choice(FIXED_COMPOUNDS)
        if kind == 6:
            return w + "\u2019s"
        if kind == 7:
            return w + "'s"
        if kind == 8:
            return rng.choice(NAMES)
        if kind == 9:
            return f"\u20ac{rng.randint(1, 90)} million"
        if kind == 10:
            return "\u201c" + w + " " + self.content_word() + "\u201d"
        if kind == 11:
            return f"{rng.choice(MONTHS)} {rng.randint(1, 28)}, {rng.randint(2015, 2025)}"
        if kind == 12:
            return "(" + w + ")"
        if kind == 13:
            return f"({rng.randint(1, 9999):,})"
        if kind == 14:
            return w.capitalize()
        if kind == 15:
            # Inverse of the continuous power law's distribution function.
            r = int((1.0 + rng.random() * self.tail_a) ** (1.0 / (1.0 - TAIL_S)))
            return tail_word(min(max(r, 1), TAIL_N))
        return w

    def sentence(self):
        rng = self.rng
        n = rng.randint(8, 28)
        words = rng.choices(self.vocab, cum_weights=self.cum, k=n)
        kinds = rng.choices(self.kinds, cum_weights=self.kcum, k=n)
        toks = [self.special(k, self.content_word()) if k else w for w, k in zip(words, kinds)]
        toks[0] = toks[0][:1].upper() + toks[0][1:]
        r = rng.random()
        if r < 0.08:
            toks.insert(n // 2, "\u2014")
        elif r < 0.12:
            toks[n // 2] += " \u2013"
        if rng.random() < 0.35:
            toks[n // 3] += ","
        return " ".join(toks) + rng.choice(".....;?:")

    def paragraph(self):
        return " ".join(self.sentence() for _ in range(self.rng.randint(2, 7)))


def text_doc(p, target):
    parts, size = [], 0
    while size < target:
        para = p.paragraph() + "\n\n"
        parts.append(para)
        size += len(para.encode("utf-8"))
    return "".join(parts)


def esc(s):
    return s.replace("&", "&amp;").replace("<", "&lt;").replace("\u2019", "&#8217;")


def html_doc(p, target):
    rng = p.rng
    head = ("<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" "
            "xmlns:ix=\"http://www.xbrl.org/2013/inlineXBRL\"><head>"
            "<meta charset=\"utf-8\"/><title>Quarterly report</title>"
            "<style>td{padding:2px} .num{text-align:right}</style>"
            "<script>var pages = 12; function toc(){ return 'skip this script text'; }</script>"
            "</head><body>\n"
            "<div style=\"display:none\"><ix:header><ix:hidden>"
            "<ix:nonNumeric name=\"x:DocumentType\" contextRef=\"c1\">quarterly</ix:nonNumeric>"
            "</ix:hidden><ix:resources>context unit resources</ix:resources></ix:header></div>\n")
    parts = [head]
    size = len(head.encode("utf-8"))
    section = 1
    while size < target:
        r = rng.random()
        if r < 0.12:
            chunk = (f"<h2>Item {section}. {p.word().title()} &amp; {p.word().title()} "
                     f"&mdash; {p.word().title()}</h2>\n")
            section += 1
        elif r < 0.30:
            rows = [f"<tr><th></th><th>{rng.randint(2018, 2025)}</th><th>{rng.randint(2018, 2025)}"
                    f"</th><th>Change</th><th>%</th></tr>"]
            for _ in range(rng.randint(4, 14)):
                cells = "".join(
                    f"<td class=\"num\">$&nbsp;<ix:nonFraction name=\"x:{p.word().title()}\" "
                    f"contextRef=\"c{rng.randint(1, 8)}\" unitRef=\"usd\" decimals=\"-3\" "
                    f"scale=\"3\">{rng.randint(1, 99999):,}</ix:nonFraction></td>"
                    for _ in range(3))
                rows.append(f"<tr><td>{p.word().title()} {p.word()} {p.word()}</td>{cells}"
                            f"<td class=\"num\">{rng.randint(-40, 60)}.{rng.randint(0, 9)}%</td></tr>")
            chunk = "<table>" + "".join(rows) + "</table>\n"
        elif r < 0.33:
            chunk = ("<script type=\"text/javascript\">document.title = 'page "
                     f"{rng.randint(1, 300)} of the report';</script>\n")
        else:
            body = esc(p.paragraph())
            if rng.random() < 0.3:
                body = body.replace(" the ", " <b>the</b> ", 1)
            if rng.random() < 0.2:
                body = (f"<ix:nonNumeric name=\"x:{p.word().title()}TextBlock\" contextRef=\"c1\">"
                        f"{body}</ix:nonNumeric>")
            chunk = f"<p>{body}</p>\n"
        parts.append(chunk)
        size += len(chunk.encode("utf-8"))
    parts.append("</body></html>\n")
    return "".join(parts)


def one(job):
    """Writes document `index` of a corpus unless it is already there."""
    seed, html, index, target, path = job
    if os.path.exists(path):
        return
    vocab = make_vocab(seed)
    p = Prose(vocab, make_compounds(seed, vocab), random.Random(f"{seed}-{'html' if html else 'text'}-{index}"))
    data = (html_doc if html else text_doc)(p, target)
    tmp = path + ".part"
    with open(tmp, "w", encoding="utf-8") as f:
        f.write(data)
    os.replace(tmp, path)


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--seed", type=int, default=7)
    ap.add_argument("--html", action="store_true", help="HTML pages instead of plain text")
    ap.add_argument("--docs", type=int, help="number of documents")
    ap.add_argument("--doc-mb", type=float, default=0.5, help="size of each document in MB")
    ap.add_argument("--mb", type=float, help="with --single: the file's size in MB")
    ap.add_argument("--single", action="store_true", help="one file of --mb MB at OUT")
    ap.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    ap.add_argument("out")
    a = ap.parse_args()
    if a.single:
        if not a.mb:
            ap.error("--single needs --mb")
        one((a.seed, a.html, 0, int(a.mb * 1e6), a.out))
        return
    if not a.docs:
        ap.error("--docs is required")
    os.makedirs(a.out, exist_ok=True)
    ext = "htm" if a.html else "txt"
    jobs = [(a.seed, a.html, i, int(a.doc_mb * 1e6), os.path.join(a.out, f"doc-{i:05d}.{ext}"))
            for i in range(1, a.docs + 1)]
    jobs = [j for j in jobs if not os.path.exists(j[4])]
    if not jobs:
        return
    if a.jobs > 1 and len(jobs) > 1:
        with multiprocessing.Pool(a.jobs) as pool:
            for _ in pool.imap_unordered(one, jobs, chunksize=4):
                pass
    else:
        for j in jobs:
            one(j)


if __name__ == "__main__":
    main()
