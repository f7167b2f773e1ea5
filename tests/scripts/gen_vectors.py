"""Regenerates every reference-vector table under tests/vectors/.

Each area has a module tests/scripts/vectors_<area>.py with a function main();
this driver runs them all. CI runs it and fails if the committed files differ
(`git diff --exit-code tests/vectors`), so the vectors are known to come from the
pinned libraries in requirements.txt.
"""
import glob
import importlib
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

for path in sorted(glob.glob(os.path.join(HERE, "vectors_*.py"))):
    mod = importlib.import_module(os.path.splitext(os.path.basename(path))[0])
    mod.main()
    print("wrote", os.path.basename(path))
