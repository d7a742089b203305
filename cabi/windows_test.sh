#!/usr/bin/env bash
# Builds tripoint.dll with mingw-w64, compiles the C test program against it
# and runs it under wine: the Windows leg of the C ABI checks. .ci/run calls
# it; it needs gcc-mingw-w64-x86-64 and wine (.ci/setup installs them when
# asked to with TRIPOINT_SETUP_WINDOWS=1).
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
out=$(mktemp -d)
trap 'WINEPREFIX="$out/wine" wineserver -k 2>/dev/null; rm -rf "$out"' EXIT
cd "$here"
CGO_ENABLED=1 GOOS=windows GOARCH=amd64 CC=x86_64-w64-mingw32-gcc \
	go build -buildmode=c-shared -o "$out/tripoint.dll" .
x86_64-w64-mingw32-gcc -O2 -Wall -I. -o "$out/ctest.exe" testdata/ctest.c \
	"$out/tripoint.dll" -static-libgcc -Wl,-Bstatic -lpthread -Wl,-Bdynamic
# The Go runtime loads ProcessPrng from system32's bcryptprimitives.dll,
# which this wine lacks: install the stand-in into a fresh prefix.
x86_64-w64-mingw32-gcc -shared -O2 -o "$out/bcryptprimitives.dll" \
	testdata/wine_bcryptprimitives.c -ladvapi32
export WINEDEBUG=-all WINEPREFIX="$out/wine"
timeout 300 wineboot -i >/dev/null 2>&1 || true
cp "$out/bcryptprimitives.dll" "$WINEPREFIX/drive_c/windows/system32/"
cd "$out"
run() { timeout 300 wine ./ctest.exe "$@" 2>/dev/null | tr -d '\r'; }
errs=$(run errors)
echo "$errs"
# Every line of the error catalogue must show its documented status; the
# Linux test (cabi_test.go) checks the same catalogue in detail.
want="vector 1 0 1 0 1|water-handle 0|nan-pressure 1|negative-pressure 1|bad-quality 1|bad-pair 1|bad-handle 1|out-of-range 2|null-err 1|small-state 1|bad-prop 1|unknown-fluid 5|co2-nbp 5"
IFS='|' read -ra wants <<<"$want"
for w in "${wants[@]}"; do
	grep -q "^$w" <<<"$errs" || { echo "windows: missing or wrong: $w" >&2; exit 1; }
done
thr=$(run threads 20000)
echo "$thr"
[ "$thr" = "mismatches 0" ] || { echo "windows: threads: $thr" >&2; exit 1; }
# The same states as the Linux library, to the last bit.
(cd "$here" && go build -buildmode=c-shared -o "$out/libtripoint.so" . &&
	gcc -O2 -I. -o "$out/ctest" testdata/ctest.c -L"$out" -ltripoint -lpthread -lm -Wl,-rpath,"$out")
table="CO2 0 1 40f86a0000000000 4072c00000000000
CO2 0 2 4146e36000000000 c10e848000000000
CO2 0 5 4071800000000000 3fe0000000000000
water 0 1 40f8bcd000000000 4072c00000000000
water 0 6 4024000000000000 413e848000000000
R134a 0 4 40f86a0000000000 3fd3333333333333"
win=$(run table <<<"$table")
lin=$(./ctest table <<<"$table")
echo "$win"
[ "$win" = "$lin" ] || { echo "windows and linux results differ:" >&2; echo "$lin" >&2; exit 1; }
# The spline tables: the same states to the last bit, and the statuses of
# bad table calls (cabi_test.go checks them in detail).
tables="CO2 1 412e848000000000 4073600000000000
CO2 2 4146e36000000000 c1024f8000000000
CO2 6 4082c00000000000 c10e848000000000
water 1 40f8bcd000000000 4072c00000000000"
win=$(run tables <<<"$tables")
lin=$(./ctest tables <<<"$tables")
echo "$win"
[ "$win" = "$lin" ] || { echo "windows and linux tables differ:" >&2; echo "$lin" >&2; exit 1; }
for w in "tbl-bad-pair 1" "tbl-bad-handle 1" "tbl-info 0 1 1" "tbl-vector 1 0 1 0" "tbl-free 0" "tbl-freed 1" "tbl-double-free 1"; do
	grep -q "^$w" <<<"$win" || { echo "windows: missing or wrong: $w" >&2; exit 1; }
done
echo "windows C ABI: ok"
