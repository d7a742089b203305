#!/usr/bin/env bash
# Builds the tripoint shared library into cabi/build/ (never committed):
#   cabi/build.sh          Linux: build/libtripoint.so and build/libtripoint.h
#   cabi/build.sh windows  also build/tripoint.dll (needs gcc-mingw-w64-x86-64)
# The hand-written header to use is cabi/tripoint.h; the generated
# libtripoint.h is cgo's and only a by-product.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
out="$here/build"
mkdir -p "$out"
cd "$here"
go build -buildmode=c-shared -o "$out/libtripoint.so" .
echo "built $out/libtripoint.so"
if [ "${1:-}" = windows ]; then
  CGO_ENABLED=1 GOOS=windows GOARCH=amd64 CC=x86_64-w64-mingw32-gcc \
    go build -buildmode=c-shared -o "$out/tripoint.dll" .
  echo "built $out/tripoint.dll"
fi
