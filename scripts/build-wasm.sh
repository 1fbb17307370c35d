#!/usr/bin/env bash
# Builds the wasm engine and its JS glue with the toolchain scripts/setup.sh chose
# (.tools/wasm.env). Usage: scripts/build-wasm.sh OUT_DIR [--bench]
# The shipped build (www/pkg) carries no benchmark workloads; --bench adds the `bench`
# feature (the `Bench` export that `make bench` drives), in a target dir of its own.
set -euo pipefail
cd "$(dirname "$0")/.."
# shellcheck disable=SC1091
. .tools/wasm.env
out="${1:?usage: scripts/build-wasm.sh OUT_DIR [--bench]}"
tdir="$WASM_TARGET_DIR"; feat=()
if [ "${2:-}" = --bench ]; then tdir="$WASM_TARGET_DIR-bench"; feat=(--features bench); fi
echo "[wasm] building with $WASM_HOW${feat:+ (bench feature)}"
# shellcheck disable=SC2086  # WASM_FLAGS is a word list
CARGO_TARGET_DIR="$tdir" RUSTC_BOOTSTRAP=$WASM_BOOTSTRAP RUSTC=$WASM_RUSTC \
  "$WASM_CARGO" build --quiet --release --lib --target wasm32-unknown-unknown $WASM_FLAGS "${feat[@]}"
# The name and producers sections are debugging aids only (about 26 KB gzipped).
.tools/bin/wasm-bindgen --target web --remove-name-section --remove-producers-section \
  --out-dir "$out" "$tdir/wasm32-unknown-unknown/release/nightfield.wasm"
echo "[wasm] $out/nightfield_bg.wasm: $(stat -c %s "$out/nightfield_bg.wasm") bytes"
