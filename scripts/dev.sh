#!/usr/bin/env bash
# npm run dev: the server with Vite in middleware mode (hot reload of the client), restarted on
# server changes.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_npm_packages
ensure_debian_packages
bash scripts/db.sh start
bash scripts/redis.sh start
npx tsx api/db/prepare.ts
MW_DEV=1 exec npx tsx watch --clear-screen=false --ignore 'web/**' api/server.ts
