# Shared helpers for start.sh and test.sh. Sourced, not run.
# Everything a fresh Debian machine with only Node 20 and npm needs is installed from here.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

say() { printf '\033[1;36mlagbook:\033[0m %s\n' "$*"; }
die() { printf 'lagbook: %s\n' "$*" >&2; exit 1; }

require_node() {
  command -v node >/dev/null || die "Node.js 20 or newer is required (node not found)"
  local major
  major="$(node -p 'process.versions.node.split(".")[0]')"
  [ "$major" -ge 20 ] || die "Node.js 20 or newer is required (found $(node --version))"
}

# npm ci when node_modules is missing or package-lock.json changed since the last install.
# Scripts started at the same time (several test runs in one checkout) install one after the
# other under a lock, and each re-checks the stamp once it holds the lock, so only the first installs.
install_node_modules() {
  local stamp="$ROOT/node_modules/.lagbook-lock-hash"
  local hash
  hash="$(sha256sum package-lock.json | cut -d' ' -f1)"
  if [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$hash" ]; then return; fi
  (
    flock 9 || die "could not lock the npm install"
    if [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$hash" ]; then exit 0; fi
    say "installing npm packages (npm ci)…"
    npm ci --no-audit --no-fund --loglevel=error || die "npm ci failed"
    echo "$hash" > "$stamp"
  ) 9>"$ROOT/.npm-install.lock" || exit 1
}

# Installs the named Debian packages (root, or sudo), running `apt-get update` once per script.
APT_UPDATED=0
apt_install() {
  [ $# -eq 0 ] && return
  local SUDO=""
  if [ "$(id -u)" -ne 0 ]; then
    command -v sudo >/dev/null || die "need root (or sudo) to install Debian packages: $*"
    SUDO="sudo"
  fi
  if [ "$APT_UPDATED" = 0 ]; then
    $SUDO apt-get update -q >/dev/null || die "apt-get update failed"
    APT_UPDATED=1
  fi
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -q --no-install-recommends "$@" >/dev/null \
    || die "apt-get install $* failed"
}

# Installs Debian packages whose command is missing: apt_install_for <command> <package> …
apt_install_for() {
  local missing=()
  while [ $# -ge 2 ]; do
    command -v "$1" >/dev/null || missing+=("$2")
    shift 2
  done
  [ ${#missing[@]} -eq 0 ] && return
  say "installing Debian packages: ${missing[*]}…"
  apt_install "${missing[@]}"
}

# The reference libraries the engine is checked against (R's stats, forecast, sandwich and nlme;
# Python's statsmodels), from Debian's packages, installed when missing. Reference tests read
# committed fixtures; the live checks and `npm run bench:analysis` call R and statsmodels directly.
install_reference_libraries() {
  local missing=()
  if ! command -v Rscript >/dev/null; then
    missing+=(r-base-core r-cran-forecast r-cran-sandwich r-cran-nlme)
  elif ! Rscript --vanilla -e 'quit(status = !all(sapply(c("forecast", "sandwich", "nlme"), requireNamespace, quietly = TRUE)))' >/dev/null 2>&1; then
    missing+=(r-cran-forecast r-cran-sandwich r-cran-nlme)
  fi
  /usr/bin/python3 -c 'import statsmodels' >/dev/null 2>&1 || missing+=(python3-statsmodels)
  [ ${#missing[@]} -eq 0 ] && return
  say "installing the reference libraries: ${missing[*]}…"
  apt_install "${missing[@]}"
}

# What docker-free-scripts/cluster.sh needs for three MariaDB Galera nodes behind HAProxy, from
# Debian's packages, installed when missing: the Galera 4 provider library, HAProxy, and
# mariadb-backup with socat (the full state transfer that streams a node's data to a joining one;
# rsync's transfer cannot be used by a root-run server, its daemon drops to 'nobody'). Node.js runs
# the health responder HAProxy checks.
install_cluster_packages() {
  local missing=()
  [ -f /usr/lib/galera/libgalera_smm.so ] || missing+=(galera-4)
  command -v haproxy >/dev/null || missing+=(haproxy)
  command -v mariadb-backup >/dev/null || missing+=(mariadb-backup)
  command -v socat >/dev/null || missing+=(socat)
  [ ${#missing[@]} -eq 0 ] && return
  say "installing the cluster packages: ${missing[*]}…"
  apt_install "${missing[@]}"
}

# Waits until an HTTP URL answers 2xx: wait_for_http <url> <seconds> <what>
wait_for_http() {
  local url="$1" seconds="$2" what="$3"
  for _ in $(seq 1 $((seconds * 10))); do
    if node -e "fetch(process.argv[1]).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" "$url" 2>/dev/null; then return 0; fi
    sleep 0.1
  done
  die "$what did not answer at $url within ${seconds}s"
}

# Starts dev-services.ts in the background and waits for its ready file.
start_dev_services() {
  local log="$1"
  export LAGBOOK_SERVICES_READY_FILE="$STATE_DIR/services.json"
  rm -f "$LAGBOOK_SERVICES_READY_FILE"
  node --import tsx docker-free-scripts/dev-services.ts >"$log" 2>&1 &
  DEV_SERVICES_PID=$!
  for _ in $(seq 1 200); do
    [ -f "$LAGBOOK_SERVICES_READY_FILE" ] && return 0
    kill -0 "$DEV_SERVICES_PID" 2>/dev/null || { cat "$log" >&2; die "the local services did not start (log: $log)"; }
    sleep 0.1
  done
  cat "$log" >&2
  die "the local services did not become ready within 20 s (log: $log)"
}
