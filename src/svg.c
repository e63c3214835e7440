/* termtide — the SVG writer.
 *
 * Every piece of text that reaches a picture (terms, titles, legend labels,
 * file names) goes through tt_svg_escape, the single escaper: the five XML
 * specials become entities, and bytes XML 1.0 cannot hold (C0 controls other
 * than tab/LF/CR, invalid UTF-8) become U+FFFD. A term such as
 * `"><svg onload=...` therefore stays text wherever it is placed. Numbers are
 * written by tt_svg_number on top of the library's locale-free fixed-point
 * formatter, so a coordinate is never "12,5" under any locale. */
#include <math.h>
#include <stdarg.h>
#include <string.h>

#include "termtide/output.h"
#include "termtide/svg.h"
#include "tt_internal.h"

const char tt_svg_caution[] =
    "termtide measures language; it gives no investment, legal or compliance advice.";

tt_status tt_svg_escape(tt_buf *b, const char *s, size_t len)
{
    const unsigned char *p = (const unsigned char *)s;
    size_t i = 0, run = 0;
    tt_status st = TT_OK;
    while (i < len && !st) {
        unsigned c = p[i];
        const char *ent = NULL;
        size_t step = 1;
        int bad = 0;
        if (c == '&') ent = "&amp;";
        else if (c == '<') ent = "&lt;";
        else if (c == '>') ent = "&gt;";
        else if (c == '"') ent = "&quot;";
        else if (c == '\'') ent = "&#39;";
        else if (c < 0x20 && c != '\t' && c != '\n' && c != '\r') bad = 1;
        else if (c >= 0x80) {
            uint32_t cp;
            step = tti_utf8_decode(p + i, len - i, &cp);
            /* U+FFFE, U+FFFF are not XML characters either */
            if (cp == 0xFFFD && !(step == 3 && p[i] == 0xEF && p[i + 1] == 0xBF && p[i + 2] == 0xBD))
                bad = 1;
            else if (cp == 0xFFFE || cp == 0xFFFF)
                bad = 1;
        }
        if (!ent && !bad) {
            i += step;
            run += step;
            continue;
        }
        st = tt_buf_append(b, s + i - run, run);
        run = 0;
        if (!st)
            st = ent ? tt_buf_puts(b, ent) : tt_buf_puts(b, "\xEF\xBF\xBD");
        i += step;
    }
    if (!st && run)
        st = tt_buf_append(b, s + len - run, run);
    return st;
}

size_t tt_svg_number(double x, int decimals, char *out)
{
    if (!isfinite(x))
        x = 0; /* a picture never holds nan/inf; callers clamp before */
    if (decimals < 0) decimals = 0;
    if (decimals > 6) decimals = 6;
    size_t n = tt_format_fixed(x, decimals, out);
    if (memchr(out, '.', n)) {
        while (n > 0 && out[n - 1] == '0')
            n--;
        if (n > 0 && out[n - 1] == '.')
            n--;
    }
    out[n] = '\0';
    if (n == 2 && out[0] == '-' && out[1] == '0') {
        out[0] = '0';
        out[1] = '\0';
        n = 1;
    }
    return n;
}

tt_status tt_svg_put(tt_buf *b, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    tt_status st = tt_svg_vput(b, fmt, ap);
    va_end(ap);
    return st;
}

tt_status tt_svg_vput(tt_buf *b, const char *fmt, va_list ap)
{
    tt_status st = TT_OK;
    const char *p = fmt;
    while (*p && !st) {
        const char *pc = strchr(p, '%');
        if (!pc) {
            st = tt_buf_puts(b, p);
            break;
        }
        if (pc > p)
            st = tt_buf_append(b, p, (size_t)(pc - p));
        if (st)
            break;
        char num[48];
        switch (pc[1]) {
        case 'd': st = tt_buf_printf(b, "%d", va_arg(ap, int)); break;
        case 'u': st = tt_buf_printf(b, "%zu", va_arg(ap, size_t)); break;
        case 'n': {
            size_t k = tt_svg_number(va_arg(ap, double), 2, num);
            st = tt_buf_append(b, num, k);
            break;
        }
        case 's': {
            const char *s = va_arg(ap, const char *);
            st = tt_svg_escape(b, s ? s : "", s ? strlen(s) : 0);
            break;
        }
        case 'S': {
            const char *s = va_arg(ap, const char *);
            size_t len = va_arg(ap, size_t);
            st = tt_svg_escape(b, s, len);
            break;
        }
        case 'r': st = tt_buf_puts(b, va_arg(ap, const char *)); break;
        case '%': st = tt_buf_putc(b, '%'); break;
        default: st = TT_EINVAL; break;
        }
        p = pc + 2;
    }
    return st;
}

tt_status tt_svg_begin(tt_buf *b, int width, int height, const char *title, const char *desc,
                       size_t desc_len)
{
    tt_status st = tt_svg_put(b,
                              "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                              "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\" "
                              "viewBox=\"0 0 %d %d\" role=\"img\" aria-labelledby=\"tt-title\" "
                              "aria-describedby=\"tt-desc\">\n<title id=\"tt-title\">%s</title>\n",
                              width, height, width, height, title);
    if (!st) st = tt_buf_puts(b, "<desc id=\"tt-desc\">");
    if (!st && desc) st = tt_svg_escape(b, desc, desc_len);
    if (!st) st = tt_svg_put(b, "</desc>\n<rect width=\"%d\" height=\"%d\" fill=\"#ffffff\"/>\n",
                             width, height);
    return st;
}

tt_status tt_svg_end(tt_buf *b)
{
    return tt_buf_puts(b, "</svg>\n");
}
