#!/usr/bin/python3
"""Index an archive on a Dask cluster with termtide, then merge the shards.

Each Dask task runs `termtide index` over one shard of the file list into
its own database under --work-dir (a directory every worker can write and
this machine can read: a shared file system on a real cluster), and this
script merges the shard databases with `termtide merge` into OUT, which then
holds what one `termtide index` run over every file would have written.

    contrib/dask_index.py --scheduler tcp://10.0.0.5:8786 --work-dir /shared/tt \\
        --shards 64 archive.db filelist.txt
    contrib/dask_index.py --workers 2 --work-dir /tmp/termtide-work demo.db filelist.txt   # local

Needs Debian's python3-distributed (Dask) and termtide on every worker.
Counting options for `termtide index` go after `--`, e.g. `-- --stem`.
"""
import argparse
import os
import subprocess
import sys


def index_shard(termtide, db, paths, options):
    """Runs on a worker: one `termtide index` over the shard's files."""
    cmd = [termtide, "index", "-q"] + list(options) + [db] + list(paths)
    r = subprocess.run(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    return db, r.returncode, r.stderr


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--scheduler", help="the scheduler's address; default: a local cluster")
    ap.add_argument("--workers", type=int, default=2, help="local cluster: worker processes")
    ap.add_argument("--shards", type=int, help="default: 4 per worker")
    ap.add_argument("--work-dir", required=True, help="where the shard databases go")
    ap.add_argument("--termtide", default="termtide", help="the program on the workers")
    ap.add_argument("out", help="the merged index")
    ap.add_argument("filelist", help="one path per line ('-': standard input)")
    ap.add_argument("options", nargs="*", help="counting options for termtide index")
    a = ap.parse_args()
    from distributed import Client, LocalCluster

    src = sys.stdin if a.filelist == "-" else open(a.filelist, encoding="utf-8")
    paths = [ln.rstrip("\n") for ln in src if ln.strip()]
    if not paths:
        sys.exit(f"{a.filelist}: no paths")
    os.makedirs(a.work_dir, exist_ok=True)
    if a.scheduler:
        client = Client(a.scheduler)
    else:
        client = Client(LocalCluster(n_workers=a.workers, threads_per_worker=1,
                                     processes=True, dashboard_address=None))
    nworkers = max(1, len(client.scheduler_info()["workers"]))
    shards = max(1, min(len(paths), a.shards or 4 * nworkers))
    # contiguous runs of the sorted list keep each shard's files together
    paths.sort()
    size = (len(paths) + shards - 1) // shards
    parts = [paths[i:i + size] for i in range(0, len(paths), size)]
    dbs = [os.path.join(a.work_dir, f"shard-{i:05d}.db") for i in range(len(parts))]
    for db in dbs:
        for ext in ("", "-wal", "-shm"):
            if os.path.exists(db + ext):
                os.remove(db + ext)
    futures = client.map(index_shard, [a.termtide] * len(parts), dbs, parts,
                         [a.options] * len(parts), pure=False)
    failed = 0
    for db, rc, err in client.gather(futures):
        if err:
            sys.stderr.write(err)
        if rc not in (0, 2):  # 2: some files skipped, the rest indexed
            failed += 1
            sys.stderr.write(f"{db}: termtide index failed (exit {rc})\n")
    client.close()
    if failed:
        sys.exit(f"{failed} shard(s) failed; nothing merged")
    r = subprocess.run([a.termtide, "merge", a.out] + dbs)
    sys.exit(r.returncode)


if __name__ == "__main__":
    main()
