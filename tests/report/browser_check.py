"""Render a report's index.html in headless Chromium (Debian `chromium`, no network) and check that the
screenshot is not blank: at least 2 % of its pixels differ from the page background.

usage: browser_check.py INDEX_HTML OUT_PNG   (exit 77 = skipped when chromium is not installed)
The PNG is decoded here with zlib (PNG spec, W3C REC 2003: IHDR, IDAT, filter types 0-4)."""
import os
import shutil
import struct
import subprocess
import sys
import tempfile
import zlib

html, png = os.path.abspath(sys.argv[1]), sys.argv[2]
chromium = shutil.which("chromium")
if not chromium:
    print("chromium not installed: skipped")
    sys.exit(77)
profile = tempfile.mkdtemp()
cmd = [chromium, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
       "--disable-component-update", "--disable-sync", "--disable-quic", f"--user-data-dir={profile}",
       "--window-size=1200,3000", f"--screenshot={os.path.abspath(png)}", "file://" + html]
subprocess.run(cmd, capture_output=True, timeout=120)
shutil.rmtree(profile, ignore_errors=True)
data = open(png, "rb").read()
assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
pos, idat, width = 8, b"", 0
while pos < len(data):
    length, kind = struct.unpack(">I4s", data[pos:pos + 8])
    body = data[pos + 8:pos + 8 + length]
    if kind == b"IHDR":
        width, height, depth, colour = struct.unpack(">IIBB", body[:10])
        channels = {2: 3, 6: 4}[colour]
    elif kind == b"IDAT":
        idat += body
    pos += 12 + length
raw = zlib.decompress(idat)
stride = width * channels
prev = bytearray(stride)
differ = total = 0
background = None
for y in range(height):
    f = raw[y * (stride + 1)]
    line = bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
    for i in range(stride):
        a = line[i - channels] if i >= channels else 0
        b = prev[i]
        c = prev[i - channels] if i >= channels else 0
        if f == 1: line[i] = (line[i] + a) & 255
        elif f == 2: line[i] = (line[i] + b) & 255
        elif f == 3: line[i] = (line[i] + (a + b) // 2) & 255
        elif f == 4:
            p = a + b - c
            pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
            line[i] = (line[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
    prev = line
    if y % 4:
        continue
    for x in range(0, width, 4):
        px = bytes(line[x * channels:x * channels + 3])
        background = background or px
        total += 1
        differ += px != background
share = differ / total
print(f"screenshot {width}x{height}: {100 * share:.1f} % of sampled pixels differ from the background")
print(f"browser render: {1 if share >= 0.02 else 0} passed, {0 if share >= 0.02 else 1} failed")
sys.exit(0 if share >= 0.02 else 1)
