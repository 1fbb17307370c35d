#!/usr/bin/env bash
# make dist: a versioned static folder for any HTTPS static host.
# dist/nightfield-<crate version>-<content hash>/ holds the page, the wasm engine and the
# catalogs; the service worker's cache name carries the same version, so a newly
# deployed build installs beside the old cache and announces itself.
set -euo pipefail
cd "$(dirname "$0")/.."
ver=$(awk -F'"' '/^version = /{print $2; exit}' Cargo.toml)
hash=$(find www -type f ! -name '*.d.ts' -print0 | sort -z | xargs -0 sha256sum | sha256sum | cut -c1-10)
out="dist/nightfield-$ver-$hash"
rm -rf "$out"; mkdir -p "$out"
cp -r www/. "$out/"
find "$out" -name "*.d.ts" -delete
sed -i "s/^const VERSION = '[^']*';/const VERSION = '$ver-$hash';/" "$out/sw.js"
echo "[dist] $out ($(du -sh "$out" | cut -f1)); serve it over HTTPS (a service worker needs HTTPS or localhost)"
