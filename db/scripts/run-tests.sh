#!/usr/bin/env bash
# npm test: all of its own set-up, then every test — unit, integration (real MariaDB), e2e (Debian chromium).
set -euo pipefail
HERE="$(dirname "${BASH_SOURCE[0]}")"
started=$(date +%s)
bash "$HERE/setup-node.sh"
bash "$HERE/system-packages.sh"
. "$HERE/env.sh"
bash "$HERE/db-server.sh"
cd "$SONDAGE_ROOT"

echo "== lint (eslint)"
npm run lint

echo "== format (prettier --check)"
npm run format:check

echo "== types (tsc --noEmit, the whole project including tests/)"
npm run typecheck

echo "== unit tests"
npx vitest run --project unit

echo "== integration tests (database sondage_test)"
npx vitest run --project integration

echo "== build"
bash "$HERE/build-app.sh"

echo "== e2e tests (database sondage_e2e, Debian chromium)"
npx playwright test

echo "npm test: everything passed in $(( $(date +%s) - started )) s"
