/* Tests of the task runner and thread start (src/parallel.c): every task
 * runs exactly once whatever the numbers, tasks really run on several
 * threads, and a started thread ends up free to run wherever its creator
 * could (the placement only picks where it starts). */
#define _GNU_SOURCE 1 /* sched_getaffinity, CPU_EQUAL */
#include <pthread.h>
#include <sched.h>

#include "tt_test.h"

#include "termtide/parallel.h"

/* library-internal (src/tt_internal.h, whose banned-function macros the
 * tests would trip on) */
int tti_thread_start(pthread_t *tid, void *(*fn)(void *), void *arg, unsigned k);

typedef struct runs {
    int *times;       /* how often each task ran */
    pthread_t *where; /* the thread that ran it */
} runs;

static void note_run(void *ctx, size_t task)
{
    runs *r = ctx;
    r->times[task]++;
    r->where[task] = pthread_self();
}

static void test_every_task_once(void **state)
{
    (void)state;
    static const int threads[] = { -3, 0, 1, 2, 3, 8, 64, 100 };
    static const size_t tasks[] = { 0, 1, 2, 5, 64, 129 };
    for (size_t i = 0; i < sizeof threads / sizeof *threads; i++) {
        for (size_t j = 0; j < sizeof tasks / sizeof *tasks; j++) {
            int times[129] = { 0 };
            pthread_t where[129];
            runs r = { times, where };
            tt_run_tasks(threads[i], tasks[j], note_run, &r);
            for (size_t k = 0; k < tasks[j]; k++)
                assert_int_equal(times[k], 1);
            /* task 0 always runs on the caller */
            if (tasks[j])
                assert_true(pthread_equal(where[0], pthread_self()));
        }
    }
}

static void test_tasks_spread_over_threads(void **state)
{
    (void)state;
    int times[6] = { 0 };
    pthread_t where[6];
    runs r = { times, where };
    tt_run_tasks(3, 6, note_run, &r);
    /* task k on thread k % 3: 0 and 3 on the caller, the others on two more */
    assert_true(pthread_equal(where[0], where[3]));
    assert_true(pthread_equal(where[1], where[4]));
    assert_true(pthread_equal(where[2], where[5]));
    assert_false(pthread_equal(where[0], where[1]));
    assert_false(pthread_equal(where[0], where[2]));
    assert_false(pthread_equal(where[1], where[2]));
}

typedef struct seen {
    cpu_set_t mask;
    int got;
} seen;

static void *read_mask(void *arg)
{
    seen *s = arg;
    s->got = sched_getaffinity(0, sizeof s->mask, &s->mask) == 0;
    return arg;
}

static void test_started_thread_keeps_creator_mask(void **state)
{
    (void)state;
    cpu_set_t mine;
    assert_int_equal(sched_getaffinity(0, sizeof mine, &mine), 0);
    for (unsigned k = 0; k < 5; k++) {
        seen s;
        memset(&s, 0, sizeof s);
        pthread_t tid;
        assert_int_equal(tti_thread_start(&tid, read_mask, &s, k), 0);
        void *back = NULL;
        assert_int_equal(pthread_join(tid, &back), 0);
        assert_ptr_equal(back, &s); /* the thread's own return value comes back */
        assert_true(s.got);
        assert_true(CPU_EQUAL(&s.mask, &mine));
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_every_task_once),
        cmocka_unit_test(test_tasks_spread_over_threads),
        cmocka_unit_test(test_started_thread_keeps_creator_mask),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
