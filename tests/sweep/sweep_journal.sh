#!/usr/bin/env bash
# The sweep journal under damage, on designs/sweeps/kestrel-small.yaml (72 layouts). Each case starts from the
# journal of an uninterrupted run, damaged as described, and must resume to the same files, byte for byte:
#  1. a line with a valid checksum but the wrong index (layout 3's row filed as layout 5, layout 5's own line
#     removed): dropped and layout 5 recomputed; before, results.csv lost layout 5 and held layout 3 twice;
#  2. CRLF line endings: read (before: refused as "another sweep"); the journal is written back with LF;
#  3. a damaged first line: refused (exit 2) with what was found and --salvage offered; --salvage keeps the
#     valid rows and recomputes the rest;
#  4. every resume repairs the journal in place: the same file (inode) before and after, no second copy;
#  5. a resume on a nearly full disk keeps the rows it computes (below).
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
sweep="$SOURCE_DIR/designs/sweeps/kestrel-small.yaml"
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
files="results.csv results.jsonl best_front.csv trade_front.csv fronts.svg"

"$SKEIN" sweep "$sweep" --out "$tmp/full" >/dev/null 2>"$tmp/full.err" || { cat "$tmp/full.err"; fail "uninterrupted run"; }
[ "$(wc -l <"$tmp/full/journal.txt")" -eq 73 ] || fail "expected a header and 72 journal lines"

# Start a case: a copy of the full run's folder without its result files, the journal given by python.
prepare() {  # NAME PYTHON-EXPRESSION-OVER-lines
  rm -rf "${tmp:?}/$1"; mkdir "$tmp/$1"
  cp "$tmp/full/.skein-output" "$tmp/$1/" 2>/dev/null || true
  "$py" - "$tmp/full/journal.txt" "$tmp/$1/journal.txt" "$2" <<'PY'
import sys, zlib
src, dst, how = sys.argv[1:4]
lines = open(src, "rb").read().split(b"\n")[:-1]
header, rows = lines[0], lines[1:]
by_index = {int(l.split(b" ", 1)[0]): l for l in rows}
def line(index, row):  # a journal line with a valid checksum: CRC-32 (zlib) of "INDEX ROW"
    body = b"%d %s" % (index, row)
    return b"%d %08x %s" % (index, zlib.crc32(body), row)
def row_of(index):
    return by_index[index].split(b" ", 2)[2]
out = eval(how)
open(dst, "wb").write(out)
PY
}
same_as_full() {  # NAME
  for f in $files; do cmp -s "$tmp/full/$f" "$tmp/$1/$f" || fail "$1: $f differs from the uninterrupted run"; done
}
resume() {  # NAME [OPTION]
  local ino_before ino_after
  ino_before=$(stat -c %i "$tmp/$1/journal.txt")
  "$SKEIN" sweep "$sweep" --out "$tmp/$1" "${2:---resume}" >/dev/null 2>"$tmp/$1.err" || { cat "$tmp/$1.err"; fail "$1: resume"; }
  ino_after=$(stat -c %i "$tmp/$1/journal.txt")
  [ "$ino_before" = "$ino_after" ] || fail "$1: the journal was replaced by a copy (inode $ino_before -> $ino_after)"
  [ "$(wc -l <"$tmp/$1/journal.txt")" -eq 73 ] || fail "$1: the journal does not hold each layout once"
  ! grep -q $'\r' "$tmp/$1/journal.txt" || fail "$1: CR left in the journal"
}

# 1. Wrong index with a valid checksum.
prepare wrong_index 'b"\n".join([header] + [by_index[i] for i in range(72) if i != 5] + [line(5, row_of(3))]) + b"\n"'
resume wrong_index
grep -q "(71 resumed from the journal, 1 damaged or repeated journal lines dropped)" "$tmp/wrong_index.err" ||
  { cat "$tmp/wrong_index.err"; fail "wrong_index: the line was not dropped"; }
same_as_full wrong_index

# 2. CRLF endings, 10 rows missing (recomputed).
prepare crlf 'b"\r\n".join([header] + [by_index[i] for i in range(62)]) + b"\r\n"'
resume crlf
grep -q "(62 resumed from the journal)" "$tmp/crlf.err" || { cat "$tmp/crlf.err"; fail "crlf: rows not kept"; }
same_as_full crlf

# 3. A damaged first line (a byte flipped in the word), 5 rows missing.
prepare header 'b"\n".join([header.replace(b"sweep", b"swe\x00p")] + [by_index[i] for i in range(67)]) + b"\n"'
if "$SKEIN" sweep "$sweep" --out "$tmp/header" --resume >/dev/null 2>"$tmp/header_refused.err"; then
  fail "header: a damaged header was accepted silently"
else
  [ $? -eq 2 ] || fail "header: expected exit 2"
fi
grep -q "journal.txt:1: the journal's first line is damaged: found \"skein-swe\\\\x00p-journal 1 " "$tmp/header_refused.err" ||
  { cat "$tmp/header_refused.err"; fail "header: the message does not say what was found"; }
grep -q "67 of its lines are valid rows of this sweep" "$tmp/header_refused.err" &&
  grep -q -- "--salvage" "$tmp/header_refused.err" ||
  { cat "$tmp/header_refused.err"; fail "header: the message does not offer --salvage with the valid row count"; }
resume header --salvage
grep -q "(67 resumed from the journal)" "$tmp/header.err" || { cat "$tmp/header.err"; fail "header: rows not kept"; }
head -1 "$tmp/header/journal.txt" | cmp -s - <(head -1 "$tmp/full/journal.txt") || fail "header: header not repaired"
same_as_full header

# 4. A cut-short tail, resumed in place (checked by resume's inode test), and a finished journal resumed again.
prepare tail 'b"\n".join([header] + [by_index[i] for i in range(70)]) + b"\n" + by_index[70][:25]'
resume tail
grep -q "(70 resumed from the journal, 1 damaged or repeated journal lines dropped)" "$tmp/tail.err" || { cat "$tmp/tail.err"; fail "tail"; }
same_as_full tail
resume tail
same_as_full tail
# 5. A nearly full disk (a 256 KiB tmpfs in a private mount namespace, room for the result files once the filler
#    is gone: they are about 116 KiB, in 4 KiB pages, with the labelled front figure; skipped, and said, where that is not
#    allowed): 60 rows and a cut line, about 21 KiB, with 12 KiB left free. The repair needs no room (in place),
#    the 12 missing rows are computed and appended; writing the result files then fails for want of room, but
#    the journal holds all 72 rows: after room is made, a resume computes nothing and writes identical files.
#    (A copy of the journal, as before, needed its 21 KiB at once and stopped the resume before any work, the journal left at 60 rows: tried.)
full_disk=skipped
if [ "$(id -u)" = 0 ] && unshare -m true 2>/dev/null; then
  mkdir "$tmp/disk"
  unshare -m bash -s "$SKEIN" "$sweep" "$tmp" <<'SH' >"$tmp/disk.log" 2>&1 || { cat "$tmp/disk.log"; fail "nearly full disk"; }
set -u
skein=$1 sweep=$2 tmp=$3
mount -t tmpfs -o size=256k tmpfs "$tmp/disk" || { echo "no tmpfs: skipped"; exit 0; }
mkdir "$tmp/disk/out"
cp "$tmp/full/.skein-output" "$tmp/disk/out/"
{ head -61 "$tmp/full/journal.txt"; sed -n 62p "$tmp/full/journal.txt" | head -c 40; } >"$tmp/disk/out/journal.txt"
avail=$(df --output=avail -B1 "$tmp/disk" | tail -1)
head -c $((avail - 12288)) /dev/zero >"$tmp/disk/filler"
echo "journal $(wc -c <"$tmp/disk/out/journal.txt") bytes, free $(df --output=avail -B1 "$tmp/disk" | tail -1) bytes"
if "$skein" sweep "$sweep" --out "$tmp/disk/out" --resume --threads 2 >/dev/null 2>"$tmp/disk.err"; then
  echo "the results fitted in 12 KiB: the test needs a fuller disk"; exit 1
fi
grep -q "No space left on device" "$tmp/disk.err" || { cat "$tmp/disk.err"; echo "not stopped by the full disk"; exit 1; }
[ "$(wc -l <"$tmp/disk/out/journal.txt")" -eq 73 ] || { echo "the journal lost the rows computed on the full disk"; exit 1; }
rm "$tmp/disk/filler"
"$skein" sweep "$sweep" --out "$tmp/disk/out" --resume >/dev/null 2>"$tmp/disk2.err" || { cat "$tmp/disk2.err"; exit 1; }
grep -q "(72 resumed from the journal)" "$tmp/disk2.err" || { cat "$tmp/disk2.err"; echo "rows recomputed"; exit 1; }
for f in results.csv results.jsonl best_front.csv trade_front.csv fronts.svg; do
  cmp -s "$tmp/full/$f" "$tmp/disk/out/$f" || { echo "$f differs"; exit 1; }
done
cat "$tmp/disk.err" | head -3 >&2
echo "checked"
SH
  grep -q "^checked" "$tmp/disk.log" && full_disk="checked ($(head -1 "$tmp/disk.log"))"
fi
echo "sweep journal: wrong index, CRLF, damaged header (--salvage) and cut tail resume to identical files, in place;" \
  "nearly full disk: $full_disk"
