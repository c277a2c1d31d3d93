import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))

# --doctest-modules imports every module under tests/; the benchmarks and the golden-file writer are
# scripts, not test modules, so they are not collected
collect_ignore = ["make_golden.py"]
collect_ignore_glob = ["bench_*.py"]
