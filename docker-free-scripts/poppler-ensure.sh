#!/usr/bin/env bash
# Ensures Debian's poppler-utils (pdftotext, pdffonts, pdftoppm) for the report tests.
# Installs from Debian's packages only when a tool is missing; serialised with flock so
# parallel test runs do not race on apt.
set -euo pipefail
if command -v pdftotext >/dev/null && command -v pdffonts >/dev/null && command -v pdftoppm >/dev/null; then
  exit 0
fi
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
mkdir -p "$root/.data"
exec 9>"$root/.data/.poppler-install.lock"
flock 9
if ! command -v pdftotext >/dev/null || ! command -v pdffonts >/dev/null || ! command -v pdftoppm >/dev/null; then
  export DEBIAN_FRONTEND=noninteractive
  apt-get install -y --no-install-recommends poppler-utils >/dev/null 2>&1 \
    || { apt-get update >/dev/null && apt-get install -y --no-install-recommends poppler-utils >/dev/null; }
fi
command -v pdftotext >/dev/null
