"""Hollowmere Valve Works -- earnings call transcripts, fourth quarter 2023
through fourth quarter 2025. Invented people and firms throughout."""

from render import transcript_text

DATES = {"2023-Q3": "November 8, 2023, 10:00 a.m.", "2023-Q4": "February 27, 2024, 10:00 a.m.", "2024-Q1": "May 8, 2024, 10:00 a.m.",
         "2024-Q2": "August 7, 2024, 10:00 a.m.", "2024-Q3": "November 12, 2024, 5:00 p.m.",
         "2024-Q4": "March 17, 2025, 8:30 a.m.", "2025-Q1": "May 7, 2025, 10:00 a.m.",
         "2025-Q2": "August 6, 2025, 10:00 a.m.", "2025-Q3": "November 5, 2025, 10:00 a.m.",
         "2025-Q4": "February 26, 2026, 10:00 a.m."}

IR = "Corwin Ashdale"
CEO = "Marguerite Ossenbrook"
CFO = "Tobias Kellerman-Ruhl"
VPSC = "Hélène Marchetti-Dufour"
TITLES = {IR: "Director of Investor Relations", CEO: "President and Chief Executive Officer",
          CFO: "Executive Vice President and Chief Financial Officer", VPSC: "Vice President, Supply Chain"}
ANALYSTS = {"Nathaniel Greaves": "Corbel Street Partners", "Simone Achterberg": "Harwick & Lowe Securities",
            "Dev Rajaratnam": "Pellam Ridge Capital", "Colm Fairweather": "Aldous Research Group"}

SAFE_HARBOR = ("Before we begin, let me remind you that today's remarks include forward-looking statements about "
               "our outlook, our supply chain and other matters. Actual results may differ materially because of the "
               "risks described in our filings. We will also refer to adjusted EBITDA, which is reconciled to net income "
               "in our earnings release. With me today are {speakers}.")

C = {}

C["2023-Q3"] = dict(label="Third Quarter 2023", execs=[IR, CEO, CFO],
                    analysts=["Nathaniel Greaves", "Dev Rajaratnam", "Simone Achterberg"], turns=[
    (CEO, """Thank you, Corwin, and good morning. I'm pleased to report another strong quarter. Revenue was ${rev_m} million, gross margin was {gm}%, and net income was ${ni_m} million, or ${eps} per share. For the first nine months, revenue was ${ytd_rev_m} million, and we're on track for a record year.

Demand was broad. LNG customers continued to place FL-Series orders for export terminal expansions, and we booked our largest-ever single order for CG-300 cryogenic gate valves. Water utilities kept ordering R-40 relief valves as they upgrade older pump stations, and we shipped a large lot of R-40 valves for a midstream compressor station, which was a good win for the product in a new application. Backlog ended the quarter at ${backlog_m} million.

Operationally, the plants ran well. On-time delivery was 95%, and our scrap rate at Fennick Harbor was the lowest we've recorded. Our foundry partners have performed reliably. Brackwater Foundry, which pours most of our large-bore bodies, has been with us for more than twenty years, and we've just agreed a two-year pricing framework with them that gives us good visibility on casting costs.

Yesterday the board authorized a share repurchase program of up to $20 million through the end of 2025. With leverage at about one times and a healthy outlook, we think our shares are a good use of capital alongside the dividend."""),
    (CFO, """Thanks, Marguerite. Gross margin of {gm}% reflects the price increases we put through last year and strong absorption. SG&A was ${sga_m} million, or {sga_pct}% of revenue. Interest expense continued to fall as we paid down the revolver; we repaid about $6 million in the quarter.

We're raising our full-year revenue outlook to $335 million to $340 million, and we expect earnings per share of $1.85 to $1.90. We'll give our 2024 outlook in February. Operator, please open the line."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Good morning. Congratulations on the CG-300 order. How does that affect capacity at Saint-Aurèle-des-Pins next year?"""),
    (CEO, """Thanks, Nathaniel. It fills a good part of the cryogenic test capacity there in the first half of 2024. We've added a second shift in the test bay, and we're comfortable we can deliver it on schedule."""),
    ("Nathaniel Greaves", """And pricing on that order?"""),
    (CEO, """Competitive, as large project orders always are, but at a margin we're happy with."""),
    ("Operator", """Next is Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """Tobias, why a buyback now rather than paying down more debt?"""),
    (CFO, """Our leverage is about one times, which is below where we need it to be. We'll keep repaying the revolver, but we have room to do both, and the board believes the shares are undervalued."""),
    ("Dev Rajaratnam", """What's the effect of the new casting price framework?"""),
    (CFO, """It fixes casting prices for two years, with an adjustment for scrap and alloy surcharges. That removes one of the bigger swings in our cost base."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """You rely on Brackwater for a lot of large castings. Have you thought about qualifying a second foundry?"""),
    (CEO, """We look at it from time to time. For smaller castings we already use several foundries. For the large bodies, Brackwater has the capability and the customer approvals, and qualifying another foundry would take a long time and cost money. Given their record, we haven't felt the need. It's something we keep under review."""),
    ("Simone Achterberg", """And the R-40 in compressor service: is that a new market for you?"""),
    (CEO, """Fairly new. The R-40 was designed for water, and we've adapted it for gas compression service with a different spring and seat. The first large lot shipped this quarter, and we're hopeful it leads to more midstream business."""),
    ("Operator", """Our next question is a follow-up from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Any early view on 2024?"""),
    (CEO, """Backlog gives us a good start. We'd expect another year of growth, led by LNG, but we'll give you the detail in February."""),
    ("Operator", """That concludes our question-and-answer session. I'll hand the call back to Ms. Ossenbrook."""),
    (CEO, """Thank you all. It's a good time to be in the valve business, and we intend to make the most of it."""),
])

C["2023-Q4"] = dict(label="Fourth Quarter and Full Year 2023", execs=[IR, CEO, CFO],
                    analysts=["Nathaniel Greaves", "Simone Achterberg", "Dev Rajaratnam"], turns=[
    (CEO, """Thank you, Corwin, and good morning, everyone. 2023 was the best year in Hollowmere's history, and I want to start by thanking the 1,310 people at Fennick Harbor, Saint-Aurèle-des-Pins and our service centres who made it so.

Revenue for the year grew {fy_rev_chg}% to ${fy_rev_m} million. Net income was ${fy_ni_m} million, or ${fy_eps} per share. We finished the year with a record backlog of ${backlog_m} million, and the quality of that backlog is good: two large LNG export packages, steady water utility business and a growing aftermarket.

A few highlights. The FL-Series had its strongest year ever, helped by the 36-inch trunnion valves we qualified for cryogenic service last spring. The R-40 relief valve continued to win municipal water business, and we shipped the first production lots of the low-emission packing set our engineers have been working on for two years. Our on-time delivery for the year was 94%.

Looking at 2024, demand is healthy. We are planning for revenue of $355 million to $370 million. One item I do want to mention: last week our main casting supplier, Brackwater Foundry, lost one of its two induction furnaces at Tollis Reach. They are already pouring again on the second furnace, and we have a few weeks of castings in the building, so we see this as a hiccup rather than a problem. We'll keep you informed. Tobias?"""),
    (CFO, """Thanks, Marguerite. Fourth-quarter revenue was ${rev_m} million and gross margin was {gm}%. For the full year gross margin was {fy_gm}%, up from {fy_gm_py}% in 2022, reflecting pricing and good absorption at Fennick Harbor. SG&A was {fy_sga_pct}% of revenue.

Cash flow was strong. We paid down $22.5 million of debt during the year, paid our dividend of 12 cents a quarter, and ended the year with ${cash_m} million of cash and net leverage of about {lev} times, against a covenant of 3.5 times. Capital spending for 2024 will be around $14 million, most of it for the new horizontal machining cell. With the balance sheet where it is, we have room to use the buyback authorization the board approved in November, and we expect to be active in the first half.

For 2024 we expect gross margin of 32% to 33% and earnings per share of $1.85 to $2.05. With that, operator, let's open the line for questions."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Thank you. Our first question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Good morning, and congratulations on the year. Marguerite, on the LNG packages, how much of the backlog ships in the first half versus the second?"""),
    (CEO, """Morning, Nathaniel. Roughly 45% first half, 55% second. The second export terminal package is weighted toward the third quarter because of the customer's own construction schedule."""),
    ("Nathaniel Greaves", """And on pricing, are you still getting increases through, or has that normalized?"""),
    (CEO, """It has normalized. We put through about 3% in January on standard products. Project pricing is competitive but rational."""),
    ("Operator", """Our next question comes from Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Thanks. I want to come back to the foundry. How dependent are you on Brackwater, and what is the plan if the furnace takes longer than they say?"""),
    (CEO, """It's a fair question. Brackwater pours most of our large-bore bodies, and for a good number of patterns it is our only qualified source. We have worked with them for 22 years, and they've been a very reliable partner. They tell us the furnace will be repaired within weeks. If it took longer, we have other foundries for smaller castings, and we would look at moving some patterns, but that is not something we expect to need."""),
    ("Simone Achterberg", """Is any of that in the guidance?"""),
    (CFO, """We've allowed for a modest amount of expediting in the first quarter, Simone, a million dollars or so. Nothing beyond that."""),
    ("Operator", """Our next question comes from Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """Hi. On capital allocation, with leverage at about one times, why not go further with the buyback or raise the dividend?"""),
    (CFO, """We like having flexibility, Dev. We'll use the buyback opportunistically, and the board looks at the dividend every year. We also want capacity to invest if LNG demand keeps growing."""),
    ("Dev Rajaratnam", """And the new packing set, is that a margin story or a share story?"""),
    (CEO, """Mostly share. Emission rules are tightening for pipeline operators, and it gives us a strong reason to be specified on new projects."""),
    ("Operator", """That concludes our question-and-answer session. I'll hand the call back to Ms. Ossenbrook."""),
    (CEO, """Thank you all. We enter 2024 with a record backlog and a strong balance sheet, and we look forward to updating you in May."""),
])

C["2024-Q1"] = dict(label="First Quarter 2024", execs=[IR, CEO, CFO],
                    analysts=["Simone Achterberg", "Colm Fairweather", "Nathaniel Greaves"], turns=[
    (CEO, """Thank you, Corwin. Good morning. Our first quarter showed two things at once: demand for our valves is as strong as it has ever been, and our supply of castings is tighter than we would like.

Revenue was ${rev_m} million, up {rev_chg}% from a year ago, and orders were even stronger. Two LNG customers released FL-Series packages earlier than planned, and backlog reached ${backlog_m} million, another record.

On the supply side, the furnace failure at Brackwater Foundry in February has taken longer to resolve than Brackwater expected. They have been running on one furnace, and heavy-section castings have been short since late February. We chose to protect our customers' delivery dates, which meant air freight, outside machining and weekend shifts. Those expedite costs were ${expedite_m} million in the quarter and are the main reason margins were lower. Brackwater now expects the furnace back in the second quarter. We believe this is temporary, but we have started to look at which patterns we could move to another foundry if we need to.

We are keeping our full-year outlook, although I'd point you toward the lower half of the range."""),
    (CFO, """Thanks, Marguerite. Gross margin was {gm}%, down from {gm_py}% a year ago. About 130 basis points of that is expediting, and most of the rest is labour at Fennick Harbor that was waiting for castings. SG&A was ${sga_m} million. Net income was ${ni_m} million, or ${eps} per share.

Inventories rose to ${inv_m} million, mostly valves that are assembled except for the body. That will unwind as castings arrive. We repurchased 252,000 shares for $6.0 million and paid our dividend. We ended the quarter with ${cash_m} million of cash and net leverage of {lev} times.

For the full year we now expect revenue toward the low end of $355 million to $370 million and earnings per share of $1.70 to $1.90, reflecting higher expedite costs in the second quarter. Operator, we're ready for questions."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question is from Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Good morning. What run rate of expedite costs is in the new guidance for the second quarter?"""),
    (CFO, """We've assumed something like $2 million to $2.5 million in the second quarter, falling away in the third once the furnace is back."""),
    ("Simone Achterberg", """And if it doesn't come back on time?"""),
    (CEO, """Then costs would be higher and some shipments would slip. I don't want to speculate about a scenario we don't expect, but we are preparing for it."""),
    ("Operator", """The next question is from Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """Thanks. There's been some chatter about a relief valve problem at a compressor station commissioning. Is that one of yours, and is there any exposure?"""),
    (CEO, """A midstream customer told us in March that a few R-40 valves did not reseat as expected during commissioning. We're examining the valves with them now. There's no claim, and I'd caution against reading too much into it. Commissioning problems have many possible causes, and we'll follow the evidence."""),
    ("Colm Fairweather", """How many valves were in that lot?"""),
    (CEO, """A couple of hundred. Three were reported."""),
    ("Operator", """Our next question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """You bought back stock this quarter while you were paying for air freight. How are you thinking about that trade-off?"""),
    (CFO, """The buyback was executed early in the quarter under the plan we described in February, when leverage was about one times. We still have plenty of liquidity. That said, we're not going to be aggressive while supply is uncertain."""),
    ("Nathaniel Greaves", """Last one. How long does it take to qualify a second foundry for a pattern?"""),
    (CEO, """Typically a year to a year and a half, because customers often have to approve the foundry. It isn't a quick fix, which is why we'd rather help Brackwater recover."""),
    ("Operator", """There are no further questions. I'll turn the call back to Ms. Ossenbrook."""),
    (CEO, """Thank you. Demand is excellent, and our focus is on getting castings through the door. We'll talk again in August."""),
])

C["2024-Q2"] = dict(label="Second Quarter 2024", execs=[IR, CEO, CFO],
                    analysts=["Dev Rajaratnam", "Simone Achterberg", "Colm Fairweather", "Nathaniel Greaves"], turns=[
    (CEO, """Thank you, Corwin. I'll be direct: the second quarter was disappointing, and the casting situation is worse than we expected three months ago.

Brackwater's furnace did come back in May, but their yields on heavy sections fell, porosity rejections went up, and a dispute with their hourly workforce cut the number of shifts they can run. On June 1 they put all their customers on allocation at about 70% of requested tonnage. In the quarter we received only about 61% of the castings our plan required. As a result, revenue fell {rev_chg}% to ${rev_m} million, even though orders were very strong. Backlog is now a record ${backlog_m} million, but a growing share of it is late, and some customers have started to charge us late-delivery penalties.

We are acting on several fronts. We've opened discussions with three foundries about taking over our highest-volume patterns. We have cut discretionary spending and deferred $3 million of capital projects. And last week the board suspended the dividend and the share buyback. That was not an easy decision, but preserving cash is the right priority while we work through this.

Finally, in May we received a warranty claim from Greywether Midstream about the R-40 relief valves I mentioned last quarter. They are seeking reimbursement of losses they estimate at more than $30 million. Our terms of sale limit our obligation to repair or replacement and exclude consequential damages, and we intend to contest the claim."""),
    (CFO, """Thanks, Marguerite. Gross margin was {gm}%, compared with {gm_py}% a year ago. Expedite costs were ${expedite_m} million. We also recorded a $0.9 million warranty charge to replace the rest of the affected R-40 lot, and penalties reduced revenue by $0.6 million. Net income was ${ni_m} million, or ${eps} per share.

Inventories increased to ${inv_m} million, and some suppliers have shortened our payment terms, so working capital absorbed cash. Borrowings were ${debt_m} million at quarter end and net leverage was {lev} times, against our 3.5 times covenant. Because the covenant uses trailing earnings, the ratio will rise if the second half stays weak, and we have begun a conversation with our lenders.

We are lowering our 2024 outlook. We now expect revenue of $300 million to $320 million, and we no longer expect to be profitable in the second half. We'll take questions now."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """Tobias, how close could you get to the covenant by year-end under the new guidance?"""),
    (CFO, """Under the low end of the range we could approach the maximum by December. We don't expect to breach it, but the headroom is clearly narrower than we'd like, which is why we're talking to the banks now rather than later."""),
    ("Dev Rajaratnam", """Would you consider equity?"""),
    (CFO, """It's not something we're planning. Our first levers are working capital, capital spending and the dividend, and we've pulled all three."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """On the second foundry, is 12 to 18 months still the right timeline, or can you compress it?"""),
    (CEO, """We're trying hard to compress it. The foundry work itself can be done in months. The constraint is customer approval, because many specifications name the approved foundry. We're going customer by customer to see who will accept an expedited process."""),
    ("Simone Achterberg", """Are you losing orders to competitors?"""),
    (CEO, """Some customers have placed second orders with competitors to protect their schedules. We haven't lost an account, but I won't pretend the risk isn't there."""),
    ("Operator", """Next is Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """On Greywether, what did your investigation find, and is there insurance?"""),
    (CEO, """The investigation isn't finished, so I'll be careful. We have product liability insurance, and our carriers have been notified. We've replaced the remaining valves in the lot at our cost. We don't accept responsibility for their consequential losses, and our contract is clear on that."""),
    ("Operator", """Our last question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Is the dividend suspension temporary?"""),
    (CEO, """The board's intention is to reinstate it when supply and earnings recover. I can't give you a date today."""),
    ("Operator", """This concludes the question-and-answer session. I'll turn the call back to management."""),
    (CEO, """Thank you. This is a difficult period, and we're treating it with the seriousness it deserves. We'll update you in November, or sooner if there is material news."""),
])

C["2024-Q3"] = dict(label="Third Quarter 2024", execs=[IR, CEO, CFO, VPSC],
                    analysts=["Simone Achterberg", "Dev Rajaratnam", "Colm Fairweather", "Nathaniel Greaves"], turns=[
    (CEO, """Thank you, Corwin. Good afternoon. The third quarter was the most difficult quarter Hollowmere has had in decades, and I want to walk you through what happened, what we've done and what we still don't know.

On September 9, Brackwater Foundry entered a court-supervised restructuring. Their deliveries to us fell to about 45% of what we needed in September, and a higher share of what arrived failed our inspection. Revenue fell {rev_chg}% to ${rev_m} million. We lost money: the net loss was ${ni_m} million. Two customers cancelled orders worth $5.8 million because we had let them down more than once.

Here is what we've done. First, we advanced $4 million to Brackwater, credited against future purchases, to keep their furnaces running, in exchange for a minimum monthly allocation. Second, in August we chose Ruddock & Thane Castings in Ironlee as a second source, and we're moving our 40 highest-volume patterns there. Hélène will give you more detail. Third, on October 28 we amended our credit agreement to give us covenant room through the middle of next year. And fourth, we've reduced salaried headcount by 6% and frozen hiring.

Greywether has now filed a lawsuit seeking at least $38 million. We believe the claims are without merit, and we'll defend the case vigorously. Because of all this uncertainty, we are withdrawing our full-year outlook."""),
    (VPSC, """Thank you, Marguerite. Ruddock & Thane has received patterns and core boxes for the first 24 of the 40. They expect to pour first articles in December. We then machine, X-ray and pressure-test them, and where the customer's specification names the foundry, we need the customer's approval. Several of our largest customers have agreed to a shortened review. If testing goes well, we expect the first production castings in the first quarter and meaningful volumes by mid-2025. I'd stress that this depends on first-article results, which we won't have until the new year."""),
    (CFO, """Thanks, Hélène. Gross margin was {gm}%. Expedite costs were ${expedite_m} million, we wrote down $1.9 million of castings that failed inspection, and penalties reduced revenue by $1.4 million. SG&A included $1.1 million of legal fees and $0.8 million of severance.

At the end of September we had ${cash_m} million of cash and ${avail_m} million available on the revolver, for liquidity of ${liq_m} million. Borrowings were ${debt_m} million. Net leverage was {lev} times, within the 3.5 times covenant, but our forecast showed we'd likely exceed it at year-end. The First Amendment raises the limit to 4.75 times through June 2025, adds a minimum liquidity requirement of $15 million and prohibits dividends and buybacks in the meantime. It also costs us another 50 basis points of margin. Operator, let's take questions."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Tobias, with liquidity at ${liq_m} million and a $15 million floor, how much room do you really have? And is there any risk to the going concern?"""),
    (CFO, """It's the right question. On our current forecast we stay above the minimum through the first half of next year, but the margin is not large. The risks are clear: if Brackwater's output falls further, or if Ruddock & Thane's approvals are delayed, we could come under pressure. We've prepared further measures, mainly on inventory purchases. I'm not going to use the phrase lightly, but we are managing the business very tightly for cash, and we're in regular contact with our lenders."""),
    ("Simone Achterberg", """Would the lenders give you more relief if you needed it?"""),
    (CFO, """They have been constructive so far. I can't promise what they'd do in a future situation."""),
    ("Operator", """The next question comes from Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """What happens to the $4 million advance if Brackwater's restructuring fails?"""),
    (CFO, """We'd likely have an unsecured claim for whatever hadn't been credited back, and we might not recover it. We judged the risk worth taking, because without Brackwater's castings over the next six months our losses would be far larger."""),
    ("Operator", """The next question comes from Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """On the lawsuit, your cap is the purchase price, about $1.7 million. Why should we be confident a court enforces that?"""),
    (CEO, """We think our terms are sound and standard for this industry, but litigation is uncertain, and I can't promise an outcome. Our investigation points to porosity in some body castings from Brackwater, and we've reserved our rights against them. Our insurers are involved, although they have reserved their rights too."""),
    ("Operator", """Our last question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Marguerite, are customers still ordering from you?"""),
    (CEO, """They are. Orders were still above shipments this quarter. Customers want our valves; they just want them on time. Our whole organization is focused on earning back their confidence."""),
    ("Operator", """That concludes today's question-and-answer session. I'll turn the call back to Ms. Ossenbrook."""),
    (CEO, """Thank you. I know this has been a hard call to listen to. We'll continue to tell you plainly where things stand."""),
])

C["2024-Q4"] = dict(label="Fourth Quarter and Full Year 2024", execs=[IR, CEO, CFO, VPSC],
                    analysts=["Dev Rajaratnam", "Simone Achterberg", "Colm Fairweather", "Nathaniel Greaves"], turns=[
    (CEO, """Thank you, Corwin, and good morning. We filed our annual report this morning, and I'll start with the most important points in it.

The fourth quarter was our weakest. Revenue was ${rev_m} million, and we lost ${ni_m} million. For the year, revenue fell {fy_rev_chg}% to ${fy_rev_m} million, and the net loss was ${fy_ni_m} million. At December 31 our leverage ratio exceeded the 4.75 times limit in our amended credit agreement, which was an event of default. On March 10 our lenders signed the Second Amendment and Waiver, which waives that default and replaces the leverage test with liquidity and earnings tests through September.

Because of the default and our losses, the accounting rules required management to evaluate whether there was substantial doubt about our ability to continue as a going concern. We concluded that those conditions did raise substantial doubt, and that our plans, starting with the waiver, alleviate it. Our auditors reviewed that conclusion, and it is explained in Note 2 of our financial statements. I want to be clear with you that this was a serious moment for the company.

There is also real progress. Ruddock & Thane poured first articles for all 40 patterns between December and February, and 22 are now approved. Brackwater completed its restructuring in February under new owners who are investing in a second furnace reline. Our first production castings from Ironlee arrived this month."""),
    (CFO, """Thank you. Fourth-quarter gross margin was {gm}%. We recorded ${special_m} million of impairment and restructuring charges, mainly for closing Quayle Point and for K-Series tooling, and an $8.9 million valuation allowance against our U.S. deferred tax assets, which is why we recorded tax expense on a loss.

At year-end we had ${cash_m} million of cash and ${avail_m} million available under the revolver. Net leverage, as the agreement then defined it, was {lev} times. The Second Amendment requires minimum liquidity of $15 million, tested weekly, and minimum cumulative adjusted EBITDA, tested monthly. It raises our interest margin by 150 basis points, limits capital spending this year to $12 million and requires weekly 13-week cash forecasts. The leverage covenant returns at 4.25 times in December.

For 2025 we expect revenue of $310 million to $335 million, with adjusted EBITDA turning positive in the second quarter. Our liquidity low point will likely be in the first quarter. Operator?"""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """How close to the $15 million floor do you expect to get in the first quarter?"""),
    (CFO, """In mid-February we were at about $17 million. We expect collections on the improving shipments to lift that through the spring, but there's no point pretending the cushion is large."""),
    ("Dev Rajaratnam", """And if you miss the minimum EBITDA test?"""),
    (CFO, """That would be a default, and we'd need another waiver. The tests were set with our lenders against our own forecast, with some room, but not a lot."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Are you considering raising equity or selling assets?"""),
    (CEO, """We're not planning an equity raise. We've looked at options, as any responsible board would, and we won't rule anything out, but our plan is to recover through operations."""),
    ("Operator", """Next is Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """Any update on the Greywether case?"""),
    (CEO, """We've answered, moved to dismiss the negligence counts and filed a third-party claim against Brackwater, which is stayed. We still believe our defenses are strong, but the case carries risk, and it's in our risk factors."""),
    ("Operator", """Our next question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Hélène, how confident are you in the remaining 18 patterns?"""),
    (VPSC, """Most are in testing now. The results on the first 22 were good, with lower porosity than we'd seen from Brackwater last year. The main timing risk is customer approvals, not metallurgy."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you all. We're in a better position than we were in November, but we have a lot of work ahead of us."""),
])

C["2025-Q1"] = dict(label="First Quarter 2025", execs=[IR, CEO, CFO, VPSC],
                    analysts=["Colm Fairweather", "Simone Achterberg", "Dev Rajaratnam"], turns=[
    (CEO, """Thanks, Corwin. Good morning, everyone. The first quarter was the start of our recovery. We're not where we want to be, but the direction has changed.

Revenue was ${rev_m} million, up {rev_seq_chg}% from the fourth quarter. Gross margin improved to {gm}%. We still lost money, ${ni_m} million, but the loss was less than half of the fourth quarter's. Ruddock & Thane supplied 12% of our castings in March, and Brackwater, under its new owners, is delivering about three quarters of what we need with much better quality.

We complied with all of the covenants in the Second Amendment. In the Greywether case, the court dismissed the negligent misrepresentation claim in February but allowed the negligence claim to continue, and mediation is scheduled for June. We're maintaining our 2025 outlook."""),
    (VPSC, """Twenty-two of the 40 patterns are approved, and the remaining 18 are in testing or waiting for customer sign-off. We expect to finish by the end of the second quarter, when Ruddock & Thane should be supplying about a third of our volume. Expedite costs fell to ${expedite_m} million, and we expect them to keep falling."""),
    (CFO, """Thanks. Liquidity at the end of March was ${liq_m} million, against the $15 million minimum. Our low point was about $17 million in mid-February. Borrowings were ${debt_m} million. We didn't record a tax benefit on the loss because of the valuation allowance. We expect operating cash flow to turn positive in the second quarter as inventory, now ${inv_m} million, comes down. Operator?"""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """If mediation fails, when would the case go to trial, and could you fund an adverse judgment?"""),
    (CEO, """If mediation fails, a trial would probably be in 2026. I won't speculate about a judgment. Our insurance would respond to part of any loss, and we'd manage the rest within our liquidity and our agreements with the lenders."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """The book-to-bill was about one. Are customers holding back on new orders?"""),
    (CEO, """Some are. After a year of late deliveries, a few customers want to see a few good months before they commit new projects to us. That's understandable. Our on-time performance is improving month by month, and that's the best sales tool we have."""),
    ("Operator", """Next is Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """Tobias, how much headroom did you have on the minimum EBITDA test?"""),
    (CFO, """A few million dollars on a cumulative basis. It isn't a lot of room, but we're tracking slightly ahead of the plan we agreed with the lenders."""),
    ("Operator", """That concludes the question-and-answer session."""),
    (CEO, """Thank you. One good quarter doesn't make a recovery, and we know it. We'll keep at it."""),
])

C["2025-Q2"] = dict(label="Second Quarter 2025", execs=[IR, CEO, CFO],
                    analysts=["Nathaniel Greaves", "Colm Fairweather", "Simone Achterberg", "Dev Rajaratnam"], turns=[
    (CEO, """Thank you, Corwin, and good morning. The recovery picked up speed in the second quarter.

Revenue was ${rev_m} million, up {rev_seq_chg}% from the first quarter and almost back to last year's level. Gross margin was {gm}%, and our net loss narrowed to ${ni_m} million. Most importantly, we generated cash from operations and paid down debt for the first time since this began.

On May 19, Ruddock & Thane completed qualification of all 40 patterns, and every customer that needed to approve the foundry has done so. Ruddock & Thane supplied 31% of our castings in the quarter and 36% in June. Brackwater's on-time delivery reached 88% in June. For the first time in our history, our highest-volume castings come from two qualified foundries, and we intend to keep it that way.

Two matters still need attention. Orders slowed: the book-to-bill was {btb}. Customers who waited a long time for valves are cautious about placing new projects with us. And mediation with Greywether in June didn't produce a settlement. The court has set a trial date of March 9, 2026."""),
    (CFO, """Thanks, Marguerite. Expedite costs were ${expedite_m} million, down from $5.2 million in the first quarter. SG&A included $1.2 million of legal fees. Inventories fell to ${inv_m} million, and some suppliers have restored normal payment terms, which helped cash flow.

Liquidity was ${liq_m} million at the end of June. We were in compliance with our covenants throughout the quarter. In our 10-Q we now disclose a range of reasonably possible loss in the Greywether matter of zero to $12 million, net of expected insurance; we haven't recorded a liability because we don't consider a loss probable. Our insurers have confirmed coverage of up to $6 million.

We're raising the low end of our 2025 revenue outlook to $318 million, so the range is now $318 million to $335 million."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Congratulations on the progress. How should we think about orders in the second half?"""),
    (CEO, """We expect intake to improve as our delivery record improves. LNG bidding activity is good, and we're being invited to bid again by customers who had stopped. But I'd expect the book-to-bill to stay below one for another quarter."""),
    ("Operator", """Next is Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """On the trial, what's your appetite for settlement versus going to court?"""),
    (CEO, """We'd consider a reasonable settlement, and we're also prepared for trial. The experts disagree on what caused the failures, and we think our contract terms matter a great deal. That's as far as I can go."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """The leverage covenant comes back at 4.25 times in December. Will you make it?"""),
    (CFO, """On our forecast, yes. The fourth quarter of 2024 drops out of the trailing period at year-end, and that helps a great deal. The forecast doesn't assume any payment to Greywether beyond insurance, so that's the sensitivity."""),
    ("Operator", """Our next question comes from Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """Is there any thought of moving more volume to Ruddock & Thane?"""),
    (CEO, """We're aiming for roughly 40% to 45% there and the rest at Brackwater. Both foundries have performed well, and having both is the lesson of the last eighteen months."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you. We'll talk again in November."""),
])

C["2025-Q3"] = dict(label="Third Quarter 2025", execs=[IR, CEO, CFO],
                    analysts=["Simone Achterberg", "Dev Rajaratnam", "Nathaniel Greaves", "Colm Fairweather"], turns=[
    (CEO, """Thank you, Corwin. Good morning, everyone. We returned to profitability in the third quarter, and we settled the Greywether lawsuit.

Revenue was ${rev_m} million, {rev_chg}% higher than a year ago. Gross margin recovered to {gm}%. Net income was ${ni_m} million, or ${eps} per share, and that's after a ${special_m} million charge for our share of the settlement.

Under the settlement, Greywether receives $9.5 million, $6 million of it from our insurers. There's no admission of liability. It lets us put the matter behind us and focus on customers.

Operationally, our on-time delivery reached 91% in September, the best since the end of 2023, and we've shipped almost all of the past-due orders. In August we signed a three-year supply agreement with Ruddock & Thane that reserves capacity for our 40 main patterns, and we're transferring 25 more. They supplied 38% of our castings in the quarter."""),
    (CFO, """Thanks. Expedite costs were down to ${expedite_m} million. Operating cash flow was positive for the second quarter in a row, and borrowings fell to ${debt_m} million. Liquidity was ${liq_m} million.

The leverage covenant comes back at 4.25 times at year-end. If it had applied at September 30, our ratio as the agreement defines it would have been {adj_lev} times. That sounds tight, but the fourth quarter of 2024, which was our worst, drops out of the trailing twelve months in December, and on our forecast we'll be comfortably inside the limit. We've also started talking to our lenders about extending the facility and ending the extra reporting.

We're narrowing our 2025 revenue outlook to $324 million to $332 million."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Congratulations. When do you pay your $3.5 million share?"""),
    (CFO, """In October, from available liquidity. It's in our numbers."""),
    ("Operator", """Next is Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """How are orders trending now that deliveries are back?"""),
    (CEO, """Better. LNG customers in particular have come back, and we won two FL-Series packages in September that had been slipping away from us earlier in the year. Shipments still exceeded orders, but the gap has narrowed."""),
    ("Operator", """Next is Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """When could the dividend come back?"""),
    (CEO, """The board will look at that once we've completed the refinancing and have a few quarters of solid results. I'd think about the second half of next year at the earliest."""),
    ("Operator", """Our next question comes from Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """What about your claim against Brackwater?"""),
    (CEO, """We're discussing it with Brackwater's new owners, and I'd expect a commercial resolution rather than more litigation."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you. It's good to be able to report a profit again."""),
])

C["2025-Q4"] = dict(label="Fourth Quarter and Full Year 2025", execs=[IR, CEO, CFO],
                    analysts=["Nathaniel Greaves", "Simone Achterberg", "Dev Rajaratnam", "Colm Fairweather"], turns=[
    (CEO, """Thank you, Corwin, and good morning. A year ago on this call I described a serious moment for Hollowmere. Today I can describe a company that has recovered, and that is stronger for what it went through.

Fourth-quarter revenue was ${rev_m} million, up {rev_chg}% from a year ago, and net income was ${ni_m} million, or ${eps} per share. For the full year, revenue grew {fy_rev_chg}% to ${fy_rev_m} million, and we earned ${fy_ni_m} million after the settlement charge.

We met every covenant in 2025. In December we completed the Third Amendment, which extends our credit facility to June 2029, ends the relief period and cuts our borrowing margin. The substantial doubt that management identified a year ago no longer exists. Greywether was dismissed with prejudice in November, and we resolved our claim against Brackwater for a credit on future purchases.

Most importantly, our supply chain is different. Every one of our main patterns is qualified at two foundries, Ruddock & Thane supplied 44% of our castings in the fourth quarter, and we keep six weeks of safety stock of critical castings. Our on-time delivery was 95% in the quarter.

For 2026 we expect revenue of $345 million to $365 million and gross margin of 30% to 32%."""),
    (CFO, """Thanks, Marguerite. Fourth-quarter gross margin was {gm}%, the highest since the first quarter of 2024. There were no expedite costs in the quarter. We released $0.8 million of the tax valuation allowance relating to state attributes.

Year-end cash was ${cash_m} million and borrowings were ${debt_m} million, down from $126.6 million at the March peak. Our leverage ratio as the credit agreement defines it was {adj_lev} times, against the 4.25 times limit, and the Third Amendment sets it at 4 times from here, stepping down to 3.5. Dividends become possible below 3 times. Capital spending in 2026 will be about $15 million, including tooling for the 25 additional patterns at Ruddock & Thane."""),
    (None, "Question-and-Answer Session"),
    ("Operator", """Our first question comes from Nathaniel Greaves with Corbel Street Partners."""),
    ("Nathaniel Greaves", """Congratulations on the turnaround. What's the path back to 33% gross margin?"""),
    (CEO, """Volume, mix and no expediting. We aren't promising 33% in 2026, but nothing structural stops us from getting back there once aftermarket and LNG volumes grow."""),
    ("Operator", """Next is Simone Achterberg with Harwick & Lowe Securities."""),
    ("Simone Achterberg", """Book-to-bill was {btb} in the quarter. Does the guidance require orders to pick up?"""),
    (CEO, """It does assume orders improve, and January and February have been encouraging. The backlog of ${backlog_m} million covers a good part of the first half."""),
    ("Operator", """Next is Dev Rajaratnam with Pellam Ridge Capital."""),
    ("Dev Rajaratnam", """What did you learn that you'd tell another industrial company?"""),
    (CEO, """Don't confuse a long relationship with a resilient supply chain. Brackwater was a good supplier for 22 years, and we still rely on them. But we should never have had 38 patterns with only one qualified source."""),
    ("Operator", """Our next question comes from Colm Fairweather with Aldous Research Group."""),
    ("Colm Fairweather", """Will the board reinstate the dividend this year?"""),
    (CEO, """The board intends to review it in the second half, if leverage is below 3 times, as the agreement requires. We're on track for that."""),
    ("Operator", """That concludes our question-and-answer session."""),
    (CEO, """Thank you all for your patience and your hard questions over the last two years."""),
])

CALLS = list(C)


def transcript(p, m):
    c = C[p]
    y, q = p.split("-")
    people = [f"{n}, our {TITLES[n]}" for n in c["execs"] if n != IR]
    speakers = "; ".join(people[:-1]) + "; and " + people[-1]
    header = ["Hollowmere Valve Works, Inc.", f"{c['label']} Earnings Conference Call", DATES[p],
              "[Fictional demonstration transcript: every company, person, product and figure in it is invented.]",
              "", "Corporate Participants"]
    header += [f"{n} -- {TITLES[n]}" for n in c["execs"]]
    header += ["", "Conference Call Participants"]
    header += [f"{n} -- {ANALYSTS[n]}" for n in c["analysts"]]
    turns = [(None, "Presentation"),
             ("Operator", f"Good {'afternoon' if 'p.m.' in DATES[p] else 'morning'}, and welcome to the Hollowmere Valve Works "
                          f"{c['label'].lower()} earnings conference call. All participants are in listen-only mode. After "
                          "the prepared remarks there will be a question-and-answer session. As a reminder, this call is being "
                          f"recorded. I would now like to turn the call over to {IR}, Director of Investor Relations."),
             (IR, "Thank you, operator, and thank you all for joining us. " + SAFE_HARBOR.format(speakers=speakers)
              + f" I'll now turn the call over to {CEO.split()[0]}.")]
    body = list(c["turns"])
    body[-2:-2] = EXTRA.get(p, [])   # before the operator closes the questions
    for speaker, text in body:
        turns.append((speaker, text.format_map(m) if speaker is not None else text))
    turns.append(("Operator", "This concludes today's conference call. Thank you for participating. You may now disconnect."))
    curly = p < "2025-Q1"   # the 2025 transcripts come from a service that keeps straight quotes
    return transcript_text(header, turns, curly=curly)


# Further questions, inserted before the operator closes the question-and-answer
# session.
EXTRA = {
    "2024-Q1": [
        ("Operator", """Our next question is a follow-up from Simone Achterberg with Harwick & Lowe Securities."""),
        ("Simone Achterberg", """Tobias, the inventory build. How much of the ${inv_m} million is waiting on castings, and how fast does it unwind?"""),
        (CFO, """A bit over $8 million of the increase is work in process, valves that are machined and trimmed and waiting for a body. When castings arrive, those valves can ship within two or three weeks. So if Brackwater recovers in the second quarter, most of it unwinds by the third."""),
    ],
    "2024-Q4": [
        ("Operator", """Our next question is a follow-up from Simone Achterberg with Harwick & Lowe Securities."""),
        ("Simone Achterberg", """On the impairment and restructuring, is Quayle Point the end of it, or are there more closures to come?"""),
        (CEO, """We don't plan further closures. Quayle Point was a small leased service centre, and its work fits in Fennick Harbor and Dunmarsh. The tooling write-off relates to K-Series patterns we've moved to Ruddock & Thane and won't use again. Our priority now is capacity, not cuts."""),
        ("Simone Achterberg", """And goodwill? Your market value is well below book."""),
        (CFO, """We tested goodwill at year-end, and the fair value of our reporting unit exceeded its carrying value by about 9%. That's a narrow margin, and we say so in the risk factors. Further declines could require a charge."""),
    ],
    "2025-Q1": [
        ("Operator", """Our next question is a follow-up from Colm Fairweather with Aldous Research Group."""),
        ("Colm Fairweather", """Brackwater has new owners. Does that change your relationship, and what happened to the $4 million advance?"""),
        (VPSC, """The new owners have been very engaged. They've committed capital for a second furnace reline and more moulding capacity, and they assumed our supply assurance agreement. The advance is being credited against our purchases at $0.4 million a month, so we expect to recover it in full by the end of the year."""),
        ("Colm Fairweather", """Will you keep buying from both foundries when supply normalizes?"""),
        (CEO, """Yes. That's a permanent change. We'll never again have our main patterns at a single foundry."""),
        ("Operator", """Next is a follow-up from Dev Rajaratnam with Pellam Ridge Capital."""),
        ("Dev Rajaratnam", """What does the backlog look like now? Is it still mostly late orders?"""),
        (CEO, """Backlog was ${backlog_m} million at the end of March, about the same as at year-end. The share that's past due is falling as we ship the oldest orders first. Customers have been patient, and we owe them on-time delivery from here."""),
        ("Dev Rajaratnam", """And pricing? Are you giving concessions to keep customers?"""),
        (CEO, """In a few cases, yes, mostly in the form of penalties we've accepted rather than price cuts. Our list prices haven't changed."""),
    ],
    "2025-Q2": [
        ("Operator", """Our next question is a follow-up from Simone Achterberg with Harwick & Lowe Securities."""),
        ("Simone Achterberg", """How much of the margin recovery is expediting falling away, and how much is volume?"""),
        (CFO, """Roughly half and half. Expedite costs fell by about $3.2 million from the first quarter, which is worth about four points of margin at this revenue level. The rest is absorption. The remaining gap to our historical margins is mostly volume and a few late orders we priced tightly to keep customers."""),
        ("Operator", """Next is a follow-up from Dev Rajaratnam with Pellam Ridge Capital."""),
        ("Dev Rajaratnam", """What does the range of zero to $12 million on Greywether mean for the covenant if the outcome is at the top?"""),
        (CFO, """It would be uncomfortable. A payment at the top of the range would come out of liquidity, and we'd need to talk to our lenders about how it's treated in the covenants. That's one reason we'd consider a reasonable settlement. But I'd stress that we don't consider a loss probable."""),
    ],
    "2025-Q3": [
        ("Operator", """Our next question is a follow-up from Dev Rajaratnam with Pellam Ridge Capital."""),
        ("Dev Rajaratnam", """Tobias, on the {adj_lev} times. What exactly do the lenders add back in that calculation?"""),
        (CFO, """Under the Second Amendment, covenant EBITDA adds back expedite costs, the impairment and restructuring charges from last year and the litigation settlement. Those were agreed as one-time items of the disruption. Without the add-backs, the trailing number would look much worse, which is exactly why they were negotiated."""),
        ("Dev Rajaratnam", """And interest expense from here?"""),
        (CFO, """It should fall as we pay down the revolver, and further once the extension is done, if we can reduce the margin as we hope."""),
        ("Operator", """Next is a follow-up from Nathaniel Greaves with Corbel Street Partners."""),
        ("Nathaniel Greaves", """How confident are you that the dual sourcing holds up if demand really picks up?"""),
        (CEO, """Quite confident. The Ruddock & Thane agreement reserves capacity for our patterns, and Brackwater has more capacity than before its restructuring. We also carry about six weeks of safety stock of the critical castings. It's a very different position from a year ago."""),
        ("Nathaniel Greaves", """Any lasting damage with customers?"""),
        (CEO, """A few customers qualified competitors during the worst of it, and some of that business won't come back quickly. But we haven't lost a major account, and several customers have told us they appreciated how openly we communicated."""),
    ],
    "2025-Q4": [
        ("Operator", """Our next question is a follow-up from Nathaniel Greaves with Corbel Street Partners."""),
        ("Nathaniel Greaves", """With the Third Amendment done, how do you think about leverage going forward?"""),
        (CFO, """We want to be below two times by the end of 2026, and we'll use most of our free cash flow to repay the revolver until we get there. That also opens the door to the dividend, which requires us to be below three times."""),
        ("Nathaniel Greaves", """And what's your free cash flow expectation?"""),
        (CFO, """Somewhere around $20 million to $25 million in 2026, depending on working capital. Inventory should come down further as we reduce the safety stock we built during the transition."""),
        ("Operator", """Next is a follow-up from Simone Achterberg with Harwick & Lowe Securities."""),
        ("Simone Achterberg", """Is there anything left of the Greywether matter?"""),
        (CEO, """No. The case was dismissed with prejudice in November, the payments are made, and our claim against Brackwater was settled for a credit on future purchases. We've also redesigned our incoming inspection for relief valve bodies, with radiography on every heavy-section casting."""),
    ],
}
