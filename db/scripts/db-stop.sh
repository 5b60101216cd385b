#!/usr/bin/env bash
# Stops Sondage's private MariaDB instance cleanly (removes its socket and pid file).
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/env.sh"
ADMIN="$(command -v mariadb-admin || echo /usr/bin/mariadb-admin)"
if "$ADMIN" --no-defaults --socket="$DB_SOCKET" -uroot ping >/dev/null 2>&1; then
  "$ADMIN" --no-defaults --socket="$DB_SOCKET" -uroot shutdown
  echo "db: stopped"
else
  echo "db: not running"
fi
