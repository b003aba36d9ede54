#!/usr/bin/env bash
# npm run verify:cluster: the whole cluster test (tests/cluster/), which starts and stops
# scripts/cluster.sh --throwaway under .tmp/cluster-test itself.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
ensure_haproxy
CLUSTER_FULL=${CLUSTER_FULL:-1} NODE_ENV=test npx vitest run --config vitest.cluster.config.ts "$@"
