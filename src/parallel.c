/* termtide — starting threads where they can run at once.
 *
 * A new thread goes where the kernel's scheduler puts it, and some
 * schedulers (seen in virtual machines that pack a guest's work onto as few
 * of its virtual CPUs as they can) put it on its creator's CPU and leave it
 * there for milliseconds while another CPU idles: a 4.5 ms task started
 * beside its creator then took 9 ms in about half the trials. For a batch's
 * tail (sorting the workers' tables, writing the rows, a few milliseconds a
 * step) that undoes the second thread. So a thread starts with its affinity
 * set to one allowed CPU: the k-th after its creator's, counting round the
 * creator's mask (k = 0 the next one; the creator's own comes last, for
 * threads that outnumber the others), and the first thing it does is take
 * back the creator's whole mask: the choice only places its start, and the
 * scheduler is free to move it afterwards. Where the calls are missing (not Linux) or fail,
 * threads start plainly. */
#if defined(__linux__)
#define _GNU_SOURCE 1 /* pthread_attr_setaffinity_np, sched_getcpu, CPU_* */
#endif
#include <pthread.h>
#include <sched.h>

#include "termtide/parallel.h"
#include "tt_internal.h"

#if defined(__linux__) && defined(CPU_SETSIZE)
#define TT_PLACE 1
#else
#define TT_PLACE 0
#endif

typedef struct start {
    void *(*fn)(void *);
    void *arg;
#if TT_PLACE
    cpu_set_t mask; /* the creator's */
#endif
} start;

static void *start_thread(void *arg)
{
    start s = *(start *)arg;
    tt_free(arg);
#if TT_PLACE
    (void)pthread_setaffinity_np(pthread_self(), sizeof s.mask, &s.mask);
#endif
    return s.fn(s.arg);
}

int tti_thread_start(pthread_t *tid, void *(*fn)(void *), void *arg, unsigned k)
{
#if TT_PLACE
    start *s = tt_malloc(sizeof *s);
    if (s && sched_getaffinity(0, sizeof s->mask, &s->mask) == 0 && CPU_COUNT(&s->mask) > 1) {
        /* the allowed CPUs in order from the one after this, round to this */
        int here = sched_getcpu(), pick = -1;
        unsigned step = k % (unsigned)CPU_COUNT(&s->mask) + 1;
        for (int c = here + 1, seen = 0; seen < CPU_SETSIZE; c++, seen++) {
            int cpu = (c % CPU_SETSIZE + CPU_SETSIZE) % CPU_SETSIZE;
            if (CPU_ISSET(cpu, &s->mask) && --step == 0) {
                pick = cpu;
                break;
            }
        }
        pthread_attr_t attr;
        if (pick >= 0 && pthread_attr_init(&attr) == 0) {
            cpu_set_t one;
            CPU_ZERO(&one);
            CPU_SET(pick, &one);
            s->fn = fn;
            s->arg = arg;
            int ok = pthread_attr_setaffinity_np(&attr, sizeof one, &one) == 0 &&
                     pthread_create(tid, &attr, start_thread, s) == 0;
            pthread_attr_destroy(&attr);
            if (ok)
                return 0;
        }
    }
    tt_free(s);
#else
    (void)k;
#endif
    return pthread_create(tid, NULL, fn, arg) == 0 ? 0 : -1;
}

typedef struct task_runner {
    void (*fn)(void *ctx, size_t task);
    void *ctx;
    size_t ntasks, stride, first;
} task_runner;

static void *task_thread(void *arg)
{
    task_runner *r = arg;
    for (size_t i = r->first; i < r->ntasks; i += r->stride)
        r->fn(r->ctx, i);
    return NULL;
}

#define MAX_TASK_THREADS 64

void tt_run_tasks(int threads, size_t ntasks, void (*fn)(void *ctx, size_t task), void *ctx)
{
    size_t t = threads < 1 ? 1 : (size_t)threads;
    if (t > ntasks)
        t = ntasks;
    if (t > MAX_TASK_THREADS)
        t = MAX_TASK_THREADS;
    pthread_t tid[MAX_TASK_THREADS];
    task_runner r[MAX_TASK_THREADS];
    int started[MAX_TASK_THREADS] = { 0 };
    for (size_t k = 1; k < t; k++) {
        r[k] = (task_runner){ fn, ctx, ntasks, t, k };
        started[k] = tti_thread_start(&tid[k], task_thread, &r[k], (unsigned)(k - 1)) == 0;
    }
    if (t) {
        r[0] = (task_runner){ fn, ctx, ntasks, t, 0 };
        task_thread(&r[0]);
    }
    for (size_t k = 1; k < t; k++) {
        if (started[k])
            pthread_join(tid[k], NULL);
        else
            task_thread(&r[k]);
    }
}
