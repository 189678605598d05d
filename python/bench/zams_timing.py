"""Wall time of starpoise.zams(1.0) from Python: the median and the minimum of 15 batches of
5 calls, per call. Compare with `cargo bench --bench zams -- refined_1msun` (criterion's
median of the same library call); python/bench/overhead.sh counts instructions instead,
which the shared machine's load does not disturb."""

import statistics
import sys
import timeit

import starpoise

mass = float(sys.argv[1]) if len(sys.argv) > 1 else 1.0
starpoise.zams(mass)  # the first call pays for one-off set-up
times = [t / 5 for t in timeit.repeat(lambda: starpoise.zams(mass), number=5, repeat=15)]
print(f"starpoise.zams({mass}): median {statistics.median(times) * 1e3:.2f} ms, "
      f"min {min(times) * 1e3:.2f} ms per call")
