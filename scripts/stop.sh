#!/usr/bin/env bash
# npm run stop — stops what a running `npm start` started (and nothing else).
source "$(dirname "$0")/lib/common.sh"
PIDS="${KALIBORE_DATA_DIR:-$ROOT/.data}/run/start.pids"
if [ ! -f "$PIDS" ]; then say "Kalibore is not running (no $PIDS)"; exit 0; fi
while read -r pid; do STARTED_PIDS+=("$pid"); done <"$PIDS"
# The start script's own trap cleans up when its children exit; stop them directly too.
stop_started
rm -f "$PIDS"
say "stopped"
