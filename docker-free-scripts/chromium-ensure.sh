#!/usr/bin/env bash
# Make sure Debian's chromium is installed for the browser tests (never a browser download by a
# test tool). Prints the browser's path on the last line.
#
#   bash docker-free-scripts/chromium-ensure.sh
#
# Environment: CHROME_BIN — use this browser instead (must be executable); nothing is installed.

set -euo pipefail

if [[ -n "${CHROME_BIN:-}" ]]; then
  [[ -x "$CHROME_BIN" ]] || { echo "[chromium] CHROME_BIN=$CHROME_BIN is not executable" >&2; exit 1; }
  echo "$CHROME_BIN"
  exit 0
fi

if [[ ! -x /usr/bin/chromium ]]; then
  [[ "$(id -u)" == 0 ]] || { echo "[chromium] /usr/bin/chromium missing: run 'apt-get install chromium' as root" >&2; exit 1; }
  echo "[chromium] /usr/bin/chromium missing: installing Debian's chromium package" >&2
  # Serialise with other runs of this script; apt itself waits for its own lock.
  mkdir -p /var/tmp
  exec 9>/var/tmp/gapwise-chromium-install.lock
  flock 9
  if [[ ! -x /usr/bin/chromium ]]; then
    export DEBIAN_FRONTEND=noninteractive
    apt-get -o DPkg::Lock::Timeout=600 update >&2
    apt-get -o DPkg::Lock::Timeout=600 install -y --no-install-recommends chromium fonts-liberation >&2
  fi
  exec 9>&-
fi

[[ -x /usr/bin/chromium ]] || { echo "[chromium] installation finished but /usr/bin/chromium is missing" >&2; exit 1; }
echo "[chromium] $(/usr/bin/chromium --version 2>/dev/null | grep -i chromium || echo 'chromium present')" >&2
echo /usr/bin/chromium
