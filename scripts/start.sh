#!/usr/bin/env bash
# npm start: the whole product on a fresh clone — packages, MariaDB, schema, demo data, client, server.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_npm_packages
ensure_debian_packages
bash scripts/db.sh start
log "migrating the database"
npx tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest >/dev/null
npx tsx scripts/seed-if-empty.ts
log "building the client"
npx vite build --logLevel warn
cat <<'TXT'

  Demo sign-ins (password for all: modewright-demo)
    Ines Marlow     ines.marlow@brackwater.example      author
    Tomasz Reyes    tomasz.reyes@brackwater.example     checker
    Priya Anand     priya.anand@brackwater.example      principal
    Lena Ostrowski  lena.ostrowski@kestrelquay.example  viewer (client)
    Ada Brennan     ada.brennan@brackwater.example      admin

TXT
exec npx tsx api/server.ts
