#!/usr/bin/env bash
# npm test: the same bring-up with a separate test database and ports, then svelte-check,
# Vitest (unit and integration on real PostgreSQL over real HTTP) and Playwright in Debian's
# Chromium. Every stage runs; the command fails if any stage failed.
source "$(dirname "$0")/lib.sh"

# TEST_SLOT=N (0-9) gives a run its own ports, database and store, so that several runs can
# go on side by side on one machine.
SLOT="${TEST_SLOT:-0}"
case "$SLOT" in [0-9]) ;; *) die "TEST_SLOT must be 0-9" ;; esac
SUFFIX=""; [ "$SLOT" = 0 ] || SUFFIX="_$SLOT"
slot_env "$SLOT" "inchwarden_test$SUFFIX" inchwarden-test "s3-test$SUFFIX"
[ -z "${TEST_DATABASE_URL:-}" ] || export DATABASE_URL="$TEST_DATABASE_URL"
export TEST_BASE_URL="$ORIGIN" PW_OUTPUT_DIR="test-results/e2e$SUFFIX"
# The test server trusts x-forwarded-for so tests can act as distinct client addresses.
export ADDRESS_HEADER=x-forwarded-for XFF_DEPTH=1
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"
# adapter-node: on SIGTERM, close open connections after 5 s rather than 30 s.
export SHUTDOWN_TIMEOUT="${SHUTDOWN_TIMEOUT:-5}"

trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_deps
[ -x "$CHROMIUM_PATH" ] || apt_install chromium fonts-liberation
services_up "${DATABASE_URL##*/}" "$SLOT"

# TEST_STAGES picks stages while working (e.g. TEST_STAGES=vitest npm test -- tests/unit/auth);
# CI and a plain npm test run all three, and the summary names any stage left out.
STAGES=" ${TEST_STAGES:-svelte-check vitest playwright} "
FAILED=()
SKIPPED=()
stage() {
	local name="$1"; shift
	if [ "${STAGES#* $name }" = "$STAGES" ]; then SKIPPED+=("$name"); log "── $name: not asked for (TEST_STAGES)"; return 0; fi
	log "── $name"; "$@" || FAILED+=("$name")
}

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
if [ "${#SKIPPED[@]}" -gt 0 ]; then
	log "passed, but NOT run: ${SKIPPED[*]} (TEST_STAGES) (after ${SECONDS}s)"
	exit 0
fi
log "all stages passed: svelte-check, vitest, playwright (in ${SECONDS}s)"
