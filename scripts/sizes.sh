#!/usr/bin/env bash
# Size budgets, measured on the built files: wasm < 300 KB gzipped, everything the app
# precaches for offline use < 6 MB gzipped. Fails when over budget.
set -euo pipefail
cd "$(dirname "$0")/.."
gz() { gzip -9 -c "$1" | wc -c; }
wasm_gz=$(gz www/pkg/nightfield_bg.wasm)
total=0; n=0
while IFS= read -r -d '' f; do total=$((total + $(gz "$f"))); n=$((n + 1)); done \
  < <(find www -type f ! -name '*.map' ! -path 'www/pkg/*.d.ts' ! -name '.gitignore' -print0)
printf '[sizes] wasm: %d bytes gzipped (budget 307200: %.2f of budget)\n' "$wasm_gz" "$(awk "BEGIN{print $wasm_gz/307200}")"
printf '[sizes] offline set: %d files, %d bytes gzipped (budget 6291456: %.2f of budget)\n' "$n" "$total" "$(awk "BEGIN{print $total/6291456}")"
for f in www/catalog/*; do [ -e "$f" ] && printf '[sizes]   %-32s %9d raw %9d gzipped\n' "${f#www/}" "$(stat -c %s "$f")" "$(gz "$f")"; done
fail=0
[ "$wasm_gz" -lt 307200 ] || { echo "[sizes] FAIL: wasm is $wasm_gz bytes gzipped, over the 307200 budget"; fail=1; }
[ "$total" -lt 6291456 ] || { echo "[sizes] FAIL: offline set over 6 MB gzipped"; fail=1; }
exit $fail
