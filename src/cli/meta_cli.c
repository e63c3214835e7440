/* termtide CLI — document metadata for the commands that work on periods
 * (compare, trend, describe): from a manifest, a path layout, or the
 * headers of submission wrappers. Problems are printed here. */
#include <string.h>

#include "termtide/meta.h"
#include "cli.h"

int cli_load_manifest(tt_manifest *m, const char *path)
{
    tt_error err;
    tt_error_init(&err);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    if (tt_manifest_load(m, path, 0, &err) == TT_OK)
        return 1;
    if (m->n_errors)
        for (size_t i = 0; i < m->n_errors; i++)
            cli_error("%s", tt_error_format(&m->errors[i], msg, sizeof msg));
    else
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
    if (m->errors_more)
        cli_error("%s: %zu more problems", path, m->errors_more);
    return 0;
}

int cli_load_layout(tt_manifest *m, const char *pattern, int nroots, char **roots)
{
    tt_layout l;
    tt_layout_init(&l);
    tt_error err;
    tt_error_init(&err);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    if (nroots <= 0) {
        cli_error("--layout needs the ROOT directories to walk");
        return 0;
    }
    if (tt_layout_compile(&l, pattern, &err)) {
        cli_error("--layout: %s", tt_error_format(&err, msg, sizeof msg));
        tt_layout_release(&l);
        return 0;
    }
    int ok = 1;
    for (int r = 0; r < nroots && ok; r++) {
        tt_source_list list;
        tt_source_list_init(&list);
        if (tt_source_expand(&list, roots[r]) != TT_OK) {
            cli_error("out of memory");
            ok = 0;
        }
        for (size_t i = 0; ok && i < list.n; i++) {
            tt_layout_fields f;
            if (list.items[i].status != TT_OK) {
                cli_error("%s: %s", list.items[i].path,
                          list.items[i].message ? list.items[i].message : "cannot be read");
                ok = 0;
            } else if (tt_layout_match(&l, roots[r], list.items[i].path, &f, &err) ||
                       tt_manifest_add(m, list.items[i].path, f.entity, &f.period, f.kind,
                                       &err)) {
                cli_error("%s", tt_error_format(&err, msg, sizeof msg));
                ok = 0;
            }
        }
        tt_source_list_release(&list);
    }
    tt_layout_release(&l);
    return ok;
}

int cli_load_headers(tt_manifest *m, tt_period_granularity g, int nroots, char **roots,
                     size_t *skipped)
{
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    if (nroots <= 0) {
        cli_error("--headers needs the ROOT files or directories to read");
        return 0;
    }
    for (int r = 0; r < nroots; r++) {
        tt_source_list list;
        tt_source_list_init(&list);
        if (tt_source_expand(&list, roots[r]) != TT_OK) {
            cli_error("out of memory");
            return 0;
        }
        for (size_t i = 0; i < list.n; i++) {
            tt_error err;
            tt_error_init(&err);
            if (list.items[i].status != TT_OK) {
                cli_error("%s: %s (skipped)", list.items[i].path,
                          list.items[i].message ? list.items[i].message : "cannot be read");
                (*skipped)++;
            } else if (tt_manifest_add_from_header(m, list.items[i].path, g, &err)) {
                if (err.status == TT_ENOMEM) {
                    cli_error("out of memory");
                    tt_source_list_release(&list);
                    return 0;
                }
                cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
                (*skipped)++;
            }
        }
        tt_source_list_release(&list);
    }
    return 1;
}

int cli_header_period(const char *arg, tt_period_granularity *out)
{
    tt_period_basis basis;
    tt_error err;
    tt_error_init(&err);
    if (tt_period_class_parse(arg, out, &basis, &err) || basis != TT_BASIS_CALENDAR) {
        cli_error("--header-period: expected year, quarter, month or day, got '%s'", arg);
        return 0;
    }
    return 1;
}
