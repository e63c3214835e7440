/* Tests of the recipes in contrib/: the Dask recipe on a LocalCluster of
 * two worker processes (Debian's python3-distributed) and the job-array
 * script, each over the demo corpus, must give an index whose output equals
 * a single `termtide index` run's, view by view. */
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

static char tmpdir[256];

static int sh(const char *cmd)
{
    int st = system(cmd);
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

static int same_output(const char *args_a, const char *args_b)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s %s > %s/a.out 2>/dev/null && %s %s > %s/b.out 2>/dev/null && "
             "cmp -s %s/a.out %s/b.out", tt_test_bin(), args_a, tmpdir, tt_test_bin(), args_b,
             tmpdir, tmpdir, tmpdir);
    return sh(cmd) == 0;
}

static void prepare(void)
{
    char cmd[2048], cwd[512];
    assert_non_null(getcwd(cwd, sizeof cwd));
    snprintf(tmpdir, sizeof tmpdir, TT_TEST_TMP "tt_contrib_XXXXXX");
    assert_non_null(mkdtemp(tmpdir));
    snprintf(cmd, sizeof cmd, "find %s/demo-corpus/hollowmere %s/demo-corpus/ambleworth -type f "
             "| sort > %s/list && %s index -q %s/single.db $(cat %s/list)", cwd, cwd, tmpdir,
             tt_test_bin(), tmpdir, tmpdir);
    assert_int_equal(sh(cmd), 0);
}

static void check_against_single(const char *db)
{
    static const char *const views[] = { "-q", "-q --show summary", "-q --total-only" };
    for (size_t i = 0; i < 3; i++) {
        char a[1024], b[1024];
        snprintf(a, sizeof a, "count %s --db %s/single.db", views[i], tmpdir);
        snprintf(b, sizeof b, "count %s --db %s", views[i], db);
        if (!same_output(a, b))
            fail_msg("count %s: %s differs from the single run", views[i], db);
    }
}

static void test_dask_local_cluster(void **state)
{
    (void)state;
    char cmd[4096], db[512];
    if (sh("/usr/bin/python3 -c 'import distributed' 2>/dev/null") != 0) {
        print_message("skipped: Debian's python3-distributed is not installed\n");
        skip();
    }
    prepare();
    snprintf(db, sizeof db, "%s/dask.db", tmpdir);
    snprintf(cmd, sizeof cmd, "%s contrib/dask_index.py --workers 2 --shards 5 --work-dir %s/w "
             "--termtide %s %s %s/list 2> %s/dask.err", tt_test_python(), tmpdir, tt_test_bin(),
             db, tmpdir, tmpdir);
    if (sh(cmd) != 0) {
        snprintf(cmd, sizeof cmd, "cat %s/dask.err", tmpdir);
        sh(cmd);
        fail_msg("the Dask recipe failed");
    }
    check_against_single(db);
    snprintf(cmd, sizeof cmd, "rm -rf %s", tmpdir);
    sh(cmd);
}

static void test_job_array(void **state)
{
    (void)state;
    char cmd[4096], db[512];
    prepare();
    for (int t = 0; t < 3; t++) {
        snprintf(cmd, sizeof cmd, "TERMTIDE=%s contrib/jobarray.sh index %s/list 3 %d %s/ja",
                 tt_test_bin(), tmpdir, t, tmpdir);
        assert_int_equal(sh(cmd), 0);
    }
    snprintf(db, sizeof db, "%s/ja.db", tmpdir);
    snprintf(cmd, sizeof cmd, "TERMTIDE=%s contrib/jobarray.sh merge %s %s/ja 2>/dev/null",
             tt_test_bin(), db, tmpdir);
    assert_int_equal(sh(cmd), 0);
    check_against_single(db);
    snprintf(cmd, sizeof cmd, "rm -rf %s", tmpdir);
    sh(cmd);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_dask_local_cluster),
        cmocka_unit_test(test_job_array),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
