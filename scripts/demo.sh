#!/usr/bin/env bash
# Starts VisViva with demo data on embedded local services at http://127.0.0.1:3000
# (quick start, first command). Ctrl-C stops the app; `npm run demo:stop` stops the services.
set -uo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh || exit 1
exec node node_modules/tsx/dist/cli.mjs scripts/demo.ts "$@"
