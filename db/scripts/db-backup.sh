#!/usr/bin/env bash
# npm run db:backup [-- <file.sql.gz>] [--database <name>]
# A consistent logical backup of the application database with mariadb-dump (one transaction, so
# the app can keep writing): schema, data, triggers and routines, gzip-compressed. Default file:
# .data/backups/<database>-<UTC timestamp>.sql.gz. Object storage (evidence, population files,
# locked workpapers) is not in it: back up the bucket alongside (see README).
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/env.sh"

FILE="" DATABASE="$DB_NAME"
while [ $# -gt 0 ]; do
  case "$1" in
    --database) DATABASE="$2"; shift 2 ;;
    *) FILE="$1"; shift ;;
  esac
done
[ -n "$FILE" ] || FILE="$SONDAGE_ROOT/.data/backups/$DATABASE-$(date -u +%Y%m%dT%H%M%SZ).sql.gz"
mkdir -p "$(dirname "$FILE")"

DUMP="$(command -v mariadb-dump || echo /usr/bin/mariadb-dump)"
tmp="$FILE.partial"
# --no-defaults first: Debian's /etc/mysql config must not leak in (STACK-NOTES).
"$DUMP" --no-defaults --socket="$DB_SOCKET" -uroot --single-transaction --quick --routines --triggers --events \
  --hex-blob --default-character-set=utf8mb4 --databases "$DATABASE" | gzip -6 > "$tmp"
mv "$tmp" "$FILE"   # a backup file exists only once complete
echo "db:backup: $DATABASE → $FILE ($(du -h "$FILE" | cut -f1))"
