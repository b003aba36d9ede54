#!/usr/bin/env bash
# Runs a command with DATABASE_URL pointing at the persistent local database that npm start uses.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
was_up=0; [ -f "${PG_ROOT:-$PWD/.data/pg}/data/postmaster.pid" ] && was_up=1
start_local_db
[ $was_up = 1 ] || trap 'bash scripts/pg.sh stop' EXIT
npx tsx scripts/migrate.ts
npx "$@"
