#!/usr/bin/env bash
# Browser tests drive Debian's chromium; install it when missing and we are root.
set -euo pipefail
if [ -x /usr/bin/chromium ]; then exit 0; fi
if [ "$(id -u)" = "0" ]; then
  echo "Installing Debian's chromium for the browser tests..."
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq chromium >/dev/null
else
  echo "Browser tests need Debian's chromium at /usr/bin/chromium." >&2
  echo "Install it with: sudo apt-get install -y chromium   (then run npm test again)" >&2
  exit 1
fi
