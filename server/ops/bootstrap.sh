#!/usr/bin/env bash
# Installs what a fresh machine lacks before `npm start` / `npm test` run any TypeScript:
# the npm dependencies, Debian's PostgreSQL and, for tests, Debian's Chromium.
set -euo pipefail
cd "$(dirname "$0")/../.."

want_browser=false
want_vips=false
[ "${1:-}" = "--test" ] && want_browser=true
# The benchmark compares our tiler with Debian's `vips dzsave`.
[ "${1:-}" = "--bench" ] && want_vips=true

if [ ! -d node_modules ]; then
  echo "etchfile: installing npm dependencies (first run)…"
  npm ci --no-audit --no-fund --loglevel=error
elif [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "etchfile: package-lock.json changed; updating npm dependencies…"
  npm install --no-audit --no-fund --loglevel=error
fi

apt_install() {
  if [ "$(id -u)" != "0" ]; then
    echo "etchfile: Debian's '$1' package is needed. Install it with: sudo apt-get install -y $1" >&2
    exit 1
  fi
  echo "etchfile: installing Debian's $1 package…"
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$1" >/dev/null
}

if ! compgen -G "/usr/lib/postgresql/*/bin/initdb" >/dev/null; then apt_install postgresql; fi
if $want_browser && ! command -v chromium >/dev/null; then apt_install chromium; fi
# Figure exports draw their labels with DejaVu Sans (librsvg finds it through fontconfig).
if ! compgen -G "/usr/share/fonts/truetype/dejavu/DejaVuSans*.ttf" >/dev/null; then apt_install fonts-dejavu-core; fi
if $want_vips && ! command -v vips >/dev/null; then apt_install libvips-tools; fi
exit 0
