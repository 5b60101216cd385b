#!/usr/bin/env bash
# npm run db:restore -- <file.sql.gz> [--database <name>] [--yes]
# Replaces the application database with a backup made by db:backup: the database is dropped and
# re-created, then the dump is loaded. Without --yes it asks first. Stop the app while restoring.
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/env.sh"

FILE="" DATABASE="$DB_NAME" YES=""
while [ $# -gt 0 ]; do
  case "$1" in
    --database) DATABASE="$2"; shift 2 ;;
    --yes) YES=1; shift ;;
    *) FILE="$1"; shift ;;
  esac
done
[ -n "$FILE" ] && [ -f "$FILE" ] || { echo "db:restore: give the backup file (npm run db:restore -- .data/backups/<file>.sql.gz)" >&2; exit 2; }
gzip -t "$FILE" || { echo "db:restore: $FILE is not a complete gzip file; nothing was changed" >&2; exit 1; }
SOURCE_DB="$(gzip -dc "$FILE" | sed -n 's/^CREATE DATABASE .*`\([^`]*\)`.*/\1/p' | head -1)"
[ -n "$SOURCE_DB" ] || { echo "db:restore: $FILE holds no CREATE DATABASE (not a db:backup file); nothing was changed" >&2; exit 1; }
if [ -z "$YES" ]; then
  read -r -p "Replace database $DATABASE with $FILE (taken from $SOURCE_DB)? [y/N] " answer
  [ "$answer" = "y" ] || [ "$answer" = "Y" ] || { echo "db:restore: cancelled"; exit 1; }
fi

CLIENT="$(command -v mariadb || echo /usr/bin/mariadb)"
"$CLIENT" --no-defaults --socket="$DB_SOCKET" -uroot -e "DROP DATABASE IF EXISTS \`$DATABASE\`; CREATE DATABASE \`$DATABASE\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
# The dump names its own database (USE `source`); point those lines at the target.
gzip -dc "$FILE" | sed -e "s/^CREATE DATABASE .*\`$SOURCE_DB\`.*;\$//" -e "s/^USE \`$SOURCE_DB\`;\$/USE \`$DATABASE\`;/" \
  | "$CLIENT" --no-defaults --socket="$DB_SOCKET" -uroot --default-character-set=utf8mb4 "$DATABASE"
echo "db:restore: $FILE → $DATABASE"
