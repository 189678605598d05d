#!/usr/bin/env bash
# The cost of calling starpoise.zams from Python over the library call it wraps, in
# instructions counted by callgrind (repeatable whatever else the machine is doing) and in
# wall time (python/bench/zams_timing.py against the criterion bench `zams/refined_1msun`).
#
# Instructions per call = (count of a run with N + 1 calls - count of a run with 1 call) / N,
# which removes start-up, imports and the first call's one-off work, for both the Python
# module (`starpoise.zams(MASS)`) and the Rust example zams_repeat (the same library work).
# Arguments: mass (M_sun, default 1.0), N (default 4), preset (default refined).
# Needs valgrind; run after scripts/test (which builds the module into .venv).
set -euo pipefail
cd "$(dirname "$0")/../.."
mass=${1:-1.0}
n=${2:-4}
preset=${3:-refined}
python=${STARPOISE_VENV:-.venv}/bin/python
cargo build --release --quiet --example zams_repeat

# Python's hash seed changes how much work its start-up and imports do; numpy's OpenBLAS
# threads spin while they wait. Both are fixed so that two runs differ only in their calls.
export PYTHONHASHSEED=0 OPENBLAS_NUM_THREADS=1

count() {
    valgrind --tool=callgrind --callgrind-out-file=/dev/null "$@" 2>&1 >/dev/null |
        sed -n 's/.*Collected : \([0-9]*\).*/\1/p'
}
py() { count "$python" -c "import starpoise
for _ in range($1): starpoise.zams($mass, physics='$preset')"; }
rs() { count target/release/examples/zams_repeat "$mass" "$1" "$preset"; }

py1=$(py 1); pyn=$(py $((n + 1)))
rs1=$(rs 1); rsn=$(rs $((n + 1)))
python3 - "$py1" "$pyn" "$rs1" "$rsn" "$n" <<'PY'
import sys
py1, pyn, rs1, rsn, n = map(int, sys.argv[1:])
per_py, per_rs = (pyn - py1) / n, (rsn - rs1) / n
print(f"instructions per call: Python {per_py:.6e}, Rust library {per_rs:.6e}, "
      f"overhead {per_py / per_rs - 1:+.3%}")
PY
