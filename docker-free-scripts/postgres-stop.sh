#!/usr/bin/env bash
# Stop Gapwise's PostgreSQL cluster (data is kept).
#
#   bash docker-free-scripts/postgres-stop.sh          dev cluster  (.data/pg)
#   bash docker-free-scripts/postgres-stop.sh --test   test cluster (.data/pg-test)
#
# Does nothing when the cluster does not exist or is not running.

set -euo pipefail
# shellcheck source=docker-free-scripts/postgres-common.sh
source "$(dirname "${BASH_SOURCE[0]}")/postgres-common.sh"

PARENT="$(cluster_parent)"
PGDATA="$PARENT/$PG_NAME"
if [[ ! -s "$PGDATA/PG_VERSION" ]]; then
  log "no cluster in $PGDATA; nothing to stop"
  exit 0
fi
BINDIR="$(find_bindir)" || die "PostgreSQL server binaries not found"

exec 9>"$PARENT/$PG_NAME.lock"
flock 9
if as_pg "$BINDIR/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1; then
  as_pg "$BINDIR/pg_ctl" -D "$PGDATA" -m fast -w -t 60 stop >/dev/null
  log "stopped $PGDATA"
else
  log "$PGDATA is not running"
fi
