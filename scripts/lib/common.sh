# Shared helpers for scripts/*.sh (sourced, not run). Everything lives under the git-ignored .data/.
# shellcheck shell=bash

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
DATA_DIR="$ROOT/.data"
PGDATA="$DATA_DIR/pg"
export PGPORT="${PGPORT:-55432}"
export NEXT_TELEMETRY_DISABLED=1
export DEBIAN_FRONTEND=noninteractive
DB_ROLE="phasewright"
DB_PASSWORD="phasewright"

log() { printf '[phasewright] %s\n' "$*" >&2; }
die() { printf '[phasewright] error: %s\n' "$*" >&2; exit 1; }

# Run a command as the database owner: "postgres" when we are root, ourselves otherwise.
as_pg() {
  if [ "$(id -u)" = "0" ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

# Is something listening on 127.0.0.1:PORT? (bash's /dev/tcp: no extra tools needed)
port_taken() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# Stop with a message naming the port and the variable to change when a port we need is taken.
require_free_port() {
  local port="$1" var="$2" what="$3"
  if port_taken "$port"; then
    log "error: port $port ($what) is already in use, perhaps by another checkout; set $var to a free port (e.g. $var=$((port + 10)))"
    return 1
  fi
}

# A URL for one database of the local cluster.
db_url() { printf 'postgres://%s:%s@127.0.0.1:%s/%s' "$DB_ROLE" "$DB_PASSWORD" "$PGPORT" "$1"; }

ensure_data_dir() {
  mkdir -p "$DATA_DIR" "$DATA_DIR/mail"
  chmod 755 "$DATA_DIR"
}

ensure_node_modules() {
  if [ ! -x "$ROOT/node_modules/.bin/next" ] || [ ! -x "$ROOT/node_modules/.bin/tsx" ]; then
    log "installing dependencies from the lockfile (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund </dev/null)
  fi
}

# The `phasewright` command (dist-cli/, built by `npm ci`'s prepare script): rebuilt when a source
# it bundles changed, e.g. in a tree whose node_modules came from elsewhere.
ensure_cli() {
  (cd "$ROOT" && node scripts/build-cli.mjs --if-stale --quiet) || die "building the phasewright command failed"
}

apt_install() {
  [ "$(id -u)" = "0" ] || die "need root to apt-get install $* (or install it yourself)"
  log "installing $* from Debian packages"
  apt-get update -q && apt-get install -y -q "$@"
}

# Newest installed PostgreSQL bin dir, installing the packages when none is present.
pg_bin_dir() {
  local dir
  dir="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
  if [ -z "$dir" ] || [ ! -x "$dir/initdb" ]; then
    apt_install postgresql >&2
    dir="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
    [ -n "$dir" ] && [ -x "$dir/initdb" ] || die "PostgreSQL binaries not found after install"
  fi
  printf '%s' "$dir"
}

psql_admin() { as_pg "$PGBIN/psql" -X -q -v ON_ERROR_STOP=1 -h "$PGDATA" -p "$PGPORT" -U postgres "$@"; }

pg_is_running() { [ -d "$PGDATA" ] && as_pg "$PGBIN/pg_ctl" status -D "$PGDATA" >/dev/null 2>&1; }

# Install, initialise and start the cluster in .data/pg on 127.0.0.1:$PGPORT; create the role and
# the main database. Safe to call when it is already running.
pg_up() {
  PGBIN="$(pg_bin_dir)"
  ensure_data_dir
  if [ "$(id -u)" = "0" ] && ! id postgres >/dev/null 2>&1; then
    useradd --system --home-dir /var/lib/postgresql --shell /bin/bash postgres
  fi
  ensure_pg_can_reach_data
  if [ ! -s "$PGDATA/PG_VERSION" ]; then
    log "creating the database cluster in .data/pg"
    mkdir -p "$PGDATA"
    [ "$(id -u)" = "0" ] && chown postgres: "$PGDATA"
    chmod 700 "$PGDATA"
    as_pg "$PGBIN/initdb" -D "$PGDATA" -U postgres -E UTF8 --no-locale \
      --auth-local=trust --auth-host=scram-sha-256 >/dev/null
  fi
  PG_STARTED_HERE=0
  if ! pg_is_running; then
    require_free_port "$PGPORT" PGPORT "PostgreSQL" || exit 1
    log "starting PostgreSQL on 127.0.0.1:$PGPORT"
    PG_STARTED_HERE=1
    # A postmaster.pid left by a killed server is detected and replaced by the server itself.
    as_pg "$PGBIN/pg_ctl" start -w -t 60 -D "$PGDATA" -l "$PGDATA/server.log" \
      -o "-c listen_addresses=127.0.0.1 -p $PGPORT -k $PGDATA" >/dev/null ||
      { tail -n 20 "$PGDATA/server.log" >&2; die "PostgreSQL did not start"; }
  fi
  local running_port
  running_port="$(sed -n 4p "$PGDATA/postmaster.pid" 2>/dev/null || true)"
  [ "$running_port" = "$PGPORT" ] ||
    die "the cluster in .data/pg is running on port $running_port, not $PGPORT (npm run db:stop first)"
  if [ "$(psql_admin -d postgres -tAc "SELECT 1 FROM pg_roles WHERE rolname = '$DB_ROLE'")" != "1" ]; then
    psql_admin -d postgres -c "CREATE ROLE $DB_ROLE LOGIN CREATEDB PASSWORD '$DB_PASSWORD'"
  fi
  ensure_database phasewright
}

# The postgres user must be able to traverse every folder above .data (a checkout under /root isn't).
ensure_pg_can_reach_data() {
  [ "$(id -u)" = "0" ] || return 0
  local dir="" part
  local IFS=/
  for part in ${DATA_DIR#/}; do
    dir="$dir/$part"
    if ! runuser -u postgres -- test -x "$dir"; then
      log "granting others search (o+x) on $dir so that the postgres user can reach .data/pg"
      chmod o+x "$dir"
    fi
  done
}

ensure_database() {
  if [ "$(psql_admin -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$1'")" != "1" ]; then
    log "creating database $1"
    psql_admin -d postgres -c "CREATE DATABASE $1 OWNER $DB_ROLE"
  fi
}

# (Functions that may run where `set -e` is suspended, e.g. inside `if`, check each step themselves.)
recreate_database() {
  psql_admin -d postgres -c "DROP DATABASE IF EXISTS $1 WITH (FORCE)" || return 1
  psql_admin -d postgres -c "CREATE DATABASE $1 OWNER $DB_ROLE" || return 1
}

pg_down() {
  PGBIN="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
  if [ -z "$PGBIN" ] || ! pg_is_running; then log "PostgreSQL is not running"; return 0; fi
  as_pg "$PGBIN/pg_ctl" stop -D "$PGDATA" -m fast -w >/dev/null && log "PostgreSQL stopped"
}

# NEXTAUTH_SECRET: generated once into .data/secret (git-ignored), unless given in the environment.
ensure_secret() {
  if [ -z "${NEXTAUTH_SECRET:-}" ]; then
    if [ ! -s "$DATA_DIR/secret" ]; then
      (umask 077 && node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))' \
        >"$DATA_DIR/secret")
    fi
    NEXTAUTH_SECRET="$(cat "$DATA_DIR/secret")"
  fi
  export NEXTAUTH_SECRET
}

# Fingerprint of the sources a build depends on (tracked and untracked-but-not-ignored files; tests,
# scripts, docs and CI files excluded: next build never reads them). Without git: every file outside the generated folders.
source_fingerprint() {
  (
    cd "$ROOT"
    if git rev-parse --is-inside-work-tree >/dev/null 2>&1; then
      git ls-files -z --cached --others --exclude-standard -- . ':!tests' ':!scripts' ':!*.md' ':!.ci' |
        xargs -0 -r sha1sum 2>/dev/null
    else
      find . \( -path ./node_modules -o -path ./.data -o -path ./.next -o -path ./.git -o -path ./tests \
        -o -path ./public/monaco -o -path ./coverage -o -path ./scripts \) -prune -o -type f \
        ! -name '*.md' ! -name '*.log' ! -name '*.tsbuildinfo' ! -name next-env.d.ts -print0 |
        sort -z | xargs -0 -r sha1sum
    fi
  ) | sha1sum | cut -d' ' -f1
}

# `next build` when .next/BUILD_ID is missing or the sources changed since the last build. The
# fingerprint is taken after the build because `next build` may rewrite tsconfig.json.
ensure_build() {
  if [ -s "$ROOT/.next/BUILD_ID" ] &&
    [ "$(cat "$DATA_DIR/build-fingerprint" 2>/dev/null)" = "$(source_fingerprint)" ]; then
    log "build is current"
    return 0
  fi
  log "building the app (next build)"
  rm -f "$DATA_DIR/build-fingerprint"
  if ! (cd "$ROOT" && npm run build --silent </dev/null); then
    log "next build failed"
    return 1
  fi
  source_fingerprint >"$DATA_DIR/build-fingerprint"
}

# Is the pid in this file one of our processes (node, npm; next renames itself "next-server"), alive and
# not a zombie? Removes a stale file, including one whose pid now belongs to an unrelated process.
pid_alive() {
  local file="$1" pid state
  [ -s "$file" ] || return 1
  pid="$(cat "$file")"
  if [ -r "/proc/$pid/stat" ]; then
    state="$(sed -E 's/^[0-9]+ \(.*\) ([A-Za-z]).*/\1/' "/proc/$pid/stat" 2>/dev/null || true)"
    if [ "$state" != "Z" ] && tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -Eq 'node|next|tsx|npm'; then return 0; fi
  elif kill -0 "$pid" 2>/dev/null; then
    return 0
  fi
  rm -f "$file"
  return 1
}

# Start the object store fake (scripts/s3-fake.ts, s3rver) on 127.0.0.1:PORT with its data in DIR, in
# its own process group; wait until it answers. Args: port, data dir, pid file, log file.
start_s3_fake() {
  local port="$1" dir="$2" pidfile="$3" logfile="$4" i
  mkdir -p "$dir"
  S3_PORT="$port" S3_DATA_DIR="$dir" setsid node_modules/.bin/tsx scripts/s3-fake.ts </dev/null >"$logfile" 2>&1 &
  echo $! >"$pidfile"
  for i in $(seq 1 60); do
    port_taken "$port" && return 0
    pid_alive "$pidfile" || { tail -n 20 "$logfile" >&2; return 1; }
    sleep 0.25
  done
  tail -n 20 "$logfile" >&2
  return 1
}

# Stop the process group recorded in a pid file (TERM, then KILL after 10 s).
stop_pidfile() {
  local file="$1" name="$2" pid i
  if ! pid_alive "$file"; then return 0; fi
  pid="$(cat "$file")"
  kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
  for i in $(seq 1 50); do
    kill -0 "$pid" 2>/dev/null || break
    sleep 0.2
  done
  if kill -0 "$pid" 2>/dev/null; then kill -KILL -- "-$pid" 2>/dev/null || kill -KILL "$pid" 2>/dev/null || true; fi
  rm -f "$file"
  log "stopped $name (pid $pid)"
}
