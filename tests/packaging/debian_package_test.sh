#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The Debian packages as a packager and a user get them:
#   debian_package_test.sh SOURCE_DIR WORK_DIR VERSION
# configures a build as a packager does (prefix /usr, BUILD_TESTING=OFF, so
# Catch2 is not needed), builds the .deb files with CPack, checks their
# Depends and runs lintian (no errors allowed), extracts them with dpkg-deb -x
# into a temporary root, and from there: loads the module in the sqlite3 shell,
# builds and runs a C program with pkg-config (shared and static link), and a
# CMake project with find_package (both targets). Fails, never skips.
set -euo pipefail
source_dir=$1
work=$2
version=$3
triplet=$(gcc -print-multiarch)
rm -rf "$work"
mkdir -p "$work"
step() { echo "== $*"; }
fail() { echo "FAILED: $*" >&2; exit 1; }

step "configure and build as a packager (prefix /usr, BUILD_TESTING=OFF)"
cmake -S "$source_dir" -B "$work/build" -DCMAKE_BUILD_TYPE=Release -DCMAKE_INSTALL_PREFIX=/usr \
      -DBUILD_TESTING=OFF -Wno-dev > "$work/build.log" 2>&1 || { cat "$work/build.log"; exit 1; }
grep -q '^Catch2_DIR' "$work/build/CMakeCache.txt" && fail "BUILD_TESTING=OFF still looked for Catch2"
cmake --build "$work/build" -j 2 >> "$work/build.log" 2>&1 || { cat "$work/build.log"; exit 1; }
(cd "$work/build" && cpack -G DEB > "$work/cpack.log" 2>&1) || { cat "$work/cpack.log"; exit 1; }
runtime_deb=$(ls "$work"/build/packages/libalmanac0_"$version"-1_*.deb)
dev_deb=$(ls "$work"/build/packages/libalmanac-dev_"$version"-1_*.deb)
pg_major=$(pg_config --version | grep -o '[0-9]*' | head -1)
pg_deb=$(ls "$work"/build/packages/postgresql-"$pg_major"-almanac_"$version"-1_*.deb)

step "Depends"
runtime_depends=$(dpkg-deb -f "$runtime_deb" Depends)
dev_depends=$(dpkg-deb -f "$dev_deb" Depends)
echo "libalmanac0: $runtime_depends"
echo "libalmanac-dev: $dev_depends"
# What the binaries link (readelf NEEDED) must each be a dependency: SQLite,
# the C++ runtime (common practice: dpkg-shlibdeps). The date library is used
# header-only: zone files are read by almanac itself.
for needed in libsqlite3-0 libstdc++6 libc6; do
  [[ $runtime_depends == *"$needed "* ]] || fail "libalmanac0 does not depend on $needed"
done
for needed in "libalmanac0 (= $version-1)" libsqlite3-dev libhowardhinnant-date-dev; do
  [[ $dev_depends == *"$needed"* ]] || fail "libalmanac-dev does not depend on $needed"
done
pg_depends=$(dpkg-deb -f "$pg_deb" Depends)
echo "postgresql-$pg_major-almanac: $pg_depends"
for needed in "postgresql-$pg_major" libstdc++6 libc6; do
  [[ $pg_depends == *"$needed"* ]] || fail "postgresql-$pg_major-almanac does not depend on $needed"
done

step "lintian (errors fail the test; warnings are listed)"
lintian --fail-on error --tag-display-limit 0 "$runtime_deb" "$dev_deb" "$pg_deb" 2>&1 |
  grep -v 'running with root privileges' || true
lintian --fail-on error "$runtime_deb" "$dev_deb" "$pg_deb" > /dev/null 2>&1 ||
  fail "lintian reports errors"

step "extract into a temporary root"
root="$work/root"
dpkg-deb -x "$runtime_deb" "$root"
dpkg-deb -x "$dev_deb" "$root"
(cd "$root" && find . ! -type d | sort)
libdir="$root/usr/lib/$triplet"
for file in "$libdir/sqlite3/almanac.so" "$libdir/libalmanac.so.0" "$libdir/libalmanac.a" \
            "$root/usr/include/almanac.h" "$root/usr/include/almanac_version.h" \
            "$libdir/pkgconfig/almanac.pc" "$libdir/cmake/almanac/almanacConfig.cmake"; do
  [ -e "$file" ] || fail "missing ${file#$root}"
done

# 2026-03-05 is a Thursday; its ISO week starts Monday 2026-03-02 (common
# practice, ISO 8601); in a fiscal year starting April it lies in the fourth
# quarter of the year ending March 2026, FY2026-Q4 (DESIGN "Labels": fiscal
# years are named for the year they end).
expected="2026-03-02|FY2026-Q4"

step "the sqlite3 shell loads the installed module"
shell_out=$(sqlite3 :memory: ".load $libdir/sqlite3/almanac" \
  "SELECT period_floor('2026-03-05 14:20', 'week'), period_label('2026-03-05', 'quarter starting april');" \
  "SELECT almanac_version();")
echo "$shell_out"
[ "$shell_out" = "$expected"$'\n'"$version" ] || fail "shell output differs"

step "a C program built with pkg-config"
pc() { PKG_CONFIG_PATH="$libdir/pkgconfig" pkg-config --define-variable=prefix="$root/usr" "$@"; }
[ "$(pc --modversion almanac)" = "$version" ] || fail "pkg-config --modversion"
consumer="$source_dir/tests/packaging/consumer"
# shellcheck disable=SC2046 # word splitting of pkg-config's flags is wanted
gcc -std=c99 -Wall -Wextra -o "$work/c_shared" "$consumer/main.c" $(pc --cflags --libs almanac)
shared_out=$(LD_LIBRARY_PATH="$libdir" "$work/c_shared")
# ldd's output is read whole before grep looks at it: with pipefail, `ldd | grep -q`
# fails at random when grep stops reading and ldd dies of SIGPIPE.
shared_ldd=$(LD_LIBRARY_PATH="$libdir" ldd "$work/c_shared")
grep -q "libalmanac.so.0 => $libdir/" <<< "$shared_ldd" ||
  fail "the C program did not use the extracted libalmanac.so.0"
[ "$shared_out" = "$expected" ] || fail "C program (shared) printed '$shared_out'"
echo "shared: $shared_out"
# A static link: the archive, then the private libraries almanac.pc lists.
static_libs=$(pc --static --libs almanac | sed 's/-lalmanac\b//')
# shellcheck disable=SC2086
gcc -std=c99 -Wall -Wextra -o "$work/c_static" "$consumer/main.c" $(pc --cflags almanac) \
    "$libdir/libalmanac.a" $static_libs
static_ldd=$(ldd "$work/c_static")
grep -q libalmanac <<< "$static_ldd" && fail "the static C program still needs libalmanac.so"
static_out=$("$work/c_static")
[ "$static_out" = "$expected" ] || fail "C program (static) printed '$static_out'"
echo "static: $static_out"

step "a CMake project built with find_package(almanac)"
cmake -S "$consumer" -B "$work/consumer" -DCMAKE_PREFIX_PATH="$root/usr" -Wno-dev \
      > "$work/consumer.log" 2>&1 || { cat "$work/consumer.log"; exit 1; }
grep -q "almanac_DIR:PATH=$libdir/cmake/almanac" "$work/consumer/CMakeCache.txt" ||
  fail "find_package did not find the extracted package"
cmake --build "$work/consumer" >> "$work/consumer.log" 2>&1 || { cat "$work/consumer.log"; exit 1; }
for program in consumer_shared consumer_static; do
  out=$(LD_LIBRARY_PATH="$libdir" "$work/consumer/$program")
  [ "$out" = "$expected" ] || fail "$program printed '$out'"
  echo "$program: $out"
done
consumer_ldd=$(LD_LIBRARY_PATH="$libdir" ldd "$work/consumer/consumer_shared")
grep -q "libalmanac.so.0 => $libdir/" <<< "$consumer_ldd" ||
  fail "consumer_shared did not use the extracted libalmanac.so.0"
step "CREATE EXTENSION almanac from the PostgreSQL package"
# PostgreSQL finds its share folder relative to its binaries, so a copy of the
# server beside the extracted package is a server with the package installed,
# and the system's own folders stay untouched. It runs as an unprivileged
# user (PostgreSQL refuses root), on a Unix socket in its folder only.
pg_root="$work/pg_root"
dpkg-deb -x "$pg_deb" "$pg_root"
for file in "usr/lib/postgresql/$pg_major/lib/almanac.so" \
            "usr/share/postgresql/$pg_major/extension/almanac.control" \
            "usr/share/postgresql/$pg_major/extension/almanac--$version.sql"; do
  [ -e "$pg_root/$file" ] || fail "postgresql-$pg_major-almanac lacks /$file"
done
cp -an "/usr/lib/postgresql/$pg_major" "$pg_root/usr/lib/postgresql/"
cp -an "/usr/share/postgresql/$pg_major" "$pg_root/usr/share/postgresql/"
pg_user=postgres
[ "$(id -u)" -eq 0 ] || pg_user=$(id -un)
pg_data="$work/pg_data"
mkdir -p "$pg_data"
[ "$(id -u)" -eq 0 ] && chown "$pg_user" "$pg_data" "$work"
as_pg() { if [ "$(id -u)" -eq 0 ]; then su "$pg_user" -s /bin/sh -c "$*"; else sh -c "$*"; fi; }
pg_bin="$pg_root/usr/lib/postgresql/$pg_major/bin"
as_pg "'$pg_bin/initdb' -D '$pg_data/db' -A trust -U almanac > '$work/initdb.log' 2>&1" ||
  { cat "$work/initdb.log"; fail "initdb"; }
stop_server() { as_pg "'$pg_bin/pg_ctl' -D '$pg_data/db' -m immediate stop > /dev/null 2>&1" || true; }
trap stop_server EXIT
as_pg "'$pg_bin/pg_ctl' -D '$pg_data/db' -w -l '$pg_data/log' \
       -o \"-k '$pg_data' -c listen_addresses='' -p 54329\" start > /dev/null" ||
  { cat "$pg_data/log"; fail "the server did not start"; }
pg_out=$(as_pg "psql -X -A -t -h '$pg_data' -p 54329 -U almanac -d postgres \
  -c 'CREATE EXTENSION almanac' \
  -c \"SELECT period_floor('2026-03-05 14:20', 'week'), period_label('2026-03-05', 'quarter starting april')\" \
  -c 'SELECT almanac_version()'") || fail "CREATE EXTENSION almanac failed"
echo "$pg_out"
# The same answers as the sqlite3 shell's above; the first line is psql's CREATE EXTENSION tag.
[ "$(tail -n 2 <<< "$pg_out")" = "2026-03-02|FY2026-Q4"$'\n'"$version" ] ||
  fail "the PostgreSQL extension's answers differ"
stop_server
trap - EXIT

echo "the packages install, load, link and pass lintian"
