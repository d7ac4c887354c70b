#!/usr/bin/env bash
# npm test: the same bootstrap as `npm start` against a fresh phasewright_test database, then lint,
# unit, integration and (when tests/browser has tests) browser tests. Runs every stage; exits
# non-zero when any stage failed.
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$ROOT"

TEST_PORT="${E2E_PORT:-3101}"
TEST_SMTP_PORT="${E2E_SMTP_PORT:-2527}"
TEST_S3_PORT="${E2E_S3_PORT:-4527}"
export APP_ENV=test
export DATABASE_URL="$(db_url phasewright_test)"
# A fresh secret per test run (shared by the test server and the tests through the environment).
export NEXTAUTH_SECRET="${NEXTAUTH_SECRET:-$(node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))')}"

ensure_data_dir
ensure_node_modules
ensure_cli
pg_up
# A cluster this run started is stopped again at the end, so that its port is free for another
# checkout's `npm start`; one that was already running (e.g. `npm start` here) is left as it was.
if [ "$PG_STARTED_HERE" = "1" ] && [ -z "${KEEP_PG:-}" ]; then trap 'pg_down' EXIT; fi
log "recreating database phasewright_test"
recreate_database phasewright_test
node_modules/.bin/tsx scripts/migrate.ts up

# The object store fake for integration and browser tests (fresh data each run), stopped at the end.
stop_s3_fake() { stop_pidfile "$DATA_DIR/test-s3.pid" "test object store fake"; }
export S3_PORT="$TEST_S3_PORT" E2E_S3_PORT="$TEST_S3_PORT" S3_BUCKET="${S3_BUCKET:-phasewright-test}"
unset S3_ENDPOINT
require_free_port "$TEST_S3_PORT" E2E_S3_PORT "the test object store fake" || exit 1
rm -rf "$DATA_DIR/s3-test"
start_s3_fake "$TEST_S3_PORT" "$DATA_DIR/s3-test" "$DATA_DIR/test-s3.pid" "$DATA_DIR/test-s3.log" ||
  die "the test object store fake did not start"
if [ "$PG_STARTED_HERE" = "1" ] && [ -z "${KEEP_PG:-}" ]; then trap 'stop_s3_fake; pg_down' EXIT; else trap 'stop_s3_fake' EXIT; fi

failed=()
stage() {
  local name="$1" t0=$SECONDS
  shift
  log "── $name"
  if "$@"; then log "── $name passed ($((SECONDS - t0)) s)"; else
    failed+=("$name")
    log "── $name FAILED ($((SECONDS - t0)) s)"
  fi
}

stage lint npm run --silent lint
stage unit node_modules/.bin/vitest run --project unit --passWithNoTests
stage integration node_modules/.bin/vitest run --project integration --passWithNoTests

if [ -d tests/browser ] && [ -n "$(find tests/browser -name '*.test.ts' -print -quit)" ]; then
  browser_stage() {
    local base="http://127.0.0.1:$TEST_PORT" i
    [ -x /usr/bin/chromium ] || apt_install chromium
    require_free_port "$TEST_PORT" E2E_PORT "the app under test" || return 1
    require_free_port "$TEST_SMTP_PORT" E2E_SMTP_PORT "the test SMTP sink" || return 1
    ensure_build || return 1
    # Fresh data for the browser (integration tests leave rows behind): recreate, migrate, seed.
    recreate_database phasewright_test || return 1
    node_modules/.bin/tsx scripts/migrate.ts up || return 1
    node_modules/.bin/tsx scripts/seed.ts || return 1
    SMTP_URL="smtp://127.0.0.1:$TEST_SMTP_PORT" MAIL_DIR="$DATA_DIR/mail-test" \
      setsid node_modules/.bin/tsx scripts/smtp-sink.ts >"$DATA_DIR/test-smtp.log" 2>&1 &
    echo $! >"$DATA_DIR/test-smtp.pid"
    PORT="$TEST_PORT" NEXTAUTH_URL="$base" SMTP_URL="smtp://127.0.0.1:$TEST_SMTP_PORT" \
      setsid node_modules/.bin/next start -p "$TEST_PORT" -H 127.0.0.1 </dev/null >"$DATA_DIR/test-app.log" 2>&1 &
    echo $! >"$DATA_DIR/test-app.pid"
    for i in $(seq 1 120); do
      curl -fsS "$base/api/health" >/dev/null 2>&1 && break
      pid_alive "$DATA_DIR/test-app.pid" || { tail -n 30 "$DATA_DIR/test-app.log" >&2; return 1; }
      sleep 0.5
    done
    E2E_BASE_URL="$base" SMTP_URL="smtp://127.0.0.1:$TEST_SMTP_PORT" MAIL_DIR="$DATA_DIR/mail-test" \
      node_modules/.bin/vitest run --project browser
  }
  stop_test_services() {
    stop_pidfile "$DATA_DIR/test-app.pid" "test app"
    stop_pidfile "$DATA_DIR/test-smtp.pid" "test SMTP sink"
  }
  trap 'stop_test_services; stop_s3_fake; [ "$PG_STARTED_HERE" = "1" ] && [ -z "${KEEP_PG:-}" ] && pg_down' EXIT
  stage browser browser_stage
  stop_test_services
fi

if [ "${#failed[@]}" -gt 0 ]; then
  log "FAILED stages: ${failed[*]}"
  exit 1
fi
log "all stages passed"
