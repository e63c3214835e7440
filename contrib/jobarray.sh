#!/bin/sh
# Index an archive as a job array (one task per shard), then merge.
#
#   jobarray.sh index LIST SHARDS TASK WORKDIR [OPTIONS...]
#       task TASK (0 .. SHARDS-1) indexes the paths on lines TASK+1,
#       TASK+1+SHARDS, ... of LIST into WORKDIR/shard-TASK.db
#   jobarray.sh merge OUT WORKDIR
#       merges every WORKDIR/shard-*.db into OUT
#
# With a batch scheduler, submit `index` as an array job with TASK set from
# the scheduler's task index (e.g. $SLURM_ARRAY_TASK_ID, or $PBS_ARRAY_INDEX),
# then `merge` as a job that depends on it. TERMTIDE names the program
# (default: termtide). Counting options go after WORKDIR and must be the
# same for every task.
set -eu
TERMTIDE=${TERMTIDE:-termtide}
case "${1:-}" in
index)
    [ $# -ge 5 ] || { echo "usage: $0 index LIST SHARDS TASK WORKDIR [OPTIONS...]" >&2; exit 2; }
    list=$2 shards=$3 task=$4 work=$5
    shift 5
    mkdir -p "$work"
    db="$work/shard-$task.db"
    rm -f "$db" "$db-wal" "$db-shm"
    # the task's lines, one path each, passed without word splitting
    awk -v n="$shards" -v t="$task" '(NR - 1) % n == t' "$list" |
        tr '\n' '\0' | xargs -0 sh -c 'exec "$0" index -q "$@"' "$TERMTIDE" "$@" "$db" || {
        rc=$?
        # 2: some files skipped, the rest indexed; 123 is xargs passing it on
        [ $rc -eq 123 ] || [ $rc -eq 2 ] || exit $rc
    }
    ;;
merge)
    [ $# -eq 3 ] || { echo "usage: $0 merge OUT WORKDIR" >&2; exit 2; }
    exec "$TERMTIDE" merge "$2" "$3"/shard-*.db
    ;;
*)
    echo "usage: $0 index LIST SHARDS TASK WORKDIR [OPTIONS...] | merge OUT WORKDIR" >&2
    exit 2
    ;;
esac
