#!/usr/bin/env bash
# Everything CI runs: type check, lint, build, then unit, reference, component, API and browser tests.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-chromium.sh
echo "== type check"
npx vue-tsc --noEmit -p tsconfig.app.json
npx tsc --noEmit -p tsconfig.node.json
echo "== lint"
npx eslint . --max-warnings 0
echo "== build"
npx vite build --logLevel warn
echo "== tests"
npx vitest run
