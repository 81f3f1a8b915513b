#!/usr/bin/env python3
"""The layer rule of lib/skein, checked over #include lines: a file may include files of its own folder and of
folders on lower layers only (DEVELOPERS.md, "Layers"). Also: yaml-cpp is included by one header only, the input
edge's reader (input/yaml_reader.hpp), and that header is included by .cpp files only, so no other library
header brings yaml-cpp in.
Usage: python3 scripts/check_layers.py [REPO_ROOT]; prints each violation and exits 1 when there is one."""
import pathlib
import re
import sys

# Lowest first. Folders on one layer may not include each other. A folder of lib/skein not listed here is an
# error, so a new folder must be placed.
LAYERS = [
    ["."],                                   # constants.hpp, error.hpp, angles.hpp
    ["time"],
    ["orbit"],
    ["atmosphere"],
    ["lifetime"],
    ["design"],                              # the domain types of a design and its blocks; constellation expansion
    ["coverage", "budget", "drift", "export", "io"],
    ["report"],
    ["sweep"],                               # trade sweeps (layouts, evaluation, journal, ranks, outputs)
    ["search"],                              # layout search over a sweep's space (cost order, bounds, record)
    ["input"],                               # the readers of design and sweep files and their blocks (YAML at the edge)
]
RANK = {folder: i for i, layer in enumerate(LAYERS) for folder in layer}
INCLUDE = re.compile(r'^\s*#\s*include\s+[<"]([^>"]+)[>"]')


def folder_of(rel: pathlib.PurePosixPath) -> str:
    parts = rel.parts[:-1]
    return parts[0] if parts else "."


def main() -> int:
    root = pathlib.Path(sys.argv[1] if len(sys.argv) > 1 else ".").resolve()
    lib = root / "lib" / "skein"
    problems = []
    for path in sorted(lib.rglob("*.[ch]pp")):
        rel = pathlib.PurePosixPath(path.relative_to(lib).as_posix())
        here = folder_of(rel)
        if here not in RANK:
            problems.append(f"lib/skein/{rel}: folder '{here}' has no layer in scripts/check_layers.py")
            continue
        for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
            m = INCLUDE.match(line)
            if not m:
                continue
            target = m.group(1)
            if target.startswith("yaml-cpp/") and rel.suffix == ".hpp" and str(rel) != "input/yaml_reader.hpp":
                problems.append(f"lib/skein/{rel}:{number}: a header includes yaml-cpp; only input/yaml_reader.hpp may")
            if target == "skein/input/yaml_reader.hpp" and rel.suffix == ".hpp":
                problems.append(f"lib/skein/{rel}:{number}: a header includes input/yaml_reader.hpp; include it from .cpp files")
            if not target.startswith("skein/"):
                continue
            there = folder_of(pathlib.PurePosixPath(target[len("skein/"):]))
            if there == here:
                continue
            if there not in RANK:
                problems.append(f"lib/skein/{rel}:{number}: includes {target} from an unplaced folder '{there}'")
            elif RANK[there] >= RANK[here]:
                problems.append(f"lib/skein/{rel}:{number}: includes {target}: '{here}' (layer {RANK[here]}) may only "
                                f"read lower layers, and '{there}' is on layer {RANK[there]}")
    for p in problems:
        print(p)
    print(f"layers: {len(problems)} violation(s) in {sum(1 for _ in lib.rglob('*.[ch]pp'))} files")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
