"""Financial figures for the two invented companies (all amounts in thousands
of dollars unless a name says otherwise). Every figure in the corpus is
derived from the inputs below, so tables and prose agree.

Inputs per quarter: revenue, cost of revenue, SG&A, R&D, special charges
(a named operating line), interest expense, other income, income tax
(a signed amount), and selected balance-sheet items. Equity rolls forward from
net income plus stock compensation; cash is the balancing figure, except where
a cash balance is given (Hollowmere), when long-term debt balances instead.
"""

QUARTERS = [f"{y}-Q{q}" for y in (2023, 2024, 2025) for q in (1, 2, 3, 4)]

QUARTER_END = {"Q1": "March 31", "Q2": "June 30", "Q3": "September 30", "Q4": "December 31"}
QUARTER_END_ISO = {"Q1": "03-31", "Q2": "06-30", "Q3": "09-30", "Q4": "12-31"}
QUARTER_WORD = {"Q1": "first", "Q2": "second", "Q3": "third", "Q4": "fourth"}


def _q(rev, cost, sga, rnd, special, interest, other, tax, da):
    return dict(rev=rev, cost=cost, sga=sga, rnd=rnd, special=special,
                interest=interest, other=other, tax=tax, da=da)


# ---------------------------------------------------------------- Hollowmere
# special: 2024-Q4 impairment and restructuring (Quayle Point service centre,
# K-Series tooling); 2025-Q3 litigation settlement net of insurance.
# tax: 2024-Q4 includes a valuation allowance against deferred tax assets.
HOLLOWMERE_PL = {
    "2023-Q1": _q(82140, 55030, 11220, 2310, 0, 1180, 150, 2950, 3480),
    "2023-Q2": _q(85420, 56980, 11540, 2350, 0, 1190, 130, 3090, 3510),
    "2023-Q3": _q(84870, 56700, 11480, 2400, 0, 1210, 160, 3040, 3530),
    "2023-Q4": _q(86470, 57640, 11910, 2460, 0, 1230, 120, 3080, 3560),
    "2024-Q1": _q(86410, 60190, 11860, 2480, 0, 1240, 110, 2420, 3590),
    "2024-Q2": _q(79820, 59870, 12140, 2450, 0, 1410, 90, 870, 3610),
    "2024-Q3": _q(68330, 56940, 12680, 2390, 0, 1960, 70, -1180, 3640),
    "2024-Q4": _q(61740, 55310, 13420, 2210, 3150, 2380, 60, 1200, 3620),
    "2025-Q1": _q(66920, 56480, 12960, 2260, 0, 2510, 40, 150, 3580),
    "2025-Q2": _q(78440, 61690, 12710, 2340, 0, 2420, 50, 110, 3600),
    "2025-Q3": _q(88690, 65200, 12890, 2520, 3500, 2180, 60, 180, 3650),
    "2025-Q4": _q(94210, 67110, 13240, 2610, 0, 1890, 80, 1120, 3690),
}

# Operating facts used in prose and tables.
HOLLOWMERE_OPS = {
    #           backlog, expedite, book_to_bill, brackwater_share_pct (of casting spend), r&t share
    "2023-Q3": dict(backlog=131400, expedite=0, btb=1.04),
    "2023-Q4": dict(backlog=134800, expedite=0, btb=1.04),
    "2024-Q1": dict(backlog=142600, expedite=1140, btb=1.09),
    "2024-Q2": dict(backlog=171300, expedite=4610, btb=1.36),
    "2024-Q3": dict(backlog=198500, expedite=7920, btb=1.40),
    "2024-Q4": dict(backlog=201700, expedite=6880, btb=1.05),
    "2025-Q1": dict(backlog=204100, expedite=5240, btb=1.04),
    "2025-Q2": dict(backlog=187600, expedite=2030, btb=0.79),
    "2025-Q3": dict(backlog=168200, expedite=640, btb=0.78),
    "2025-Q4": dict(backlog=151900, expedite=0, btb=0.82),
}

# Balance sheet inputs at quarter end; cash is derived.
HOLLOWMERE_BS = {
    "2022-Q4": dict(cash=21300, ar=58100, inv=66400, ocur=5800, ppe=93900, gwi=59600, dta=10200, oth=4900,
                    ap=35600, accr=19800, cl=8700, dcur=5000, oltl=12400),
    #          cash, receivables, inventories, other_cur, ppe, gw_intang, dta, other_assets,
    #          ap, accrued, contract_liab, debt_cur, other_ltl (debt_lt balances)
    "2023-Q4": dict(cash=24000, ar=63900, inv=71200, ocur=6100, ppe=96400, gwi=58400, dta=9800, oth=5100,
                    ap=38200, accr=21300, cl=9400, dcur=5000, oltl=12100),
    "2024-Q1": dict(cash=19800, ar=64800, inv=79500, ocur=6400, ppe=96900, gwi=58100, dta=9700, oth=5100,
                    ap=39000, accr=21900, cl=10200, dcur=5000, oltl=12000),
    "2024-Q2": dict(cash=16400, ar=59700, inv=92600, ocur=7400, ppe=97300, gwi=57800, dta=9800, oth=5200,
                    ap=36500, accr=22800, cl=13600, dcur=5000, oltl=11900),
    "2024-Q3": dict(cash=12900, ar=51200, inv=104800, ocur=11300, ppe=98400, gwi=57500, dta=11000, oth=5200,
                    ap=31800, accr=23400, cl=15100, dcur=5000, oltl=11800),
    "2024-Q4": dict(cash=11200, ar=46900, inv=103900, ocur=14600, ppe=97900, gwi=57200, dta=2100, oth=5300,
                    ap=29400, accr=24900, cl=15800, dcur=5000, oltl=11700),
    "2025-Q1": dict(cash=9600, ar=50400, inv=101200, ocur=13100, ppe=99600, gwi=56900, dta=2100, oth=5300,
                    ap=30900, accr=24100, cl=15300, dcur=5000, oltl=11600),
    "2025-Q2": dict(cash=13100, ar=58900, inv=94000, ocur=10900, ppe=100400, gwi=56600, dta=2100, oth=5400,
                    ap=35000, accr=26400, cl=13900, dcur=5000, oltl=11500),
    "2025-Q3": dict(cash=17400, ar=66300, inv=86800, ocur=15300, ppe=100900, gwi=56300, dta=2100, oth=5400,
                    ap=39200, accr=31900, cl=12400, dcur=5000, oltl=11400),
    "2025-Q4": dict(cash=21800, ar=70200, inv=79500, ocur=8100, ppe=101300, gwi=56000, dta=2900, oth=5500,
                    ap=41000, accr=22700, cl=11800, dcur=5000, oltl=11300),
}
# Dividends and share repurchases (reduce equity). The quarterly dividend of
# $0.12 a share was suspended after the second quarter of 2024.
HOLLOWMERE_DIST = {"2023-Q1": 2570, "2023-Q2": 2570, "2023-Q3": 2570, "2023-Q4": 2570,
                   "2024-Q1": 8580, "2024-Q2": 2580}

# Fiscal 2022 appears only as the comparative year in the fiscal 2023 reports.
HOLLOWMERE_2022 = _q(312600, 211400, 43900, 8700, 0, 5100, 420, 10500, 13600)
AMBLEWORTH_2022 = _q(418900, 199300, 114800, 37600, 0, 1000, 2600, 15300, 15900)
HOLLOWMERE_EQUITY_2022Q4 = 121230
HOLLOWMERE_SBC = 620
HOLLOWMERE_SHARES = {2022: 21310, 2023: 21380, 2024: 21460, 2025: 21540}   # weighted, thousands

# ---------------------------------------------------------------- Ambleworth
# special: 2024-Q2 acquisition and integration costs (Labovère);
# 2024-Q4 the CF-6 recall provision sits in cost of revenue (see prose);
# 2025-Q4 release of part of the recall provision, also in cost of revenue.
AMBLEWORTH_PL = {
    "2023-Q1": _q(109800, 51830, 29650, 9880, 0, 210, 980, 4420, 4100),
    "2023-Q2": _q(112400, 52940, 30120, 10010, 0, 210, 1040, 4560, 4150),
    "2023-Q3": _q(113600, 53280, 30560, 10230, 0, 200, 1110, 4590, 4190),
    "2023-Q4": _q(116500, 54520, 31480, 10480, 0, 200, 1190, 4700, 4240),
    "2024-Q1": _q(118240, 55330, 31570, 10640, 0, 200, 1210, 4860, 4290),
    "2024-Q2": _q(121530, 57000, 32330, 10850, 2140, 240, 980, 4170, 4480),
    "2024-Q3": _q(123010, 58170, 33240, 11070, 0, 260, 860, 4290, 4760),
    "2024-Q4": _q(126880, 74130, 35610, 11380, 0, 260, 820, 1240, 4810),
    "2025-Q1": _q(116420, 57920, 33960, 11120, 0, 250, 790, 2690, 4830),
    "2025-Q2": _q(122870, 59010, 33880, 11290, 0, 240, 840, 3930, 4860),
    "2025-Q3": _q(128640, 60990, 34120, 11560, 0, 230, 910, 4860, 4900),
    "2025-Q4": _q(134910, 62550, 35270, 11830, 0, 220, 960, 5420, 4950),
}
AMBLEWORTH_OPS = {
    #          recall retrofit progress pct, CF-6 units in scope, recall provision balance, service attach pct
    "2024-Q4": dict(retro_pct=6, provision=13900),
    "2025-Q1": dict(retro_pct=38, provision=9400),
    "2025-Q2": dict(retro_pct=81, provision=4100),
    "2025-Q3": dict(retro_pct=96, provision=1900),
    "2025-Q4": dict(retro_pct=100, provision=0),
}
AMBLEWORTH_BS = {
    "2022-Q4": dict(ar=71300, inv=80100, ocur=10400, ppe=118900, gwi=65500, dta=6900, oth=9400,
                    ap=29900, accr=35200, cl=21100, dcur=0, dlt=24000, oltl=14900),
    "2023-Q4": dict(ar=78400, inv=88200, ocur=11300, ppe=121600, gwi=64300, dta=7200, oth=9800,
                    ap=31800, accr=38600, cl=22900, dcur=0, dlt=18000, oltl=14700),
    "2024-Q1": dict(ar=79600, inv=90100, ocur=11800, ppe=122400, gwi=64000, dta=7200, oth=9900,
                    ap=32400, accr=37100, cl=23600, dcur=0, dlt=18000, oltl=14600),
    "2024-Q2": dict(ar=84700, inv=97300, ocur=12600, ppe=131900, gwi=92800, dta=7300, oth=10100,
                    ap=35900, accr=39800, cl=24100, dcur=0, dlt=48000, oltl=16900),
    "2024-Q3": dict(ar=86200, inv=99400, ocur=12900, ppe=132700, gwi=92300, dta=7300, oth=10200,
                    ap=36300, accr=40400, cl=24800, dcur=0, dlt=44000, oltl=16800),
    "2024-Q4": dict(ar=88900, inv=101800, ocur=12400, ppe=133500, gwi=91800, dta=10400, oth=10300,
                    ap=37200, accr=55300, cl=25900, dcur=0, dlt=40000, oltl=16700),
    "2025-Q1": dict(ar=80100, inv=104900, ocur=12200, ppe=134100, gwi=91300, dta=10300, oth=10400,
                    ap=35400, accr=49600, cl=26300, dcur=0, dlt=38000, oltl=16600),
    "2025-Q2": dict(ar=85300, inv=101200, ocur=12500, ppe=134900, gwi=90800, dta=9900, oth=10500,
                    ap=36800, accr=45100, cl=26900, dcur=0, dlt=34000, oltl=16500),
    "2025-Q3": dict(ar=89800, inv=97600, ocur=12800, ppe=135600, gwi=90300, dta=9400, oth=10600,
                    ap=37900, accr=43700, cl=27800, dcur=0, dlt=30000, oltl=16400),
    "2025-Q4": dict(ar=93600, inv=95100, ocur=13100, ppe=136800, gwi=89800, dta=8700, oth=10700,
                    ap=38600, accr=41900, cl=28600, dcur=0, dlt=26000, oltl=16300),
}
AMBLEWORTH_EQUITY_2022Q4 = 300050
AMBLEWORTH_SBC = 1450
AMBLEWORTH_SHARES = {2022: 38450, 2023: 38620, 2024: 38740, 2025: 38810}


def _derive(pl):
    out = {}
    for p, q in pl.items():
        d = dict(q)
        d["gp"] = d["rev"] - d["cost"]
        d["opinc"] = d["gp"] - d["sga"] - d["rnd"] - d["special"]
        d["pretax"] = d["opinc"] - d["interest"] + d["other"]
        d["ni"] = d["pretax"] - d["tax"]
        d["ebitda"] = d["opinc"] + d["da"]
        out[p] = d
    return out


def _sum(derived, periods):
    keys = derived[periods[0]].keys()
    return {k: sum(derived[p][k] for p in periods) for k in keys}


def _balance(bs, equity0, sbc, derived, dist):
    """Rolls equity through every quarter after the first balance-sheet date."""
    out = {}
    eq = equity0
    first = min(bs)
    for p in ["2022-Q4"] + QUARTERS:
        if p < first:
            continue
        if p != first:
            eq = eq + derived[p]["ni"] + sbc - dist.get(p, 0)
        if p not in bs:
            continue
        b = dict(bs[p])
        b["equity"] = eq
        noncash = b["ar"] + b["inv"] + b["ocur"] + b["ppe"] + b["gwi"] + b["dta"] + b["oth"]
        if "cash" in b:     # cash is set: long-term debt balances the sheet
            b["dlt"] = b["cash"] + noncash - eq - (b["ap"] + b["accr"] + b["cl"] + b["dcur"] + b["oltl"])
        liab = b["ap"] + b["accr"] + b["cl"] + b["dcur"] + b["dlt"] + b["oltl"]
        b["liab"] = liab
        b["cash"] = liab + eq - noncash
        b["curassets"] = b["cash"] + b["ar"] + b["inv"] + b["ocur"]
        b["assets"] = liab + eq
        b["curliab"] = b["ap"] + b["accr"] + b["cl"] + b["dcur"]
        b["debt"] = b["dcur"] + b["dlt"]
        out[p] = b
    return out


class Company:
    def __init__(self, slug, pl, bs, eq0, sbc, shares, ops, dist, fy2022):
        self.slug = slug
        self.fy2022 = _derive({"2022": fy2022})["2022"]
        self.q = _derive(pl)
        self.bs = _balance(bs, eq0, sbc, self.q, dist)
        self.dist = dist
        self.shares = shares
        self.ops = ops

    def ytd(self, period):
        y, qn = period.split("-Q")
        return _sum(self.q, [f"{y}-Q{i}" for i in range(1, int(qn) + 1)])

    def year(self, y):
        if int(y) == 2022:
            return self.fy2022
        return _sum(self.q, [f"{y}-Q{i}" for i in range(1, 5)])

    def ttm(self, period):
        i = QUARTERS.index(period)
        return _sum(self.q, QUARTERS[i - 3:i + 1])

    def eps(self, ni, year):
        return ni / self.shares[int(year)]


HOLLOWMERE = Company("hollowmere", HOLLOWMERE_PL, HOLLOWMERE_BS, HOLLOWMERE_EQUITY_2022Q4,
                     HOLLOWMERE_SBC, HOLLOWMERE_SHARES, HOLLOWMERE_OPS, HOLLOWMERE_DIST, HOLLOWMERE_2022)
AMBLEWORTH = Company("ambleworth", AMBLEWORTH_PL, AMBLEWORTH_BS, AMBLEWORTH_EQUITY_2022Q4,
                     AMBLEWORTH_SBC, AMBLEWORTH_SHARES, AMBLEWORTH_OPS, {}, AMBLEWORTH_2022)

if __name__ == "__main__":
    for c in (HOLLOWMERE, AMBLEWORTH):
        print(c.slug)
        for p in QUARTERS:
            d = c.q[p]
            b = c.bs.get(p)
            line = f"{p} rev {d['rev']:>7} gm {100*d['gp']/d['rev']:5.1f} op {d['opinc']:>7} ni {d['ni']:>7}"
            if b:
                net_debt = b['debt'] - b['cash']
                lev = net_debt / c.ttm(p)['ebitda'] if p >= '2023-Q4' else 0
                line += f" | cash {b['cash']:>7} debt {b['debt']:>7} eq {b['equity']:>7} netlev {lev:5.2f} ttmEBITDA {c.ttm(p)['ebitda']}"
            print(line)
        for y in (2022, 2023, 2024, 2025):
            s = c.year(y)
            print(y, s['rev'], s['ni'])
