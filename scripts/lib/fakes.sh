# The object-store and mail fakes: detached node processes with pid files and logs
# under $DATA. Sourced by services.sh after common.sh.

# name | script | port that proves it is up
FAKES=("s3|scripts/s3-fake.ts|$S3_PORT" "mail|scripts/mail-fake.ts|$MAIL_HTTP_PORT")

fake_start() {
  local name="$1" script="$2" port="$3" pid="$DATA/$1.pid" log="$DATA/$1.log"
  if pid_alive "$pid" "$script"; then
    say "$name fake: already running (pid $(cat "$pid"))"; return 0
  fi
  rm -f "$pid"
  if port_open "$port"; then
    die "$name fake: port $port is taken by another program (stop it, or set the port env)"
  fi
  [ -f "$ROOT/node_modules/tsx/package.json" ] || die "node_modules missing: run npm install first"
  start_detached "$name fake" "$pid" "$log" node --import tsx "$script"
  if ! wait_for 20 port_open "$port"; then
    tail -n 20 "$log" >&2
    die "$name fake did not come up on port $port (log: $log)"
  fi
  pid_alive "$pid" "$script" || { tail -n 20 "$log" >&2; die "$name fake exited (log: $log)"; }
  say "$name fake: started (pid $(cat "$pid"), log $log)"
}

fakes_each() {
  local action="$1" entry name script port rc=0
  for entry in "${FAKES[@]}"; do
    IFS='|' read -r name script port <<<"$entry"
    case "$action" in
      start) fake_start "$name" "$script" "$port" ;;
      stop) stop_pidfile "$name fake" "$DATA/$name.pid" "$script" ;;
      status)
        if pid_alive "$DATA/$name.pid" "$script" && port_open "$port"; then
          say "$name fake: running (pid $(cat "$DATA/$name.pid"))"
        else
          say "$name fake: stopped"; rc=1
        fi ;;
    esac
  done
  return "$rc"
}
