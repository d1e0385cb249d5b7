#!/usr/bin/env bash
# The whole test suite: lint, formatting, unit tests, production build (which type-checks every file the
# tsconfig includes, tests too), crash test, browser tests, and the CI-size plant benchmark.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -x /usr/bin/chromium ] || ! command -v pdftotext >/dev/null 2>&1; then
  if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
    echo "Installing Debian's chromium and poppler-utils for the browser and PDF tests…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium poppler-utils >/dev/null
  else
    echo "Browser tests need Debian's chromium and poppler-utils: run 'sudo apt-get install -y chromium poppler-utils', then 'npm test' again." >&2
    exit 1
  fi
fi

export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1 NEXT_TELEMETRY_DISABLED=1
# Each step's heading says how long the suite has run so far, so a slow step shows in CI's log.
step() { echo "== $1 (at $((SECONDS / 60)) min $((SECONDS % 60)) s)"; }
step "lint";        npx eslint . --max-warnings=0
step "format";      npx prettier --check . --log-level=warn
step "unit tests";  npx vitest run
step "build";       npx next build > /tmp/washproof-build.log 2>&1 || { cat /tmp/washproof-build.log; exit 1; }
step "crash test (needs the build)"; npx vitest run --config vitest.build.config.ts
step "browser tests"; npx playwright test
# Fails only if the benchmark breaks (an error or a non-2xx response); a missed target is reported.
step "plant benchmark (CI size)"; npx tsx tests/bench/plant.ts --scale=ci
step "done"
