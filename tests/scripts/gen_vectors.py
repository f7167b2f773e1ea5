"""Regenerates every reference-vector table under tests/vectors/.

Each area has a module tests/scripts/vectors_<area>.py with a function main();
this driver runs them all. `--check` writes into a temporary folder instead and
compares with the committed tables (same files, same headers, values within a
relative 1e-12, to allow for last-digit differences between machines); CI runs
it that way, so the committed vectors are known to come from the pinned
libraries in requirements.txt.
"""
import glob
import importlib
import os
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
COMMITTED = os.path.normpath(os.path.join(HERE, "..", "vectors"))


def run_all():
    sys.path.insert(0, HERE)
    for path in sorted(glob.glob(os.path.join(HERE, "vectors_*.py"))):
        mod = importlib.import_module(os.path.splitext(os.path.basename(path))[0])
        mod.main()
        print("ran", os.path.basename(path))


def table(path):
    with open(path) as f:
        lines = [l for l in f.read().splitlines() if l.strip() and not l.startswith("#")]
    return lines[0].split(), [[float(v) for v in l.split()] for l in lines[1:]]


def same(a, b, rtol=1e-12, atol=1e-300):
    if a == b or (a != a and b != b):
        return True
    return abs(a - b) <= max(rtol * max(abs(a), abs(b)), atol)


def check(out):
    bad = 0
    new = sorted(os.listdir(out))
    old = sorted(f for f in os.listdir(COMMITTED) if f.endswith(".txt"))
    if new != old:
        print("file sets differ:", sorted(set(new) ^ set(old)))
        bad += 1
    for name in sorted(set(new) & set(old)):
        h1, r1 = table(os.path.join(out, name))
        h2, r2 = table(os.path.join(COMMITTED, name))
        if h1 != h2 or len(r1) != len(r2):
            print(f"{name}: header or row count differs")
            bad += 1
            continue
        for i, (x, y) in enumerate(zip(r1, r2)):
            if len(x) != len(y) or not all(same(a, b) for a, b in zip(x, y)):
                print(f"{name}: row {i + 1} differs")
                bad += 1
                break
    return bad


if __name__ == "__main__":
    if "--check" in sys.argv:
        with tempfile.TemporaryDirectory() as tmp:
            os.environ["ECHOLINE_VECTORS_OUT"] = tmp
            run_all()
            n = check(tmp)
        if n:
            print(f"{n} vector table(s) differ from a fresh regeneration")
            sys.exit(1)
        print("vectors match a fresh regeneration")
    else:
        run_all()
