#!/usr/bin/env bash
# npm run cluster: HAProxy on $PORT (3000) in front of two app servers, a PostgreSQL primary and a
# streaming replica for Debrief, and one process of local fakes (mail, photos) that both servers
# share; all under .data/cluster/ and on loopback. Ctrl-C stops it all.
#   --throwaway   a test cluster (durability off, no client build); CLUSTER_ROOT says where
# It writes $CLUSTER_ROOT/run.env (ports, process ids, database URLs) for the cluster test.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
mode=${1:-}
began=$(date +%s%N)
ensure_node_modules
ensure_haproxy
ROOT=${CLUSTER_ROOT:-$PWD/.data/cluster}
mkdir -p "$ROOT/files"
rm -f "$ROOT/run.env"
pids=()
cleanup() {
  trap '' INT TERM; trap - EXIT  # a second Ctrl-C must not skip stopping the databases
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  for p in "${pids[@]}"; do wait "$p" 2>/dev/null || true; done
  PG_ROOT=$ROOT/replica bash scripts/pg.sh stop
  PG_ROOT=$ROOT/primary bash scripts/pg.sh stop
  rm -f "$ROOT/run.env"
  say "cluster stopped"
}
trap cleanup INT TERM EXIT

DATABASE_URL=$(PG_ROOT=$ROOT/primary bash scripts/pg.sh start "$mode")
PG_ROOT=$ROOT/primary bash scripts/pg.sh allow-replication
DATABASE_REPLICA_URL=$(PG_ROOT=$ROOT/replica PG_PORT=$(( $(cat "$ROOT/primary/port") + 1 )) bash scripts/pg.sh replica "$ROOT/primary" "$mode")
export DATABASE_URL DATABASE_REPLICA_URL

PORT=${PORT:-3000}
APP1_PORT=$(free_port $((PORT + 1))); APP2_PORT=$(free_port $((APP1_PORT + 1)))
SMTP_PORT=$(free_port 2525); S3_PORT=$(free_port $((SMTP_PORT + 1)))
export NODE_ENV=${NODE_ENV:-production} DATA_DIR=$ROOT/files APP_URL=${APP_URL:-http://localhost:$PORT}
export LOCAL_FAKES=0 MAILBOX_DIR=$ROOT/files/mail SMTP_HOST=127.0.0.1 SMTP_PORT S3_ENDPOINT=http://127.0.0.1:$S3_PORT

if [ "$mode" = --throwaway ]; then
  export SERVE_CLIENT=0 DEMO_HISTORY=${DEMO_HISTORY:-40}
else
  say "building the client"
  mkdir -p .tmp/build
  TMPDIR=$PWD/.tmp/build npx vite build --logLevel warn
fi

# healthy: /api/health answers 200 within $2 seconds
wait_healthy() {
  local i
  for ((i = 0; i < $2 * 5; i++)); do
    curl -fsS -o /dev/null "http://127.0.0.1:$1/api/health" 2>/dev/null && return 0
    sleep 0.2
  done
  say "nothing healthy on port $1 after $2 s"; return 1
}

S3_PORT=$S3_PORT node --import tsx server/dev/fakes.ts &
pids+=($!)
# The first server applies the migrations and seeds the demo before the second starts, so the two
# never race for them.
PORT=$APP1_PORT node --import tsx server/index.ts &
app1=$!; pids+=($app1)
wait_healthy "$APP1_PORT" 180
PORT=$APP2_PORT node --import tsx server/index.ts &
app2=$!; pids+=($app2)
wait_healthy "$APP2_PORT" 60

haproxy_config "$PORT" "$APP1_PORT" "$APP2_PORT" > "$ROOT/haproxy.cfg"
haproxy -db -f "$ROOT/haproxy.cfg" &
balancer=$!; pids+=($balancer)
wait_healthy "$PORT" 20

# written aside and moved into place, so a reader never sees it half-written
cat > "$ROOT/run.env.part" <<ENV
PORT=$PORT
APP1_PORT=$APP1_PORT
APP1_PID=$app1
APP2_PORT=$APP2_PORT
APP2_PID=$app2
BALANCER_PID=$balancer
DATABASE_URL=$DATABASE_URL
DATABASE_REPLICA_URL=$DATABASE_REPLICA_URL
PRIMARY_ROOT=$ROOT/primary
REPLICA_ROOT=$ROOT/replica
DATA_DIR=$ROOT/files
STARTED_IN_MS=$(( ($(date +%s%N) - began) / 1000000 ))
ENV
mv "$ROOT/run.env.part" "$ROOT/run.env"
say "cluster up in $(( ($(date +%s%N) - began) / 1000000 )) ms: http://localhost:$PORT (HAProxy) → app servers on $APP1_PORT and $APP2_PORT; primary on port $(cat "$ROOT/primary/port"), replica on port $(cat "$ROOT/replica/port"); Ctrl-C stops it all"
wait "$balancer" || true
