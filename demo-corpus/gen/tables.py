"""Financial statement tables built from model.py (see render.py for the
table shape). Context ids: c-q / c-q-py (the quarter, prior-year quarter),
c-ytd / c-ytd-py (year to date), c-fy / c-fy-py (fiscal years), c-i (balance
sheet date), c-i-py (prior year end)."""

from model import QUARTER_END, QUARTER_END_ISO

SPECIAL_LABEL = {
    "hollowmere": {"2024": ("Impairment and restructuring charges", "us-gaap:RestructuringSettlementAndImpairmentProvisions"),
                   "2025": ("Litigation settlement, net of insurance recoveries", "hvw:LitigationSettlementNetOfInsuranceRecoveries")},
    "ambleworth": {"2024": ("Acquisition and integration costs", "us-gaap:BusinessCombinationAcquisitionRelatedCosts"),
                   "2025": ("Acquisition and integration costs", "us-gaap:BusinessCombinationAcquisitionRelatedCosts")},
}

MONTHS = {"Q1": "Three", "Q2": "Six", "Q3": "Nine"}


def _is_rows(co, cols_data, year, special_info):
    rows = [("Revenue", [d["rev"] for d in cols_data], "us-gaap:Revenues", "m"),
            ("Cost of revenue", [d["cost"] for d in cols_data], "us-gaap:CostOfRevenue", "m"),
            ("Gross profit", [d["gp"] for d in cols_data], "us-gaap:GrossProfit", "mt"),
            ("Operating expenses:", None, None, "head"),
            ("Selling, general and administrative", [d["sga"] for d in cols_data],
             "us-gaap:SellingGeneralAndAdministrativeExpense", "m"),
            ("Research and development", [d["rnd"] for d in cols_data], "us-gaap:ResearchAndDevelopmentExpense", "m")]
    if any(d["special"] for d in cols_data):
        label, concept = special_info
        rows.append((label, [d["special"] for d in cols_data], concept, "m"))
    rows += [("Operating income (loss)", [d["opinc"] for d in cols_data], "us-gaap:OperatingIncomeLoss", "mt"),
             ("Interest expense", [d["interest"] for d in cols_data], "us-gaap:InterestExpense", "mneg"),
             ("Other income, net", [d["other"] for d in cols_data], "us-gaap:OtherNonoperatingIncomeExpense", "m"),
             ("Income (loss) before income taxes", [d["pretax"] for d in cols_data],
              "us-gaap:IncomeLossFromContinuingOperationsBeforeIncomeTaxesExtraordinaryItemsNoncontrollingInterest", "mt"),
             ("Income tax expense (benefit)", [d["tax"] for d in cols_data], "us-gaap:IncomeTaxExpenseBenefit", "m"),
             ("Net income (loss)", [d["ni"] for d in cols_data], "us-gaap:NetIncomeLoss", "mt")]
    return rows


def income_quarter(co, p):
    y, q = p.split("-")
    py = f"{int(y) - 1}-{q}"
    cols = [(f"Three Months Ended {QUARTER_END[q]},", y, "c-q"),
            (f"Three Months Ended {QUARTER_END[q]},", str(int(y) - 1), "c-q-py")]
    data = [co.q[p], co.q[py]]
    years = [int(y), int(y) - 1]
    if q != "Q1":
        cols += [(f"{MONTHS[q]} Months Ended {QUARTER_END[q]},", y, "c-ytd"),
                 (f"{MONTHS[q]} Months Ended {QUARTER_END[q]},", str(int(y) - 1), "c-ytd-py")]
        data += [co.ytd(p), co.ytd(py)]
        years += [int(y), int(y) - 1]
    rows = _is_rows(co, data, y, SPECIAL_LABEL[co.slug].get(y))
    rows.append(("Net income (loss) per share, basic and diluted",
                 [round(d["ni"] / co.shares[yy], 2) for d, yy in zip(data, years)],
                 "us-gaap:EarningsPerShareBasicAndDiluted", "eps"))
    rows.append(("Weighted-average shares outstanding", [co.shares[yy] for yy in years],
                 "us-gaap:WeightedAverageNumberOfShareOutstandingBasicAndDiluted", "sh"))
    return dict(title="Condensed Consolidated Statements of Operations (Unaudited)",
                note="(in thousands, except per share amounts)", cols=cols, rows=rows)


def income_annual(co, year):
    y = int(year)
    cols = [("Year Ended December 31,", str(y), "c-fy"), ("Year Ended December 31,", str(y - 1), "c-fy-py")]
    data = [co.year(y), co.year(y - 1)]
    rows = _is_rows(co, data, str(y), SPECIAL_LABEL[co.slug].get(str(y)))
    rows.append(("Net income (loss) per share, basic and diluted",
                 [round(d["ni"] / co.shares[yy], 2) for d, yy in zip(data, (y, y - 1))],
                 "us-gaap:EarningsPerShareBasicAndDiluted", "eps"))
    rows.append(("Weighted-average shares outstanding", [co.shares[y], co.shares[y - 1]],
                 "us-gaap:WeightedAverageNumberOfShareOutstandingBasicAndDiluted", "sh"))
    return dict(title="Consolidated Statements of Operations", note="(in thousands, except per share amounts)",
                cols=cols, rows=rows)


def balance(co, p, annual=False):
    y, q = p.split("-")
    ye = f"{int(y) - 1}-Q4"
    a, b = co.bs[p], co.bs[ye]
    cols = [(f"{QUARTER_END[q]},", f"{y}{'' if annual else ' (unaudited)'}", "c-i"),
            ("December 31,", str(int(y) - 1), "c-i-py")]
    v = lambda k: [a[k], b[k]]
    intang_label = "Goodwill and intangible assets, net"
    rows = [("Assets", None, None, "head"),
            ("Cash and cash equivalents", v("cash"), "us-gaap:CashAndCashEquivalentsAtCarryingValue", "m"),
            ("Accounts receivable, net", v("ar"), "us-gaap:AccountsReceivableNetCurrent", "m"),
            ("Inventories", v("inv"), "us-gaap:InventoryNet", "m"),
            ("Prepaid expenses and other current assets", v("ocur"), "us-gaap:PrepaidExpenseAndOtherAssetsCurrent", "m"),
            ("Total current assets", v("curassets"), "us-gaap:AssetsCurrent", "mt"),
            ("Property, plant and equipment, net", v("ppe"), "us-gaap:PropertyPlantAndEquipmentNet", "m"),
            (intang_label, v("gwi"), "us-gaap:IntangibleAssetsNetIncludingGoodwill", "m"),
            ("Deferred income taxes", v("dta"), "us-gaap:DeferredIncomeTaxAssetsNet", "m"),
            ("Other assets", v("oth"), "us-gaap:OtherAssetsNoncurrent", "m"),
            ("Total assets", v("assets"), "us-gaap:Assets", "mt"),
            ("Liabilities and stockholders' equity", None, None, "head"),
            ("Accounts payable", v("ap"), "us-gaap:AccountsPayableCurrent", "m"),
            ("Accrued liabilities", v("accr"), "us-gaap:AccruedLiabilitiesCurrent", "m"),
            ("Contract liabilities", v("cl"), "us-gaap:ContractWithCustomerLiabilityCurrent", "m"),
            ("Current portion of long-term debt", v("dcur"), "us-gaap:LongTermDebtCurrent", "m"),
            ("Total current liabilities", v("curliab"), "us-gaap:LiabilitiesCurrent", "mt"),
            ("Long-term debt, less current portion", v("dlt"), "us-gaap:LongTermDebtNoncurrent", "m"),
            ("Other long-term liabilities", v("oltl"), "us-gaap:OtherLiabilitiesNoncurrent", "m"),
            ("Total liabilities", v("liab"), "us-gaap:Liabilities", "mt"),
            ("Total stockholders' equity", v("equity"), "us-gaap:StockholdersEquity", "m"),
            ("Total liabilities and stockholders' equity", v("assets"), "us-gaap:LiabilitiesAndStockholdersEquity", "mt")]
    title = "Consolidated Balance Sheets" if annual else "Condensed Consolidated Balance Sheets"
    return dict(title=title, note="(in thousands)", cols=cols, rows=rows)


# Inventory split: work in process swells while finished goods wait for castings.
WIP_SHARE = {"hollowmere": {"2023-Q4": .30, "2024-Q1": .33, "2024-Q2": .38, "2024-Q3": .44, "2024-Q4": .46,
                            "2025-Q1": .43, "2025-Q2": .38, "2025-Q3": .34, "2025-Q4": .31},
             "ambleworth": {}}


def inventory(co, p):
    y, q = p.split("-")
    ye = f"{int(y) - 1}-Q4"

    def split(pp):
        total = co.bs[pp]["inv"]
        wip = WIP_SHARE[co.slug].get(pp, .22)
        w = int(round(total * wip, -2))
        r = int(round(total * (0.36 if co.slug == "hollowmere" else 0.41), -2))
        return [r, w, total - r - w, total]

    a, b = split(p), split(ye)
    rows = [("Raw materials and purchased components", [a[0], b[0]], "us-gaap:InventoryRawMaterialsNetOfReserves", "m"),
            ("Work in process", [a[1], b[1]], "us-gaap:InventoryWorkInProcessNetOfReserves", "m"),
            ("Finished goods", [a[2], b[2]], "us-gaap:InventoryFinishedGoodsNetOfReserves", "m"),
            ("Total inventories", [a[3], b[3]], "us-gaap:InventoryNet", "mt")]
    cols = [(f"{QUARTER_END[q]},", y, "c-i"), ("December 31,", str(int(y) - 1), "c-i-py")]
    return dict(title="Inventories", note="(in thousands)", cols=cols, rows=rows)


def cash_flow(co, year, capex_share=0.8, acquisitions=None):
    """Annual cash-flow summary derived from the balance sheets, so it ties."""
    acquisitions = acquisitions or {}
    cols, vals = [], []
    for y in (int(year), int(year) - 1):
        if f"{y - 1}-Q4" not in co.bs:
            continue
        a, b = co.bs[f"{y}-Q4"], co.bs[f"{y - 1}-Q4"]
        yr = co.year(y)
        acq = acquisitions.get(y, (0, 0))  # (cash paid, of which PP&E and intangibles)
        capex = int(round((a["ppe"] - b["ppe"]) + capex_share * yr["da"] - acq[1], -2))
        dist = sum(v for k, v in co.dist.items() if k.startswith(str(y)))
        cfi = -capex - acq[0]
        cff = (a["debt"] - b["debt"]) - dist
        cfo = (a["cash"] - b["cash"]) - cfi - cff
        cols.append(("Year Ended December 31,", str(y), "c-fy" if y == int(year) else "c-fy-py"))
        vals.append(dict(cfo=cfo, capex=-capex, acq=-acq[0], cfi=cfi, debt=a["debt"] - b["debt"], dist=-dist,
                         cff=cff, net=a["cash"] - b["cash"], beg=b["cash"], end=a["cash"], ni=yr["ni"]))
    rows = [("Net income (loss)", [v["ni"] for v in vals], "us-gaap:NetIncomeLoss", "m"),
            ("Net cash provided by (used in) operating activities", [v["cfo"] for v in vals],
             "us-gaap:NetCashProvidedByUsedInOperatingActivities", "mt"),
            ("Purchases of property, plant and equipment", [v["capex"] for v in vals],
             "us-gaap:PaymentsToAcquirePropertyPlantAndEquipment", "m")]
    if any(v["acq"] for v in vals):
        rows.append(("Acquisition of business, net of cash acquired", [v["acq"] for v in vals],
                     "us-gaap:PaymentsToAcquireBusinessesNetOfCashAcquired", "m"))
    rows += [("Net cash used in investing activities", [v["cfi"] for v in vals],
              "us-gaap:NetCashProvidedByUsedInInvestingActivities", "mt"),
             ("Net borrowings (repayments) of debt", [v["debt"] for v in vals], "us-gaap:ProceedsFromRepaymentsOfDebt", "m")]
    if any(v["dist"] for v in vals):
        rows.append(("Dividends paid and shares repurchased", [v["dist"] for v in vals],
                     "hvw:PaymentsOfDividendsAndForRepurchaseOfCommonStock", "m"))
    rows += [("Net cash provided by (used in) financing activities", [v["cff"] for v in vals],
              "us-gaap:NetCashProvidedByUsedInFinancingActivities", "mt"),
             ("Net increase (decrease) in cash and cash equivalents", [v["net"] for v in vals],
              "us-gaap:CashAndCashEquivalentsPeriodIncreaseDecrease", "mt"),
             ("Cash and cash equivalents, end of year", [v["end"] for v in vals],
              "us-gaap:CashAndCashEquivalentsAtCarryingValue", "mt")]
    # the end-of-year cash fact is an instant; render.py tags by column context,
    # so that row is left untagged to keep the instance valid.
    rows[-1] = (rows[-1][0], rows[-1][1], None, rows[-1][3])
    return dict(title="Consolidated Statements of Cash Flows (Summary)", note="(in thousands)", cols=cols,
                rows=rows), vals


def contexts_quarter(p):
    y, q = p.split("-")
    py = str(int(y) - 1)
    end, end_py = f"{y}-{QUARTER_END_ISO[q]}", f"{py}-{QUARTER_END_ISO[q]}"
    qstart = {"Q1": "01-01", "Q2": "04-01", "Q3": "07-01", "Q4": "10-01"}[q]
    ctx = {"c-q": (f"{y}-{qstart}", end), "c-q-py": (f"{py}-{qstart}", end_py),
           "c-i": (None, end), "c-i-py": (None, f"{py}-12-31")}
    if q != "Q1":
        ctx["c-ytd"] = (f"{y}-01-01", end)
        ctx["c-ytd-py"] = (f"{py}-01-01", end_py)
    return ctx


def contexts_annual(year):
    y = int(year)
    return {"c-fy": (f"{y}-01-01", f"{y}-12-31"), "c-fy-py": (f"{y - 1}-01-01", f"{y - 1}-12-31"),
            "c-i": (None, f"{y}-12-31"), "c-i-py": (None, f"{y - 1}-12-31")}
