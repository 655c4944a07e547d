#!/usr/bin/env bash
# The app for end-to-end tests: a fresh database (migrated, demo data), the test mail sink that
# scripts/test started, and the built client. Runs in the foreground until Playwright stops it.
source "$(dirname "$0")/../../scripts/lib/common.sh"
PORT_E2E="${1:-3100}"
pg_start
psql_admin -c "drop database if exists loadframe_e2e_$PORT_E2E with (force)" >/dev/null
psql_admin -c "create database loadframe_e2e_$PORT_E2E" >/dev/null
export NODE_ENV=production PORT="$PORT_E2E" PUBLIC_URL="${E2E_PUBLIC_URL:-http://127.0.0.1:$PORT_E2E}"
export DATABASE_URL; DATABASE_URL=$(db_url loadframe_e2e_$PORT_E2E)
export AUTH_SECRET; AUTH_SECRET=$(auth_secret)
export SMTP_PORT="${TEST_SMTP_PORT:-1125}" MAIL_INBOX_URL="${TEST_INBOX_URL:-http://127.0.0.1:1180}"
export UPLOAD_DIR="$DATA/e2e-uploads-$PORT_E2E" RATE_LIMIT=false LOG_LEVEL=warn
rm -rf "$UPLOAD_DIR"; mkdir -p "$UPLOAD_DIR"
node --import tsx server/db/migrate.ts
DEMO_SEASON=off node --import tsx scripts/seed.ts
exec node --import tsx server/index.ts
