"""Placeholder values for the prose: every figure a sentence quotes comes from
model.py through here, already formatted, so text and tables cannot drift."""

from decimal import Decimal, ROUND_HALF_UP

from model import QUARTER_END, QUARTER_WORD, QUARTERS


def m1(x):
    """Thousands to millions with one decimal, sign dropped (prose says gain/loss)."""
    v = (Decimal(abs(int(x))) / 1000).quantize(Decimal("0.1"), rounding=ROUND_HALF_UP)
    return f"{v:,}"


def r1(x):
    """One decimal, halves rounded up, as a reader rounding by hand would."""
    return f"{Decimal(repr(x)).quantize(Decimal('0.1'), rounding=ROUND_HALF_UP)}"


def pct(a, b):
    return r1(abs(100.0 * (a - b) / b)) if b else "n/a"


def direction(a, b, up="increased", down="decreased"):
    return up if a >= b else down


def prior_year(p):
    y, q = p.split("-")
    return f"{int(y) - 1}-{q}"


def prev_q(p):
    return QUARTERS[QUARTERS.index(p) - 1]


def _basic(prefix, d, d_py, shares, shares_py):
    out = {}
    for k in ("rev", "cost", "gp", "sga", "rnd", "special", "opinc", "interest", "other",
              "pretax", "tax", "ni", "da", "ebitda"):
        out[f"{prefix}{k}_m"] = m1(d[k])
        if d_py is not None:
            out[f"{prefix}{k}_py_m"] = m1(d_py[k])
    out[f"{prefix}gm"] = f"{100.0 * d['gp'] / d['rev']:.1f}"
    out[f"{prefix}eps"] = f"{abs(d['ni']) / shares:.2f}"
    out[f"{prefix}ni_word"] = "net income" if d["ni"] >= 0 else "net loss"
    out[f"{prefix}op_word"] = "operating income" if d["opinc"] >= 0 else "operating loss"
    out[f"{prefix}sga_pct"] = f"{100.0 * d['sga'] / d['rev']:.1f}"
    if d_py is not None:
        out[f"{prefix}gm_py"] = f"{100.0 * d_py['gp'] / d_py['rev']:.1f}"
        out[f"{prefix}gm_pts"] = f"{abs(100.0 * d['gp'] / d['rev'] - 100.0 * d_py['gp'] / d_py['rev']):.1f}"
        out[f"{prefix}rev_chg"] = pct(d["rev"], d_py["rev"])
        out[f"{prefix}rev_dir"] = direction(d["rev"], d_py["rev"])
        out[f"{prefix}sga_chg"] = pct(d["sga"], d_py["sga"])
        out[f"{prefix}sga_dir"] = direction(d["sga"], d_py["sga"])
        out[f"{prefix}eps_py"] = f"{abs(d_py['ni']) / shares_py:.2f}"
        out[f"{prefix}ni_py_word"] = "net income" if d_py["ni"] >= 0 else "net loss"
    return out


def quarter_metrics(co, p):
    y, q = p.split("-")
    d = co.q[p]
    py = prior_year(p)
    d_py = co.q.get(py)
    m = {"period": p, "year": y, "pyear": str(int(y) - 1), "q": q, "qword": QUARTER_WORD[q],
         "Qword": QUARTER_WORD[q].capitalize(), "qend": f"{QUARTER_END[q]}, {y}",
         "qend_py": f"{QUARTER_END[q]}, {int(y) - 1}"}
    m.update(_basic("", d, d_py, co.shares[int(y)], co.shares.get(int(y) - 1, co.shares[int(y)])))
    if p != QUARTERS[0]:
        pq = co.q[prev_q(p)]
        m["rev_seq_chg"] = pct(d["rev"], pq["rev"])
        m["rev_seq_dir"] = direction(d["rev"], pq["rev"])
        m["rev_pq_m"] = m1(pq["rev"])
        m["gm_pq"] = f"{100.0 * pq['gp'] / pq['rev']:.1f}"
    if q != "Q1":
        ytd = co.ytd(p)
        ytd_py = co.ytd(py) if py in co.q else None
        m.update(_basic("ytd_", ytd, ytd_py, co.shares[int(y)], co.shares.get(int(y) - 1, 1)))
    if q == "Q4":
        fy = co.year(int(y))
        fy_py = co.year(int(y) - 1)
        if fy is not None and fy_py is not None:
            m.update(_basic("fy_", fy, fy_py, co.shares[int(y)], co.shares[int(y) - 1]))
    b = co.bs.get(p)
    if b:
        for k in ("cash", "ar", "inv", "ocur", "ppe", "gwi", "ap", "accr", "cl", "debt", "dlt",
                  "equity", "assets", "curassets", "curliab"):
            m[f"{k}_m"] = m1(b[k])
        ye = f"{int(y) - 1}-Q4"
        if ye in co.bs:
            for k in ("cash", "inv", "debt", "ar", "ap"):
                m[f"{k}_ye_m"] = m1(co.bs[ye][k])
        ttm = co.ttm(p)
        m["ttm_ebitda_m"] = m1(ttm["ebitda"])
        if ttm["ebitda"] > 0:
            m["lev"] = f"{(b['debt'] - b['cash']) / ttm['ebitda']:.2f}"
        m["wc_m"] = m1(b["curassets"] - b["curliab"])
    ops = co.ops.get(p, {})
    for k, v in ops.items():
        if k in ("backlog", "expedite", "provision"):
            m[f"{k}_m"] = m1(v)
        else:
            m[k] = f"{v:.2f}" if isinstance(v, float) else str(v)
    if co.slug == "hollowmere":
        _hollowmere_extra(co, p, m)
    return m


# Hollowmere's term loan amortises $1.25 million a quarter from $50.0 million at
# the end of 2023; the revolving facility (commitment $100.0 million, with
# $6.2 million of letters of credit outstanding) carries the rest.
def _hollowmere_extra(co, p, m):
    i = QUARTERS.index(p)
    if i >= QUARTERS.index("2023-Q4"):
        term = 50000 - 1250 * (i - QUARTERS.index("2023-Q4"))
        b = co.bs[p]
        rev = b["debt"] - term
        m["term_m"] = m1(term)
        m["revolver_m"] = m1(rev)
        avail = 100000 - rev - 6200
        m["avail_m"] = m1(avail)
        m["liq_m"] = m1(avail + b["cash"])
        # Credit-agreement EBITDA after the second amendment adds back expedite
        # costs, impairment and restructuring, and the litigation settlement.
        adj = 0
        for pp in QUARTERS[i - 3:i + 1]:
            adj += co.q[pp]["ebitda"] + co.q[pp]["special"] + co.ops.get(pp, {}).get("expedite", 0)
        m["adj_ttm_ebitda_m"] = m1(adj)
        if adj > 0:
            m["adj_lev"] = f"{(b['debt'] - b['cash']) / adj:.2f}"


def annual_metrics(co, year):
    """Keys for an annual report: the year's totals without prefix, plus q4_."""
    y = int(year)
    d = co.year(y)
    d_py = co.year(y - 1)
    m = {"year": str(y), "pyear": str(y - 1)}
    m.update(_basic("", d, d_py, co.shares[y], co.shares.get(y - 1, co.shares[y])))
    q4 = quarter_metrics(co, f"{y}-Q4")
    for k, v in q4.items():
        if k not in m and not k.startswith(("fy_", "ytd_")):
            m[k] = v
        m["q4_" + k] = v
    return m
