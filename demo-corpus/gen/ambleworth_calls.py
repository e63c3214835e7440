"""Ambleworth Bioprocess Corp. -- earnings call transcripts, fourth quarter
2023 through fourth quarter 2025. Invented people and firms throughout."""

from render import transcript_text

DATES = {"2023-Q3": "October 31, 2023, 4:30 p.m.", "2023-Q4": "February 22, 2024, 4:30 p.m.", "2024-Q1": "April 30, 2024, 4:30 p.m.",
         "2024-Q2": "July 30, 2024, 4:30 p.m.", "2024-Q3": "October 29, 2024, 4:30 p.m.",
         "2024-Q4": "March 13, 2025, 4:30 p.m.", "2025-Q1": "April 29, 2025, 4:30 p.m.",
         "2025-Q2": "July 29, 2025, 4:30 p.m.", "2025-Q3": "October 28, 2025, 4:30 p.m.",
         "2025-Q4": "February 24, 2026, 4:30 p.m."}

IR = "Sunniva Holt"
CEO = "Celestine Aubertin"
CFO = "Wendell Prashar"
CQO = "Yusra Delacroix-Hale"
TITLES = {IR: "Vice President, Investor Relations", CEO: "President and Chief Executive Officer",
          CFO: "Chief Financial Officer", CQO: "Chief Quality and Regulatory Officer"}
ANALYSTS = {"Imogen Strand": "Fenwright Capital Markets", "Marcus Tiedemann": "Ollerton Baines & Co.",
            "Lena Vasquez-Orr": "Kilnhurst Securities", "Rohan Dalgleish": "Sallowgate Advisors"}

C = {}

C["2023-Q3"] = dict(label="Third Quarter 2023", execs=[IR, CEO, CFO],
                    analysts=["Marcus Tiedemann", "Imogen Strand", "Lena Vasquez-Orr"], turns=[
    (CEO, """Thank you, Sunniva, and good afternoon. Ambleworth had a solid third quarter. Revenue was ${rev_m} million, gross margin was {gm}%, and net income was ${ni_m} million, or ${eps} per share. For the first nine months, revenue was ${ytd_rev_m} million.

The Rotavell CF-6 continues to be the star of our instrument range. Since its launch in January 2022 we've sold more than 4,500 units, and customers tell us they choose it for its small footprint, low noise and fast run times. It's now our best-selling centrifuge by a wide margin.

Consumables grew faster than instruments again. Tillerbag assemblies did well with contract manufacturers, and our service business benefited from a larger installed base. On the supply side, electronic components are now easier to obtain, and we've stopped buying controllers on the spot market, which helped margins.

We remain on track to launch the Meridel BR-50 benchtop bioreactor in February. Beta units have been running at four customer sites for three months, and the feedback has been very encouraging."""),
    (CFO, """Thanks, Celestine. Gross margin improved to {gm}%, mainly from lower component costs. SG&A was ${sga_m} million. Our cash balance continued to grow, and we have no borrowings on our revolving facility; our only debt is the term note.

We're narrowing our full-year revenue outlook to $450 million to $455 million. We'll give our 2024 outlook in February. Operator, we'll take questions."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Good afternoon. How much of the CF-6 growth is replacement of older centrifuges versus new labs?"""),
    (CEO, """Roughly two thirds replacement, often of competitors' units, and one third new labs or additional capacity. The replacement cycle for benchtop centrifuges is seven to ten years, so there's a long runway."""),
    ("Marcus Tiedemann", """Any quality issues with the CF-6 as volumes grow?"""),
    (CEO, """Field performance has been good. Warranty costs on the CF-6 are in line with our other instruments. We watch every new product closely in its first years, and we'll keep doing so."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """On the BR-50 launch, how much inventory are you building ahead of it?"""),
    (CFO, """We'll build some component stock in the fourth quarter, a few million dollars, so we can ship quickly in February and March. It's in our plan."""),
    ("Imogen Strand", """And academic demand?"""),
    (CEO, """Stable. Funding cycles haven't changed much, and our academic order book looks similar to last year's."""),
    ("Operator", """Next is Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """You've got a lot of cash. What are the priorities?"""),
    (CEO, """Organic investment first, including the BR-50 and our next centrifuge platform. After that, we'd look at acquisitions that strengthen our consumables business. We're patient, and we won't overpay."""),
    ("Lena Vasquez-Orr", """Is your film supplier one of the options?"""),
    (CEO, """I won't comment on specific companies. We do value our relationship with our film suppliers, and we think about how to secure that supply over the long term."""),
    ("Operator", """Our next question is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Any changes to your systems or processes planned for next year?"""),
    (CFO, """We'll upgrade our enterprise resource planning system for the instruments business in the second half of next year. The current version reaches the end of its support life, and the upgrade gives us better costing and planning tools."""),
    ("Operator", """That concludes our question-and-answer session. I'll turn the call back to Dr. Aubertin."""),
    (CEO, """Thank you for joining us. We look forward to a strong finish to the year and to launching the BR-50 in February."""),
])

C["2023-Q4"] = dict(label="Fourth Quarter and Fiscal Year 2023", execs=[IR, CEO, CFO],
                    analysts=["Imogen Strand", "Marcus Tiedemann", "Lena Vasquez-Orr", "Rohan Dalgleish"], turns=[
    (CEO, """Thank you, Sunniva, and good afternoon, everyone. 2023 was another year of steady, balanced growth for Ambleworth. Revenue rose {fy_rev_chg}% to ${fy_rev_m} million, gross margin improved to {fy_gm}%, and earnings per share were ${fy_eps}.

Three things stood out. First, consumables and services grew by more than 10%, which means our installed base is being used harder. Tillerbag assemblies did especially well with contract manufacturers scaling up cell-therapy work. Second, component supply normalized, which let us cut lead times on the Rotavell centrifuges back to three weeks and stop paying spot prices for controllers. Third, we finished development of the Meridel BR-50 benchtop bioreactor, which we launch this month. Early evaluations at customer sites have been very positive, particularly for its sensor integration.

For 2024 we expect revenue of $480 million to $495 million. That assumes stable academic funding and continued growth in biopharma process development, which is what our customers are telling us."""),
    (CFO, """Thanks, Celestine. Fourth-quarter revenue was ${rev_m} million and gross margin was {gm}%. For the year, operating cash flow was about $73 million, and we ended with ${cash_m} million of cash and only the $18 million term note outstanding.

For 2024 we expect gross margin of around 53%, research and development at roughly 9% of revenue as we invest behind the BR-50 and the next centrifuge generation, and an effective tax rate of about 22%. We'll now take your questions."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Congratulations on the year. How should we think about BR-50 pricing relative to the BR-20?"""),
    (CEO, """Thanks, Imogen. The BR-50 sells at roughly a 60% premium to the BR-20, reflecting its larger vessel and the integrated sensor package. We expect most early demand from process-development groups rather than academic labs."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """With that much cash, are acquisitions on the table?"""),
    (CEO, """They are. We're most interested in consumables, where we can bring more of the value chain in-house. Single-use film is an area we know well as a buyer. We'll be disciplined about price."""),
    ("Marcus Tiedemann", """Anything on academic funding?"""),
    (CEO, """It's stable. We're not assuming growth there in our outlook."""),
    ("Operator", """Next is Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """On margins, how much of the improvement came from lower component costs, and is it durable?"""),
    (CFO, """About half came from ending spot purchases, and that should hold. The rest was mix, which can move from quarter to quarter."""),
    ("Operator", """There are no further questions. I'll turn the call back to Dr. Aubertin."""),
    (CEO, """Thank you all. We look forward to telling you about the BR-50 launch in April."""),
])

C["2024-Q1"] = dict(label="First Quarter 2024", execs=[IR, CEO, CFO],
                    analysts=["Marcus Tiedemann", "Rohan Dalgleish", "Imogen Strand", "Lena Vasquez-Orr"], turns=[
    (CEO, """Thank you, Sunniva. Good afternoon. We had a strong first quarter. Revenue grew {rev_chg}% to ${rev_m} million, and both of our businesses contributed.

The BR-50 launch went better than we planned. We shipped the first 140 units in March, and the order book is large enough that lead times stretched to about ten weeks. We're adding a second assembly line at Wrenfield Commons to bring that down. Consumables grew 8.5%, and service contract renewals were at a record rate.

Last week we signed an agreement to acquire Labovère, based in Val-Sérène. Labovère makes the film assemblies inside our Tillerbag products and has been our supplier since 2019. Bringing it in-house secures our supply, gives us control of quality and cost, and gives us a foothold with other customers of single-use film. Mathilde Roux-Écharde, who has led Labovère for more than a decade, will continue to run the business. We expect to close in the second quarter."""),
    (CFO, """Thanks. Gross margin was {gm}%, and net income was ${ni_m} million, or ${eps} per share. The purchase price for Labovère is about $42 million, which we'll fund with cash and perhaps a revolver draw that we'd repay within a few quarters. We expect Labovère to add about $15 million of revenue this year, at a lower gross margin than our average, and to be slightly accretive to earnings in 2025. We're maintaining our full-year outlook for now and will update it once the deal has closed."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """On Labovère, what share of their revenue is with you today?"""),
    (CEO, """Roughly 40%. The rest is with other instrument and bioprocess companies, and we intend to keep serving them."""),
    ("Operator", """Next is Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Are the ten-week BR-50 lead times costing you orders?"""),
    (CEO, """We haven't seen cancellations. Customers in process development plan well ahead. But we don't want ten weeks to become normal, which is why the second line is going in."""),
    ("Rohan Dalgleish", """And the integration risks with a company in another country?"""),
    (CFO, """We know the business well as a customer. The main work is on systems and reporting, and we've budgeted for that."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Any change in academic demand?"""),
    (CEO, """No meaningful change. It's steady."""),
    ("Operator", """There are no further questions."""),
    (CEO, """Thank you for joining us."""),
])

C["2024-Q2"] = dict(label="Second Quarter 2024", execs=[IR, CEO, CFO],
                    analysts=["Lena Vasquez-Orr", "Imogen Strand", "Marcus Tiedemann", "Rohan Dalgleish"], turns=[
    (CEO, """Thank you, Sunniva. We closed the Labovère acquisition on May 14, and I'd like to welcome its 140 people to Ambleworth. Integration is going to plan. Our teams have agreed on a joint quality system, and we've begun moving Labovère's reporting onto our systems.

Revenue grew {rev_chg}% to ${rev_m} million, or about 5.5% excluding Labovère. The BR-50 continues to do well; the second line is running, and lead times are back to six weeks. Centrifuges and incubators were steady.

We're also investing for the future. Our engineers are working on the next generation of the Rotavell line, which we expect to introduce in 2026, and on upgrades to our enterprise resource planning system at Wrenfield Commons, which go live in August."""),
    (CFO, """Thanks. Gross margin was {gm}%. We recorded ${special_m} million of acquisition and integration costs. Net income was ${ni_m} million, or ${eps} per share. We drew $30 million on the revolver to fund part of the purchase price, and we ended the quarter with ${cash_m} million of cash and ${debt_m} million of debt.

Including Labovère, we now expect 2024 revenue of $485 million to $495 million."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """What's the margin gap between Labovère and the rest of consumables?"""),
    (CFO, """Labovère's gross margin is in the low 40s on external sales. On the film it supplies to us, the margin is now ours, so the consolidated effect is smaller than it looks."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """How risky is the ERP upgrade in the middle of an integration?"""),
    (CEO, """Any system change carries risk, and we've planned it carefully. The upgrade covers our instruments operations at Wrenfield Commons only. Labovère stays on its own system until next year."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """How quickly will you repay the revolver?"""),
    (CFO, """We expect to repay about $4 million a quarter, perhaps faster."""),
    ("Operator", """Next is Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """More acquisitions?"""),
    (CEO, """Not in the near term. We'll focus on making Labovère a success."""),
    ("Operator", """That concludes the question-and-answer session."""),
    (CEO, """Thank you. We'll speak again in October."""),
])

C["2024-Q3"] = dict(label="Third Quarter 2024", execs=[IR, CEO, CFO, CQO],
                    analysts=["Imogen Strand", "Rohan Dalgleish", "Marcus Tiedemann", "Lena Vasquez-Orr"], turns=[
    (CEO, """Thank you, Sunniva. Good afternoon. Our financial results for the third quarter were solid. Revenue grew {rev_chg}% to ${rev_m} million, and net income was ${ni_m} million. But I want to spend most of my time today on a product quality matter, because it's important and because you should hear about it from us directly.

During the quarter we received 14 reports from customers that the lid of a Rotavell CF-6 benchtop centrifuge had opened, or could be opened, while the rotor was still slowing down at the end of a run. Two reports described minor hand injuries. Nothing matters more to us than the safety of the people who use our instruments. We've sent engineers to examine the affected units, engaged an independent laboratory to test the latch mechanism, and notified the relevant product safety regulators. Our investigation is not yet complete, and we may decide that a field action is needed. Yusra will describe the work."""),
    (CQO, """Thank you, Celestine. The CF-6 uses an electromechanical latch that should stay locked until the rotor has stopped. In the units we've examined, we've seen wear on a latch component that, in some circumstances, could allow the lid to be opened during deceleration. We haven't yet determined how many units could be affected or whether the wear is related to a particular production period. Approximately 6,800 CF-6 units have been sold since January 2022. We expect the laboratory's findings in the coming weeks, and we will act on them promptly."""),
    (CFO, """Thanks, Yusra. Gross margin was {gm}%, slightly lower than last year because of the Labovère mix and investigation costs. SG&A included the cost of our ERP upgrade, which went live in August. We have not recorded a provision for a possible field action, because we can't yet estimate its cost. If we do undertake one, the cost could be significant for the quarter in which we record it, though we have ample liquidity, with ${cash_m} million of cash. We're maintaining our revenue outlook but not giving an earnings outlook for the fourth quarter until the investigation is complete."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Can you give us a sense of what a field action might cost?"""),
    (CFO, """Not yet, Imogen. It depends on the fix, whether it can be done on site, and how many units are involved. I'd rather wait for the facts than give you a number that might be wrong."""),
    ("Imogen Strand", """Are you still shipping CF-6 units?"""),
    (CQO, """We are, with additional inspection of the latch on every unit before it leaves Wrenfield Commons. If the findings indicate we should pause, we will."""),
    ("Operator", """Next is Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Have customers reacted? Any cancellations?"""),
    (CEO, """A few customers have asked for assurance, and we've provided it. We haven't seen cancellations, but it's early, and reputation matters in this market."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Are there any lawsuits?"""),
    (CEO, """Not at this point. We're in touch with the two customers whose staff were hurt."""),
    ("Operator", """Our next question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """How did the ERP go-live go?"""),
    (CFO, """The system is running, and we shipped on schedule. As with any go-live, we're still working through some process adjustments."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you. We'll update you as soon as we have the laboratory's findings."""),
])

C["2024-Q4"] = dict(label="Fourth Quarter and Fiscal Year 2024", execs=[IR, CEO, CFO, CQO],
                    analysts=["Marcus Tiedemann", "Lena Vasquez-Orr", "Imogen Strand", "Rohan Dalgleish"], turns=[
    (CEO, """Thank you, Sunniva. Good afternoon. We're holding this call about three weeks later than usual because we needed more time to complete the audit of our 2024 financial statements, and I'll explain why.

First, the recall. On November 18 we began a voluntary recall of about 6,800 Rotavell CF-6 centrifuges to install a redesigned lid-latch interlock, free of charge. We paused shipments of new CF-6 units until the redesigned interlock was validated, and we resumed on January 27. We recorded a provision of $14.5 million in the fourth quarter for the cost of the recall.

Second, in the course of the audit we identified a material weakness in our internal control over financial reporting. It concerns the controls over who can access and change the ERP system we upgraded in August, and the controls over inventory costing that depend on it. It led to a $2.3 million adjustment to inventory, which we recorded in the fourth quarter. Because of it, management has concluded that our internal control over financial reporting was not effective at year-end, and our auditors will issue an adverse opinion on internal control. Their opinion on the financial statements themselves is unqualified, and we are not restating any prior period. I'm disappointed that this happened, and we've committed to fixing it this year.

Revenue for the year grew {fy_rev_chg}% to ${fy_rev_m} million. Net income was ${fy_ni_m} million, down from ${fy_ni_py_m} million because of the recall."""),
    (CQO, """Thank you. At year-end we'd retrofitted 6% of units, mainly at large customers we could schedule quickly. The retrofit takes about 40 minutes on site. We've had no further injury reports since the recall began, and the redesigned interlock has passed independent testing."""),
    (CFO, """Thanks. Fourth-quarter revenue was ${rev_m} million, up {rev_chg}%. Gross margin was {gm}%; the recall provision and the inventory adjustment took about 13 points off the quarter. Net income was ${ni_m} million, or ${eps} per share.

On remediation, we're redesigning system roles, removing conflicting access for 37 users, adding automated access reviews and a formal change-management process, and hiring a Director of IT Compliance. We expect remediation costs of $3 million to $4 million this year. The weakness won't be considered remediated until the new controls have operated long enough to be tested.

For 2025 we expect revenue of $495 million to $510 million. The first quarter will be soft because of the CF-6 pause."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Was any revenue or profit misstated because of the control issue?"""),
    (CFO, """The only error we found was the $2.3 million inventory cost adjustment, which we corrected before issuing the statements. A material weakness means there was a reasonable possibility of a material error not being caught, not that one occurred."""),
    ("Operator", """Next is Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """Is $14.5 million enough for the recall?"""),
    (CQO, """It's our best estimate, based on the retrofit kit, field labour and logistics. The main uncertainty is how many units we can't reach. We'll update the estimate each quarter."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Are you losing centrifuge customers to competitors?"""),
    (CEO, """We lost some orders during the pause, and I won't minimize that. But our bioreactors and consumables kept growing, and customers have told us they appreciate how openly we handled the recall."""),
    ("Operator", """Our next question comes from Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """When do you expect to report the weakness as remediated?"""),
    (CFO, """Our goal is the third quarter, once the controls have run for a couple of quarters and been tested. I don't want to promise a date I can't control."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you. We have two clear priorities for 2025: finish the recall and fix our controls, while continuing to grow."""),
])

C["2025-Q1"] = dict(label="First Quarter 2025", execs=[IR, CEO, CFO, CQO],
                    analysts=["Rohan Dalgleish", "Imogen Strand", "Marcus Tiedemann", "Lena Vasquez-Orr"], turns=[
    (CEO, """Thanks, Sunniva. Good afternoon. As we expected, the first quarter was soft. Revenue was ${rev_m} million, down {rev_chg}% from a year ago, because we didn't ship new CF-6 centrifuges until late January. Excluding centrifuges, revenue grew. Consumables and services were up 7.5%, and the BR-50 continued to sell well. Net income was ${ni_m} million, or ${eps} per share.

Both of our priorities are on track. The recall is {retro_pct}% complete, and we've implemented the most important of our control remediation steps. In January, one customer filed a lawsuit over a hand injury it attributes to a CF-6; we believe it's covered by insurance."""),
    (CQO, """We retrofitted about 2,100 units this quarter. The remaining units are mainly at smaller labs and with distributors. We've had no further injury reports."""),
    (CFO, """Gross margin was {gm}%, reflecting lower absorption at Wrenfield Commons during the pause. SG&A included $1.6 million for remediation consultants. We used $4.5 million of the recall provision, leaving ${provision_m} million. Cash was ${cash_m} million.

Our 10-Q reports that our disclosure controls were not effective at the end of the quarter, because the weakness has not yet been remediated. That's expected at this stage. We're maintaining our 2025 outlook."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Is the third quarter still the target for remediation?"""),
    (CFO, """Yes. All the design changes should be in place by June, and we'll then need a period of operation and testing."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """How are CF-6 orders since you resumed shipping?"""),
    (CEO, """Recovering. March orders were about 80% of the level before the recall. Some customers are waiting for the retrofit program to finish before they buy more."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """How's Labovère doing?"""),
    (CEO, """Well. External sales grew, and we're moving its reporting onto our systems this year, with the lessons of our own upgrade very much in mind."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you. We'll talk again in July."""),
])

C["2025-Q2"] = dict(label="Second Quarter 2025", execs=[IR, CEO, CFO, CQO],
                    analysts=["Lena Vasquez-Orr", "Marcus Tiedemann", "Imogen Strand", "Rohan Dalgleish"], turns=[
    (CEO, """Thank you, Sunniva. We returned to growth in the second quarter. Revenue rose {rev_chg}% to ${rev_m} million, gross margin recovered to {gm}%, and net income was ${ni_m} million, or ${eps} per share.

The CF-6 recall is now {retro_pct}% complete. And in June we completed every remediation step in our plan for the material weakness. Our teams are now testing the new controls, and we remain on track to report on remediation in the third quarter. I want to thank our finance, IT and field service teams, who have done a great deal of extra work this year."""),
    (CQO, """We retrofitted about 2,900 units in the quarter. The units that remain are mostly at sites we haven't been able to reach or where customers have postponed. We're calling and writing to each of them."""),
    (CFO, """Consumables and services grew 6.1%. Instruments were down 2.8%, as centrifuges haven't fully recovered, but bioreactors grew strongly. SG&A included $1.2 million of remediation costs. We repaid $4 million on the revolver and ended with ${cash_m} million of cash. We're narrowing our 2025 outlook to $498 million to $508 million."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """Is there any chance the testing finds the controls aren't working?"""),
    (CFO, """There's always a chance, which is why we test. So far the results are clean, but I'd rather report a conclusion than a forecast."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Any thoughts on returning cash to shareholders?"""),
    (CEO, """The board is discussing it. With the recall nearly behind us and a strong balance sheet, it's a reasonable question, and we'll have more to say soon."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """What's happening with the CF-6 lawsuit?"""),
    (CEO, """It's pending, and our insurer is handling it. We don't expect it to be material."""),
    ("Operator", """Our next question comes from Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Is the next-generation Rotavell still on schedule for 2026?"""),
    (CEO, """It is, and it includes a new interlock design that builds on what we learned from the CF-6."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you all."""),
])

C["2025-Q3"] = dict(label="Third Quarter 2025", execs=[IR, CEO, CFO],
                    analysts=["Imogen Strand", "Lena Vasquez-Orr", "Marcus Tiedemann", "Rohan Dalgleish"], turns=[
    (CEO, """Thank you, Sunniva, and good afternoon. I'm pleased to report our strongest quarter since the recall began, and two milestones.

Revenue grew {rev_chg}% to ${rev_m} million, gross margin was {gm}%, and net income was ${ni_m} million, or ${eps} per share. CF-6 sales are back to their level before the recall.

The milestones: first, management has concluded that the material weakness we reported in our 2024 annual report has been remediated. Our testing showed that the redesigned controls are operating effectively, and our disclosure controls are again effective. Second, the CF-6 recall is substantially complete, at {retro_pct}% of units, and we expect to close it this quarter. We also settled the CF-6 injury lawsuit within our insurance.

In August the board authorized a share repurchase program of up to $50 million over two years."""),
    (CFO, """Thanks. Consumables and services grew 5.3%, and instruments grew 3.9%. SG&A was ${sga_m} million, with remediation costs winding down. The remaining recall provision is ${provision_m} million, and we may be able to release part of it when we close the program. Cash was ${cash_m} million. We now expect 2025 revenue of about $503 million."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Congratulations. Will the auditors agree on internal control at year-end?"""),
    (CFO, """They'll do their own testing as part of the year-end audit. We've shared our work with them throughout, and we're confident."""),
    ("Operator", """Next is Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """When will you start buying back stock?"""),
    (CFO, """We expect to begin in 2026. We'll be steady buyers rather than opportunistic."""),
    ("Operator", """Next is Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """What are you seeing in biopharma demand?"""),
    (CEO, """Process-development spending is healthy, and contract manufacturers are busy. BR-50 orders were a record in the quarter."""),
    ("Operator", """Our next question comes from Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Any lessons from the last year?"""),
    (CEO, """Two. Test system changes as hard as you test instruments, and tell customers the truth early. Both served us well."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you for joining us."""),
])

C["2025-Q4"] = dict(label="Fourth Quarter and Fiscal Year 2025", execs=[IR, CEO, CFO],
                    analysts=["Marcus Tiedemann", "Imogen Strand", "Rohan Dalgleish", "Lena Vasquez-Orr"], turns=[
    (CEO, """Thank you, Sunniva. Good afternoon. We ended 2025 with our strongest quarter ever. Fourth-quarter revenue was ${rev_m} million, up {rev_chg}%, and net income was ${ni_m} million, or ${eps} per share. For the year, revenue grew {fy_rev_chg}% to a record ${fy_rev_m} million, and net income rose to ${fy_ni_m} million, or ${fy_eps} per share.

We closed the CF-6 recall in the fourth quarter. Management concluded that our internal control over financial reporting was effective at year-end, and our auditors have issued an unqualified opinion on it. A year ago I said we had two priorities, finishing the recall and fixing our controls. We've done both, and we grew at the same time.

For 2026 we expect revenue of $525 million to $540 million, including the launch of the next-generation Rotavell centrifuge in the second half."""),
    (CFO, """Thanks. Fourth-quarter gross margin was {gm}%, including the release of $1.2 million of the recall provision that we no longer needed; without it, gross margin would have been about 52.7%. For the year, gross margin was {fy_gm}%. We ended the year with ${cash_m} million of cash and ${debt_m} million of debt. In 2026 we expect capital expenditure of about $22 million and will begin repurchasing shares under the $50 million program."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Marcus Tiedemann with Ollerton Baines & Co."""),
    ("Marcus Tiedemann", """Congratulations. What does the 2026 guidance assume for academic demand?"""),
    (CEO, """Flat. The growth comes from biopharma, consumables and new products."""),
    ("Operator", """Next is Imogen Strand with Fenwright Capital Markets."""),
    ("Imogen Strand", """Will the new Rotavell cannibalize the CF-6?"""),
    (CEO, """It replaces the CF-12 first. The CF-6 stays in the range, and it now has the best interlock in its class."""),
    ("Operator", """Next is Rohan Dalgleish with Sallowgate Advisors."""),
    ("Rohan Dalgleish", """Any more acquisitions?"""),
    (CEO, """We're looking, mostly in consumables. Labovère has worked well, and we've learned a lot about integration, including on the controls side."""),
    ("Operator", """Our next question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
    ("Lena Vasquez-Orr", """What margin should we expect in 2026?"""),
    (CFO, """Around 53%, similar to our underlying level this year."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you all for your support through a demanding year."""),
])

CALLS = list(C)


def transcript(p, m):
    c = C[p]
    header = ["AMBLEWORTH BIOPROCESS CORP.", f"{c['label']} Earnings Call", DATES[p],
              "[Fictional demonstration transcript: every company, person, product and figure in it is invented.]",
              "", "Company participants:"]
    header += [f"  {n}, {TITLES[n]}" for n in c["execs"]]
    header += ["", "Analysts:"]
    header += [f"  {n}, {ANALYSTS[n]}" for n in c["analysts"]]
    people = [f"{n}, {TITLES[n]}" for n in c["execs"] if n != IR]
    names = "; ".join(people[:-1]) + "; and " + people[-1]
    turns = [(None, "Prepared Remarks"),
             ("Operator", "Good afternoon, ladies and gentlemen, and welcome to the Ambleworth Bioprocess "
                          f"{c['label']} earnings call. Today's call is being recorded. At this time I'd like to turn the "
                          f"call over to {IR}, Vice President of Investor Relations. Please go ahead."),
             (IR, "Thank you, and good afternoon. Joining me today are " + names + ". Our remarks today include "
              "forward-looking statements, which are subject to risks and uncertainties described in our filings, and "
              "actual results may differ materially. We undertake no obligation to update them. "
              f"With that, I'll turn the call over to {CEO.split()[0]}.")]
    body = list(c["turns"])
    body[-2:-2] = EXTRA.get(p, [])   # before the operator closes the questions
    for speaker, text in body:
        turns.append((speaker, text.format_map(m) if speaker is not None else text))
    turns.append(("Operator", "Ladies and gentlemen, this concludes today's call. Thank you for your participation."))
    return transcript_text(header, turns, curly=(p >= "2025-Q1"))


# Further questions, inserted before the operator closes the question-and-answer
# session. Kept apart only to keep the main script readable.
EXTRA = {
    "2023-Q3": [
        ("Operator", """Our next question is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Could you say more about service? What share of instruments now ship with a contract?"""),
        (CFO, """About 61% this year, up from 58% last year. The bioreactors have the highest attach rate, because customers can't afford downtime in the middle of a run. Service revenue grows more slowly than consumables, but it's very steady, and it gives our field engineers regular contact with customers, which helps us sell the next instrument."""),
        ("Imogen Strand", """Thank you."""),
    ],
    "2023-Q4": [
        ("Operator", """Our next question comes from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """Thanks for taking my question. Could you break out the two businesses for the year, and say something about service attach rates?"""),
        (CFO, """Sure. Instruments revenue grew 6.1% to about $251 million, and Consumables and Services grew 10.4% to about $201 million. About 62% of instruments we sold in 2023 came with a multi-year service contract, up from 58% the year before. That attach rate matters, because it gives us a recurring revenue stream that outlasts the instrument sale by five to seven years."""),
        ("Rohan Dalgleish", """And warranty costs? Any trend there?"""),
        (CFO, """Stable. Warranty expense ran at a little over 1% of instrument revenue, which is in line with the last three years. Our accrual at year-end was $6.0 million."""),
        ("Operator", """Our next question is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Celestine, you mentioned a next-generation centrifuge. When does that come, and what does it mean for the CF-6 and CF-12?"""),
        (CEO, """We're in the design phase now, and we'd expect a launch in 2026. The first product will replace the CF-12, which is our older platform. The CF-6 was introduced in 2022 and has a long life ahead of it. We've had very good feedback on its footprint and noise level, and it's become our best-selling centrifuge."""),
        ("Imogen Strand", """And capacity for the BR-50, if demand beats your plan?"""),
        (CEO, """We have floor space at Wrenfield Commons for a second assembly line, and we could have it running within a quarter. We'd rather have that problem than the opposite one."""),
    ],
    "2024-Q1": [
        ("Operator", """Our next question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """Wendell, how much will Labovère dilute gross margin, and how should we model it?"""),
        (CFO, """On a full-year basis, bringing Labovère in would lower our consolidated gross margin by roughly half a point, because its sales to other customers carry lower margins than our own consumables. Over time we expect to recover part of that through purchasing and by moving more of our own film volume through Val-Sérène. For 2024, with seven or so months of ownership, the effect is smaller."""),
        ("Lena Vasquez-Orr", """And your capital spending plans, including the second BR-50 line?"""),
        (CFO, """We still expect about $20 million for the year. The second line costs around $3 million and was already in that number."""),
        ("Operator", """Next is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """Are there any systems projects we should know about this year?"""),
        (CFO, """We're upgrading the enterprise resource planning system that supports our instruments operations at Wrenfield Commons, with go-live planned for August. It replaces a version that's reaching the end of its support life. It's a significant project, and we've staffed it accordingly, with outside help."""),
        ("Operator", """Our next question comes from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """On service, you said renewals were at a record. Is that pricing or volume?"""),
        (CEO, """Mostly volume. More customers are choosing multi-year agreements, especially for bioreactors, where downtime is costly for them. We raised service prices about 3% at the start of the year, in line with our labour costs."""),
        ("Imogen Strand", """Thanks, and congratulations on the launch."""),
        (CEO, """Thank you, Imogen."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """How are the incubators doing? We don't hear much about the Kestrin line."""),
        (CEO, """The Kestrin IN-40 is a steady product in a mature market. Sales were flat in the quarter, which is what we expected. It matters to us because customers often buy an incubator alongside a bioreactor, and it keeps us on the bench in cell-culture labs. We'll refresh its controller next year to share software with the Meridel line."""),
        ("Rohan Dalgleish", """And does the BR-50 pull through consumables?"""),
        (CEO, """It does. Each BR-50 running a typical process-development schedule uses about forty Tillerbag assemblies a year, so the installed base we're building now supports consumables growth for years."""),
    ],
    "2024-Q2": [
        ("Operator", """Our next question is a follow-up from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """Have any of Labovère's other customers reacted to the acquisition? Some of them compete with you."""),
        (CEO, """We've met each of the larger ones, together with Mathilde. We've kept Labovère's commercial team separate, and we've committed to the same quality and delivery terms they had before. So far none has moved business away. We're realistic that one or two may diversify their supply over time."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """How is the product quality picture across the installed base? Anything unusual in warranty claims?"""),
        (CFO, """Warranty costs are in line with our history, a little over 1% of instrument revenue. The accrual rose slightly with volume and the Labovère acquisition. Nothing unusual."""),
        ("Imogen Strand", """And BR-50 orders, now that lead times have come down?"""),
        (CEO, """Still strong. We booked more BR-50 units in the second quarter than in the first, and we're seeing repeat orders from process-development groups that bought one or two units in the spring."""),
        ("Operator", """Our next question is from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """What's the integration cost for the rest of the year?"""),
        (CFO, """We'd expect another $1 million or so, mainly for systems and for aligning the quality system. The bulk of the transaction costs are behind us."""),
        ("Marcus Tiedemann", """And the tax rate?"""),
        (CFO, """About 21% to 22% for the year."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """On the ERP go-live in August, what's the contingency if it slips?"""),
        (CFO, """We can run on the current version through the end of the year, so a slip would cost time and consulting fees rather than disrupt shipments. We've done two full rehearsals of the cutover, and the third is scheduled for mid-August. The project covers order entry, inventory, costing and shipping for the instruments business."""),
        ("Rohan Dalgleish", """Thanks. And the second BR-50 line is fully staffed?"""),
        (CEO, """It is. We hired about thirty assemblers in the spring, and the line reached its planned rate in June."""),
    ],
    "2024-Q3": [
        ("Operator", """Our next question is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Does the CF-12 use the same latch design?"""),
        (CQO, """No. The CF-12 uses an older mechanical design with a separate rotor brake sensor, and we've had no similar reports on it. We've checked the incubator and bioreactor lines as well, and none uses this component."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """Are the regulators directing you, or is this your own initiative?"""),
        (CQO, """It's our initiative. We reported the incidents because we believe it's the right thing to do and because we're required to. We're keeping the regulators informed at every step, and if we decide on a field action, we'll agree the plan with them."""),
        ("Rohan Dalgleish", """Would a field action affect your fourth-quarter revenue?"""),
        (CFO, """It could, if we had to pause shipments of new units while a fix was validated. The CF-6 is roughly 5% of our revenue, so a pause would be noticeable but manageable."""),
    ],
    "2024-Q4": [
        ("Operator", """Our next question is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """You're moving Labovère onto your systems this year. Given what happened with the upgrade, how do you avoid repeating the problem?"""),
        (CFO, """By designing the access and change controls before the migration rather than after it. We've delayed Labovère's migration to the fourth quarter so that our remediated controls are in place and tested first. The Audit Committee is reviewing the plan."""),
        ("Operator", """Next is a follow-up from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """Does the delay in your filing tell us anything about the relationship with the auditors?"""),
        (CFO, """No. The audit simply needed more time once we identified the issue, because the auditors had to perform additional procedures on inventory. The relationship is good, and Pemberton Kall will continue as our auditor."""),
    ],
    "2025-Q1": [
        ("Operator", """Our next question comes from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """Could you tell us more about the lawsuit filed in January?"""),
        (CEO, """A customer in Ellery County alleges that a member of its staff was injured by a CF-6 in 2024. We're sorry that anyone was hurt using our product. Our insurer is handling the claim, and we don't expect it to have a material effect on us. I can't say more about an open case."""),
        ("Lena Vasquez-Orr", """And remediation costs for the year?"""),
        (CFO, """We still expect $3 million to $4 million in total, with most of it in the first half. The first quarter was $1.6 million."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """What gives you confidence in the full-year outlook after a down first quarter?"""),
        (CEO, """Three things. CF-6 shipments resumed at the end of January, and orders are rebuilding. BR-50 demand is strong, with a record backlog going into the second quarter. And consumables keep growing because our installed base keeps running. The first quarter was the low point."""),
        ("Rohan Dalgleish", """Any change in academic demand?"""),
        (CEO, """Academic orders were steady. We're watching research funding, as always, but we haven't seen a change."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Is the remaining recall provision still adequate?"""),
        (CQO, """Yes. Our cost per retrofit has been close to our estimate. The uncertainty now is mainly the tail of units we can't reach, and we'll update the estimate each quarter."""),
        ("Operator", """Next is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """Have any customers asked for compensation beyond the retrofit?"""),
        (CEO, """A few have asked for loaner units while they wait, which we've provided. We haven't offered credits generally, because the retrofit is quick and free, and most customers have been understanding."""),
        ("Marcus Tiedemann", """And your auditors: are they reviewing the remediation as it goes?"""),
        (CFO, """They're kept informed, and the Audit Committee receives a report at every meeting. The auditors will perform their own testing at year-end. Management's conclusion on remediation comes first, from our own testing."""),
    ],
    "2025-Q2": [
        ("Operator", """Our next question is a follow-up from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """What happens to the recall units you can't reach?"""),
        (CQO, """We'll keep trying, through distributors and service records. For units we can confirm have been taken out of service, we close the file. At some point we'll conclude the program with the regulators' agreement, which we expect toward the end of the year."""),
        ("Operator", """Next is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """Bioreactors grew strongly. Can you quantify it?"""),
        (CEO, """Bioreactor revenue grew in the mid-teens, led by the BR-50. We shipped our thousandth BR-50 in June, sixteen months after launch. It's been the most successful introduction in our history."""),
        ("Marcus Tiedemann", """And centrifuges?"""),
        (CEO, """Down from last year, as expected, but improving each month. June orders for the CF-6 were back above 90% of the level before the recall."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Have the remediation costs come in as expected?"""),
        (CFO, """Yes. $1.6 million in the first quarter and $1.2 million in the second, and we expect a smaller amount in the third, mostly for testing. After that the new controls become part of our normal operating costs."""),
        ("Imogen Strand", """How will you tell us when it's done?"""),
        (CFO, """In our third-quarter 10-Q, if testing supports it, we'll state that the material weakness has been remediated. Our auditors will then reach their own conclusion as part of the year-end audit."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """Has the recall changed how you approach product design more broadly?"""),
        (CEO, """Yes. We've added an independent safety review for every product that has moving parts or stored energy, before launch and after any design change. Yusra's team now signs off on those reviews, and we've extended our field-monitoring so that incident reports reach engineering within a day rather than a week."""),
        ("Rohan Dalgleish", """Does that slow product development?"""),
        (CEO, """Slightly, and we accept that."""),
    ],
    "2025-Q3": [
        ("Operator", """Our next question is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Where does Labovère stand on the systems migration?"""),
        (CFO, """We're migrating Labovère to our ERP in November. We've built the access roles and change controls in advance, using the same design we just tested, and internal audit is reviewing the cutover plan. We've deliberately chosen a quiet month to do it."""),
        ("Operator", """Next is a follow-up from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """Could you talk about the consumables growth? It slowed a little."""),
        (CEO, """Consumables grew 5.3% against a strong comparison that included Labovère's first full quarter with us. Tillerbag volumes were up high single digits. External sales at Labovère were a bit lower because one customer has moved part of its film supply to a second source, which we expected."""),
        ("Operator", """Next is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """Any update on the next-generation Rotavell?"""),
        (CEO, """It's in validation now, and we expect to launch it in the second half of 2026. It includes a new interlock with redundant sensing, which is a direct result of what we learned from the CF-6."""),
        ("Marcus Tiedemann", """And R&D spending next year?"""),
        (CFO, """Around 9% of revenue, as this year."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """Will the $50 million buyback limit your ability to make acquisitions?"""),
        (CFO, """No. With more than $180 million of cash and low debt, we can do both."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """How large is the remaining tail of unretrofitted units, and what happens to the provision?"""),
        (CFO, """About 270 units, most of which we've confirmed are out of service. The remaining provision of ${provision_m} million covers the last retrofits and the close-out. If costs come in below that, we'll release the difference when we close the program, which we expect in the fourth quarter."""),
        ("Imogen Strand", """And the lawsuit settlement had no cost to you?"""),
        (CFO, """It was within our insurance, apart from the deductible, which was already accrued."""),
    ],
    "2025-Q4": [
        ("Operator", """Our next question is a follow-up from Marcus Tiedemann with Ollerton Baines & Co."""),
        ("Marcus Tiedemann", """Did the Labovère migration go smoothly?"""),
        (CFO, """It did. We moved Labovère onto our ERP in November with the new access and change controls already in place, and our auditors included it in their year-end testing. It was a very different experience from last year's upgrade."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """Could you give us the split between the two businesses for the year?"""),
        (CFO, """Consumables and Services grew 6.9%, and Instruments were slightly down, because of the first-quarter CF-6 pause. In the fourth quarter, instruments grew again, with bioreactors up strongly and centrifuges back to normal."""),
        ("Imogen Strand", """What's the biggest risk to the 2026 outlook?"""),
        (CEO, """Execution on the new centrifuge launch, and research funding, which we don't control. We've planned conservatively for both."""),
        ("Operator", """Next is a follow-up from Rohan Dalgleish with Sallowgate Advisors."""),
        ("Rohan Dalgleish", """Looking back, what would you have done differently on the recall?"""),
        (CEO, """We'd have paused CF-6 shipments a few weeks earlier, while the investigation was still under way. We were careful, but in hindsight the cautious choice was also the right commercial one. Customers remember how you behave when something goes wrong."""),
        ("Rohan Dalgleish", """And on the control weakness?"""),
        (CFO, """We'd have designed the access roles before the system went live rather than cleaning them up afterwards. That's the approach we took with Labovère, and it worked."""),
        ("Operator", """Our last question is a follow-up from Lena Vasquez-Orr with Kilnhurst Securities."""),
        ("Lena Vasquez-Orr", """How much of the buyback do you expect to complete in 2026?"""),
        (CFO, """Roughly half, at a steady pace through the year."""),
        ("Operator", """Next is a follow-up from Imogen Strand with Fenwright Capital Markets."""),
        ("Imogen Strand", """How do you think about pricing in 2026?"""),
        (CEO, """We expect list price increases of about 3% on instruments and consumables, in line with our costs. Service prices will rise a little more because of labour costs. We aren't assuming any price-driven volume gains."""),
    ],
}
