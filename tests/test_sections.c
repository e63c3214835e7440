/* Tests of section detection (src/sections.c) and --section: the heading
 * forms of periodic and current reports (upper and mixed case, with or
 * without a part, dashes, a table of contents in cells or in paragraphs),
 * a report with a missing section, transcripts, user rules, and the demo
 * corpus. The item structure and its numbering (Items 1-16 of annual
 * reports, Parts I and II of quarterly reports, decimal items of current
 * reports) are common practice in filings; no external source. */
#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/sections.h"

typedef struct blk {
    tt_block_kind kind;
    const char *text;
} blk;

static void make(tt_blocks *b, const blk *v, size_t n)
{
    tt_blocks_reset(b);
    for (size_t i = 0; i < n; i++)
        assert_int_equal(tt_blocks_add(b, v[i].kind, v[i].text, strlen(v[i].text), -1), TT_OK);
}

static const char body[] =
    "This paragraph is the body of a section and has more than thirty words in it so that "
    "the detector takes the heading before it as the start of the section it names here.";

static const tt_section *named(const tt_sections *s, const char *name)
{
    for (size_t i = 0; i < s->n; i++)
        if (!strcmp(s->items[i].name, name))
            return &s->items[i];
    return NULL;
}

static void test_annual(void **state)
{
    (void)state;
    const blk v[] = {
        { TT_BLOCK_HEADING, "TABLE OF CONTENTS" },
        { TT_BLOCK_CELL, "Item 1." }, { TT_BLOCK_CELL, "Business" },       /* toc in cells */
        { TT_BLOCK_PARAGRAPH, "Item 1A. Risk Factors 12" },                 /* toc line */
        { TT_BLOCK_PARAGRAPH, "Item 7. Management's Discussion 30" },
        { TT_BLOCK_HEADING, "PART I" },                                     /* 5 */
        { TT_BLOCK_HEADING, "ITEM 1. BUSINESS" },                           /* 6 */
        { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_PARAGRAPH, "Item 1A \xe2\x80\x94 Risk Factors" },        /* 8 */
        { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_PARAGRAPH, "As described in Item 1A of this report, our business depends on "
                              "one foundry, and a longer sentence like this one is prose." },
        { TT_BLOCK_HEADING, "Item 7. Management\xe2\x80\x99s Discussion and Analysis" }, /* 11 */
        { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Item 7A. Quantitative and Qualitative Disclosures" },       /* 13 */
        { TT_BLOCK_PARAGRAPH, "Not applicable." },
        { TT_BLOCK_HEADING, "Item 70 is not an item" },
    };
    tt_blocks b;
    tt_blocks_init(&b);
    make(&b, v, sizeof v / sizeof *v);
    tt_sections s;
    tt_sections_init(&s);
    assert_int_equal(tt_sections_find(&b, NULL, &s), TT_OK);
    assert_string_equal(s.form, "annual report");
    assert_int_equal(s.n, 4);
    const tt_section *x = named(&s, "business");
    assert_non_null(x);
    assert_int_equal(x->first, 6);
    assert_int_equal(x->end, 8);
    x = named(&s, "risk-factors");
    assert_non_null(x);
    assert_int_equal(x->first, 8);
    assert_int_equal(x->mentions, 2);
    assert_non_null(strstr(x->how, "earlier mentions without a body skipped"));
    x = named(&s, "mdna");
    assert_int_equal(x->first, 11);
    x = named(&s, "market-risk");
    assert_int_equal(x->first, 13); /* no body of 30 words: the last mention */
    assert_int_equal(x->end, b.n);
    /* keeping sections */
    const char *want[] = { "risk-factors", "market-risk", "controls" };
    size_t kept;
    assert_int_equal(tt_blocks_keep_sections(&b, &s, want, 3, &kept), TT_OK);
    assert_int_equal(kept, 2);
    assert_int_equal(b.n, 3 + 3); /* 8, 9, 10 and 13, 14, 15 */
    tt_sections_release(&s);
    tt_blocks_release(&b);
}

static void test_quarterly_and_current(void **state)
{
    (void)state;
    const blk q[] = {
        { TT_BLOCK_HEADING, "PART I. FINANCIAL INFORMATION" },
        { TT_BLOCK_HEADING, "Item 1. Financial Statements" }, { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Item 2. Management's Discussion" }, { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "PART II \xe2\x80\x94 OTHER INFORMATION" },
        { TT_BLOCK_HEADING, "Item 1. Legal Proceedings" }, { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Part II, Item 1A. Risk Factors" }, { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Item 6. Exhibits" }, { TT_BLOCK_PARAGRAPH, body },
    };
    tt_blocks b;
    tt_blocks_init(&b);
    make(&b, q, sizeof q / sizeof *q);
    tt_sections s;
    tt_sections_init(&s);
    assert_int_equal(tt_sections_find(&b, NULL, &s), TT_OK);
    assert_string_equal(s.form, "quarterly report");
    assert_int_equal(s.n, 5);
    assert_string_equal(named(&s, "financial-statements")->item, "I-1");
    assert_string_equal(named(&s, "legal-proceedings")->item, "II-1");
    assert_string_equal(named(&s, "risk-factors")->item, "II-1A");
    assert_int_equal(named(&s, "risk-factors")->first, 8);
    const blk c[] = {
        { TT_BLOCK_HEADING, "Item 2.02 Results of Operations and Financial Condition" },
        { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Item 9.01. Financial Statements and Exhibits" },
        { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "Item 4.09 Something new" }, { TT_BLOCK_PARAGRAPH, body },
    };
    make(&b, c, sizeof c / sizeof *c);
    assert_int_equal(tt_sections_find(&b, NULL, &s), TT_OK);
    assert_string_equal(s.form, "current report");
    assert_non_null(named(&s, "results"));
    assert_non_null(named(&s, "exhibits"));
    assert_non_null(named(&s, "item-4.09"));
    /* nothing to find */
    const blk none[] = { { TT_BLOCK_PARAGRAPH, body }, { TT_BLOCK_HEADING, "Overview" } };
    make(&b, none, 2);
    assert_int_equal(tt_sections_find(&b, NULL, &s), TT_OK);
    assert_int_equal(s.n, 0);
    assert_string_equal(s.form, "none");
    tt_sections_release(&s);
    tt_blocks_release(&b);
}

static void test_user_rules(void **state)
{
    (void)state;
    char path[] = TT_TEST_TMP "tt_rules_XXXXXX";
    int fd = mkstemp(path);
    const char *rules = "# our own sections\r\noutlook\t^(our )?outlook\\b\r\nrisks\t^risks?$\r\n";
    assert_int_equal(write(fd, rules, strlen(rules)), (ssize_t)strlen(rules));
    close(fd);
    tt_section_rules *r = NULL;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_section_rules_load(path, &r, &err), TT_OK);
    const blk v[] = {
        { TT_BLOCK_HEADING, "Our Outlook" }, { TT_BLOCK_PARAGRAPH, body },
        { TT_BLOCK_HEADING, "RISKS" }, { TT_BLOCK_PARAGRAPH, body },
    };
    tt_blocks b;
    tt_blocks_init(&b);
    make(&b, v, 4);
    tt_sections s;
    tt_sections_init(&s);
    assert_int_equal(tt_sections_find(&b, r, &s), TT_OK);
    assert_string_equal(s.form, "user rules");
    assert_int_equal(s.n, 2);
    assert_int_equal(named(&s, "outlook")->first, 0);
    assert_int_equal(named(&s, "risks")->end, 4);
    tt_section_rules_free(r);
    /* a bad pattern: the file, the line and PCRE2's message */
    fd = open(path, O_WRONLY | O_TRUNC);
    const char *bad = "ok\tfine\nbroken\t(unclosed\n";
    assert_int_equal(write(fd, bad, strlen(bad)), (ssize_t)strlen(bad));
    close(fd);
    assert_int_equal(tt_section_rules_load(path, &r, &err), TT_EPARSE);
    assert_int_equal(err.line, 2);
    assert_non_null(strstr(err.message, "pattern at offset"));
    unlink(path);
    tt_sections_release(&s);
    tt_blocks_release(&b);
}

static char *capture(const char *args, int *status)
{
    return tt_test_run(args, 1, status);
}

/* The demo corpus: its reports' items and its calls' parts are found where
 * they are, the offsets point at the headings in the files, and --section
 * reads only them, a document without one reported and skipped. */
static void test_demo(void **state)
{
    (void)state;
    int st;
    char *out = capture("sections -q --no-header demo-corpus/hollowmere/FY2024-annual-report.htm "
                        "demo-corpus/hollowmere/2024-Q2-quarterly-report.htm "
                        "demo-corpus/hollowmere/2024-Q2-call-transcript.txt", &st);
    assert_int_equal(st, 0);
    static const char *const expect[] = {
        "FY2024-annual-report.htm\tannual report\trisk-factors\t1A\t",
        "FY2024-annual-report.htm\tannual report\tmdna\t7\t",
        "2024-Q2-quarterly-report.htm\tquarterly report\trisk-factors\tII-1A\t",
        "2024-Q2-quarterly-report.htm\tquarterly report\tmdna\tI-2\t",
        "2024-Q2-call-transcript.txt\ttranscript\tprepared-remarks\t\t",
        "2024-Q2-call-transcript.txt\ttranscript\tqa\t\t",
    };
    for (size_t i = 0; i < sizeof expect / sizeof *expect; i++) {
        char *at = strstr(out, expect[i]);
        if (!at)
            fail_msg("no row %s in:\n%s", expect[i], out);
        /* the offset points at the heading in the file */
        const char *file = strstr(expect[i], "FY2024") == expect[i]
                               ? "demo-corpus/hollowmere/FY2024-annual-report.htm"
                           : strstr(expect[i], "2024-Q2-q") == expect[i]
                               ? "demo-corpus/hollowmere/2024-Q2-quarterly-report.htm"
                               : "demo-corpus/hollowmere/2024-Q2-call-transcript.txt";
        unsigned long long off = strtoull(at + strlen(expect[i]), NULL, 10);
        FILE *f = fopen(file, "rb");
        char head[8] = "";
        fseek(f, (long)off, SEEK_SET);
        assert_int_equal(fread(head, 1, 4, f), 4);
        fclose(f);
        const char *want = strstr(expect[i], "transcript") ? (strstr(expect[i], "\tqa\t") ? "Ques"
                                                                                          : "Oper")
                                                           : "Item";
        if (memcmp(head, want, 4))
            fail_msg("%s: offset %llu holds '%.4s'", expect[i], off, head);
    }
    free(out);
    /* --section: only the risk factors; a call has none and is skipped */
    out = capture("count -q --total-only --section risk-factors "
                  "demo-corpus/hollowmere/FY2024-annual-report.htm "
                  "demo-corpus/hollowmere/2024-Q2-call-transcript.txt", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "2024-Q2-call-transcript.txt: no section risk-factors found"));
    assert_non_null(strstr(out, "\tdoubt\t"));
    assert_null(strstr(out, "\tdividend\t")); /* outside the risk factors */
    free(out);
    out = capture("count --section no-such-thing demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "no section named 'no-such-thing'"));
    free(out);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_annual),
        cmocka_unit_test(test_quarterly_and_current),
        cmocka_unit_test(test_user_rules),
        cmocka_unit_test(test_demo),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
