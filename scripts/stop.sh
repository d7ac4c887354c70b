#!/usr/bin/env bash
# npm run stop: stop the app, the worker and the SMTP sink started by `npm start` (not the database).
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
stop_pidfile "$DATA_DIR/app.pid" app
stop_pidfile "$DATA_DIR/worker.pid" worker
stop_pidfile "$DATA_DIR/smtp.pid" "SMTP sink"
