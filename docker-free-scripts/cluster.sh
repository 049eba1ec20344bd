#!/usr/bin/env bash
# Runs three MariaDB Galera nodes and HAProxy in front of them on 127.0.0.1, without systemd or
# containers, for the cluster mode of Lagbook (`LAGBOOK_CLUSTER=1 npm start`) and the fault test.
#
#   docker-free-scripts/cluster.sh start         # install what is missing, start nodes 1-3, health checker, HAProxy
#   docker-free-scripts/cluster.sh stop          # HAProxy, health checker, then the nodes (3, 2, 1: clean shutdown)
#   docker-free-scripts/cluster.sh status        # each node's state, cluster size, writer node; exit 0 when both listeners answer
#   docker-free-scripts/cluster.sh kill-node N   # SIGKILL node N's server (the machine "dies"); returns at once
#   docker-free-scripts/cluster.sh start-node N  # start node N so it rejoins (IST, or SST when the gap is too big); waits until Synced
#   docker-free-scripts/cluster.sh env           # export lines for the app: writer and reader listeners
#   docker-free-scripts/cluster.sh writer        # the node (1..3) the writer listener sends new connections to
#
# Settings (environment):
#   LAGBOOK_CLUSTER_DIR        state folder (default .lagbook/cluster, git-ignored): node1/ node2/ node3/,
#                              haproxy.cfg, haproxy.pid, haproxy.log, health.pid, health.log
#   LAGBOOK_CLUSTER_PORT       base port B (default 4340). On 127.0.0.1: writer B, reader B+1,
#                              HTTP LAGBOOK_CLUSTER_HTTP_PORT (default B+2), HAProxy stats B+3;
#                              node N: SQL B+10N, Galera B+10N+1, IST B+10N+2, SST B+10N+3, health B+10N+4
#   LAGBOOK_CLUSTER_APP_PORTS  app server ports behind the HTTP listener (default "4317 4318")
#   LAGBOOK_DB_NAME            database to create (default lagbook); user 'lagbook'@'127.0.0.1' / lagbook
#   LAGBOOK_CLUSTER_NODE_MEMORY  InnoDB buffer pool per node (default 128M)
#   LAGBOOK_CLUSTER_GCACHE     Galera write-set cache per node (default 256M; a node that was away
#                              rejoins by IST while the writes it missed still fit in it)
#   LAGBOOK_CLUSTER_SYNC_TIMEOUT  seconds to wait for a node to reach Synced (default 180)
#   LAGBOOK_CLUSTER_EXTRA_ARGS more server options for every node, space-separated
#   LAGBOOK_CLUSTER_PROVIDER_OPTIONS more Galera provider options, ";"-separated (default
#                              evs.suspect_timeout=PT3S; set it empty for Galera's 5 s)
#
# How it runs (docker-free-scripts/cluster/README.md says more, and why):
# - State transfer: a node that was away briefly gets the write sets it missed by IST from another
#   node's write-set cache; a full transfer (SST) uses mariadb-backup over socat (rsync's transfer
#   cannot write a joiner's data when the server runs as root). A new cluster is seeded from node
#   1's data folder so nodes 2 and 3 join by IST.
# - Bootstrap: a new cluster starts from node 1 (--wsrep-new-cluster). After a full stop the
#   node whose grastate.dat says safe_to_bootstrap: 1 starts first (stop shuts 3, 2, 1 down in that
#   order, so normally node 1); after a crash of every node, the one with the highest recovered
#   position (mariadbd --wsrep-recover) is marked safe and starts first.
# - Writer listener: one node at a time, 1 -> 2 -> 3; a one-entry stick table keeps the writer on
#   the node it failed over to, so a returning node 1 does not split the writes over two nodes.
set -euo pipefail

HERE="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
ROOT="$(cd "$HERE/.." && pwd)"
# shellcheck source=docker-free-scripts/database-setup.sh
source "$HERE/database-setup.sh"
CLUSTER_DIR="${LAGBOOK_CLUSTER_DIR:-$ROOT/.lagbook/cluster}"
BASE="${LAGBOOK_CLUSTER_PORT:-4340}"
[[ "$BASE" =~ ^[0-9]+$ ]] && [ "$BASE" -ge 1024 ] && [ "$BASE" -le 65490 ] \
  || { echo "cluster: LAGBOOK_CLUSTER_PORT must be a port number from 1024 to 65490 (got '$BASE')" >&2; exit 2; }
WRITER_PORT=$BASE
READER_PORT=$((BASE + 1))
HTTP_PORT="${LAGBOOK_CLUSTER_HTTP_PORT:-$((BASE + 2))}"
STATS_PORT=$((BASE + 3))
APP_PORTS="${LAGBOOK_CLUSTER_APP_PORTS:-4317 4318}"
DB_NAME="${LAGBOOK_DB_NAME:-lagbook}"
NODE_MEMORY="${LAGBOOK_CLUSTER_NODE_MEMORY:-128M}"
GCACHE="${LAGBOOK_CLUSTER_GCACHE:-256M}"
# A node that stops answering is suspected after 3 s (Galera's default is 5 s): the survivors form
# a new view, and writes resume, that much sooner. All nodes share one machine here, so a
# 3-second silence means the process is gone or the machine is overloaded.
PROVIDER_OPTIONS="${LAGBOOK_CLUSTER_PROVIDER_OPTIONS-evs.suspect_timeout=PT3S}"
SYNC_TIMEOUT="${LAGBOOK_CLUSTER_SYNC_TIMEOUT:-180}"
read -r -a EXTRA_ARGS <<< "${LAGBOOK_CLUSTER_EXTRA_ARGS:-}"
GALERA_LIB=/usr/lib/galera/libgalera_smm.so
HAPROXY_CFG="$CLUSTER_DIR/haproxy.cfg"
HAPROXY_PID="$CLUSTER_DIR/haproxy.pid"
HAPROXY_LOG="$CLUSTER_DIR/haproxy.log"
HAPROXY_SOCK="$CLUSTER_DIR/haproxy.sock"
HEALTH_PID="$CLUSTER_DIR/health.pid"
HEALTH_LOG="$CLUSTER_DIR/health.log"

fail() { echo "cluster: $*" >&2; exit 1; }
note() { echo "cluster: $*"; }

sql_port() { echo $((BASE + 10 * $1)); }
galera_port() { echo $((BASE + 10 * $1 + 1)); }
ist_port() { echo $((BASE + 10 * $1 + 2)); }
sst_port() { echo $((BASE + 10 * $1 + 3)); }
health_port() { echo $((BASE + 10 * $1 + 4)); }
node_dir() { echo "$CLUSTER_DIR/node$1"; }
node_sock() { echo "$CLUSTER_DIR/node$1/mysqld.sock"; }
node_pidfile() { echo "$CLUSTER_DIR/node$1/mysqld.pid"; }
node_log() { echo "$CLUSTER_DIR/node$1/mysqld.err"; }
node_data() { echo "$CLUSTER_DIR/node$1/data"; }

check_node_number() {
  [[ "${1:-}" =~ ^[123]$ ]] || { echo "cluster: the node number must be 1, 2 or 3 (got '${1:-}')" >&2; exit 2; }
}

node_client() { local n=$1; shift; mariadb --no-defaults --socket="$(node_sock "$n")" -uroot --connect-timeout=2 "$@"; }

# The value of one status variable of node N ("" when the node does not answer).
node_status() {
  node_client "$1" -N -B -e "SHOW GLOBAL STATUS LIKE '$2'" 2>/dev/null | cut -f2 || true
}

# The pid in node N's pid file when that process is alive.
node_pid() {
  local pidfile
  pidfile="$(node_pidfile "$1")"
  [ -f "$pidfile" ] || return 1
  local pid
  pid="$(cat "$pidfile" 2>/dev/null)"
  [[ "$pid" =~ ^[0-9]+$ ]] && process_running "$pid" && echo "$pid"
}

# The process runs (a killed one may linger as a zombie until it is reaped: that counts as gone).
process_running() {
  local stat
  stat="$(ps -o stat= -p "$1" 2>/dev/null)" || return 1
  [ -n "$stat" ] && [ "${stat:0:1}" != Z ]
}

# Pids of node N's mariadbd found by its command line (also while it is still in a state transfer,
# before the pid file exists); the socket path is unique to this cluster and node.
node_process() { pgrep -f -- "^mariadbd --defaults-file=$(node_dir "$1")/my.cnf"; }

node_answers() { mariadb-admin --no-defaults --socket="$(node_sock "$1")" -uroot --connect-timeout=2 ping >/dev/null 2>&1; }

# 4 = Synced, and the node accepts queries, in the primary component.
node_synced() {
  local state ready
  state="$(node_status "$1" wsrep_local_state)"
  ready="$(node_status "$1" wsrep_ready)"
  [ "$state" = 4 ] && [ "$ready" = ON ]
}

port_free() {
  node -e "const s=require('net').createServer();s.once('error',()=>process.exit(1));s.listen(+process.argv[1],'127.0.0.1',()=>s.close(()=>process.exit(0)))" "$1"
}

# pid_alive <pid file> <command name>: the process in the pid file runs and is that command (a pid
# left over from an earlier run may since belong to another program).
pid_alive() {
  [ -f "$1" ] || return 1
  local pid
  pid="$(cat "$1" 2>/dev/null)"
  [[ "$pid" =~ ^[0-9]+$ ]] && [ "$(ps -o comm= -p "$pid" 2>/dev/null)" = "$2" ]
}

cluster_address() {
  echo "gcomm://127.0.0.1:$(galera_port 1),127.0.0.1:$(galera_port 2),127.0.0.1:$(galera_port 3)"
}

# Writes node N's server settings to nodeN/my.cnf (rewritten on every start). The server reads only
# this file (--defaults-file), never Debian's /etc/mysql; the state-transfer scripts read their
# settings from the same file, which is why it is a file and not command-line options.
write_node_config() {
  local n=$1
  cat > "$(node_dir "$n")/my.cnf" <<EOF
# Written by docker-free-scripts/cluster.sh on every start; edits are lost.
[mysqld]
user = root
datadir = $(node_data "$n")
socket = $(node_sock "$n")
port = $(sql_port "$n")
bind-address = 127.0.0.1
pid-file = $(node_pidfile "$n")
log-error = $(node_log "$n")
skip-name-resolve
# As in mariadb.sh: utf8mb4, LOAD DATA LOCAL, zlib page compression (built into Debian's mariadbd).
local-infile = 1
character-set-server = utf8mb4
collation-server = utf8mb4_unicode_ci
innodb-compression-algorithm = zlib
innodb-compression-level = 6
innodb-flush-log-at-trx-commit = 1
max-connections = 300
max-allowed-packet = 64M
# Three servers share one machine: a smaller buffer pool and redo log each.
innodb-buffer-pool-size = $NODE_MEMORY
innodb-log-file-size = 96M
default-storage-engine = InnoDB
# Galera: row events, interleaved auto-increment locks, no binary log file (write sets replicate
# without it).
skip-log-bin
binlog-format = ROW
innodb-autoinc-lock-mode = 2
wsrep-on = ON
wsrep-provider = $GALERA_LIB
wsrep-cluster-name = lagbook
wsrep-cluster-address = $(cluster_address)
wsrep-node-name = node$n
wsrep-node-address = 127.0.0.1:$(galera_port "$n")
wsrep-node-incoming-address = 127.0.0.1:$(sql_port "$n")
wsrep-sst-receive-address = 127.0.0.1:$(sst_port "$n")
wsrep-slave-threads = 2
# gcache.recover keeps the write-set cache across a crash, so a restarted node can still serve IST.
wsrep-provider-options = "gmcast.listen_addr=tcp://127.0.0.1:$(galera_port "$n");ist.recv_addr=127.0.0.1:$(ist_port "$n");gcache.size=$GCACHE;gcache.recover=yes${PROVIDER_OPTIONS:+;$PROVIDER_OPTIONS}"
# Full state transfers with mariadb-backup streamed over socat; the donor's backup connects as root
# through the Unix socket (root has no password on these private servers).
wsrep-sst-method = mariabackup
wsrep-sst-auth = root:

[sst]
# The transfer scripts' messages go to the node's error log, not to syslog.
sst-syslog = -1
# No copies of the transfer logs in /tmp/sst_log_archive.
sst-log-archive = 0
EOF
}

# Starts node N's mariadbd in the background: start_node_process N [extra server options…]
start_node_process() {
  local n=$1; shift
  local dir
  dir="$(node_dir "$n")"
  for port in "$(sql_port "$n")" "$(galera_port "$n")" "$(ist_port "$n")" "$(sst_port "$n")"; do
    port_free "$port" || fail "port $port on 127.0.0.1 (node $n) is in use by another program; set LAGBOOK_CLUSTER_PORT to a free range"
  done
  rm -f "$(node_pidfile "$n")"
  # Where this start's part of the log begins (wait_synced reads only that part).
  stat -c %s "$(node_log "$n")" > "$dir/log-offset" 2>/dev/null || echo 0 > "$dir/log-offset"
  local position
  position="$(start_position_option "$n")"
  write_node_config "$n"
  # nohup + setsid: the server outlives this script and ignores the terminal's Ctrl-C.
  setsid nohup mariadbd --defaults-file="$dir/my.cnf" ${position:+"$position"} ${EXTRA_ARGS[@]+"${EXTRA_ARGS[@]}"} "$@" \
    >>"$dir/mysqld.out" 2>&1 < /dev/null 8>&- &
  disown
}

# The last few error lines of node N's log, indented, to stderr (before the one-line failure).
log_errors() {
  grep -E '\[ERROR\]|WSREP_SST: \[ERROR\]' "$(node_log "$1")" 2>/dev/null | tail -n 5 | cut -c1-300 | sed 's/^/    /' >&2 || true
}

# True when node N's log since its last start says Galera gave up on it ("node restart required",
# e.g. after a failed IST): the server process stays up but never joins again by itself.
node_gave_up() {
  local offset
  offset="$(cat "$(node_dir "$1")/log-offset" 2>/dev/null || echo 0)"
  tail -c +"$((offset + 1))" "$(node_log "$1")" 2>/dev/null | grep -q 'restart required'
}

# Waits until node N is Synced; fails with the end of its log when it dies or times out. A joining
# node that Galera gave up on is stopped and started once more (it then asks for IST or SST again).
wait_synced() {
  local n=$1 what=$2 retried=0
  local deadline=$((SECONDS + SYNC_TIMEOUT))
  local started=$SECONDS
  sleep 0.3
  while [ $SECONDS -lt $deadline ]; do
    if node_synced "$n"; then note "node $n $what (Synced, $((SECONDS - started)) s)"; return 0; fi
    if [ "$retried" = 0 ] && [ "$what" != "started a new cluster" ] && node_gave_up "$n"; then
      retried=1
      echo "cluster: node $n failed to join ($(grep -h 'restart required' "$(node_log "$n")" | tail -n 1 | cut -c1-200)); starting it once more" >&2
      stop_node "$n" >/dev/null
      local donor
      donor="$(preferred_donor "$n")"
      start_node_process "$n" ${donor:+"--wsrep-sst-donor=$donor"}
      sleep 0.3
      continue
    fi
    # The pid file appears once the server is up; before that, the process started by
    # start_node_process may still be initialising (SST runs first).
    if ! node_process "$n" >/dev/null; then
      log_errors "$n"
      fail "node $n stopped while starting (log: $(node_log "$n"))"
    fi
    sleep 0.3
  done
  log_errors "$n"
  fail "node $n was not Synced within ${SYNC_TIMEOUT} s (log: $(node_log "$n"))"
}

# Creates node N's data folder when it has none. Node 1 gets system tables (it may bootstrap);
# nodes 2 and 3 start empty and receive everything by state transfer when they first join.
init_node() {
  local n=$1 dir data
  dir="$(node_dir "$n")"
  data="$(node_data "$n")"
  mkdir -p "$dir"
  [ -d "$data" ] && return 0
  if [ "$n" = 1 ]; then
    mariadb-install-db --no-defaults --datadir="$data.init" --user=root \
      --auth-root-authentication-method=normal --skip-test-db --skip-name-resolve >"$dir/install.log" 2>&1 \
      || fail "could not initialise node 1's data folder (see $dir/install.log)"
    mv "$data.init" "$data"
  else
    mkdir -p "$data"
  fi
}

# A new cluster: node 1 starts one, gets the database and user, shuts down cleanly, and its data
# folder is copied to nodes 2 and 3 (without its write-set cache and view state). All three then
# hold the same cluster position, so 2 and 3 join without a full state transfer (mariadb-backup's
# transfer script waits a fixed 10 s before it streams; two of them made a new cluster take ~35 s).
seed_new_cluster() {
  note "creating a new cluster in $CLUSTER_DIR"
  init_node 1
  start_node_process 1 --wsrep-new-cluster
  wait_synced 1 "started a new cluster"
  ensure_database 1
  stop_node 1 >/dev/null
  local n copy
  for n in 2 3; do
    mkdir -p "$(node_dir "$n")"
    copy="$(node_data "$n").copy"
    rm -rf "$copy"
    cp -a "$(node_data 1)" "$copy"
    rm -f "$copy/galera.cache" "$copy/gvwstate.dat"
    sed -i 's/^safe_to_bootstrap:.*/safe_to_bootstrap: 0/' "$copy/grastate.dat"
    mv "$copy" "$(node_data "$n")"
  done
}

# "uuid seqno safe" from node N's grastate.dat (empty when it has none).
grastate() {
  local file
  file="$(node_data "$1")/grastate.dat"
  [ -f "$file" ] || return 0
  awk '/^uuid:/{u=$2} /^seqno:/{s=$2} /^safe_to_bootstrap:/{b=$2} END{print u, s, b}' "$file"
}

# The last committed position ("uuid:seqno") of a node that crashed, read from InnoDB by
# `mariadbd --wsrep-recover` (what mysqld_safe does before it starts a Galera node). A killed node's
# grastate.dat says seqno -1; started without its position it would ask for a full state transfer
# (SST) instead of the write sets it missed (IST). Prints nothing when the position is unknown.
recovered_position() {
  local n=$1 out
  out="$(node_dir "$n")/recover.log"
  rm -f "$out"
  write_node_config "$n"
  mariadbd --defaults-file="$(node_dir "$n")/my.cnf" --skip-networking \
    --socket="$(node_sock "$n").recover" --pid-file="$(node_pidfile "$n").recover" --log-error="$out" \
    --wsrep-recover >/dev/null 2>&1 || true
  sed -n 's/.*WSREP: Recovered position: \([0-9a-f-]*:-\{0,1\}[0-9]*\).*/\1/p' "$out" | tail -n 1
}

# The position option for a node that did not shut down cleanly (grastate.dat seqno -1), empty
# for a node that did (Galera reads its position from grastate.dat) or has no data yet.
start_position_option() {
  local n=$1 uuid seqno safe position
  read -r uuid seqno safe <<< "$(grastate "$n")" || true
  [ -n "${uuid:-}" ] && [ "${seqno:-}" = -1 ] && [ -d "$(node_data "$n")/mysql" ] || return 0
  position="$(recovered_position "$n")"
  case "$position" in
    *:-1 | "") echo "cluster: node $n's last position could not be recovered; it will receive a full state transfer" >&2 ;;
    *) echo "cluster: node $n recovered its position $position" >&2; echo "--wsrep-start-position=$position" ;;
  esac
}

# Which node starts the cluster: 1 when no node has Galera state yet; otherwise the node marked
# safe_to_bootstrap (the last one shut down cleanly); otherwise the one with the highest
# recovered position, which is then marked safe. Prints the node number.
pick_bootstrap_node() {
  local n uuid seqno safe any=0 best="" best_seqno=-2
  for n in 1 2 3; do
    read -r uuid seqno safe <<< "$(grastate "$n")" || true
    [ -n "${uuid:-}" ] || continue
    any=1
    if [ "${safe:-0}" = 1 ]; then echo "$n"; return; fi
  done
  if [ "$any" = 0 ]; then echo 1; return; fi
  for n in 1 2 3; do
    read -r uuid seqno safe <<< "$(grastate "$n")" || true
    [ -n "${uuid:-}" ] || continue
    if [ "${seqno:--1}" = -1 ]; then seqno="$(recovered_position "$n")"; seqno="${seqno##*:}"; fi
    [ -n "$seqno" ] || seqno=-1
    if [ "$seqno" -gt "$best_seqno" ]; then best="$n"; best_seqno="$seqno"; fi
  done
  [ -n "$best" ] || fail "no node has a usable Galera state; remove $CLUSTER_DIR to start a new, empty cluster"
  echo "cluster: no node was shut down last cleanly; node $best has the newest data (position $best_seqno) and starts the cluster" >&2
  sed -i 's/^safe_to_bootstrap:.*/safe_to_bootstrap: 1/' "$(node_data "$best")/grastate.dat"
  echo "$best"
}

# A node that belongs to a running primary component (the others can join through it).
running_primary_node() {
  local n
  for n in 1 2 3; do
    if node_answers "$n" && [ "$(node_status "$n" wsrep_cluster_status)" = Primary ]; then echo "$n"; return 0; fi
  done
  return 1
}

ensure_database() {
  local n=$1
  node_client "$n" -e "$(lagbook_database_sql "$DB_NAME")" || fail "could not create database $DB_NAME"
}

write_haproxy_config() {
  local n app servers="" i=0
  for app in $APP_PORTS; do
    [[ "$app" =~ ^[0-9]+$ ]] || fail "LAGBOOK_CLUSTER_APP_PORTS must be port numbers separated by spaces (got '$APP_PORTS')"
    i=$((i + 1))
    servers+="    server app$i 127.0.0.1:$app check"$'\n'
  done
  [ -n "$servers" ] || fail "LAGBOOK_CLUSTER_APP_PORTS is empty"
  {
    cat <<EOF
# Written by docker-free-scripts/cluster.sh on every start; edits are lost.
global
    maxconn 4000
    log stdout format raw local0 info
    stats socket $HAPROXY_SOCK mode 600 level admin

defaults
    log global
    mode tcp
    option dontlognull
    # Only failed connections and server state changes are logged, not every connection.
    option dontlog-normal
    timeout connect 2s
    timeout client 1h
    timeout server 1h
    timeout check 1s
    # A connection refused by a node that died since its last check goes to the next server at
    # once (for the writer: the next in order) instead of failing.
    retries 2
    option redispatch
    # Health: an HTTP probe of docker-free-scripts/cluster/node-health.mjs on the node's health
    # port; 200 only when wsrep_local_state = 4 (Synced) and wsrep_ready = ON.
    default-server inter 1s fastinter 500ms downinter 1s fall 2 rise 2

# Writer: every connection to one node. node1 first, then the backups in order (HAProxy uses the
# first healthy backup). The one-entry stick table remembers the node in use, so after a failover
# new connections stay on that node when node 1 comes back (no fail-back while connections still
# write to the other node); it moves only when that node fails in turn.
listen writer
    bind 127.0.0.1:$WRITER_PORT
    option httpchk GET /
    # a node marked down has its sessions cut at once: clients see a lost connection, not a dead node's silence
    default-server on-marked-down shutdown-sessions
    stick-table type integer size 1
    stick on int(1)
    server node1 127.0.0.1:$(sql_port 1) check port $(health_port 1)
    server node2 127.0.0.1:$(sql_port 2) check port $(health_port 2) backup
    server node3 127.0.0.1:$(sql_port 3) check port $(health_port 3) backup

# Reader: connections spread over every Synced node.
listen reader
    bind 127.0.0.1:$READER_PORT
    balance roundrobin
    option httpchk GET /
    default-server on-marked-down shutdown-sessions
    server node1 127.0.0.1:$(sql_port 1) check port $(health_port 1)
    server node2 127.0.0.1:$(sql_port 2) check port $(health_port 2)
    server node3 127.0.0.1:$(sql_port 3) check port $(health_port 3)

# The app servers, round robin, each checked at /healthz. Both 200 and 503 count as up: /healthz
# answers 503 while the database does not answer, and during a writer failover that is true of
# every app server at once; taking them all out would only swap the app's own 503 + Retry-After
# for HAProxy's. A server that does not answer HTTP at all (stopped, hung) is taken out.
# When no app server is up, HAProxy's own 503 carries Retry-After and the app's error shape.
listen http
    bind 127.0.0.1:$HTTP_PORT
    mode http
    option httplog
    option forwardfor
    balance roundrobin
    timeout client 5m
    timeout server 5m
    timeout http-request 30s
    # /healthz of a busy app server (20 loggers on 2 cores) took over 1 s at times: the fault test saw
    # both app servers marked down at once and the requests in flight cut (502). So 5 s, three misses,
    # and requests already being served finish even when their server is marked down.
    timeout check 5s
    option httpchk GET /healthz
    http-check expect rstatus ^(200|503)\$
    http-error status 503 content-type application/json string "{\"error\":{\"code\":\"service_unavailable\",\"message\":\"No Lagbook server is answering right now; nothing was saved. Try again shortly.\"}}" hdr Retry-After 5
    default-server inter 1s fall 3 rise 1
EOF
    printf '%s' "$servers"
    cat <<EOF

listen stats
    bind 127.0.0.1:$STATS_PORT
    mode http
    timeout client 30s
    timeout server 30s
    stats enable
    stats uri /
    stats refresh 2s
EOF
  } > "$HAPROXY_CFG"
  haproxy -c -q -f "$HAPROXY_CFG" >/dev/null 2>&1 || haproxy -c -f "$HAPROXY_CFG" >&2 || fail "HAProxy rejected $HAPROXY_CFG"
}

start_health_checker() {
  if pid_alive "$HEALTH_PID" node; then return 0; fi
  local n
  for n in 1 2 3; do
    port_free "$(health_port "$n")" || fail "port $(health_port "$n") on 127.0.0.1 (node $n health) is in use by another program"
  done
  LAGBOOK_CLUSTER_DIR="$CLUSTER_DIR" LAGBOOK_CLUSTER_PORT="$BASE" \
    setsid nohup node "$HERE/cluster/node-health.mjs" >>"$HEALTH_LOG" 2>&1 < /dev/null 8>&- &
  echo $! > "$HEALTH_PID"
  for _ in $(seq 1 100); do
    if node -e "fetch('http://127.0.0.1:'+process.argv[1]+'/').then(()=>process.exit(0),()=>process.exit(1))" "$(health_port 1)" 2>/dev/null; then return 0; fi
    pid_alive "$HEALTH_PID" node || { tail -n 20 "$HEALTH_LOG" >&2; fail "the health checker stopped (log: $HEALTH_LOG)"; }
    sleep 0.1
  done
  fail "the health checker did not answer within 10 s (log: $HEALTH_LOG)"
}

start_haproxy() {
  if pid_alive "$HAPROXY_PID" haproxy; then return 0; fi
  for port in "$WRITER_PORT" "$READER_PORT" "$HTTP_PORT" "$STATS_PORT"; do
    port_free "$port" || fail "port $port on 127.0.0.1 (HAProxy) is in use by another program; set LAGBOOK_CLUSTER_PORT to a free range"
  done
  write_haproxy_config
  setsid nohup haproxy -db -f "$HAPROXY_CFG" >>"$HAPROXY_LOG" 2>&1 < /dev/null 8>&- &
  echo $! > "$HAPROXY_PID"
}

# Waits until a query through the writer listener and one through the reader listener succeed.
wait_listeners() {
  for _ in $(seq 1 150); do
    if listener_answers "$WRITER_PORT" && listener_answers "$READER_PORT"; then return 0; fi
    pid_alive "$HAPROXY_PID" haproxy || { tail -n 20 "$HAPROXY_LOG" >&2; fail "HAProxy stopped (log: $HAPROXY_LOG)"; }
    sleep 0.2
  done
  fail "the writer and reader listeners did not answer within 30 s (log: $HAPROXY_LOG)"
}

listener_answers() {
  mariadb --no-defaults -h127.0.0.1 -P"$1" -ulagbook -plagbook --connect-timeout=2 -N -B -e 'SELECT 1' >/dev/null 2>&1
}

start() {
  # shellcheck source=docker-free-scripts/lib.sh
  (source "$HERE/lib.sh" && apt_install_for mariadbd mariadb-server && install_cluster_packages) \
    || fail "could not install the cluster packages"
  command -v mariadbd >/dev/null || fail "mariadbd not found (Debian package mariadb-server)"
  [ -f "$GALERA_LIB" ] || fail "the Galera provider $GALERA_LIB is missing (Debian package galera-4)"
  command -v haproxy >/dev/null || fail "haproxy not found (Debian package haproxy)"
  mkdir -p "$CLUSTER_DIR"
  local started=$SECONDS n first donor
  if [ ! -d "$(node_data 1)" ] && [ ! -d "$(node_data 2)" ] && [ ! -d "$(node_data 3)" ]; then seed_new_cluster; fi
  for n in 1 2 3; do init_node "$n"; done
  if first="$(running_primary_node)"; then
    note "node $first is running; starting the nodes that are not"
  else
    for n in 1 2 3; do
      if node_pid "$n" >/dev/null; then fail "node $n runs but is not in a primary component; run '$0 stop' first"; fi
    done
    first="$(pick_bootstrap_node)"
    note "starting the cluster from node $first"
    start_node_process "$first" --wsrep-new-cluster
    wait_synced "$first" "started a new cluster"
  fi
  # The other nodes join one after the other: two joining at once can break an IST (Galera 26.4
  # here: "IST didn't contain all write sets" when the second join's membership change falls
  # inside the first one's range).
  for n in 1 2 3; do
    [ "$n" = "$first" ] && continue
    if ! node_answers "$n" && ! node_process "$n" >/dev/null; then
      donor="$(preferred_donor "$n")"
      start_node_process "$n" ${donor:+"--wsrep-sst-donor=$donor"}
    fi
    wait_synced "$n" "joined"
  done
  ensure_database "$first"
  start_health_checker
  start_haproxy
  wait_listeners
  note "ready in $((SECONDS - started)) s: writer 127.0.0.1:$WRITER_PORT, reader 127.0.0.1:$READER_PORT, HTTP 127.0.0.1:$HTTP_PORT, stats http://127.0.0.1:$STATS_PORT/ (data in $CLUSTER_DIR)"
}

# Clean shutdown of node N (mariadb-admin shutdown), then SIGKILL if it has not ended in 60 s.
stop_node() {
  local n=$1 pid
  pid="$(node_pid "$n")" || { pkill_node_leftover "$n"; return 0; }
  mariadb-admin --no-defaults --socket="$(node_sock "$n")" -uroot --connect-timeout=2 shutdown >/dev/null 2>&1 \
    || kill -TERM "$pid" 2>/dev/null || true
  for _ in $(seq 1 600); do
    kill -0 "$pid" 2>/dev/null || { note "node $n stopped"; return 0; }
    sleep 0.1
  done
  kill -KILL "$pid" 2>/dev/null || true
  note "node $n did not stop within 60 s and was killed"
}

# A node still starting (state transfer, before its pid file exists) is found by its socket path,
# which only this cluster's processes carry on their command line.
pkill_node_leftover() {
  local pids
  pids="$(node_process "$1" || true)"
  [ -n "$pids" ] || return 0
  # shellcheck disable=SC2086 # one pid per word
  kill -TERM $pids 2>/dev/null || true
  sleep 1
  # shellcheck disable=SC2086
  kill -KILL $pids 2>/dev/null || true
}

stop_pidfile() {
  local file=$1
  if pid_alive "$file" "$2"; then
    local pid
    pid="$(cat "$file")"
    kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -KILL "$pid" 2>/dev/null || true
  fi
  rm -f "$file"
}

stop() {
  stop_pidfile "$HAPROXY_PID" haproxy
  stop_pidfile "$HEALTH_PID" node
  # 3, 2, 1: node 1 shuts down last, is marked safe_to_bootstrap and starts the next cluster.
  local n
  for n in 3 2 1; do stop_node "$n"; done
  note "stopped"
}

writer_node() {
  local port
  port="$(mariadb --no-defaults -h127.0.0.1 -P"$WRITER_PORT" -ulagbook -plagbook --connect-timeout=2 -N -B -e 'SELECT @@port' 2>/dev/null)" \
    || { echo "cluster: the writer listener does not answer" >&2; return 1; }
  echo $(((port - BASE) / 10))
}

status() {
  local n state size="" pid
  for n in 1 2 3; do
    if pid="$(node_pid "$n")" && node_answers "$n"; then
      state="$(node_status "$n" wsrep_local_state_comment)"
      [ -n "$size" ] || size="$(node_status "$n" wsrep_cluster_size)"
      echo "node $n: ${state:-unknown} (SQL 127.0.0.1:$(sql_port "$n"), pid $pid)"
    else
      echo "node $n: down"
    fi
  done
  echo "cluster size: ${size:-none}"
  local writer=""
  writer="$(writer_node 2>/dev/null)" || true
  echo "writer: ${writer:+node }${writer:-none} (127.0.0.1:$WRITER_PORT)"
  if listener_answers "$WRITER_PORT" && listener_answers "$READER_PORT"; then
    echo "listeners: writer and reader answer"
  else
    echo "listeners: not answering"; return 1
  fi
}

kill_node() {
  local n=$1 pid
  pid="$(node_pid "$n")" || fail "node $n is not running"
  kill -KILL "$pid"
  note "node $n (pid $pid) killed"
}

start_node() {
  local n=$1
  if node_answers "$n"; then
    node_synced "$n" && { note "node $n is already running (Synced)"; return 0; }
    wait_synced "$n" "is running"
    return 0
  fi
  pkill_node_leftover "$n"
  running_primary_node >/dev/null || fail "no running node to join; use '$0 start' to start the cluster"
  init_node "$n"
  local donor
  donor="$(preferred_donor "$n")"
  start_node_process "$n" ${donor:+"--wsrep-sst-donor=$donor"}
  wait_synced "$n" "rejoined"
}

# The donor a rejoining node N should ask for its state: a Synced node that is not the writer, so
# the writer never turns Donor (state 2) for the transfer and HAProxy never moves the writes
# because of a rejoin. The trailing comma lets Galera pick any other node when that one cannot.
# Prints nothing when there is no such node.
preferred_donor() {
  local n=$1 writer m
  writer="$(writer_node 2>/dev/null)" || writer=""
  for m in 1 2 3; do
    [ "$m" = "$n" ] || [ "$m" = "$writer" ] && continue
    if node_synced "$m"; then echo "node$m,"; return 0; fi
  done
}

print_env() {
  echo "export LAGBOOK_DB_HOST=127.0.0.1"
  echo "export LAGBOOK_DB_PORT=$WRITER_PORT"
  echo "export LAGBOOK_DB_READ_HOST=127.0.0.1"
  echo "export LAGBOOK_DB_READ_PORT=$READER_PORT"
}

# start, stop and start-node of one cluster folder run one at a time.
# The servers started from here do not inherit the lock (8>&- on each).
hold_lock() {
  mkdir -p "$CLUSTER_DIR"
  exec 8>"$CLUSTER_DIR/cluster.lock"
  flock 8 || fail "could not lock $CLUSTER_DIR/cluster.lock"
}

case "${1:-}" in
  start) hold_lock; start ;;
  stop) hold_lock; stop ;;
  status) status ;;
  kill-node) check_node_number "${2:-}"; kill_node "$2" ;;
  start-node) check_node_number "${2:-}"; hold_lock; start_node "$2" ;;
  env) print_env ;;
  writer) writer_node ;;
  *) echo "usage: $0 start|stop|status|kill-node N|start-node N|env|writer" >&2; exit 2 ;;
esac
