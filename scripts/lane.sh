#!/usr/bin/env bash
# Run a command with a test setup of its own ("lane" 1–9): its own PostgreSQL cluster and fresh
# databases, mail and storage fakes, build folder and ports, so several people (or CI jobs) can
# run tests in one checkout side by side. Example:
#   bash scripts/lane.sh 2 'npm run build && npx vitest run --project integration tests/integration/x.test.ts'
set -uo pipefail
source "$(dirname "$0")/lib.sh"
n=${1:?lane number 1-9}; shift
[[ $n =~ ^[1-9]$ ]] || { say "lane must be 1-9"; exit 2; }
export LOOM_BUILD_DIR=.data/build-lane$n LOOM_TEST_OUT=$root/.data/test-lane$n
mkdir -p "$LOOM_TEST_OUT"
export LOOM_PG_DATA=$root/.data/pg-lane$n LOOM_PG_PORT=$((54340 + n)) LOOM_PG_FAST=1
DATABASE_URL=$(bash scripts/db.sh fresh loomwright_test) || exit 1
E2E_DATABASE_URL=$(bash scripts/db.sh fresh loomwright_e2e) || exit 1
export DATABASE_URL E2E_DATABASE_URL
export SMTP_PORT=$((2700 + 10 * n)) MAIL_API_PORT=$((2701 + 10 * n)) S3_ENDPOINT=http://127.0.0.1:$((4700 + 10 * n)) S3_DIR=$LOOM_TEST_OUT/s3
export INTEGRATION_PORT=$((4300 + 10 * n)) E2E_PORT=$((4301 + 10 * n))
start_fakes "$LOOM_TEST_OUT/fakes.log" || exit 1
trap 'kill $fakes_pid 2>/dev/null || true' EXIT
bash -c "$*"
