#!/usr/bin/env bash
# Keeps one command running: supervise.sh <command> [arguments…]
#
# When the command ends on its own (crash, exit, killed), it is started again after a pause that
# doubles with each quick failure (1 s, 2 s, 4 s … at most 30 s) and goes back to the first pause
# once a run has lasted a minute. Each restart is logged with the reason (exit code or signal).
# TERM or INT to the supervisor stops the command (TERM, then waits for it) and does not restart it.
# start.sh runs the built server under it, so a crashed server comes back without stopping
# MariaDB or the stand-ins and without a rebuild.
#
# Pauses in milliseconds (tests make them small):
#   LAGBOOK_RESTART_DELAY_MS      first pause (default 1000)
#   LAGBOOK_RESTART_DELAY_MAX_MS  longest pause (default 30000)
#   LAGBOOK_RESTART_STABLE_MS     a run this long resets the pause (default 60000)
set -uo pipefail

[ $# -ge 1 ] || { echo "usage: supervise.sh <command> [arguments…]" >&2; exit 2; }

FIRST_MS="${LAGBOOK_RESTART_DELAY_MS:-1000}"
MAX_MS="${LAGBOOK_RESTART_DELAY_MAX_MS:-30000}"
STABLE_MS="${LAGBOOK_RESTART_STABLE_MS:-60000}"
for setting in FIRST_MS MAX_MS STABLE_MS; do
  [[ "${!setting}" =~ ^[0-9]+$ ]] || { echo "supervise.sh: the restart pauses must be whole milliseconds (got '${!setting}')" >&2; exit 2; }
done

log() { printf 'lagbook: %s\n' "$*" >&2; }
now_ms() { local t="${EPOCHREALTIME//[!0-9]/}"; echo $((t / 1000)); }
# 1500 → "1.5 s"
seconds() { local ms=$1; if ((ms % 1000 == 0)); then echo "$((ms / 1000)) s"; else printf '%d.%03d s' $((ms / 1000)) $((ms % 1000)) | sed -E 's/0+ s$/ s/'; fi; }

child=""
pause=""
stopping=0
stop() {
  stopping=1
  [ -n "$child" ] && kill -TERM "$child" 2>/dev/null
  [ -n "$pause" ] && kill -TERM "$pause" 2>/dev/null
}
trap stop TERM INT

delay=$FIRST_MS
restarts=0
while :; do
  started=$(now_ms)
  "$@" &
  child=$!
  # `wait` returns early when a trapped signal arrives; keep waiting until the child has ended.
  while :; do
    wait "$child"
    status=$?
    kill -0 "$child" 2>/dev/null || break
  done
  child=""
  if ((stopping)); then
    log "supervisor stopped; the server was asked to stop and has ended."
    exit 0
  fi
  ran=$(($(now_ms) - started))
  ((ran >= STABLE_MS)) && delay=$FIRST_MS
  if ((status > 128)); then
    why="was killed by signal $(kill -l $((status - 128)) 2>/dev/null || echo $((status - 128)))"
  else
    why="exited with code $status"
  fi
  restarts=$((restarts + 1))
  log "the server $why after $(seconds "$ran"); restarting in $(seconds "$delay") (restart $restarts; MariaDB and the stand-ins keep running)"
  sleep "$((delay / 1000)).$(printf '%03d' $((delay % 1000)))" &
  pause=$!
  wait "$pause"
  pause=""
  if ((stopping)); then
    log "supervisor stopped before restarting the server."
    exit 0
  fi
  delay=$((delay * 2 > MAX_MS ? MAX_MS : delay * 2))
done
