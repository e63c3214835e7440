"""Hollowmere Valve Works, Inc. -- invented industrial-valve maker. Quarterly
and annual report prose. Placeholders in braces come from metrics.py."""

NAME = "Hollowmere Valve Works, Inc."
CIK = "0009870011"
PREFIX = "hvw"
FILER = "Accelerated Filer"

FILED = {"2024-Q1": "May 9, 2024", "2024-Q2": "August 8, 2024", "2024-Q3": "November 12, 2024",
         "2025-Q1": "May 8, 2025", "2025-Q2": "August 7, 2025", "2025-Q3": "November 6, 2025",
         "FY2023": "February 29, 2024", "FY2024": "March 17, 2025", "FY2025": "February 26, 2026"}
SHARES_OUT = {"2024-Q1": ("April 30, 2024", "21,214,806"), "2024-Q2": ("July 31, 2024", "21,231,550"),
              "2024-Q3": ("October 31, 2024", "21,236,118"), "2025-Q1": ("April 30, 2025", "21,298,402"),
              "2025-Q2": ("July 31, 2025", "21,311,977"), "2025-Q3": ("October 31, 2025", "21,324,090"),
              "FY2023": ("February 16, 2024", "21,462,115"), "FY2024": ("March 3, 2025", "21,279,640"),
              "FY2025": ("February 13, 2026", "21,366,251")}

COVER_Q = """
!c UNITED STATES
!c SECURITIES AND EXCHANGE COMMISSION

!c FORM 10-Q

!c [X] QUARTERLY REPORT UNDER SECTION 13 OR 15(d) OF THE SECURITIES EXCHANGE ACT OF 1934
!c For the quarterly period ended {qend}
!c [ ] TRANSITION REPORT UNDER SECTION 13 OR 15(d) OF THE SECURITIES EXCHANGE ACT OF 1934
!c Commission File Number 001-99117

!c HOLLOWMERE VALVE WORKS, INC.
!c (Exact name of registrant as specified in its charter)
!c Incorporated in Delaware -- I.R.S. Employer Identification No. 88-0417726
!c 400 Foundry Row, Fennick Harbor -- Telephone (555) 014-2200

Title of each class registered under Section 12(b) of the Act: Common Stock, par value $0.01 per share, listed on the Kellbrook Securities Exchange.

The registrant (1) has filed every report that Section 13 or 15(d) of the Securities Exchange Act of 1934 required it to file during the preceding 12 months and (2) has been subject to those filing requirements for the past 90 days. Yes [X] No [ ]. The registrant has submitted electronically every Interactive Data File it was required to submit. Yes [X] No [ ]. The registrant is an accelerated filer. It is not a shell company.

As of {shares_date}, the registrant had {shares_out} shares of common stock outstanding.

[toc]
"""

NOTE_BASIS = """
**Note 1 -- Basis of Presentation.** The accompanying unaudited condensed consolidated financial statements of Hollowmere Valve Works, Inc. and its subsidiaries (the "Company," "Hollowmere," "we" or "us") have been prepared in accordance with U.S. generally accepted accounting principles for interim financial information. Management believes they reflect every adjustment, all of a normal recurring kind, needed to present the interim periods fairly. The results of one quarter do not necessarily predict those of the full year. These statements should be read together with the audited consolidated financial statements and notes included in our Annual Report on Form 10-K for the year ended December 31, {pyear}.
"""

NOTE_INV = """
**Note 2 -- Inventories.** Inventories are stated at the lower of cost (first-in, first-out) and net realizable value and consisted of the following:

[table:inv]
"""

FLS = """
### Cautionary Note Regarding Forward-Looking Statements

This report contains forward-looking statements, which are statements about future events or results rather than historical facts. Words such as "anticipate," "believe," "could," "estimate," "expect," "intend," "may," "plan," "should," "target" and "will" identify such statements. They reflect management's current expectations and are subject to risks and uncertainties that could cause actual results to differ materially, including:

{fls_items}

We undertake no obligation to update any forward-looking statement, except as required by law.
"""

CRITICAL = """
### Off-Balance-Sheet Arrangements

We have no off-balance-sheet arrangements other than $6.2 million of standby letters of credit issued under our revolving facility, mainly as performance guarantees on project orders.

### Critical Accounting Estimates

Our critical accounting estimates are described in our Annual Report on Form 10-K for the year ended December 31, {pyear}. They include revenue recognized over time on engineered-to-order valve packages, the valuation of inventories, product warranty reserves, the recoverability of goodwill and long-lived assets, and the realizability of deferred tax assets. {critical_extra}
"""

MARKET = """
## Item 3. Quantitative and Qualitative Disclosures About Market Risk

We are exposed to changes in interest rates on borrowings under our credit agreement, which bear interest at floating rates. A 100 basis point increase in the benchmark rate would increase annual interest expense by approximately ${rate_sens} million at the borrowing levels outstanding on {qend}. We purchase castings, forgings and bar stock whose prices move with steel and scrap markets, and our Saint-Aurèle-des-Pins plant buys some components priced in euros; we use forward contracts for part of that exposure. There were no material changes in our market risk during the quarter.
"""

CONTROLS_Q = """
## Item 4. Controls and Procedures

Under the supervision of our Chief Executive Officer and Chief Financial Officer, management evaluated the effectiveness of our disclosure controls and procedures as of {qend}. Based on that evaluation, those officers concluded that our disclosure controls and procedures were effective at a reasonable assurance level. There was no change in our internal control over financial reporting during the quarter that had, or is reasonably likely to have, a material effect on our internal control over financial reporting.
"""

EXHIBITS_Q = """
## Item 6. Exhibits

{exhibit_items}
- 31.1 Certification of the Chief Executive Officer under Rule 13a-14(a).
- 31.2 Certification of the Chief Financial Officer under Rule 13a-14(a).
- 32.1 Certification under 18 U.S.C. Section 1350.
- 101 Inline XBRL instance document and related taxonomy extension documents.

## SIGNATURES

Under the requirements of the Securities Exchange Act of 1934, the registrant has caused this report to be signed on its behalf by the undersigned officer, who is authorized to sign it.

Hollowmere Valve Works, Inc. -- Date: {filed}

By: /s/ Tobias Kellerman-Ruhl -- Tobias Kellerman-Ruhl, Executive Vice President and Chief Financial Officer (Principal Financial and Accounting Officer)
"""

QUARTERLY_SHAPE = COVER_Q + """
## PART I -- FINANCIAL INFORMATION

## Item 1. Financial Statements

[table:is]

[table:bs]

### Notes to Condensed Consolidated Financial Statements (Unaudited)
""" + NOTE_BASIS + NOTE_INV + """
{note_debt}

[tb:us-gaap:CommitmentsAndContingenciesDisclosureTextBlock@c-q]

{note_contingencies}

[/tb]

{note_extra}

## Item 2. Management's Discussion and Analysis of Financial Condition and Results of Operations

The following discussion should be read together with the condensed consolidated financial statements and notes in Item 1 of this report.
""" + FLS + """
### Overview

{overview}

### Supply Chain and Casting Supply

{supply}

### Results of Operations

{results}

### Liquidity and Capital Resources

{liquidity}
""" + CRITICAL + MARKET + CONTROLS_Q + """
## PART II -- OTHER INFORMATION

## Item 1. Legal Proceedings

{legal}

## Item 1A. Risk Factors

{risk}

## Item 5. Other Information

{other}
""" + EXHIBITS_Q


Q = {}

# --------------------------------------------------------------------------- 2024-Q1
Q["2024-Q1"] = dict(
    fls=["the timing of the return to full output at our principal casting supplier and the cost of expediting in the meantime;",
         "demand from liquefied natural gas, midstream and water utility customers, and the timing of large project orders;",
         "prices of steel, scrap and alloying elements, and our ability to pass those costs through;",
         "our ability to convert backlog into shipments on the schedules our customers expect; and",
         "the other risks described in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2023."],
    critical_extra="There were no changes to these estimates or the methods used to make them during the quarter.",
    rate_sens="0.5",
    note_debt="""**Note 3 -- Debt.** We are party to a credit agreement with a syndicate of lenders led by Westerholm National Bank, N.A., consisting of a $100.0 million revolving credit facility maturing in June 2027 and a term loan with an original principal amount of $60.0 million that amortizes at $1.25 million per quarter. At {qend}, ${term_m} million was outstanding under the term loan and ${revolver_m} million under the revolving facility. Borrowings bear interest at a benchmark rate plus a margin of 1.75% to 2.50% depending on our leverage. The agreement requires a consolidated net leverage ratio of not more than 3.50 to 1.00 and an interest coverage ratio of not less than 3.00 to 1.00, each measured at the end of a fiscal quarter. We were in compliance with these covenants at {qend}.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** In the ordinary course of business we are subject to claims relating to product performance, warranty, employment and commercial matters. We maintain reserves for product warranty based on historical claim rates, and the reserve was $3.1 million at {qend} compared with $3.0 million at December 31, 2023. In March 2024 a midstream customer informed us that several pressure-relief valves did not reseat as expected during the commissioning of a compressor station. No claim has been asserted, and we are working with the customer to examine the valves. Based on information currently available, we do not believe that any pending matter will have a material adverse effect on our financial position or results of operations.""",
    note_extra="",
    overview="""Hollowmere designs, machines and assembles industrial valves for liquefied natural gas, midstream pipeline, water and wastewater, chemical and mining customers. Our principal product families are the FL-Series trunnion-mounted ball valves, CG-300 cryogenic gate valves, R-40 pressure-relief valves and K-Series knife gate valves, and we sell replacement parts and field service through service centres at Quayle Point and Dunmarsh. Our machining and assembly plants are in Fennick Harbor and Saint-Aurèle-des-Pins.

Orders were strong in the first quarter. Two liquefied natural gas export projects released FL-Series packages earlier than we had planned, and water utilities continued to order R-40 relief valves at the pace of last year. Revenue rose {rev_chg}% to ${rev_m} million. Profitability was lower than a year ago, mainly because of a casting shortage that began late in the quarter and the premium freight and overtime we used to keep priority orders on schedule. Backlog reached ${backlog_m} million at {qend}, the highest in our history.""",
    supply="""Most of our large-bore valve bodies and bonnets are poured by Brackwater Foundry Ltd. at its works in Tollis Reach. Brackwater is currently the only qualified source for 38 of our casting patterns, which together account for roughly 60% of our casting spend, and several of our customers' specifications name the approved foundry. On February 21, 2024, one of the two induction furnaces at Tollis Reach failed. Brackwater restarted partial production on its remaining furnace within a week, but its output of heavy-section castings has been below our requirements since then.

To protect delivery dates on project orders, we paid for air freight of castings from Brackwater's secondary pour line, sent some bodies to outside machine shops and ran weekend shifts at Fennick Harbor. These expedite costs totalled ${expedite_m} million in the quarter and are included in cost of revenue. Brackwater has told us that it expects the damaged furnace to return to service during the second quarter. We believe the disruption is temporary, but it is the most significant interruption to our supply chain in more than a decade, and we have begun to review which patterns could be transferred to another foundry if it persists.""",
    results="""**Revenue.** Revenue was ${rev_m} million, an increase of {rev_chg}% from ${rev_py_m} million in the first quarter of 2023. FL-Series shipments to liquefied natural gas customers accounted for most of the increase, together with higher aftermarket sales. Shipments of CG-300 cryogenic valves were lower than planned because finished bodies did not arrive in time for quarter-end acceptance testing.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}% a year earlier. The decline of {gm_pts} percentage points reflects expedite costs of ${expedite_m} million, labour at Fennick Harbor that stood idle while machining cells waited for castings, and surcharges on alloy bar stock.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, reflecting wage increases and higher commissions on the larger order intake. Research and development expense was ${rnd_m} million, mainly for the development of a low-emission packing set for the FL-Series.

**Interest and taxes.** Interest expense was ${interest_m} million compared with ${interest_py_m} million, reflecting higher average borrowings. Our effective tax rate was about 23%.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share, in the first quarter of 2023.

**Backlog.** Backlog, which we define as firm orders not yet shipped, was ${backlog_m} million at {qend} compared with $134.8 million at December 31, 2023. Our book-to-bill ratio was {btb}.""",
    liquidity="""Our principal sources of liquidity are cash from operations and borrowings under our revolving credit facility. At {qend}, cash and cash equivalents were ${cash_m} million and total borrowings were ${debt_m} million, consisting of the term loan and ${revolver_m} million drawn on the revolving facility. After $6.2 million of outstanding letters of credit, ${avail_m} million remained available to borrow. Our consolidated net leverage ratio as defined in the credit agreement was {lev} to 1.00, well within the maximum of 3.50 to 1.00.

Inventories increased to ${inv_m} million from ${inv_ye_m} million at the end of 2023, as partially assembled valves waited for body castings and we bought trim components ahead of the second quarter. During the quarter we paid our regular quarterly dividend of $0.12 per share and repurchased 252,000 shares for $6.0 million under the repurchase program authorized in 2023. We believe that cash on hand, cash from operations and availability under the revolving facility will be sufficient to meet our needs for at least the next twelve months.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report.""",
    risk="""There have been no material changes to the risk factors disclosed in our Annual Report on Form 10-K for the year ended December 31, 2023, except as follows.

**We depend on a single-source supplier for many of our valve body castings, and its output has been reduced.** As described under "Casting Supply" in Item 2, a furnace failure at Brackwater Foundry has reduced the supply of heavy-section castings since late February 2024. If the repair takes longer than Brackwater expects, we could incur further expedite costs, delay shipments and lose orders. Qualifying another foundry would take time and may require our customers' approval.""",
    other="""During the quarter ended {qend}, none of our directors or officers adopted or terminated a plan for the purchase or sale of our securities intended to satisfy the affirmative defense conditions of Rule 10b5-1(c).""",
    exhibit_items="",
)

# --------------------------------------------------------------------------- 2024-Q2
Q["2024-Q2"] = dict(
    fls=["the output of Brackwater Foundry, our single-source supplier for most heavy-section castings, and the duration of its allocation of castings among customers;",
         "our ability to qualify an additional casting source, and the time and customer approvals that qualification requires;",
         "expedite costs, late-delivery penalties and order cancellations if shipments continue to slip;",
         "the outcome of a warranty claim asserted by a midstream customer concerning R-40 pressure-relief valves;",
         "our ability to remain in compliance with the financial covenants in our credit agreement; and",
         "the other risks described in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2023 and in Part II, Item 1A of this report."],
    critical_extra="During the quarter we increased the product warranty reserve for a specific lot of R-40 valves, as described in Note 4, and we considered whether the reduced margins on certain fixed-price orders required loss provisions; none were required at {qend}.",
    rate_sens="0.6",
    note_debt="""**Note 3 -- Debt.** Our credit agreement with a syndicate of lenders led by Westerholm National Bank, N.A. provides a $100.0 million revolving credit facility maturing in June 2027 and a term loan that amortizes at $1.25 million per quarter. At {qend}, ${term_m} million was outstanding under the term loan and ${revolver_m} million under the revolving facility. The agreement requires a consolidated net leverage ratio of not more than 3.50 to 1.00 and an interest coverage ratio of not less than 3.00 to 1.00 at the end of each quarter. We were in compliance with both covenants at {qend}. Lower earnings in coming quarters would increase our leverage ratio; see Liquidity and Capital Resources in Item 2.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** In May 2024, Greywether Midstream Partners, L.P. ("Greywether") delivered a written notice of claim asserting that three of 212 R-40 pressure-relief valves we supplied in 2023 for its Calloway Flats compressor station failed to reseat during commissioning in March 2024, causing a venting event and a shutdown of the station for 19 days. Greywether demands reimbursement of losses that it estimates exceed $30 million, including lost throughput and remediation costs. Our terms of sale limit our obligation to the repair or replacement of nonconforming products and exclude consequential damages. Our investigation of the returned valves is continuing. During the quarter we recorded a warranty charge of $0.9 million for the replacement of the remaining valves in the affected production lot. We are unable at this time to estimate any loss in excess of the amount recorded, and we intend to contest any claim for consequential damages.

The product warranty reserve was $3.8 million at {qend} compared with $3.0 million at December 31, 2023.""",
    note_extra="""**Note 5 -- Subsequent Event.** On July 30, 2024, our Board of Directors suspended the quarterly cash dividend and the share repurchase program, beginning with the dividend that would have been declared for the third quarter of 2024.""",
    overview="""The casting shortage that began in February worsened during the second quarter. Our principal casting supplier placed its customers on allocation, shipments fell short of our requirements in every month of the quarter, and we could not complete many valves that were otherwise ready. Revenue declined {rev_chg}% to ${rev_m} million, gross margin fell to {gm}%, and net income was ${ni_m} million compared with ${ni_py_m} million a year earlier.

Demand, by contrast, remained strong. Orders exceeded shipments by a wide margin, and backlog rose to a record ${backlog_m} million. Our near-term results depend far more on our supply chain, and in particular on the supply of castings, than on demand. In response, we have begun work to qualify a second foundry, reduced discretionary spending and, after the end of the quarter, suspended the dividend and share repurchases to preserve cash.

During the quarter we also received a warranty claim from a midstream customer relating to a lot of R-40 pressure-relief valves, which we describe in Note 4.""",
    supply="""Brackwater Foundry's damaged furnace returned to service in May, but output did not recover as Brackwater had expected. Scrap rates on heavy-section pours rose, with porosity the most frequent cause of rejection, and a dispute between Brackwater and its hourly workforce at Tollis Reach reduced the number of shifts it could run. From June 1, 2024, Brackwater allocated its output among customers at approximately 70% of requested tonnage. We received about 61% of the castings, by weight, that our production plan required in the quarter.

We spent ${expedite_m} million on expedite costs in the quarter, compared with $1.1 million in the first quarter, for air freight, outside machining, overtime and additional inspection of incoming castings. Some customers have begun to assess late-delivery penalties under their contracts, and we reduced revenue by $0.6 million for penalties incurred or expected on orders shipped late.

We have started discussions with three foundries about transferring our highest-volume patterns. Qualifying a new source is not quick: patterns and core boxes must be transferred or rebuilt, first-article castings must be poured, machined and tested, and for many project orders the customer must approve the foundry itself. Historically this has taken 12 to 18 months. We are working to shorten that period, but we cannot be certain we will succeed.""",
    results="""**Revenue.** Revenue was ${rev_m} million, a decrease of {rev_chg}% from ${rev_py_m} million in the second quarter of 2023. Shipments of FL-Series and CG-300 valves, which depend most heavily on Brackwater castings, declined sharply. K-Series knife gate valves, which use smaller castings from other suppliers, and aftermarket parts grew. For the first six months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}% a year earlier, a decline of {gm_pts} percentage points. Expedite costs of ${expedite_m} million, the $0.9 million warranty charge, lower absorption of fixed costs at Fennick Harbor and late-delivery penalties all contributed.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million. The increase reflects legal and consulting fees related to the casting disruption and the Greywether claim, partly offset by lower incentive compensation. Research and development expense was ${rnd_m} million.

**Interest and taxes.** Interest expense rose to ${interest_m} million from ${interest_py_m} million because of higher borrowings and rates. Income tax expense was ${tax_m} million.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share, a year earlier. For the first six months, net income was ${ytd_ni_m} million compared with ${ytd_ni_py_m} million.

**Backlog.** Backlog was ${backlog_m} million at {qend}, up from $142.6 million at March 31, 2024 and $134.8 million at December 31, 2023. The book-to-bill ratio was {btb}. A growing share of backlog is past its original delivery date, which increases the risk of cancellations and penalties.""",
    liquidity="""At {qend}, cash and cash equivalents were ${cash_m} million and total borrowings were ${debt_m} million, including ${revolver_m} million drawn on the revolving facility. Availability under the revolving facility was ${avail_m} million after outstanding letters of credit. Inventories rose to ${inv_m} million from ${inv_ye_m} million at the end of 2023, and accounts payable declined as some suppliers shortened our payment terms.

Our consolidated net leverage ratio was {lev} to 1.00 at {qend}, compared with the maximum of 3.50 to 1.00 permitted by the credit agreement. Because the ratio is measured on trailing twelve-month earnings, continued weakness in the second half of the year would raise it. If casting supply does not improve, our leverage ratio could approach the maximum by the end of 2024, and we have begun discussions with our lenders about the covenant. To preserve liquidity, on July 30, 2024 the Board suspended our quarterly dividend, which had cost about $2.6 million per quarter, and suspended share repurchases. We have also deferred $3.0 million of planned capital expenditure.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report, for a description of the warranty claim asserted by Greywether Midstream Partners, L.P.""",
    risk="""Except as set out below, there have been no material changes to the risk factors disclosed in our Annual Report on Form 10-K for the year ended December 31, 2023.

**The disruption at our single-source casting supplier has become more severe and may continue.** Brackwater Foundry has placed its customers on allocation, and its output has remained below our requirements. If this continues, we expect to incur further expedite costs, late-delivery penalties and cancellations, and our revenue, margins and cash flow could decline further. Our efforts to qualify an additional foundry may take longer or cost more than we expect, and some customers may not approve a new source.

**We are subject to a warranty claim that could result in litigation.** A customer has asserted that certain R-40 pressure-relief valves failed in service and demands compensation well in excess of the purchase price. Although our terms of sale limit our liability, a court might not enforce those limits, and the cost of defending the claim could be significant.

**A decline in earnings could cause us to breach the financial covenants in our credit agreement.** If we were unable to comply with the leverage covenant, and our lenders did not agree to amend or waive it, the lenders could declare our borrowings immediately due and payable and stop making new loans.""",
    other="""On July 30, 2024, our Board of Directors suspended the quarterly cash dividend and the share repurchase program. The Board will consider reinstating them when casting supply and earnings have recovered. During the quarter ended {qend}, none of our directors or officers adopted or terminated a Rule 10b5-1 trading arrangement.""",
    exhibit_items="",
)

# --------------------------------------------------------------------------- 2024-Q3
# (published inside the submission wrapper; see make_corpus.py)
Q["2024-Q3"] = dict(
    fls=["the financial condition of Brackwater Foundry, which commenced a court-supervised restructuring in September 2024, and its ability to supply castings;",
         "the timing of qualifying Ruddock & Thane Castings as a second source, including approval by our customers;",
         "our ability to comply with the amended financial covenants in our credit agreement;",
         "the outcome of the lawsuit filed against us by Greywether Midstream Partners, L.P.; and",
         "cancellations of backlog orders, late-delivery penalties and the loss of customers to competitors."],
    critical_extra="We tested goodwill for impairment in the quarter; none existed at {qend}, but the margin of fair value over carrying value has narrowed.",
    rate_sens="0.7",
    note_debt="""**Note 3 -- Debt.** At {qend}, ${term_m} million was outstanding under our term loan and ${revolver_m} million under our revolving credit facility, and we were in compliance with the financial covenants of the credit agreement. On October 28, 2024, we entered into the First Amendment to the credit agreement. It raises the maximum consolidated net leverage ratio to 4.75 to 1.00 for the quarters ending December 31, 2024 through June 30, 2025; adds a minimum liquidity requirement of $15.0 million, tested monthly; increases the interest margin by 0.50%; and prohibits dividends and share repurchases while the higher limit applies.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** On August 19, 2024, Greywether Midstream Partners, L.P. filed a complaint against the Company in the Circuit Court of Marrow County alleging breach of express and implied warranties, negligence and negligent misrepresentation in connection with R-40 pressure-relief valves supplied for its Calloway Flats compressor station. The plaintiff alleges that the valves failed to reseat during commissioning, causing a venting event and a 19-day shutdown, and seeks damages of not less than $38.0 million, plus interest, costs and attorneys' fees.

We believe we have meritorious defenses and intend to defend the action vigorously. Our terms of sale limit our obligation to repair or replacement, cap our liability at the purchase price of $1.7 million and exclude consequential damages. Our insurers have reserved their rights. Litigation is inherently uncertain. We have not recorded a liability beyond the warranty reserve, because a loss is not probable and we cannot reasonably estimate the amount or range of any possible loss.""",
    note_extra="""**Note 5 -- Supply Assurance Agreement.** On September 9, 2024, Brackwater Foundry Ltd., our principal supplier of body castings, commenced a court-supervised restructuring proceeding. On September 20, 2024, we advanced $4.0 million to Brackwater, to be credited against future purchases, in exchange for a minimum monthly allocation of castings. The advance is included in prepaid expenses and other current assets; its recovery depends on Brackwater's continued operation, and there can be no assurance that it will be recovered in full.""",
    overview="""The third quarter was the most difficult in our recent history. Casting supply deteriorated further after our principal foundry entered a court-supervised restructuring, and we could not ship a large part of what our customers had ordered. Revenue declined {rev_chg}% to ${rev_m} million, gross margin fell to {gm}%, and we reported a net loss of ${ni_m} million, or ${eps} per share, compared with net income of ${ni_py_m} million a year earlier.

In response we selected a second casting source, advanced funds to Brackwater, amended our credit agreement after the end of the quarter and reduced salaried headcount by 6%. In August, Greywether Midstream Partners, L.P. sued us over R-40 pressure-relief valves (Note 4); we dispute the claims.""",
    supply="""Brackwater Foundry's deliveries to us in September were approximately 45% of our requirements by weight, and castings that did arrive showed more porosity defects. We wrote down $1.9 million of castings and partially machined bodies that failed inspection. Expedite costs were ${expedite_m} million; we had incurred none in the third quarter of 2023. We have placed two quality engineers at Tollis Reach, but we cannot be certain that Brackwater will meet its allocation commitment or complete its restructuring.

In August we selected Ruddock & Thane Castings, Inc. of Ironlee as a second source and began transferring the 40 patterns that account for most of our casting volume. First-article castings are expected in the fourth quarter and production castings in the first half of 2025, subject to test results and, for many orders, customer approval of the new foundry. Until then, we remain dependent on Brackwater.""",
    results="""**Revenue.** Revenue was ${rev_m} million, down {rev_chg}% from ${rev_py_m} million a year earlier and {rev_seq_chg}% from the second quarter. Two customers cancelled orders totalling $5.8 million because of repeated delays, and late-delivery penalties reduced revenue by $1.4 million. Nine-month revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}%. Expedite costs, the inventory write-down, penalties and under-absorbed fixed costs at both plants account for the decline.

**Operating expenses.** Selling, general and administrative expense rose to ${sga_m} million from ${sga_py_m} million, including $1.1 million of legal fees and $0.8 million of severance.

**Interest and taxes.** Interest expense was ${interest_m} million compared with ${interest_py_m} million. We recorded a tax benefit of ${tax_m} million.

**Net loss and backlog.** The net loss was ${ni_m} million, or ${eps} per share. Backlog was ${backlog_m} million, much of it past its original delivery date; further cancellations are possible, and backlog is not necessarily indicative of future revenue.""",
    liquidity="""At {qend}, cash was ${cash_m} million, borrowings were ${debt_m} million and revolver availability was ${avail_m} million, for total liquidity of ${liq_m} million. Operating cash flow was negative as inventories rose to ${inv_m} million, suppliers tightened credit terms and we made the advance to Brackwater.

Our net leverage ratio was {lev} to 1.00, within the 3.50 maximum, but our forecasts showed it would likely exceed that maximum at year-end, which led to the First Amendment (Note 3). Compliance with the amended covenants depends on a recovery in casting supply that we do not fully control. If we fail to comply, and the lenders do not waive the default, they could terminate their commitments and require immediate repayment of all borrowings. We have no commitment for alternative financing.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report.""",
    risk="""In addition to the risk factors in our Annual Report on Form 10-K for 2023 and our report for the quarter ended June 30, 2024, you should consider the following.

**Our principal casting supplier is in a court-supervised restructuring.** Our supply chain remains dependent on a single-source supplier for most heavy-section castings. If Brackwater's restructuring fails or its deliveries decline further, we may be unable to ship much of our backlog until a second source is qualified, and we may lose the $4.0 million advance.

**We may be unable to comply with our amended covenants.** The First Amendment provides relief only through June 30, 2025. A further amendment or waiver may not be available, or may carry higher costs and tighter restrictions, and an event of default could require immediate repayment that we might not be able to fund.

**We are a defendant in litigation seeking substantial damages.** An adverse judgment or a settlement above our insurance coverage could materially affect our financial condition and liquidity.""",
    other="""The dividend and share repurchases remain suspended, and the First Amendment prohibits them while the higher leverage limit applies. No director or officer adopted or terminated a Rule 10b5-1 trading arrangement during the quarter.""",
    exhibit_items="- 10.1 First Amendment to Credit Agreement, dated October 28, 2024.\n- 10.2 Supply Assurance Agreement, dated September 20, 2024, with Brackwater Foundry Ltd.",
)

# --------------------------------------------------------------------------- 2025-Q1
Q["2025-Q1"] = dict(
    fls=["our ability to comply with the minimum liquidity and minimum adjusted EBITDA covenants in our credit agreement as amended by the Second Amendment and Waiver, and to reach agreement with our lenders on terms after the covenant relief period;",
         "the pace at which Ruddock & Thane Castings completes qualification of our remaining patterns and increases deliveries;",
         "Brackwater Foundry's performance under its new ownership;",
         "the outcome of the lawsuit filed by Greywether Midstream Partners, L.P.;",
         "the conversion of our backlog into revenue, cancellations and late-delivery penalties; and",
         "the other risks described in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024."],
    critical_extra="As discussed in our Annual Report, we maintain a full valuation allowance against our U.S. deferred tax assets, and we will continue to evaluate whether positive evidence supports releasing it.",
    rate_sens="0.8",
    note_debt="""**Note 3 -- Debt.** At {qend}, ${term_m} million was outstanding under our term loan and ${revolver_m} million under our revolving credit facility. As described in our Annual Report, our consolidated net leverage ratio at December 31, 2024 exceeded the maximum permitted by the First Amendment, and on March 10, 2025 we entered into the Second Amendment and Waiver with our lenders. The Second Amendment waived that default; suspended the leverage covenant for the quarters ending March 31, June 30 and September 30, 2025, reinstating it at 4.25 to 1.00 from December 31, 2025; requires minimum liquidity of $15.0 million, tested weekly, and minimum cumulative adjusted EBITDA, tested monthly; increases the interest margin by a further 1.50%; and requires us to deliver a rolling 13-week cash flow forecast to the lenders each week. We were in compliance with the amended covenants at {qend}.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** We are a defendant in an action filed on August 19, 2024 by Greywether Midstream Partners, L.P. in the Circuit Court of Marrow County, in which the plaintiff alleges breach of warranty, negligence and negligent misrepresentation relating to R-40 pressure-relief valves and seeks damages of not less than $38.0 million. On February 14, 2025, the court dismissed the negligent misrepresentation count but declined to dismiss the negligence count at this stage. Discovery is under way, and the court has ordered the parties to attend mediation in June 2025. Our third-party complaint against Brackwater Foundry Ltd. for contribution and indemnity remains stayed.

We continue to believe that we have meritorious defenses, including the limitation of remedies in our terms of sale. Because of the uncertainties of litigation, we cannot predict the outcome. We have not recorded a liability for this matter because we have concluded that a loss is not probable, and we are not able to estimate a reasonably possible range of loss at this stage. Our insurers continue to reserve their rights.

The product warranty reserve was $3.5 million at {qend} compared with $3.6 million at December 31, 2024.""",
    note_extra="""**Note 5 -- Liquidity.** As disclosed in our Annual Report, in preparing our 2024 financial statements management identified conditions, principally the covenant default at December 31, 2024 and the continuing casting disruption, that raised substantial doubt about the Company's ability to continue as a going concern, and concluded that its plans, including the Second Amendment and Waiver, alleviated that doubt. Management has updated this evaluation at {qend} and continues to conclude that substantial doubt has been alleviated. Our ability to meet our obligations depends on continued compliance with the amended covenants, which in turn depends on the recovery of shipments described in Item 2.""",
    overview="""The first quarter of 2025 marked the beginning of a recovery, although our results remain well below historical levels. Revenue was ${rev_m} million, {rev_seq_chg}% higher than in the fourth quarter of 2024 but {rev_chg}% lower than in the first quarter of 2024. Gross margin improved to {gm}% from {gm_pq}% in the fourth quarter. We reported a net loss of ${ni_m} million, or ${eps} per share.

The most important development was the progress of our second casting source. Ruddock & Thane Castings received first-article approval for 22 of the 40 patterns we transferred, and its first production castings arrived at Fennick Harbor in March. Brackwater Foundry completed its restructuring in February under new ownership and increased its deliveries to us. In March we also completed the Second Amendment and Waiver with our lenders, which waived the covenant default at December 31, 2024 and replaced the leverage test with liquidity and earnings tests through the third quarter.

We still face significant risks. Our liquidity is limited, our covenants leave little room for a setback, and the Greywether litigation is continuing.""",
    supply="""Ruddock & Thane poured first-article castings for all 40 transferred patterns between December and February. By March 31, 22 patterns had passed our dimensional, radiographic and pressure testing and had been approved by the customers whose specifications require it; the remaining 18 are in testing or awaiting customer approval. Our supply chain is beginning to stabilize. Ruddock & Thane supplied 12% of our casting requirements by weight in March, and we expect that share to reach about one third by the end of the second quarter.

In February 2025, Brackwater's restructuring was completed, and the foundry is now owned by a group of industrial investors who have committed new capital for a second furnace reline and additional moulding capacity. Brackwater's deliveries rose to about 75% of our requirements in March, and its defect rates improved. The $4.0 million advance under our supply assurance agreement was assumed by the new owner and is being credited against purchases at $0.4 million per month.

Expedite costs were ${expedite_m} million, down from $6.9 million in the fourth quarter of 2024. We expect them to decline further as deliveries from both foundries increase, but we will continue to air-freight castings for the most urgent orders.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in the first quarter of 2024, a decrease of {rev_chg}%, and ${rev_pq_m} million in the fourth quarter of 2024. Shipments of FL-Series valves increased from the fourth quarter as castings became available, while CG-300 shipments remained limited by customer approval of the second source.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}% a year earlier. Expedite costs of ${expedite_m} million, first-article testing costs and continued under-absorption of fixed costs weighed on margin, partly offset by lower penalties.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including $0.9 million of legal fees. Research and development expense was ${rnd_m} million.

**Interest and taxes.** Interest expense rose to ${interest_m} million from ${interest_py_m} million because of higher borrowings and the higher margins under our amended credit agreement. Because we maintain a full valuation allowance, we did not record a tax benefit on the pre-tax loss; income tax expense of ${tax_m} million relates to foreign and state taxes.

**Net loss.** The net loss was ${ni_m} million, or ${eps} per share, compared with net income of ${ni_py_m} million, or ${eps_py} per share, in the first quarter of 2024.

**Backlog.** Backlog was ${backlog_m} million at {qend}, compared with $201.7 million at December 31, 2024, and the book-to-bill ratio was {btb}.""",
    liquidity="""At {qend}, cash and cash equivalents were ${cash_m} million, total borrowings were ${debt_m} million, and availability under the revolving facility was ${avail_m} million, for total liquidity of ${liq_m} million compared with the minimum of $15.0 million required by the Second Amendment. Our liquidity was at its lowest point in mid-February, before collections on fourth-quarter shipments, when it fell to approximately $17 million.

We expect operating cash flow to turn positive in the second quarter as shipments rise and inventories decline from ${inv_m} million. However, our margin over the minimum liquidity covenant is narrow. If shipments recover more slowly than we expect, or if we are required to make a significant payment in the Greywether litigation, we could breach the covenant. The leverage covenant will be reinstated at 4.25 to 1.00 for the quarter ending December 31, 2025, and our ability to meet it depends on continued improvement in earnings. Capital expenditure is limited to $12.0 million in 2025 under the Second Amendment.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report.""",
    risk="""There have been no material changes to the risk factors disclosed in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024, which include risks relating to our liquidity and ability to continue as a going concern, our compliance with the covenants of our amended credit agreement, our dependence on a limited number of casting suppliers, and the Greywether litigation.""",
    other="""During the quarter ended {qend}, none of our directors or officers adopted or terminated a Rule 10b5-1 trading arrangement.""",
    exhibit_items="- 10.1 Second Amendment and Waiver to Credit Agreement, dated March 10, 2025.",
)

# --------------------------------------------------------------------------- 2025-Q2
Q["2025-Q2"] = dict(
    fls=["our ability to remain in compliance with the covenants of our amended credit agreement, including the leverage covenant that will be reinstated at December 31, 2025;",
         "continued improvement in casting deliveries from Ruddock & Thane Castings and Brackwater Foundry;",
         "the outcome of the lawsuit filed by Greywether Midstream Partners, L.P., which is scheduled for trial in March 2026;",
         "order intake, given that customers placed fewer new orders while our deliveries were unreliable; and",
         "the other risks described in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024."],
    critical_extra="There were no changes to our critical accounting estimates during the quarter.",
    rate_sens="0.8",
    note_debt="""**Note 3 -- Debt.** At {qend}, ${term_m} million was outstanding under our term loan and ${revolver_m} million under our revolving credit facility. Under the Second Amendment and Waiver dated March 10, 2025, the leverage covenant is suspended through September 30, 2025 and will be reinstated at 4.25 to 1.00 for the quarter ending December 31, 2025; until then we must maintain minimum liquidity of $15.0 million and minimum cumulative adjusted EBITDA. We were in compliance with these covenants throughout the quarter.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** In the action brought by Greywether Midstream Partners, L.P. in the Circuit Court of Marrow County, the parties attended court-ordered mediation on June 24, 2025, which ended without a resolution. The court has set the case for trial beginning March 9, 2026. The plaintiff continues to seek damages of not less than $38.0 million. Expert reports exchanged in the quarter attribute the failure of the valves to porosity in the body castings and to the setting of the valve springs; the parties disagree about responsibility for those conditions and about the enforceability of the limitation of remedies in our terms of sale.

We continue to defend the action. Based on the information developed in discovery and mediation, we have concluded that a loss is reasonably possible but not probable. We estimate the range of reasonably possible loss, net of expected insurance recoveries, to be between zero and $12 million. No liability has been recorded. Our insurers have confirmed coverage of up to $6.0 million for this matter, subject to a reservation of rights with respect to certain damages.""",
    note_extra="""**Note 5 -- Liquidity.** Management has updated its evaluation of the Company's ability to continue as a going concern at {qend} and continues to conclude that the substantial doubt identified at December 31, 2024 has been alleviated by management's plans, including the Second Amendment and Waiver and the qualification of a second casting supplier.""",
    overview="""Our recovery gathered pace in the second quarter. Revenue rose {rev_seq_chg}% from the first quarter to ${rev_m} million, close to the level of a year ago, gross margin improved to {gm}%, and the net loss narrowed to ${ni_m} million. Operating cash flow was positive, and we reduced borrowings for the first time since the casting disruption began.

Ruddock & Thane Castings completed qualification of all 40 transferred patterns in May, and it supplied 31% of our casting requirements by weight in the quarter. With two qualified foundries, our supply chain is more resilient than at any time in our history, and expedite costs fell to ${expedite_m} million. Shipments from our backlog accelerated, and past-due orders fell by more than half from their peak.

Two matters still require attention. First, order intake slowed: customers who had waited for delayed valves placed fewer new orders, and the book-to-bill ratio was {btb}. Second, mediation in the Greywether litigation did not resolve the case, and the court has set a trial date in March 2026.""",
    supply="""All 40 patterns transferred to Ruddock & Thane had received first-article approval by May 19, 2025, and every customer whose specifications required approval of the foundry has now given it. Ruddock & Thane's deliveries to us increased each month, and in June it supplied 36% of our requirements. Brackwater Foundry supplied most of the remainder; its on-time delivery improved to 88% in June, compared with less than half during the worst months of 2024.

We now have two qualified sources for each of our highest-volume castings, and we intend to keep both. Our target is to buy roughly 40% to 45% of our heavy-section castings from Ruddock & Thane and the rest from Brackwater, so that a disruption at either foundry would no longer stop our production. Expedite costs of ${expedite_m} million in the quarter were mainly for air freight of castings for orders that were already late.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in the second quarter of 2024, a decrease of {rev_chg}%, and ${rev_pq_m} million in the first quarter of 2025. FL-Series and CG-300 shipments rose sharply from the first quarter. For the first six months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}% a year earlier and {gm_pq}% in the first quarter of 2025, reflecting lower expedite costs, better absorption of fixed costs and fewer penalties.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including $1.2 million of legal fees for the Greywether litigation. Research and development expense was ${rnd_m} million.

**Interest and taxes.** Interest expense was ${interest_m} million compared with ${interest_py_m} million. Income tax expense of ${tax_m} million relates to foreign and state taxes.

**Net loss.** The net loss was ${ni_m} million, or ${eps} per share, compared with net income of ${ni_py_m} million, or ${eps_py} per share, in the second quarter of 2024. For the first six months, the net loss was ${ytd_ni_m} million.

**Backlog.** Backlog was ${backlog_m} million at {qend}, down from $204.1 million at March 31, 2025, as shipments exceeded new orders.""",
    liquidity="""At {qend}, cash and cash equivalents were ${cash_m} million, total borrowings were ${debt_m} million, and availability under the revolving facility was ${avail_m} million, giving total liquidity of ${liq_m} million, compared with the $15.0 million minimum. Operating cash flow was positive in the quarter, as inventories fell to ${inv_m} million from $101.2 million at March 31, 2025 and suppliers restored some of our normal payment terms.

The leverage covenant will be reinstated at 4.25 to 1.00 for the quarter ending December 31, 2025. On our current forecast we expect to comply with it, but our forecast assumes continued improvement in shipments and margins, and it does not include any payment in the Greywether litigation in excess of insurance. We continue to report weekly to our lenders and to restrict capital expenditure, dividends and share repurchases as the Second Amendment requires.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report.""",
    risk="""There have been no material changes to the risk factors disclosed in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024.""",
    other="""During the quarter ended {qend}, none of our directors or officers adopted or terminated a Rule 10b5-1 trading arrangement.""",
    exhibit_items="",
)

# --------------------------------------------------------------------------- 2025-Q3
Q["2025-Q3"] = dict(
    fls=["our ability to comply with the leverage covenant that is reinstated at December 31, 2025;",
         "the level of new orders, as customers rebuild confidence in our delivery performance;",
         "the performance of our two casting suppliers;",
         "the payment of the Greywether settlement and the related insurance recoveries; and",
         "the other risks described in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024."],
    critical_extra="We recorded the Greywether settlement net of the insurance recovery that our insurers have agreed in writing to pay, as described in Note 4.",
    rate_sens="0.8",
    note_debt="""**Note 3 -- Debt.** At {qend}, ${term_m} million was outstanding under our term loan and ${revolver_m} million under our revolving credit facility. We were in compliance with the minimum liquidity and minimum cumulative adjusted EBITDA covenants of the Second Amendment and Waiver throughout the quarter. The consolidated net leverage covenant will be reinstated at 4.25 to 1.00 for the quarter ending December 31, 2025. Calculated as the credit agreement defines it, our net leverage ratio at {qend} would have been {adj_lev} to 1.00.""",
    note_contingencies="""**Note 4 -- Commitments and Contingencies.** On September 26, 2025, we entered into a settlement agreement with Greywether Midstream Partners, L.P. resolving the action Greywether filed against us in August 2024 in the Circuit Court of Marrow County. Under the agreement, Greywether will receive $9.5 million, of which $6.0 million will be paid by our insurers and $3.5 million by the Company, in exchange for a full release of its claims. The settlement contains no admission of liability. We recorded a charge of $3.5 million, net of the insurance recovery, in the quarter; the full settlement amount is included in accrued liabilities and the insurance recovery in prepaid expenses and other current assets at {qend}. The parties will ask the court to dismiss the action with prejudice once the payments are made, which we expect in the fourth quarter.

We are in discussions with Brackwater Foundry about the third-party claim we filed against it for contribution. The product warranty reserve was $3.2 million at {qend}.""",
    note_extra="",
    overview="""We returned to profitability in the third quarter. Revenue was ${rev_m} million, {rev_chg}% higher than a year ago, when the casting disruption was at its most severe. Gross margin recovered to {gm}%, and we reported net income of ${ni_m} million, or ${eps} per share, after a net charge of ${special_m} million to settle the Greywether litigation.

Settling the litigation removes a significant uncertainty. The settlement of $9.5 million is largely funded by our insurers, and we will pay our $3.5 million share from available liquidity in the fourth quarter.

Both casting suppliers performed well. Ruddock & Thane supplied 38% of our casting requirements in the quarter, expedite costs fell to ${expedite_m} million, and our on-time delivery to customers reached 91% in September, the best level since the end of 2023. We cleared nearly all of the past-due orders that had accumulated during the disruption.""",
    supply="""Deliveries from both foundries were steady throughout the quarter. Ruddock & Thane supplied 38% of our heavy-section castings by weight and Brackwater Foundry the rest, and the combined defect rate at our incoming inspection was the lowest we have recorded since we began tracking it in 2021. The $4.0 million advance to Brackwater has been fully credited against purchases.

We have made the dual-source arrangement a permanent feature of our supply chain. In August we signed a three-year supply agreement with Ruddock & Thane that sets capacity reservations for our 40 highest-volume patterns, and we have begun transferring a further 25 patterns. We also now hold a safety stock of about six weeks of our most critical castings at Fennick Harbor.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in the third quarter of 2024, an increase of {rev_chg}%, and ${rev_pq_m} million in the second quarter of 2025. Most of the growth came from FL-Series and CG-300 valves, as we shipped orders that had been delayed. For the first nine months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross profit.** Gross margin was {gm}% compared with {gm_py}% a year earlier. Margin benefited from lower expedite costs, better absorption of fixed costs and the absence of the inventory write-down and penalties recorded a year ago.

**Litigation settlement.** We recorded a charge of ${special_m} million for our share of the Greywether settlement.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million. Research and development expense increased to ${rnd_m} million, as we resumed work on the low-emission packing set that we had deferred in 2024.

**Interest and taxes.** Interest expense was ${interest_m} million compared with ${interest_py_m} million. Income tax expense of ${tax_m} million relates to foreign and state taxes.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with a net loss of ${ni_py_m} million, or ${eps_py} per share, in the third quarter of 2024. For the first nine months, the {ytd_ni_word} was ${ytd_ni_m} million.

**Backlog.** Backlog was ${backlog_m} million at {qend}. Order intake improved during the quarter, particularly from liquefied natural gas customers, although shipments still exceeded new orders.""",
    liquidity="""At {qend}, cash and cash equivalents were ${cash_m} million, total borrowings were ${debt_m} million, and availability under the revolving facility was ${avail_m} million, for total liquidity of ${liq_m} million. Operating cash flow was positive for the second consecutive quarter, and inventories fell to ${inv_m} million.

We expect to be in compliance with the leverage covenant when it is reinstated at 4.25 to 1.00 at December 31, 2025. We have begun discussions with our lenders about extending the maturity of the credit facility and ending the additional reporting requirements of the Second Amendment. We expect to pay our $3.5 million share of the Greywether settlement in October from available liquidity.""",
    legal="""See Note 4, Commitments and Contingencies, in Part I, Item 1 of this report, for a description of the settlement of the action brought by Greywether Midstream Partners, L.P.""",
    risk="""There have been no material changes to the risk factors disclosed in Item 1A of our Annual Report on Form 10-K for the year ended December 31, 2024, except that the risk relating to the Greywether litigation has been substantially reduced by the settlement described in Note 4.""",
    other="""During the quarter ended {qend}, none of our directors or officers adopted or terminated a Rule 10b5-1 trading arrangement.""",
    exhibit_items="- 10.1 Supply Agreement, dated August 14, 2025, between the Company and Ruddock & Thane Castings, Inc.",
)


def quarterly_dml(p, m):
    d = dict(Q[p])
    fls_items = "\n".join("- " + i for i in d.pop("fls"))
    vals = dict(m)
    vals.update(shares_date=SHARES_OUT[p][0], shares_out=SHARES_OUT[p][1], filed=FILED[p])
    # the first pass fills the section slots, the second the figures inside them
    shape = QUARTERLY_SHAPE.replace("{fls_items}", fls_items)
    for k, v in d.items():
        shape = shape.replace("{" + k + "}", v)
    return shape.format_map(vals)
