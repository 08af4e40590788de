#!/usr/bin/env bash
# npm stop: stop the app started by npm start, then the local services.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
stop_pidfile app "$DATA/app.pid" next
bash "$ROOT/scripts/services.sh" stop
