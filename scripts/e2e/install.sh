#!/usr/bin/env bash
# Installs what the editor tests need: Debian packages (Chromium, ripgrep, headers for the native
# modules) and code-server 4.100.3 (VS Code 1.100 served to a browser; 4.103+ needs Node 22) into
# .cache/code-server. Idempotent: each step is skipped when its result is already there, and the
# code-server folder is only marked complete (.complete) after every step succeeded.
#
# code-server's own npm install hook downloads ripgrep from outside the npm registry, which this
# machine cannot reach, so the package is unpacked with `npm pack` and installed with
# --ignore-scripts; the native modules are rebuilt explicitly and Debian's `rg` stands in for the
# downloaded one.
set -euo pipefail

CODE_SERVER_VERSION="4.100.3"
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
CACHE="${LOOPWISE_E2E_CACHE:-$ROOT/.cache}"
DEST="$CACHE/code-server"
STAMP="$DEST/.complete"
started=$SECONDS

log() { printf 'e2e-install: %s\n' "$*"; }

# --- Debian packages -------------------------------------------------------------------------
apt_packages=(libkrb5-dev pkg-config ripgrep chromium)
missing=()
for p in "${apt_packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed' || missing+=("$p")
done
if ((${#missing[@]})); then
  log "apt-get install ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
else
  log "Debian packages present"
fi
command -v chromium >/dev/null || { log "chromium missing after install"; exit 1; }
command -v rg >/dev/null || { log "rg missing after install"; exit 1; }

# --- code-server -------------------------------------------------------------------------------
if [[ -f "$STAMP" && "$(cat "$STAMP")" == "$CODE_SERVER_VERSION" ]]; then
  log "code-server $CODE_SERVER_VERSION cached in $DEST ($((SECONDS - started)) s)"
  exit 0
fi

log "installing code-server $CODE_SERVER_VERSION into $DEST"
rm -rf "$DEST" "$CACHE/code-server.tmp"
mkdir -p "$CACHE/code-server.tmp"
(
  cd "$CACHE/code-server.tmp"
  tarball="$(npm pack --silent "code-server@$CODE_SERVER_VERSION")"
  tar -xzf "$tarball"
  rm -f "$tarball"
)
mv "$CACHE/code-server.tmp/package" "$DEST"
rm -rf "$CACHE/code-server.tmp"

cd "$DEST"
npm install --omit=dev --ignore-scripts --no-audit --no-fund --loglevel=error
npm rebuild argon2 --loglevel=error

cd "$DEST/lib/vscode"
npm install --omit=dev --ignore-scripts --no-audit --no-fund --loglevel=error
npm_config_yes=true npm rebuild @parcel/watcher @vscode/spdlog kerberos native-watchdog node-pty @vscode/deviceid --loglevel=error
mkdir -p node_modules/@vscode/ripgrep/bin
ln -sfn "$(command -v rg)" node_modules/@vscode/ripgrep/bin/rg
ln -sfn node_modules node_modules.asar

cd "$DEST/lib/vscode/extensions"
npm install --omit=dev --ignore-scripts --no-audit --no-fund --loglevel=error

[[ -x "$DEST/out/node/entry.js" || -f "$DEST/out/node/entry.js" ]] || { log "code-server entry point missing"; exit 1; }
printf '%s' "$CODE_SERVER_VERSION" > "$STAMP"
log "code-server $CODE_SERVER_VERSION installed ($((SECONDS - started)) s)"
