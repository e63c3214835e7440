/* The golden runner: each case file in tests/golden/ holds a command line, one or
 * more input files and the expected output. Every case runs through the
 * program (output compared byte for byte) and, for term tables, through the
 * library as well (tt_read_documents + tt_counter), whose term counts must
 * equal the expected table's. A regression case is named after its issue.
 *
 * Case file format:
 *   # comment lines
 *   args: count --no-stopwords ...
 *   === file NAME
 *   ...contents (a final newline is part of the file)...
 *   === expected
 *   ...expected standard output...
 */
#include <dirent.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/count.h"
#include "termtide/document.h"
#include "termtide/filter.h"
#include "termtide/termtable.h"

typedef struct gcase {
    char args[1024];
    char *names[8];
    char *bodies[8];
    size_t nfiles;
    char *expected;
} gcase;

static void parse_case(char *text, gcase *c)
{
    memset(c, 0, sizeof *c);
    char *p = text;
    char **cur = NULL;
    char *start = NULL;
    while (*p) {
        char *eol = strchr(p, '\n');
        char *next = eol ? eol + 1 : p + strlen(p);
        if (!strncmp(p, "=== ", 4)) {
            if (cur && start)
                *cur = strndup(start, (size_t)(p - start));
            if (!strncmp(p + 4, "file ", 5)) {
                assert_true(c->nfiles < 8);
                c->names[c->nfiles] = strndup(p + 9, (size_t)(eol - (p + 9)));
                cur = &c->bodies[c->nfiles++];
            } else {
                cur = &c->expected;
            }
            start = next;
        } else if (!cur && !strncmp(p, "args: ", 6)) {
            snprintf(c->args, sizeof c->args, "%.*s", (int)(eol - (p + 6)), p + 6);
        }
        p = next;
    }
    if (cur && start)
        *cur = strdup(start);
}

typedef struct lib_ctx {
    tt_counter *counter;
    tt_termtable *table;
} lib_ctx;

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    lib_ctx *l = vctx;
    tt_doc_stats st;
    memset(&st, 0, sizeof st);
    return tt_counter_count(l->counter, doc->blocks, l->table, &st);
}

/* Counts the case's files through the library with the options of args and
 * checks each expected row's count. */
static void check_library(const gcase *c, const char *dir)
{
    if (strstr(c->args, "--show") || !strstr(c->args, "--no-stopwords") ||
        strstr(c->args, "--total"))
        return; /* only plain per-document term tables */
    tt_count_options o;
    tt_count_options_init(&o);
    tt_read_options r;
    memset(&r, 0, sizeof r);
    if (strstr(c->args, "--stem"))
        o.stem = 1;
    if (strstr(c->args, "--numbers"))
        o.keep_numbers = 1;
    if (strstr(c->args, "--tables drop"))
        r.drop_tables = 1;
    if (strstr(c->args, "--doc-types all"))
        r.doc_types = "all";
    const char *ng = strstr(c->args, "--ngram ");
    if (ng) {
        o.ngram_min = ng[8] - '0';
        o.ngram_max = ng[9] == '-' ? ng[10] - '0' : o.ngram_min;
    }
    lib_ctx l = { tt_counter_new(&o), tt_termtable_new() };
    assert_non_null(l.counter);
    for (size_t i = 0; i < c->nfiles; i++) {
        char path[1024];
        snprintf(path, sizeof path, "%s/%s", dir, c->names[i]);
        tt_error err;
        tt_error_init(&err);
        assert_int_equal(tt_read_documents(path, &r, on_doc, &l, NULL, &err), TT_OK);
    }
    /* every expected row (document rank term count ...) has its count in
     * the library's table summed over documents */
    tt_termtable *want = tt_termtable_new();
    char *exp = strdup(c->expected), *save = NULL;
    for (char *line = strtok_r(exp, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        if (!strncmp(line, "document\t", 9))
            continue;
        char *f[4];
        char *s = line;
        for (int k = 0; k < 4; k++) {
            f[k] = s;
            char *tab = strchr(s, '\t');
            if (tab) {
                *tab = '\0';
                s = tab + 1;
            }
        }
        tt_termtable_add(want, f[2], strlen(f[2]), strtoull(f[3], NULL, 10));
    }
    free(exp);
    if (!strstr(c->args, "--top") && !strstr(c->args, "--min-count"))
        assert_int_equal(tt_termtable_distinct(want), tt_termtable_distinct(l.table));
    tt_term_entry *e;
    size_t n;
    assert_int_equal(tt_termtable_sorted(want, &e, &n), TT_OK);
    for (size_t i = 0; i < n; i++) {
        uint64_t got = tt_termtable_get(l.table, e[i].term, e[i].len);
        if (got != e[i].count)
            fail_msg("library count of '%s' is %llu, expected %llu", e[i].term,
                     (unsigned long long)got, (unsigned long long)e[i].count);
    }
    tt_free(e);
    tt_termtable_free(want);
    tt_termtable_free(l.table);
    tt_counter_free(l.counter);
}

static void run_case(const char *file)
{
    char *text = tt_test_slurp(file, NULL);
    assert_non_null(text);
    gcase c;
    parse_case(text, &c);
    assert_true(c.args[0] && c.expected && c.nfiles > 0);
    char dir[] = TT_TEST_TMP "tt_golden_XXXXXX";
    assert_non_null(mkdtemp(dir));
    for (size_t i = 0; i < c.nfiles; i++) {
        char path[1024];
        snprintf(path, sizeof path, "%s/%s", dir, c.names[i]);
        FILE *f = fopen(path, "wb");
        fputs(c.bodies[i], f);
        fclose(f);
    }
    char bin[1024], cmd[4096];
    if (!realpath(tt_test_bin(), bin))
        fail_msg("program not found: %s", tt_test_bin());
    snprintf(cmd, sizeof cmd, "cd %s && %s %s --quiet > out.txt", dir, bin, c.args);
    int st = system(cmd);
    assert_true(WIFEXITED(st));
    char outp[1024];
    snprintf(outp, sizeof outp, "%s/out.txt", dir);
    char *out = tt_test_slurp(outp, NULL);
    if (strcmp(out, c.expected) != 0) {
        print_error("case %s: output differs\n--- expected\n%s--- got\n%s", file, c.expected, out);
        fail();
    }
    check_library(&c, dir);
    print_message("golden: %s ok\n", file);
    snprintf(cmd, sizeof cmd, "rm -rf %s", dir);
    assert_int_equal(system(cmd), 0);
    free(out);
    free(text);
    for (size_t i = 0; i < c.nfiles; i++) {
        free(c.names[i]);
        free(c.bodies[i]);
    }
    free(c.expected);
}

static int cmp_names(const void *a, const void *b)
{
    return strcmp(*(char *const *)a, *(char *const *)b);
}

static void test_golden(void **state)
{
    (void)state;
    DIR *d = opendir("tests/golden");
    assert_non_null(d);
    char *names[256];
    size_t n = 0;
    struct dirent *e;
    while ((e = readdir(d)) && n < 256) {
        size_t l = strlen(e->d_name);
        if (l > 5 && !strcmp(e->d_name + l - 5, ".case"))
            names[n++] = strdup(e->d_name);
    }
    closedir(d);
    assert_true(n >= 5);
    qsort(names, n, sizeof names[0], cmp_names);
    for (size_t i = 0; i < n; i++) {
        char path[512];
        snprintf(path, sizeof path, "tests/golden/%s", names[i]);
        run_case(path);
        free(names[i]);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = { cmocka_unit_test(test_golden) };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
