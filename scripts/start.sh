#!/usr/bin/env bash
# npm start: dependencies, PostgreSQL, the fake SMTP server, migrations, the demo (only into
# an empty database), a production build, and the app at http://127.0.0.1:3000. Ctrl-C stops all.
source "$(dirname "$0")/lib.sh"

# Uploads may be up to UPLOAD_MAX_BYTES (5 MiB); routes enforce their own, smaller caps.
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}"
export HOST="${HOST:-127.0.0.1}" PORT="${PORT:-3000}"
export ORIGIN="${ORIGIN:-http://$HOST:$PORT}"
export DATABASE_URL="${DATABASE_URL:-postgres://postgres@127.0.0.1:$PGPORT/inchwarden}"
export SMTP_HOST="${SMTP_HOST:-127.0.0.1}" SMTP_PORT="${SMTP_PORT:-2525}"
export FAKE_SMTP_API="${FAKE_SMTP_API:-http://127.0.0.1:2580}"
export S3_ENDPOINT="${S3_ENDPOINT:-http://127.0.0.1:4569}" S3_BUCKET="${S3_BUCKET:-inchwarden}"
export S3_REGION="${S3_REGION:-us-east-1}" S3_FORCE_PATH_STYLE="${S3_FORCE_PATH_STYLE:-true}"
export S3_ACCESS_KEY_ID="${S3_ACCESS_KEY_ID:-S3RVER}" S3_SECRET_ACCESS_KEY="${S3_SECRET_ACCESS_KEY:-S3RVER}"
export FAKE_S3_DIR="${FAKE_S3_DIR:-$DATA/s3}"

trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_deps
pg_up
ensure_database inchwarden
start_fake_smtp
export STRIPE_API_BASE="${STRIPE_API_BASE:-http://127.0.0.1:12111}" APP_WEBHOOK_URL="${APP_WEBHOOK_URL:-$ORIGIN/api/v1/payments/webhook}"
if [ "${STRIPE_API_BASE#http://127.0.0.1}" != "$STRIPE_API_BASE" ]; then start_fake_payments; fi
if [ "${S3_ENDPOINT#http://127.0.0.1}" != "$S3_ENDPOINT" ]; then start_fake_s3; fi

log "migrating"
knex_cli migrate:latest >/dev/null
node_modules/.bin/tsx scripts/seed-demo.ts

log "building"
node_modules/.bin/svelte-kit sync
node_modules/.bin/vite build --logLevel warn

start_app app build
wait_for_port "$PORT" "the app"
cat <<MSG

  Inchwarden is running at $ORIGIN

  Demo sign-ins (password for all: $(node_modules/.bin/tsx -e "import('./seeds/data/demo.ts').then(m => console.log(m.DEMO_PASSWORD))")):
$(node_modules/.bin/tsx -e "import('./seeds/data/demo.ts').then(m => m.DEMO_PEOPLE.forEach(p => console.log('    ' + p.email.padEnd(34) + p.roles.join(', '))))")

  The fake SMTP server's messages appear on the admin outbox page.
  Press Ctrl-C to stop everything.

MSG
tail -f "$DATA/app.log" &
STARTED_PIDS+=("$!")
# Run until Ctrl-C, or until any service stops by itself; the EXIT trap stops the rest.
wait -n "${STARTED_PIDS[@]}" || true
