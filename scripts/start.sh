#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, migrate, seed the demo once, build when the
# sources changed, then serve the app in the foreground (with the local SMTP sink and the worker).
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$ROOT"

export PORT="${PORT:-3000}"
export APP_ENV="${APP_ENV:-development}"
export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:2526}"
export S3_PORT="${S3_PORT:-4526}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://localhost:$PORT}"
started=$SECONDS

ensure_data_dir
if pid_alive "$DATA_DIR/app.pid"; then
  die "the app is already running (pid $(cat "$DATA_DIR/app.pid")); run \`npm run stop\` first"
fi

require_free_port "$PORT" PORT "the app" || exit 1
ensure_node_modules
ensure_cli
pg_up
export DATABASE_URL="${DATABASE_URL:-$(db_url phasewright)}"
ensure_secret

# The object store fake comes up before the seed (demo readings may carry attachments), unless
# S3_ENDPOINT names a real store.
if [ -z "${S3_ENDPOINT:-}" ] && ! pid_alive "$DATA_DIR/s3.pid"; then
  require_free_port "$S3_PORT" S3_PORT "the local object store fake" || exit 1
  start_s3_fake "$S3_PORT" "$DATA_DIR/s3" "$DATA_DIR/s3.pid" "$DATA_DIR/s3.log" || die "the object store fake did not start"
fi
trap 'stop_pidfile "$DATA_DIR/s3.pid" "object store fake"' EXIT

node_modules/.bin/tsx scripts/lib/prepare-db.ts # = npm run db:migrate && npm run db:seed
ensure_build

cleanup() {
  trap - EXIT INT TERM
  stop_pidfile "$DATA_DIR/app.pid" app
  stop_pidfile "$DATA_DIR/worker.pid" worker
  stop_pidfile "$DATA_DIR/smtp.pid" "SMTP sink"
  stop_pidfile "$DATA_DIR/s3.pid" "object store fake"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

# Each service runs in its own process group (setsid) so that stop.sh can end it with its children.
if ! pid_alive "$DATA_DIR/smtp.pid"; then
  smtp_port="${SMTP_URL##*:}"
  require_free_port "${smtp_port%%/*}" SMTP_URL "the local SMTP sink" || exit 1
  MAIL_DIR="$DATA_DIR/mail" setsid node_modules/.bin/tsx scripts/smtp-sink.ts &
  echo $! >"$DATA_DIR/smtp.pid"
fi
if [ -f scripts/worker.ts ] && ! pid_alive "$DATA_DIR/worker.pid"; then
  setsid npm run --silent worker </dev/null &
  echo $! >"$DATA_DIR/worker.pid"
fi

setsid node_modules/.bin/next start -p "$PORT" -H 127.0.0.1 </dev/null &
app_pid=$!
echo "$app_pid" >"$DATA_DIR/app.pid"
log "serving http://localhost:$PORT (pid $app_pid; prepared in $((SECONDS - started)) s); \`npm run stop\` stops it"
status=0
wait "$app_pid" || status=$?
rm -f "$DATA_DIR/app.pid"
exit "$status"
