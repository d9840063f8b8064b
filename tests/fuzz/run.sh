#!/usr/bin/env bash
# Builds the libFuzzer targets (preset fuzz: clang-14, ASan + UBSan + coverage) and runs each
# for a bounded time: tests/fuzz/run.sh [seconds-per-target] [target...]  (default 60 s, all).
# Each run starts from the seed corpus in tests/fuzz/corpus/<target> and grows a working corpus
# in build/fuzz/corpus/<target> (kept between local runs). A crash, hang (>10 s per input),
# leak or memory blow-up (>2 GiB) is saved to tests/fuzz/crashes/<target>-... and makes the
# script exit nonzero (FUZZ_SKIP_BUILD=1: run what is built). A per-target summary (executions, corpus size, crashes) ends the output.
set -euo pipefail
cd "$(dirname "$0")/../.."
seconds="${1:-60}"
shift || true
all=(fuzz_events_csv fuzz_seeds_csv fuzz_project fuzz_report fuzz_journal fuzz_frame_index fuzz_video)
[ $# -gt 0 ] && targets=("$@") || targets=("${all[@]}")

if [ -z "${FUZZ_SKIP_BUILD:-}" ]; then  # set it to run targets already built
  [ -f build/fuzz/CMakeCache.txt ] || cmake --preset fuzz >/dev/null
  cmake --build --preset fuzz -j"${FUZZ_BUILD_JOBS:-2}"
fi

# Longest input per target: a little above the largest seed, so mutations stay fast.
declare -A max_len=([fuzz_events_csv]=4096 [fuzz_seeds_csv]=2048 [fuzz_project]=8192 [fuzz_report]=16384
                    [fuzz_journal]=4096 [fuzz_frame_index]=4096 [fuzz_video]=16384)
crashes=tests/fuzz/crashes
mkdir -p "$crashes" build/fuzz/logs build/fuzz/tmp
export TMPDIR="$PWD/build/fuzz/tmp"
export ASAN_OPTIONS="detect_leaks=1:abort_on_error=1:symbolize=1"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1"
failed=0
summary=()
for target in "${targets[@]}"; do
  name="${target#fuzz_}"
  work="build/fuzz/corpus/$name"
  log="build/fuzz/logs/$name.log"
  mkdir -p "$work"
  dict=()
  [ -f "tests/fuzz/dict/$name.dict" ] && dict=(-dict="tests/fuzz/dict/$name.dict")
  before=$(find "$crashes" -name "$target-*" -type f | wc -l)
  echo "== $target: ${seconds} s"
  rc=0
  "build/fuzz/tests/fuzz/$target" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
    -max_len="${max_len[$target]}" -print_final_stats=1 -artifact_prefix="$crashes/$target-" \
    "${dict[@]}" "$work" "tests/fuzz/corpus/$name" >"$log" 2>&1 || rc=$?
  after=$(find "$crashes" -name "$target-*" -type f | wc -l)
  runs=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -1)
  size=$(grep -o 'corp: [0-9]*' "$log" | tail -1 | cut -d' ' -f2)
  found=$((after - before))
  if [ "$rc" -ne 0 ] || [ "$found" -gt 0 ]; then
    failed=1
    echo "!! $target failed (exit $rc, $found new file(s) in $crashes); the end of $log:"
    tail -n 40 "$log"
  fi
  summary+=("$(printf '%-18s %12s executions  %6s corpus files  %s crash(es)' \
    "$target" "${runs:-?}" "${size:-?}" "$found")")
done
printf '%s\n' "== summary (${seconds} s per target)" "${summary[@]}"
exit "$failed"
