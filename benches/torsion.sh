#!/usr/bin/env bash
# Whole-process time of `kern calc --json` (torsion to the default 1e-3) on the torsion
# bench sections, with the flexure (shear) solution beside torsion (what `kern calc`
# does) and torsion alone (`--no-shear`): best and median of N runs, wall clock and CPU
# (user + system), in milliseconds. On a machine shared with other work the best CPU
# time is the steadiest figure. Targets (issue 10, torsion alone): IPE 300 with fillets
# <= 3 ms, loading-bay beam <= 5 ms, 20-plate girder <= 10 ms, 300-hole plate <= 1 s.
#   benches/torsion.sh [N] [BIN]   (N runs each, default 21; BIN a kern binary to time,
#                                   default: builds and times target/release/kern; a
#                                   binary without --no-shear is timed with shear only)
set -eu
cd "$(dirname "$0")/.."
n=${1:-21}
bin=${2:-}
if [ -z "$bin" ]; then
    cargo build --release --quiet --bin kern
    bin=target/release/kern
fi
modes=("shear:" "alone:--no-shear")
"$bin" calc --help | grep -q -- --no-shear || modes=("shear:")
TIMEFORMAT='%3R %3U %3S'
for f in benches/sections/ipe300.toml sections/loading-bay-beam.toml \
    benches/sections/girder-20-plates.toml benches/sections/plate-300-holes.toml; do
    runs=$n
    case $f in *300-holes*) runs=$((n < 5 ? n : 5)) ;; esac
    for mode in "${modes[@]}"; do
        name=${mode%%:*} flag=${mode#*:}
        for ((i = 0; i < runs; i++)); do
            # shellcheck disable=SC2086 # $flag is empty or one word
            { time "$bin" calc --json $flag "$f" > /dev/null; } 2>&1
        done | awk -v f="$f" -v mode="$name" '
            { wall[NR] = $1 * 1000; cpu[NR] = ($2 + $3) * 1000 }
            function sort(a, n,   i, j, t) {
                for (i = 2; i <= n; i++) for (j = i; j > 1 && a[j - 1] > a[j]; j--) {
                    t = a[j]; a[j] = a[j - 1]; a[j - 1] = t
                }
            }
            END {
                sort(wall, NR); sort(cpu, NR); m = int((NR + 1) / 2)
                printf "%-40s %-5s wall best %8.1f median %8.1f | cpu best %8.1f median %8.1f ms (%d runs)\n",
                    f, mode, wall[1], wall[m], cpu[1], cpu[m], NR
            }'
    done
done
