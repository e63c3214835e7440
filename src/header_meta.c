/* termtide — document metadata from a submission wrapper's own header:
 * entity = COMPANY CONFORMED NAME, period = CONFORMED PERIOD OF REPORT
 * (a day, coarsened to the granularity a series needs), kind = CONFORMED
 * SUBMISSION TYPE. Reads and decodes the file but extracts nothing. */
#include "termtide/decode.h"
#include "termtide/document.h"
#include "termtide/meta.h"
#include "termtide/source.h"
#include "tt_internal.h"

tt_status tt_manifest_add_from_header(tt_manifest *m, const char *path,
                                      tt_period_granularity granularity, tt_error *err)
{
    tt_buf raw, scratch;
    tt_wrapper w;
    tt_decode_info info;
    tt_period day, period;
    tt_status st;
    tt_buf_init(&raw, 0);
    tt_buf_init(&scratch, 0);
    tt_wrapper_init(&w);
    if ((st = tt_source_read(path, &raw, NULL, err)) != TT_OK)
        goto done;
    if ((st = tt_decode_buf(&raw, &scratch, &info, path, err)) != TT_OK)
        goto done;
    if (tt_detect_kind(raw.data, raw.len) != TT_KIND_WRAPPER) {
        st = tt_error_set(err, TT_EPARSE, path, -1,
                          "not a submission wrapper: no header to take metadata from");
        goto done;
    }
    if ((st = tt_wrapper_split(raw.data, raw.len, &w, path, err)) != TT_OK)
        goto done;
    if (!w.entity[0] || !w.period[0]) {
        st = tt_error_set(err, TT_EPARSE, path, -1,
                          "the wrapper header has no %s",
                          !w.entity[0] ? "COMPANY CONFORMED NAME" : "CONFORMED PERIOD OF REPORT");
        goto done;
    }
    if ((st = tt_period_parse_basic_date(w.period, strlen(w.period), &day, err)) != TT_OK ||
        (st = tt_period_coarsen(&day, granularity, &period, err)) != TT_OK) {
        tti_strlcpy(err->file, path, sizeof err->file);
        goto done;
    }
    st = tt_manifest_add(m, path, w.entity, &period, w.form, err);
done:
    tt_buf_release(&raw);
    tt_buf_release(&scratch);
    tt_wrapper_release(&w);
    return st;
}
