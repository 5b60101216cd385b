#!/usr/bin/env bash
# Loads (and on first use creates) the project's git-ignored .env.local, then exports the
# settings every script shares. Sourced, never run.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
ENV_FILE="$ROOT/.env.local"

if [ ! -f "$ENV_FILE" ]; then
  rand() { node -e 'process.stdout.write(require("crypto").randomBytes(24).toString("base64url"))'; }
  cat > "$ENV_FILE" <<ENV
# Created by db/scripts/env.sh on first run; git-ignored. See .env.example for what each line means.
NEXTAUTH_SECRET=$(rand)
NEXTAUTH_URL=http://127.0.0.1:3000
DB_HOST=127.0.0.1
DB_PORT=3366
DB_NAME=sondage
DB_USER=sondage
DB_PASSWORD=$(rand)
S3_ENDPOINT=http://127.0.0.1:4569
S3_BUCKET=sondage-files
S3_ACCESS_KEY_ID=S3RVER
S3_SECRET_ACCESS_KEY=S3RVER
SMTP_HOST=127.0.0.1
SMTP_PORT=2525
MAIL_INBOX_PORT=2580
MAIL_FROM="Sondage <no-reply@sondage.local>"
ENV
  chmod 600 "$ENV_FILE"
fi

set -a
# shellcheck disable=SC1090
. "$ENV_FILE"
set +a

export SONDAGE_ROOT="$ROOT"
export DB_DATA_DIR="$ROOT/.data/mariadb"
export DB_SOCKET="$DB_DATA_DIR/mariadbd.sock"
