#!/usr/bin/env bash
# Byte-for-byte comparison of two builds' `kern calc --json` output: BEFORE=old binary
# (e.g. a release build of an earlier commit), AFTER=new one (default: this tree's
# release build). On every `.toml` in the repository (one file a run, so a file that
# does not compute is compared by its error line and status too) and on the 300 batch
# files (benches/batch_files), without torsion, and on the demo sections with torsion;
# also `calc` without --json (the tables) on the batch. Prints what differs, and
# "same output" with the counts when nothing does.
set -euo pipefail
cd "$(dirname "$0")/.."
: "${BEFORE:?BEFORE=path to the old kern binary (named kern: help texts name it)}"
after=${AFTER:-target/release/kern}
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
# BATCH: a folder the batch is already written in (skips building the writer).
batch=${BATCH:-$dir/batch}
[ -n "${BATCH:-}" ] || cargo bench --quiet --bench batch_files -- "$batch" >/dev/null
mapfile -t repo < <(find . -name '*.toml' -not -path './target/*' -not -path './.git/*' | sort)
differ=0
run() { # label, then kern's arguments
    local label=$1
    shift
    local so sa
    so=$("$BEFORE" "$@" 2>"$dir/e1"; echo "status $?")
    sa=$("$after" "$@" 2>"$dir/e2"; echo "status $?")
    if [ "$so" != "$sa" ] || ! cmp -s "$dir/e1" "$dir/e2"; then
        echo "differs: $label"
        differ=$((differ + 1))
    fi
}
for f in "${repo[@]}"; do
    run "$f" calc --json --no-torsion "$f"
done
run "the batch, JSON" calc --json --no-torsion "$batch"/*.toml
run "the batch, tables" calc --no-torsion "$batch"/*.toml
for f in sections/*.toml; do
    run "$f with torsion" calc --json "$f"
done
run "all sections at once, with torsion, in inches" calc --json --units in sections/*.toml
run "sweep --json" sweep sections/canopy-post.toml --param t --from 5 --to 10 --steps 6 --json --no-torsion
run "seek --json" seek sections/canopy-post.toml --param t --target inertia.xx=2e7 --json
run "diff --json" diff sections/canopy-post.toml sections/canopy-hanger.toml --json --no-torsion
run "check --json" check --json sections/*.toml
run "--help" --help
run "calc --help" calc --help
run "an unknown option" calc --frobnicate x.toml
if [ "$differ" -eq 0 ]; then
    echo "same output: ${#repo[@]} repository files one by one, 300 batch files (JSON and tables), sections/ with torsion, sweep, seek, diff and check JSON, help texts"
else
    echo "$differ runs differ" >&2
    exit 1
fi
