#!/usr/bin/env bash
# `npm start`: PostgreSQL (installed if missing), mail capture and S3 store on loopback, migrations,
# the demo seed, the web build when it is stale, then the one Node process serving web and API.
# Ctrl-C stops the server and the services; PostgreSQL keeps running (npm run db:stop).
set -euo pipefail
cd "$(dirname "$0")/.."
root=$(pwd)

say() { printf '\033[1m[gapwise]\033[0m %s\n' "$*"; }

say "starting PostgreSQL on 127.0.0.1:${PGPORT:-54329}…"
pg_out=$(bash docker-free-scripts/postgres-start.sh)
DATABASE_URL=${DATABASE_URL:-$(printf '%s\n' "$pg_out" | sed -n 's/^DATABASE_URL=//p' | tail -n 1)}
export DATABASE_URL


export SMTP_PORT=${SMTP_PORT:-2525} MAIL_UI_PORT=${MAIL_UI_PORT:-2526} S3_PORT=${S3_PORT:-4568}
export S3_ENDPOINT=${S3_ENDPOINT:-http://127.0.0.1:${S3_PORT}}
say "starting mail capture (SMTP ${SMTP_PORT}) and the S3-compatible store (${S3_PORT})…"
node docker-free-scripts/run-bundled.mjs docker-free-scripts/services.ts &
services_pid=$!
cleanup() {
  kill "$services_pid" 2>/dev/null || true
  wait "$services_pid" 2>/dev/null || true
}
trap cleanup EXIT
trap 'exit 130' INT TERM

# Wait until the object store answers before the seed writes demo files into it.
for _ in $(seq 1 60); do
  if (exec 3<>"/dev/tcp/127.0.0.1/${S3_PORT}") 2>/dev/null; then break; fi
  sleep 0.5
done

say "applying migrations and the demo seed…"
npx tsx db/migrate.ts
npx tsx apps/api/src/seed/seed-demo.ts

# Rebuild the web app only when a source file is newer than the last build.
index=dist/web/browser/index.html
if [ ! -f "$index" ] || [ -n "$(find apps/web/src libs angular.json -newer "$index" -type f -print -quit 2>/dev/null)" ]; then
  say "building the web app (about a minute on a cold machine)…"
  npx ng build --configuration production
else
  say "web app build is up to date"
fi


port=${PORT:-4280}
cat <<MSG

  Gapwise: http://127.0.0.1:${port}/
  Demo sign-ins (password: gapwise-demo):
    owner@gapwise.test     owner of both demo workspaces
    editor@gapwise.test    editor in the photoredox lab
    reviewer@gapwise.test  reviewer in the photoredox lab
    viewer@gapwise.test    viewer in the photoredox lab
  E-mail sent by the app: http://127.0.0.1:${MAIL_UI_PORT}/messages
  Change or drop the demo accounts before real use (see README.md).

MSG
node docker-free-scripts/run-bundled.mjs apps/api/src/main.ts
