#!/usr/bin/env bash
# npm run db:stop: stop the PostgreSQL cluster in .data/pg.
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
pg_down
