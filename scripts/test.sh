#!/usr/bin/env bash
# npm test: the whole suite on fresh test databases.
#   chromium (Debian package, once) → services → fresh undertone_test and undertone_e2e →
#   migrate both, seed e2e → vitest (unit + integration) → next build → Playwright.
# Services are left running afterwards (npm stop ends them). Exits nonzero on any failure;
# a failing vitest run still goes on to the build and Playwright so one run shows everything.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
source "$ROOT/scripts/lib/pg.sh"
cd "$ROOT"

export TEST_DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/undertone_test"
export E2E_DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/undertone_e2e"
export NEXTAUTH_SECRET="${NEXTAUTH_SECRET:-undertone-test-secret-not-for-use}"

TIMINGS=()
FAILED=()
START=$(now)

summary() {
  local rc=$?
  say ""
  say "── timings ──"
  local line; for line in "${TIMINGS[@]}"; do say "  $line"; done
  say "  total              $(elapsed "$START") s"
  if [ "${#FAILED[@]}" -gt 0 ]; then say "FAILED: ${FAILED[*]}"; [ "$rc" = 0 ] && rc=1;
  elif [ "$rc" != 0 ]; then say "FAILED (exit $rc)"; else say "all passed"; fi
  exit "$rc"
}
trap summary EXIT

# phase NAME MUST COMMAND...: run, time, record. MUST=1 stops the run on failure.
phase() {
  local name="$1" must="$2" t rc=0; shift 2
  say ""; say "══ $name"
  t=$(now)
  "$@" || rc=$?
  TIMINGS+=("$(printf '%-18s %6s s%s' "$name" "$(elapsed "$t")" "$([ "$rc" = 0 ] || echo "  (failed, exit $rc)")")")
  if [ "$rc" != 0 ]; then
    FAILED+=("$name")
    [ "$must" = 1 ] && exit "$rc"
  fi
  return 0
}

chromium() {
  if [ -x /usr/bin/chromium ]; then say "chromium: /usr/bin/chromium present"; return 0; fi
  [ "$(id -u)" = 0 ] || die "/usr/bin/chromium is missing; install Debian's chromium package"
  say "chromium: installing Debian's chromium package (one-time)"
  DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=600 update -qq &&
    DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=600 install -y -qq chromium >/dev/null &&
    [ -x /usr/bin/chromium ]
}

fresh_databases() {
  PGDIR="$(pg_datadir)"
  pg_recreate undertone_test && pg_recreate undertone_e2e && say "undertone_test, undertone_e2e: created fresh"
}

migrate_and_seed() {
  # (&& chains: errexit does not apply inside a function run under `||`)
  DATABASE_URL="$TEST_DATABASE_URL" npm run --silent migrate &&
    DATABASE_URL="$E2E_DATABASE_URL" npm run --silent migrate &&
    DATABASE_URL="$E2E_DATABASE_URL" npm run --silent seed
}

phase chromium 1 chromium
phase services 1 bash scripts/services.sh start
phase "fresh databases" 1 fresh_databases
phase "migrate + seed" 1 migrate_and_seed
# The integration globalSetup need not start services or migrate again.
phase vitest 0 env UNDERTONE_TEST_DB_READY=1 npx vitest run
phase build 1 npm run --silent build
phase playwright 0 npx playwright test
say ""
say "Services are still running (npm stop ends them)."
