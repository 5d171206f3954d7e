# Shared by postgres-start.sh and postgres-stop.sh (sourced, not run).
# Works out which cluster (dev or --test) we are talking about, where it lives, and how to run
# the server binaries as the postgres system user.

GAPWISE_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

log() { printf '[postgres] %s\n' "$*" >&2; }
die() { printf '[postgres] ERROR: %s\n' "$*" >&2; exit 1; }

# --- which cluster -----------------------------------------------------------------------------
PG_MODE=dev
for arg in "$@"; do
  case "$arg" in
    --test) PG_MODE=test ;;
    -h | --help)
      sed -n '2,/^$/s/^# \{0,1\}//p' "$0"
      exit 0
      ;;
    *) die "unknown argument: $arg (only --test is understood)" ;;
  esac
done

if [[ "$PG_MODE" == test ]]; then
  PG_NAME=pg-test
  PG_PORT="${GAPWISE_TEST_PGPORT:-54339}"
else
  PG_NAME=pg
  PG_PORT="${PGPORT:-54329}"
fi
[[ "$PG_PORT" =~ ^[0-9]+$ ]] || die "port must be a number, got '$PG_PORT'"

PG_ROLE=gapwise
PG_DATABASE=gapwise
PG_PASSWORD="${GAPWISE_DB_PASSWORD:-gapwise}"

# --- where it lives ----------------------------------------------------------------------------
DATA_DIR="${GAPWISE_DATA_DIR:-$GAPWISE_ROOT/.data}"
mkdir -p "$DATA_DIR"
DATA_DIR="$(cd "$DATA_DIR" && pwd)"

# Who runs the server: initdb and postgres refuse to run as root.
if [[ "$(id -u)" == 0 ]]; then
  PG_USER=postgres
else
  PG_USER="$(id -un)"
fi

as_pg() {
  if [[ "$(id -u)" == 0 ]]; then
    (cd / && runuser -u "$PG_USER" -- "$@")
  else
    (cd / && "$@")
  fi
}

# The cluster's parent folder: the project's data folder when the server user can enter it,
# else a world-traversable folder keyed by a hash of the data folder's path.
cluster_parent() {
  if [[ "$(id -u)" != 0 ]] || ! id "$PG_USER" >/dev/null 2>&1 \
    || runuser -u "$PG_USER" -- test -x "$DATA_DIR" 2>/dev/null; then
    printf '%s\n' "$DATA_DIR"
  else
    local hash
    hash="$(printf '%s' "$DATA_DIR" | sha256sum | cut -c1-12)"
    printf '/var/tmp/gapwise-%s\n' "$hash"
  fi
}

find_bindir() {
  local dir
  if command -v pg_config >/dev/null 2>&1; then
    dir="$(pg_config --bindir 2>/dev/null || true)"
    if [[ -n "$dir" && -x "$dir/postgres" && -x "$dir/initdb" && -x "$dir/pg_ctl" ]]; then
      printf '%s\n' "$dir"
      return 0
    fi
  fi
  # Newest installed major version first.
  for dir in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -t/ -k5,5 -n -r); do
    if [[ -x "$dir/postgres" && -x "$dir/initdb" && -x "$dir/pg_ctl" ]]; then
      printf '%s\n' "$dir"
      return 0
    fi
  done
  return 1
}

urlencode() { node -e 'process.stdout.write(encodeURIComponent(process.argv[1]))' "$1"; }
