#!/usr/bin/env bash
# Starts Sondage's private MariaDB instance on 127.0.0.1:$DB_PORT with its data under .data/mariadb,
# installing Debian's mariadb-server first if it is missing. Idempotent: an instance that already
# answers is left alone. Creates the application databases and user (the app never connects as root).
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/env.sh"

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

find_bin() { command -v "$1" 2>/dev/null || { [ -x "/usr/sbin/$1" ] && echo "/usr/sbin/$1"; } || true; }

if [ -z "$(find_bin mariadbd)" ] || [ -z "$(find_bin mariadb-admin)" ]; then
  echo "db: mariadbd not found; installing Debian's mariadb-server (apt-get)…"
  as_root apt-get update -qq
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends \
    mariadb-server mariadb-client >/dev/null
fi
MARIADBD="$(find_bin mariadbd)"
ADMIN="$(find_bin mariadb-admin)"
CLIENT="$(find_bin mariadb)"
INSTALL_DB="$(find_bin mariadb-install-db)"
RUN_AS="$(id -un)"

ping_db() { "$ADMIN" --no-defaults --socket="$DB_SOCKET" -uroot ping >/dev/null 2>&1; }

if ping_db; then
  echo "db: private MariaDB already running (socket $DB_SOCKET)"
else
  mkdir -p "$DB_DATA_DIR"
  if [ ! -d "$DB_DATA_DIR/data/mysql" ]; then
    echo "db: initialising data folder $DB_DATA_DIR/data"
    "$INSTALL_DB" --no-defaults --datadir="$DB_DATA_DIR/data" --user="$RUN_AS" \
      --auth-root-authentication-method=socket --skip-test-db --skip-name-resolve >"$DB_DATA_DIR/install.log" 2>&1
  fi
  rm -f "$DB_SOCKET" "$DB_DATA_DIR/mariadbd.pid"   # stale after a hard kill
  echo "db: starting mariadbd on 127.0.0.1:$DB_PORT"
  nohup setsid "$MARIADBD" --no-defaults --datadir="$DB_DATA_DIR/data" --socket="$DB_SOCKET" \
    --port="$DB_PORT" --bind-address=127.0.0.1 --user="$RUN_AS" --pid-file="$DB_DATA_DIR/mariadbd.pid" \
    --log-error="$DB_DATA_DIR/error.log" --skip-name-resolve --local-infile=1 \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --max-allowed-packet=256M ${DB_EXTRA_FLAGS:-} </dev/null >/dev/null 2>&1 &
  for _ in $(seq 1 300); do ping_db && break; sleep 0.1; done
  ping_db || { echo "db: mariadbd did not start; see $DB_DATA_DIR/error.log" >&2; tail -20 "$DB_DATA_DIR/error.log" >&2; exit 1; }
fi

"$CLIENT" --no-defaults --socket="$DB_SOCKET" -uroot <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`sondage\`.* TO '$DB_USER'@'localhost', '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`sondage\\_%\`.* TO '$DB_USER'@'localhost', '$DB_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
echo "db: ready (database $DB_NAME, user $DB_USER)"
