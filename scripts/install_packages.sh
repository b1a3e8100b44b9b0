#!/usr/bin/env bash
# Installs the Debian 12 packages named as arguments that are missing (sudo when not root); does
# nothing when all are there. Used by scripts/setup.sh and by the checking builds (scripts/sanitize.sh,
# scripts/fuzz.sh) for what they need beyond setup.sh's list.
set -euo pipefail

missing=()
for package in "$@"; do
  dpkg-query -W -f='${Status}' "$package" 2>/dev/null | grep -q "install ok installed" || missing+=("$package")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "ringroad setup: installing ${missing[*]}" >&2
  sudo_if_needed=()
  [ "$(id -u)" -eq 0 ] || sudo_if_needed=(sudo)
  "${sudo_if_needed[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo_if_needed[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >&2
fi
