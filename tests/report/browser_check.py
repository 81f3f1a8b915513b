"""Render a report's index.html in headless Chromium (Debian `chromium`, no network) and measure it there.

usage: browser_check.py INDEX_HTML [--screenshot OUT_PNG] [--expect-clipped FIGURE[,FIGURE...]]
       browser_check.py --self-test            (a deliberately broken page must be reported as failing)
exit 0 pass, 1 fail, 77 skipped (chromium not installed).

How it measures: the page is copied beside the original (so relative image paths resolve) with one <script>
added at the end of <body>. On the window's load event, with every image settled, the script records

  1. width: document.documentElement.scrollWidth <= window.innerWidth (nothing wider than the window; checked at
     two window widths, 1280 and 760 px, so the scroll boxes and the images' max-width are both exercised);
  2. images: every <img> has complete == true and naturalWidth > 0 (loaded and decoded);
  3. figure text: for every SVG figure (inline <svg>, and each SVG loaded by an <img>, whose text this script
     cannot reach, so the test puts an inline copy of that file in the test page), every <text> element's
     getBBox(), mapped through its transforms into the root <svg>'s user space (getScreenCTM), lies inside the
     root's viewBox, within 0.5 user units (anti-aliasing of glyph edges; a cut label is off by a glyph or more).

and writes them as JSON into a <pre id="skein-browser-check"> element. Chromium's --dump-dom prints the DOM
after the page's scripts ran (--virtual-time-budget lets the load event and the image decodes finish first), and
this script reads the JSON back from that dump. The original index.html is not changed.

--expect-clipped names figures (fnmatch patterns on the reported figure name, e.g. figure-decay_*) whose clipped
labels are a known, reported fault: those are printed as EXPECTED-FAIL and do not fail the run, every other
problem does, and so does an expected figure that no longer clips (the marker must then be removed).
"""
import fnmatch
import html as htmllib
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

CHROMIUM = shutil.which("chromium")
FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
         "--disable-component-update", "--disable-sync", "--disable-quic", "--hide-scrollbars"]
WIDTHS = (1280, 760)
TOLERANCE = 0.5

MEASURE_JS = r"""
<script id="skein-measure">
(function () {
  var TOL = %(tol)s;
  function box(svg) {
    var vb = svg.viewBox && svg.viewBox.baseVal;
    if (vb && (vb.width > 0 || vb.height > 0)) return {x: vb.x, y: vb.y, w: vb.width, h: vb.height};
    return {x: 0, y: 0, w: svg.width.baseVal.value, h: svg.height.baseVal.value};
  }
  function figureName(svg, k) {
    var f = svg.closest('figure');
    return svg.getAttribute('data-source') || (f && f.id) || ('svg ' + k);
  }
  function measureSvg(svg, k, out) {
    var b = box(svg);
    var toRoot = svg.getScreenCTM().inverse();
    var texts = svg.querySelectorAll('text');
    for (var i = 0; i < texts.length; ++i) {
      var t = texts[i], bb = t.getBBox();
      if (bb.width === 0 && bb.height === 0) continue;  // an empty label draws nothing
      var m = toRoot.multiply(t.getScreenCTM());
      var xs = [], ys = [];
      [[bb.x, bb.y], [bb.x + bb.width, bb.y], [bb.x, bb.y + bb.height], [bb.x + bb.width, bb.y + bb.height]]
        .forEach(function (c) {
          var p = new DOMPoint(c[0], c[1]).matrixTransform(m);
          xs.push(p.x); ys.push(p.y);
        });
      var x0 = Math.min.apply(null, xs), x1 = Math.max.apply(null, xs);
      var y0 = Math.min.apply(null, ys), y1 = Math.max.apply(null, ys);
      out.texts += 1;
      if (x0 < b.x - TOL || y0 < b.y - TOL || x1 > b.x + b.w + TOL || y1 > b.y + b.h + TOL)
        out.clipped.push({figure: figureName(svg, k), text: t.textContent.slice(0, 80),
                          bbox: [x0, y0, x1, y1].map(function (v) { return Math.round(v * 10) / 10; }),
                          viewBox: [b.x, b.y, b.x + b.w, b.y + b.h]});
    }
    out.figures += 1;
  }
  window.addEventListener('load', function () {
    var out = {window_width: window.innerWidth, scroll_width: document.documentElement.scrollWidth,
               widest: [], images: 0, broken_images: [], figures: 0, texts: 0, clipped: []};
    // The elements that reach past the window's right edge (for the message only).
    if (out.scroll_width > out.window_width) {
      var all = document.body.querySelectorAll('*');
      for (var i = 0; i < all.length && out.widest.length < 5; ++i) {
        var r = all[i].getBoundingClientRect();
        if (r.right > window.innerWidth + 1 && !all[i].parentElement.closest('[data-too-wide]')) {
          all[i].setAttribute('data-too-wide', '1');
          out.widest.push(all[i].tagName.toLowerCase() + (all[i].id ? '#' + all[i].id : '') +
                          ' right edge ' + Math.round(r.right) + ' px');
        }
      }
    }
    var imgs = document.images;
    for (var i = 0; i < imgs.length; ++i) {
      out.images += 1;
      if (!imgs[i].complete || imgs[i].naturalWidth === 0) out.broken_images.push(imgs[i].getAttribute('src'));
    }
    // Inline copies of the SVG files the page loads through <img>, measured apart from the page (after the
    // width was taken), in a box that does not add to the page.
    var copies = JSON.parse(document.getElementById('skein-svg-copies').textContent);
    var sandbox = document.createElement('div');
    sandbox.setAttribute('style', 'position:absolute;left:0;top:0;width:0;height:0;overflow:hidden');
    document.body.appendChild(sandbox);
    Object.keys(copies).forEach(function (src) {
      var doc = new DOMParser().parseFromString(copies[src], 'image/svg+xml');
      var svg = document.importNode(doc.documentElement, true);
      svg.setAttribute('data-source', src);
      sandbox.appendChild(svg);
    });
    var svgs = document.querySelectorAll('svg');
    for (var k = 0; k < svgs.length; ++k)
      if (!svgs[k].parentElement.closest('svg')) measureSvg(svgs[k], k, out);
    var pre = document.createElement('pre');
    pre.id = 'skein-browser-check';
    pre.textContent = JSON.stringify(out);
    document.body.appendChild(pre);
  });
})();
</script>
"""


def svg_copies(page_html, folder):
    """The SVG files the page shows through <img src="...svg">, as text keyed by src (missing ones left out:
    the image check reports them)."""
    copies = {}
    for src in re.findall(r"<img\b[^>]*\bsrc=\"([^\"]+\.svg)\"", page_html):
        path = os.path.join(folder, htmllib.unescape(src))
        if os.path.isfile(path):
            with open(path, encoding="utf-8") as f:
                copies[src] = f.read()
    return copies


def measure(index_html, width, screenshot=None):
    """Render a measuring copy of index_html at the given window width; return the script's JSON."""
    folder = os.path.dirname(os.path.abspath(index_html))
    with open(index_html, encoding="utf-8") as f:
        page = f.read()
    # JSON inside <script type="application/json">: "</" written as "<\/" so no SVG text can close the element.
    copies = json.dumps(svg_copies(page, folder)).replace("</", "<\\/")
    inject = ('<script type="application/json" id="skein-svg-copies">' + copies + "</script>\n" +
              MEASURE_JS % {"tol": TOLERANCE})
    if "</body>" not in page:
        raise SystemExit(f"{index_html}: no </body>")
    test_copy = tempfile.NamedTemporaryFile("w", suffix=".html", prefix=".browser-check-", dir=folder,
                                            delete=False, encoding="utf-8")
    profile = tempfile.mkdtemp()
    try:
        with test_copy:
            test_copy.write(page.replace("</body>", inject + "</body>", 1))
        url = "file://" + os.path.abspath(test_copy.name)
        cmd = [CHROMIUM, *FLAGS, f"--user-data-dir={profile}", f"--window-size={width},1000",
               "--virtual-time-budget=10000", "--dump-dom", url]
        r = subprocess.run(cmd, capture_output=True, text=True, timeout=180)
        m = re.search(r'<pre id="skein-browser-check">(.*?)</pre>', r.stdout, re.S)
        if not m:
            raise SystemExit(f"no measurements in the DOM dump of {index_html} (chromium exit {r.returncode}):\n"
                             + r.stderr[-2000:])
        if screenshot:
            # The original page (not the measuring copy), at the wider window, its first 1600 px.
            subprocess.run([CHROMIUM, *FLAGS, f"--user-data-dir={profile}", f"--window-size={width},1600",
                            f"--screenshot={os.path.abspath(screenshot)}",
                            "file://" + os.path.abspath(index_html)], capture_output=True, timeout=180)
        return json.loads(htmllib.unescape(m.group(1)))
    finally:
        os.unlink(test_copy.name)
        shutil.rmtree(profile, ignore_errors=True)


def problems(res):
    out = []
    if res["scroll_width"] > res["window_width"]:
        out.append(f"page {res['scroll_width']} px wide in a {res['window_width']} px window: "
                   + "; ".join(res["widest"]))
    for src in res["broken_images"]:
        out.append(f"image not loaded: {src}")
    for c in res["clipped"]:
        out.append(f"text outside its figure: {c['figure']}: {c['text']!r} spans {c['bbox']}, viewBox {c['viewBox']}")
    return out


def check(index_html, screenshot=None, quiet=False):
    found = []
    for k, width in enumerate(WIDTHS):
        res = measure(index_html, width, screenshot if k == 0 else None)
        p = problems(res)
        if not quiet:
            print(f"{os.path.basename(os.path.dirname(os.path.abspath(index_html)))} at {width} px: page "
                  f"{res['scroll_width']} px, {res['images']} images, {res['figures']} figures, {res['texts']} "
                  f"figure texts measured, {len(p)} problems")
        if res["figures"] and not res["texts"]:
            p.append("figures hold no measurable text (the measurement did not run)")
        found += [f"{width} px: {x}" for x in p]
    return found


BROKEN_PAGE = """<!DOCTYPE html><html><head><meta charset="utf-8"><style>body{max-width:600px;margin:auto}</style>
</head><body><h1>broken on purpose</h1>
<table><tr>%(cells)s</tr></table>
<img src="no-such-plot.png" alt="missing">
<img src="cut.svg" alt="a figure file with a cut legend">
<figure><svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 100" width="200" height="100">
<text x="150" y="50" font-size="14">a legend that runs past the edge</text>
<text x="10" y="20" font-size="12" transform="rotate(-90 10 20)">turned label</text>
<text x="20" y="60" font-size="12">fits</text></svg></figure>
</body></html>"""
CUT_SVG = """<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 120 60" width="120" height="60">
<text x="5" y="30" font-size="12">ok</text><text x="60" y="75" font-size="12">below the box</text></svg>"""


def self_test():
    """A page with a wide table outside any scroll box, a missing image, a label past its SVG's edge, a rotated
    label above the top, and an <img>-loaded SVG with a label below its box must fail on each; the same page
    with these mended must pass."""
    work = tempfile.mkdtemp()
    try:
        cells = "".join(f"<td>column{j:02d}wide</td>" for j in range(60))
        with open(os.path.join(work, "cut.svg"), "w") as f:
            f.write(CUT_SVG)
        with open(os.path.join(work, "index.html"), "w") as f:
            f.write(BROKEN_PAGE % {"cells": cells})
        found = check(os.path.join(work, "index.html"), quiet=True)
        expected = {
            "wide table": lambda p: "px wide in a" in p,
            "missing image": lambda p: "image not loaded: no-such-plot.png" in p,
            "label past the right edge": lambda p: "a legend that runs past the edge" in p,
            "rotated label past the top": lambda p: "turned label" in p,
            "label below an <img> SVG's box": lambda p: "cut.svg: 'below the box'" in p,
        }
        missed = [name for name, hit in expected.items() if not any(hit(p) for p in found if p.startswith("760 px"))]
        false_alarm = [p for p in found if "'fits'" in p or "'ok'" in p or "image not loaded: cut.svg" in p]
        # Mended: the table in a scroll box, the image removed, the labels moved inside.
        mended = (BROKEN_PAGE % {"cells": cells}).replace("<table>", '<div style="overflow-x:auto"><table>').replace(
            "</table>", "</table></div>").replace('<img src="no-such-plot.png" alt="missing">', "").replace(
            'x="150" y="50"', 'x="5" y="50" textLength="180"').replace(
            'x="10" y="20" font-size="12" transform="rotate(-90 10 20)"', 'x="15" y="95" font-size="12" transform="rotate(-90 15 95)"')
        with open(os.path.join(work, "index.html"), "w") as f:
            f.write(mended)
        with open(os.path.join(work, "cut.svg"), "w") as f:
            f.write(CUT_SVG.replace('x="60" y="75"', 'x="30" y="50"'))
        mended_found = check(os.path.join(work, "index.html"), quiet=True)
    finally:
        shutil.rmtree(work, ignore_errors=True)
    for name in expected:
        print(f"broken page: {name}: {'reported' if name not in missed else 'NOT reported'}")
    for p in false_alarm:
        print(f"broken page: false alarm: {p}")
    for p in mended_found:
        print(f"mended page: still reported: {p}")
    ok = not missed and not false_alarm and not mended_found
    print(f"browser self-test: {1 if ok else 0} passed, {0 if ok else 1} failed")
    return 0 if ok else 1


def split_expected(found, patterns):
    """Clipped-text problems in figures matching the patterns (fnmatch on the figure's name) are expected; the
    rest are failures. A pattern that matched nothing is an unexpected pass, itself a failure (the marker must go)."""
    expected, failures, used = [], [], set()
    for p in found:
        m = re.search(r"text outside its figure: ([^:]+):", p)
        hit = next((pat for pat in patterns if m and fnmatch.fnmatch(m.group(1), pat)), None)
        if hit:
            used.add(hit)
            expected.append(p)
        else:
            failures.append(p)
    for pat in patterns:
        if pat not in used:
            failures.append(f"unexpected pass: no clipped text in {pat} any more; remove it from the expected failures")
    return expected, failures


def main(argv):
    if not CHROMIUM:
        print("chromium not installed: skipped")
        return 77
    if argv[1:] == ["--self-test"]:
        return self_test()
    index_html, screenshot, expect_clipped = argv[1], None, []
    rest = argv[2:]
    while rest:
        if rest[0] == "--screenshot":
            screenshot, rest = rest[1], rest[2:]
        elif rest[0] == "--expect-clipped":
            expect_clipped, rest = [x for x in rest[1].split(",") if x], rest[2:]
        else:
            raise SystemExit(f"unknown argument {rest[0]}")
    expected, failures = split_expected(check(index_html, screenshot), expect_clipped)
    for p in expected:
        print("EXPECTED-FAIL " + p)
    for p in failures:
        print("FAIL " + p)
    print(f"browser checks of {index_html}: {0 if failures else 1} passed, {1 if failures else 0} failed"
          + (f" ({len(expected)} expected failures in {', '.join(expect_clipped)})" if expected else ""))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
