#!/usr/bin/env bash
# npm start: local services → migrate → seed → build when sources changed → serve the app
# on 127.0.0.1 (PORT, default 3000). Safe to run again: running parts are left running.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
cd "$ROOT"

PORT="${PORT:-3000}"
URL="http://127.0.0.1:$PORT"
APP_PID="$DATA/app.pid"
APP_LOG="$DATA/app.log"
export DATABASE_URL="${DATABASE_URL:-postgres://postgres@127.0.0.1:$PG_PORT/undertone}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-$URL}"

# One secret per checkout, generated on first start and kept in .data/secret.
if [ -z "${NEXTAUTH_SECRET:-}" ]; then
  mkdir -p "$DATA"
  if [ ! -s "$DATA/secret" ]; then
    (umask 077; head -c 32 /dev/urandom | base64 | tr -d '\n=' >"$DATA/secret")
  fi
  NEXTAUTH_SECRET="$(cat "$DATA/secret")"
fi
export NEXTAUTH_SECRET

bash scripts/services.sh start

say "database: migrating"
npm run --silent migrate
say "database: seeding demo data"
npm run --silent seed

# Sources that go into the build; a newer one than the last BUILD_ID means rebuild.
BUILD_INPUTS=(app components lib entities colour migrations public types next.config.mjs
  postcss.config.mjs tsconfig.json package.json package-lock.json mikro-orm.config.ts)
needs_build() {
  [ -f .next/BUILD_ID ] || return 0
  local inputs=() p
  for p in "${BUILD_INPUTS[@]}"; do [ -e "$p" ] && inputs+=("$p"); done
  [ -n "$(find "${inputs[@]}" -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]
}

if pid_alive "$APP_PID" next; then
  say "app: already running (pid $(cat "$APP_PID")) at $URL"
  needs_build && say "app: sources changed since its build; run npm stop && npm start to rebuild"
else
  rm -f "$APP_PID"
  port_open "$PORT" && die "port $PORT is taken by another program; stop it or set PORT"
  if needs_build; then
    say "app: building (next build)"
    t=$(now); npm run --silent build; say "app: built in $(elapsed "$t") s"
  else
    say "app: build is up to date"
  fi
  start_detached app "$APP_PID" "$APP_LOG" node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$PORT"
  answers() { curl -s -o /dev/null --max-time 2 "$URL/"; }
  if ! wait_for 60 answers; then
    tail -n 30 "$APP_LOG" >&2
    die "app did not answer at $URL within 60 s (log: $APP_LOG)"
  fi
  say "app: started (pid $(cat "$APP_PID"), log $APP_LOG)"
fi

say ""
say "Undertone is running at $URL"
if [ -f scripts/demo-accounts.json ]; then
  say "Demo sign-ins:"
  node -e '
    const list = JSON.parse(require("fs").readFileSync("scripts/demo-accounts.json", "utf8"));
    for (const a of list) console.log(`  ${String(a.role).padEnd(6)}  ${a.email}  /  ${a.password}`);
  ' || warn "could not read scripts/demo-accounts.json"
else
  say "(no scripts/demo-accounts.json: no demo sign-ins to show)"
fi
say "Stop everything with: npm stop"
