#!/usr/bin/env bash
# npm start: everything a fresh clone needs, then Sondage on http://127.0.0.1:3000 with the demo data.
set -euo pipefail
HERE="$(dirname "${BASH_SOURCE[0]}")"
bash "$HERE/setup-node.sh"
. "$HERE/env.sh"
bash "$HERE/db-server.sh"
cd "$SONDAGE_ROOT"
npx tsx db/migrate.ts latest
npx tsx db/seed.ts
bash "$HERE/build-app.sh"

FAKES_PID=""
if [ -f lib/fakes/run-fakes.ts ]; then
  npx tsx lib/fakes/run-fakes.ts & FAKES_PID=$!
fi
trap '[ -n "$FAKES_PID" ] && kill "$FAKES_PID" 2>/dev/null || true' EXIT INT TERM

PORT="${PORT:-3000}"
# Once the server answers, load the demo ledger and a first sample through the app's own API (once).
( node -e 'const u=process.argv[1];(async()=>{for(let i=0;i<240;i++){try{if((await fetch(u)).ok)return}catch{}await new Promise(r=>setTimeout(r,500))}})()' "http://127.0.0.1:$PORT/sign-in"
  npx tsx db/seeds/demo-fieldwork.ts "http://127.0.0.1:$PORT" ) &

echo
echo "Sondage is starting on http://127.0.0.1:3000 — sign in as manager@marrow-quill.example / sondage-demo-2026 (README lists every demo account)."
# A larger young generation cuts garbage collection in the ledger parser (measured in npm run bench).
NEXT_TELEMETRY_DISABLED=1 node --max-semi-space-size=64 node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$PORT"
