#!/usr/bin/env bash
# npm test: type checks, lint, unit tests, then end-to-end tests in Debian's Chromium against the production build.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -x /usr/bin/chromium ]; then
	if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null; then
		echo "Installing Debian's chromium for the end-to-end tests…"
		apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
	else
		echo "The end-to-end tests need Chromium at /usr/bin/chromium. Install it (Debian: sudo apt-get install chromium) and run npm test again." >&2
		exit 1
	fi
fi

echo "== svelte-check"
npm run --silent check
echo "== lint (Prettier, ESLint with the import-cycle check, knip)"
npm run --silent lint
echo "== unit tests (vitest)"
npx vitest run
echo "== production build"
npm run --silent build > /tmp/bandwright-build.log 2>&1 || { tail -50 /tmp/bandwright-build.log; exit 1; }
echo "== end-to-end tests (Playwright, Chromium)"
npx playwright test
