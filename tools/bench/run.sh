#!/usr/bin/env bash
# hangline's side-by-side benchmark, one command (see README-section.md):
#
#   tools/bench/run.sh            # 10 MB and 100 MB drawings, ASCII and binary
#   tools/bench/run.sh --quick    # 10 MB only, for development
#   tools/bench/run.sh --help     # the other options
#
# Needs cargo, /usr/bin/time and Python 3; installs the pinned ezdxf into
# .venv when it is missing (as scripts/test-all does). Drawings go to
# $TMPDIR/hangline-bench (or --dir), outside the repository.
set -euo pipefail
cd "$(dirname "$0")/../.."

venv=.venv
if ! "$venv/bin/python" -c "import ezdxf" 2>/dev/null; then
    echo "== installing ezdxf (tools/requirements.txt) into $venv" >&2
    python3 -m venv "$venv"
    "$venv/bin/python" -m pip install --quiet --disable-pip-version-check -r tools/requirements.txt
fi
exec "$venv/bin/python" tools/bench/run.py "$@"
