#!/usr/bin/env bash
# Regenerate every reference fixture in test/fixtures/ from the python scripts here.
set -euo pipefail
cd "$(dirname "$0")"
for script in *.py; do
  [[ $script == _* ]] && continue # helper modules, not fixture scripts
  echo "== $script"
  python3 "$script"
done
