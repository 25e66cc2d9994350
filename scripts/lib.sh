# Shared bring-up for the start and test commands: dependencies, PostgreSQL on loopback,
# the local fake services, and a cleanup that stops only what this run started.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

# Settings from .env (if any) override the defaults below; see .env.example.
if [ -f .env ]; then set -a; . ./.env; set +a; fi
export PGPORT="${PGPORT:-54329}"
DATA="$ROOT/.data"
STARTED_PIDS=()
STARTED_PG=0
PG_SIGNED_IN=0
# Where the cluster lives: .data/ unless the postgres user cannot reach the checkout.
PGHOME="$DATA"

log() { printf '\033[1;32m[inchwarden]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[inchwarden]\033[0m %s\n' "$*" >&2; exit 1; }

as_pg() {
	# PostgreSQL refuses to run as root: run its tools as the postgres user then.
	# (from /, which the postgres user can always enter; every path given is absolute)
	if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

apt_install() {
	command -v apt-get >/dev/null || die "apt-get is missing: install $* by hand"
	local sudo=""
	[ "$(id -u)" = 0 ] || sudo="sudo"
	log "installing $* from Debian's packages (log: .data/apt.log)"
	mkdir -p "$DATA"
	# No recommended extras (chromium's would bring daemons such as avahi), and every stream of
	# apt and of anything its install scripts start goes to a log file: a service started by a
	# package must never hold this command's output open after it ends.
	if ! { $sudo env DEBIAN_FRONTEND=noninteractive apt-get update -qq \
		&& $sudo env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "$@"; \
		} </dev/null >>"$DATA/apt.log" 2>&1; then
		tail -20 "$DATA/apt.log" >&2
		die "could not install $* (see .data/apt.log)"
	fi
}

ensure_deps() {
	if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		log "installing dependencies (npm ci)"
		# --include=dev: the build and the tests need them even when NODE_ENV=production
		npm ci --include=dev --no-audit --no-fund
	fi
}

find_pgbin() {
	local d
	for d in /usr/lib/postgresql/*/bin; do
		[ -x "$d/initdb" ] && [ -x "$d/pg_ctl" ] && { echo "$d"; return 0; }
	done
	return 1
}

ensure_pg_binaries() {
	PGBIN="$(find_pgbin || true)"
	if [ -z "$PGBIN" ] || ! command -v psql >/dev/null; then
		apt_install postgresql postgresql-client
		PGBIN="$(find_pgbin)" || die "PostgreSQL binaries not found after install"
	fi
	export PGBIN
}

pg_home() {
	mkdir -p "$DATA"
	if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$DATA" 2>/dev/null; then
		# e.g. a checkout under /root: PostgreSQL runs as postgres and must be able to enter
		# its data folder, so the cluster of this checkout lives under /var/tmp instead.
		PGHOME="/var/tmp/inchwarden-$(printf %s "$ROOT" | md5sum | cut -c1-12)"
		mkdir -p "$PGHOME"
		chown postgres:postgres "$PGHOME"
		log "the postgres user cannot enter $DATA: cluster kept in $PGHOME"
	fi
}

pg_up() {
	ensure_pg_binaries
	pg_home
	mkdir -p "$PGHOME/run"
	if [ ! -f "$PGHOME/pg/PG_VERSION" ]; then
		log "creating the PostgreSQL cluster in .data/pg"
		mkdir -p "$PGHOME/pg"
		if [ "$(id -u)" = 0 ]; then chown -R postgres:postgres "$PGHOME/pg" "$PGHOME/run"; fi
		chmod 700 "$PGHOME/pg"
		as_pg "$PGBIN/initdb" -D "$PGHOME/pg" -U postgres --auth=trust --encoding=UTF8 \
			--locale=C.UTF-8 >/dev/null
	fi
	if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$PGHOME/run"; fi
	if as_pg "$PGBIN/pg_ctl" -D "$PGHOME/pg" status >/dev/null 2>&1; then
		log "PostgreSQL already running on 127.0.0.1:$PGPORT"
	else
		log "starting PostgreSQL on 127.0.0.1:$PGPORT"
		touch "$PGHOME/pg.log"
		if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$PGHOME/pg.log"; fi
		if as_pg "$PGBIN/pg_ctl" -D "$PGHOME/pg" -l "$PGHOME/pg.log" -w -t 60 \
			-o "-c listen_addresses=127.0.0.1 -p $PGPORT -k $PGHOME/run" start >/dev/null; then
			STARTED_PG=1
		elif as_pg "$PGBIN/pg_ctl" -D "$PGHOME/pg" status >/dev/null 2>&1; then
			# Another run of this checkout started it at the same moment: use theirs.
			log "PostgreSQL was started by another run at the same moment: using it"
		else
			tail -20 "$PGHOME/pg.log"; die "PostgreSQL did not start"
		fi
	fi
	# Several runs of one checkout (npm start beside npm test, say) share this cluster: each
	# signs in under users/, and the last one out stops it if one of them started it.
	[ "$STARTED_PG" = 1 ] && touch "$PGHOME/run/started-by-inchwarden"
	mkdir -p "$PGHOME/users"
	echo "$$" >"$PGHOME/users/$$"
	PG_SIGNED_IN=1
}

pg_other_users() {
	local f pid n=0
	for f in "$PGHOME"/users/*; do
		[ -e "$f" ] || continue
		pid="$(basename "$f")"
		if [ "$pid" = "$$" ]; then continue; fi
		if kill -0 "$pid" 2>/dev/null; then n=$((n + 1)); else rm -f "$f"; fi
	done
	[ "$n" -gt 0 ]
}

ensure_database() {
	local name="$1"
	if ! psql -h 127.0.0.1 -p "$PGPORT" -U postgres -tAc "select 1 from pg_database where datname='$name'" | grep -q 1; then
		log "creating database $name"
		psql -h 127.0.0.1 -p "$PGPORT" -U postgres -qc "create database \"$name\"" >/dev/null
	fi
}

recreate_database() {
	local name="$1"
	psql -h 127.0.0.1 -p "$PGPORT" -U postgres -qc "drop database if exists \"$name\" with (force)" >/dev/null
	psql -h 127.0.0.1 -p "$PGPORT" -U postgres -qc "create database \"$name\"" >/dev/null
}

wait_for_port() {
	local port="$1" what="$2" i
	for i in $(seq 1 150); do
		if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then return 0; fi
		sleep 0.2
	done
	die "$what did not come up on port $port"
}

start_bg() {
	# start_bg <name> <command...>: run in the background, log under .data/, remember the pid
	local name="$1"; shift
	"$@" >"$DATA/$name.log" 2>&1 &
	STARTED_PIDS+=("$!")
}

# How the app's Node runs (npm start, npm test, the benches). V8's allocation-site pretenuring
# watches which allocation sites' objects survive a young collection and, past a threshold,
# allocates theirs straight in the old generation. A burst of concurrent requests trips it for
# the request path (SvelteKit's event, undici's Request and streams, zod's output), and from
# then on every request's short-lived objects land in the old generation: promotion rose from
# ~0.4 to ~1.4 MB per scavenge, scavenges took 3-7 ms instead of 1-2, and a 10-15 ms full
# collection followed every few seconds (docs/reliability.md §6 has the traces and runs).
APP_NODE_FLAGS=(--no-allocation-site-pretenuring)

start_app() {
	# start_app <name> <build dir>: the production server in the background (start_bg)
	start_bg "$1" node "${APP_NODE_FLAGS[@]}" "$2"
}

port_of() { node -e "console.log(new URL(process.argv[1]).port)" "$1"; }

start_fake() {
	# start_fake <port> <what> <script>: refuse a taken port, start, wait until it listens
	local port="$1" what="$2" script="$3"
	if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
		die "port $port is taken: is another run of $what up?"
	fi
	start_bg "$(basename "$script" .ts)-$port" node_modules/.bin/tsx "$script"
	wait_for_port "$port" "$what"
}

start_fake_smtp() {
	start_fake "$SMTP_PORT" "the fake SMTP server" scripts/fake-smtp.ts
	wait_for_port "$(port_of "$FAKE_SMTP_API")" "the fake SMTP listing"
}
start_fake_s3() { start_fake "$(port_of "$S3_ENDPOINT")" "the fake S3 store" scripts/fake-s3.ts; }
start_fake_payments() { start_fake "$(port_of "$STRIPE_API_BASE")" "the fake payment provider" scripts/fake-payments.ts; }

cleanup() {
	local pid
	# Finish the cleanup even when Ctrl-C also closed the terminal pipe we print to.
	trap '' PIPE INT TERM
	local i alive
	for pid in "${STARTED_PIDS[@]:-}"; do
		[ -n "$pid" ] && kill "$pid" 2>/dev/null || true
	done
	# A bounded wait: whatever has not ended 20 s after SIGTERM gets SIGKILL, so that the
	# command always ends.
	for i in $(seq 1 200); do
		alive=0
		for pid in "${STARTED_PIDS[@]:-}"; do
			[ -n "$pid" ] && kill -0 "$pid" 2>/dev/null && alive=1
		done
		[ "$alive" = 0 ] && break
		sleep 0.1
	done
	for pid in "${STARTED_PIDS[@]:-}"; do
		[ -n "$pid" ] || continue
		if kill -0 "$pid" 2>/dev/null; then
			log "pid $pid did not stop on SIGTERM: SIGKILL" 2>/dev/null || true
			pkill -KILL -P "$pid" 2>/dev/null || true
			kill -KILL "$pid" 2>/dev/null || true
		fi
		wait "$pid" 2>/dev/null || true
	done
	if [ "$PG_SIGNED_IN" = 1 ]; then
		rm -f "$PGHOME/users/$$"
		if pg_other_users; then
			log "leaving PostgreSQL running: other runs of this checkout use it" 2>/dev/null || true
		elif [ -f "$PGHOME/run/started-by-inchwarden" ]; then
			log "stopping PostgreSQL" 2>/dev/null || true
			as_pg "$PGBIN/pg_ctl" -D "$PGHOME/pg" -m fast -w -t 30 stop >/dev/null 2>&1 \
				|| as_pg "$PGBIN/pg_ctl" -D "$PGHOME/pg" -m immediate -w -t 30 stop >/dev/null 2>&1 || true
			rm -f "$PGHOME/run/started-by-inchwarden"
		fi
	fi
}

services_up() {
	# services_up <database> <slot>: after the slot's ports are set — refuse a slot another run
	# holds (before touching anything of it), then PostgreSQL, the three fakes, and a fresh
	# database, migrated, with the demo.
	local database="$1" slot="$2" port
	for port in "$PORT" "$SMTP_PORT"; do
		if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
			die "port $port is in use: another run holds slot $slot (set TEST_SLOT=0-9)"
		fi
	done
	pg_up
	start_fake_smtp
	rm -rf "$FAKE_S3_DIR"
	start_fake_s3
	start_fake_payments
	log "fresh database $database"
	recreate_database "$database"
	knex_cli migrate:latest >/dev/null
	node_modules/.bin/tsx scripts/seed-demo.ts
}

slot_env() {
	# slot_env <slot> <database> <bucket> <store>: the settings of an app on a slot of its own
	# (npm test, the benches): app 3100 + slot, fake SMTP 2526 + slot (listing 2581 + slot),
	# fake S3 4570 + slot with its bucket and store under .data/, fake payments 12120 + slot.
	local slot="$1" database="$2" bucket="$3" store="$4"
	export NODE_ENV=production
	# Uploads may be up to UPLOAD_MAX_BYTES (5 MiB); routes enforce their own, smaller caps.
	export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}"
	export HOST=127.0.0.1 PORT="$((3100 + slot))"
	export ORIGIN="http://127.0.0.1:$PORT"
	export DATABASE_URL="postgres://postgres@127.0.0.1:$PGPORT/$database"
	export SMTP_HOST=127.0.0.1 SMTP_PORT="$((2526 + slot))"
	export FAKE_SMTP_API="http://127.0.0.1:$((2581 + slot))"
	export S3_ENDPOINT="http://127.0.0.1:$((4570 + slot))" S3_BUCKET="$bucket" S3_REGION=us-east-1
	export S3_FORCE_PATH_STYLE=true S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
	export FAKE_S3_DIR="$DATA/$store"
	export STRIPE_API_BASE="http://127.0.0.1:$((12120 + slot))" APP_WEBHOOK_URL="$ORIGIN/api/v1/payments/webhook"
}

bench_app_up() {
	# bench_app_up <slot> <database>: the test command's bring-up on a slot of its own for a
	# benchmark — PostgreSQL, the fakes, a fresh database with the demo, a production build and
	# the app on 3100 + slot (BENCH_BASE_URL); cleanup (trap it) stops what it started.
	local slot="$1" database="$2"
	case "$slot" in [0-9]) ;; *) die "TEST_SLOT must be 0-9" ;; esac
	slot_env "$slot" "$database" "${database//_/-}" "s3-$database"
	export BENCH_BASE_URL="$ORIGIN"
	ensure_deps
	services_up "$database" "$slot"
	log "building"
	export BUILD_DIR="$DATA/build-$database" SVELTEKIT_OUT_DIR="$DATA/kit-$database"
	node_modules/.bin/svelte-kit sync
	node_modules/.bin/vite build --logLevel warn
	start_app "app-$database" "$BUILD_DIR"
	wait_for_port "$PORT" "the app"
	log "load average: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores"
}

knex_cli() {
	NODE_OPTIONS='--import tsx' node_modules/.bin/knex --knexfile knexfile.ts "$@"
}
