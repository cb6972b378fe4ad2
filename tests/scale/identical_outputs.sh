#!/usr/bin/env bash
# The outputs of a 10^4-pipe run must stay byte-identical while the model and the writers are made
# leaner (issue 22): the same generated network (scripts/make_network.py --seed 1, invented data)
# is checked and each output's digest (tests/scale/output_digest.py: dates, version and input
# hashes taken out) compared with tests/scale/outputs-10k.sha256, recorded from the run before the
# compaction. A change meant to alter the outputs records new digests with --record, in its own
# commit that says why.  Usage: identical_outputs.sh RIMLINE [--record]
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
rimline="$1"
expected="$here/tests/scale/outputs-10k.sha256"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cd "$work"
/usr/bin/python3 "$here/scripts/make_network.py" --pipes 10000 --seed 1 --out net >/dev/null
status=0
"$rimline" check net/project.toml --out out -q || status=$?
[[ $status -le 1 ]] || { echo "rimline check exited with $status" >&2; exit 1; }
/usr/bin/python3 "$here/tests/scale/output_digest.py" out > digests.txt
if [[ "${2:-}" == "--record" ]]; then
  cp digests.txt "$expected"
  echo "recorded $(wc -l < digests.txt) digests in $expected"
  exit 0
fi
if ! diff -u "$expected" digests.txt; then
  echo "the outputs of the 10^4-pipe run differ from the recorded ones (lines above: - recorded, + now)" >&2
  exit 1
fi
echo "identical outputs: $(wc -l < digests.txt) files"
