"""Renderers: one small markup (DML, below) to XHTML with inline XBRL, to
older upper-case HTML, and to fixed-width plain text; plus the transcript and
submission-wrapper layouts.

DML, one block per paragraph (blank line between blocks):
  # title            document title line (centred)
  ## heading         part or item heading
  ### heading        sub-heading
  !c text            centred cover line
  - item             bullet (consecutive lines form one list)
  [table:name]       a financial table from the tables dict
  [tb:concept] ... [/tb]   wrap the blocks between in an inline-XBRL text block
  **lead.** text     bold run inside a paragraph
  -- (spaced)        em dash; straight quotes become typographic ones
"""

import html
import re
import textwrap

# ------------------------------------------------------------------ typography

def typo(s):
    s = s.replace(" -- ", "\u2014").replace("--", "\u2014")
    # apostrophes: inside or ending a word
    s = re.sub(r"(?<=[A-Za-z0-9\u00C0-\u024F])'(?=[A-Za-z])", "\u2019", s)
    s = re.sub(r"(?<=s)'(?=[\s,.;:])", "\u2019", s)
    s = re.sub(r"'(?=\d\d\b)", "\u2019", s)          # '24
    out, open_q = [], True
    for ch in s:
        if ch == '"':
            out.append("\u201c" if open_q else "\u201d")
            open_q = not open_q
        else:
            out.append(ch)
    return "".join(out)


def parse_dml(text):
    blocks = []
    paras = re.split(r"\n\s*\n", text.strip("\n"))
    for para in paras:
        lines = [ln.rstrip() for ln in para.strip("\n").split("\n") if ln.strip()]
        if not lines:
            continue
        first = lines[0].lstrip()
        if all(ln.lstrip().startswith("- ") for ln in lines):
            blocks.append(("ul", [ln.lstrip()[2:].strip() for ln in lines]))
        elif all(ln.lstrip().startswith("!c ") for ln in lines):
            for ln in lines:
                blocks.append(("center", ln.lstrip()[3:].strip()))
        elif first.startswith("### "):
            blocks.append(("h3", " ".join(lines)[4:].strip()))
        elif first.startswith("## "):
            blocks.append(("h2", " ".join(lines)[3:].strip()))
        elif first.startswith("# "):
            blocks.append(("title", " ".join(lines)[2:].strip()))
        elif first.startswith("[table:") and len(lines) == 1:
            blocks.append(("table", first[7:-1]))
        elif first.startswith("[tb:") and len(lines) == 1:
            blocks.append(("tb_open", first[4:-1]))
        elif first == "[/tb]":
            blocks.append(("tb_close", None))
        elif first == "[toc]":
            blocks.append(("toc", None))
        else:
            blocks.append(("p", " ".join(ln.strip() for ln in lines)))
    return blocks


# ------------------------------------------------------------------ HTML text

ENTITY_STYLES = {
    # literal: characters as UTF-8; numeric: &#8217; style; named: &rsquo; style
    "numeric": {"\u2019": "&#8217;", "\u2018": "&#8216;", "\u201c": "&#8220;",
                "\u201d": "&#8221;", "\u2014": "&mdash;", "\u2013": "&#8211;",
                "\u00a0": "&nbsp;"},
    "named": {"\u2019": "&rsquo;", "\u2018": "&lsquo;", "\u201c": "&ldquo;",
              "\u201d": "&rdquo;", "\u2014": "&mdash;", "\u2013": "&ndash;",
              "\u00e9": "&eacute;", "\u00e8": "&egrave;", "\u00c9": "&Eacute;",
              "\u00f1": "&ntilde;", "\u00fa": "&uacute;", "\u00f6": "&ouml;",
              "\u00e7": "&ccedil;", "\u00a0": "&nbsp;", "\u00e1": "&aacute;",
              "\u00ed": "&iacute;", "\u00f3": "&oacute;", "\u00fc": "&uuml;"},
    "literal": {"\u00a0": "&#160;"},
}


def html_text(s, style):
    s = typo(s)
    s = html.escape(s, quote=False)
    s = re.sub(r"\*\*(.+?)\*\*", r"<b>\1</b>", s)
    s = re.sub(r"\b(Item) (\d+[A-C]?\.)", "\\1\u00a0\\2", s)
    for ch, ent in ENTITY_STYLES[style].items():
        s = s.replace(ch, ent)
    return s


def plain_text(s):
    s = typo(s)
    return re.sub(r"\*\*(.+?)\*\*", r"\1", s)


# ------------------------------------------------------------------ tables
# A table: dict(title, note, cols=[(head1, head2, context)], rows=[row]).
# A row: (label, values, concept, kind) with kind one of
#   "head"  a caption row (values ignored)
#   "m"     money in thousands; "mt" the same with a rule above (subtotal)
#   "mneg"  money shown negated (an expense subtracted in the statement)
#   "eps"   per-share dollars; "sh" shares in thousands; "x" ratio
# The first money row and every "mt" row carry a dollar sign.

def fmt_val(v, kind):
    if v is None:
        return "\u2014"
    if kind == "eps":
        s = f"{abs(v):.2f}"
    elif kind == "x":
        s = f"{v:.2f}x"
    elif kind == "pct":
        s = f"{v:.1f}%"
    else:
        s = f"{abs(v):,}"
    if v == 0 and kind not in ("eps", "x", "pct"):
        return "\u2014"
    return f"({s})" if v < 0 and kind not in ("x", "pct") else s


def _display_value(v, kind):
    return -v if (kind == "mneg" and v is not None) else v


def table_xhtml(t, style, xbrl, upper=False):
    T = (lambda s: s.upper()) if upper else (lambda s: s)
    out = []
    ncol = len(t["cols"])
    out.append(f'<{T("p")} class="tt"><{T("b")}>{html_text(t["title"], style)}</{T("b")}></{T("p")}>')
    if t.get("note"):
        out.append(f'<{T("p")} class="tn">{html_text(t["note"], style)}</{T("p")}>')
    tbl_attr = 'class="fin" cellspacing="0" cellpadding="2"' if not upper else 'WIDTH="100%" BORDER="0" CELLSPACING="0" CELLPADDING="2"'
    out.append(f"<{T('table')} {tbl_attr}>")
    # header rows
    h1 = "".join(f'<{T("td")} colspan="2" class="ch">{html_text(c[0], style)}</{T("td")}>' for c in t["cols"])
    h2 = "".join(f'<{T("td")} colspan="2" class="ch u">{html_text(c[1], style)}</{T("td")}>' for c in t["cols"])
    out.append(f'<{T("tr")}><{T("td")}></{T("td")}>{h1}</{T("tr")}>')
    out.append(f'<{T("tr")}><{T("td")}></{T("td")}>{h2}</{T("tr")}>')
    dollar_done = False
    for label, values, concept, kind in t["rows"]:
        if kind == "head":
            out.append(f'<{T("tr")}><{T("td")} class="lh" colspan="{1 + 2 * ncol}">{html_text(label, style)}</{T("td")}></{T("tr")}>')
            continue
        cls = "lt" if kind == "mt" else "lb"
        cells = [f'<{T("td")} class="{cls}">{html_text(label, style)}</{T("td")}>']
        money = kind in ("m", "mt", "mneg")
        show_dollar = money and (not dollar_done or kind == "mt")
        if money:
            dollar_done = True
        if kind == "eps":
            show_dollar = True
        for (h1_, h2_, ctx), v in zip(t["cols"], values):
            dv = _display_value(v, kind)
            txt = fmt_val(dv, kind)
            core = txt.strip("()")
            if xbrl and concept and v not in (None, 0):
                unit = {"eps": "usdPerShare", "sh": "shares"}.get(kind, "usd")
                dec = {"eps": "2"}.get(kind, "-3")
                scale = "" if kind == "eps" else ' scale="3"'
                sign = ' sign="-"' if v < 0 else ""
                core = (f'<ix:nonFraction name="{concept}" contextRef="{ctx}" unitRef="{unit}" '
                        f'decimals="{dec}"{scale} format="ixt:num-dot-decimal"{sign}>{core}</ix:nonFraction>')
            if txt.startswith("("):
                txt = "(" + core + ")"
            else:
                txt = core
            dollar = "$" if show_dollar and v is not None else ""
            cells.append(f'<{T("td")} class="cur">{dollar}</{T("td")}><{T("td")} class="num">{txt}</{T("td")}>')
        out.append(f'<{T("tr")}>' + "".join(cells) + f'</{T("tr")}>')
    out.append(f"</{T('table')}>")
    return "\n".join(out)


def table_text(t, label_w=46, col_w=13):
    lines = []
    lines.append(plain_text(t["title"]).upper().center(label_w + col_w * len(t["cols"])).rstrip())
    if t.get("note"):
        lines.append(plain_text(t["note"]).center(label_w + col_w * len(t["cols"])).rstrip())
    lines.append("")
    # group header: consecutive columns sharing a first heading share one label
    groups = []
    for c in t["cols"]:
        if groups and groups[-1][0] == c[0]:
            groups[-1][1] += 1
        else:
            groups.append([c[0], 1])
    # two-line headings when a group label is long
    rows_h = [[], []]
    for label, n in groups:
        span = col_w * n
        lab = plain_text(label)
        if len(lab) > span - 2:
            cut = lab.rfind(" ", 0, span - 2)
            a, b = lab[:cut], lab[cut + 1:]
        else:
            a, b = "", lab
        rows_h[0].append(a.rjust(span))
        rows_h[1].append(b.rjust(span))
    if any(x.strip() for x in rows_h[0]):
        lines.append(" " * label_w + "".join(rows_h[0]))
    lines.append(" " * label_w + "".join(rows_h[1]))
    lines.append(" " * label_w + "".join(plain_text(c[1]).rjust(col_w) for c in t["cols"]))
    lines.append(" " * label_w + "".join(("-" * (col_w - 2)).rjust(col_w) for _ in t["cols"]))
    dollar_done = False
    for label, values, concept, kind in t["rows"]:
        lab = plain_text(label)
        if kind == "head":
            lines.append(lab)
            continue
        if kind == "mt":
            lines.append(" " * label_w + "".join(("-" * (col_w - 2)).rjust(col_w) for _ in t["cols"]))
        money = kind in ("m", "mt", "mneg")
        show_dollar = (money and (not dollar_done or kind == "mt")) or kind == "eps"
        if money:
            dollar_done = True
        row = ("  " + lab)[:label_w].ljust(label_w, ".") if len(lab) < label_w - 2 else ("  " + lab)
        if len(row) > label_w:
            lines.append(row)
            row = " " * label_w
        cells = ""
        for v in values:
            txt = fmt_val(_display_value(v, kind), kind)
            if show_dollar and v is not None:
                txt = "$" + (" " * max(1, col_w - 3 - len(txt))) + txt
            cells += txt.rjust(col_w)
        lines.append(row + cells)
    return "\n".join(lines)


# ------------------------------------------------------------------ documents

XHTML_PROLOG = ('<?xml version="1.0" encoding="utf-8"?>\n'
                '<!DOCTYPE html PUBLIC "-//W3C//DTD XHTML 1.0 Transitional//EN" '
                '"http://www.w3.org/TR/xhtml1/DTD/xhtml1-transitional.dtd">\n')

NAMESPACES = ('xmlns="http://www.w3.org/1999/xhtml" '
              'xmlns:ix="http://www.xbrl.org/2013/inlineXBRL" '
              'xmlns:ixt="http://www.xbrl.org/inlineXBRL/transformation/2020-02-12" '
              'xmlns:xbrli="http://www.xbrl.org/2003/instance" '
              'xmlns:link="http://www.xbrl.org/2003/linkbase" '
              'xmlns:xlink="http://www.w3.org/1999/xlink" '
              'xmlns:iso4217="http://www.xbrl.org/2003/iso4217" '
              'xmlns:us-gaap="http://fasb.org/us-gaap/2024" '
              'xmlns:dei="http://xbrl.sec.gov/dei/2024" '
              'xmlns:{pfx}="http://{pfx}.example/20{yy}"')

STYLE = """body {{ font-family: {font}; font-size: 10pt; margin: 2em 4em; }}
h1, h2 {{ font-size: 11pt; font-weight: bold; margin-top: 1.6em; }}
h3 {{ font-size: 10pt; font-style: italic; }}
p.c {{ text-align: center; margin: 0.2em; }}
p.tt {{ text-align: center; margin-top: 1.2em; }} p.tn {{ text-align: center; font-size: 8pt; }}
table.fin {{ border-collapse: collapse; margin: 0 auto; }}
td.num {{ text-align: right; padding-left: 0.2em; }} td.cur {{ text-align: left; padding-left: 1.2em; }}
td.ch {{ text-align: center; font-weight: bold; }} td.u {{ border-bottom: 1px solid #000; }}
td.lt {{ padding-left: 1.5em; font-weight: bold; }} td.lb {{ padding-left: 0.8em; }}
td.lh {{ font-style: italic; }}
/* styleonlyword: the extractor must never count style sheet text */
"""

SCRIPT = """//<![CDATA[
/* Table-of-contents toggle for the reading copy.
   scriptonlyword: the extractor must never count script text. */
var tocShown = false;
function toggleToc() {
  var el = document.getElementById("toc");
  if (el && el.style) { tocShown = !tocShown; el.style.display = tocShown ? "block" : "none"; }
  return tocShown && el !== null;
}
//]]>"""


def _contexts_xml(cik, ctxs):
    parts = []
    for cid, (start, end) in ctxs.items():
        if start:
            per = f"<xbrli:startDate>{start}</xbrli:startDate><xbrli:endDate>{end}</xbrli:endDate>"
        else:
            per = f"<xbrli:instant>{end}</xbrli:instant>"
        parts.append(f'<xbrli:context id="{cid}"><xbrli:entity><xbrli:identifier scheme="http://www.sec.gov/CIK">'
                     f'{cik}</xbrli:identifier></xbrli:entity><xbrli:period>{per}</xbrli:period></xbrli:context>')
    return "\n".join(parts)


def ix_header(meta):
    ctxs = meta["contexts"]
    dur = meta["dei_context"]
    hidden = (f'<ix:nonNumeric name="dei:AmendmentFlag" contextRef="{dur}">false</ix:nonNumeric>\n'
              f'<ix:nonNumeric name="dei:DocumentFiscalYearFocus" contextRef="{dur}">{meta["fy"]}</ix:nonNumeric>\n'
              f'<ix:nonNumeric name="dei:DocumentFiscalPeriodFocus" contextRef="{dur}">{meta["fp"]}</ix:nonNumeric>\n'
              f'<ix:nonNumeric name="dei:CurrentFiscalYearEndDate" contextRef="{dur}">--12-31</ix:nonNumeric>\n'
              f'<ix:nonNumeric name="dei:EntityCentralIndexKey" contextRef="{dur}">{meta["cik"]}</ix:nonNumeric>\n'
              f'<ix:nonNumeric name="dei:EntityFilerCategory" contextRef="{dur}">{meta["filer"]}</ix:nonNumeric>')
    return ('<div style="display:none">\n<ix:header>\n<ix:hidden>\n' + hidden + '\n</ix:hidden>\n'
            f'<ix:references><link:schemaRef xlink:type="simple" xlink:href="{meta["schema"]}"/></ix:references>\n'
            '<ix:resources>\n' + _contexts_xml(meta["cik"], ctxs) + '\n'
            '<xbrli:unit id="usd"><xbrli:measure>iso4217:USD</xbrli:measure></xbrli:unit>\n'
            '<xbrli:unit id="shares"><xbrli:measure>xbrli:shares</xbrli:measure></xbrli:unit>\n'
            '<xbrli:unit id="usdPerShare"><xbrli:divide><xbrli:unitNumerator><xbrli:measure>iso4217:USD</xbrli:measure>'
            '</xbrli:unitNumerator><xbrli:unitDenominator><xbrli:measure>xbrli:shares</xbrli:measure>'
            '</xbrli:unitDenominator></xbrli:divide></xbrli:unit>\n'
            '</ix:resources>\n</ix:header>\n</div>')


def _anchor(text):
    return re.sub(r"[^a-z0-9]+", "-", text.lower()).strip("-")[:40]


def render_blocks_html(blocks, tables, style, xbrl, upper=False, dei=None):
    T = (lambda s: s.upper()) if upper else (lambda s: s)
    out = []
    heads = [b[1] for b in blocks if b[0] == "h2"]
    for kind, val in blocks:
        if kind == "title":
            out.append(f'<{T("p")} class="c"><{T("b")}>{html_text(val, style)}</{T("b")}></{T("p")}>')
        elif kind == "center":
            txt = html_text(val, style)
            if dei:
                for key, (name, ctx, fmt) in dei.items():
                    if key in val:
                        esc = html_text(key, style)
                        fmt_attr = f' format="{fmt}"' if fmt else ""
                        txt = txt.replace(esc, f'<ix:nonNumeric name="{name}" contextRef="{ctx}"{fmt_attr}>{esc}</ix:nonNumeric>', 1)
            out.append(f'<{T("p")} class="c">{txt}</{T("p")}>')
        elif kind == "h2":
            if upper:
                out.append(f'<P><A NAME="{_anchor(val)}"></A><B>{html_text(val, style)}</B></P>')
            else:
                out.append(f'<h2 id="{_anchor(val)}">{html_text(val, style)}</h2>')
        elif kind == "h3":
            if upper:
                out.append(f'<P><B><I>{html_text(val, style)}</I></B></P>')
            else:
                out.append(f'<h3>{html_text(val, style)}</h3>')
        elif kind == "p":
            out.append(f'<{T("p")}>{html_text(val, style)}</{T("p")}>')
        elif kind == "ul":
            items = "".join(f'<{T("li")}>{html_text(i, style)}</{T("li")}>' for i in val)
            out.append(f'<{T("ul")}>{items}</{T("ul")}>')
        elif kind == "table":
            out.append(table_xhtml(tables[val], style, xbrl, upper))
        elif kind == "tb_open":
            if xbrl:
                concept, ctx = val.split("@")
                out.append(f'<ix:nonNumeric name="{concept}" contextRef="{ctx}" escape="true">')
        elif kind == "tb_close":
            if xbrl:
                out.append("</ix:nonNumeric>")
        elif kind == "toc":
            if upper:
                items = "".join(f'<TR><TD><A HREF="#{_anchor(h)}">{html_text(h, style)}</A></TD></TR>' for h in heads)
                out.append(f'<CENTER><B>TABLE OF CONTENTS</B></CENTER>\n<TABLE ID="toc">{items}</TABLE>')
            else:
                items = "".join(f'<li><a href="#{_anchor(h)}">{html_text(h, style)}</a></li>' for h in heads)
                out.append(f'<div id="toc"><p class="c"><b>Table of Contents</b></p><ul>{items}</ul></div>')
    return "\n".join(out)


def xhtml_document(title, body_dml, tables, meta, style="numeric", xbrl=True, font="Times New Roman, serif"):
    blocks = parse_dml(body_dml)
    dei = meta.get("dei_visible") if xbrl else None
    body = render_blocks_html(blocks, tables, style, xbrl, dei=dei)
    ns = NAMESPACES.format(pfx=meta["prefix"], yy=meta["fy"][2:])
    head = (f'<head>\n<meta http-equiv="Content-Type" content="text/html; charset=utf-8"/>\n'
            f'<title>{html_text(title, style)}</title>\n'
            f'<style type="text/css">\n{STYLE.format(font=font)}</style>\n'
            f'<script type="text/javascript">\n{SCRIPT}\n</script>\n</head>')
    hdr = ix_header(meta) + "\n" if xbrl else ""
    return (XHTML_PROLOG + f"<html {ns}>\n" + head + "\n<body>\n" + hdr +
            "<!-- commentonlyword: an invented demonstration document; every company, person, "
            "product and place in it is fictional. -->\n" + body + "\n</body>\n</html>\n")


def html4_document(title, body_dml, tables, style="named"):
    blocks = parse_dml(body_dml)
    body = render_blocks_html(blocks, tables, style, xbrl=False, upper=True)
    return ('<!DOCTYPE HTML PUBLIC "-//W3C//DTD HTML 4.01 Transitional//EN">\n<HTML>\n<HEAD>\n'
            '<META HTTP-EQUIV="Content-Type" CONTENT="text/html; charset=utf-8">\n'
            f'<TITLE>{html_text(title, style)}</TITLE>\n'
            f'<STYLE TYPE="text/css">\n<!--\n{STYLE.format(font="Arial, sans-serif")}-->\n</STYLE>\n'
            f'<SCRIPT LANGUAGE="JavaScript" TYPE="text/javascript">\n<!--\n{SCRIPT}\n// -->\n</SCRIPT>\n'
            '</HEAD>\n<BODY BGCOLOR="#FFFFFF">\n'
            '<!-- commentonlyword: an invented demonstration document; every company, person, '
            'product and place in it is fictional. -->\n'
            f'<FONT FACE="Arial" SIZE="2">\n{body}\n</FONT>\n</BODY>\n</HTML>\n')


def text_document(body_dml, tables, width=72):
    blocks = parse_dml(body_dml)
    out = []
    for kind, val in blocks:
        if kind == "title":
            out.append(plain_text(val).upper().center(width).rstrip())
            out.append("")
        elif kind == "center":
            out.append(plain_text(val).center(width).rstrip())
        elif kind == "h2":
            out.append("")
            out.append(plain_text(val).upper())
            out.append("")
        elif kind == "h3":
            out.append(plain_text(val))
            out.append("")
        elif kind == "p":
            out.append(textwrap.fill(plain_text(val), width, initial_indent="     ", break_on_hyphens=False,
                                     break_long_words=False))
            out.append("")
        elif kind == "ul":
            for i in val:
                out.append(textwrap.fill(plain_text(i), width, initial_indent="  *  ", subsequent_indent="     ",
                                         break_on_hyphens=False, break_long_words=False))
            out.append("")
        elif kind == "table":
            out.append(table_text(tables[val]))
            out.append("")
        elif kind == "toc":
            pass
    text = "\n".join(out)
    return re.sub(r"\n{3,}", "\n\n", text).strip("\n") + "\n"


def transcript_text(header_lines, turns, curly=True, width=0):
    """turns: list of (speaker or None for a section heading, text)."""
    conv = typo if curly else (lambda s: s.replace(" -- ", " - "))
    out = [conv(h) for h in header_lines] + [""]
    for speaker, text in turns:
        if speaker is None:
            out += ["", conv(text), ""]
            continue
        paras = [p.strip() for p in re.split(r"\n\s*\n", text.strip()) if p.strip()]
        paras = [" ".join(l.strip() for l in p.split("\n")) for p in paras]
        out.append(f"{speaker}: {conv(paras[0])}")
        for p in paras[1:]:
            out.append("")
            out.append(conv(p))
        out.append("")
    return re.sub(r"\n{3,}", "\n\n", "\n".join(out)).strip("\n") + "\n"
