#!/usr/bin/env bash
# The whole test suite, from a fresh Debian 12 machine: installs what is missing, builds,
# checks formatting, runs every test (under Xvfb when there is no display), then runs the
# core and command-line tests once more in a sanitizer build.
set -euo pipefail
cd "$(dirname "$0")/.."

./scripts/setup.sh

echo "== format check (clang-format)"
mapfile -t sources < <(git ls-files '*.cpp' '*.hpp' 2>/dev/null || find core render app tests bench -name '*.[ch]pp')
clang-format --dry-run --Werror "${sources[@]}"

run_ctest() {
  local dir=$1
  if [ -z "${DISPLAY:-}" ] && command -v xvfb-run >/dev/null; then
    xvfb-run -a -s "-screen 0 1920x1080x24" ctest --test-dir "$dir" --output-on-failure -j 2
  else
    ctest --test-dir "$dir" --output-on-failure -j 2
  fi
}

echo "== tests (Release build)"
run_ctest build

echo "== tests (AddressSanitizer + UndefinedBehaviorSanitizer build)"
cmake -S . -B build-asan -DCMAKE_BUILD_TYPE=RelWithDebInfo -DATTISCOPE_SANITIZE=ON \
  -DATTISCOPE_BUILD_GUI=OFF -DATTISCOPE_BUILD_BENCH=OFF >/dev/null
cmake --build build-asan -j "$(nproc)"
ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 ctest --test-dir build-asan --output-on-failure -j 2

echo "== fuzz: the paste reader for about a minute (clang, libFuzzer, ASan + UBSan)"
cmake -S . -B build-fuzz -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_COMPILER=clang++ -DATTISCOPE_FUZZ=ON \
  -DATTISCOPE_BUILD_GUI=OFF -DATTISCOPE_BUILD_BENCH=OFF -DATTISCOPE_BUILD_TESTS=ON >/dev/null
cmake --build build-fuzz --target intake_fuzz -j "$(nproc)"
ctest --test-dir build-fuzz -R '^fuzz\.' --output-on-failure
