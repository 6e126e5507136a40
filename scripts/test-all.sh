#!/usr/bin/env bash
# Installs what the tests need on a fresh machine (Debian's Chromium, the npm
# packages from the lock file) and runs every test: type check, unit tests,
# browser tests. Prints a closing "N passed, N failed" line.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -x /usr/bin/chromium ]; then
  SUDO=""; [ "$(id -u)" = 0 ] || SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq chromium >/dev/null
fi
export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1
npm ci --no-audit --no-fund --loglevel=error

rm -rf reports && mkdir -p reports
echo "== type check"
npx tsc --noEmit

echo "== unit tests"
unit_status=0
npx vitest run --reporter=default --reporter=json --outputFile.json=reports/unit.json || unit_status=$?

e2e_status=0
if ls e2e/*.spec.ts >/dev/null 2>&1; then
  echo "== browser tests"
  PLAYWRIGHT_JSON_OUTPUT_NAME=reports/e2e.json npx playwright test --reporter=list,json || e2e_status=$?
fi

node scripts/test-summary.mjs reports/unit.json reports/e2e.json
[ "$unit_status" = 0 ] && [ "$e2e_status" = 0 ]
