#!/usr/bin/env bash
# npm run dev: Vite's dev server on $PORT (default 3000) with a watching API behind its proxy
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
start_local_db
export NODE_ENV=development DATA_DIR=${DATA_DIR:-$PWD/.data}
WEB_PORT=${PORT:-3000}
export API_PORT=${API_PORT:-$(free_port 3100)}
pids=()
cleanup() {
  trap '' INT TERM; trap - EXIT  # a second Ctrl-C must not skip stopping the database
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  wait 2>/dev/null || true
  bash scripts/pg.sh stop
}
trap cleanup INT TERM EXIT
PORT=$API_PORT SERVE_CLIENT=0 APP_URL=http://localhost:$WEB_PORT npx tsx watch server/index.ts &
pids+=($!)
npx vite --port "$WEB_PORT" --strictPort &
pids+=($!)
wait
