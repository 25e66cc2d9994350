#!/usr/bin/env bash
# npm run bench:frame: the same bring-up as the test command on its own slot (TEST_SLOT,
# default 8) with a fresh database inchwarden_bench, then the browser benchmarks against the
# built app: frame time while dragging on a 300-piece table (tests/bench/frame-bench.ts) and
# the play page's JavaScript gzipped (tests/bench/bundle-size.ts). Stops everything it started.
# `npm run bench:frame -- frame` or `-- bundle` runs only one of the two.
source "$(dirname "$0")/lib.sh"

export NODE_ENV=production
SLOT="${TEST_SLOT:-8}"
case "$SLOT" in [0-9]) ;; *) die "TEST_SLOT must be 0-9" ;; esac
WHICH="${1:-all}"
case "$WHICH" in all|frame|bundle) ;; *) die "usage: npm run bench:frame [-- frame|bundle]" ;; esac
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}"
export HOST=127.0.0.1 PORT="$((3100 + SLOT))"
export ORIGIN="http://127.0.0.1:$PORT" BENCH_BASE_URL="http://127.0.0.1:$PORT"
export DATABASE_URL="postgres://postgres@127.0.0.1:$PGPORT/inchwarden_bench"
export SMTP_HOST=127.0.0.1 SMTP_PORT="$((2526 + SLOT))"
export FAKE_SMTP_API="http://127.0.0.1:$((2581 + SLOT))"
export S3_ENDPOINT="http://127.0.0.1:$((4570 + SLOT))" S3_BUCKET=inchwarden-bench S3_REGION=us-east-1
export S3_FORCE_PATH_STYLE=true S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
export FAKE_S3_DIR="$DATA/s3-bench"
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"
export STRIPE_API_BASE="http://127.0.0.1:$((12120 + SLOT))" APP_WEBHOOK_URL="$ORIGIN/api/v1/payments/webhook"

trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_deps
[ -x "$CHROMIUM_PATH" ] || apt_install chromium fonts-liberation
for port in "$PORT" "$SMTP_PORT"; do
	if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
		die "port $port is in use: another run holds slot $SLOT (set TEST_SLOT=0-9)"
	fi
done
pg_up
start_fake_smtp
rm -rf "$FAKE_S3_DIR"
start_fake_s3
start_fake_payments
log "fresh benchmark database"
recreate_database inchwarden_bench
knex_cli migrate:latest >/dev/null
node_modules/.bin/tsx scripts/seed-demo.ts

log "building"
export BUILD_DIR="$DATA/build-bench" SVELTEKIT_OUT_DIR="$DATA/kit-bench"
node_modules/.bin/svelte-kit sync
node_modules/.bin/vite build --logLevel warn
start_bg "app-bench" node "$BUILD_DIR"
export BENCH_CLIENT_MANIFEST="$SVELTEKIT_OUT_DIR/output/client/.vite/manifest.json"
wait_for_port "$PORT" "the app"

log "load average: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores"
status=0
if [ "$WHICH" != bundle ]; then node_modules/.bin/tsx tests/bench/frame-bench.ts || status=1; fi
if [ "$WHICH" != frame ]; then node_modules/.bin/tsx tests/bench/bundle-size.ts || status=1; fi
log "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
exit "$status"
