#!/bin/sh
# Renders a loopform HTML report in headless Chromium, checks it (see browser-check.mjs) and
# writes a full-page screenshot. Installs what is missing: Chromium through apt (when root) and
# playwright-core through npm into a cache directory (nothing is added to the repository).
#
# usage: scripts/browser-check.sh REPORT.html OUT.png
# env:   LOOPFORM_CACHE (default: .cache in the repository), CHROMIUM (default /usr/bin/chromium)
set -eu
if [ $# -ne 2 ]; then
  echo "usage: scripts/browser-check.sh REPORT.html OUT.png" >&2
  exit 2
fi
here=$(cd "$(dirname "$0")" && pwd)
chromium=${CHROMIUM:-/usr/bin/chromium}
if [ ! -x "$chromium" ]; then
  if [ "$(id -u)" -eq 0 ]; then
    echo "browser-check: installing chromium" >&2
    apt-get update -qq >&2 && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >&2
  else
    echo "browser-check: $chromium not found; install it (apt-get install chromium) or set CHROMIUM" >&2
    exit 2
  fi
fi
command -v node >/dev/null || { echo "browser-check: node (20 or later) is needed" >&2; exit 2; }
cache=${LOOPFORM_CACHE:-$(dirname "$here")/.cache}/browser-check
if [ ! -d "$cache/node_modules/playwright-core" ]; then
  echo "browser-check: installing playwright-core into $cache" >&2
  mkdir -p "$cache"
  npm install --no-save --no-audit --no-fund --silent --prefix "$cache" playwright-core >&2
fi
# the .mjs is run from the cache so that its bare import finds playwright-core there
cp "$here/browser-check.mjs" "$cache/browser-check.mjs"
CHROMIUM=$chromium exec node "$cache/browser-check.mjs" "$1" "$2"
