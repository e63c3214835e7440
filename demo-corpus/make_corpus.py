#!/usr/bin/python3
"""Writes the termtide demo corpus: an invented scenario about two fictional
companies, told through quarterly and annual reports and earnings call
transcripts (see README.md). Deterministic: the same script writes the same
bytes. Run from anywhere:

    /usr/bin/python3 demo-corpus/make_corpus.py          # write the files
    /usr/bin/python3 demo-corpus/make_corpus.py --check  # also print word counts

All prose lives in gen/*.py; all figures come from gen/model.py.
"""

import gzip
import html
import os
import re
import sys

sys.dont_write_bytecode = True
HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "gen"))

import model          # noqa: E402
import metrics        # noqa: E402
import render         # noqa: E402
import tables         # noqa: E402
import hollowmere_reports as HR     # noqa: E402
import hollowmere_annual as HA      # noqa: E402
import hollowmere_calls as HC       # noqa: E402
import hollowmere_wrapper as HW     # noqa: E402
import ambleworth_reports as AR     # noqa: E402
import ambleworth_annual as AA      # noqa: E402
import ambleworth_calls as AC       # noqa: E402

MANIFEST = []   # (path, entity, period, kind)


def write(rel, data, entity, period, kind):
    path = os.path.join(HERE, rel)
    os.makedirs(os.path.dirname(path), exist_ok=True)
    if isinstance(data, str):
        data = data.encode("utf-8")
    with open(path, "wb") as f:
        f.write(data)
    MANIFEST.append((rel, entity, period, kind))


def xbrl_meta(mod, period, annual):
    if annual:
        y = period[2:]
        ctx = tables.contexts_annual(y)
        fp, dei_ctx, end = "FY", "c-fy", f"{y}-12-31"
        doc_type, end_text = "10-K", f"December 31, {y}"
    else:
        y, q = period.split("-")
        ctx = tables.contexts_quarter(period)
        fp, dei_ctx, end = q, "c-q", ctx["c-i"][1]
        doc_type, end_text = "10-Q", f"{model.QUARTER_END[q]}, {y}"
    return dict(cik=mod.CIK, prefix=mod.PREFIX, filer=mod.FILER, fy=y, fp=fp, contexts=ctx, dei_context=dei_ctx,
                schema=f"{mod.PREFIX}-{end.replace('-', '')}.xsd",
                dei_visible={doc_type: ("dei:DocumentType", dei_ctx, None),
                             end_text: ("dei:DocumentPeriodEndDate", dei_ctx, "ixt:date-monthname-day-year-en"),
                             mod.NAME.upper(): ("dei:EntityRegistrantName", dei_ctx, None)})


def quarter_tables(co, p):
    return {"is": tables.income_quarter(co, p), "bs": tables.balance(co, p), "inv": tables.inventory(co, p)}


def annual_tables(co, year, acquisitions=None):
    cf, _ = tables.cash_flow(co, year, acquisitions=acquisitions)
    return {"is": tables.income_annual(co, year), "bs": tables.balance(co, f"{year}-Q4", annual=True),
            "cf": cf}


# ------------------------------------------------------------------ Hollowmere

def build_hollowmere():
    co = model.HOLLOWMERE
    ent = "hollowmere"
    # FY2023 annual report: old-style plain text in Windows-1252
    m = metrics.annual_metrics(co, 2023)
    dml = HA.annual_dml("FY2023", m)
    txt = render.text_document(dml, annual_tables(co, 2023))
    txt = txt.replace("\n", "\r\n")   # as the older filings were delivered
    write("hollowmere/FY2023-annual-report.txt", txt.encode("cp1252"), ent, "FY2023", "annual-report")

    for p in ("2024-Q1", "2024-Q2", "2025-Q1", "2025-Q2", "2025-Q3"):
        m = metrics.quarter_metrics(co, p)
        body = HR.quarterly_dml(p, m)
        y, q = p.split("-")
        title = f"Hollowmere Valve Works, Inc. -- Form 10-Q for the quarter ended {m['qend']}"
        doc = render.xhtml_document(title, body, quarter_tables(co, p), xbrl_meta(HR, p, False), style="numeric")
        write(f"hollowmere/{p}-quarterly-report.htm", doc, ent, p, "quarterly-report")

    # 2024-Q3: the full submission in the multi-document wrapper
    p = "2024-Q3"
    m = metrics.quarter_metrics(co, p)
    body = HR.quarterly_dml(p, m)
    main_doc = render.html4_document(f"Hollowmere Valve Works, Inc. -- Form 10-Q for the quarter ended {m['qend']}",
                                     body, quarter_tables(co, p), style="named")
    write(f"hollowmere/{p}-quarterly-report.txt", HW.wrapper(main_doc, m), ent, p, "quarterly-report")

    for y in (2024, 2025):
        m = metrics.annual_metrics(co, y)
        body = HA.annual_dml(f"FY{y}", m)
        title = f"Hollowmere Valve Works, Inc. -- Form 10-K for the fiscal year ended December 31, {y}"
        doc = render.xhtml_document(title, body, annual_tables(co, y), xbrl_meta(HR, f"FY{y}", True),
                                    style="numeric")
        write(f"hollowmere/FY{y}-annual-report.htm", doc, ent, f"FY{y}", "annual-report")

    for p in HC.CALLS:
        m = metrics.quarter_metrics(co, p)
        text = HC.transcript(p, m)
        if p == "2023-Q4":
            write(f"hollowmere/{p}-call-transcript.txt.gz", gzip.compress(text.encode("utf-8"), mtime=0),
                  ent, p, "call-transcript")
        else:
            write(f"hollowmere/{p}-call-transcript.txt", text, ent, p, "call-transcript")


# ------------------------------------------------------------------ Ambleworth

def build_ambleworth():
    co = model.AMBLEWORTH
    ent = "ambleworth"
    acq = {2024: (41600, 8000)}
    m = metrics.annual_metrics(co, 2023)
    doc = render.html4_document("Ambleworth Bioprocess Corp. -- Annual Report on Form 10-K for 2023",
                                AA.annual_dml("FY2023", m), annual_tables(co, 2023), style="named")
    write("ambleworth/FY2023-annual-report.htm", doc, ent, "FY2023", "annual-report")

    for p in ("2024-Q1", "2024-Q2", "2024-Q3"):
        m = metrics.quarter_metrics(co, p)
        doc = render.html4_document(f"Ambleworth Bioprocess Corp. -- Quarterly Report for the period ended {m['qend']}",
                                    AR.quarterly_dml(p, m), quarter_tables(co, p), style="named")
        write(f"ambleworth/{p}-quarterly-report.htm", doc, ent, p, "quarterly-report")
    for p in ("2025-Q1", "2025-Q2", "2025-Q3"):
        m = metrics.quarter_metrics(co, p)
        title = f"Ambleworth Bioprocess Corp. -- Form 10-Q for the quarter ended {m['qend']}"
        doc = render.xhtml_document(title, AR.quarterly_dml(p, m), quarter_tables(co, p),
                                    xbrl_meta(AR, p, False), style="literal", font="Georgia, serif")
        write(f"ambleworth/{p}-quarterly-report.htm", doc, ent, p, "quarterly-report")
    for y in (2024, 2025):
        m = metrics.annual_metrics(co, y)
        title = f"Ambleworth Bioprocess Corp. -- Form 10-K for the fiscal year ended December 31, {y}"
        doc = render.xhtml_document(title, AA.annual_dml(f"FY{y}", m), annual_tables(co, y, acq),
                                    xbrl_meta(AA, f"FY{y}", True), style="literal", font="Georgia, serif")
        write(f"ambleworth/FY{y}-annual-report.htm", doc, ent, f"FY{y}", "annual-report")

    for p in AC.CALLS:
        m = metrics.quarter_metrics(co, p)
        text = AC.transcript(p, m)
        if p == "2023-Q3":   # exported by a tool that writes a UTF-8 byte-order mark
            write(f"ambleworth/{p}-call-transcript.txt", b"\xef\xbb\xbf" + text.encode("utf-8"),
                  ent, p, "call-transcript")
        elif p == "2023-Q4":
            write(f"ambleworth/{p}-call-transcript.txt.gz", gzip.compress(text.encode("utf-8"), mtime=0),
                  ent, p, "call-transcript")
        else:
            write(f"ambleworth/{p}-call-transcript.txt", text, ent, p, "call-transcript")


# ------------------------------------------------------------------ checks

def visible_words(rel):
    """A rough reading of what a reader sees, for the word-count check only."""
    raw = open(os.path.join(HERE, rel), "rb").read()
    if rel.endswith(".gz"):
        raw = gzip.decompress(raw)
    raw = raw[3:] if raw.startswith(b"\xef\xbb\xbf") else raw
    text = raw.decode("cp1252") if rel.endswith("FY2023-annual-report.txt") else raw.decode("utf-8")
    if rel.endswith(".htm") or "<SEC-DOCUMENT>" in text[:200]:
        text = re.sub(r"(?is)<(script|style)\b.*?</\1>", " ", text)
        text = re.sub(r'(?is)<div style="display:none">.*?</div>', " ", text)
        text = re.sub(r"(?s)<!--.*?-->", " ", text)
        text = re.sub(r"(?m)^begin 644.*?^end$", " ", text, flags=re.S)
        text = html.unescape(re.sub(r"<[^>]+>", " ", text))
    # words are runs of letters (with inner apostrophes), so figures do not count
    return len(re.findall(r"[^\W\d_]+(?:['\u2019][^\W\d_]+)*", text))


def main():
    build_hollowmere()
    build_ambleworth()
    MANIFEST.sort()
    with open(os.path.join(HERE, "manifest.tsv"), "w", encoding="utf-8", newline="\n") as f:
        f.write("path\tentity\tperiod\tkind\n")
        for row in MANIFEST:
            f.write("\t".join(row) + "\n")
    if "--check" in sys.argv:
        total = 0
        for rel, ent, per, kind in MANIFEST:
            n = visible_words(rel)
            total += n
            flag = "" if 800 <= n <= 3000 else "  <-- outside 800..3000"
            print(f"{n:6d}  {rel}{flag}")
        print(f"{total:6d}  words in {len(MANIFEST)} documents")


if __name__ == "__main__":
    main()
