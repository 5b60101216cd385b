#!/usr/bin/env bash
# npm run test:e2e:cluster: the whole e2e suite once through a front door with two app servers
# (playwright.config.ts starts them behind HAProxy when E2E_CLUSTER=1). Sets up what it needs itself,
# as npm test does: packages, the private MariaDB, the build in a folder of its own.
set -euo pipefail
HERE="$(dirname "${BASH_SOURCE[0]}")"
bash "$HERE/setup-node.sh"
bash "$HERE/system-packages.sh"
. "$HERE/env.sh"
bash "$HERE/db-server.sh"
cd "$SONDAGE_ROOT"
export E2E_CLUSTER=1 E2E_SLOT="${E2E_SLOT:-40}" NEXT_DIST_DIR="${NEXT_DIST_DIR:-.next-40}"
bash "$HERE/build-app.sh"
npx playwright test "$@"
