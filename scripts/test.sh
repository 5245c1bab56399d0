#!/usr/bin/env bash
# npm test: every check, on a fresh clone. Installs what is missing (npm packages, MariaDB,
# Chromium), starts the project's MariaDB, migrates the test database, then typecheck, lint, the
# client build and all Vitest projects (engine, API against MariaDB, browser tests in Chromium).
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_npm_packages
ensure_debian_packages with-chromium
bash scripts/db.sh start
log "migrating the test database"
MW_DB_NAME=modewright_test npx tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts \
  migrate:latest >/dev/null
log "typecheck"
npx tsc --noEmit -p tsconfig.json
log "lint"
npx eslint . --max-warnings 0
log "building the client"
npx vite build --logLevel warn
log "tests"
export MW_DB_NAME=modewright_test
exec npx vitest run
