#!/usr/bin/env bash
# npm run bench:load: the check API and the commit route under load (tests/bench/load-bench.ts).
# With BENCH_BASE_URL set it drives that app as it stands; without, it brings up its own on a
# slot of its own (TEST_SLOT, default 7: a fresh database inchwarden_load with the demo, a
# production build, the app on 3107) and stops everything it started afterwards.
source "$(dirname "$0")/lib.sh"

# The load generator is a Node process too: the app's flags (lib.sh) keep its own collections
# short, and --expose-gc lets it collect its garbage before each measured run.
bench_client() { node --expose-gc "${APP_NODE_FLAGS[@]}" --import tsx tests/bench/load-bench.ts; }

# The disk probe writes beside PostgreSQL's data (the cluster lib.sh runs, npm start's too).
if [ -n "${BENCH_BASE_URL:-}" ]; then
	pg_home
	export BENCH_DISK_DIR="${BENCH_DISK_DIR:-$PGHOME}"
	bench_client
	exit
fi
trap cleanup EXIT
trap 'exit 130' INT TERM
bench_app_up "${TEST_SLOT:-7}" inchwarden_load
export BENCH_DISK_DIR="${BENCH_DISK_DIR:-$PGHOME}"
status=0
bench_client || status=1
log "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
exit "$status"
