#!/usr/bin/env bash
# `npm run bench` (a benchmark, not a test): the solver rows (scripts/bench.ts), then the speed goals
# of the runs feature (scripts/bench-app.ts) against a database of its own, phasewright_bench.
#
#   BENCH_DB          database to use (default phasewright_bench; phasewright / phasewright_test refused)
#   BENCH_BASE_URL    an app to time over HTTP (default http://127.0.0.1:3000) — only with BENCH_API_TOKEN,
#   BENCH_API_TOKEN   a pw_… token of that app's database (the bench never writes to another database)
#   BENCH_SERVE       1 (default): without a token, serve the existing .next build on BENCH_PORT (3197)
#                     against the bench database for the HTTP figures; 0: in-process figures only
#   BENCH_SKIP_SOLVER 1: skip scripts/bench.ts
set -euo pipefail
# shellcheck source=lib/common.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
cd "$ROOT"

BENCH_DB="${BENCH_DB:-phasewright_bench}"
case "$BENCH_DB" in
  phasewright | phasewright_test) die "BENCH_DB=$BENCH_DB is shared; the bench uses a database of its own" ;;
esac
[[ "$BENCH_DB" =~ ^[a-z_][a-z0-9_]*$ ]] || die "BENCH_DB must be a plain lower-case name"

ensure_node_modules
ensure_cli
pg_up
ensure_database "$BENCH_DB"
DATABASE_URL="$(db_url "$BENCH_DB")"
export DATABASE_URL BENCH_DB
ensure_secret
log "migrating $BENCH_DB"
npx tsx scripts/migrate.ts up

# Is the .next build older than the sources? (Reported beside the first-load sizes.)
if [ -s .next/BUILD_ID ]; then
  if [ "$(cat "$DATA_DIR/build-fingerprint" 2>/dev/null)" = "$(source_fingerprint)" ]; then
    export BENCH_BUILD_STATE="current"
  else
    export BENCH_BUILD_STATE="older than the sources"
  fi
fi

# A private app on the bench database, so that the HTTP figures need no token from a shared database.
SERVER_PID=""
stop_server() {
  if [ -n "$SERVER_PID" ] && kill -0 "$SERVER_PID" 2>/dev/null; then
    kill -TERM -- "-$SERVER_PID" 2>/dev/null || kill -TERM "$SERVER_PID" 2>/dev/null || true
    for _ in $(seq 1 50); do
      kill -0 "$SERVER_PID" 2>/dev/null || break
      sleep 0.2
    done
    kill -0 "$SERVER_PID" 2>/dev/null && { kill -KILL -- "-$SERVER_PID" 2>/dev/null || true; }
    log "stopped the bench app (pid $SERVER_PID)"
  fi
  SERVER_PID=""
}
trap stop_server EXIT

if [ -z "${BENCH_API_TOKEN:-}" ] && [ "${BENCH_SERVE:-1}" = "1" ]; then
  BENCH_PORT="${BENCH_PORT:-3197}"
  if [ ! -s .next/BUILD_ID ]; then
    log "no .next build: the solve round trip is timed in-process only"
  elif curl -s -o /dev/null -m 1 "http://127.0.0.1:$BENCH_PORT/"; then
    log "port $BENCH_PORT is taken: the solve round trip is timed in-process only (set BENCH_PORT)"
  else
    log "serving the .next build on 127.0.0.1:$BENCH_PORT against $BENCH_DB"
    mkdir -p "$DATA_DIR"
    setsid env PORT="$BENCH_PORT" NEXTAUTH_URL="http://127.0.0.1:$BENCH_PORT" OUTBOX_AUTODELIVER=0 \
      SMTP_URL="smtp://127.0.0.1:9" node_modules/.bin/next start -H 127.0.0.1 -p "$BENCH_PORT" \
      >"$DATA_DIR/bench-app.log" 2>&1 </dev/null &
    SERVER_PID=$!
    for _ in $(seq 1 150); do
      curl -sf -o /dev/null -m 1 "http://127.0.0.1:$BENCH_PORT/api/health" && break
      kill -0 "$SERVER_PID" 2>/dev/null || break
      sleep 0.2
    done
    if curl -sf -o /dev/null -m 2 "http://127.0.0.1:$BENCH_PORT/api/health"; then
      export BENCH_OWN_URL="http://127.0.0.1:$BENCH_PORT"
    else
      log "the bench app did not come up (see .data/bench-app.log): in-process only"
      stop_server
    fi
  fi
fi

status=0
if [ "${BENCH_SKIP_SOLVER:-0}" != "1" ]; then
  echo "## Solver"
  npx tsx scripts/bench.ts || status=1
  echo
  echo "## The phasewright command (fresh processes)"
  npx tsx scripts/bench-cli.ts || status=1
  echo
fi
npx tsx scripts/bench-app.ts || status=1
echo
echo "## Adversarial inputs (issue 13)"
npx tsx scripts/bench-bounds.ts || status=1
echo
echo "## Health under load"
npx tsx scripts/bench-health.ts || status=1
exit "$status"
