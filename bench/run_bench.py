#!/usr/bin/python3
"""termtide benchmark: times `termtide count` next to floors (cat, wc -w) and
peers on the same generated corpus, in one run, and appends the table to
bench/RESULTS.md (newest first).

Each tool runs once to warm the page cache, then --runs times; the table
gives wall time median/min/max, MB/s, CPU seconds and peak RSS from GNU
time, the speed ratio of termtide to each, and a check column (tokens and
distinct terms each tool reports) so a fast wrong answer shows.
"""
import argparse
import datetime
import os
import platform
import re
import statistics
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))


def gnu_time(cmd, cwd):
    """Runs cmd (a shell string) under GNU time; returns (wall, cpu, rss_kb, stdout)."""
    tf = os.path.join(cwd, ".time")
    full = ["/usr/bin/time", "-f", "%e %U %S %M", "-o", tf, "bash", "-c", cmd]
    p = subprocess.run(full, cwd=cwd, stdout=subprocess.PIPE, stderr=subprocess.DEVNULL)
    if p.returncode not in (0,):
        raise SystemExit(f"benchmark command failed ({p.returncode}): {cmd}")
    e, u, s, m = open(tf).read().split()[-4:]
    return float(e), float(u) + float(s), int(m), p.stdout


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--termtide", required=True)
    ap.add_argument("--mb", type=float, default=100)
    ap.add_argument("--runs", type=int, default=3)
    ap.add_argument("--seed", type=int, default=7)
    a = ap.parse_args()
    work = os.path.join(HERE, "work")
    corpus = os.path.join(work, f"prose-{int(a.mb)}mb")
    if not os.path.isdir(corpus):
        subprocess.run([sys.executable, os.path.join(HERE, "gen_corpus.py"), "--mb", str(a.mb),
                        "--seed", str(a.seed), "--single", corpus], check=True)
    files = sorted(os.path.join(corpus, f) for f in os.listdir(corpus))
    size = sum(os.path.getsize(f) for f in files)
    flist = " ".join(files)
    tt = os.path.abspath(a.termtide)
    tools = [
        ("cat (floor)", f"cat {flist} > /dev/null", None),
        ("wc -w (floor)", f"LC_ALL=C.UTF-8 wc -w {flist}", "wc"),
        ("termtide count -j1", f"{tt} count --quiet --no-stopwords --total-only -j 1 {flist} "
                               f"| tail -n +2 | awk -F'\\t' '{{n+=$4}} END {{print n, NR}}'", "pair"),
        ("tr|sort|uniq -c", f"LC_ALL=C tr -cs A-Za-z '\\n' < {flist} | tr A-Z a-z | sort | uniq -c "
                            f"| awk '{{n+=$1}} END {{print n, NR}}'", "pair"),
        ("python re+Counter", f"{a.python if hasattr(a, 'python') else '/usr/bin/python3'} -c "
                              f"\"import re,collections,sys; c=collections.Counter(); "
                              f"[c.update(re.findall(r'\\w+', l.lower())) for l in open(sys.argv[1], encoding='utf-8')]; "
                              f"print(sum(c.values()), len(c))\" {files[0]}", "pair"),
    ]
    rows = []
    for name, cmd, kind in tools:
        gnu_time(cmd, work)  # warm-up
        walls, cpus, rss = [], [], []
        out = b""
        for _ in range(a.runs):
            w, c, m, out = gnu_time(cmd, work)
            walls.append(w)
            cpus.append(c)
            rss.append(m)
        check = out.decode().split()
        check = " / ".join(check[:2]) if check else ""
        rows.append((name, statistics.median(walls), min(walls), max(walls),
                     statistics.median(cpus), max(rss), check))
    ttw = [r for r in rows if r[0].startswith("termtide")][0][1]
    lines = [f"## {datetime.datetime.now().strftime('%Y-%m-%d %H:%M')} — {platform.node()}, "
             f"{os.cpu_count()} cores, {size / 1e6:.0f} MB of generated prose (seed {a.seed})",
             "",
             f"Command: `make bench MB={a.mb:g}`; termtide {subprocess.run([tt, '--version'], stdout=subprocess.PIPE).stdout.decode().splitlines()[0]}",
             "",
             "| tool | wall median s | min | max | MB/s | CPU s | peak RSS MB | termtide speed ratio | check (tokens / distinct) |",
             "|---|---|---|---|---|---|---|---|---|"]
    for name, med, mn, mx, cpu, rss, check in rows:
        ratio = med / ttw if ttw > 0 else float("nan")
        lines.append(f"| {name} | {med:.2f} | {mn:.2f} | {mx:.2f} | {size / 1e6 / med:.1f} | "
                     f"{cpu:.2f} | {rss / 1024:.1f} | {ratio:.2f}× | {check} |")
    table = "\n".join(lines) + "\n"
    print(table)
    res = os.path.join(HERE, "RESULTS.md")
    head = "# Benchmark results (newest first)\n\n"
    old = open(res, encoding="utf-8").read() if os.path.exists(res) else head
    if old.startswith(head):
        old = old[len(head):]
    with open(res, "w", encoding="utf-8") as f:
        f.write(head + table + "\n" + old)


if __name__ == "__main__":
    main()
