/* Tests of the transcript stage (src/transcript.c): speaker labels, turns
 * that run over several paragraphs, the start of the question-and-answer
 * part (a heading, or the operator opening the queue), roles from a
 * participant list, from the label and from behaviour, and prose that must
 * not be read as turns. The conventions checked (a "Name: " label, the
 * operator, prepared remarks then questions) are common practice in call
 * transcripts; no external source. */
#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/transcript.h"

static void add_blocks(tt_blocks *b, const char *const *paras, size_t n)
{
    tt_blocks_reset(b);
    for (size_t i = 0; i < n; i++)
        assert_int_equal(tt_blocks_add(b, TT_BLOCK_PARAGRAPH, paras[i], strlen(paras[i]), -1),
                         TT_OK);
}

static const tt_speaker *speaker(const tt_transcript *t, const char *name)
{
    for (size_t i = 0; i < t->n_speakers; i++)
        if (!strcmp(t->speakers[i].name, name))
            return &t->speakers[i];
    fail_msg("no speaker %s", name);
    return NULL;
}

static void test_heading_and_lists(void **state)
{
    (void)state;
    static const char *const p[] = {
        "Example Corp Second Quarter Call",                                    /* 0 */
        "Corporate Participants Ann Lee—Chief Executive Officer Bo Park—CFO",  /* 1 */
        "Conference Call Participants Cy Dunn—Some Bank",                      /* 2 */
        "Presentation",                                                        /* 3 */
        "Operator: Welcome to the call.",                                      /* 4 */
        "Ann Lee: Thank you. Sales rose.",                                     /* 5 */
        "We also opened a plant.",                                             /* 6 */
        "Bo Park: Margins were 30%.",                                          /* 7 */
        "Question-and-Answer Session",                                         /* 8 */
        "Operator: Our first question comes from Cy Dunn.",                    /* 9 */
        "Cy Dunn: How is demand?",                                             /* 10 */
        "Ann Lee: Demand is firm.",                                            /* 11 */
    };
    tt_blocks b;
    tt_blocks_init(&b);
    add_blocks(&b, p, 12);
    tt_transcript t;
    tt_transcript_init(&t);
    assert_int_equal(tt_transcript_find(&b, &t), TT_OK);
    assert_true(t.found);
    assert_int_equal(t.n_speakers, 4);
    assert_int_equal(t.qa_block, 8);
    assert_string_equal(t.qa_how, "a heading names it");
    assert_int_equal(speaker(&t, "Operator")->role, TT_ROLE_OPERATOR);
    assert_int_equal(speaker(&t, "Ann Lee")->role, TT_ROLE_MANAGEMENT);
    assert_string_equal(speaker(&t, "Ann Lee")->how, "participant list");
    assert_int_equal(speaker(&t, "Ann Lee")->turns, 2);
    assert_int_equal(speaker(&t, "Cy Dunn")->role, TT_ROLE_ANALYST);
    /* parts: header blocks other, turns prepared then qa; block 6 continues
     * Ann Lee's turn; the Q&A heading ends the turn before it */
    tt_turn_part parts[12] = { 0, 0, 0, 0, 1, 1, 1, 1, 0, 2, 2, 2 };
    for (size_t i = 0; i < 12; i++)
        if (t.blocks[i].part != parts[i])
            fail_msg("block %zu: part %s, expected %s", i, tt_turn_part_name(t.blocks[i].part),
                     tt_turn_part_name(parts[i]));
    assert_int_equal(t.blocks[6].role, TT_ROLE_MANAGEMENT);
    assert_int_equal(t.blocks[6].label_len, 0);
    assert_int_equal(t.blocks[5].label_len, strlen("Ann Lee: "));
    assert_int_equal(t.blocks[10].role, TT_ROLE_ANALYST);
    tt_transcript_release(&t);
    tt_blocks_release(&b);
}

/* No participant list and no Q&A heading: the operator opening the queue
 * starts the questions; roles from the label, then from behaviour. */
static void test_fallbacks(void **state)
{
    (void)state;
    static const char *const p[] = {
        "Operator: Good morning, everyone.",                          /* 0 */
        "Dana Ruiz - Chief Financial Officer: Revenue grew.",         /* 1 */
        "Eli Moss: Thank you. We will now take your questions.",      /* 2 */
        "Operator: Our first caller is Fay Lin.",                     /* 3 */
        "Fay Lin: Can you say more about costs?",                     /* 4 */
        "Gus Hale: Costs were flat.",                                 /* 5 */
        "Ivy Tran: And pricing?",                                     /* 6 */
    };
    tt_blocks b;
    tt_blocks_init(&b);
    add_blocks(&b, p, 7);
    tt_transcript t;
    tt_transcript_init(&t);
    assert_int_equal(tt_transcript_find(&b, &t), TT_OK);
    assert_true(t.found);
    assert_int_equal(t.qa_block, 3);
    assert_string_equal(t.qa_how, "the operator opens the questions");
    assert_int_equal(speaker(&t, "Dana Ruiz")->role, TT_ROLE_MANAGEMENT);
    assert_string_equal(speaker(&t, "Dana Ruiz")->how, "role in the label");
    assert_int_equal(speaker(&t, "Eli Moss")->role, TT_ROLE_MANAGEMENT);
    assert_string_equal(speaker(&t, "Eli Moss")->how, "spoke in the prepared remarks");
    assert_int_equal(speaker(&t, "Fay Lin")->role, TT_ROLE_ANALYST);
    assert_string_equal(speaker(&t, "Fay Lin")->how, "first spoke after the operator in the Q&A");
    assert_int_equal(speaker(&t, "Gus Hale")->role, TT_ROLE_MANAGEMENT);
    assert_int_equal(speaker(&t, "Ivy Tran")->role, TT_ROLE_ANALYST);
    assert_string_equal(speaker(&t, "Ivy Tran")->how, "first spoke with a question in the Q&A");
    assert_int_equal(t.blocks[1].part, TT_PART_PREPARED);
    assert_int_equal(t.blocks[4].part, TT_PART_QA);
    tt_transcript_release(&t);
    tt_blocks_release(&b);
}

/* Prose with colons is not a transcript: headings, times, notes, sentences. */
static void test_not_a_transcript(void **state)
{
    (void)state;
    static const char *const p[] = {
        "Note: amounts are in thousands.",
        "The meeting starts at 10:00 a.m. sharp.",
        "Risk factors: our supply chain depends on one foundry.",
        "Item 7: Management's discussion and analysis.",
        "Source: company estimates.",
        "We said: results will improve.",
        "Total: 1,200.",
    };
    tt_blocks b;
    tt_blocks_init(&b);
    add_blocks(&b, p, 7);
    tt_transcript t;
    tt_transcript_init(&t);
    assert_int_equal(tt_transcript_find(&b, &t), TT_OK);
    assert_false(t.found);
    assert_int_equal(t.n_speakers, 0);
    for (size_t i = 0; i < 7; i++) {
        assert_int_equal(t.blocks[i].part, TT_PART_OTHER);
        assert_int_equal(t.blocks[i].role, TT_ROLE_NONE);
        assert_int_equal(t.blocks[i].label_len, 0);
    }
    /* three turns by two speakers are not enough either */
    static const char *const q[] = { "Ann Lee: Hello.", "Bo Park: Hi.", "Ann Lee: Bye." };
    add_blocks(&b, q, 3);
    assert_int_equal(tt_transcript_find(&b, &t), TT_OK);
    assert_false(t.found);
    /* an empty document */
    tt_blocks_reset(&b);
    assert_int_equal(tt_transcript_find(&b, &t), TT_OK);
    assert_false(t.found);
    tt_transcript_release(&t);
    tt_blocks_release(&b);
}

/* Out of memory at every allocation is reported, never crashed on. */
static void test_out_of_memory(void **state)
{
    (void)state;
    static const char *const p[] = { "Operator: Hello.", "Ann Lee: Hi.", "Bo Park: Hey.",
                                      "Ann Lee: Bye?", "Cy Dunn: Thanks." };
    tt_blocks b;
    tt_blocks_init(&b);
    add_blocks(&b, p, 5);
    tt_transcript t;
    tt_transcript_init(&t);
    int saw_ok = 0;
    tt_allocator a = { tt_test_failing_malloc, tt_test_failing_realloc, free };
    for (int k = 0; k < 40 && !saw_ok; k++) {
        tt_test_fail_after = k;
        tt_set_allocator(&a);
        tt_status st = tt_transcript_find(&b, &t);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        if (st == TT_OK)
            saw_ok = 1;
        else
            assert_int_equal(st, TT_ENOMEM);
    }
    assert_true(saw_ok);
    assert_true(t.found);
    tt_transcript_release(&t);
    tt_blocks_release(&b);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_heading_and_lists),
        cmocka_unit_test(test_fallbacks),
        cmocka_unit_test(test_not_a_transcript),
        cmocka_unit_test(test_out_of_memory),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
