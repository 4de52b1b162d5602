#!/usr/bin/env bash
# Lossline on one machine, without Docker.
#
#   ./docker-free-start.sh         install what is missing, start PostgreSQL (private cluster under
#                                  .data/), the S3 fake, the mail catcher, the worker and the web
#                                  server on loopback, load the demo; Ctrl-C stops all (data kept).
#   ./docker-free-start.sh test    the same installs, a throwaway cluster and fakes on other ports,
#                                  the type check (scripts/typecheck.ts), vitest (unit + integration
#                                  on a real database), a production build, Playwright in Debian's
#                                  Chromium; prints "N passed, N failed".
set -euo pipefail
cd "$(dirname "$0")"
ROOT="$PWD"
MODE="${1:-run}"

log() { printf '\033[1m[lossline]\033[0m %s\n' "$*"; }
die() { printf '\033[31m[lossline] %s\033[0m\n' "$*" >&2; exit 1; }

SUDO=""
if [ "$(id -u)" != 0 ]; then SUDO="sudo"; fi
APT_UPDATED=0
apt_install() {
  local missing=()
  for p in "$@"; do dpkg -s "$p" >/dev/null 2>&1 || missing+=("$p"); done
  [ ${#missing[@]} -eq 0 ] && return 0
  log "installing from Debian: ${missing[*]}"
  if [ "$APT_UPDATED" = 0 ]; then $SUDO apt-get update -qq >/dev/null; APT_UPDATED=1; fi
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

install_deps() {
  command -v node >/dev/null || die "Node.js 20 or newer is needed (node not found)."
  if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then apt_install postgresql; fi
  apt_install openssl ca-certificates
  local stamp="node_modules/.lossline-lock"
  if [ ! -f "$stamp" ] || ! cmp -s package-lock.json "$stamp"; then
    log "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
    cp package-lock.json "$stamp"
  fi
}

PG_BIN="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

# start_pg DATA_DIR PORT: a private cluster owned by the postgres user when we are root
# (PostgreSQL refuses to run as root), by us otherwise. Listens on 127.0.0.1 and a socket in DATA_DIR.
start_pg() {
  local dir="$1" port="$2"
  PG_BIN="$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)"
  local owner; owner="$(id -un)"; [ "$(id -u)" = 0 ] && owner=postgres
  mkdir -p "$dir"
  if [ "$(id -u)" = 0 ]; then
    chmod 755 "$dir"
    # The postgres user must be able to reach the folder: open traverse (x) on any parent that blocks it
    # (a checkout under a private temporary folder, say).
    local up="$dir"
    while [ "$up" != "/" ]; do
      if ! runuser -u postgres -- test -x "$up" 2>/dev/null; then log "letting the postgres user pass through $up (chmod o+x)"; chmod o+x "$up"; fi
      up="$(dirname "$up")"
    done
  fi
  install -d -o "$owner" -m 700 "$dir/pg"
  install -d -o "$owner" -m 755 "$dir/pgsock"
  if [ ! -f "$dir/pg/PG_VERSION" ]; then
    log "creating PostgreSQL cluster in $dir/pg"
    as_pg "$PG_BIN/initdb" -D "$dir/pg" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if as_pg "$PG_BIN/pg_ctl" -D "$dir/pg" status >/dev/null 2>&1; then as_pg "$PG_BIN/pg_ctl" -D "$dir/pg" -m fast stop >/dev/null || true; fi
  as_pg "$PG_BIN/pg_ctl" -D "$dir/pg" -l "$dir/pg/server.log" -o "-h 127.0.0.1 -p $port -k $dir/pgsock -c fsync=${PG_FSYNC:-on}" -w start >/dev/null \
    || { tail -20 "$dir/pg/server.log" >&2; die "PostgreSQL did not start on port $port (log above)."; }
  "$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U postgres -tAc "select 1 from pg_database where datname='lossline'" | grep -q 1 \
    || "$PG_BIN/createdb" -h 127.0.0.1 -p "$port" -U postgres lossline
}
stop_pg() { [ -n "${PG_DIR:-}" ] && as_pg "$PG_BIN/pg_ctl" -D "$PG_DIR/pg" -m fast stop >/dev/null 2>&1 || true; }

PIDS=()
spawn() { # spawn NAME LOGFILE CMD...: run in the background, remember the PID
  local name="$1" logf="$2"; shift 2
  "$@" >"$logf" 2>&1 &
  PIDS+=("$!")
}
wait_port() { # wait_port PORT NAME LOGFILE
  for _ in $(seq 1 150); do (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null && return 0; sleep 0.2; done
  tail -20 "$3" >&2 || true; die "$2 did not open port $1 (log above)."
}
cleanup() {
  for p in "${PIDS[@]:-}"; do [ -n "$p" ] && kill "$p" 2>/dev/null || true; done
  for p in "${PIDS[@]:-}"; do [ -n "$p" ] && wait "$p" 2>/dev/null || true; done
  stop_pg
}

# services DIR PGPORT S3PORT SMTPPORT MAILWEBPORT: the database and the fakes, with env exported.
services() {
  local dir="$1"
  PG_DIR="$dir"
  export DATABASE_URL="postgres://postgres@127.0.0.1:$2/lossline"
  export S3_ENDPOINT="http://127.0.0.1:$3" S3_BUCKET="lossline-raw" S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER S3_FORCE_PATH_STYLE=true
  export SMTP_URL="smtp://127.0.0.1:$4" MAIL_INBOX_URL="http://127.0.0.1:$5"
  if [ ! -s "$dir/session-secret" ]; then mkdir -p "$dir"; umask 077; openssl rand -hex 32 >"$dir/session-secret"; umask 022; fi
  export BETTER_AUTH_SECRET="$(cat "$dir/session-secret")"
  start_pg "$dir" "$2"
  spawn s3 "$dir/s3.log" node --import tsx fakes/s3.ts --port "$3" --dir "$dir/s3" --bucket "$S3_BUCKET"
  spawn mail "$dir/mail.log" node --import tsx fakes/mail.ts --smtp-port "$4" --web-port "$5" --dir "$dir/mail"
  wait_port "$3" "The S3 fake" "$dir/s3.log"
  wait_port "$4" "The mail catcher" "$dir/mail.log"
  node --import tsx scripts/migrate.ts
}

run_mode() {
  install_deps
  trap 'echo; log "stopping"; cleanup; log "stopped; data kept in .data/"; exit 0' INT TERM
  trap cleanup EXIT
  services "$ROOT/.data" 54329 4569 1025 1080
  export PUBLIC_BASE_URL="http://127.0.0.1:4321" HOST=127.0.0.1 PORT=4321
  node --import tsx scripts/seed.ts
  log "building the web app"
  npx astro build >"$ROOT/.data/build.log" 2>&1 || { tail -30 "$ROOT/.data/build.log"; die "astro build failed (log above)."; }
  spawn worker "$ROOT/.data/worker.log" node --import tsx src/worker/main.ts
  spawn web "$ROOT/.data/web.log" node scripts/serve.mjs
  wait_port 4321 "The web server" "$ROOT/.data/web.log"
  cat <<EOF

  Lossline is running (Ctrl-C stops everything; data stays in .data/).
    web           http://127.0.0.1:4321
    mail inbox    http://127.0.0.1:1080
    S3 fake       http://127.0.0.1:4569  (bucket lossline-raw)
    PostgreSQL    postgres://postgres@127.0.0.1:54329/lossline
    health        http://127.0.0.1:4321/api/health
  Demo sign-ins (password lossline-demo-1):
$(node --import tsx -e "import('./src/server/demo-accounts.ts').then(m=>m.DEMO_ACCOUNTS.forEach(a=>console.log('    '+a.role.padEnd(12)+'  '+a.email)))")
  Logs: .data/web.log .data/worker.log .data/s3.log .data/mail.log .data/pg/server.log

EOF
  if [ -f scripts/demo-load.ts ]; then
    log "loading the demo plant (first start: a year of invented one-minute exports through the normal upload path; a few minutes)"
    if node --import tsx scripts/demo-load.ts; then log "demo ready: sign in at http://127.0.0.1:4321"; else log "demo data not loaded (see above); Lossline runs without it"; fi
  fi
  wait
}

test_mode() {
  install_deps
  apt_install chromium python3-iapws python3-pint python3-pandas
  local dir="$ROOT/.test-data"
  if [ -d "$dir/pg" ]; then as_pg "$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)/pg_ctl" -D "$dir/pg" -m fast stop >/dev/null 2>&1 || true; fi
  rm -rf "$dir"; mkdir -p "$dir"
  trap cleanup EXIT
  local failed=0
  # The type check (two tsc runs side by side, about 35 s at low load) starts first and runs while the
  # services start; it is waited for before vitest and counts as one test in the closing line.
  log "type check: tsc on tsconfig.json and tsconfig.index-strict.json (in the background while the services start)"
  spawn typecheck "$dir/typecheck.log" node --import tsx scripts/typecheck.ts --json "$dir/typecheck.json"
  local typecheck_pid=$!
  local o="${LOSSLINE_PORT_OFFSET:-0}" # several checkouts can test side by side with different offsets
  PG_FSYNC=off services "$dir" $((54339 + o)) $((4579 + o)) $((1035 + o)) $((1090 + o))
  export PUBLIC_BASE_URL="http://127.0.0.1:$((4331 + o))" HOST=127.0.0.1 PORT=$((4331 + o)) SIGN_IN_LIMIT_PER_MINUTE=5
  export LOSSLINE_TEST_DIR="$dir"

  log "type check"
  wait "$typecheck_pid" || failed=1
  cat "$dir/typecheck.log"

  log "vitest: unit and integration tests"
  npx vitest run --reporter=default --reporter=json --outputFile.json="$dir/vitest.json" || failed=1

  log "production build"
  if ! npx astro build >"$dir/build.log" 2>&1; then tail -40 "$dir/build.log"; failed=1; echo '{"build":"failed"}' >"$dir/build.json"; fi

  if [ -f dist/server/entry.mjs ]; then
    node --import tsx scripts/seed.ts
    spawn worker "$dir/worker.log" node --import tsx src/worker/main.ts
    SIGN_IN_LIMIT_PER_MINUTE=600 spawn web "$dir/web.log" node scripts/serve.mjs
    wait_port "$PORT" "The web server" "$dir/web.log"
    log "Playwright in Chromium"
    PLAYWRIGHT_JSON_OUTPUT_NAME="$dir/playwright.json" npx playwright test --reporter=list,json || failed=1
  fi

  node --import tsx scripts/test-summary.ts "$dir" || failed=1
  return $failed
}

# For iterating on tests: services like a test run's (own folder and ports, so a full test run can go on
# beside them), left up until Ctrl-C, with the variables to export.
test_services_mode() {
  install_deps
  local dir="$ROOT/.dev-test-data"
  trap cleanup EXIT
  local o="${LOSSLINE_PORT_OFFSET:-0}"
  PG_FSYNC=off services "$dir" $((54349 + o)) $((4589 + o)) $((1045 + o)) $((1100 + o))
  node --import tsx scripts/seed.ts
  cat <<EOF
Test services are up. In another shell:
  export DATABASE_URL=$DATABASE_URL S3_ENDPOINT=$S3_ENDPOINT SMTP_URL=$SMTP_URL MAIL_INBOX_URL=$MAIL_INBOX_URL
  export BETTER_AUTH_SECRET=$BETTER_AUTH_SECRET PUBLIC_BASE_URL=http://127.0.0.1:$((4331 + o)) SIGN_IN_LIMIT_PER_MINUTE=5
  npx vitest run tests/<area>
EOF
  wait
}

# npm run bench:ingest: throwaway services (own folder and ports), then bench/ingest.ts, then cleanup.
bench_ingest_mode() {
  install_deps
  apt_install python3-pandas
  local dir="$ROOT/.bench-data"
  rm -rf "$dir"; mkdir -p "$dir"
  trap cleanup EXIT
  local o="${LOSSLINE_PORT_OFFSET:-0}"
  PG_FSYNC=on services "$dir" $((54359 + o)) $((4599 + o)) $((1055 + o)) $((1110 + o))
  node --import tsx bench/ingest.ts "$@"
}

# npm run bench:web: the production server on the demo year, loaded by 50 users at once (bench/web.ts).
# Its services live in .bench-web-data/ on their own ports and are KEPT between runs: the first run
# loads the demo year through the worker (many minutes), later runs find it loaded and start at once.
bench_web_mode() {
  install_deps
  local dir="$ROOT/.bench-web-data"
  trap cleanup EXIT
  local o="${LOSSLINE_PORT_OFFSET:-0}"
  PG_FSYNC=on services "$dir" $((54369 + o)) $((4609 + o)) $((1065 + o)) $((1120 + o))
  export PUBLIC_BASE_URL="http://127.0.0.1:$((4341 + o))" HOST=127.0.0.1 PORT=$((4341 + o))
  node --import tsx scripts/seed.ts
  spawn worker "$dir/worker.log" node --import tsx src/worker/main.ts
  log "loading the demo year (first run only: many minutes; progress above)"
  node --import tsx scripts/demo-load.ts || die "the demo year did not load (see above)"
  if [ "${BENCH_WEB_BUILD:-1}" = 1 ] || [ ! -f dist/server/entry.mjs ]; then
    log "production build"
    npx astro build >"$dir/build.log" 2>&1 || { tail -30 "$dir/build.log"; die "astro build failed (log above)."; }
  fi
  # The worker's jobs after loading (drift checks, engine settles) are done; it stays up as in production.
  # 50 people sign in within seconds from one address: the per-address sign-in limit is raised for the bench.
  SIGN_IN_LIMIT_PER_MINUTE=120 spawn web "$dir/web.log" node scripts/serve.mjs
  wait_port "$PORT" "The web server" "$dir/web.log"
  node --import tsx bench/web.ts
}

case "$MODE" in
  run|"") run_mode ;;
  test) test_mode ;;
  test-services) test_services_mode ;;
  bench-ingest) bench_ingest_mode "${@:2}" ;;
  bench-web) bench_web_mode ;;
  *) die "unknown mode '$MODE': use no argument to run Lossline, or 'test' to run every test" ;;
esac
