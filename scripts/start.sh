#!/usr/bin/env bash
# npm start: the whole product on a fresh clone — packages, MariaDB, Redis, schema, demo data,
# client, server.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_npm_packages
ensure_debian_packages
bash scripts/db.sh start
bash scripts/redis.sh start
log "migrating the database; demo data when it is empty"
npx tsx api/db/prepare.ts
log "building the client"
npx vite build --logLevel warn
log "compiling the server (when a source changed since the last build)"
node scripts/build-server.mjs
exec node --enable-source-maps dist/server/server.js
