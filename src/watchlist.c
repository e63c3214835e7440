/* termtide — watch-lists: rule lines parsed, checked and compiled with
 * PCRE2 (see include/termtide/search.h for the format).
 *
 * Every line is checked even after a problem, so one run reports them all;
 * a watch-list with any problem is never used. Each rule's pattern is
 * compiled as written first, so a compile error's offset points into the
 * pattern the user wrote; with whole words it is compiled again wrapped in
 * lookarounds, (?<![\w])(?:P)(?![\w]) under UCP, which unlike \b also works
 * for a pattern that starts or ends with a non-word character ("$5").
 *
 * Pair scan. A pattern rule whose start can be read (start_steps: literal
 * ASCII characters, escaped punctuation, \s and \s+, passing over \b and
 * \B) becomes a list of steps every match begins with, each a set of
 * bytes that may start its character; with three or more such rules, they
 * are compiled anchored and run by search.c's pair scan, from tables built
 * here (build_pairs): a byte-pair table, a bit set of rules per byte at
 * each of the first four offsets, and per byte after a \s+ run. The sets
 * are supersets (a byte above ASCII only means "maybe"), so the scan misses
 * no position where a rule matches. A pattern the reading could get wrong
 * is left to the other ways (pair_unsafe): an alternative at the top level,
 * \Q...\E, (?# comments, verbs, \G and \K. Cost, once per watch-list: 8 x
 * 257 bits and a few dozen bytes per pair-scanned rule, a 64 KiB pair table
 * built in 65536 x rules / 64 word operations. For the scan's wide first
 * look (SSSE3, AVX2), build_print reads the bytes each rule's match can
 * have at its first six offsets from the same steps, puts the rules in
 * eight buckets and writes 192 bytes of nibble tables.
 *
 * Prefilter and scan. The other rules' patterns, but for those that start
 * with a known character (each runs on its own over the whole text), are
 * also compiled into one
 * alternation, (?:P1)|(?:P2)|..., which finds, in one pass over a block,
 * each leftmost position where some rule matches (an alternation matches
 * at a position whenever one of its branches does); search.c tries the
 * pattern rules there, each compiled a second time anchored, and runs the
 * near() rules (which take part through their A pattern) only on blocks
 * where the alternation found something. Rules whose meaning would change
 * inside a bigger pattern are left out of it and run on every block on
 * their own: numbered back-references and subroutine calls (the group
 * numbers shift), conditionals on groups, backtracking verbs ((*COMMIT)
 * would stop the other branches), and patterns that can match the empty
 * string (the alternation would then stop at every position). When the alternation does not compile
 * (an extended-mode comment eating the closing parenthesis) or there is one
 * rule, every rule runs on its own.
 *
 * PCRE2 allocates through tt_malloc (a general context), so a failing
 * allocator reaches the pattern compiler too. */
#include "search_internal.h"

static void *pcre_alloc(size_t n, void *data)
{
    (void)data;
    return tt_malloc(n);
}

static void pcre_free(void *p, void *data)
{
    (void)data;
    tt_free(p);
}

void tt_search_options_init(tt_search_options *o)
{
    o->case_sensitive = 0;
    o->whole_words = 0;
    o->context = 8;
}

tt_watchlist *tt_watchlist_new(const tt_search_options *opt)
{
    tt_watchlist *wl = tt_calloc(1, sizeof *wl);
    if (!wl)
        return NULL;
    if (opt)
        wl->opt = *opt;
    else
        tt_search_options_init(&wl->opt);
    if (wl->opt.context > TT_LIMIT_SEARCH_CONTEXT)
        wl->opt.context = TT_LIMIT_SEARCH_CONTEXT;
    wl->gctx = pcre2_general_context_create(pcre_alloc, pcre_free, NULL);
    if (!wl->gctx) {
        tt_free(wl);
        return NULL;
    }
    wl->jit = 1;
    tt_sha256_init(&wl->hash);
    return wl;
}

static void code_free(pcre2_code *c)
{
    if (c)
        pcre2_code_free(c);
}

void tt_watchlist_free(tt_watchlist *wl)
{
    if (!wl)
        return;
    for (size_t i = 0; i < wl->n; i++) {
        tti_rule *r = &wl->rules[i];
        tt_free((char *)r->pub.name);
        tt_free((char *)r->pub.pattern);
        tt_free((char *)r->pub.note);
        code_free(r->code);
        code_free(r->code_b);
        code_free(r->anchored);
    }
    tt_free(wl->rules);
    tt_free(wl->problems);
    code_free(wl->prefilter);
    tt_free(wl->always);
    tt_free(wl->scan);
    tt_free(wl->gated);
    tt_free(wl->whole);
    tt_free(wl->pair);
    tt_free(wl->pair_sets);
    tt_free(wl->pair_at);
    tt_free(wl->pair_after);
    tt_free(wl->pair_table);
    pcre2_general_context_free(wl->gctx);
    tt_free(wl);
}

size_t tt_watchlist_problem_count(const tt_watchlist *wl) { return wl->n_problems; }
const tt_error *tt_watchlist_problem(const tt_watchlist *wl, size_t i)
{
    return i < wl->n_problems ? &wl->problems[i] : NULL;
}
size_t tt_watchlist_size(const tt_watchlist *wl) { return wl->n; }
const tt_rule *tt_watchlist_rule(const tt_watchlist *wl, size_t i)
{
    return i < wl->n ? &wl->rules[i].pub : NULL;
}
const char *tt_watchlist_sha256(const tt_watchlist *wl) { return wl->sha256; }
int tt_watchlist_jit(const tt_watchlist *wl) { return wl->n > 0 && wl->jit; }

/* Records a problem (the first TT_LIMIT_WATCHLIST_PROBLEMS are kept). */
static tt_status problem(tt_watchlist *wl, const char *file, long line, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
static tt_status problem(tt_watchlist *wl, const char *file, long line, const char *fmt, ...)
{
    wl->problems_total++;
    if (wl->n_problems >= TT_LIMIT_WATCHLIST_PROBLEMS)
        return TT_OK;
    if (!wl->problems) {
        wl->problems = tt_calloc(TT_LIMIT_WATCHLIST_PROBLEMS, sizeof *wl->problems);
        if (!wl->problems)
            return TT_ENOMEM;
    }
    tt_error *e = &wl->problems[wl->n_problems++];
    tt_error_init(e);
    char msg[TT_ERROR_MSG_MAX];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    tt_error_set_line(e, TT_EPARSE, file, line, "%s", msg);
    return TT_OK;
}

/* Whether a pattern holds an item PCRE2_UCP changes: \b \B \d \D \s \S
 * \w \W or a POSIX class ([:alpha:] ...). Only those: with PCRE2_UTF,
 * caseless matching already follows Unicode (pcre2api, PCRE2_CASELESS). A
 * pattern without them is compiled without UCP, which means the same and
 * lets the JIT keep its fast search for the first characters (measured
 * here: a caseless phrase over 97 MB in 0.01 s instead of 0.17 s). */
static int needs_ucp(const char *p, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if (p[i] == '\\' && i + 1 < n) {
            if (strchr("bBdDsSwW", p[i + 1]))
                return 1;
            i++;
        } else if (p[i] == '[' && i + 1 < n && p[i + 1] == ':') {
            return 1;
        } else if (p[i] == '(' && i + 1 < n && p[i + 1] == '*') {
            return 1; /* a leading (*UCP) or other verb: keep the documented default */
        }
    }
    return 0;
}

/* Compiles one pattern (extra: more compile options); on failure fills msg
 * and *erroff (bytes). */
static pcre2_code *compile_with(tt_watchlist *wl, const char *pat, size_t len, int wrap_words,
                                uint32_t extra, char *msg, size_t msgsize, size_t *erroff,
                                int *nomem)
{
    /* \C (one code unit) could end a hit inside a character: refused */
    uint32_t options = PCRE2_UTF | PCRE2_MATCH_INVALID_UTF | PCRE2_NEVER_BACKSLASH_C | extra;
    if (needs_ucp(pat, len))
        options |= PCRE2_UCP;
    if (!wl->opt.case_sensitive)
        options |= PCRE2_CASELESS;
    pcre2_compile_context *cctx = pcre2_compile_context_create(wl->gctx);
    if (!cctx) {
        *nomem = 1;
        return NULL;
    }
    tt_buf wrapped;
    tt_buf_init(&wrapped, 0);
    const char *p = pat;
    size_t n = len;
    if (wrap_words) {
        /* \w under PCRE2_UCP, written out so the wrapper needs no UCP */
        if (tt_buf_puts(&wrapped, "(?<![\\p{L}\\p{N}_])(?:") || tt_buf_append(&wrapped, pat, len) ||
            tt_buf_puts(&wrapped, ")(?![\\p{L}\\p{N}_])")) {
            pcre2_compile_context_free(cctx);
            *nomem = 1;
            return NULL;
        }
        p = wrapped.data;
        n = wrapped.len;
    }
    int errcode = 0;
    PCRE2_SIZE off = 0;
    pcre2_code *code = pcre2_compile((PCRE2_SPTR)p, n, options, &errcode, &off, cctx);
    pcre2_compile_context_free(cctx);
    tt_buf_release(&wrapped);
    if (!code) {
        if (errcode == PCRE2_ERROR_HEAPLIMIT || errcode == PCRE2_ERROR_NOMEMORY)
            *nomem = 1;
        pcre2_get_error_message(errcode, (PCRE2_UCHAR *)msg, msgsize);
        *erroff = off;
        return NULL;
    }
    if (pcre2_jit_compile(code, PCRE2_JIT_COMPLETE) != 0)
        wl->jit = 0; /* the interpreter runs it, with the same limits */
    return code;
}

static pcre2_code *compile(tt_watchlist *wl, const char *pat, size_t len, int wrap_words,
                           char *msg, size_t msgsize, size_t *erroff, int *nomem)
{
    return compile_with(wl, pat, len, wrap_words, 0, msg, msgsize, erroff, nomem);
}

/* A rule whose pattern means something else inside a bigger alternation
 * (see the top of the file). Conservative: a false "yes" only costs speed. */
static int unsafe_in_alternation(const char *p, size_t n)
{
    for (size_t i = 0; i + 1 < n; i++) {
        if (p[i] == '\\') {
            char c = p[i + 1];
            if ((c >= '1' && c <= '9') || c == 'g' || c == 'k')
                return 1;
            i++;
            continue;
        }
        if (p[i] == '(' && (p[i + 1] == '*' || p[i + 1] == '?')) {
            if (p[i + 1] == '*')
                return 1;
            char c = i + 2 < n ? p[i + 2] : 0;
            if (c == 'R' || c == '&' || c == '(' || c == '+' || c == '-' ||
                (c >= '0' && c <= '9'))
                return 1;
            if (c == 'P' && i + 3 < n && (p[i + 3] == '>' || p[i + 3] == '='))
                return 1;
        }
    }
    return 0;
}

static int is_space(char c) { return c == ' ' || c == '\t'; }

/* Commas outside (), [] and {} (escapes skipped). */
static size_t top_level_commas(const char *f, size_t n)
{
    size_t commas = 0;
    int depth = 0, in_class = 0;
    for (size_t i = 0; i < n; i++) {
        char c = f[i];
        if (c == '\\') {
            i++;
        } else if (in_class) {
            in_class = c != ']';
        } else if (c == '[') {
            in_class = 1;
            if (i + 1 < n && f[i + 1] == ']')
                i++;
        } else if (c == '(' || c == '{') {
            depth++;
        } else if ((c == ')' || c == '}') && depth > 0) {
            depth--;
        } else if (c == ',' && depth == 0) {
            commas++;
        }
    }
    return commas;
}

/* Splits "near(A, B, N)" (the whole field); returns 0 and a message when
 * malformed. a/b are offsets and lengths within the field. */
static int split_near(const char *f, size_t n, size_t *a, size_t *alen, size_t *b,
                      size_t *blen, size_t *words, char *msg, size_t msgsize)
{
    if (n < 6 || f[n - 1] != ')') {
        snprintf(msg, msgsize, "near(A, B, N) must end with ')'");
        return 0;
    }
    size_t end = n - 1; /* the closing ')' */
    if (top_level_commas(f + 5, end - 5) < 2) {
        snprintf(msg, msgsize, "near(A, B, N) needs three arguments");
        return 0;
    }
    size_t last = end;
    while (last > 5 && f[last - 1] != ',')
        last--;
    if (last <= 5) {
        snprintf(msg, msgsize, "near(A, B, N) needs three arguments");
        return 0;
    }
    /* N: digits between the last comma and ')' */
    size_t p = last;
    while (p < end && is_space(f[p]))
        p++;
    size_t q = end;
    while (q > p && is_space(f[q - 1]))
        q--;
    if (p == q || q - p > 3) {
        snprintf(msg, msgsize, "near(A, B, N): N must be a number of words from 0 to %d",
                 TT_LIMIT_NEAR_WORDS);
        return 0;
    }
    size_t v = 0;
    for (size_t i = p; i < q; i++) {
        if (f[i] < '0' || f[i] > '9') {
            snprintf(msg, msgsize, "near(A, B, N): N must be a number of words from 0 to %d",
                     TT_LIMIT_NEAR_WORDS);
            return 0;
        }
        v = v * 10 + (size_t)(f[i] - '0');
    }
    if (v > TT_LIMIT_NEAR_WORDS) {
        snprintf(msg, msgsize, "near(A, B, N): N must be a number of words from 0 to %d",
                 TT_LIMIT_NEAR_WORDS);
        return 0;
    }
    /* A and B: the first comma outside (), [] and {} (escapes skipped) */
    size_t start = 5, split = 0;
    int depth = 0, in_class = 0;
    for (size_t i = start; i < last - 1; i++) {
        char c = f[i];
        if (c == '\\') {
            i++;
            continue;
        }
        if (in_class) {
            if (c == ']')
                in_class = 0;
            continue;
        }
        if (c == '[') {
            in_class = 1;
            if (i + 1 < last - 1 && f[i + 1] == ']')
                i++; /* "[]...]": a leading ] is literal */
        } else if (c == '(' || c == '{') {
            depth++;
        } else if ((c == ')' || c == '}') && depth > 0) {
            depth--;
        } else if (c == ',' && depth == 0) {
            split = i;
            break;
        }
    }
    if (!split) {
        snprintf(msg, msgsize, "near(A, B, N) needs two patterns separated by a comma");
        return 0;
    }
    size_t as = start, ae = split, bs = split + 1, be = last - 1;
    while (as < ae && is_space(f[as]))
        as++;
    while (ae > as && is_space(f[ae - 1]))
        ae--;
    while (bs < be && is_space(f[bs]))
        bs++;
    while (be > bs && is_space(f[be - 1]))
        be--;
    if (as == ae || bs == be) {
        snprintf(msg, msgsize, "near(A, B, N): a pattern is empty");
        return 0;
    }
    *a = as;
    *alen = ae - as;
    *b = bs;
    *blen = be - bs;
    *words = v;
    return 1;
}

/* Whether a pattern may run over a document's whole text at once (see
 * search.c): it holds no anchor (^ $ \\A \\z \\Z \\G), no \\K, no lookaround
 * and no verb, the only items that could see past a block's end without
 * consuming the separator. Conservative: a '^' in a class counts too. */
static int whole_text_ok(const char *p, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if (p[i] == '\\' && i + 1 < n) {
            if (strchr("AzZGK", p[i + 1]))
                return 0;
            i++;
        } else if (p[i] == '^' || p[i] == '$') {
            return 0;
        } else if (p[i] == '(' && i + 2 < n && (p[i + 1] == '*' ||
                   (p[i + 1] == '?' && (p[i + 2] == '=' || p[i + 2] == '!' || p[i + 2] == '<')))) {
            return 0;
        }
    }
    return 1;
}

/* Whether a pattern holds something that would make the pair scan's view
 * of it wrong (see start_steps and search.c): an alternative at the top level
 * (a match may start with either branch), \Q...\E quoting and (?# comments
 * (they hide what follows from this reading), verbs ((*COMMIT) and (*SKIP)
 * change which later start positions a search tries, so an anchored try at
 * each position would find more), \G (true only at the search's start) and
 * \K (it moves a match's start). Conservative: a class is taken to end at
 * its first ']' that is not its first character, no later than PCRE2 ends
 * it, so no top-level '|' is taken for a class member. */
static int pair_unsafe(const char *p, size_t n)
{
    int depth = 0, in_class = 0;
    for (size_t i = 0; i < n; i++) {
        char c = p[i];
        if (c == '\\') {
            if (i + 1 < n && (p[i + 1] == 'Q' || p[i + 1] == 'E' || p[i + 1] == 'G' ||
                              p[i + 1] == 'K'))
                return 1;
            i++;
        } else if (in_class) {
            in_class = c != ']';
        } else if (c == '[') {
            in_class = 1;
            if (i + 1 < n && p[i + 1] == '^')
                i++;
            if (i + 1 < n && p[i + 1] == ']')
                i++;
        } else if (c == '(') {
            if (i + 1 < n && (p[i + 1] == '*' || (p[i + 1] == '?' && i + 2 < n && p[i + 2] == '#')))
                return 1;
            depth++;
        } else if (c == ')') {
            if (depth)
                depth--;
        } else if (c == '|' && depth == 0) {
            return 1;
        }
    }
    return 0;
}

static int is_ascii_alnum(unsigned char c)
{
    return (c >= '0' && c <= '9') || ((c | 0x20) >= 'a' && (c | 0x20) <= 'z');
}

/* The step sets (see search_internal.h): set c holds ASCII c and, when
 * caseless and c is a letter, its other case; caseless k and s also match
 * U+212A KELVIN SIGN (E2 84 AA) and U+017F LATIN SMALL LETTER LONG S (C5
 * BF), so E2 and C5 may start them. No other ASCII character has a case
 * partner above ASCII (the search tests check this against PCRE2 over every
 * character). \s, under PCRE2_UCP or not, holds ASCII TAB to CR, 0x1C to
 * 0x1F (more than PCRE2 takes, which is safe) and space, and may start with
 * the first byte of each Unicode White_Space character above ASCII: C2
 * (U+0085, U+00A0), E1 (U+1680, U+180E), E2 (U+2000 to U+205F) and E3
 * (U+3000) (checked the same way). A set may hold bytes no match has, never
 * miss one. */
static void fill_pair_sets(unsigned char *sets, int caseless)
{
    for (unsigned c = 0; c < 128; c++) {
        unsigned char *set = sets + c * 256;
        set[c] = 1;
        if (caseless && (c | 0x20) >= 'a' && (c | 0x20) <= 'z') {
            set[c ^ 0x20] = 1;
            if ((c | 0x20) == 'k')
                set[0xE2] = 2;
            else if ((c | 0x20) == 's')
                set[0xC5] = 2;
        }
    }
    unsigned char *space = sets + TTI_PAIR_SPACE * 256;
    for (unsigned b = 0x09; b <= 0x0D; b++)
        space[b] = 1;
    for (unsigned b = 0x1C; b <= 0x20; b++)
        space[b] = 1;
    space[0xC2] = space[0xE1] = space[0xE2] = space[0xE3] = 2;
}

/* Reads a pattern's start for the pair scan into steps that every match
 * begins with: a character of a set (see fill_pair_sets) or a run of \s+.
 * Read are literal ASCII characters, escaped ASCII punctuation, \s and \s+;
 * \b and \B take nothing and are passed over. A character that may be left
 * out (followed by ?, * or {) and anything else (a group, a class, a dot,
 * other escapes, a non-ASCII character) ends the reading; so does a
 * character followed by + (after it), and a \s+ run that the next character
 * could continue (the run's end would not be known). Returns the number of
 * steps (0: the start cannot be read). */
static size_t start_steps(const char *p, size_t n, const unsigned char *sets,
                          tti_pair_step steps[TTI_PAIR_STEPS])
{
    static const char punct[] = " !\"#%&',-/:;<=>@_`~]}";
    size_t k = 0, i = 0;
    while (i < n && k < TTI_PAIR_STEPS) {
        unsigned char c = (unsigned char)p[i];
        tti_pair_step st = { 0, 0 };
        size_t len = 1;
        if (c == '\\') {
            if (i + 1 >= n)
                break;
            unsigned char e = (unsigned char)p[i + 1];
            len = 2;
            if (e == 'b' || e == 'B') {
                i += 2;
                continue;
            }
            if (e == 's')
                st.set = TTI_PAIR_SPACE;
            else if (e > 0x20 && e < 0x7F && !is_ascii_alnum(e))
                st.set = e;
            else
                break;
        } else if (is_ascii_alnum(c) || (c && strchr(punct, c))) {
            st.set = c;
        } else {
            break;
        }
        char q = i + len < n ? p[i + len] : '\0';
        if (q == '?' || q == '*' || q == '{')
            break;
        if (k && steps[k - 1].run) {
            /* the run before ends where this character starts only when
             * this character cannot be white space */
            const unsigned char *a = sets + st.set * 256, *sp = sets + TTI_PAIR_SPACE * 256;
            int overlap = 0;
            for (unsigned b = 0; b < 0x80 && !overlap; b++)
                overlap = a[b] && sp[b];
            if (overlap)
                break;
        }
        i += len;
        if (q == '+') {
            i++;
            if (st.set != TTI_PAIR_SPACE || (i < n && (p[i] == '?' || p[i] == '+'))) {
                steps[k++] = st; /* one character is sure; a lazy or possessive run
                                    is left to PCRE2 */
                break;
            }
            st.run = 1;
        }
        steps[k++] = st;
    }
    return k;
}

/* Checks and compiles one rule; a problem is recorded and TT_OK returned
 * (the caller goes on with the next line); TT_ENOMEM is fatal. */
static tt_status add_rule(tt_watchlist *wl, const char *file, long line, const char *name,
                          size_t name_len, const char *pat, size_t pat_len, const char *note,
                          size_t note_len)
{
    char msg[256];
    if (name_len == 0)
        return problem(wl, file, line, "the rule has no name (expected name<TAB>pattern)");
    if (pat_len == 0)
        return problem(wl, file, line, "rule '%.*s' has no pattern", (int)name_len, name);
    for (size_t i = 0; i < wl->n; i++)
        if (strlen(wl->rules[i].pub.name) == name_len &&
            !memcmp(wl->rules[i].pub.name, name, name_len))
            return problem(wl, file, line, "rule name '%.*s' is used twice (first on line %ld)",
                           (int)name_len, name, wl->rules[i].pub.line);
    if (wl->n >= TT_LIMIT_WATCHLIST_RULES)
        return problem(wl, file, line, "more than %d rules", TT_LIMIT_WATCHLIST_RULES);

    tti_rule r;
    memset(&r, 0, sizeof r);
    r.pub.line = line;
    int nomem = 0, words = wl->opt.whole_words;
    size_t erroff = 0;
    if (pat_len >= 5 && !memcmp(pat, "near(", 5)) {
        size_t a, alen, b, blen, n;
        if (!split_near(pat, pat_len, &a, &alen, &b, &blen, &n, msg, sizeof msg))
            return problem(wl, file, line, "rule '%.*s': %s", (int)name_len, name, msg);
        r.pub.kind = TT_RULE_NEAR;
        r.pub.near_words = n;
        r.a_off = a;
        r.a_len = alen;
        pcre2_code *ca = compile(wl, pat + a, alen, 0, msg, sizeof msg, &erroff, &nomem);
        if (!ca)
            goto bad_a;
        code_free(ca);
        pcre2_code *cb = compile(wl, pat + b, blen, 0, msg, sizeof msg, &erroff, &nomem);
        if (!cb) {
            erroff += b;
            goto bad;
        }
        code_free(cb);
        r.code = compile(wl, pat + a, alen, words, msg, sizeof msg, &erroff, &nomem);
        r.code_b = r.code ? compile(wl, pat + b, blen, words, msg, sizeof msg, &erroff, &nomem)
                          : NULL;
        if (!r.code || !r.code_b)
            goto bad_wrap;
        goto store;
    bad_a:
        erroff += a;
        goto bad;
    }
    r.pub.kind = TT_RULE_PATTERN;
    r.a_off = 0;
    r.a_len = pat_len;
    {
        pcre2_code *c = compile(wl, pat, pat_len, 0, msg, sizeof msg, &erroff, &nomem);
        if (!c)
            goto bad;
        if (!words) {
            r.code = c;
            goto store;
        }
        code_free(c);
        r.code = compile(wl, pat, pat_len, 1, msg, sizeof msg, &erroff, &nomem);
        if (!r.code)
            goto bad_wrap;
    }
store:
    r.pub.name = tt_strndup(name, name_len);
    r.pub.pattern = tt_strndup(pat, pat_len);
    r.pub.note = tt_strndup(note ? note : "", note ? note_len : 0);
    r.alternation_safe = !unsafe_in_alternation(pat + r.a_off, r.a_len);
    /* a pattern that can match the empty string would stop the prefilter
     * at every position: it runs on its own */
    uint32_t min_len = 0;
    if (pcre2_pattern_info(r.code, PCRE2_INFO_MINLENGTH, &min_len) == 0 && min_len == 0)
        r.alternation_safe = 0;
    /* A pattern that must start with a known character is found fastest
     * on its own (the JIT scans for that character with SIMD; an
     * alternation of many such patterns has no single one to look for). */
    uint32_t first = 0;
    r.fast = r.pub.kind == TT_RULE_PATTERN &&
             pcre2_pattern_info(r.code, PCRE2_INFO_FIRSTCODETYPE, &first) == 0 && first == 1;
    r.whole_text = r.fast && whole_text_ok(pat, pat_len);
    if (!r.pub.name || !r.pub.pattern || !r.pub.note)
        goto nomem;
    if (wl->n == wl->cap) {
        size_t cap = wl->cap ? wl->cap * 2 : 16;
        tti_rule *rules = tt_reallocarray(wl->rules, cap, sizeof *rules);
        if (!rules)
            goto nomem;
        wl->rules = rules;
        wl->cap = cap;
    }
    wl->rules[wl->n++] = r;
    return TT_OK;
bad_wrap:
    if (nomem)
        goto nomem;
    code_free(r.code);
    return problem(wl, file, line, "rule '%.*s': the pattern cannot be used for whole words: %s",
                   (int)name_len, name, msg);
bad:
    if (nomem)
        goto nomem;
    return problem(wl, file, line, "rule '%.*s': pattern error at offset %zu: %s", (int)name_len,
                   name, erroff, msg);
nomem:
    tt_free((char *)r.pub.name);
    tt_free((char *)r.pub.pattern);
    tt_free((char *)r.pub.note);
    code_free(r.code);
    code_free(r.code_b);
    return TT_ENOMEM;
}

/* The 16 bits that bytes b0 b1 make when read from memory: the pair
 * table's index, so the scan reads two bytes at once on any byte order. */
static unsigned pair_key(unsigned b0, unsigned b1)
{
    unsigned char two[2] = { (unsigned char)b0, (unsigned char)b1 };
    uint16_t x;
    memcpy(&x, two, 2);
    return x;
}

/* ---- the wide first look -------------------------------------------------- */

/* A rule's (or a bucket's) view at offsets 0 .. TTI_PAIR_PRINT - 1: bit l
 * of lo[j] and bit h of hi[j] for each byte h * 16 + l it may have there. */
typedef struct print {
    uint16_t lo[TTI_PAIR_PRINT], hi[TTI_PAIR_PRINT];
} print;

/* The bytes a match of pr can have at each offset while the bytes before
 * it are ASCII (each then is one character of one step): an NFA over the
 * steps, where a step's character is one byte, a \s+ run one or more, and
 * the offsets after the last step (on any path) take every byte. At offset
 * 0 a byte above ASCII that may start a step's longer character is among
 * them; at later offsets only ASCII bytes are (the first look lets every
 * byte above ASCII through there, search.c). */
static void print_of(const tti_pair_rule *pr, const unsigned char *sets, print *out)
{
    uint32_t at = 1;   /* bit k: the next byte may be step k's first */
    uint32_t cont = 0; /* bit k: the next byte may go on with step k's run */
    int past = 0;      /* the steps may have ended */
    for (size_t j = 0; j < TTI_PAIR_PRINT; j++) {
        at |= cont << 1; /* a run may end before any byte */
        past |= (int)(at >> pr->n_steps & 1);
        out->lo[j] = out->hi[j] = past ? 0xFFFF : 0;
        uint32_t next_at = 0, next_cont = 0;
        for (size_t k = 0; k < pr->n_steps && !past; k++) {
            if (!((at | cont) >> k & 1))
                continue;
            const unsigned char *set = sets + pr->step[k].set * 256;
            for (unsigned b = 0; b < (j ? 0x80u : 256u); b++)
                if (set[b]) {
                    out->lo[j] |= (uint16_t)(1u << (b & 15));
                    out->hi[j] |= (uint16_t)(1u << (b >> 4));
                }
            if (pr->step[k].run)
                next_cont |= 1u << k;
            else if (at >> k & 1)
                next_at |= 1u << (k + 1);
        }
        at = next_at;
        cont = next_cont;
    }
}

/* Rough weights of bytes in English prose, to guess how often a print lets
 * a position through: lower-case letters by their frequency in English
 * text in tenths of a percent (R. Lewand, Cryptological Mathematics, 2000),
 * capitals at a twentieth of that, space, punctuation, digits and line
 * ends in rough proportion, other bytes rare. The weights only steer which
 * rules share a bucket (and so how many positions the first look lets
 * through), never what is found. */
static unsigned byte_weight(unsigned b)
{
    static const unsigned char letter[26] = { 82, 15, 28, 43, 127, 22, 20, 61, 70, 2, 8, 40, 24,
                                              67, 75, 19, 1,  60, 63, 91, 28, 10, 24, 2, 20, 1 };
    if (b >= 'a' && b <= 'z')
        return 20u * letter[b - 'a'];
    if (b >= 'A' && b <= 'Z')
        return letter[b - 'A'];
    if (b == ' ')
        return 3600;
    if (b == ',' || b == '.')
        return 200;
    if (b >= '0' && b <= '9')
        return 60;
    if (b == '\n')
        return 40;
    if (b > 0x20 && b < 0x7F)
        return 20;
    return 1;
}

/* The share of text positions a print lets through, by byte_weight (the
 * offsets taken as independent). */
static double print_share(const print *p, const double *w)
{
    double share = 1;
    for (size_t j = 0; j < TTI_PAIR_PRINT; j++) {
        double s = 0;
        for (unsigned h = 0; h < 16; h++)
            if (p->hi[j] >> h & 1)
                for (unsigned l = 0; l < 16; l++)
                    if (p->lo[j] >> l & 1)
                        s += w[h * 16 + l];
        share *= s;
    }
    return share;
}

static void print_merge(print *into, const print *p)
{
    for (size_t j = 0; j < TTI_PAIR_PRINT; j++) {
        into->lo[j] |= p->lo[j];
        into->hi[j] |= p->hi[j];
    }
}

static int print_cmp(const void *x, const void *y)
{
    return memcmp(x, y, sizeof(print));
}

/* Up to this many groups of rules are merged greedily (a cost matrix of
 * their pairs); more distinct prints are first cut down to it in sorted
 * order, which keeps prints sharing their first offsets together. */
#define PRINT_GROUPS 32

/* The wide first look's tables (see search_internal.h): each pair rule's
 * print (print_of); rules with the same print together; then, while there
 * are more groups than buckets, the two whose merging adds the least
 * expected share of positions let through are merged (greedy; ties to the
 * lowest pair). A bucket's print is the union of its rules' (the nibble
 * tables let through every byte made of a low and a high nibble of the
 * bucket's, a superset). Cost, once per watch-list: a sort of the rules'
 * prints and at most PRINT_GROUPS^2 merge costs of 256 x TTI_PAIR_PRINT
 * additions each, under a millisecond. */
static tt_status build_print(tt_watchlist *wl)
{
    memset(wl->pair_print, 0, sizeof wl->pair_print);
    print *p = tt_calloc(wl->n_pair, sizeof *p);
    if (!p)
        return TT_ENOMEM;
    for (size_t k = 0; k < wl->n_pair; k++)
        print_of(&wl->pair[k], wl->pair_sets, &p[k]);
    qsort(p, wl->n_pair, sizeof *p, print_cmp);
    size_t distinct = 0;
    for (size_t k = 0; k < wl->n_pair; k++)
        if (!distinct || memcmp(&p[k], &p[distinct - 1], sizeof *p))
            p[distinct++] = p[k];
    print group[PRINT_GROUPS];
    size_t n = distinct < PRINT_GROUPS ? distinct : PRINT_GROUPS;
    memset(group, 0, sizeof group);
    for (size_t d = 0; d < distinct; d++)
        print_merge(&group[d * n / distinct], &p[d]);
    tt_free(p);
    double w[256], total = 0;
    for (unsigned b = 0; b < 256; b++)
        total += w[b] = byte_weight(b);
    for (unsigned b = 0; b < 256; b++)
        w[b] /= total;
    double share[PRINT_GROUPS], cost[PRINT_GROUPS][PRINT_GROUPS];
    for (size_t a = 0; a < n; a++)
        share[a] = print_share(&group[a], w);
    for (size_t a = 0; a < n; a++)
        for (size_t b = a + 1; b < n; b++) {
            print m = group[a];
            print_merge(&m, &group[b]);
            cost[a][b] = print_share(&m, w) - share[a] - share[b];
        }
    while (n > TTI_PAIR_BUCKETS) {
        size_t ba = 0, bb = 1;
        for (size_t a = 0; a < n; a++)
            for (size_t b = a + 1; b < n; b++)
                if (cost[a][b] < cost[ba][bb])
                    ba = a, bb = b;
        print_merge(&group[ba], &group[bb]);
        share[ba] = print_share(&group[ba], w);
        /* the last group takes bb's place */
        n--;
        if (bb != n) {
            group[bb] = group[n];
            share[bb] = share[n];
        }
        for (size_t a = 0; a < n; a++)
            for (size_t b = a + 1; b < n; b++)
                if (a == ba || b == ba || a == bb || b == bb) {
                    print m = group[a];
                    print_merge(&m, &group[b]);
                    cost[a][b] = print_share(&m, w) - share[a] - share[b];
                }
    }
    for (size_t g = 0; g < n; g++)
        for (size_t j = 0; j < TTI_PAIR_PRINT; j++)
            for (unsigned x = 0; x < 16; x++) {
                if (group[g].lo[j] >> x & 1)
                    wl->pair_print[j][0][x] |= (unsigned char)(1u << g);
                if (group[g].hi[j] >> x & 1)
                    wl->pair_print[j][1][x] |= (unsigned char)(1u << g);
            }
    return TT_OK;
}

/* The pair scan's rules and tables (see search_internal.h): every pattern
 * rule whose start start_steps can read, compiled anchored, when there are
 * TTI_PAIR_MIN_RULES or more; fewer run faster on their own (whole text or
 * alone: the JIT looks for the first character with SIMD; measured with
 * callgrind on 10 MB of prose, two phrases took 2% more instructions on
 * the pair scan, five 14% fewer). */
static tt_status build_pairs(tt_watchlist *wl)
{
    size_t cand = 0;
    for (size_t i = 0; i < wl->n; i++) {
        const tti_rule *r = &wl->rules[i];
        if (r->pub.kind == TT_RULE_PATTERN && !pair_unsafe(r->pub.pattern, r->a_len))
            cand++;
    }
    if (cand < TTI_PAIR_MIN_RULES)
        return TT_OK;
    wl->pair = tt_calloc(cand, sizeof *wl->pair);
    wl->pair_sets = tt_calloc(TTI_PAIR_SETS, 256);
    if (!wl->pair || !wl->pair_sets)
        return TT_ENOMEM;
    fill_pair_sets(wl->pair_sets, !wl->opt.case_sensitive);
    char msg[128];
    size_t off;
    int nomem = 0;
    for (size_t i = 0; i < wl->n; i++) {
        tti_rule *r = &wl->rules[i];
        if (r->pub.kind != TT_RULE_PATTERN || pair_unsafe(r->pub.pattern, r->a_len))
            continue;
        tti_pair_rule *pr = &wl->pair[wl->n_pair];
        pr->n_steps = start_steps(r->pub.pattern, r->a_len, wl->pair_sets, pr->step);
        if (!pr->n_steps)
            continue;
        r->anchored = compile_with(wl, r->pub.pattern, r->a_len, wl->opt.whole_words,
                                   PCRE2_ANCHORED, msg, sizeof msg, &off, &nomem);
        if (nomem)
            return TT_ENOMEM;
        if (!r->anchored)
            continue;
        pr->rule = i;
        r->paired = 1;
        wl->n_pair++;
    }
    if (wl->n_pair < TTI_PAIR_MIN_RULES) {
        for (size_t k = 0; k < wl->n_pair; k++) {
            tti_rule *r = &wl->rules[wl->pair[k].rule];
            code_free(r->anchored);
            r->anchored = NULL;
            r->paired = 0;
        }
        wl->n_pair = 0;
        tt_free(wl->pair);
        tt_free(wl->pair_sets);
        wl->pair = NULL;
        wl->pair_sets = NULL;
        return TT_OK;
    }
    size_t words = (wl->n_pair + 63) / 64;
    wl->pair_words = words;
    wl->pair_at = tt_calloc((size_t)TTI_PAIR_FIXED * 256 * words, sizeof *wl->pair_at);
    wl->pair_after = tt_calloc((size_t)TTI_PAIR_FIXED * 257 * words, sizeof *wl->pair_after);
    wl->pair_table = tt_calloc(65536, 1);
    if (!wl->pair_at || !wl->pair_after || !wl->pair_table)
        return TT_ENOMEM;
    for (size_t k = 0; k < wl->n_pair; k++) {
        tti_pair_rule *pr = &wl->pair[k];
        uint64_t bit = (uint64_t)1 << (k % 64);
        /* byte j is step j's first byte while no step before it is a run
         * (and the bytes before it are ASCII, which search.c sees to) */
        size_t fixed = 0;
        while (fixed < pr->n_steps && fixed < TTI_PAIR_FIXED && (!fixed || !pr->step[fixed - 1].run))
            fixed++;
        pr->fixed = fixed && pr->step[fixed - 1].run ? fixed - 1 : fixed;
        /* a run at offset r followed by a character: that character's
         * first bytes after the run */
        for (size_t r = 0; r < TTI_PAIR_FIXED; r++) {
            int here = r > 0 && r == pr->fixed && r < fixed && r + 1 < pr->n_steps;
            if (here && words == 1)
                wl->pair_run_rules |= bit;
            const unsigned char *set = here ? wl->pair_sets + pr->step[r + 1].set * 256 : NULL;
            uint64_t *after = wl->pair_after + r * 257 * words + k / 64;
            for (unsigned b = 0; b < 257; b++)
                if (!here || (b < 256 && set[b]))
                    after[b * words] |= bit;
        }
        for (size_t j = 0; j < TTI_PAIR_FIXED; j++) {
            const unsigned char *set = j < fixed ? wl->pair_sets + pr->step[j].set * 256 : NULL;
            uint64_t *at = wl->pair_at + j * 256 * words + k / 64;
            for (unsigned b = 0; b < 256; b++)
                if (!set || set[b])
                    at[b * words] |= bit;
        }
    }
    /* the scan's first look: some rule has b0 at offset 0 and, when b0 is
     * ASCII, b1 at offset 1 */
    for (unsigned b0 = 0; b0 < 256; b0++)
        for (unsigned b1 = 0; b1 < 256; b1++) {
            const uint64_t *f = wl->pair_at + b0 * words, *g = wl->pair_at + (256 + b1) * words;
            for (size_t w = 0; w < words; w++)
                if (b0 >= 0x80 ? f[w] != 0 : (f[w] & g[w]) != 0) {
                    wl->pair_table[pair_key(b0, b1)] = 1;
                    break;
                }
        }
    /* the keys of the SIMD first look (see search_internal.h) */
    size_t keys = 0;
    int simd = 1;
    for (unsigned b0 = 0; b0 < 256 && simd; b0++) {
        int used = 0;
        for (unsigned b1 = 0; b1 < 256 && !used; b1++)
            used = wl->pair_table[pair_key(b0, b1)];
        if (!used)
            continue;
        if (b0 < 0x21 || b0 >= 0x80) {
            wl->pair_low = 1;
            continue;
        }
        unsigned char f = (unsigned char)(b0 | 0x20);
        size_t j = 0;
        while (j < keys && wl->pair_first[j] != f)
            j++;
        if (j < keys)
            continue;
        if (keys == TTI_PAIR_KEYS)
            simd = 0;
        else
            wl->pair_first[keys++] = f;
    }
    /* unused keys repeat a used one (or, with none, match nothing: a
     * control byte, which a first look with low takes anyway) */
    for (size_t j = keys; j < TTI_PAIR_KEYS; j++)
        wl->pair_first[j] = keys ? wl->pair_first[0] : 0x01;
    wl->pair_simd = simd;
    return build_print(wl);
}

/* The prefilter alternation over the rules that can take part, and each
 * rule's list (see search_internal.h): without a prefilter every rule is in
 * `always`. */
static tt_status build_prefilter(tt_watchlist *wl)
{
    code_free(wl->prefilter);
    wl->prefilter = NULL;
    tt_free(wl->always);
    tt_free(wl->scan);
    tt_free(wl->gated);
    tt_free(wl->whole);
    wl->n_always = wl->n_scan = wl->n_gated = wl->n_whole = 0;
    tt_free(wl->pair);
    tt_free(wl->pair_sets);
    tt_free(wl->pair_at);
    tt_free(wl->pair_after);
    tt_free(wl->pair_table);
    wl->pair = NULL;
    wl->pair_sets = NULL;
    wl->pair_at = NULL;
    wl->pair_after = NULL;
    wl->pair_table = NULL;
    wl->n_pair = wl->pair_words = 0;
    wl->pair_run_rules = 0;
    wl->pair_simd = wl->pair_low = 0;
    size_t cap = wl->n ? wl->n : 1;
    wl->always = tt_calloc(cap, sizeof *wl->always);
    wl->scan = tt_calloc(cap, sizeof *wl->scan);
    wl->gated = tt_calloc(cap, sizeof *wl->gated);
    wl->whole = tt_calloc(cap, sizeof *wl->whole);
    if (!wl->always || !wl->scan || !wl->gated || !wl->whole)
        return TT_ENOMEM;
    for (size_t i = 0; i < wl->n; i++) {
        code_free(wl->rules[i].anchored);
        wl->rules[i].anchored = NULL;
        wl->rules[i].paired = 0;
    }
    tt_status st = build_pairs(wl);
    if (st)
        return st;
    tt_buf alt;
    tt_buf_init(&alt, 0);
    size_t members = 0;
    for (size_t i = 0; i < wl->n && !st; i++) {
        const tti_rule *r = &wl->rules[i];
        if (!r->alternation_safe || r->fast || r->paired)
            continue;
        if (members++)
            st = tt_buf_putc(&alt, '|');
        if (!st) st = tt_buf_puts(&alt, "(?:");
        if (!st) st = tt_buf_append(&alt, r->pub.pattern + r->a_off, r->a_len);
        if (!st) st = tt_buf_putc(&alt, ')');
    }
    char msg[128];
    size_t off;
    int nomem = 0, jit = wl->jit;
    if (!st && members > 1) {
        /* one rule alone needs no prefilter: the rule is its own */
        wl->prefilter = compile(wl, alt.data, alt.len, 0, msg, sizeof msg, &off, &nomem);
        if (nomem)
            st = TT_ENOMEM;
    }
    tt_buf_release(&alt);
    for (size_t i = 0; i < wl->n && !st; i++) {
        tti_rule *r = &wl->rules[i];
        if (r->paired) {
            continue;
        } else if (r->whole_text) {
            wl->whole[wl->n_whole++] = i;
        } else if (!wl->prefilter || !r->alternation_safe || r->fast) {
            wl->always[wl->n_always++] = i;
        } else if (r->pub.kind == TT_RULE_NEAR) {
            wl->gated[wl->n_gated++] = i;
        } else {
            r->anchored = compile_with(wl, r->pub.pattern, r->a_len, wl->opt.whole_words,
                                       PCRE2_ANCHORED, msg, sizeof msg, &off, &nomem);
            if (r->anchored)
                wl->scan[wl->n_scan++] = i;
            else if (nomem)
                st = TT_ENOMEM;
            else
                wl->always[wl->n_always++] = i;
        }
    }
    wl->jit = jit; /* the prefilter's JIT does not change what the rules use */
    return st;
}

static void finish_hash(tt_watchlist *wl)
{
    tt_sha256 h = wl->hash; /* a copy: more rules may be added later */
    unsigned char d[32];
    tt_sha256_final(&h, d);
    static const char hex[] = "0123456789abcdef";
    for (int i = 0; i < 32; i++) {
        wl->sha256[2 * i] = hex[d[i] >> 4];
        wl->sha256[2 * i + 1] = hex[d[i] & 15];
    }
    wl->sha256[64] = '\0';
}

static tt_status finish(tt_watchlist *wl, tt_error *err)
{
    finish_hash(wl);
    if (wl->problems_total) {
        if (err)
            *err = wl->problems[0];
        return TT_EPARSE;
    }
    return build_prefilter(wl) ? tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory")
                               : TT_OK;
}

tt_status tt_watchlist_parse(tt_watchlist *wl, const char *text, size_t len, const char *name,
                             tt_error *err)
{
    const char *file = name ? name : "";
    tt_sha256_update(&wl->hash, text, len);
    size_t pos = 0;
    long line = 0;
    size_t rules_before = wl->n;
    if (len >= 3 && !memcmp(text, "\xEF\xBB\xBF", 3))
        pos = 3;
    while (pos < len) {
        line++;
        const char *l = text + pos;
        const char *nl = memchr(l, '\n', len - pos);
        size_t n = nl ? (size_t)(nl - l) : len - pos;
        pos += n + (nl ? 1 : 0);
        if (n && l[n - 1] == '\r')
            n--;
        if (n > TT_LIMIT_WATCHLIST_LINE) {
            if (problem(wl, file, line, "line longer than %d bytes", TT_LIMIT_WATCHLIST_LINE))
                goto nomem;
            continue;
        }
        /* valid UTF-8, no control characters but TAB */
        size_t bad = (size_t)-1;
        int ctrl = 0;
        for (size_t i = 0; i < n;) {
            unsigned char c = (unsigned char)l[i];
            if (c < 0x80) {
                if ((c < 0x20 && c != '\t') || c == 0x7F) {
                    bad = i;
                    ctrl = 1;
                    break;
                }
                i++;
                continue;
            }
            uint32_t cp;
            size_t k = tti_utf8_decode((const unsigned char *)l + i, n - i, &cp);
            if (cp == 0xFFFD && !(k == 3 && (unsigned char)l[i] == 0xEF)) {
                bad = i;
                break;
            }
            i += k;
        }
        if (bad != (size_t)-1) {
            if (problem(wl, file, line, ctrl ? "control character (byte 0x%02X) at column %zu"
                                             : "invalid UTF-8 (byte 0x%02X) at column %zu",
                        (unsigned char)l[bad], bad + 1))
                goto nomem;
            continue;
        }
        size_t s = 0;
        while (s < n && (l[s] == ' ' || l[s] == '\t'))
            s++;
        if (s == n || l[s] == '#')
            continue;
        const char *tab1 = memchr(l, '\t', n);
        if (!tab1) {
            if (problem(wl, file, line, "expected name<TAB>pattern[<TAB>note], found no tab"))
                goto nomem;
            continue;
        }
        const char *f2 = tab1 + 1;
        size_t rest = n - (size_t)(f2 - l);
        const char *tab2 = memchr(f2, '\t', rest);
        const char *note = NULL;
        size_t note_len = 0, pat_len = tab2 ? (size_t)(tab2 - f2) : rest;
        if (tab2) {
            note = tab2 + 1;
            note_len = n - (size_t)(note - l);
            if (memchr(note, '\t', note_len)) {
                if (problem(wl, file, line, "more than three tab-separated fields"))
                    goto nomem;
                continue;
            }
        }
        /* the name without surrounding blanks; the pattern as written */
        const char *nm = l;
        size_t nm_len = (size_t)(tab1 - l);
        while (nm_len && *nm == ' ') {
            nm++;
            nm_len--;
        }
        while (nm_len && nm[nm_len - 1] == ' ')
            nm_len--;
        if (add_rule(wl, file, line, nm, nm_len, f2, pat_len, note, note_len))
            goto nomem;
    }
    if (wl->n == rules_before && !wl->problems_total &&
        problem(wl, file, 0, "the watch-list holds no rule"))
        goto nomem;
    return finish(wl, err);
nomem:
    return tt_error_set(err, TT_ENOMEM, file, -1, "out of memory");
}

tt_status tt_watchlist_load(tt_watchlist *wl, const char *path, tt_error *err)
{
    tt_buf b;
    tt_buf_init(&b, TT_LIMIT_WATCHLIST_BYTES);
    FILE *f = fopen(path, "rb");
    if (!f) {
        int e = errno;
        tt_buf_release(&b);
        return tt_error_set(err, e == ENOENT ? TT_ENOENT : TT_EIO, path, -1, "%s", strerror(e));
    }
    char piece[65536];
    size_t n;
    tt_status st = TT_OK;
    while (!st && (n = fread(piece, 1, sizeof piece, f)) > 0)
        st = tt_buf_append(&b, piece, n);
    int bad = ferror(f);
    fclose(f);
    if (st == TT_ELIMIT)
        st = tt_error_set(err, st, path, -1, "watch-list larger than %zu bytes",
                          (size_t)TT_LIMIT_WATCHLIST_BYTES);
    else if (st)
        st = tt_error_set(err, st, path, -1, "out of memory");
    else if (bad)
        st = tt_error_set(err, TT_EIO, path, -1, "read error");
    else
        st = tt_watchlist_parse(wl, b.data, b.len, path, err);
    tt_buf_release(&b);
    return st;
}

tt_status tt_watchlist_add(tt_watchlist *wl, const char *name, const char *pattern,
                           const char *note, tt_error *err)
{
    size_t pl = strlen(pattern);
    tt_sha256_update(&wl->hash, pattern, pl);
    tt_sha256_update(&wl->hash, "\n", 1);
    for (size_t i = 0; i < pl; i++)
        if ((unsigned char)pattern[i] < 0x20 || pattern[i] == 0x7F) {
            if (problem(wl, "", 0, "pattern holds a control character"))
                return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
            return finish(wl, err);
        }
    if (add_rule(wl, "", 0, name, strlen(name), pattern, pl, note, note ? strlen(note) : 0))
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    return finish(wl, err);
}
