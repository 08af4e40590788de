# PostgreSQL from Debian's packages, run as the `postgres` OS user on 127.0.0.1:$PG_PORT
# with its own cluster. Sourced by services.sh after common.sh.

PG_DATABASES=(undertone undertone_test undertone_e2e)

pg_bin() {
  local dir
  dir="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)"
  [ -n "$dir" ] && [ -x "$dir/pg_ctl" ] && printf '%s' "$dir"
}

pg_install() {
  [ -n "$(pg_bin)" ] && return 0
  [ "$(id -u)" = 0 ] || die "PostgreSQL is not installed and only root can install it (apt-get install postgresql)"
  say "postgres: installing Debian's postgresql package (one-time)"
  export DEBIAN_FRONTEND=noninteractive
  apt-get -o DPkg::Lock::Timeout=600 update -qq && apt-get -o DPkg::Lock::Timeout=600 install -y -qq postgresql >/dev/null \
    || die "apt-get install postgresql failed"
  [ -n "$(pg_bin)" ] || die "postgresql installed but no /usr/lib/postgresql/*/bin/pg_ctl found"
}

pg_user() {
  id -u postgres >/dev/null 2>&1 && return 0
  say "postgres: creating the postgres OS user"
  useradd --system --user-group --home-dir /var/lib/postgresql --shell /bin/bash postgres \
    || die "could not create the postgres user"
}

# From / so postgres does not complain about a working directory it cannot enter.
as_pg() {
  if [ "$(id -un)" = postgres ]; then "$@"; else (cd / && runuser -u postgres -- "$@"); fi
}

# Where the cluster lives. Inside the project unless PGDATA_DIR says otherwise or the
# postgres user cannot reach the project (e.g. a clone under a 0700 /root).
pg_datadir() {
  if [ -n "${PGDATA_DIR:-}" ]; then printf '%s' "$PGDATA_DIR"; return; fi
  mkdir -p "$DATA"
  if as_pg test -x "$DATA" 2>/dev/null; then
    printf '%s' "$DATA/pg"
  else
    local hash
    hash="$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)"
    printf '/var/lib/undertone/%s/pg' "$hash"
  fi
}

pg_ctl_() { as_pg "$(pg_bin)/pg_ctl" -D "$PGDIR" "$@"; }

pg_ready() { "$(pg_bin)/pg_isready" -q -U postgres -h 127.0.0.1 -p "$PG_PORT" -t 1; }

# Our own check rather than `pg_ctl status`, which takes a zombie postmaster for a live one.
pg_running() {
  local pid
  pid="$(head -n 1 "$PGDIR/postmaster.pid" 2>/dev/null)" || return 1
  [[ "$pid" =~ ^[0-9]+$ ]] && proc_alive "$pid" && [ "$(cat "/proc/$pid/comm" 2>/dev/null)" = postgres ]
}

pg_psql() { "$(pg_bin)/psql" -X -q -v ON_ERROR_STOP=1 -U postgres -h 127.0.0.1 -p "$PG_PORT" "$@"; }

pg_init() {
  [ -f "$PGDIR/PG_VERSION" ] && return 0
  # Directories created here stay traversable for postgres whatever the caller's umask.
  (umask 022 && mkdir -p "$PGDIR")
  as_pg test -x "$(dirname "$PGDIR")" 2>/dev/null \
    || die "the postgres user cannot reach $(dirname "$PGDIR"); choose another PGDATA_DIR"
  chown postgres:postgres "$PGDIR" && chmod 700 "$PGDIR"
  say "postgres: initdb in $PGDIR"
  as_pg "$(pg_bin)/initdb" -D "$PGDIR" -U postgres --auth=trust --encoding=UTF8 --no-locale \
    >"$DATA/pg-initdb.log" 2>&1 || { cat "$DATA/pg-initdb.log" >&2; die "initdb failed"; }
  echo "include_if_exists = 'undertone.conf'" | as_pg tee -a "$PGDIR/postgresql.conf" >/dev/null
}

# Settings rewritten on every start, so a changed PG_PORT takes effect on the next start.
# fsync/synchronous_commit/full_page_writes are off for the whole local cluster: it only
# holds development and test data, and a crash of the machine may lose it.
pg_conf() {
  as_pg tee "$PGDIR/undertone.conf" >/dev/null <<CONF
listen_addresses = '127.0.0.1'
port = $PG_PORT
unix_socket_directories = ''
fsync = off
synchronous_commit = off
full_page_writes = off
max_connections = 100
CONF
}

# After a kill -9 the postmaster.pid may name a pid that now belongs to something else.
pg_clear_stale_pid() {
  local f="$PGDIR/postmaster.pid" pid
  [ -f "$f" ] || return 0
  pg_running && return 0
  pid="$(head -n 1 "$f")"
  say "postgres: removing stale postmaster.pid (pid $pid is gone)"
  rm -f "$f"
}

pg_start() {
  pg_install; pg_user
  PGDIR="$(pg_datadir)"
  [ "$PGDIR" != "$DATA/pg" ] && [ -z "${PGDATA_DIR:-}" ] && \
    say "postgres: the postgres user cannot reach $DATA; using $PGDIR instead (set PGDATA_DIR to choose)"
  pg_init
  pg_clear_stale_pid
  if pg_running; then
    wait_for 30 pg_ready || die "postgres runs but does not answer on 127.0.0.1:$PG_PORT (log: $PGDIR/server.log)"
    say "postgres: already running on 127.0.0.1:$PG_PORT ($PGDIR)"
  else
    if port_open "$PG_PORT"; then die "port $PG_PORT is taken by another program; set PG_PORT"; fi
    pg_conf
    pg_ctl_ -l "$PGDIR/server.log" -w -t 60 start >/dev/null \
      || { tail -n 20 "$PGDIR/server.log" >&2; die "postgres did not start (log: $PGDIR/server.log)"; }
    wait_for 30 pg_ready || die "postgres started but does not answer on 127.0.0.1:$PG_PORT"
    say "postgres: started on 127.0.0.1:$PG_PORT ($PGDIR)"
  fi
  local db
  for db in "${PG_DATABASES[@]}"; do pg_createdb "$db"; done
}

pg_createdb() {
  if [ -z "$(pg_psql -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$1'")" ]; then
    pg_psql -d postgres -c "CREATE DATABASE \"$1\"" && say "postgres: created database $1"
  fi
}

# Drop and create a database afresh (used by the test run).
pg_recreate() {
  pg_psql -d postgres -c "DROP DATABASE IF EXISTS \"$1\" WITH (FORCE)" -c "CREATE DATABASE \"$1\""
}

pg_stop() {
  [ -n "$(pg_bin)" ] && id -u postgres >/dev/null 2>&1 || { say "postgres: not installed"; return 0; }
  PGDIR="$(pg_datadir)"
  if [ -f "$PGDIR/PG_VERSION" ] && pg_running; then
    pg_ctl_ -m fast -w -t 60 stop >/dev/null && say "postgres: stopped"
  else
    say "postgres: not running"
  fi
}

pg_status() {
  PGDIR="$(pg_datadir)"
  if [ -n "$(pg_bin)" ] && [ -f "$PGDIR/PG_VERSION" ] && pg_running && pg_ready; then
    say "postgres: running on 127.0.0.1:$PG_PORT ($PGDIR)"
  else
    say "postgres: stopped"; return 1
  fi
}
