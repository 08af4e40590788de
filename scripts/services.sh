#!/usr/bin/env bash
# Local services for Undertone: PostgreSQL, the object-store fake and the mail fake,
# all on 127.0.0.1. Usage: bash scripts/services.sh start|stop|status
# Ports: PG_PORT (54329), S3_PORT (4569), SMTP_PORT (2525), MAIL_HTTP_PORT (2580).
# Postgres data: .data/pg, or PGDATA_DIR, or /var/lib/undertone/<hash>/pg when the
# postgres user cannot reach the project directory.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
source "$ROOT/scripts/lib/pg.sh"
source "$ROOT/scripts/lib/fakes.sh"

case "${1:-}" in
  start)
    mkdir -p "$DATA"
    pg_start
    fakes_each start
    ;;
  stop)
    fakes_each stop
    pg_stop
    ;;
  status)
    rc=0
    pg_status || rc=1
    fakes_each status || rc=1
    exit "$rc"
    ;;
  *)
    echo "usage: bash scripts/services.sh start|stop|status" >&2
    exit 2
    ;;
esac
