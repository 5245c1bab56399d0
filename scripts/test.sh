#!/usr/bin/env bash
# npm test: every check, on a fresh clone. Installs what is missing (npm packages, MariaDB, Redis,
# Chromium), starts the project's MariaDB and Redis, re-creates the test database, then typecheck,
# lint, the client build and all Vitest projects (engine, API against MariaDB, browser tests in Chromium).
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_npm_packages
ensure_debian_packages with-chromium
bash scripts/db.sh start
bash scripts/redis.sh start
# A new, empty test database every run: no test depends on what an earlier run left behind.
log "re-creating the test database"
MW_DB_NAME=modewright_test MW_DB_SEED=0 bash scripts/db-reset.sh >/dev/null
log "typecheck"
npx tsc --noEmit -p tsconfig.json
log "lint"
npx eslint . --max-warnings 0
log "building the client"
npx vite build --logLevel warn
log "tests"
export MW_DB_NAME=modewright_test
exec npx vitest run
