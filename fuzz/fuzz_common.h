/* termtide fuzz targets — shared helpers: invariant checks and the plain
 * replay driver.
 *
 * Each fuzz/fuzz_<target>.c defines LLVMFuzzerTestOneInput, the entry point
 * libFuzzer calls (clang -fsanitize=fuzzer). Built with -DTT_FUZZ_STANDALONE
 * instead, the main() below turns the same file into a replay driver: every
 * file named on the command line (a directory stands for the files in it,
 * sorted bytewise, hidden ones skipped) is read and handed to the entry point
 * once. That is how `make fuzz` replays the seed corpus and the saved crash
 * reproducers with gcc under AddressSanitizer on a machine without clang.
 *
 * The harness, not the library, may abort: a broken invariant is a finding,
 * and abort() is what both libFuzzer and the replay driver report as one. */
#ifndef TT_FUZZ_COMMON_H
#define TT_FUZZ_COMMON_H

#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/extract.h"
#include "termtide/status.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

/* A contract the library's headers state was broken: print where and stop. */
#define FUZZ_CHECK(cond)                                                              \
    do {                                                                              \
        if (!(cond)) {                                                                \
            fprintf(stderr, "%s:%d: invariant failed: %s\n", __FILE__, __LINE__,      \
                    #cond);                                                           \
            abort();                                                                  \
        }                                                                             \
    } while (0)

/* Strict UTF-8 (Unicode 15.0, chapter 3.9, Table 3-7 "Well-Formed UTF-8 Byte
 * Sequences"): no overlong forms, no surrogates, nothing above U+10FFFF.
 * Written out here rather than taken from the library so the check does not
 * share the code it checks. */
static inline int fuzz_utf8_valid(const unsigned char *s, size_t n)
{
    size_t i = 0;
    while (i < n) {
        unsigned c = s[i];
        if (c < 0x80) {
            i++;
            continue;
        }
        size_t need;
        unsigned lo = 0x80, hi = 0xBF;
        if (c >= 0xC2 && c <= 0xDF) {
            need = 1;
        } else if (c >= 0xE0 && c <= 0xEF) {
            need = 2;
            if (c == 0xE0)
                lo = 0xA0;
            else if (c == 0xED)
                hi = 0x9F;
        } else if (c >= 0xF0 && c <= 0xF4) {
            need = 3;
            if (c == 0xF0)
                lo = 0x90;
            else if (c == 0xF4)
                hi = 0x8F;
        } else {
            return 0;
        }
        if (n - i <= need)
            return 0;
        if (s[i + 1] < lo || s[i + 1] > hi)
            return 0;
        for (size_t k = 2; k <= need; k++)
            if (s[i + k] < 0x80 || s[i + k] > 0xBF)
                return 0;
        i += need + 1;
    }
    return 1;
}

/* A failed call returns a status the header lists and fills the error record
 * with that status and a message (include/termtide/status.h). */
static inline void fuzz_check_error(tt_status st, const tt_error *err)
{
    FUZZ_CHECK(st > TT_OK && st <= TT_ELOOP);
    FUZZ_CHECK(err->status == st);
    FUZZ_CHECK(memchr(err->message, '\0', sizeof err->message) != NULL);
    FUZZ_CHECK(err->message[0] != '\0');
}

/* The layout include/termtide/extract.h promises for blocks: each block's
 * text lies in the shared buffer followed by '\n', holds no line break, is
 * valid UTF-8 without NUL, and is white-space normalized (no tab, CR or LF,
 * only single inner spaces, no U+00A0, nothing at either end); blocks
 * follow one another; src_off is -1 or lies within the source. */
static inline void fuzz_check_blocks(const tt_blocks *b, long long src_base, size_t src_len)
{
    size_t next = 0;
    FUZZ_CHECK(b->text.data != NULL);
    FUZZ_CHECK(b->text.data[b->text.len] == '\0');
    for (size_t k = 0; k < b->n; k++) {
        const tt_block *blk = &b->items[k];
        const unsigned char *t = (const unsigned char *)b->text.data + blk->off;
        FUZZ_CHECK(blk->kind >= TT_BLOCK_PARAGRAPH && blk->kind <= TT_BLOCK_ITEM);
        FUZZ_CHECK(blk->off >= next);
        FUZZ_CHECK(blk->len > 0);
        FUZZ_CHECK(blk->off + blk->len < b->text.len);
        FUZZ_CHECK(t[blk->len] == '\n');
        FUZZ_CHECK(t[0] != ' ' && t[blk->len - 1] != ' ');
        for (size_t i = 0; i < blk->len; i++) {
            FUZZ_CHECK(t[i] != '\0' && t[i] != '\n' && t[i] != '\r' && t[i] != '\t');
            if (i + 1 < blk->len) {
                FUZZ_CHECK(!(t[i] == ' ' && t[i + 1] == ' '));
                FUZZ_CHECK(!(t[i] == 0xC2 && t[i + 1] == 0xA0));
            }
        }
        FUZZ_CHECK(fuzz_utf8_valid(t, blk->len));
        FUZZ_CHECK(blk->src_off == -1 ||
                   (blk->src_off >= src_base && blk->src_off <= src_base + (long long)src_len));
        next = blk->off + blk->len + 1;
    }
}

#ifdef TT_FUZZ_STANDALONE

#include <dirent.h>
#include <sys/stat.h>

static int fuzz_replay_file(const char *path)
{
    FILE *f = fopen(path, "rb");
    if (!f) {
        fprintf(stderr, "%s: cannot open\n", path);
        return 1;
    }
    size_t cap = 4096, len = 0;
    unsigned char *buf = malloc(cap);
    for (;;) {
        if (!buf) {
            fclose(f);
            fprintf(stderr, "%s: out of memory\n", path);
            return 1;
        }
        len += fread(buf + len, 1, cap - len, f);
        if (len < cap)
            break;
        cap *= 2;
        unsigned char *p = realloc(buf, cap);
        if (!p)
            free(buf);
        buf = p;
    }
    int bad = ferror(f);
    fclose(f);
    if (bad) {
        free(buf);
        fprintf(stderr, "%s: read error\n", path);
        return 1;
    }
    /* An exact-size copy, so ASan sees a read one byte past the input. */
    unsigned char *exact = malloc(len ? len : 1);
    if (!exact) {
        free(buf);
        return 1;
    }
    memcpy(exact, buf, len);
    free(buf);
    LLVMFuzzerTestOneInput(exact, len);
    free(exact);
    return 0;
}

static int fuzz_cmp_names(const void *a, const void *b)
{
    return strcmp(*(const char *const *)a, *(const char *const *)b);
}

/* Replays path, or the regular files directly inside it; counts inputs. */
static int fuzz_replay_path(const char *path, size_t *inputs)
{
    struct stat st;
    if (stat(path, &st) != 0) {
        fprintf(stderr, "%s: no such file or directory\n", path);
        return 1;
    }
    if (!S_ISDIR(st.st_mode)) {
        (*inputs)++;
        return fuzz_replay_file(path);
    }
    DIR *d = opendir(path);
    if (!d) {
        fprintf(stderr, "%s: cannot open directory\n", path);
        return 1;
    }
    char **names = NULL;
    size_t n = 0, cap = 0;
    int rc = 0;
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        if (e->d_name[0] == '.')
            continue;
        if (n == cap) {
            cap = cap ? cap * 2 : 64;
            char **p = realloc(names, cap * sizeof *p);
            if (!p) {
                rc = 1;
                break;
            }
            names = p;
        }
        size_t need = strlen(path) + strlen(e->d_name) + 2;
        names[n] = malloc(need);
        if (!names[n]) {
            rc = 1;
            break;
        }
        snprintf(names[n], need, "%s/%s", path, e->d_name);
        n++;
    }
    closedir(d);
    if (n)
        qsort(names, n, sizeof *names, fuzz_cmp_names);
    for (size_t i = 0; i < n; i++) {
        if (!rc && stat(names[i], &st) == 0 && S_ISREG(st.st_mode)) {
            (*inputs)++;
            rc |= fuzz_replay_file(names[i]);
        }
        free(names[i]);
    }
    free(names);
    return rc;
}

int main(int argc, char **argv)
{
    size_t inputs = 0;
    int rc = 0;
    if (argc < 2) {
        fprintf(stderr, "usage: %s FILE-OR-DIR...\n", argv[0]);
        return 2;
    }
    for (int i = 1; i < argc; i++)
        rc |= fuzz_replay_path(argv[i], &inputs);
    printf("%s: %zu inputs replayed\n", argv[0], inputs);
    return rc;
}

#endif /* TT_FUZZ_STANDALONE */

#endif
