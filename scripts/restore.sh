#!/usr/bin/env bash
# npm run restore ARCHIVE — an archive of npm run backup into an EMPTY instance (scripts/restore.ts
# refuses anything else and checks every checksum). For the local instance: npm run reset-demo,
# then npm run restore ARCHIVE, then npm start (which finds data and seeds nothing).
source "$(dirname "$0")/lib/common.sh"
[ $# -eq 1 ] || fail "usage: npm run restore backups/kalibore-<database>-<time>.tar.gz"
ARCHIVE="$(cd "$(dirname "$1")" && pwd)/$(basename "$1")"
local_instance_env
trap 'stop_started' EXIT
trap 'exit 130' INT TERM
ensure_mariadb
with_local_services
node --conditions=react-server --import tsx scripts/restore.ts "$ARCHIVE"
