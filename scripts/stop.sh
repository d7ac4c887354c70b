#!/usr/bin/env bash
# npm run stop: stop the app, the worker the SMTP sink and the object store fake started by `npm start` (not the database).
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
stop_pidfile "$DATA_DIR/app.pid" app
stop_pidfile "$DATA_DIR/worker.pid" worker
stop_pidfile "$DATA_DIR/smtp.pid" "SMTP sink"
stop_pidfile "$DATA_DIR/s3.pid" "object store fake"
