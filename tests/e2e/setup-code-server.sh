#!/usr/bin/env bash
# Installs what the end-to-end tests need, offline-safe (npm registry and Debian packages only):
#   - Debian packages: chromium (driven headless by playwright-core) and the build headers and
#     ripgrep that code-server's native modules and search need;
#   - code-server 4.100.3 from the npm registry (a real VS Code 1.100 workbench on Node 20),
#     installed into a cache outside the clone so a second run is fast.
# code-server's own install steps download a ripgrep binary from the internet, which these
# machines cannot reach: we install with --ignore-scripts and put the pieces together by hand.
# Usage: tests/e2e/setup-code-server.sh   (prints the code-server binary path on its last line)
set -euo pipefail
VERSION=4.100.3
CACHE=${PNEUMARK_E2E_CACHE:-${XDG_CACHE_HOME:-$HOME/.cache}/pneumark-e2e}
TARGET="$CACHE/code-server-$VERSION"
BIN="$TARGET/node_modules/.bin/code-server"

need="chromium libkrb5-dev libsecret-1-dev libx11-dev libxkbfile-dev pkg-config ripgrep"
missing=$(for p in $need; do dpkg -s "$p" >/dev/null 2>&1 || echo "$p"; done)
if [ -n "$missing" ]; then
  echo "installing Debian packages:" $missing >&2
  SUDO=""; [ "$(id -u)" -ne 0 ] && SUDO=sudo
  $SUDO apt-get update -qq >&2
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq $missing >&2
fi

if [ -x "$BIN" ] && [ -f "$TARGET/.complete" ]; then
  echo "$BIN"
  exit 0
fi

echo "installing code-server $VERSION into $TARGET (once; later runs reuse it)" >&2
rm -rf "$TARGET"
mkdir -p "$TARGET"
cd "$TARGET"
export npm_config_yes=true npm_config_unsafe_perm=true npm_config_audit=false npm_config_fund=false
npm init -y >/dev/null
npm install --ignore-scripts "code-server@$VERSION" >&2
vscode="node_modules/code-server/lib/vscode"
(cd "$vscode" && npm install --omit=dev --ignore-scripts >&2)
mkdir -p "$vscode/node_modules/@vscode/ripgrep/bin"
ln -sf "$(command -v rg)" "$vscode/node_modules/@vscode/ripgrep/bin/rg"
(cd "$vscode" && npm rebuild >&2)
(cd "$vscode" && rm -rf node_modules.asar && ln -s node_modules node_modules.asar)
(cd "$vscode/bin/remote-cli" && ln -sf code-linux.sh code-server)
(cd "$vscode/bin/helpers" && ln -sf browser-linux.sh browser.sh)
(cd "$vscode/extensions" && npm install --omit=dev >&2)
npm rebuild >&2
touch "$TARGET/.complete"
echo "$BIN"
