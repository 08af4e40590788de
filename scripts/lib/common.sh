# Shared helpers for the service scripts. Sourced, never run.
# ROOT is the project checkout; DATA holds everything the local services write.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
DATA="${UNDERTONE_DATA_DIR:-$ROOT/.data}"

PG_PORT="${PG_PORT:-54329}"
S3_PORT="${S3_PORT:-4569}"
SMTP_PORT="${SMTP_PORT:-2525}"
MAIL_HTTP_PORT="${MAIL_HTTP_PORT:-2580}"
export PG_PORT S3_PORT SMTP_PORT MAIL_HTTP_PORT
# The app, the seed and the tests find the services through these (lib/env.ts); derived
# from the ports so a checkout run on other ports stays consistent.
export S3_ENDPOINT="${S3_ENDPOINT:-http://127.0.0.1:$S3_PORT}"
export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:$SMTP_PORT}"
export MAIL_FAKE_URL="${MAIL_FAKE_URL:-http://127.0.0.1:$MAIL_HTTP_PORT}"
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true

say() { printf '%s\n' "$*"; }
warn() { printf 'warning: %s\n' "$*" >&2; }
die() { printf 'error: %s\n' "$*" >&2; exit 1; }

# True when something accepts TCP connections on 127.0.0.1:$1.
port_open() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# wait_for SECONDS COMMAND...: retry COMMAND every 0.2 s until it succeeds or time runs out.
wait_for() {
  local limit=$(( $1 * 5 )) i=0; shift
  until "$@"; do
    i=$((i + 1)); [ "$i" -ge "$limit" ] && return 1
    sleep 0.2
  done
}

# proc_alive PID: the process exists and is not a zombie (a killed process may linger as
# a zombie until its parent reaps it, and kill -0 still succeeds on it).
proc_alive() {
  local state
  state="$(sed -E 's/^[0-9]+ \(.*\) ([A-Za-z]).*/\1/' "/proc/$1/stat" 2>/dev/null)" || return 1
  [ -n "$state" ] && [ "$state" != Z ] && [ "$state" != X ]
}

# pid_alive PIDFILE [PATTERN]: the pid in PIDFILE is running (and its command line
# contains PATTERN, so a recycled pid is not mistaken for ours).
pid_alive() {
  local file="$1" pattern="${2:-}" pid
  [ -f "$file" ] || return 1
  pid="$(cat "$file" 2>/dev/null)"
  [[ "$pid" =~ ^[0-9]+$ ]] || return 1
  proc_alive "$pid" || return 1
  [ -z "$pattern" ] && return 0
  tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -qF -- "$pattern"
}

# stop_pidfile NAME PIDFILE PATTERN: TERM the process, wait, KILL if it lingers.
stop_pidfile() {
  local name="$1" file="$2" pattern="$3" pid
  if ! pid_alive "$file" "$pattern"; then
    rm -f "$file"; say "$name: not running"; return 0
  fi
  pid="$(cat "$file")"
  kill "$pid" 2>/dev/null || true
  if ! wait_for 10 eval "! proc_alive $pid"; then
    warn "$name (pid $pid) ignored TERM; killing"
    kill -9 "$pid" 2>/dev/null || true
  fi
  rm -f "$file"
  say "$name: stopped (pid $pid)"
}

# start_detached NAME PIDFILE LOGFILE COMMAND...: run COMMAND in its own session, in the
# background, with output appended to LOGFILE; write its pid.
start_detached() {
  local name="$1" pidfile="$2" log="$3"; shift 3
  mkdir -p "$(dirname "$log")"
  printf '\n--- %s start %s\n' "$name" "$(date -Is)" >>"$log"
  (cd "$ROOT" && exec setsid "$@" >>"$log" 2>&1 </dev/null) &
  echo $! >"$pidfile"
}

# Seconds since the epoch with milliseconds, for phase timings.
now() { date +%s.%N; }
elapsed() { awk -v a="$1" -v b="$(now)" 'BEGIN { printf "%.1f", b - a }'; }
