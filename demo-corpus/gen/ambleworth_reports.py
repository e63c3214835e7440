"""Ambleworth Bioprocess Corp. -- invented laboratory-equipment maker.
Quarterly report prose; placeholders in braces come from metrics.py."""

NAME = "Ambleworth Bioprocess Corp."
CIK = "0009870342"
PREFIX = "abpc"
FILER = "Large Accelerated Filer"

FILED = {"2024-Q1": "May 2, 2024", "2024-Q2": "August 1, 2024", "2024-Q3": "October 31, 2024",
         "2025-Q1": "May 1, 2025", "2025-Q2": "July 31, 2025", "2025-Q3": "October 30, 2025",
         "FY2023": "February 26, 2024", "FY2024": "March 14, 2025", "FY2025": "February 24, 2026"}
SHARES_OUT = {"2024-Q1": ("April 24, 2024", "38,702,554"), "2024-Q2": ("July 24, 2024", "38,741,019"),
              "2024-Q3": ("October 23, 2024", "38,760,872"), "2025-Q1": ("April 23, 2025", "38,779,310"),
              "2025-Q2": ("July 23, 2025", "38,802,645"), "2025-Q3": ("October 22, 2025", "38,826,903"),
              "FY2023": ("February 14, 2024", "38,655,208"), "FY2024": ("February 28, 2025", "38,771,430"),
              "FY2025": ("February 11, 2026", "38,840,117")}

COVER_Q = """
!c UNITED STATES
!c SECURITIES AND EXCHANGE COMMISSION

!c FORM 10-Q

!c [X] QUARTERLY REPORT UNDER SECTION 13 OR 15(d) OF THE SECURITIES EXCHANGE ACT OF 1934
!c For the quarterly period ended {qend}
!c Commission File Number 001-99342

!c AMBLEWORTH BIOPROCESS CORP.
!c (Exact name of registrant as specified in its charter)
!c Delaware -- I.R.S. Employer Identification No. 86-2294417
!c 1200 Carrick Lane, Wrenfield Commons -- (555) 017-4400

Common Stock, $0.001 par value per share, is registered under Section 12(b) of the Act and listed on the Kellbrook Securities Exchange. The registrant has filed all reports required by Section 13 or 15(d) of the Act during the preceding 12 months and has been subject to such filing requirements for the past 90 days: Yes [X]. The registrant is a large accelerated filer and is not a shell company.

On {shares_date}, {shares_out} shares of the registrant's common stock were outstanding.

[toc]
"""

SHAPE_Q = COVER_Q + """
## PART I -- FINANCIAL INFORMATION

## Item 1. Financial Statements

[table:is]

[table:bs]

### Notes to Condensed Consolidated Financial Statements (Unaudited)

**1. Basis of presentation.** These unaudited interim financial statements of Ambleworth Bioprocess Corp. and its subsidiaries ("Ambleworth," the "Company," "we," "our") follow U.S. generally accepted accounting principles for interim reporting and the rules for quarterly reports. They include the normal recurring adjustments that management considers necessary to present the interim periods fairly. They should be read with the financial statements in our Annual Report on Form 10-K for {pyear}. Interim results may not be indicative of the full year.

**2. Revenue.** We disaggregate revenue into Instruments (bioreactors, centrifuges and incubators) and Consumables and Services (single-use assemblies, filters, service contracts and spare parts). {rev_mix}

{notes}

## Item 2. Management's Discussion and Analysis of Financial Condition and Results of Operations

### Forward-looking statements

This discussion contains forward-looking statements. Words such as "expect," "believe," "anticipate," "intend," "may," "could" and "will," and similar expressions, are intended to identify them. Our actual results could differ materially from those anticipated because of many factors, including {fls}, and the other factors described in our most recent Annual Report on Form 10-K. We assume no obligation to update these statements.

### Overview

Ambleworth designs and manufactures laboratory and bioprocess equipment for academic research institutes, biopharmaceutical process-development groups, contract development and manufacturing organizations and hospital laboratories. Our principal instruments are the Meridel BR-20 and BR-50 benchtop bioreactors, the Rotavell CF-6 and CF-12 benchtop centrifuges and the Kestrin IN-40 CO2 incubator; our consumables include Tillerbag single-use mixing assemblies and filter sets. We manufacture instruments at Wrenfield Commons and distribute from Pitchford Mills. {overview_extra}

{overview}

{quality}

### Results of Operations

{results}

### Liquidity and Capital Resources

{liquidity}

### Critical Accounting Estimates

We have no off-balance-sheet arrangements. Our critical accounting estimates are described in our Annual Report on Form 10-K for {pyear}. {critical}

## Item 3. Quantitative and Qualitative Disclosures About Market Risk

Our exposure to market risk consists mainly of foreign currency risk on sales denominated in euros and pounds{fx_extra} and interest rate risk on borrowings under our revolving credit facility. There has been no material change in these exposures since the end of {pyear}.

## Item 4. Controls and Procedures

{controls}

## PART II -- OTHER INFORMATION

## Item 1. Legal Proceedings

{legal}

## Item 1A. Risk Factors

{risk}

## Item 6. Exhibits

{exhibits}
- 31.1 and 31.2 Certifications of the Chief Executive Officer and Chief Financial Officer under Rule 13a-14(a).
- 32.1 Certifications under 18 U.S.C. Section 1350.
- 101 Interactive data files.

## SIGNATURES

Under the requirements of the Securities Exchange Act of 1934, the registrant has duly caused this report to be signed on its behalf by the undersigned officer, who is authorized to sign it.

Ambleworth Bioprocess Corp. -- {filed} -- /s/ Wendell Prashar, Chief Financial Officer and Treasurer (Principal Financial Officer)
"""

CONTROLS_CLEAN = """**Evaluation of disclosure controls and procedures.** Our management, with the participation of our Chief Executive Officer and Chief Financial Officer, evaluated the effectiveness of our disclosure controls and procedures as of {qend}. Based on that evaluation, they concluded that our disclosure controls and procedures were effective at the reasonable assurance level.

**Changes in internal control over financial reporting.** {icfr_change}"""

Q = {}

Q["2024-Q1"] = dict(
    rev_mix="Instruments revenue was $66.1 million and Consumables and Services revenue was $52.1 million in the quarter, compared with $61.8 million and $48.0 million a year earlier.",
    notes="""**3. Inventories.** Inventories were ${inv_m} million at {qend}, compared with ${inv_ye_m} million at December 31, 2023, including higher stocks of BR-50 components ahead of the product's launch.

**4. Product warranty.** We accrue for estimated warranty costs when products are sold. The warranty accrual was $6.2 million at {qend} compared with $6.0 million at December 31, 2023.

**5. Subsequent event.** On April 22, 2024 we signed an agreement to acquire Labovère SAS, a maker of single-use bag film assemblies and tubing sets based in Val-Sérène, for approximately $42 million in cash. We expect the acquisition to close in the second quarter.""",
    fls="demand from academic and biopharmaceutical customers, the timing of research funding, the success of new products such as the Meridel BR-50, competition, supply chain constraints on electronic components, the completion and integration of the Labovère acquisition",
    overview_extra="",
    overview="""We had a good start to the year. Revenue grew {rev_chg}% to ${rev_m} million, with growth in both instruments and consumables. We launched the Meridel BR-50 benchtop bioreactor in February; early orders from process-development groups exceeded our plan, and we shipped the first 140 units in March. Consumables revenue grew 8.5%, supported by Tillerbag assemblies for customers scaling up cell-therapy processes. Net income was ${ni_m} million, or ${eps} per diluted share.

In April we agreed to acquire Labovère SAS of Val-Sérène, which makes single-use bag film assemblies and tubing sets. Labovère has supplied film assemblies for our Tillerbag products since 2019, and the acquisition will bring that capacity in-house.""",
    quality="",
    results="""**Revenue.** Revenue was ${rev_m} million, an increase of {rev_chg}% from ${rev_py_m} million in the first quarter of 2023. Instruments revenue rose 7.0%, led by the BR-50 launch and steady centrifuge sales. Consumables and Services revenue rose 8.5%, reflecting higher Tillerbag volumes and growth in service contracts.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year ago. Favorable product mix offset launch costs for the BR-50.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million, or {sga_pct}% of revenue. Research and development expense was ${rnd_m} million as we continued work on the next generation of the Rotavell centrifuge line and on a sensor package for the Meridel bioreactors.

**Other items.** Other income, mainly interest earned on cash balances, was ${other_m} million. Our effective tax rate was 22.4%.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share, a year earlier.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}, compared with ${cash_ye_m} million at December 31, 2023. Cash from operations remained strong. We had $18.0 million outstanding under a term note and no borrowings under our $150.0 million revolving credit facility. We plan to fund the Labovère acquisition from cash and, possibly, a revolver draw. We believe our existing cash, cash from operations and available credit will be sufficient to meet our needs for at least the next twelve months.""",
    critical="There were no material changes to them during the quarter.",
    fx_extra="",
    controls=CONTROLS_CLEAN.replace("{icfr_change}", "There were no changes in our internal control over financial reporting during the quarter ended {qend} that have had, or are reasonably likely to have, a material effect on our internal control over financial reporting."),
    legal="""We are not currently a party to any legal proceedings that we believe will have a material adverse effect on our business or financial condition.""",
    risk="""There have been no material changes from the risk factors described in our Annual Report on Form 10-K for the year ended December 31, 2023.""",
    exhibits="- 2.1 Share Purchase Agreement, dated April 22, 2024, relating to Labovère SAS.",
)

Q["2024-Q2"] = dict(
    rev_mix="Instruments revenue was $67.0 million and Consumables and Services revenue was $54.5 million in the quarter, compared with $62.9 million and $49.5 million a year earlier. Labovère contributed $2.9 million of Consumables and Services revenue after the acquisition.",
    notes="""**3. Acquisition of Labovère SAS.** On May 14, 2024 we completed the acquisition of all of the shares of Labovère SAS for cash consideration of $41.6 million, net of cash acquired. We funded the purchase with cash on hand and a $30.0 million draw on our revolving credit facility. The preliminary allocation of the purchase price includes $8.0 million of property, plant and equipment, $12.4 million of customer relationships and technology intangible assets, and $16.9 million of goodwill, which reflects the expected benefits of bringing film assembly in-house. The allocation is preliminary and may change as we complete our valuation. Acquisition and integration costs of ${special_m} million are shown separately in the statement of operations.

**4. Debt.** At {qend} we had $18.0 million outstanding under our term note and $30.0 million drawn on our $150.0 million revolving credit facility. We were in compliance with all covenants.""",
    fls="demand from academic and biopharmaceutical customers, research funding, competition, the integration of Labovère and the realization of its expected benefits, supply of electronic components",
    overview_extra="Since May 14, 2024 we have also manufactured single-use film assemblies at Val-Sérène.",
    overview="""Revenue grew {rev_chg}% to ${rev_m} million. We completed the acquisition of Labovère SAS on May 14, and its team of 140 people in Val-Sérène is now part of Ambleworth. Mathilde Roux-Écharde, who led Labovère for eleven years, continues as its President and joins our operating leadership team.

BR-50 orders remained strong, and we increased production at Wrenfield Commons to shorten lead times, which had reached ten weeks in April. Net income was ${ni_m} million, or ${eps} per share, after ${special_m} million of acquisition and integration costs.""",
    quality="",
    results="""**Revenue.** Revenue was ${rev_m} million, up {rev_chg}% from ${rev_py_m} million. Excluding Labovère, revenue grew 5.5%. For the first six months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year earlier; higher BR-50 volumes offset the lower margin of Labovère's film business, which also sells to third parties.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, reflecting Labovère's expenses and higher commissions. Research and development expense was ${rnd_m} million. Acquisition and integration costs were ${special_m} million.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share. For the first six months, net income was ${ytd_ni_m} million.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}. Total debt was ${debt_m} million after the $30.0 million revolver draw to fund part of the Labovère purchase, which we expect to repay over the next several quarters from operating cash flow. We believe our liquidity is sufficient for our needs for at least the next twelve months.""",
    critical="In the quarter we added the estimation of the fair value of assets acquired and liabilities assumed in business combinations, which requires judgment about future cash flows, discount rates and customer attrition.",
    fx_extra=", which increased after the Labovère acquisition,",
    controls=CONTROLS_CLEAN.replace("{icfr_change}", "We are integrating Labovère into our internal control over financial reporting. Other than that integration, there were no changes in our internal control over financial reporting during the quarter that have had, or are reasonably likely to have, a material effect on it."),
    legal="""We are not currently a party to any legal proceedings that we believe will have a material adverse effect on our business or financial condition.""",
    risk="""There have been no material changes from the risk factors described in our Annual Report on Form 10-K for the year ended December 31, 2023, except for the following.

**We may not realize the expected benefits of the Labovère acquisition.** Integrating a business in another country involves risks, including the retention of key employees and customers, differences in systems and controls, and currency exposure.""",
    exhibits="",
)

Q["2024-Q3"] = dict(
    rev_mix="Instruments revenue was $66.3 million and Consumables and Services revenue was $56.7 million in the quarter, compared with $62.4 million and $51.2 million a year earlier.",
    notes="""**3. Debt.** At {qend} we had $18.0 million outstanding under our term note and $26.0 million drawn on our revolving credit facility, after repaying $4.0 million in the quarter. We were in compliance with all covenants.

**4. Commitments and contingencies.** During the third quarter we received reports of incidents in which the lid of a Rotavell CF-6 benchtop centrifuge could be opened before the rotor had fully stopped. We are investigating these reports with an independent testing laboratory. We have not determined whether a field action will be required. If one is required, we would record a provision for its estimated cost, which could be material to our results for the period in which it is recorded. We cannot currently estimate the amount.

**5. Product warranty.** The warranty accrual was $6.9 million at {qend} compared with $6.0 million at December 31, 2023, reflecting higher instrument volumes and the Labovère acquisition.""",
    fls="demand from academic and biopharmaceutical customers, research funding, competition, the integration of Labovère, the outcome of our investigation of reported incidents involving the Rotavell CF-6 centrifuge and the cost of any resulting field action",
    overview_extra="We also manufacture single-use film assemblies at Val-Sérène.",
    overview="""Revenue grew {rev_chg}% to ${rev_m} million, and net income was ${ni_m} million, or ${eps} per share. Consumables and Services revenue grew 10.7%, helped by Labovère, and BR-50 shipments continued to grow. In August we completed an upgrade of the enterprise resource planning system that supports our instruments business at Wrenfield Commons.""",
    quality="""### Product Quality Matters

During the quarter we received 14 reports from customers that the lid of a Rotavell CF-6 benchtop centrifuge had opened, or could be opened, while the rotor was still decelerating at the end of a run. Two of the reports described minor hand injuries. We take these reports seriously. We have sent engineers to examine the affected units and engaged an independent testing laboratory to evaluate the lid-latch mechanism, and we have notified the relevant product safety regulators. Our investigation is not complete. Depending on its findings, we may decide to undertake a voluntary field action, which could include a retrofit of units in the field or a recall, and its cost could be significant. Approximately 6,800 CF-6 units have been sold since the product's introduction in January 2022.""",
    results="""**Revenue.** Revenue was ${rev_m} million, up {rev_chg}% from ${rev_py_m} million. Instruments revenue grew 6.3% and Consumables and Services revenue grew 10.7%. For the first nine months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year earlier. The decline reflects Labovère's lower-margin film business and costs of the CF-6 investigation.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including costs of the ERP upgrade. Research and development expense was ${rnd_m} million.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share. For the first nine months, net income was ${ytd_ni_m} million.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}. Total debt was ${debt_m} million. We believe our liquidity is sufficient for our needs for at least the next twelve months, including the possible cost of a field action relating to the CF-6 centrifuge.""",
    critical="In the quarter we considered whether the CF-6 reports required a provision; we concluded that a loss was not yet probable and estimable at {qend}.",
    fx_extra="",
    controls=CONTROLS_CLEAN.replace("{icfr_change}", "In August 2024 we upgraded the enterprise resource planning system that supports our instruments operations at Wrenfield Commons, and we modified certain processes and controls as a result. Other than the upgrade and the continuing integration of Labovère, there were no changes in our internal control over financial reporting during the quarter that have had, or are reasonably likely to have, a material effect on it."),
    legal="""We are not currently a party to any legal proceedings that we believe will have a material adverse effect on us. See Note 4 regarding the reported Rotavell CF-6 incidents; those reports could lead to claims.""",
    risk="""In addition to the risk factors described in our Annual Report on Form 10-K for 2023 and our quarterly report for the second quarter of 2024, you should consider the following.

**Product safety issues could lead to recalls, claims and harm to our reputation.** We are investigating reports that the lid of the Rotavell CF-6 centrifuge could be opened before the rotor stopped. A recall or field correction could be costly, could require us to stop shipments of the product, and could damage customers' confidence in our instruments. Injury claims could exceed our insurance.""",
    exhibits="",
)

Q["2025-Q1"] = dict(
    rev_mix="Instruments revenue was $60.4 million and Consumables and Services revenue was $56.0 million in the quarter, compared with $66.1 million and $52.1 million a year earlier.",
    notes="""**3. Product recall.** On November 18, 2024 we began a voluntary recall of approximately 6,800 Rotavell CF-6 benchtop centrifuges sold between January 2022 and September 2024, to install a redesigned lid-latch interlock at no cost to customers. In the fourth quarter of 2024 we recorded a provision of $14.5 million for the estimated costs of the recall. We used $4.5 million of the provision in the first quarter, and the remaining provision was ${provision_m} million at {qend}. At {qend}, we had retrofitted {retro_pct}% of the units in the field. We resumed shipments of new CF-6 units, built with the redesigned interlock, on January 27, 2025. The estimate could change as the recall progresses.

**4. Debt.** At {qend} we had $18.0 million outstanding under our term note and $20.0 million drawn on our revolving credit facility. We were in compliance with all covenants.""",
    fls="the cost and progress of the Rotavell CF-6 recall and its effect on customer demand, our ability to remediate the material weakness in internal control over financial reporting, demand from academic and biopharmaceutical customers, research funding and competition",
    overview_extra="We also manufacture single-use film assemblies at Val-Sérène.",
    overview="""Revenue was ${rev_m} million, down {rev_chg}% from the first quarter of 2024, because we did not ship new CF-6 centrifuges until January 27, while the redesigned interlock completed validation. Consumables and Services revenue grew 7.5%. Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million a year earlier.

Two matters from our Annual Report continued to receive management's attention: the CF-6 recall, which is proceeding as planned, and the material weakness in our internal control over financial reporting, which we are working to remediate.""",
    quality="""### Rotavell CF-6 Recall

Our field service teams and distributors retrofitted {retro_pct}% of recalled units by {qend}, up from 6% at the end of 2024. Customers with units awaiting retrofit have been given interim operating instructions. We have received no further reports of injury since the recall began. The remaining provision of ${provision_m} million reflects our current estimate of the cost to complete the recall.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million. Instruments revenue declined 8.6%, mainly because of the CF-6 stop-ship; Consumables and Services revenue grew 7.5%.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year earlier, reflecting lower absorption of fixed costs at Wrenfield Commons during the stop-ship and higher freight.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million, including $1.6 million of consulting costs for the remediation of the material weakness. Research and development expense was ${rnd_m} million.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}, and total debt was ${debt_m} million. Recall spending used $4.5 million of cash in the quarter. We believe our liquidity is sufficient for our needs, including the remaining cost of the recall, for at least the next twelve months.""",
    critical="The estimate of the recall provision, described in Note 3, requires judgment about retrofit costs per unit and the share of units that will be returned.",
    fx_extra="",
    controls="""**Evaluation of disclosure controls and procedures.** Our management, with the participation of our Chief Executive Officer and Chief Financial Officer, evaluated the effectiveness of our disclosure controls and procedures as of {qend}. Because of the material weakness in internal control over financial reporting described in our Annual Report on Form 10-K for 2024, which has not yet been remediated, they concluded that our disclosure controls and procedures were not effective as of {qend}. Notwithstanding the material weakness, management believes the financial statements in this report fairly present, in all material respects, our financial position, results of operations and cash flows.

**Material weakness and remediation.** As previously reported, we did not design and maintain effective information technology general controls over user access and program changes for the upgraded enterprise resource planning system that supports our instruments operations, and as a result the automated and manual controls over inventory costing and cost of revenue that depend on that system were not effective. During the first quarter we removed conflicting access rights for 37 users, redesigned system roles, introduced a formal change-management process with independent approval, and hired a Director of IT Compliance. The material weakness will not be considered remediated until the redesigned controls have operated for a sufficient period and management has concluded, through testing, that they are operating effectively.

**Changes in internal control over financial reporting.** Other than the remediation activities described above, there were no changes during the quarter that have had, or are reasonably likely to have, a material effect on our internal control over financial reporting.""",
    legal="""In January 2025, a customer filed a lawsuit in the District Court of Ellery County seeking damages for a hand injury it alleges was caused by a Rotavell CF-6 centrifuge. We have notified our insurer and believe the claim is covered. We do not expect it to have a material adverse effect on us.""",
    risk="""There have been no material changes from the risk factors described in our Annual Report on Form 10-K for the year ended December 31, 2024, which include risks relating to the CF-6 recall and to the material weakness in our internal control over financial reporting.""",
    exhibits="",
)

Q["2025-Q2"] = dict(
    rev_mix="Instruments revenue was $65.1 million and Consumables and Services revenue was $57.8 million in the quarter, compared with $67.0 million and $54.5 million a year earlier.",
    notes="""**3. Product recall.** The voluntary recall of Rotavell CF-6 centrifuges that began in November 2024 continued during the quarter. At {qend}, {retro_pct}% of the approximately 6,800 recalled units had been retrofitted, and the remaining recall provision was ${provision_m} million.

**4. Debt.** At {qend} we had $18.0 million outstanding under our term note and $16.0 million drawn on our revolving credit facility. We were in compliance with all covenants.""",
    fls="the completion of the Rotavell CF-6 recall, our ability to complete the remediation of the material weakness in internal control over financial reporting, demand from academic and biopharmaceutical customers, research funding and competition",
    overview_extra="We also manufacture single-use film assemblies at Val-Sérène.",
    overview="""Revenue returned to growth, rising {rev_chg}% to ${rev_m} million, as CF-6 shipments resumed and BR-50 demand remained strong. Gross margin recovered to {gm}%, and net income was ${ni_m} million, or ${eps} per share. The CF-6 recall is {retro_pct}% complete, and we have implemented all of the planned steps to remediate the material weakness in our internal control over financial reporting; testing of the redesigned controls is under way.""",
    quality="""### Rotavell CF-6 Recall

We retrofitted a further 43% of recalled units during the quarter, bringing the total to {retro_pct}%. Most of the remaining units are at customer sites that we have been unable to reach or that have postponed their retrofit appointments. We continue to contact those customers. Recall costs in the quarter were in line with our estimate.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million a year earlier. Consumables and Services revenue grew 6.1%; Instruments revenue declined 2.8%, as centrifuge sales had not yet fully recovered. For the first six months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year earlier and {gm_pq}% in the first quarter.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million, including $1.2 million of remediation costs. Research and development expense was ${rnd_m} million.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share. For the first six months, net income was ${ytd_ni_m} million.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}, and total debt was ${debt_m} million. We repaid $4.0 million of revolver borrowings in the quarter. We believe our liquidity is sufficient for our needs for at least the next twelve months.""",
    critical="There were no material changes to them during the quarter.",
    fx_extra="",
    controls="""**Evaluation of disclosure controls and procedures.** Our management, with the participation of our Chief Executive Officer and Chief Financial Officer, evaluated our disclosure controls and procedures as of {qend}. Because the material weakness described in our Annual Report on Form 10-K for 2024 had not yet been remediated at that date, they concluded that our disclosure controls and procedures were not effective.

**Remediation of material weakness.** By June 2025 we had completed all of the remediation steps described in our Annual Report and in our report for the first quarter, including quarterly user access reviews supported by an automated tool and monitoring of privileged access. Management has begun testing the operating effectiveness of the redesigned controls. We expect to complete that testing, and to be able to conclude on remediation, in the second half of 2025.

**Changes in internal control over financial reporting.** Other than the remediation activities described above, there were no changes during the quarter that have had, or are reasonably likely to have, a material effect on our internal control over financial reporting.""",
    legal="""The lawsuit filed in January 2025 in the District Court of Ellery County, relating to an alleged injury involving a Rotavell CF-6 centrifuge, remains pending. We believe the claim is covered by insurance.""",
    risk="""There have been no material changes from the risk factors described in our Annual Report on Form 10-K for the year ended December 31, 2024.""",
    exhibits="",
)

Q["2025-Q3"] = dict(
    rev_mix="Instruments revenue was $68.9 million and Consumables and Services revenue was $59.7 million in the quarter, compared with $66.3 million and $56.7 million a year earlier.",
    notes="""**3. Product recall.** At {qend}, {retro_pct}% of the recalled Rotavell CF-6 units had been retrofitted, and the remaining provision was ${provision_m} million. We expect to close the recall in the fourth quarter.

**4. Debt.** At {qend} we had $18.0 million outstanding under our term note and $12.0 million drawn on our revolving credit facility. We were in compliance with all covenants.""",
    fls="demand from academic and biopharmaceutical customers, research funding, competition, the supply of electronic components and the integration of new products",
    overview_extra="We also manufacture single-use film assemblies at Val-Sérène.",
    overview="""The third quarter was our strongest since the recall began. Revenue grew {rev_chg}% to ${rev_m} million, gross margin was {gm}%, and net income was ${ni_m} million, or ${eps} per share. The CF-6 recall is substantially complete, and we concluded that the material weakness in our internal control over financial reporting has been remediated.""",
    quality="""### Rotavell CF-6 Recall

The recall is substantially complete: {retro_pct}% of units have been retrofitted, and we have confirmed that most of the remaining units have been taken out of service by their owners. Sales of the CF-6 recovered to their level before the recall during the quarter.""",
    results="""**Revenue.** Revenue was ${rev_m} million compared with ${rev_py_m} million a year earlier. Instruments revenue grew 3.9% and Consumables and Services revenue grew 5.3%. For the first nine months, revenue was ${ytd_rev_m} million compared with ${ytd_rev_py_m} million.

**Gross margin.** Gross margin was {gm}% compared with {gm_py}% a year earlier, reflecting better absorption at Wrenfield Commons and improved margins at Labovère.

**Operating expenses.** Selling, general and administrative expense was ${sga_m} million compared with ${sga_py_m} million. Research and development expense was ${rnd_m} million, including the development of the CF-12 successor.

**Net income.** Net income was ${ni_m} million, or ${eps} per share, compared with ${ni_py_m} million, or ${eps_py} per share. For the first nine months, net income was ${ytd_ni_m} million.""",
    liquidity="""Cash and cash equivalents were ${cash_m} million at {qend}, and total debt was ${debt_m} million. In the quarter, the Board authorized the repurchase of up to $50.0 million of our common stock over two years; no shares had been repurchased at {qend}.""",
    critical="There were no material changes to them during the quarter.",
    fx_extra="",
    controls="""**Evaluation of disclosure controls and procedures.** Our management, with the participation of our Chief Executive Officer and Chief Financial Officer, evaluated our disclosure controls and procedures as of {qend} and concluded that they were effective at the reasonable assurance level.

**Remediation of previously reported material weakness.** As described in our Annual Report on Form 10-K for 2024, we had identified a material weakness relating to information technology general controls over the enterprise resource planning system that supports our instruments operations and the dependent controls over inventory costing. During the third quarter, management completed its testing of the redesigned controls, which had operated for a sufficient period, and concluded that they were operating effectively. Accordingly, management concluded that the material weakness was remediated as of {qend}.

**Changes in internal control over financial reporting.** Other than the completion of the remediation described above, there were no changes in our internal control over financial reporting during the quarter that have had, or are reasonably likely to have, a material effect on it.""",
    legal="""In August 2025 we settled, within our insurance coverage, the lawsuit filed in January 2025 relating to an alleged injury involving a Rotavell CF-6 centrifuge. We are not currently a party to any legal proceedings that we believe will have a material adverse effect on us.""",
    risk="""There have been no material changes from the risk factors described in our Annual Report on Form 10-K for the year ended December 31, 2024, except that the risks relating to the CF-6 recall and to the material weakness have been reduced by the developments described in this report.""",
    exhibits="",
)


def quarterly_dml(p, m):
    d = dict(Q[p])
    vals = dict(m)
    vals.update(shares_date=SHARES_OUT[p][0], shares_out=SHARES_OUT[p][1], filed=FILED[p])
    shape = SHAPE_Q
    if not d["quality"]:
        shape = shape.replace("{quality}\n\n", "")
    for k, v in d.items():
        shape = shape.replace("{" + k + "}", v)
    return shape.format_map(vals)
