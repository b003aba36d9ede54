# Shared helpers for the project's scripts. Source it from the repository root.
say() { printf '\033[1m[sparkwright]\033[0m %s\n' "$*" >&2; }

# npm ci when node_modules is missing or older than the lock file
ensure_node_modules() {
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    say "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}

# Debian's Chromium for the end-to-end tests; never a browser download
ensure_chromium() {
  if [ -x /usr/bin/chromium ]; then return; fi
  if [ "$(id -u)" != 0 ]; then say "Chromium is missing: sudo apt-get install chromium"; exit 1; fi
  say "installing Debian's chromium (one time)"
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
}

# the first free TCP port on 127.0.0.1 at or after $1
free_port() {
  local p=$1
  while (exec 3<>/dev/tcp/127.0.0.1/"$p") 2>/dev/null; do p=$((p + 1)); done
  echo "$p"
}

# The S3 SDK is pinned to a release that supports Node 20 (see the team's stack notes); its
# reminder that later releases need Node 22 would only add noise to every log.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true

# The durable local cluster that npm start, npm run dev and seed:history share (fsync on);
# starts it when needed and exports PG_ROOT and DATABASE_URL.
start_local_db() {
  export PG_ROOT=${PG_ROOT:-$PWD/.data/pg}
  DATABASE_URL=$(bash scripts/pg.sh start)
  export DATABASE_URL
}

# Debian's HAProxy for npm run cluster and perf:steps --cluster
ensure_haproxy() {
  if command -v haproxy >/dev/null; then return; fi
  if [ "$(id -u)" != 0 ]; then say "HAProxy is missing: sudo apt-get install haproxy"; exit 1; fi
  say "installing Debian's haproxy (one time)"
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq haproxy >/dev/null
  # the package starts its own service on port 80; the cluster runs its own HAProxy in the foreground
  { systemctl disable --now haproxy || service haproxy stop; } >/dev/null 2>&1 || true
}

# An HAProxy configuration on stdout: listen on 127.0.0.1:$1, round-robin over the app servers on
# the loopback ports that follow, each checked on /api/health every 2 s (a server that refuses a connection is out at once). A refused connection
# is retried on the other server (option redispatch); a request that reached a server that died
# is not replayed by the balancer (the phone's outbox sends it again, and a step sent twice is
# stored once).
haproxy_config() {
  local listen=$1; shift
  cat <<CFG
global
  maxconn 4096
defaults
  mode http
  timeout connect 2s
  timeout client 60s
  timeout server 60s
  timeout http-keep-alive 10s
  # a server busy under load answers its check late, not never: it stays in until three checks fail
  timeout check 10s
  retries 3
  option redispatch
frontend web
  bind 127.0.0.1:$listen
  default_backend app
backend app
  balance roundrobin
  option httpchk GET /api/health
  http-check expect status 200
  default-server check inter 2s fall 3 rise 2 observe layer4 error-limit 1 on-error mark-down
CFG
  local i=1
  for p in "$@"; do echo "  server app$i 127.0.0.1:$p"; i=$((i + 1)); done
}
