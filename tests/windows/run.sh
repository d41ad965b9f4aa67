#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The Windows module under Debian's wine: cross-builds almanac.dll with
# mingw-w64 (ext/windows/), builds SQLite's own shell for Windows and for Linux
# from one amalgamation, runs tests/windows/queries.sql in both — the Windows
# shell with `.load almanac` (the DLL), the Linux shell with the Linux module —
# and requires the two outputs (stdout and stderr) to be equal byte for byte.
#
# The amalgamation (sqlite3.c, shell.c) comes from the npm package sqlite3,
# which ships SQLite's autoconf tarball; `npm pack` fetches it from the npm
# registry, nothing else is downloaded. Everything lands in build-windows/ and
# is reused by the next run. Needs the Linux module built in build/ first.
#   tests/windows/run.sh
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
out="$root/build-windows"
npm_package="sqlite3@6.0.1"                 # ships deps/sqlite-autoconf-3520000.tar.gz
amalgamation="sqlite-autoconf-3520000"      # SQLite 3.52.0
started=$SECONDS
stage() { echo "windows: $1 ($((SECONDS - started)) s)"; }

linux_module="$root/build/almanac.so"
[ -f "$linux_module" ] || { echo "windows: $linux_module not built (run tests/setup.sh)" >&2; exit 1; }

wine64="$(command -v wine64 || echo /usr/lib/wine/wine64)"
[ -x "$wine64" ] || { echo "windows: wine64 not found (install Debian's wine64)" >&2; exit 1; }
export WINEPREFIX="$out/wine" WINEDEBUG=-all WINEDLLOVERRIDES="mscoree,mshtml="
# A fresh wine prefix takes a minute or more, mostly waiting: it is made in the
# background while the compilers run, and waited for before the first query.
wineboot_pid=
if [ ! -f "$WINEPREFIX/system.reg" ]; then
  stage "creating the wine prefix in the background (first run only)"
  mkdir -p "$out"
  ( "$wine64" wineboot --init > "$out/wineboot.log" 2>&1
    "$(command -v wineserver || echo /usr/lib/wine/wineserver64)" -w ) &
  wineboot_pid=$!
fi

stage "cross-building almanac.dll"
mkdir -p "$out"
cmake -S "$root/ext/windows" -B "$out" \
  -DCMAKE_TOOLCHAIN_FILE="$root/ext/windows/mingw-w64-x86_64.cmake" > "$out/build.log" 2>&1 ||
  { cat "$out/build.log"; exit 1; }
cmake --build "$out" -j 2 >> "$out/build.log" 2>&1 || { cat "$out/build.log"; exit 1; }
# The DLL must need nothing a bare Windows lacks, and export the entry point.
headers="$(x86_64-w64-mingw32-objdump -p "$out/almanac.dll")"
imports=$(sed -n 's/^\s*DLL Name: //p' <<< "$headers" | sort | tr '\n' ' ')
[ "$imports" = "KERNEL32.dll msvcrt.dll " ] || { echo "windows: unexpected DLL imports: $imports" >&2; exit 1; }
grep -qE '\[ *[0-9]+\] sqlite3_almanac_init$' <<< "$headers" ||
  { echo "windows: almanac.dll does not export sqlite3_almanac_init" >&2; exit 1; }

shells="$out/sqlite"
if [ ! -x "$shells/sqlite3.exe" ] || [ ! -x "$shells/sqlite3-linux" ]; then
  stage "fetching the SQLite amalgamation ($npm_package from npm) and building both shells"
  rm -rf "$shells" && mkdir -p "$shells"
  (cd "$shells" && npm pack --silent "$npm_package" > /dev/null)
  tar -xzf "$shells"/sqlite3-*.tgz -C "$shells" "package/deps/$amalgamation.tar.gz"
  tar -xzf "$shells/package/deps/$amalgamation.tar.gz" -C "$shells" \
    "$amalgamation/sqlite3.c" "$amalgamation/shell.c" "$amalgamation/sqlite3.h" "$amalgamation/sqlite3ext.h"
  src="$shells/$amalgamation"
  # -O0: the shells only host the module for 32 queries; unoptimised, SQLite's
  # 9 MB amalgamation compiles in a third of the time.
  x86_64-w64-mingw32-gcc-posix -O0 -municode -I"$src" "$src/shell.c" "$src/sqlite3.c" \
    -o "$shells/sqlite3.exe.tmp" -static &
  windows_build=$!
  gcc -O0 -I"$src" "$src/shell.c" "$src/sqlite3.c" -o "$shells/sqlite3-linux.tmp" -lm -ldl -lpthread
  wait "$windows_build"
  mv "$shells/sqlite3.exe.tmp" "$shells/sqlite3.exe"
  mv "$shells/sqlite3-linux.tmp" "$shells/sqlite3-linux"
fi

if [ -n "$wineboot_pid" ]; then
  stage "waiting for the wine prefix"
  wait "$wineboot_pid" || { cat "$out/wineboot.log"; echo "windows: wineboot failed" >&2; exit 1; }
fi

stage "running tests/windows/queries.sql on Windows (wine) and on Linux"
run="$out/run"
rm -rf "$run" && mkdir -p "$run"
cp "$out/almanac.dll" "$shells/sqlite3.exe" "$run/"
# Results go to a file through `.output` with `.crlf off`: Windows' console
# output would turn every "\n" into "\r\n", which is the C runtime's doing,
# not the module's.
printf '.crlf off\n.output windows.out\n.load almanac\n' | cat - "$root/tests/windows/queries.sql" > "$run/windows.sql"
printf '.crlf off\n.output linux.out\n.load %s\n' "${linux_module%.so}" |
  cat - "$root/tests/windows/queries.sql" > "$run/linux.sql"
(cd "$run" && "$wine64" ./sqlite3.exe -batch :memory: < windows.sql 2> windows.err) || true
(cd "$run" && "$shells/sqlite3-linux" -batch :memory: < linux.sql 2> linux.err) || true

# Error messages reach stderr, which the Windows C runtime writes in text mode
# ("\r\n"); they are compared after taking that translation back.
tr -d '\r' < "$run/windows.err" > "$run/windows.err.lf" && mv "$run/windows.err.lf" "$run/windows.err"
status=0
# Windows has no zoneinfo: the DLL must be answering from its built-in data.
tz_version=$(cd "$run" && printf '.load almanac\nSELECT almanac_tz_version();\n' |
  "$wine64" ./sqlite3.exe -batch :memory: | tr -d '\r')
[[ "$tz_version" =~ ^[0-9]{4}[a-z]+\ \(built\ in\)$ ]] ||
  { echo "windows: almanac_tz_version() under wine is '$tz_version', expected '<release> (built in)'" >&2; status=1; }
queries=$(grep -c -v -E '^(\.|--)' "$root/tests/windows/queries.sql")
lines=$(wc -l < "$run/linux.out")
errors=$(wc -l < "$run/linux.err")
for stream in out err; do
  if ! cmp -s "$run/linux.$stream" "$run/windows.$stream"; then
    echo "windows: std$stream differs between the Linux module and almanac.dll:" >&2
    diff "$run/linux.$stream" "$run/windows.$stream" | head -40 >&2 || true
    status=1
  fi
done
# The run must have reached the last query and the DLL must have loaded.
tail -n 1 "$run/windows.out" | grep -qx done || { echo "windows: the queries did not run to the end" >&2; status=1; }
if grep -qi "almanac.*load\|load.*almanac" "$run/windows.err"; then
  echo "windows: .load almanac failed" >&2
  status=1
fi
if [ $status -eq 0 ]; then
  echo "windows: $queries queries: $lines output lines equal byte for byte, $errors error lines equal" \
       "($(stat -c %s "$out/almanac.dll") bytes almanac.dll, zones $tz_version, $((SECONDS - started)) s)"
fi
exit $status
