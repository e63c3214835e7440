/* termtide — the extract stage for HTML, XHTML and inline XBRL: blocks of
 * clean text through libxml2's HTML parser.
 *
 * Shape. libxml2's HTML parser runs in SAX mode over the whole document: it
 * tokenizes, repairs the markup (implied and auto-closed elements), decodes
 * every named and numeric character reference, and calls back for each
 * start tag, end tag and run of text. No tree is built and nothing recurses
 * on depth, so memory is the current block plus libxml2's copy of the input.
 * Each callback costs O(1) beyond the text it appends and the attributes it
 * checks.
 *
 * Depth comes from libxml2's own element stack (ctxt->nameNr) rather than
 * from counting callbacks: libxml2 sometimes pops an element without an end
 * callback (an unterminated start tag), and a counter would then drift and,
 * say, skip the rest of the document after a hidden <div>. Per depth we keep
 * the element's block flag and the block kind in force, in fixed arrays of
 * TT_LIMIT_HTML_DEPTH entries: when an element would open deeper than the
 * limit, the parse is stopped (xmlStopParser) and TT_ELIMIT returned.
 * libxml2 2.9 has no depth guard of its own in the HTML parser, and its
 * end-tag matching scans the element stack, so a 100,000-deep document with
 * mismatched end tags costs it quadratic time; stopping at the limit bounds
 * both.
 *
 * Text. Block elements end the current block at their start and end, so
 * "<td>net</td><td>loss</td>" is two blocks; inline elements (span, b, font,
 * a, ix:*) do not, so "<b>Reve</b>nue" stays one word. White space runs
 * (ASCII and U+00A0) become one space inside a block, trimmed at its ends.
 * A block's kind is that of its innermost heading, cell or item element;
 * generic blocks (p, div, ...) inherit the enclosing kind, so the <p> inside
 * a <td> still yields a cell. Dropped subtrees (script, style, head, title,
 * template, noscript, svg, ix:header, the `hidden` attribute, a style with
 * display:none, and <table> under drop_tables) are skipped from their start
 * until libxml2's stack falls back below them.
 *
 * Offsets. When a block gets its first visible character, the parser's
 * cursor (xmlByteConsumed: bytes consumed, exact and O(1) with no encoding
 * converter, which is our case) sits at or just before the end of the run
 * just delivered; libxml2 2.9 flushes text in 1000-byte pieces before
 * stepping over the last character. So the run's start is found by
 * comparing the delivered bytes with the input at cursor - len + 0..4. When
 * the run does not match the input verbatim (a character reference), the
 * offset falls back to the cursor after the previous callback, past a '>'
 * and white space: the start of the reference. Best effort; the HTML parser
 * keeps CR LF as it is, so line endings do not shift it.
 *
 * Input hygiene. The input is meant to be valid UTF-8 without NUL (the decode
 * stage guarantees it). libxml2 2.9 misbehaves otherwise: on a byte that is
 * not UTF-8 it re-reads the rest of the document as Latin-1, and a NUL in the
 * first four bytes makes it guess UTF-16. So one fast pre-pass (8 bytes at a
 * time while ASCII) checks the input, and only if it finds such a byte is a
 * copy made with each NUL or invalid byte replaced by a space: same length,
 * so offsets stay exact.
 *
 * libxml2 options: HTML_PARSE_NONET (no network), NOERROR and NOWARNING (no
 * printing), RECOVER; not HUGE. IGNORE_ENC, and the encoding set to UTF-8
 * before parsing, so a <meta charset=windows-1252> cannot re-decode text that
 * is already UTF-8. The HTML parser never loads external entities or DTDs.
 * Errors go to a structured handler on the context (counted, never
 * printed), and the thread's generic error function is silenced.
 *
 * Known cost outside our reach: libxml2 2.9 checks each attribute of a start
 * tag against all the earlier ones, so one tag with 50,000 distinct
 * attributes takes about 3 s (quadratic), and no callback runs before the
 * tag is complete.
 *
 * libxml2 is loaded (dlopen) the first time an HTML document comes, not
 * when the program starts: with ICU and the C++ runtime it brings, loading
 * it took 3 ms of every run (a program linking the same libraries started
 * in 8.1 ms with it and 5.1 ms without), which a run over plain text never
 * used. The few functions called go through a table filled from dlsym,
 * with the headers' own prototypes. If the library cannot be loaded, each
 * HTML document fails with the loader's message.
 *
 * Threads: loading and xmlInitParser() run once through pthread_once; each
 * call has its own parser context, so calls on different threads are
 * independent.
 * libxml2 allocates through its own hooks (malloc), not tt_malloc; an
 * out-of-memory inside libxml2 is reported as TT_ENOMEM when libxml2 says
 * so (ctxt->errNo). */
#include <dlfcn.h>
#include <limits.h>
#include <pthread.h>
#include <stdint.h>
#include <stdio.h>

#include <libxml/HTMLparser.h>
#include <libxml/parser.h>
#include <libxml/parserInternals.h>
#include <libxml/xmlerror.h>

#include "termtide/extract.h"
#include "tt_internal.h"

/* libxml2's functions, from dlsym (see the top of the file). */
static struct {
    __typeof__(xmlInitParser) *InitParser;
    __typeof__(xmlThrDefSetGenericErrorFunc) *ThrDefSetGenericErrorFunc;
    __typeof__(xmlSetGenericErrorFunc) *SetGenericErrorFunc;
    __typeof__(htmlCreateMemoryParserCtxt) *CreateMemoryParserCtxt;
    __typeof__(htmlCtxtUseOptions) *CtxtUseOptions;
    __typeof__(xmlSwitchEncoding) *SwitchEncoding;
    __typeof__(htmlParseDocument) *ParseDocument;
    __typeof__(htmlFreeParserCtxt) *FreeParserCtxt;
    __typeof__(xmlByteConsumed) *ByteConsumed;
    __typeof__(xmlStopParser) *StopParser;
} xml;
static char xml_missing[256]; /* why libxml2 could not be loaded ("" when it was) */

/* htmlCreateMemoryParserCtxt takes an int size; documents are capped first. */
_Static_assert(TT_LIMIT_FILE_BYTES <= (size_t)INT_MAX, "document size must fit an int");

/* ---- element rules ---------------------------------------------------- */

enum {
    EL_BLOCK = 1, /* ends the current block at its start and end */
    EL_DROP = 2,  /* its whole subtree is left out */
    EL_TABLE = 4  /* left out under drop_tables */
};

#define KIND_INHERIT 0xFF

typedef struct element_rule {
    const char *name; /* as libxml2 reports it: lower case */
    unsigned char flags;
    unsigned char kind; /* tt_block_kind, or KIND_INHERIT */
} element_rule;

/* Sorted by name (strcmp) for bsearch. Beyond the elements that must break
 * words, a few more block-level ones are listed: a needless break costs
 * nothing, a missing one glues two words. */
static const element_rule element_rules[] = {
    { "address", EL_BLOCK, KIND_INHERIT },
    { "article", EL_BLOCK, KIND_INHERIT },
    { "aside", EL_BLOCK, KIND_INHERIT },
    { "blockquote", EL_BLOCK, KIND_INHERIT },
    { "body", EL_BLOCK, KIND_INHERIT },
    { "br", EL_BLOCK, KIND_INHERIT },
    { "caption", EL_BLOCK, KIND_INHERIT },
    { "center", EL_BLOCK, KIND_INHERIT },
    { "dd", EL_BLOCK, TT_BLOCK_ITEM },
    { "details", EL_BLOCK, KIND_INHERIT },
    { "dialog", EL_BLOCK, KIND_INHERIT },
    { "dir", EL_BLOCK, KIND_INHERIT },
    { "div", EL_BLOCK, KIND_INHERIT },
    { "dl", EL_BLOCK, KIND_INHERIT },
    { "dt", EL_BLOCK, TT_BLOCK_ITEM },
    { "fieldset", EL_BLOCK, KIND_INHERIT },
    { "figcaption", EL_BLOCK, KIND_INHERIT },
    { "figure", EL_BLOCK, KIND_INHERIT },
    { "footer", EL_BLOCK, KIND_INHERIT },
    { "form", EL_BLOCK, KIND_INHERIT },
    { "h1", EL_BLOCK, TT_BLOCK_HEADING },
    { "h2", EL_BLOCK, TT_BLOCK_HEADING },
    { "h3", EL_BLOCK, TT_BLOCK_HEADING },
    { "h4", EL_BLOCK, TT_BLOCK_HEADING },
    { "h5", EL_BLOCK, TT_BLOCK_HEADING },
    { "h6", EL_BLOCK, TT_BLOCK_HEADING },
    { "head", EL_BLOCK | EL_DROP, KIND_INHERIT },
    { "header", EL_BLOCK, KIND_INHERIT },
    { "hgroup", EL_BLOCK, KIND_INHERIT },
    { "hr", EL_BLOCK, KIND_INHERIT },
    { "html", EL_BLOCK, KIND_INHERIT },
    { "ix:header", EL_BLOCK | EL_DROP, KIND_INHERIT },
    { "legend", EL_BLOCK, KIND_INHERIT },
    { "li", EL_BLOCK, TT_BLOCK_ITEM },
    { "main", EL_BLOCK, KIND_INHERIT },
    { "menu", EL_BLOCK, KIND_INHERIT },
    { "nav", EL_BLOCK, KIND_INHERIT },
    { "noscript", EL_DROP, KIND_INHERIT },
    { "ol", EL_BLOCK, KIND_INHERIT },
    { "option", EL_BLOCK, KIND_INHERIT },
    { "p", EL_BLOCK, KIND_INHERIT },
    { "pre", EL_BLOCK, KIND_INHERIT },
    { "script", EL_DROP, KIND_INHERIT },
    { "section", EL_BLOCK, KIND_INHERIT },
    { "style", EL_DROP, KIND_INHERIT },
    { "summary", EL_BLOCK, KIND_INHERIT },
    { "svg", EL_DROP, KIND_INHERIT },
    { "table", EL_BLOCK | EL_TABLE, KIND_INHERIT },
    { "tbody", EL_BLOCK, KIND_INHERIT },
    { "td", EL_BLOCK, TT_BLOCK_CELL },
    { "template", EL_DROP, KIND_INHERIT },
    { "tfoot", EL_BLOCK, KIND_INHERIT },
    { "th", EL_BLOCK, TT_BLOCK_CELL },
    { "thead", EL_BLOCK, KIND_INHERIT },
    { "title", EL_DROP, KIND_INHERIT },
    { "tr", EL_BLOCK, KIND_INHERIT },
    { "ul", EL_BLOCK, KIND_INHERIT },
};

static int rule_cmp(const void *key, const void *elem)
{
    return strcmp((const char *)key, ((const element_rule *)elem)->name);
}

static const element_rule *find_rule(const char *name)
{
    return bsearch(name, element_rules, sizeof element_rules / sizeof element_rules[0],
                   sizeof element_rules[0], rule_cmp);
}

/* Case-insensitive ASCII comparison of s[0..n) with a lower-case word. */
static int word_is(const char *s, size_t n, const char *lower)
{
    size_t i = 0;
    for (; i < n && lower[i]; i++)
        if (tti_ascii_lower((unsigned char)s[i]) != lower[i])
            return 0;
    return i == n && lower[i] == '\0';
}

/* An inline style with a declaration "display: none" (any case, any white
 * space, "!important" allowed). A plain declaration scanner: properties are
 * separated by ';', the name ends at ':'. */
static int style_hides(const char *v)
{
    const char *p = v;
    while (*p) {
        while (*p == ';' || tti_is_ascii_space((unsigned char)*p))
            p++;
        const char *prop = p;
        while (*p && *p != ':' && *p != ';')
            p++;
        const char *prop_end = p;
        while (prop_end > prop && tti_is_ascii_space((unsigned char)prop_end[-1]))
            prop_end--;
        if (*p != ':')
            continue;
        p++;
        while (tti_is_ascii_space((unsigned char)*p))
            p++;
        const char *val = p;
        while (tti_is_ascii_alpha((unsigned char)*p) || *p == '-')
            p++;
        if (word_is(prop, (size_t)(prop_end - prop), "display") &&
            word_is(val, (size_t)(p - val), "none") &&
            (*p == '\0' || *p == ';' || *p == '!' || tti_is_ascii_space((unsigned char)*p)))
            return 1;
        while (*p && *p != ';')
            p++;
    }
    return 0;
}

static int attributes_hide(const xmlChar **atts)
{
    if (!atts)
        return 0;
    for (size_t i = 0; atts[i]; i += 2) {
        const char *attr = (const char *)atts[i];
        const char *val = (const char *)atts[i + 1];
        if (attr[0] == 'h' && strcmp(attr, "hidden") == 0)
            return 1;
        if (attr[0] == 's' && val && strcmp(attr, "style") == 0 && style_hides(val))
            return 1;
    }
    return 0;
}

/* ---- parser state ------------------------------------------------------ */

typedef struct html_state {
    htmlParserCtxtPtr ctxt;
    const unsigned char *src; /* the (possibly repaired) input */
    size_t src_len;
    long long src_base;
    int drop_tables;
    tt_blocks *out;

    tt_buf block;           /* the current block's normalized text */
    tt_block_kind block_kind;
    long long block_src;    /* its first visible byte, -1 before any */
    int pending_space;      /* white space seen since the last character */

    int skip_depth;         /* depth of the dropped element, 0 when none */
    long prev_pos;          /* parser cursor after the previous callback */

    tt_status status;       /* first failure; parsing stops at it */
    int stopped;
    int too_deep;           /* the failure is TT_LIMIT_HTML_DEPTH */
    int parsing;            /* inside htmlParseDocument */
    long long stop_offset;
    size_t repaired;

    /* The rule of each recent element name, in a slot chosen by the name's
     * address (libxml2 hands out names interned in its dictionary, so a
     * name keeps its slot) and checked against a copy of the name, so a
     * name that is not interned is still looked up right. */
    struct {
        char name[16]; /* "" when empty */
        const element_rule *rule;
    } rule_cache[64];

    unsigned char is_block[TT_LIMIT_HTML_DEPTH + 1]; /* per open depth */
    unsigned char kind_at[TT_LIMIT_HTML_DEPTH + 1];
} html_state;

static void stop(html_state *s, tt_status st)
{
    if (s->stopped)
        return;
    s->stopped = 1;
    s->status = st;
    s->stop_offset = xml.ByteConsumed(s->ctxt);
    if (s->parsing)
        xml.StopParser(s->ctxt);
}

/* The element depth libxml2 is at, clamped to the arrays. */
static int current_depth(const html_state *s)
{
    int d = s->ctxt->nameNr;
    if (d < 0)
        return 0;
    return d > TT_LIMIT_HTML_DEPTH ? TT_LIMIT_HTML_DEPTH : d;
}

static void end_block(html_state *s)
{
    if (s->block.len) {
        tt_status st = tt_blocks_add(s->out, s->block_kind, s->block.data, s->block.len,
                                     s->block_src);
        if (st)
            stop(s, st);
        tt_buf_reset(&s->block);
    }
    s->pending_space = 0;
    s->block_src = -1;
}

/* Where in the input the delivered run t[0..len) starts, plus k. */
static long long text_offset(const html_state *s, const unsigned char *t, size_t len, size_t k)
{
    long end = xml.ByteConsumed(s->ctxt);
    if (end >= 0) {
        /* A text run is delivered verbatim (references come as runs of
         * their own), so comparing its first bytes up to the block's first
         * character tells the candidate positions apart. */
        size_t cmp = k + 32 < len ? k + 32 : len;
        for (size_t d = 0; d <= 4; d++) {
            if ((size_t)end + d < len)
                continue;
            size_t start = (size_t)end + d - len;
            if (start + len > s->src_len)
                break;
            if (memcmp(s->src + start, t, cmp) == 0)
                return s->src_base + (long long)(start + k);
        }
    }
    /* A character reference: it starts where the previous callback left
     * the cursor, after the '>' of a start tag and any white space. */
    if (s->prev_pos < 0)
        return -1;
    size_t p = (size_t)s->prev_pos;
    size_t stop_at = end >= 0 && (size_t)end <= s->src_len ? (size_t)end : s->src_len;
    if (p < stop_at && s->src[p] == '>')
        p++;
    while (p < stop_at && tti_is_ascii_space(s->src[p]))
        p++;
    return s->src_base + (long long)p;
}

/* Byte classes for white-space collapsing (locale-free): ASCII white space
 * as tti_is_ascii_space, and 0xC2, which starts U+00A0 when 0xA0 follows. */
enum { B_TEXT = 0, B_SPACE, B_C2 };
static const unsigned char byte_class[256] = {
    ['\t'] = B_SPACE, ['\n'] = B_SPACE, ['\v'] = B_SPACE, ['\f'] = B_SPACE,
    ['\r'] = B_SPACE, [' '] = B_SPACE,   [0xC2] = B_C2,
};

static int is_nbsp(const unsigned char *t, size_t i, size_t len)
{
    return t[i] == 0xC2 && i + 1 < len && t[i + 1] == 0xA0;
}

static void append_text(html_state *s, const unsigned char *t, size_t len, int depth)
{
    size_t i = 0;
    while (i < len) {
        unsigned c = byte_class[t[i]];
        if (c == B_SPACE) {
            s->pending_space = 1;
            i++;
            continue;
        }
        if (c == B_C2 && is_nbsp(t, i, len)) {
            s->pending_space = 1;
            i += 2;
            continue;
        }
        /* A run of words: the single spaces between them are already
         * normalized and copied as they are. */
        size_t j = i + 1;
        while (j < len) {
            unsigned k = byte_class[t[j]];
            if (k == B_TEXT)
                j++;
            else if (t[j] == ' ' && j + 1 < len && byte_class[t[j + 1]] == B_TEXT)
                j += 2;
            else if (k == B_C2 && !is_nbsp(t, j, len))
                j++;
            else
                break;
        }
        tt_status st = TT_OK;
        if (s->block.len == 0) {
            s->block_src = text_offset(s, t, len, i);
            s->block_kind = (tt_block_kind)s->kind_at[depth];
        } else if (s->pending_space) {
            st = tt_buf_putc(&s->block, ' ');
        }
        s->pending_space = 0;
        if (!st)
            st = tt_buf_append(&s->block, t + i, j - i);
        if (st) {
            stop(s, st);
            return;
        }
        i = j;
    }
}

static const element_rule *cached_rule(html_state *s, const char *name)
{
    size_t n = sizeof s->rule_cache / sizeof s->rule_cache[0];
    size_t slot = ((uintptr_t)name >> 3) % n;
    if (s->rule_cache[slot].name[0] && strcmp(s->rule_cache[slot].name, name) == 0)
        return s->rule_cache[slot].rule;
    const element_rule *r = find_rule(name);
    size_t len = strlen(name);
    if (len < sizeof s->rule_cache[slot].name) {
        memcpy(s->rule_cache[slot].name, name, len + 1);
        s->rule_cache[slot].rule = r;
    }
    return r;
}

/* ---- SAX callbacks ----------------------------------------------------- */

static void on_start(void *user, const xmlChar *name, const xmlChar **atts)
{
    html_state *s = user;
    if (s->stopped)
        return;
    /* libxml2 has pushed the element before calling us. */
    int d = s->ctxt->nameNr;
    if (d > TT_LIMIT_HTML_DEPTH) {
        s->too_deep = 1;
        stop(s, TT_ELIMIT);
        return;
    }
    if (d < 1)
        d = 1;
    /* The dropped element was popped without an end callback. */
    if (s->skip_depth && d <= s->skip_depth)
        s->skip_depth = 0;

    const element_rule *r = cached_rule(s, (const char *)name);
    unsigned flags = r ? r->flags : 0;
    s->is_block[d] = (flags & EL_BLOCK) != 0;
    s->kind_at[d] = (r && r->kind != KIND_INHERIT) ? r->kind : s->kind_at[d - 1];

    if (!s->skip_depth) {
        if (flags & EL_BLOCK)
            end_block(s);
        if ((flags & EL_DROP) || ((flags & EL_TABLE) && s->drop_tables) ||
            attributes_hide(atts))
            s->skip_depth = d;
    }
    s->prev_pos = xml.ByteConsumed(s->ctxt);
}

static void on_end(void *user, const xmlChar *name)
{
    html_state *s = user;
    (void)name; /* the depth says which element ends */
    if (s->stopped)
        return;
    /* libxml2 pops the element after calling us. */
    int d = current_depth(s);
    if (s->skip_depth) {
        if (d > s->skip_depth) {
            s->prev_pos = xml.ByteConsumed(s->ctxt);
            return;
        }
        s->skip_depth = 0;
    }
    if (d >= 1 && s->is_block[d])
        end_block(s);
    s->prev_pos = xml.ByteConsumed(s->ctxt);
}

static void on_text(void *user, const xmlChar *text, int len)
{
    html_state *s = user;
    if (s->stopped)
        return;
    int d = current_depth(s);
    if (s->skip_depth && d < s->skip_depth)
        s->skip_depth = 0;
    if (!s->skip_depth && len > 0)
        append_text(s, text, (size_t)len, d);
    s->prev_pos = xml.ByteConsumed(s->ctxt);
}

/* Comments and processing instructions only move the cursor. */
static void on_comment(void *user, const xmlChar *value)
{
    html_state *s = user;
    (void)value;
    if (!s->stopped)
        s->prev_pos = xml.ByteConsumed(s->ctxt);
}

static void on_pi(void *user, const xmlChar *target, const xmlChar *data)
{
    (void)target;
    (void)data;
    on_comment(user, NULL);
}

/* libxml2 reports each problem it recovers from here, never on stderr. The
 * ones that mean broken tag structure are counted as repairs: end tags that
 * match no open element or close across another, misplaced html/head/body,
 * start or end tags left unterminated. libxml2 2.9 closes elements left open
 * at the end of the document, or implied closed by a later tag, silently,
 * so those are not counted. Unknown tag names (every ix: tag) are not
 * problems. */
static void on_error(void *user, xmlErrorPtr e)
{
    html_state *s = user;
    if (!e)
        return;
    switch (e->code) {
    case XML_ERR_TAG_NAME_MISMATCH:
    case XML_ERR_TAG_NOT_FINISHED:
    case XML_ERR_GT_REQUIRED:
    case XML_ERR_LTSLASH_REQUIRED:
    case XML_HTML_STRUCURE_ERROR:
        s->repaired++;
        break;
    default:
        break;
    }
}

static void silent_generic_error(void *ctx, const char *msg, ...)
{
    (void)ctx;
    (void)msg;
}

#ifndef TT_LIBXML2_SONAME
#define TT_LIBXML2_SONAME "libxml2.so.2"
#endif


static pthread_once_t libxml_once = PTHREAD_ONCE_INIT;

/* Each function by name; a POSIX cast from the object pointer dlsym
 * returns, through memcpy so that ISO C's pedantry has nothing to say. */
#define XML_SYM(field, name)                                                       \
    do {                                                                           \
        void *f = dlsym(lib, name);                                                \
        if (!f) {                                                                  \
            snprintf(xml_missing, sizeof xml_missing, "%s has no %s", TT_LIBXML2_SONAME, \
                     name);                                                        \
            return;                                                                \
        }                                                                          \
        memcpy(&xml.field, &f, sizeof f);                                          \
    } while (0)

static void libxml_init(void)
{
    void *lib = dlopen(TT_LIBXML2_SONAME, RTLD_NOW | RTLD_LOCAL);
    if (!lib) {
        const char *why = dlerror();
        snprintf(xml_missing, sizeof xml_missing, "%s", why ? why : TT_LIBXML2_SONAME);
        return;
    }
    XML_SYM(InitParser, "xmlInitParser");
    XML_SYM(ThrDefSetGenericErrorFunc, "xmlThrDefSetGenericErrorFunc");
    XML_SYM(SetGenericErrorFunc, "xmlSetGenericErrorFunc");
    XML_SYM(CreateMemoryParserCtxt, "htmlCreateMemoryParserCtxt");
    XML_SYM(CtxtUseOptions, "htmlCtxtUseOptions");
    XML_SYM(SwitchEncoding, "xmlSwitchEncoding");
    XML_SYM(ParseDocument, "htmlParseDocument");
    XML_SYM(FreeParserCtxt, "htmlFreeParserCtxt");
    XML_SYM(ByteConsumed, "xmlByteConsumed");
    XML_SYM(StopParser, "xmlStopParser");
    xml.InitParser();
    /* Threads created later start with the silent handler too. */
    xml.ThrDefSetGenericErrorFunc(NULL, silent_generic_error);
}

/* ---- input hygiene ----------------------------------------------------- */

/* Offset of the first NUL or byte that is not part of valid UTF-8, or len. */
static size_t first_bad_byte(const unsigned char *s, size_t len)
{
    size_t i = 0;
    while (i < len) {
        if (len - i >= 8) {
            uint64_t w;
            memcpy(&w, s + i, 8);
            /* No high bit and no zero byte: 8 clean ASCII bytes. */
            uint64_t zero = (w - 0x0101010101010101ull) & ~w & 0x8080808080808080ull;
            if (((w & 0x8080808080808080ull) | zero) == 0) {
                i += 8;
                continue;
            }
        }
        if (s[i] == 0)
            return i;
        if (s[i] < 0x80) {
            i++;
            continue;
        }
        uint32_t cp;
        size_t l = tti_utf8_decode(s + i, len - i, &cp);
        if (l == 1)
            return i;
        i += l;
    }
    return len;
}

/* A copy of s with every NUL and invalid byte replaced by a space. */
static unsigned char *repaired_copy(const unsigned char *s, size_t len, size_t from)
{
    unsigned char *c = tt_malloc(len);
    if (!c)
        return NULL;
    memcpy(c, s, len);
    size_t i = from;
    while (i < len) {
        if (c[i] == 0) {
            c[i++] = ' ';
        } else if (c[i] < 0x80) {
            i++;
        } else {
            uint32_t cp;
            size_t l = tti_utf8_decode(c + i, len - i, &cp);
            if (l == 1)
                c[i] = ' ';
            i += l;
        }
    }
    return c;
}

/* Finds a start tag with more than TT_LIMIT_HTML_ATTRIBUTES attributes,
 * before libxml2 sees it (its duplicate check is quadratic in the number of
 * attributes on one tag). A plain scan of tag syntax: '<' and a letter open
 * a tag, then name[=value] pairs with quoted or bare values, until '>'.
 * Returns the tag's offset, or len when none. O(len). */
static size_t crowded_tag(const unsigned char *s, size_t len)
{
    size_t i = 0;
    while (i < len) {
        const unsigned char *lt = memchr(s + i, '<', len - i);
        if (!lt)
            return len;
        size_t tag = (size_t)(lt - s), p = tag + 1;
        i = p;
        if (p >= len || !tti_is_ascii_alpha(s[p]))
            continue;
        while (p < len && !tti_is_ascii_space(s[p]) && s[p] != '>' && s[p] != '/')
            p++;
        size_t attributes = 0;
        for (;;) {
            while (p < len && (tti_is_ascii_space(s[p]) || s[p] == '/'))
                p++;
            if (p >= len || s[p] == '>')
                break;
            while (p < len && !tti_is_ascii_space(s[p]) && s[p] != '=' && s[p] != '>' &&
                   s[p] != '/')
                p++;
            if (++attributes > TT_LIMIT_HTML_ATTRIBUTES)
                return tag;
            while (p < len && tti_is_ascii_space(s[p]))
                p++;
            if (p < len && s[p] == '=') {
                p++;
                while (p < len && tti_is_ascii_space(s[p]))
                    p++;
                if (p < len && (s[p] == '"' || s[p] == '\'')) {
                    const unsigned char *close = memchr(s + p + 1, s[p], len - p - 1);
                    p = close ? (size_t)(close - s) + 1 : len;
                } else {
                    while (p < len && !tti_is_ascii_space(s[p]) && s[p] != '>')
                        p++;
                }
            }
        }
        i = p;
    }
    return len;
}

/* ---- entry point ------------------------------------------------------- */

tt_status tt_extract_html(const char *html, size_t len, long long src_base,
                          const tt_extract_options *opt, tt_blocks *out,
                          const char *name, tt_error *err)
{
    tt_blocks_reset(out);
    if (len > TT_LIMIT_FILE_BYTES)
        return tt_error_set(err, TT_ELIMIT, name, -1,
                            "HTML document of %zu bytes exceeds TT_LIMIT_FILE_BYTES (%zu)",
                            len, (size_t)TT_LIMIT_FILE_BYTES);
    if (len == 0)
        return TT_OK;

    pthread_once(&libxml_once, libxml_init);
    if (xml_missing[0])
        return tt_error_set(err, TT_EIO, name, -1, "cannot load the HTML parser: %s",
                            xml_missing);
    xml.SetGenericErrorFunc(NULL, silent_generic_error);

    const unsigned char *src = (const unsigned char *)html;
    size_t crowded = crowded_tag(src, len);
    if (crowded < len)
        return tt_error_set(err, TT_ELIMIT, name, src_base + (long long)crowded,
                            "an HTML tag with more than %d attributes "
                            "(TT_LIMIT_HTML_ATTRIBUTES)", TT_LIMIT_HTML_ATTRIBUTES);
    unsigned char *copy = NULL;
    size_t bad = first_bad_byte(src, len);
    if (bad < len) {
        copy = repaired_copy(src, len, bad);
        if (!copy)
            return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory reading HTML");
        src = copy;
    }

    html_state *s = tt_calloc(1, sizeof *s);
    if (!s) {
        tt_free(copy);
        return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory reading HTML");
    }
    s->src = src;
    s->src_len = len;
    s->src_base = src_base;
    s->drop_tables = opt ? opt->drop_tables : 0;
    s->out = out;
    tt_buf_init(&s->block, 0);
    s->block_kind = TT_BLOCK_PARAGRAPH;
    s->block_src = -1;
    s->prev_pos = -1;
    s->kind_at[0] = TT_BLOCK_PARAGRAPH;

    /* len <= TT_LIMIT_FILE_BYTES <= INT_MAX, so the cast is exact. */
    htmlParserCtxtPtr ctxt = xml.CreateMemoryParserCtxt((const char *)src, (int)len);
    if (!ctxt) {
        tt_buf_release(&s->block);
        tt_free(s);
        tt_free(copy);
        return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory starting the HTML parser");
    }
    s->ctxt = ctxt;
    memset(ctxt->sax, 0, sizeof *ctxt->sax);
    ctxt->sax->initialized = XML_SAX2_MAGIC; /* so the structured handler is used */
    ctxt->sax->startElement = on_start;
    ctxt->sax->endElement = on_end;
    ctxt->sax->characters = on_text;
    ctxt->sax->ignorableWhitespace = on_text;
    ctxt->sax->comment = on_comment;
    ctxt->sax->processingInstruction = on_pi;
    ctxt->sax->serror = on_error;
    ctxt->userData = s;
    xml.CtxtUseOptions(ctxt, HTML_PARSE_NONET | HTML_PARSE_NOERROR | HTML_PARSE_NOWARNING |
                                 HTML_PARSE_RECOVER | HTML_PARSE_IGNORE_ENC);
    xml.SwitchEncoding(ctxt, XML_CHAR_ENCODING_UTF8);

    s->parsing = 1;
    xml.ParseDocument(ctxt); /* its result only says "not well-formed" */
    s->parsing = 0;
    if (!s->stopped) {
        if (ctxt->errNo == XML_ERR_NO_MEMORY) {
            s->stopped = 1;
            s->status = TT_ENOMEM;
            s->stop_offset = xml.ByteConsumed(ctxt);
        } else {
            end_block(s);
        }
    }

    tt_status st = s->status;
    int too_deep = s->too_deep;
    long long where = s->stopped && s->stop_offset >= 0 ? src_base + s->stop_offset : -1;
    size_t repaired = s->repaired;
    xml.FreeParserCtxt(ctxt);
    tt_buf_release(&s->block);
    tt_free(s);
    tt_free(copy);

    if (st == TT_OK) {
        out->repaired = repaired;
        return TT_OK;
    }
    tt_blocks_reset(out);
    if (too_deep)
        return tt_error_set(err, st, name, where,
                            "HTML elements nested deeper than %d (TT_LIMIT_HTML_DEPTH)",
                            TT_LIMIT_HTML_DEPTH);
    if (st == TT_ENOMEM)
        return tt_error_set(err, st, name, where, "out of memory extracting HTML text");
    return tt_error_set(err, st, name, where, "extracted HTML text exceeds its size limit");
}
