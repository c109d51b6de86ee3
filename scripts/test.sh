#!/usr/bin/env bash
# The whole test suite on the real local services (quick start, second command; .ci/run).
set -uo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh --with-browser || exit 1
exec node node_modules/tsx/dist/cli.mjs scripts/test-run.ts "$@"
