#!/usr/bin/env bash
# Installs the locked npm packages (npm ci) unless node_modules already matches package-lock.json.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$ROOT"
want="$(sha256sum package-lock.json | cut -d' ' -f1)"
stamp=node_modules/.sondage-installed
if [ "$(cat "$stamp" 2>/dev/null)" != "$want" ]; then
  echo "setup: installing npm packages (npm ci)…"
  PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1 npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi
