#!/usr/bin/env bash
# Benchmarks: the same workloads (src/bench.rs) native and in wasm, built by the same
# compiler, in one run; prints medians and the ratios the targets are set on.
# Usage: scripts/bench.sh [--quick]
set -euo pipefail
cd "$(dirname "$0")/.."
. .tools/wasm.env
QUICK="${1:-}"
echo "[bench] native build with the wasm build's compiler ($WASM_RUSTC)"
CARGO_TARGET_DIR="$WASM_TARGET_DIR-native" RUSTC="$WASM_RUSTC" RUSTC_BOOTSTRAP=$WASM_BOOTSTRAP \
  "$WASM_CARGO" build --quiet --release --bin bench
native_json=$("$WASM_TARGET_DIR-native/release/bench" $QUICK catalog)
# The wasm side: the shipped build plus the `bench` feature (the Bench export), same flags.
scripts/build-wasm.sh "$WASM_TARGET_DIR-bench/pkg" --bench
wasm_json=$(NIGHTFIELD_PKG="$(cd "$WASM_TARGET_DIR-bench/pkg" && pwd)" node scripts/bench-wasm.mjs $QUICK)
node scripts/bench-report.mjs "$native_json" "$wasm_json"
# The render ratios again, native and wasm in alternating rounds: this shared machine's
# speed drifts between the two processes of the single run above, which skews a
# cross-process ratio (frame/floor is immune: each frame is timed beside its floor).
rounds=7; [ "$QUICK" = --quick ] && rounds=3
echo "[bench] render in $rounds alternating native/wasm rounds (400 frames each):"
node scripts/bench-render.mjs "$(cd "$WASM_TARGET_DIR-bench/pkg" && pwd)" "$WASM_TARGET_DIR-native/release/bench" "$rounds" | sed 's/^/[bench]   /'
# The page: how soon the first view is painted after the shipped wasm is instantiated.
if [ -x /usr/bin/chromium ] && [ -d tests/browser/node_modules/playwright-core ]; then node scripts/bench-page.mjs $QUICK; else echo "[bench] page timing skipped (make test installs Chromium and playwright-core)"; fi
