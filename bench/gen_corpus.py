#!/usr/bin/python3
"""Seeded generator of English-like filing prose for termtide's benchmark.

Written for this project. Draws words from a vocabulary of a few thousand
made-up and common English words with Zipf-like weights (weight of rank r is
1/r^1.07), builds sentences with capitalised starts, possessives, hyphenated
compounds, numbers, amounts and percentages, typographic quotes and dashes,
and a little non-ASCII (accented names, the euro sign). With --html it wraps
the same prose in pages with headings, paragraphs, statement tables full of
figures, inline-XBRL-style tags, entities and scripts.

Usage: gen_corpus.py --mb 100 --seed 7 [--html] [--docs N] OUTDIR
Writes OUTDIR/doc-00001.txt (or .htm) ... totalling about MB megabytes.
Nothing it writes is committed.
"""
import argparse
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
""".split()

PREFIXES = ["re", "un", "pre", "over", "under", "co", "sub", "inter", "non", "multi"]
SYLL = ["ka", "lo", "mer", "tis", "van", "dor", "pel", "quin", "ras", "tel", "bro", "fen",
        "gal", "hur", "jax", "lum", "nor", "pra", "sel", "tor", "ulm", "vek", "wis", "zan"]
SUFFIXES = ["tion", "ment", "ness", "ity", "ing", "ed", "er", "al", "ous", "ive", "ly", "s"]
NAMES = ["Núñez", "Lefèvre", "Sørensen", "Müller-Oya", "Đorić", "Ibáñez", "Château-Brume"]


def make_vocab(rng, size):
    words = list(dict.fromkeys(BASE))
    while len(words) < size:
        w = "".join(rng.choice(SYLL) for _ in range(rng.randint(1, 3)))
        if rng.random() < 0.3:
            w = rng.choice(PREFIXES) + w
        if rng.random() < 0.6:
            w += rng.choice(SUFFIXES)
        words.append(w)
    return words


def zipf_weights(n, s=1.07):
    return [1.0 / (r ** s) for r in range(1, n + 1)]


class Prose:
    def __init__(self, seed, vocab_size=4000):
        self.rng = random.Random(seed)
        self.vocab = make_vocab(self.rng, vocab_size)
        self.cum = []
        total = 0.0
        for w in zipf_weights(len(self.vocab)):
            total += w
            self.cum.append(total)
        self.total = total

    def word(self):
        import bisect
        return self.vocab[bisect.bisect_left(self.cum, self.rng.random() * self.total)]

    def token(self):
        rng = self.rng
        r = rng.random()
        if r < 0.03:
            return f"{rng.randint(1, 999):,}{rng.choice(['', ',000'])}"
        if r < 0.04:
            return f"${rng.randint(1, 900)}.{rng.randint(0, 9)} million"
        if r < 0.05:
            return f"{rng.randint(1, 40)}.{rng.randint(0, 9)}%"
        if r < 0.06:
            return self.word() + "-" + self.word()
        if r < 0.07:
            return self.word() + "\u2019s"
        if r < 0.075:
            return rng.choice(NAMES)
        if r < 0.077:
            return f"\u20ac{rng.randint(1, 90)} million"
        if r < 0.085:
            return "\u201c" + self.word() + "\u201d"
        return self.word()

    def sentence(self):
        n = self.rng.randint(8, 28)
        toks = [self.token() for _ in range(n)]
        toks[0] = toks[0][:1].upper() + toks[0][1:]
        if self.rng.random() < 0.1:
            toks.insert(n // 2, "\u2014")
        if self.rng.random() < 0.3:
            toks[n // 3] += ","
        return " ".join(toks) + self.rng.choice([".", ".", ".", ";", "?"])

    def paragraph(self):
        return " ".join(self.sentence() for _ in range(self.rng.randint(3, 8)))


def html_page(p, target):
    rng = p.rng
    parts = ["<!DOCTYPE html>\n<html xmlns:ix=\"http://www.xbrl.org/2013/inlineXBRL\"><head>"
             "<title>Quarterly report</title><style>td{padding:2px}</style>"
             "<script>var pages = 12; function toc(){ return 'skip'; }</script></head><body>\n"
             "<div style=\"display:none\"><ix:header><ix:hidden>hidden context values</ix:hidden>"
             "</ix:header></div>\n"]
    size = sum(len(x) for x in parts)
    section = 1
    while size < target:
        if rng.random() < 0.15:
            chunk = f"<h2>Item {section}. {p.word().title()} &amp; {p.word().title()}</h2>\n"
            section += 1
        elif rng.random() < 0.2:
            rows = []
            for _ in range(rng.randint(4, 12)):
                cells = "".join(
                    f"<td><ix:nonFraction name=\"x:{p.word()}\" contextRef=\"c1\" unitRef=\"usd\" "
                    f"decimals=\"-3\">{rng.randint(1, 99999):,}</ix:nonFraction></td>"
                    for _ in range(4))
                rows.append(f"<tr><td>{p.word().title()} {p.word()}</td>{cells}</tr>")
            chunk = "<table>" + "".join(rows) + "</table>\n"
        else:
            chunk = "<p>" + p.paragraph().replace("&", "&amp;").replace("\u2019", "&#8217;") + "</p>\n"
        parts.append(chunk)
        size += len(chunk)
    parts.append("</body></html>\n")
    return "".join(parts)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--mb", type=float, default=10)
    ap.add_argument("--seed", type=int, default=7)
    ap.add_argument("--docs", type=int, default=0, help="number of documents (default MB/0.5)")
    ap.add_argument("--html", action="store_true")
    ap.add_argument("--single", action="store_true", help="one file of MB megabytes")
    ap.add_argument("outdir")
    a = ap.parse_args()
    os.makedirs(a.outdir, exist_ok=True)
    p = Prose(a.seed)
    total = int(a.mb * 1e6)
    docs = 1 if a.single else (a.docs or max(1, int(a.mb / 0.5)))
    per = total // docs
    for i in range(docs):
        path = os.path.join(a.outdir, f"doc-{i + 1:05d}." + ("htm" if a.html else "txt"))
        with open(path, "w", encoding="utf-8") as f:
            if a.html:
                f.write(html_page(p, per))
            else:
                written = 0
                while written < per:
                    para = p.paragraph() + "\n\n"
                    f.write(para)
                    written += len(para.encode("utf-8"))


if __name__ == "__main__":
    main()
