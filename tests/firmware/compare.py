"""Compares the firmware's semihosting report with the host's (same source).

Tolerance: relative 1e-5 (f32) or 1e-12 (f64), absolute 1e-30 — the target uses
the libm crate for transcendental functions while the host build may use the
platform's; both are within a few ulp.
"""
import struct
import sys

host_path, target_path, prec, stack_budget, cpu = sys.argv[1:6]
rtol = 1e-5 if prec == "f32" else 1e-12


def read(path):
    vals, fails = {}, []
    for line in open(path):
        parts = line.split()
        if not parts:
            continue
        if parts[0] == "FAIL":
            fails.append(line.strip())
            continue
        vals[parts[0]] = int(parts[1], 16)
    return vals, fails


def as_float(bits):
    if prec == "f32":
        return struct.unpack("<f", struct.pack("<I", bits))[0]
    return struct.unpack("<d", struct.pack("<Q", bits))[0]


host, hf = read(host_path)
tgt, tf = read(target_path)
bad = hf + tf
stacks = {k: tgt.pop(k) for k in list(tgt) if k.startswith("stack.")}
if "stack.trace" not in stacks:
    bad.append("no stack.trace line")
elif prec == "f32" and stacks["stack.trace"] > int(stack_budget):
    bad.append(f"trace analysis stack {stacks['stack.trace']} B over budget {stack_budget} B")
stack = ", ".join(f"{k[6:]} {v} B" for k, v in sorted(stacks.items()))
if set(host) != set(tgt):
    bad.append(f"keys differ: {sorted(set(host) ^ set(tgt))}")
worst = 0.0
for k in sorted(set(host) & set(tgt)):
    if k.endswith(".count") or k.endswith(".kind"):
        if host[k] != tgt[k]:
            bad.append(f"{k}: host {host[k]} target {tgt[k]}")
        continue
    a, b = as_float(host[k]), as_float(tgt[k])
    err = abs(a - b)
    if err > max(rtol * abs(a), 1e-30):
        bad.append(f"{k}: host {a!r} target {b!r}")
    elif a:
        worst = max(worst, err / abs(a))
if bad:
    print(f"FAIL {cpu} {prec}:", *bad, sep="\n  ")
    sys.exit(1)
print(f"   {cpu} {prec}: {len(tgt)} results equal the host's (worst rel. diff {worst:.1e}, tol {rtol:g}); peak stack (upper bounds) {stack}" + (f"; budget {stack_budget} B for the f32 trace analysis" if prec == "f32" else " (reported only)"))
