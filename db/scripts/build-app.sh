#!/usr/bin/env bash
# Builds the Next app when there is no build yet or any source is newer than the last one.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$ROOT"
stamp="${NEXT_DIST_DIR:-.next}/BUILD_ID"
if [ -f "$stamp" ] && [ -z "$(find app components lib db templates public proxy.ts next.config.mjs tailwind.config.ts package-lock.json -newer "$stamp" -type f 2>/dev/null | head -1)" ]; then
  echo "build: up to date"
else
  echo "build: next build…"
  NEXT_TELEMETRY_DISABLED=1 npx next build
fi
