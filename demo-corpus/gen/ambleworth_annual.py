"""Ambleworth Bioprocess Corp. -- annual reports (Form 10-K style) for fiscal
2023 (older HTML), 2024 (recall and material weakness) and 2025."""

from ambleworth_reports import FILED, SHARES_OUT, NAME, CIK, PREFIX, FILER  # noqa: F401  (re-exported)

COVER_K = """
!c UNITED STATES
!c SECURITIES AND EXCHANGE COMMISSION

!c FORM 10-K

!c [X] ANNUAL REPORT UNDER SECTION 13 OR 15(d) OF THE SECURITIES EXCHANGE ACT OF 1934
!c For the fiscal year ended December 31, {year}
!c Commission File Number 001-99342

!c AMBLEWORTH BIOPROCESS CORP.
!c (Exact name of registrant as specified in its charter)
!c Delaware -- I.R.S. Employer Identification No. 86-2294417
!c 1200 Carrick Lane, Wrenfield Commons -- (555) 017-4400

Common Stock, $0.001 par value per share, is registered under Section 12(b) of the Act and listed on the Kellbrook Securities Exchange. The registrant has filed all reports required by Section 13 or 15(d) of the Act during the preceding 12 months and has been subject to such requirements for the past 90 days. The registrant is a large accelerated filer and is not a shell company. {icfr_cover}

The aggregate market value of the common stock held by non-affiliates on June 30, {year} was approximately ${float_m} billion. On {shares_date}, {shares_out} shares of common stock were outstanding. Portions of the definitive proxy statement for the {next_year} annual meeting of stockholders are incorporated by reference into Part III.

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

Our information security program is overseen by the Audit Committee and managed by our Chief Information Officer. It includes risk assessments, monitoring of our business and manufacturing networks, employee training and the assessment of third-party service providers. {cyber}

## Item 2. Properties

We own our headquarters and instrument plant at Wrenfield Commons (about 290,000 square feet) and lease a distribution centre at Pitchford Mills (about 140,000 square feet). {properties}

## Item 3. Legal Proceedings

{legal}

## Item 4. Mine Safety Disclosures

Not applicable.

## PART II

## Item 5. Market for Registrant's Common Equity, Related Stockholder Matters and Issuer Purchases of Equity Securities

Our common stock is listed on the Kellbrook Securities Exchange. We have never paid cash dividends and do not expect to in the foreseeable future. {buyback}

## Item 6. [Reserved]

## Item 7. Management's Discussion and Analysis of Financial Condition and Results of Operations

### Overview

{overview}

### Results of Operations

{results}

### Liquidity and Capital Resources

{liquidity}

### Critical Accounting Estimates

We have no off-balance-sheet arrangements. Our critical accounting estimates concern revenue from multiple-element arrangements of instruments and service, the valuation of inventories, {crit_extra} and the valuation of goodwill and intangible assets.

## Item 7A. Quantitative and Qualitative Disclosures About Market Risk

Our principal market risks are foreign currency exposure on sales in euros and pounds{fx_extra} and interest rate exposure on our revolving credit facility. A 10% change in exchange rates or a 100 basis point change in interest rates would not have had a material effect on {year} results.

## Item 8. Financial Statements and Supplementary Data

{audit}

[table:is]

[table:bs]

[table:cf]

{notes}

## Item 9. Changes in and Disagreements With Accountants on Accounting and Financial Disclosure

None.

## Item 9A. Controls and Procedures

{controls}

## Item 9B. Other Information

None.

## PART III

## Items 10, 11, 12, 13 and 14

The information these items require is incorporated by reference to our definitive proxy statement for the {next_year} annual meeting of stockholders.

## PART IV

## Item 15. Exhibits and Financial Statement Schedules

{exhibits}

## SIGNATURES

Under the requirements of Section 13 or 15(d) of the Securities Exchange Act of 1934, the registrant has duly caused this report to be signed on its behalf by the undersigned officer, who is authorized to sign it, on {filed}.

Ambleworth Bioprocess Corp. -- /s/ Celestine Aubertin, Ph.D., President and Chief Executive Officer (Principal Executive Officer) -- /s/ Wendell Prashar, Chief Financial Officer and Treasurer (Principal Financial Officer) -- /s/ Lorcan Tebbutt-Imre, Chief Accounting Officer -- /s/ Tamsin Achebe-Lorne, Chair of the Board -- /s/ Beatriz Ocaña-Villar, Director and Chair of the Audit Committee -- /s/ Jörg Almqvist-Ferrante, Director -- /s/ Renée Castellvi-Moss, Director
"""

BUSINESS_BASE = """Ambleworth Bioprocess Corp. designs, manufactures and services laboratory and bioprocess equipment. Our customers are academic and government research institutes, biopharmaceutical process-development groups, contract development and manufacturing organizations ("CDMOs") and hospital laboratories. We were founded in 1994 at Wrenfield Commons to make laboratory shakers and have grown through our own product development and a small number of acquisitions.

**Products.** Our Instruments business includes the Meridel BR-20 and BR-50 benchtop bioreactors, the Rotavell CF-6 and CF-12 benchtop centrifuges and the Kestrin IN-40 CO2 incubator. Our Consumables and Services business includes Tillerbag single-use mixing assemblies, filter sets, spare parts and service contracts. Consumables and services provide recurring revenue from our installed base of instruments."""

A = {}

A["FY2023"] = dict(
    float_m="2.1", next_year="2024", icfr_cover="",
    business=BUSINESS_BASE + """

**Manufacturing and suppliers.** We assemble and test instruments at Wrenfield Commons and buy single-use film assemblies from outside suppliers, the largest of which is Labovère SAS of Val-Sérène. We buy electronic components, motors and sensors from a broad supplier base; supply chain constraints on certain controllers were tight in 2022 but eased during 2023.

**Employees.** At December 31, 2023 we had 1,740 employees.""",
    risks="""Our business is subject to risks, including the following.

**Our revenue depends on research and biopharmaceutical spending.** Reductions in academic research funding or in biopharmaceutical development budgets could reduce demand for our instruments.

**We face strong competition.** Several competitors are larger and have broader product ranges and greater resources.

**Product defects could lead to recalls or claims.** Our instruments contain moving parts, heaters and pressurized vessels. A defect could require a field action or recall and lead to injury claims.

**We depend on a limited number of suppliers for certain components.** An interruption in supply of film assemblies, controllers or motors could delay our shipments.

**New products may not succeed.** We plan to launch the Meridel BR-50 in 2024; delays or weak demand would affect our growth.""",
    cyber="We did not identify any cybersecurity incident in 2023 that materially affected us.",
    properties="We believe our facilities are adequate for our present needs.",
    legal="""We are not a party to any legal proceeding that we believe will have a material adverse effect on us.""",
    buyback="""We did not repurchase any shares in 2023.""",
    overview="""2023 was a year of steady growth. Revenue rose {rev_chg}% to ${rev_m} million, gross margin improved to {gm}% from {gm_py}%, and net income was ${ni_m} million, or ${eps} per share. Consumables and Services grew faster than Instruments, and our installed base of bioreactors and centrifuges continued to expand. We ended the year with ${q4_cash_m} million of cash and preparing to launch the Meridel BR-50 in February 2024.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in 2022. Instruments revenue grew 6.1% and Consumables and Services revenue grew 10.4%. Sales to CDMOs grew fastest; academic demand was stable.

**Gross margin.** Gross margin was {gm}%, up from {gm_py}%, reflecting improved component availability, which reduced spot purchases, and a higher share of consumables.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million, or {sga_pct}% of revenue. Research and development expense was ${rnd_m} million, focused on the BR-50 and on the next generation of our centrifuges.

**Income taxes.** Our effective tax rate was approximately 22%.""",
    liquidity="""At December 31, 2023, cash and cash equivalents were ${q4_cash_m} million and debt was ${q4_debt_m} million, consisting of a term note. We had no borrowings under our $150.0 million revolving credit facility. Cash from operations was strong. We expect capital expenditure of about $20 million in 2024, including tooling for the BR-50. We believe our cash, operating cash flow and credit facility are sufficient for our needs.""",
    crit_extra="product warranty reserves",
    fx_extra="",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Pemberton Kall LLP issued unqualified opinions on our consolidated financial statements for 2023 and 2022 and on the effectiveness of our internal control over financial reporting as of December 31, 2023.""",
    notes="""**Selected notes.** *Revenue recognition.* We recognize instrument revenue on shipment or installation, depending on the contract, and service revenue over the contract term. *Warranty.* The warranty accrual was $6.0 million at December 31, 2023. *Debt.* Our $150.0 million revolving credit facility matures in 2028; borrowings bear interest at a benchmark rate plus 1.00% to 1.75%.""",
    controls="""Our management, with the participation of our Chief Executive Officer and Chief Financial Officer, concluded that our disclosure controls and procedures were effective as of December 31, 2023. Management assessed our internal control over financial reporting using the 2013 Internal Control -- Integrated Framework and concluded that it was effective as of December 31, 2023. Pemberton Kall LLP has issued an unqualified report on our internal control over financial reporting.""",
    exhibits="""Exhibits include our certificate of incorporation and bylaws, our credit agreement, our equity plans, the list of subsidiaries, the consent of Pemberton Kall LLP and the certifications of our officers.""",
)

A["FY2024"] = dict(
    float_m="2.3", next_year="2025",
    icfr_cover="The registrant's independent registered public accounting firm has issued an adverse report on the effectiveness of its internal control over financial reporting.",
    business=BUSINESS_BASE + """

**Acquisition of Labovère.** On May 14, 2024 we acquired Labovère SAS, of Val-Sérène, which makes single-use bag film assemblies and tubing sets. Labovère had been our largest supplier of film assemblies; it also sells to other customers.

**Product recall.** On November 18, 2024 we began a voluntary recall of approximately 6,800 Rotavell CF-6 benchtop centrifuges to install a redesigned lid-latch interlock, after reports that the lid could be opened before the rotor had stopped. See Item 7 and Note 5.

**Employees.** At December 31, 2024 we had 1,930 employees, including 140 at Labovère.""",
    risks="""Our business is subject to risks, including the following.

**We have identified a material weakness in our internal control over financial reporting.** As described in Item 9A, our internal control over financial reporting was not effective as of December 31, 2024. If we fail to remediate the material weakness, or identify others, we may be unable to report our results accurately or on time, which could cause investors to lose confidence in our reporting and could harm the market price of our stock.

**The CF-6 recall could cost more than we expect and could harm our reputation.** Our provision reflects our current estimate of retrofit costs and customer response. Costs could be higher, additional injury claims could be filed, and customers could choose competitors' instruments.

**Product defects could lead to further recalls or claims.** Our instruments contain moving parts, heaters and pressurized vessels.

**We may not realize the benefits of the Labovère acquisition.** Integration could take longer or cost more than planned.

**Our revenue depends on research and biopharmaceutical spending**, and we face strong competition from larger companies.""",
    cyber="We did not identify any cybersecurity incident in 2024 that materially affected us.",
    properties="Since May 2024 we also own Labovère's plant at Val-Sérène (about 95,000 square feet).",
    legal="""Following the CF-6 recall, we have received a small number of claims from users who allege injuries. None has been filed as a lawsuit as of the date of this report, and we believe they are covered by insurance. We do not believe any pending matter will have a material adverse effect on us.""",
    buyback="""We did not repurchase any shares in 2024.""",
    overview="""In 2024 revenue grew {rev_chg}% to ${rev_m} million, led by the Meridel BR-50 and by the Labovère acquisition. Net income fell to ${ni_m} million, or ${eps} per share, from ${ni_py_m} million, because of a provision of $14.5 million for the voluntary recall of Rotavell CF-6 centrifuges recorded in the fourth quarter. Fourth-quarter net income was ${q4_ni_m} million.

In connection with the audit of our 2024 financial statements, we identified a material weakness in our internal control over financial reporting relating to information technology general controls over the enterprise resource planning system we upgraded in August 2024. As a result, our management concluded that our internal control over financial reporting was not effective as of December 31, 2024. The weakness led to an adjustment of $2.3 million that reduced inventories and increased cost of revenue in the fourth quarter. We have begun a remediation plan, described in Item 9A.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million. Labovère contributed $14.6 million. Excluding Labovère, revenue grew 5.0%. Instruments revenue grew 6.6% despite a stop-ship of new CF-6 units from November 18, and Consumables and Services revenue grew 10.3%.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}%. The recall provision of $14.5 million and the inventory adjustment of $2.3 million reduced gross margin by 3.4 percentage points; the lower-margin Labovère film business also weighed on it.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including Labovère, the ERP upgrade and $1.1 million of additional audit and consulting costs in the fourth quarter. Research and development expense was ${rnd_m} million. Acquisition and integration costs were $2.1 million.

**Income taxes.** Our effective tax rate was approximately 21%.""",
    liquidity="""At December 31, 2024, cash and cash equivalents were ${q4_cash_m} million and debt was ${q4_debt_m} million, including $22.0 million drawn on our revolving credit facility to fund part of the Labovère acquisition. We expect to spend most of the remaining recall provision of ${q4_provision_m} million in 2025. We believe our cash, operating cash flow and credit facility are sufficient for our needs for at least the next twelve months.""",
    crit_extra="the provision for the CF-6 recall, product warranty reserves, the fair value of assets acquired with Labovère",
    fx_extra=", which increased with the Labovère acquisition,",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Pemberton Kall LLP issued an unqualified opinion on our consolidated financial statements for 2024 and 2023. In its report on internal control over financial reporting, Pemberton Kall LLP expressed an adverse opinion because of the material weakness described in Item 9A. The firm identified the estimate of the CF-6 recall provision as a critical audit matter.""",
    notes="""**Note 3 -- Acquisition.** We acquired Labovère SAS on May 14, 2024 for $41.6 million in cash, net of cash acquired. The purchase price was allocated to property, plant and equipment ($8.0 million), intangible assets ($12.4 million), goodwill ($16.9 million) and net working capital.

**Note 5 -- Product Recall.**

[tb:us-gaap:CommitmentsAndContingenciesDisclosureTextBlock@c-fy]

On November 18, 2024 we began a voluntary recall of approximately 6,800 Rotavell CF-6 centrifuges sold between January 2022 and September 2024, to retrofit a redesigned lid-latch interlock at no cost to customers. We recorded a provision of $14.5 million in cost of revenue, based on the estimated cost of retrofit kits, field service labor, logistics and customer communication. At December 31, 2024, {q4_retro_pct}% of units had been retrofitted and the remaining provision was ${q4_provision_m} million. Actual costs could differ from the estimate.

[/tb]""",
    controls="""**Disclosure controls and procedures.** Because of the material weakness described below, our Chief Executive Officer and Chief Financial Officer concluded that our disclosure controls and procedures were not effective as of December 31, 2024.

**Management's report on internal control over financial reporting.** A material weakness is a shortcoming in internal control serious enough that a material error in our annual or quarterly financial statements could reasonably go unprevented or undetected in time. We did not design and maintain effective information technology general controls over user access and program change management for the enterprise resource planning system that supports our instruments operations, which we upgraded in August 2024. Users, including 37 with conflicting access rights, could change inventory cost records without independent review, and changes to the system were not consistently approved and tested. As a result, automated and manual controls over inventory costing and cost of revenue that depend on the system were ineffective. The weakness resulted in an adjustment of $2.3 million recorded before the financial statements were issued. Because of this material weakness, management concluded that our internal control over financial reporting was not effective as of December 31, 2024, based on the 2013 Internal Control -- Integrated Framework. Pemberton Kall LLP has issued an adverse report on our internal control over financial reporting.

Notwithstanding the material weakness, management has concluded that the consolidated financial statements in this report fairly present, in all material respects, our financial position, results of operations and cash flows.

**Remediation plan.** With the oversight of the Audit Committee, we are redesigning system roles and removing conflicting access, introducing an automated quarterly user access review and monitoring of privileged access, implementing a formal change-management process with independent approval and testing, hiring a Director of IT Compliance, and training personnel. The material weakness will not be considered remediated until the controls have operated for a sufficient period and management has concluded, through testing, that they are effective.""",
    exhibits="""Exhibits include our certificate of incorporation and bylaws, our credit agreement, the share purchase agreement for Labovère SAS, our equity plans, the list of subsidiaries, the consent of Pemberton Kall LLP and the certifications of our officers.""",
)

A["FY2025"] = dict(
    float_m="2.6", next_year="2026", icfr_cover="",
    business=BUSINESS_BASE + """

**Manufacturing.** We assemble and test instruments at Wrenfield Commons and make single-use film assemblies at Val-Sérène, the plant of Labovère SAS, which we acquired in May 2024. In 2025 Labovère supplied all of our film assemblies and grew its sales to other customers.

**Product quality.** We completed the voluntary recall of Rotavell CF-6 centrifuges that began in November 2024. All new CF-6 units shipped since January 27, 2025 include the redesigned lid-latch interlock.

**Employees.** At December 31, 2025 we had 1,975 employees.""",
    risks="""Our business is subject to risks, including the following.

**Our revenue depends on research and biopharmaceutical spending.** Reductions in research funding or in biopharmaceutical budgets could reduce demand for our instruments.

**Product defects could lead to recalls or claims.** As our experience with the CF-6 showed, a defect can require a costly field action and harm customer confidence.

**We must maintain effective internal control over financial reporting.** We remediated the material weakness we identified in 2024, but we could identify other deficiencies in the future, particularly as we upgrade systems or acquire businesses.

**We face strong competition**, and new products, including the CF-12 successor, may not succeed.

**We are exposed to currency movements**, which increased with the Labovère acquisition.""",
    cyber="We did not identify any cybersecurity incident in 2025 that materially affected us.",
    properties="We also own the Labovère plant at Val-Sérène (about 95,000 square feet).",
    legal="""In August 2025 we settled, within our insurance coverage, a lawsuit relating to an alleged injury involving a Rotavell CF-6 centrifuge. We are not a party to any legal proceeding that we believe will have a material adverse effect on us.""",
    buyback="""In August 2025 the Board authorized the repurchase of up to $50.0 million of our common stock over two years. We had not repurchased any shares at December 31, 2025 and expect to begin in 2026.""",
    overview="""2025 was a year of recovery and renewed growth. Revenue rose {rev_chg}% to a record ${rev_m} million, gross margin recovered to {gm}% from {gm_py}%, and net income grew to ${ni_m} million, or ${eps} per share. Fourth-quarter revenue of ${q4_rev_m} million was our highest ever.

We completed the Rotavell CF-6 recall in the fourth quarter and released $1.2 million of the provision that was no longer required. We remediated the material weakness in our internal control over financial reporting in the third quarter, and management has concluded that our internal control over financial reporting was effective as of December 31, 2025.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million in 2024. Consumables and Services revenue grew 6.9%, including a full year of Labovère. Instruments revenue declined slightly, because the first-quarter CF-6 stop-ship offset growth in bioreactors in the rest of the year.

**Gross margin.** Gross margin was {gm}%, compared with {gm_py}% in 2024, when the recall provision and the inventory adjustment reduced it. Fourth-quarter gross margin of {q4_gm}% benefited from the release of $1.2 million of the recall provision.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including $3.3 million of remediation costs in the first three quarters. Research and development expense was ${rnd_m} million.

**Income taxes.** Our effective tax rate was approximately 21%.""",
    liquidity="""At December 31, 2025, cash and cash equivalents were ${q4_cash_m} million and debt was ${q4_debt_m} million. We repaid $14.0 million of revolver borrowings during the year. We expect to fund share repurchases, capital expenditure of about $22 million and possible small acquisitions from cash and operating cash flow.""",
    crit_extra="product warranty reserves",
    fx_extra=", which increased with the Labovère acquisition,",
    audit="""**Report of Independent Registered Public Accounting Firm (summary).** Pemberton Kall LLP issued unqualified opinions on our consolidated financial statements for 2025 and 2024 and on the effectiveness of our internal control over financial reporting as of December 31, 2025.""",
    notes="""**Note 5 -- Product Recall.**

[tb:us-gaap:CommitmentsAndContingenciesDisclosureTextBlock@c-fy]

The voluntary recall of Rotavell CF-6 centrifuges that began in November 2024 was completed in the fourth quarter of 2025. Of the $14.5 million provision recorded in 2024, we used $13.3 million and released the remaining $1.2 million to cost of revenue in the fourth quarter of 2025.

[/tb]""",
    controls="""Our Chief Executive Officer and Chief Financial Officer concluded that our disclosure controls and procedures were effective as of December 31, 2025. Management assessed our internal control over financial reporting using the 2013 Internal Control -- Integrated Framework and concluded that it was effective as of December 31, 2025. Pemberton Kall LLP has issued an unqualified report on our internal control over financial reporting.

**Remediation of the 2024 material weakness.** During 2025 we redesigned system roles, removed conflicting access, introduced automated user access reviews and privileged access monitoring, and implemented a formal change-management process. Management tested the redesigned controls and concluded in the third quarter of 2025 that the material weakness identified at December 31, 2024 had been remediated.""",
    exhibits="""Exhibits include our certificate of incorporation and bylaws, our credit agreement, our equity plans, the list of subsidiaries, the consent of Pemberton Kall LLP and the certifications of our officers.""",
)


def annual_dml(key, m):
    d = dict(A[key])
    vals = dict(m)
    vals.update(shares_date=SHARES_OUT[key][0], shares_out=SHARES_OUT[key][1], filed=FILED[key])
    shape = SHAPE_K
    for k in ("business", "risks", "legal", "overview", "results", "liquidity", "audit", "notes", "controls",
              "exhibits", "cyber", "properties", "buyback", "crit_extra", "fx_extra", "icfr_cover"):
        shape = shape.replace("{" + k + "}", d.pop(k))
    vals.update(d)
    return shape.format_map(vals)
