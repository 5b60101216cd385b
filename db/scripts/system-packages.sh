#!/usr/bin/env bash
# Installs the Debian packages the tests need when they are missing: chromium (e2e), poppler-utils
# (PDF checks). Never downloads a browser of Playwright's own.
set -euo pipefail
as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }
missing=()
[ -x /usr/bin/chromium ] || missing+=(chromium)
command -v pdftotext >/dev/null 2>&1 || missing+=(poppler-utils)
if [ ${#missing[@]} -gt 0 ]; then
  echo "setup: installing ${missing[*]} (apt-get)…"
  as_root apt-get update -qq
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi
