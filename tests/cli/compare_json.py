"""Compare two JSON documents: same structure and keys, strings equal, numbers equal to 1e-9 relative
(or 1e-12 absolute near zero). The tolerance absorbs last-digit differences between compilers and
sanitizer builds; any modelling change moves results by far more."""
import json
import math
import sys


def diff(a, b, path, out):
    if isinstance(a, dict) and isinstance(b, dict):
        if list(a.keys()) != list(b.keys()):
            out.append(f"{path}: keys {list(a.keys())} != {list(b.keys())}")
            return
        for k in a:
            diff(a[k], b[k], f"{path}.{k}", out)
    elif isinstance(a, list) and isinstance(b, list):
        if len(a) != len(b):
            out.append(f"{path}: length {len(a)} != {len(b)}")
            return
        for i, (x, y) in enumerate(zip(a, b)):
            diff(x, y, f"{path}[{i}]", out)
    elif isinstance(a, bool) or isinstance(b, bool) or isinstance(a, str) or a is None or b is None:
        if a != b:
            out.append(f"{path}: {a!r} != {b!r}")
    elif isinstance(a, (int, float)) and isinstance(b, (int, float)):
        if not math.isclose(a, b, rel_tol=1e-9, abs_tol=1e-12):
            out.append(f"{path}: {a!r} != {b!r}")
    else:
        out.append(f"{path}: {a!r} != {b!r}")


def main():
    with open(sys.argv[1]) as f:
        expected = json.load(f)
    with open(sys.argv[2]) as f:
        actual = json.load(f)
    problems = []
    diff(expected, actual, "$", problems)
    for p in problems[:20]:
        print("  " + p)
    if len(problems) > 20:
        print(f"  ... and {len(problems) - 20} more")
    sys.exit(1 if problems else 0)


if __name__ == "__main__":
    main()
