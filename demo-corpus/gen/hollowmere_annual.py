"""Hollowmere Valve Works, Inc. -- annual reports (Form 10-K style) for fiscal
2023 (published as old-style plain text), 2024 (the worst point) and 2025."""

from hollowmere_reports import FILED, SHARES_OUT

COVER_K = """
!c UNITED STATES
!c SECURITIES AND EXCHANGE COMMISSION

!c FORM 10-K

!c [X] ANNUAL REPORT UNDER SECTION 13 OR 15(d) OF THE SECURITIES EXCHANGE ACT OF 1934
!c For the fiscal year ended December 31, {year}
!c Commission File Number 001-99117

!c HOLLOWMERE VALVE WORKS, INC.
!c (Exact name of registrant as specified in its charter)
!c Incorporated in Delaware -- I.R.S. Employer Identification No. 88-0417726
!c 400 Foundry Row, Fennick Harbor -- Telephone (555) 014-2200

Common Stock, par value $0.01 per share, is registered under Section 12(b) of the Act and listed on the Kellbrook Securities Exchange. The registrant has filed every report required by Section 13 or 15(d) of the Act during the preceding 12 months and has been subject to those requirements for the past 90 days. The registrant is an accelerated filer and is not a shell company. {auditor_icfr_cover}

The aggregate market value of common stock held by non-affiliates on June 30, {year}, the last business day of the registrant's second fiscal quarter, was approximately ${float_m} million. As of {shares_date}, {shares_out} shares of common stock were outstanding. Portions of the proxy statement for the {next_year} annual meeting of stockholders are incorporated by reference into Part III.

[toc]
"""

SHAPE_K = COVER_K + """
## PART I

## Item 1. Business

{business}

## Item 1A. Risk Factors

{risks}

## Item 1B. Unresolved Staff Comments

None.

## Item 1C. Cybersecurity

We maintain a program to identify and manage risks from cybersecurity threats to our plant networks and business systems, overseen by the Audit Committee of the Board and led by our Director of Information Security, who reports to the Chief Financial Officer. {cyber_year}

## Item 2. Properties

We own our headquarters, machining and assembly plant in Fennick Harbor (approximately 410,000 square feet) and our cryogenic and relief-valve assembly plant in Saint-Aurèle-des-Pins (approximately 165,000 square feet). {properties_extra}

## Item 3. Legal Proceedings

{legal}

## Item 4. Mine Safety Disclosures

Not applicable.

## PART II

## Item 5. Market for Registrant's Common Equity, Related Stockholder Matters and Issuer Purchases of Equity Securities

Our common stock is listed on the Kellbrook Securities Exchange. As of {shares_date}, there were approximately 1,140 holders of record. {dividends}

## Item 6. [Reserved]

## Item 7. Management's Discussion and Analysis of Financial Condition and Results of Operations

### Overview

{mdna_overview}

### Results of Operations

{results}

### Liquidity and Capital Resources

{liquidity}

## Item 7A. Quantitative and Qualitative Disclosures About Market Risk

Our borrowings bear interest at floating rates; a 100 basis point increase in the benchmark rate would change annual interest expense by approximately ${rate_sens} million at year-end borrowing levels. We buy castings, forgings and bar stock whose prices follow steel and scrap markets, and our Saint-Aurèle-des-Pins plant buys some components priced in euros. {fx_note}

## Item 8. Financial Statements and Supplementary Data

{audit}

[table:is]

[table:bs]

[table:cf]

{notes}

## Item 9. Changes in and Disagreements with Accountants on Accounting and Financial Disclosure

None.

## Item 9A. Controls and Procedures

Management, with the participation of our Chief Executive Officer and Chief Financial Officer, evaluated our disclosure controls and procedures as of December 31, {year} and concluded that they were effective. Management assessed our internal control over financial reporting as of December 31, {year} using the criteria of the 2013 Internal Control -- Integrated Framework and concluded that it was effective. Ashcombe & Pryor LLP, our independent registered public accounting firm, has issued an unqualified report on the effectiveness of our internal control over financial reporting. There was no change in internal control over financial reporting during the fourth quarter that materially affected it.

## Item 9B. Other Information

{other9b}

## PART III

## Items 10 through 14

The information required by these items (directors, executive officers and corporate governance; executive compensation; security ownership; certain relationships and director independence; principal accountant fees and services) is incorporated by reference to our proxy statement for the {next_year} annual meeting of stockholders.

## PART IV

## Item 15. Exhibits and Financial Statement Schedules

{exhibits}

## SIGNATURES

Under the requirements of Section 13 or 15(d) of the Securities Exchange Act of 1934, the registrant has caused this report to be signed on its behalf by the undersigned officer, who is authorized to sign it, on {filed}.

Hollowmere Valve Works, Inc. -- By: /s/ Marguerite Ossenbrook, President and Chief Executive Officer

/s/ Tobias Kellerman-Ruhl, Executive Vice President and Chief Financial Officer (Principal Financial and Accounting Officer) -- /s/ Joaquín Ibarrola-Senn, Director and Chair of the Audit Committee -- /s/ Ottilie Vance-Harrowgate, Chair of the Board -- /s/ Bramwell Osei-Fenner, Director -- /s/ Solène Arsenault-Criel, Director
"""

A = {}

# --------------------------------------------------------------------------- FY2023
A["FY2023"] = dict(
    float_m="612.4", next_year="2024", auditor_icfr_cover="",
    cyber_year="We did not identify any cybersecurity incident in 2023 that materially affected us.",
    properties_extra="We lease service centres in Quayle Point and Dunmarsh and a sales office in Port-Aubrelle. We believe our facilities are suitable and adequate for our current needs, and that the Fennick Harbor plant has capacity for roughly 20% more output with additional shifts.",
    business="""Hollowmere Valve Works, Inc. ("Hollowmere," the "Company," "we" or "us") designs, machines, assembles and tests industrial valves used to isolate, control and relieve the flow of liquids and gases. We were founded in Fennick Harbor in 1958 as a repair shop for municipal water valves and were incorporated in Delaware in 1987. We sell to liquefied natural gas ("LNG") producers and terminal operators, midstream pipeline companies, water and wastewater utilities, chemical processors and mining companies, directly and through independent representatives.

Our products are grouped into four families: FL-Series trunnion-mounted ball valves for pipeline and LNG service, in sizes from 2 to 48 inches; CG-300 cryogenic gate valves for temperatures down to minus 196 degrees Celsius; R-40 spring-loaded pressure-relief valves; and K-Series knife gate valves for slurry and mining service. Aftermarket parts, repairs and field service made up 18% of 2023 revenue.

We machine, assemble and test valves at Fennick Harbor and Saint-Aurèle-des-Pins, where every valve is pressure-tested in what our employees call the ‘long bay’ before it ships. We do not pour our own castings. Body and bonnet castings are bought from outside foundries under our own patterns; the largest of these, Brackwater Foundry Ltd. of Tollis Reach ("Brackwater"), supplies the large-bore ductile iron and carbon steel castings for most FL-Series and CG-300 valves and is currently the only qualified source for 38 of our patterns. Forgings, bar stock, springs, seals and actuators come from a broad base of suppliers, and each year we review the overall resilience of our supply chain with our largest suppliers.

At December 31, 2023, we had 1,310 employees. Backlog was ${q4_backlog_m} million, compared with $118.6 million a year earlier; we expect to ship most of it in 2024.""",
    risks="""Our business is subject to many risks. The following are those we consider most significant; others not presently known to us, or that we now consider immaterial, could also affect us.

**We depend on a limited number of foundries, and on a single source for many castings.** Brackwater Foundry is the only qualified source for 38 of our casting patterns, representing about 60% of our casting spend. Qualifying another foundry for those patterns would take many months and, for many orders, our customers' approval. A fire, equipment failure, labor dispute or financial difficulty at Brackwater could interrupt our production, raise our costs and delay shipments. We do not carry business-interruption insurance that covers a supplier's outage, and we regard this concentration as the most significant risk in our supply chain.

**Our revenue depends on capital spending in energy, water and mining.** Large LNG and pipeline projects can be delayed or cancelled, and the timing of their orders makes our quarterly results uneven.

**Raw material prices are volatile.** Castings, forgings and alloy bar stock follow steel, scrap and nickel prices. Many of our project orders are at fixed prices, and we may not be able to recover increases.

**Product failures could expose us to warranty claims and liability.** Our valves are used in high-pressure and hazardous service. Although our terms of sale limit our liability, a failure could lead to claims, litigation and damage to our reputation that exceed our reserves and insurance.

**Our credit agreement contains financial covenants.** It requires us to maintain a consolidated net leverage ratio of not more than 3.50 to 1.00 and an interest coverage ratio of at least 3.00 to 1.00. A significant decline in earnings could cause us to breach these covenants.

**We are exposed to foreign currency movements.** Our Saint-Aurèle-des-Pins plant buys trim components and actuators priced in euros. At December 31, 2023, we held forward contracts to buy €4.2 million.""",
    legal="""From time to time we are involved in claims and lawsuits arising in the ordinary course of business, including product warranty and commercial disputes. We do not believe that any pending matter will have a material adverse effect on our financial position, results of operations or cash flows.""",
    dividends="""We paid quarterly dividends of $0.12 per share in 2023. In November 2023 the Board authorized the repurchase of up to $20.0 million of our common stock through December 2025; no shares were repurchased in 2023.""",
    mdna_overview="""2023 was a record year. Revenue grew {rev_chg}% to ${rev_m} million, led by FL-Series valves for two LNG export projects and continued demand from water utilities for R-40 relief valves. Gross margin improved to {gm}% from {gm_py}%, helped by price increases and better absorption at Fennick Harbor. Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share, in 2022. We ended the year with record backlog of ${q4_backlog_m} million and reduced our borrowings by $22.5 million.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in 2022. LNG and midstream customers accounted for 46% of revenue, water and wastewater for 27%, chemical for 15% and mining for 12%.

**Gross profit.** Gross margin was {gm}%, up {gm_pts} points, reflecting price increases implemented in late 2022 and higher volumes.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million, or {sga_pct}% of revenue. Research and development expense was ${rnd_m} million, mainly for the CG-300 product line and a low-emission packing set for the FL-Series.

**Interest and taxes.** Interest expense fell to ${interest_m} million from ${interest_py_m} million as we repaid borrowings. Our effective tax rate was about 23%.""",
    liquidity="""At December 31, 2023, cash and cash equivalents were ${q4_cash_m} million and borrowings were ${q4_debt_m} million, consisting of ${q4_term_m} million under our term loan and ${q4_revolver_m} million under our $100.0 million revolving credit facility, which matures in June 2027. Our consolidated net leverage ratio was {q4_lev} to 1.00, compared with the maximum of 3.50 to 1.00, and we were in compliance with all covenants. Cash from operations funded capital expenditures, dividends and debt repayment. We expect capital expenditure of about $14 million in 2024, mainly for a new horizontal machining cell at Fennick Harbor. We believe our cash, operating cash flow and revolver availability are sufficient for at least the next twelve months.""",
    rate_sens="0.8",
    fx_note="A 10% change in the euro exchange rate would not have had a material effect on our 2023 results.",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Ashcombe & Pryor LLP audited the consolidated financial statements of Hollowmere Valve Works, Inc. for 2023 and 2022 and issued an unqualified opinion. The complete report, including the critical audit matter on revenue recognized over time for engineered-to-order valve packages, is included in the full annual report.""",
    notes="""**Notes to Consolidated Financial Statements (selected).** *Revenue.* We recognize revenue on standard valves and parts when control passes to the customer, generally on shipment, and on engineered-to-order packages over time using costs incurred. *Concentration.* Purchases from Brackwater Foundry were 21% of our cost of materials in 2023. *Debt.* Our credit agreement (the "Credit Agreement") with a syndicate led by Westerholm National Bank, N.A. provides a $100.0 million revolving facility and a term loan amortizing at $1.25 million per quarter; borrowings bear interest at a benchmark rate plus 1.75%–2.50%, depending on leverage. *Subsequent event.* On February 21, 2024, Brackwater Foundry informed us that one of the two induction furnaces at its Tollis Reach works had failed. Brackwater expects to restore partial output within days and full output within several weeks. We are assessing the effect on our first-quarter shipments and do not currently expect it to be material to the year.""",
    other9b="""None.""",
    exhibits="""The exhibits filed with this report include our certificate of incorporation and bylaws, the credit agreement with Westerholm National Bank, N.A. and its amendments, our equity incentive plan, the list of subsidiaries, the consent of Ashcombe & Pryor LLP, and certifications of our principal executive and financial officers.""",
)

# --------------------------------------------------------------------------- FY2024
A["FY2024"] = dict(
    float_m="318.7", next_year="2025", auditor_icfr_cover="",
    cyber_year="We did not identify any cybersecurity incident in 2024 that materially affected us.",
    properties_extra="We lease a service centre in Dunmarsh and a sales office in Port-Aubrelle. In the fourth quarter of 2024 we closed our leased service centre at Quayle Point and consolidated its work into Fennick Harbor and Dunmarsh. Substantially all of our owned property is pledged as collateral under our credit agreement.",
    business="""Hollowmere Valve Works, Inc. designs, machines, assembles and tests industrial valves for liquefied natural gas ("LNG"), midstream pipeline, water and wastewater, chemical and mining customers. Our product families are FL-Series trunnion-mounted ball valves, CG-300 cryogenic gate valves, R-40 pressure-relief valves and K-Series knife gate valves, and we sell aftermarket parts and field service. We machine and assemble valves at Fennick Harbor and Saint-Aurèle-des-Pins and buy our castings from outside foundries.

In 2024 our business was severely disrupted by a breakdown in our supply chain: the failure of our principal casting supplier, Brackwater Foundry Ltd., to deliver the castings we required. Brackwater was the only qualified source for 38 of our patterns. Its output fell after a furnace failure in February 2024, it placed customers on allocation in June and it entered a court-supervised restructuring in September. In response, we selected Ruddock & Thane Castings, Inc. of Ironlee as a second source in August 2024 and transferred our 40 highest-volume patterns to it. Ruddock & Thane began pouring first-article castings in December 2024, and by early March 2025, 22 patterns had been approved.

At December 31, 2024 we had 1,205 employees, compared with 1,310 a year earlier. Backlog was ${q4_backlog_m} million, a substantial part of which was past its original delivery date.""",
    risks="""The following risks could materially and adversely affect our business, financial condition, liquidity and results of operations.

**Conditions have raised substantial doubt about our ability to continue as a going concern.** As described in Note 2, the covenant default at December 31, 2024, our recurring losses in the second half of 2024 and our limited liquidity raised substantial doubt about our ability to continue as a going concern. Management concluded that its plans, including the Second Amendment and Waiver, alleviate that doubt. Those plans depend on assumptions about casting supply, shipments and margins. If they are not realized, we may be unable to meet our obligations as they fall due, and substantial doubt could arise again.

**We may not be able to comply with the covenants in our amended credit agreement.** We did not comply with the leverage covenant at December 31, 2024. The Second Amendment waived that default but requires minimum liquidity of $15.0 million and minimum cumulative adjusted EBITDA, and it reinstates a leverage covenant at 4.25 to 1.00 from December 31, 2025. A further default would allow our lenders to terminate their commitments and accelerate all borrowings, which we would not be able to repay from available resources.

**We remain dependent on a limited number of casting suppliers.** Brackwater's restructuring may not succeed, and Ruddock & Thane may not complete the qualification of our remaining patterns on schedule or may be unable to increase its output as we require. Either outcome would limit our shipments.

**We are a defendant in litigation seeking at least $38.0 million.** An adverse outcome in the action brought by Greywether Midstream Partners, L.P., or a settlement above our insurance coverage, would strain our liquidity and could cause a covenant default.

**We have lost orders and may lose customers.** Cancellations caused by our delays totalled $9.4 million in 2024, and some have qualified competitors. We may not regain this business.

**We may be required to record further impairment charges.** Our market capitalization declined significantly in 2024, and the fair value of our single reporting unit exceeded its carrying value by only 9% at our annual impairment test. A further decline could require a goodwill impairment.

**Our deferred tax assets may not be realized.** We recorded a valuation allowance against our U.S. deferred tax assets in 2024, and we will not recognize tax benefits on future losses until we return to sustained profitability.""",
    legal="""On August 19, 2024, Greywether Midstream Partners, L.P. filed a complaint against us in the Circuit Court of Marrow County alleging breach of warranty, negligence and negligent misrepresentation relating to R-40 pressure-relief valves supplied for its Calloway Flats compressor station, and seeking damages of not less than $38.0 million. We answered the complaint, moved to dismiss the negligence and negligent misrepresentation counts, and filed a third-party complaint against Brackwater Foundry Ltd. for contribution and indemnity, which has been stayed because of Brackwater's restructuring. Our investigation found subsurface porosity in certain body castings supplied by Brackwater. We believe we have meritorious defenses, including the limitation of remedies in our terms of sale, and we intend to defend the action vigorously. See Note 4.""",
    dividends="""We paid dividends of $0.12 per share in each of the first two quarters of 2024 and repurchased 252,000 shares for $6.0 million in the first quarter. The Board suspended the dividend and repurchases on July 30, 2024, and our amended credit agreement now prohibits them.""",
    mdna_overview="""2024 was the most difficult year in the Company's history. Demand remained strong, but a prolonged shortage of castings from our single-source supplier prevented us from shipping a large part of our orders. Revenue fell {rev_chg}% to ${rev_m} million, gross margin declined to {gm}% from {gm_py}%, and we reported a net loss of ${ni_m} million, or ${eps} per share, compared with net income of ${ni_py_m} million in 2023. The fourth quarter was the weakest of the year, with revenue of ${q4_rev_m} million and a net loss of ${q4_ni_m} million.

At December 31, 2024 our net leverage ratio exceeded the maximum permitted by our credit agreement. On March 10, 2025, our lenders waived the default under the Second Amendment and Waiver, which substantially changed our covenants and increased our borrowing costs. In preparing these financial statements, management concluded that conditions raised substantial doubt about the Company's ability to continue as a going concern, and that its plans alleviate that doubt, as described in Note 2.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in 2023. FL-Series and CG-300 shipments, which depend most on heavy-section castings, fell by 31%; K-Series and aftermarket revenue grew. Late-delivery penalties reduced revenue by $3.1 million, and customers cancelled $9.4 million of orders.

**Gross profit.** Gross margin was {gm}%. Expedite costs were $20.6 million for the year, compared with none in 2023, and we wrote down $3.4 million of castings and partially machined bodies that failed inspection. Lower volumes left fixed costs under-absorbed at both plants.

**Impairment and restructuring.** In the fourth quarter we recorded charges of ${q4_special_m} million, mainly for closing the Quayle Point service centre, impairing K-Series tooling made redundant by the pattern transfer, and severance.

**Operating expenses.** Selling, general and administrative expense rose to ${sga_m} million from ${sga_py_m} million, including $3.6 million of legal fees and $1.4 million of advisory fees related to our credit agreement.

**Interest and taxes.** Interest expense increased to ${interest_m} million from ${interest_py_m} million. Income tax expense of ${tax_m} million includes a valuation allowance of $8.9 million recorded in the fourth quarter against our U.S. deferred tax assets.""",
    liquidity="""At December 31, 2024, cash and cash equivalents were ${q4_cash_m} million and borrowings were ${q4_debt_m} million, including ${q4_revolver_m} million under the revolving facility, with availability of ${q4_avail_m} million. Operating cash flow was negative, reflecting the net loss, inventories that rose to ${q4_inv_m} million while valves awaited castings, the $4.0 million advance to Brackwater, and the shortening of payment terms by suppliers.

Our consolidated net leverage ratio at December 31, 2024 was {q4_lev} to 1.00, above the 4.75 maximum set by the First Amendment, which constituted an event of default. Under the Second Amendment and Waiver of March 10, 2025, the lenders waived the default, suspended the leverage covenant through September 30, 2025, required minimum liquidity of $15.0 million and minimum cumulative adjusted EBITDA, raised the interest margin by 1.50%, limited 2025 capital expenditure to $12.0 million and required weekly cash flow reporting. Our liquidity is limited, and our forecasts show only a narrow margin over the minimum liquidity requirement during the first half of 2025.""",
    rate_sens="0.8",
    fx_note="Our euro exposure was not material to 2024 results.",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Ashcombe & Pryor LLP issued an unqualified opinion on our 2024 and 2023 consolidated financial statements. The report identifies as a critical audit matter management's evaluation of whether substantial doubt about the Company's ability to continue as a going concern is alleviated, which required evaluation of management's forecasts of casting supply, shipments, margins and covenant compliance.""",
    notes="""**Note 2 -- Liquidity and Going Concern.**

[tb:us-gaap:SubstantialDoubtAboutGoingConcernTextBlock@c-fy]

Management evaluated whether conditions and events, considered in the aggregate, raise substantial doubt about the Company's ability to continue as a going concern within one year after the date the financial statements are issued. The Company incurred a net loss of ${ni_m} million in 2024, did not comply with the leverage covenant at December 31, 2024, and had limited liquidity. Absent a waiver, the lenders could have accelerated all borrowings. These conditions raised substantial doubt. Management's plans include the Second Amendment and Waiver, which waived the default and amended the covenants; the qualification of Ruddock & Thane Castings as a second source; reductions in inventory and capital spending; and the suspension of dividends and share repurchases. Management concluded that these plans, which have been implemented or are probable of being implemented, alleviate the substantial doubt.

[/tb]

**Note 4 -- Commitments and Contingencies.**

[tb:us-gaap:CommitmentsAndContingenciesDisclosureTextBlock@c-fy]

The Company is a defendant in the action brought by Greywether Midstream Partners, L.P., described in Item 3. The Company has not recorded a liability for the claims because it has concluded that a loss is not probable, and it is unable to estimate a reasonably possible range of loss. The product warranty reserve was $3.6 million at December 31, 2024.

[/tb]""",
    other9b="""On March 10, 2025, we entered into the Second Amendment and Waiver to our credit agreement, described in Item 7.""",
    exhibits="""The exhibits filed with this report include our certificate of incorporation and bylaws, the credit agreement with Westerholm National Bank, N.A., the First Amendment dated October 28, 2024, the Second Amendment and Waiver dated March 10, 2025, the Supply Assurance Agreement with Brackwater Foundry Ltd., the list of subsidiaries, the consent of Ashcombe & Pryor LLP, and certifications of our principal executive and financial officers.""",
)

# --------------------------------------------------------------------------- FY2025
A["FY2025"] = dict(
    float_m="401.2", next_year="2026", auditor_icfr_cover="",
    cyber_year="We did not identify any cybersecurity incident in 2025 that materially affected us.",
    properties_extra="We lease a service centre in Dunmarsh and a sales office in Port-Aubrelle. We believe our facilities are adequate for our current needs.",
    business="""Hollowmere Valve Works, Inc. designs, machines, assembles and tests industrial valves for liquefied natural gas ("LNG"), midstream pipeline, water and wastewater, chemical and mining customers. Our product families are FL-Series trunnion-mounted ball valves, CG-300 cryogenic gate valves, R-40 pressure-relief valves and K-Series knife gate valves, and we sell aftermarket parts and field service. We machine and assemble valves at Fennick Harbor and Saint-Aurèle-des-Pins.

We buy our body and bonnet castings from outside foundries under our own patterns. Following the supply chain disruption of 2024, we no longer rely on a single-source supplier for any high-volume casting: each of our 40 highest-volume casting patterns is now qualified at both Brackwater Foundry Ltd. of Tollis Reach, which completed a restructuring under new ownership in February 2025, and Ruddock & Thane Castings, Inc. of Ironlee, with which we signed a three-year supply agreement in August 2025. Ruddock & Thane supplied 44% of our heavy-section castings by weight in the fourth quarter of 2025. We are transferring a further 25 patterns and hold about six weeks of safety stock of our most critical castings.

At December 31, 2025 we had 1,262 employees. Backlog was ${q4_backlog_m} million, close to its level before the disruption, and the share of past-due orders was under 3%.""",
    risks="""The following risks could materially and adversely affect our business, financial condition and results of operations.

**Our credit agreement contains financial covenants and restrictions.** Under the Third Amendment, described in Item 7, we must maintain a consolidated net leverage ratio of not more than 4.00 to 1.00, stepping down to 3.50 to 1.00 from December 31, 2026, and an interest coverage ratio of at least 3.00 to 1.00. Dividends and share repurchases are permitted only if our leverage ratio is below 3.00 to 1.00. A decline in earnings could cause us to breach these covenants.

**Our casting supply remains concentrated.** Although our principal patterns are now qualified at two foundries, a disruption at either one would raise our costs and could delay shipments, and Brackwater's new owners may change its priorities.

**Demand may not sustain the recovery.** Customers placed fewer orders while our deliveries were unreliable, and some qualified competitors. Our order intake depends on LNG, midstream, water and mining capital spending, which can be delayed or cancelled.

**Product failures could expose us to warranty claims and litigation.** Our valves are used in high-pressure and hazardous service. As the Greywether matter showed, a failure can lead to claims far exceeding the value of the product, and our insurance may not cover all such claims.

**We may not realize our deferred tax assets.** We continue to maintain a valuation allowance against most of our U.S. deferred tax assets; its release depends on sustained profitability.""",
    legal="""In September 2025 we settled the action brought against us in August 2024 by Greywether Midstream Partners, L.P. in the Circuit Court of Marrow County. Greywether received $9.5 million, of which our insurers paid $6.0 million and we paid $3.5 million, and the action was dismissed with prejudice on November 18, 2025. The settlement contained no admission of liability. In December 2025 we resolved our third-party claim against Brackwater Foundry Ltd. for a credit of $0.8 million against future casting purchases. We are not currently party to any legal proceeding that we expect to have a material adverse effect on us.""",
    dividends="""We did not pay dividends or repurchase shares in 2025. The Board intends to review the reinstatement of a dividend in the second half of 2026, subject to the restrictions in our credit agreement.""",
    mdna_overview="""2025 was a year of recovery. With two qualified casting sources, we cleared the backlog of past-due orders that had built up in 2024, and our revenue, margins and cash flow improved in every quarter. Revenue rose {rev_chg}% to ${rev_m} million, gross margin improved to {gm}% from {gm_py}%, and we reported net income of ${ni_m} million, or ${eps} per share, compared with a net loss of ${ni_py_m} million in 2024. Fourth-quarter revenue was ${q4_rev_m} million and fourth-quarter net income ${q4_ni_m} million.

We settled the Greywether litigation, met the covenants of our amended credit agreement throughout the year, and in December completed the Third Amendment, which extends the maturity of our credit facility and ends the covenant relief period. Substantial doubt about our ability to continue as a going concern, which management had identified at December 31, 2024 and concluded was alleviated by its plans, no longer exists.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in 2024. FL-Series and CG-300 revenue grew by 24% as we shipped delayed orders; K-Series and aftermarket revenue grew modestly.

**Gross profit.** Gross margin was {gm}%. Expedite costs fell to $7.9 million from $20.6 million, and fixed-cost absorption improved as volumes rose. Fourth-quarter gross margin was {q4_gm}%, the highest since the first quarter of 2024.

**Litigation settlement.** We recorded a charge of $3.5 million for our share of the Greywether settlement, net of insurance.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, as lower legal and advisory fees offset the reinstatement of incentive compensation. Research and development expense was ${rnd_m} million.

**Interest and taxes.** Interest expense rose to ${interest_m} million from ${interest_py_m} million because of the higher margins under the Second Amendment, then declined in the fourth quarter. Income tax expense of ${tax_m} million relates mainly to foreign and state taxes.""",
    liquidity="""At December 31, 2025, cash and cash equivalents were ${q4_cash_m} million and borrowings were ${q4_debt_m} million, down from $126.6 million at their peak on March 31, 2025. Availability under the revolving facility was ${q4_avail_m} million. Operating cash flow was positive for the year, as inventories declined to ${q4_inv_m} million and suppliers restored normal payment terms.

Our consolidated net leverage ratio, calculated as the credit agreement defines it, was {q4_adj_lev} to 1.00 at December 31, 2025, within the reinstated maximum of 4.25 to 1.00. On December 15, 2025, we entered into the Third Amendment to the credit agreement, which extends the maturity of the revolving facility and term loan to June 2029, sets the leverage covenant at 4.00 to 1.00 stepping down to 3.50 to 1.00, ends the weekly reporting and minimum liquidity requirements of the Second Amendment, and reduces the interest margin by 1.00%. We believe our cash, operating cash flow and revolver availability are sufficient for at least the next twelve months.""",
    rate_sens="0.7",
    fx_note="Our euro exposure was not material to 2025 results.",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Ashcombe & Pryor LLP issued an unqualified opinion on our 2025 and 2024 consolidated financial statements and on the effectiveness of our internal control over financial reporting as of December 31, 2025.""",
    notes="""**Note 4 -- Commitments and Contingencies.**

[tb:us-gaap:CommitmentsAndContingenciesDisclosureTextBlock@c-fy]

The Greywether action was settled in September 2025 and dismissed with prejudice in November 2025, as described in Item 3. The product warranty reserve was $3.1 million at December 31, 2025, compared with $3.6 million a year earlier. We had purchase commitments of $41.2 million under our casting supply agreements at year-end.

[/tb]

**Note 7 -- Income Taxes.** We continue to maintain a valuation allowance against most of our U.S. deferred tax assets. In the fourth quarter of 2025 we released $0.8 million of the allowance relating to state tax attributes we now expect to use. We will consider releasing more of the allowance when we have a sustained record of taxable income.""",
    other9b="""None.""",
    exhibits="""The exhibits filed with this report include our certificate of incorporation and bylaws, the credit agreement with Westerholm National Bank, N.A. and its First, Second and Third Amendments, the Supply Agreement with Ruddock & Thane Castings, Inc., the settlement agreement with Greywether Midstream Partners, L.P., the list of subsidiaries, the consent of Ashcombe & Pryor LLP, and certifications of our principal executive and financial officers.""",
)


def annual_dml(key, m):
    d = dict(A[key])
    vals = dict(m)
    vals.update(shares_date=SHARES_OUT[key][0], shares_out=SHARES_OUT[key][1], filed=FILED[key])
    shape = SHAPE_K
    for k in ("business", "risks", "legal", "dividends", "mdna_overview", "results", "liquidity", "audit",
              "notes", "other9b", "exhibits", "properties_extra", "cyber_year", "fx_note"):
        shape = shape.replace("{" + k + "}", d.pop(k))
    vals.update(d)
    return shape.format_map(vals)
