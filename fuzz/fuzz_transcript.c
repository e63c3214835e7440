/* termtide fuzz target — speaker turns (tt_transcript_find) and the source
 * offset walk (tt_blocks_source_offset), over plain text.
 *
 * The input is a plain-text document: it is extracted to blocks
 * (tt_extract_text) and searched for turns. Checked
 * (include/termtide/transcript.h, extract.h): one entry per block; a block
 * outside every turn is part "other", role "none", with no label; a block in
 * a turn names a speaker in range whose role is not "none", and its label
 * lies inside the block; found = 0 means no speakers; the Q&A start, when
 * set, is a block index; each speaker has at least one turn. For every
 * block, the source offset of its first byte is its src_off, and the offset
 * of any byte is within the text and never before the block's start.
 * Sections (sections.h): each within the blocks, in order, not
 * overlapping. Changes (changes.h): the document aligned with itself is all
 * unchanged, with an edit similarity of 1. */
#include "fuzz_common.h"

#include "termtide/changes.h"
#include "termtide/sections.h"
#include "termtide/transcript.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size > 1 << 20)
        return 0;
    tt_blocks b;
    tt_blocks_init(&b);
    tt_error err;
    tt_error_init(&err);
    if (tt_extract_text((const char *)data, size, 0, &b, "fuzz", &err) != TT_OK) {
        tt_blocks_release(&b);
        return 0;
    }
    tt_transcript t;
    tt_transcript_init(&t);
    tt_status st = tt_transcript_find(&b, &t);
    FUZZ_CHECK(st == TT_OK || st == TT_ENOMEM);
    if (st == TT_OK) {
        FUZZ_CHECK(t.n_blocks == b.n);
        FUZZ_CHECK(t.found || t.n_speakers == 0);
        FUZZ_CHECK(t.qa_block < (long)b.n);
        for (size_t i = 0; i < t.n_blocks; i++) {
            const tt_block_turn *bt = &t.blocks[i];
            if (bt->speaker == (size_t)-1) {
                FUZZ_CHECK(bt->part == TT_PART_OTHER && bt->role == TT_ROLE_NONE);
                FUZZ_CHECK(bt->label_len == 0);
            } else {
                FUZZ_CHECK(bt->speaker < t.n_speakers);
                FUZZ_CHECK(bt->role != TT_ROLE_NONE && bt->part != TT_PART_OTHER);
                FUZZ_CHECK(bt->label_len <= b.items[i].len + 1);
            }
        }
        for (size_t k = 0; k < t.n_speakers; k++)
            FUZZ_CHECK(t.speakers[k].turns > 0 && t.speakers[k].name != NULL);
    }
    for (size_t i = 0; i < b.n; i++) {
        long long first = tt_blocks_source_offset(&b, i, 0, (const char *)data, size, 0);
        FUZZ_CHECK(first == b.items[i].src_off);
        for (size_t off = 0; off < b.items[i].len; off += 7) {
            long long o = tt_blocks_source_offset(&b, i, off, (const char *)data, size, 0);
            FUZZ_CHECK(o >= first && (size_t)o <= size);
        }
    }
    tt_sections secs;
    tt_sections_init(&secs);
    if (tt_sections_find(&b, NULL, &secs) == TT_OK) {
        for (size_t i = 0; i < secs.n; i++) {
            FUZZ_CHECK(secs.items[i].first < secs.items[i].end && secs.items[i].end <= b.n);
            FUZZ_CHECK(i == 0 || secs.items[i].first >= secs.items[i - 1].end);
        }
    }
    tt_sections_release(&secs);
    tt_sentence_list *x = tt_sentence_list_new();
    tt_sentence_list *y = x ? tt_sentence_list_new_sharing(x) : NULL;
    if (x && y && tt_sentence_list_add(x, &b, (const char *)data, size, 0, 0, "a") == TT_OK &&
        tt_sentence_list_add(y, &b, (const char *)data, size, 0, 0, "b") == TT_OK) {
        tt_alignment al;
        tt_alignment_init(&al);
        if (tt_align_sentences(x, y, 0.5, &al) == TT_OK) {
            FUZZ_CHECK(al.unchanged == tt_sentence_list_count(x));
            FUZZ_CHECK(al.added == 0 && al.removed == 0 && al.modified == 0);
            FUZZ_CHECK(al.edit_similarity == 1.0);
        }
        tt_alignment_release(&al);
    }
    tt_sentence_list_free(y);
    tt_sentence_list_free(x);
    tt_transcript_release(&t);
    tt_blocks_release(&b);
    return 0;
}
