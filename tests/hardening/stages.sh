#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The hardening stages of tests/run.sh, each bounded in time:
#   1. a clang build with ASan+UBSan and the libFuzzer harnesses (build-asan/):
#      the unit tests, the fuzz replays and the SQL-level tests run in it (the
#      Python ones load the sanitized module with the ASan runtime preloaded);
#   2. each fuzz harness for ALMANAC_FUZZ_SECONDS (default 25) under ASan+UBSan,
#      two at a time (one core each);
#      a crash, hang or leak fails the stage and leaves the input in build-asan/fuzz/;
#   3. eight threads for ALMANAC_THREAD_SECONDS (default 20) under TSan (build-tsan/);
#   4. the SQL-level tests that drive the sqlite3 shell, with the shell under
#      valgrind memcheck (zero errors, zero definite leaks), on the plain build.
# The allocation-failure test is a ctest of the plain build (tests/run.sh runs it).
#   tests/hardening/stages.sh [stage ...]     stages: asan fuzz tsan valgrind (default: all)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
stages=("$@")
[ ${#stages[@]} -gt 0 ] || stages=(asan fuzz tsan valgrind)
fuzz_seconds="${ALMANAC_FUZZ_SECONDS:-25}"
thread_seconds="${ALMANAC_THREAD_SECONDS:-20}"
jobs=2
export UBSAN_OPTIONS=halt_on_error=1:print_stacktrace=1
asan_runtime="$(clang++ -print-file-name=libclang_rt.asan-x86_64.so)"

configure() {  # folder, cmake options...
  local folder="$1"
  shift
  cmake -S "$root" -B "$root/$folder" -DCMAKE_CXX_COMPILER=clang++ \
    -DCMAKE_BUILD_TYPE=RelWithDebInfo "$@" > "$root/$folder.log" 2>&1 ||
    { cat "$root/$folder.log"; exit 1; }
}

stage_asan() {
  echo "hardening: ASan+UBSan build (build-asan/)"
  configure build-asan -DALMANAC_SANITIZE=address,undefined -DALMANAC_FUZZ=ON
  # Only what the tests below run: the module, the unit and embedded tests and
  # the fuzz harnesses (the shared library, the locale and number-text tools
  # are not run here, and TSan builds the thread test for itself).
  local targets=(almanac almanac_unit_tests almanac_unit_tests_portable_int128 almanac_embedded_test)
  for source in "$root"/tests/fuzz/fuzz_*.cpp; do
    source="${source##*/}"
    targets+=("${source%.cpp}")
  done
  cmake --build "$root/build-asan" -j "$jobs" --target "${targets[@]}" >> "$root/build-asan.log" 2>&1 ||
    { tail -50 "$root/build-asan.log"; exit 1; }
  cd "$root/build-asan"
  ASAN_OPTIONS=halt_on_error=1 ctest --output-on-failure -j "$jobs" -R '^(unit|embedded|fuzz_replay\.)'
  # Python itself is not built with ASan: its runtime is preloaded, and leak
  # checking is left to valgrind (CPython keeps its own objects until exit).
  LD_PRELOAD="$asan_runtime" ASAN_OPTIONS=halt_on_error=1:detect_leaks=0 \
    ctest --output-on-failure -j "$jobs" -R '^sql\.' -E '^sql\.(test_demo_as_user|test_your_data)$'
  # (those two run demo/run.sh, which builds the project: a compiler with the
  # ASan runtime preloaded is neither needed nor within the time budget)
}

stage_fuzz() {
  echo "hardening: fuzzing, ${fuzz_seconds} s per harness, ${jobs} harnesses at a time"
  [ -d "$root/build-asan" ] || stage_asan
  local work="$root/build-asan/fuzz"
  mkdir -p "$work"
  # A libFuzzer harness runs on one core: $jobs of them run side by side, each
  # still for its full time (the same executions per harness, half the wait).
  local harnesses=("$root"/build-asan/tests/fuzz/fuzz_*) pids=() names=() failed=()
  for harness in "${harnesses[@]}"; do
    local name="${harness##*/fuzz_}"
    mkdir -p "$work/$name"
    # New inputs go to the scratch folder; the checked-in corpus is only read.
    "$harness" -max_total_time="$fuzz_seconds" -timeout=10 -rss_limit_mb=2048 \
      -artifact_prefix="$work/$name-" "$work/$name" "$root/tests/fuzz/corpus/$name" \
      > "$work/$name.log" 2>&1 &
    pids+=($!)
    names+=("$name")
    if [ ${#pids[@]} -eq "$jobs" ] || [ "$harness" = "${harnesses[-1]}" ]; then
      for i in "${!pids[@]}"; do
        if wait "${pids[$i]}"; then
          echo "  fuzz_${names[$i]}: $(grep -E '^Done' "$work/${names[$i]}.log")"
        else
          failed+=("${names[$i]}")
        fi
      done
      pids=()
      names=()
    fi
  done
  for name in "${failed[@]}"; do
    tail -40 "$work/$name.log"
    echo "hardening: fuzz_$name found a problem; keep the input in tests/fuzz/regressions/$name/" >&2
  done
  [ ${#failed[@]} -eq 0 ] || exit 1
}

stage_tsan() {
  echo "hardening: ${thread_seconds} s of eight threads under TSan (build-tsan/)"
  configure build-tsan -DALMANAC_SANITIZE=thread
  cmake --build "$root/build-tsan" -j "$jobs" --target almanac_threads >> "$root/build-tsan.log" 2>&1 ||
    { tail -50 "$root/build-tsan.log"; exit 1; }
  TSAN_OPTIONS=halt_on_error=1:second_deadlock_stack=1 \
    "$root/build-tsan/tests/hardening/almanac_threads" "$thread_seconds"
}

stage_valgrind() {
  # Python under valgrind is far too slow for the budget, so the shell is what
  # runs under it: every README example and every catalogue case goes through
  # the real sqlite3 shell, and conftest.run_shell puts valgrind in front of it.
  echo "hardening: SQL-level tests with the sqlite3 shell under valgrind memcheck"
  cd "$root/build"
  ALMANAC_SHELL_PREFIX="valgrind -q --error-exitcode=99 --leak-check=full --errors-for-leak-kinds=definite --show-leak-kinds=definite" \
    ctest --output-on-failure -j "$jobs" -R '^sql\.(test_markdown_examples|test_bad_input_catalogue)$'
}

for stage in "${stages[@]}"; do
  start=$SECONDS
  "stage_$stage"
  echo "hardening: $stage took $((SECONDS - start)) s"
done
