#!/usr/bin/env bash
# Whole-process throughput of `kern calc --json --no-torsion` on the 300-section batch
# (benches/support/sections.rs), release build, with 1 and 2 worker threads
# (KERN_JOBS). Prints µs a section, best and median of RUNS runs (default 21).
# KERN_BIN times another binary (an older build, to compare) instead of this tree's.
# The machine may be shared: run it on a quiet moment and say so with the figures.
set -euo pipefail
cd "$(dirname "$0")/.."
runs=${RUNS:-21}
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
cargo bench --quiet --bench batch_files -- "$dir" >/dev/null
[ -n "${KERN_BIN:-}" ] || cargo build --release --quiet --bin kern
bin=${KERN_BIN:-target/release/kern}
files=("$dir"/*.toml)
n=${#files[@]}
lines=$("$bin" calc --json --no-torsion "${files[@]}" | wc -l)
if [ "$lines" -ne "$n" ]; then
    echo "batch.sh: $lines results for $n files" >&2
    exit 1
fi
for jobs in 1 2; do
    times=()
    for _ in $(seq "$runs"); do
        t0=$EPOCHREALTIME
        KERN_JOBS=$jobs "$bin" calc --json --no-torsion "${files[@]}" >/dev/null
        t1=$EPOCHREALTIME
        times+=("$(echo "($t1 - $t0) * 1000000 / $n" | bc -l)")
    done
    sorted=$(printf '%s\n' "${times[@]}" | sort -g)
    best=$(echo "$sorted" | head -1)
    median=$(echo "$sorted" | sed -n "$(((runs + 1) / 2))p")
    printf '%d thread(s): %6.1f µs a section best, %6.1f median (%d files, %d runs)\n' \
        "$jobs" "$best" "$median" "$n" "$runs"
done
