"""The third-quarter 2024 report of Hollowmere Valve Works, delivered as a full
submission in the plain-text multi-document wrapper: a header, then the main
report (HTML), a certification (EX-31.1), a press release (EX-99.1) and a
uuencoded logo (GRAPHIC)."""

import binascii
import textwrap

from render import typo

ACCESSION = "0009870011-24-000047"
FILED = "20241112"

HEADER = f"""<SEC-DOCUMENT>{ACCESSION}.txt : {FILED}
<SEC-HEADER>{ACCESSION}.hdr.sgml : {FILED}
<ACCEPTANCE-DATETIME>{FILED}163018
ACCESSION NUMBER:\t\t{ACCESSION}
CONFORMED SUBMISSION TYPE:\t10-Q
PUBLIC DOCUMENT COUNT:\t\t4
CONFORMED PERIOD OF REPORT:\t20240930
FILED AS OF DATE:\t\t{FILED}
DATE AS OF CHANGE:\t\t{FILED}

FILER:

\tCOMPANY DATA:\t
\t\tCOMPANY CONFORMED NAME:\t\t\tHOLLOWMERE VALVE WORKS, INC.
\t\tCENTRAL INDEX KEY:\t\t\t0009870011
\t\tSTANDARD INDUSTRIAL CLASSIFICATION:\tINDUSTRIAL VALVES [3491]
\t\tORGANIZATION NAME:\t\t\tOffice of Manufacturing
\t\tIRS NUMBER:\t\t\t\t880417726
\t\tSTATE OF INCORPORATION:\t\t\tDE
\t\tFISCAL YEAR END:\t\t\t1231

\tFILING VALUES:
\t\tFORM TYPE:\t\t10-Q
\t\tSEC ACT:\t\t1934 Act
\t\tSEC FILE NUMBER:\t001-99117
\t\tFILM NUMBER:\t\t241455017

\tBUSINESS ADDRESS:\t
\t\tSTREET 1:\t\t400 FOUNDRY ROW
\t\tCITY:\t\t\tFENNICK HARBOR
\t\tBUSINESS PHONE:\t\t5550142200

\tMAIL ADDRESS:\t
\t\tSTREET 1:\t\t400 FOUNDRY ROW
\t\tCITY:\t\t\tFENNICK HARBOR
</SEC-HEADER>
"""

EX31 = """EXHIBIT 31.1

CERTIFICATION OF THE PRINCIPAL EXECUTIVE OFFICER

I, Marguerite Ossenbrook, President and Chief Executive Officer of Hollowmere Valve Works, Inc., certify that:

1. I have read this quarterly report on Form 10-Q for the quarter ended September 30, 2024.

2. To my knowledge, the report contains no untrue statement of a material fact and leaves out no material fact needed to keep its statements from being misleading, and its financial statements and other financial information present fairly, in all material respects, the company's financial condition, results of operations and cash flows.

3. The company's other certifying officer and I are responsible for the company's disclosure controls and procedures and its internal control over financial reporting; we have evaluated the disclosure controls as of the end of the period and reported our conclusions in the report; and we have told the auditors and the Audit Committee of any significant deficiency or material weakness in internal control, and of any fraud involving people with a significant role in it.

Date: November 12, 2024

/s/ Marguerite Ossenbrook
Marguerite Ossenbrook
President and Chief Executive Officer
"""

EX99 = """EXHIBIT 99.1

FOR IMMEDIATE RELEASE

Hollowmere Valve Works Reports Third Quarter 2024 Results; Amends Credit Agreement; Withdraws Full-Year Outlook

FENNICK HARBOR, November 12, 2024 -- Hollowmere Valve Works, Inc. today reported revenue of ${rev_m} million for the third quarter of 2024, down {rev_chg}% from ${rev_py_m} million a year earlier, and a net loss of ${ni_m} million, or ${eps} per share, compared with net income of ${ni_py_m} million, or ${eps_py} per share, in the third quarter of 2023.

Third-quarter highlights:

  - Backlog reached a record ${backlog_m} million, but shipments were held back by a continuing shortage of body castings from the company's principal foundry, which entered a court-supervised restructuring on September 9.
  - Expedite costs were ${expedite_m} million, and the company wrote down $1.9 million of castings that failed inspection. Gross margin fell to {gm}%.
  - The company selected Ruddock & Thane Castings of Ironlee as a second source and began transferring its 40 highest-volume patterns.
  - On October 28 the company amended its credit agreement, raising the maximum net leverage ratio to 4.75 times through June 30, 2025 and adding a $15.0 million minimum liquidity covenant.

"This has been a very hard quarter for our people and our customers," said Marguerite Ossenbrook, President and Chief Executive Officer. "Our order book shows that customers still want our valves. Our job now is to get castings from two foundries instead of one, and to protect our liquidity while we do it."

Because of the uncertainty about casting supply, the company is withdrawing the full-year 2024 outlook it gave in August. The company also continues to defend the lawsuit filed by Greywether Midstream Partners, L.P. in August, which it believes is without merit.

Conference call: the company will hold a conference call at 5:00 p.m. today.

Forward-looking statements: statements in this release about casting supply, a second foundry, covenant compliance and litigation are forward-looking; actual results may differ materially because of the risks described in the company's quarterly report on Form 10-Q.

About Hollowmere: Hollowmere Valve Works, Inc. designs and builds industrial valves for LNG, pipeline, water, chemical and mining customers at plants in Fennick Harbor and Saint-Aurèle-des-Pins.

Contact: Corwin Ashdale, Director of Investor Relations, (555) 014-2290

(This release, like the company, is fictional.)
"""


def _gif():
    """A valid 1x1 two-colour GIF with a comment extension (invented bytes)."""
    comment = b"Hollowmere Valve Works logo - fictional"
    return (b"GIF89a" + b"\x01\x00\x01\x00" + b"\x80\x00\x00" +
            b"\x1f\x3a\x5c" + b"\xf2\xe8\xd0" +
            b"\x21\xfe" + bytes([len(comment)]) + comment + b"\x00" +
            b"\x2c\x00\x00\x00\x00\x01\x00\x01\x00\x00" +
            b"\x02\x02\x44\x01\x00" + b"\x3b")


def uuencode(data, name):
    lines = [f"begin 644 {name}"]
    for i in range(0, len(data), 45):
        lines.append(binascii.b2a_uu(data[i:i + 45], backtick=True).decode("ascii").rstrip("\n"))
    lines.append("`")
    lines.append("end")
    return "\n".join(lines)


def _text_part(s, width=78):
    out = []
    for para in typo(s).split("\n\n"):
        if para.startswith("  - "):
            for item in para.split("\n"):
                out.append(textwrap.fill(item.strip()[2:], width, initial_indent="  - ",
                                         subsequent_indent="    ", break_on_hyphens=False))
        elif "\n" in para:
            out.append(para)   # keep short signature lines as written
        else:
            out.append(textwrap.fill(para, width, break_on_hyphens=False))
        out.append("")
    return "\n".join(out).rstrip("\n") + "\n"


def _document(type_, seq, filename, description, body):
    return (f"<DOCUMENT>\n<TYPE>{type_}\n<SEQUENCE>{seq}\n<FILENAME>{filename}\n"
            f"<DESCRIPTION>{description}\n<TEXT>\n{body.rstrip()}\n</TEXT>\n</DOCUMENT>\n")


def wrapper(main_html, m):
    parts = [HEADER,
             _document("10-Q", 1, "hvw-20240930.htm", "QUARTERLY REPORT FOR THE PERIOD ENDED SEPTEMBER 30, 2024", main_html),
             _document("EX-31.1", 2, "hvw-ex31_1.txt", "CERTIFICATION OF THE CHIEF EXECUTIVE OFFICER", _text_part(EX31)),
             _document("EX-99.1", 3, "hvw-ex99_1.txt", "PRESS RELEASE DATED NOVEMBER 12, 2024",
                       _text_part(EX99.format_map(m))),
             _document("GRAPHIC", 4, "logo.gif", "GRAPHIC", uuencode(_gif(), "logo.gif")),
             "</SEC-DOCUMENT>\n"]
    return "".join(parts)
