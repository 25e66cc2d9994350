#!/usr/bin/env bash
# npm run bench:frame: the test command's bring-up on its own slot (TEST_SLOT, default 8) with
# a fresh database inchwarden_bench, then the browser benchmarks against the built app: frame
# time while dragging on a 300-piece table (tests/bench/frame-bench.ts) and the play page's
# JavaScript gzipped (tests/bench/bundle-size.ts). Stops everything it started.
# `npm run bench:frame -- frame` or `-- bundle` runs only one of the two.
source "$(dirname "$0")/lib.sh"

WHICH="${1:-all}"
case "$WHICH" in all|frame|bundle) ;; *) die "usage: npm run bench:frame [-- frame|bundle]" ;; esac
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"

trap cleanup EXIT
trap 'exit 130' INT TERM

[ -x "$CHROMIUM_PATH" ] || apt_install chromium fonts-liberation
bench_app_up "${TEST_SLOT:-8}" inchwarden_bench
export BENCH_CLIENT_MANIFEST="$SVELTEKIT_OUT_DIR/output/client/.vite/manifest.json"

status=0
if [ "$WHICH" != bundle ]; then node_modules/.bin/tsx tests/bench/frame-bench.ts || status=1; fi
if [ "$WHICH" != frame ]; then node_modules/.bin/tsx tests/bench/bundle-size.ts || status=1; fi
log "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
exit "$status"
