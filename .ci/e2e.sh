#!/usr/bin/env bash
# Editor tests in CI: installs what they need (Debian packages and code-server 4.100.3 into
# .cache/code-server, skipped when already complete), then runs `npm run test:e2e`, which prints
# `e2e: N passed, N failed` and exits non-zero when any test failed. Called by .ci/run after the unit
# tests, with the project's npm dependencies already installed.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/e2e/install.sh
npm run test:e2e
