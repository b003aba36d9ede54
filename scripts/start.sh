#!/usr/bin/env bash
# npm start: everything from a fresh clone to a running app, with durable local data under .data/
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
start_local_db
export NODE_ENV=${NODE_ENV:-production} PORT=${PORT:-3000} DATA_DIR=${DATA_DIR:-$PWD/.data}
server_pid=""
cleanup() {
  trap '' INT TERM; trap - EXIT  # a second Ctrl-C must not skip stopping the database
  if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then kill -TERM "$server_pid" 2>/dev/null; wait "$server_pid" 2>/dev/null || true; fi
  bash scripts/pg.sh stop
  say "stopped"
}
trap cleanup INT TERM EXIT
say "building the client"
mkdir -p .tmp/build
TMPDIR=$PWD/.tmp/build npx vite build --logLevel warn
say "starting the app on port $PORT"
node --import tsx server/index.ts &
server_pid=$!
wait "$server_pid" || true
