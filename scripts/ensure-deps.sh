#!/usr/bin/env bash
# Installs what the quick-start commands need on a fresh machine: npm packages (from the
# lock file) and, for the browser tests, Debian's chromium. Safe to run again.
set -euo pipefail
cd "$(dirname "$0")/.."

major=$(node -p 'process.versions.node.split(".")[0]' 2>/dev/null || echo 0)
if [ "$major" -lt 20 ]; then
  echo "VisViva needs Node.js 20 or newer (found $(node --version 2>/dev/null || echo none))." >&2
  exit 1
fi

if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[deps] installing npm packages (npm ci)..." >&2
  npm ci --no-audit --no-fund --loglevel=error >&2
fi

need_chromium="${1:-}"
if [ "$need_chromium" = "--with-browser" ] && [ ! -x /usr/bin/chromium ]; then
  if [ "$(id -u)" = "0" ]; then
    echo "[deps] installing Debian's chromium for the browser tests..." >&2
    apt-get update -qq >&2
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends chromium >&2
  else
    echo "[deps] the browser tests need Debian's chromium: run 'sudo apt-get install -y chromium' and start again." >&2
    exit 1
  fi
fi
