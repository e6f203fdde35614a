#!/usr/bin/env bash
# README command 1: install, start PostgreSQL on loopback, migrate, seed the demo, start the mail
# and storage fakes, build, and serve Loomwright. Ctrl-C stops the app and the fakes.
set -euo pipefail
source "$(dirname "$0")/lib.sh"

port=${PORT:-5178}
install_packages
mkdir -p .data

if [ -z "${DATABASE_URL:-}" ]; then
	DATABASE_URL=$(bash scripts/db.sh start)
fi
export DATABASE_URL
export SMTP_PORT=${SMTP_PORT:-2525} MAIL_API_PORT=${MAIL_API_PORT:-2526}
export S3_ENDPOINT=${S3_ENDPOINT:-http://127.0.0.1:4569} S3_DIR=${S3_DIR:-$root/.data/s3}
export LOOM_DEV_MAIL=${LOOM_DEV_MAIL:-1}
# A large harness document is bigger than adapter-node's 512 kB default request body.
export BODY_SIZE_LIMIT=${BODY_SIZE_LIMIT:-16M}

node --import tsx scripts/migrate.ts
node --import tsx scripts/seed.ts

start_fakes .data/fakes.log
trap 'kill $fakes_pid 2>/dev/null || true' EXIT

say "building"
npm run build --silent >.data/build.log 2>&1 || { cat .data/build.log >&2; exit 1; }

cat >&2 <<TXT

  Loomwright is running at  http://localhost:$port
  Demo sign-in:             demo@loomwright.test  /  tracer-stripe-demo
  Site admin:               admin@loomwright.test /  earth-strap-admin
  Club organiser:           organiser@loomwright.test / bonded-earth-organiser
  Caught mail (dev):        http://localhost:$port/admin/mail

TXT
HOST=${HOST:-127.0.0.1} PORT=$port ORIGIN=${ORIGIN:-http://localhost:$port} NODE_ENV=production node build
