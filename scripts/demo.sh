#!/usr/bin/env bash
# The demo: installs what is missing, starts PostgreSQL on loopback, loads the demo show afresh,
# starts the local SMTP fake and the app, and prints where to go. Ctrl-C stops the app and the fake.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

ensure_node_modules
./docker-less-db.sh start crownbench

export DATABASE_URL="$(./docker-less-db.sh url crownbench)"
export PORT="${PORT:-3000}" HOST="${HOST:-127.0.0.1}" BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-12M}"
export ORIGIN="${ORIGIN:-http://localhost:$PORT}"
export SMTP_FAKE_PORT="${SMTP_FAKE_PORT:-2525}" SMTP_FAKE_HTTP_PORT="${SMTP_FAKE_HTTP_PORT:-2526}"
export SMTP_URL="smtp://127.0.0.1:$SMTP_FAKE_PORT"
export CB_DEV_MAIL_URL="http://127.0.0.1:$SMTP_FAKE_HTTP_PORT"
# Anyone signed in may start a society in the demo (unset, only the host's operator may).
export CB_SOCIETY_SIGNUP="${CB_SOCIETY_SIGNUP:-open}"
export AUTH_SECRET="${AUTH_SECRET:-$(auth_secret)}"
export PAYMENT_FAKE_PORT="${PAYMENT_FAKE_PORT:-12111}"
export PAYMENT_FAKE_WEBHOOK_URL="http://127.0.0.1:$PORT/api/payments/webhook"
use_payment_fake

echo "demo: loading the demo society and its spring show (this replaces earlier demo data)"
npx tsx scripts/db.ts reset

start_smtp_fake
start_payment_fake
trap stop_background EXIT INT TERM

echo "demo: building the app"
npx vite build --logLevel error >/dev/null

cat <<MSG

  Crownbench demo is running at $ORIGIN

  Sign in with one of these addresses; the sign-in link is caught by the local mail server
  and shown at $ORIGIN/dev/mail (open it and click the link):
    admin@crownbench.test     society admin
    chair@crownbench.test     show chair
    clerk@crownbench.test     clerk at the entry desk
    judge1@crownbench.test    judge (judge2, judge3 too)
    member@crownbench.test    member and exhibitor
    lapsed@crownbench.test    member whose dues have lapsed
  Any other address gets a new account with no role.

  Payments go to the local payment fake at http://127.0.0.1:$PAYMENT_FAKE_PORT (no card, no
  money): lapsed@crownbench.test can pay dues at $ORIGIN/my/membership.

  Press Ctrl-C to stop. The database keeps running: ./docker-less-db.sh stop ends it.

MSG
BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-12M}" node build
