#!/usr/bin/env bash
# Empties one database of the project's MariaDB and builds it again: drop, create, migrate, seed.
#   npm run db:reset                         the development database (MW_DB_NAME, default modewright)
#   MW_DB_NAME=modewright_test npm run db:reset
#   MW_DB_SEED=0 …                          schema only, no demo data (npm test starts so)
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
PATH="/usr/sbin:/sbin:$PATH"
DB="${MW_DB_NAME:-modewright}"
DATA_DIR="${MW_DATA_DIR:-.data}"
case "$DATA_DIR" in /*) ;; *) DATA_DIR="$ROOT/$DATA_DIR" ;; esac

if [[ ! "$DB" =~ ^[A-Za-z0-9_]+$ ]]; then
  echo "db-reset.sh: MW_DB_NAME must be letters, digits and _ only, got \"$DB\"" >&2
  exit 1
fi

bash scripts/db.sh start
echo "db-reset.sh: dropping and re-creating database $DB"
mariadb --no-defaults --socket="$DATA_DIR/mariadb/mariadb.sock" --user=root -e \
  "DROP DATABASE IF EXISTS \`$DB\`; CREATE DATABASE \`$DB\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
bash scripts/db.sh start >/dev/null # grants the app user on the new database again
export MW_DB_NAME="$DB"
node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest
if [[ "${MW_DB_SEED:-1}" == "0" ]]; then
  echo "db-reset.sh: $DB is migrated and empty"
  exit 0
fi
node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts seed:run
echo "db-reset.sh: $DB is migrated and holds the demo scenario"
