#!/usr/bin/env bash
# Regenerate every reference fixture in test/fixtures/ from the python scripts here.
set -euo pipefail
cd "$(dirname "$0")"
for script in *.py; do
  echo "== $script"
  python3 "$script"
done
