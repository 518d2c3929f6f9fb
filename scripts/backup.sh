#!/usr/bin/env bash
# npm run backup — the database and the stored objects into one dated archive (scripts/backup.ts).
# Reaches the instance `npm start` runs (or what .env / the environment names); when Kalibore is
# stopped, starts its private MariaDB and S3 fake for the backup only.
source "$(dirname "$0")/lib/common.sh"
local_instance_env
trap 'stop_started' EXIT
trap 'exit 130' INT TERM
ensure_mariadb
with_local_services
node --conditions=react-server --import tsx scripts/backup.ts
