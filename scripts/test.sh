#!/usr/bin/env bash
# npm test: the same bring-up with a separate test database and ports, then svelte-check,
# Vitest (unit and integration on real PostgreSQL over real HTTP) and Playwright in Debian's
# Chromium. Every stage runs; the command fails if any stage failed.
source "$(dirname "$0")/lib.sh"

export NODE_ENV=production
# TEST_SLOT=N (0-9) gives a run its own ports, database and store, so that several runs can
# go on side by side on one machine.
SLOT="${TEST_SLOT:-0}"
case "$SLOT" in [0-9]) ;; *) die "TEST_SLOT must be 0-9" ;; esac
SUFFIX=""; [ "$SLOT" = 0 ] || SUFFIX="_$SLOT"
# Uploads may be up to UPLOAD_MAX_BYTES (5 MiB); routes enforce their own, smaller caps.
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}"
export HOST=127.0.0.1 PORT="$((3100 + SLOT))"
export ORIGIN="http://127.0.0.1:$PORT" TEST_BASE_URL="http://127.0.0.1:$PORT"
export DATABASE_URL="${TEST_DATABASE_URL:-postgres://postgres@127.0.0.1:$PGPORT/inchwarden_test$SUFFIX}"
export SMTP_HOST=127.0.0.1 SMTP_PORT="$((2526 + SLOT))"
export FAKE_SMTP_API="http://127.0.0.1:$((2581 + SLOT))"
export S3_ENDPOINT="http://127.0.0.1:$((4570 + SLOT))" S3_BUCKET=inchwarden-test S3_REGION=us-east-1
export S3_FORCE_PATH_STYLE=true S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
export FAKE_S3_DIR="$DATA/s3-test$SUFFIX" PW_OUTPUT_DIR="test-results/e2e$SUFFIX"
# The test server trusts x-forwarded-for so tests can act as distinct client addresses.
export ADDRESS_HEADER=x-forwarded-for XFF_DEPTH=1
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"
# adapter-node: on SIGTERM, close open connections after 5 s rather than 30 s.
export SHUTDOWN_TIMEOUT="${SHUTDOWN_TIMEOUT:-5}"

trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_deps
[ -x "$CHROMIUM_PATH" ] || apt_install chromium fonts-liberation
export STRIPE_API_BASE="http://127.0.0.1:$((12120 + SLOT))" APP_WEBHOOK_URL="$ORIGIN/api/v1/payments/webhook"
services_up "${DATABASE_URL##*/}" "$SLOT"

FAILED=()
stage() { local name="$1"; shift; log "── $name"; "$@" || FAILED+=("$name"); }

stage "svelte-check" bash -c 'node_modules/.bin/svelte-kit sync && node_modules/.bin/svelte-check --tsconfig ./tsconfig.json --output human --threshold error'
log "building"
export BUILD_DIR="$DATA/build-test$SUFFIX" SVELTEKIT_OUT_DIR="$DATA/kit-test$SUFFIX"
node_modules/.bin/vite build --logLevel warn
start_app "app-test$SUFFIX" "$BUILD_DIR"
wait_for_port "$PORT" "the app"

stage "vitest" env NODE_OPTIONS='--import tsx' node_modules/.bin/vitest run "$@"
stage "playwright" node_modules/.bin/playwright test

echo
if [ "${#FAILED[@]}" -gt 0 ]; then
	log "FAILED: ${FAILED[*]} (after ${SECONDS}s)"
	exit 1
fi
log "all stages passed: svelte-check, vitest, playwright (in ${SECONDS}s)"
