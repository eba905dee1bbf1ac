#!/usr/bin/python3
"""Every --html report rendered by a real browser (Debian's chromium, headless).

For each report: bine runs once with --json and --html FILE (the same run gives both), then
  - the page parses as XML (xml.etree: every element closed, attributes quoted) and as HTML;
  - it holds no script and asks for nothing outside the file (no src=, no http: or https:);
  - it is under 300 kB;
  - chromium renders it: full-page screenshots at 360 px and 800 px wide (the whole page, however
    tall; kept under the build folder for review and for tools/docs-screenshots) and the DOM after
    rendering (--dump-dom);
  - a page built from the demo catalog shows the demo-data marker; a bittering swap from stock
    charts each lot's alpha on the brew day (tied to alpha_today_percent), not the catalog midpoint;
  - the rendered DOM has the report's tables, a caution box, and every number in a table cell
    or chart label that names its JSON value (data-json) matches that value of the same run
    within the rounding written on the page; every figure cell (class "num") with a digit names
    its value, so no number goes unchecked;
  - at 360 px and 800 px wide, and printed (print media at the width of an A4 and a Letter page
    less 14 mm margins), the document is no wider than the viewport (cdp_layout.py: the browser's
    own layout metrics; pages have no script, and none is injected).
A missing chromium is a failure: CI installs it with tools/setup --for-tests.
Usage: check_reports.py BINE SOURCE_DIR OUT_DIR
"""
import html.parser
import json
import os
import re
import shutil
import subprocess
import sys
import xml.etree.ElementTree as ET

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import cdp_layout  # noqa: E402

MAX_BYTES = 300 * 1024
# Printable width in CSS px (96 px per inch) with 14 mm margins: A4 210 mm, Letter 8.5 in = 215.9 mm.
PRINT_WIDTHS = {"A4": round((210 - 28) / 25.4 * 96), "Letter": round((215.9 - 28) / 25.4 * 96)}


def reports():
    # Paths relative to the source folder, where bine runs: the pages (and the screenshots kept
    # in docs/) name the example files as a reader of the repository sees them.
    ex = os.path.join("descriptor-data", "examples")
    pale, stock = os.path.join(ex, "pale-ale.json"), os.path.join(ex, "stock.json")
    hazy = os.path.join(ex, "hazy-ipa.json")
    fixtures = os.path.join("tests", "fixtures")
    return {
        "ibu": ["ibu", pale],
        "ibu-hazy": ["ibu", hazy],
        "rebalance": ["rebalance", pale, "--stock", stock, "--on", "2026-12-01"],
        # an addition split across two lots (one aged): each part and the parts together with intervals
        "rebalance-split": ["--catalog", os.path.join(fixtures, "h3-catalog.json"), "rebalance",
                            os.path.join(fixtures, "lots-40g.json"), "--stock",
                            os.path.join(fixtures, "lots-aged-stock.json"), "--on", "2026-12-01"],
        "swap": ["swap", "Tidewell", "--stock", stock, "--on", "2026-12-01", "--pairs"],
        "swap-bittering": ["swap", "Keelstone", "--for", "bittering", "--top", "3"],
        "swap-bittering-stock": ["swap", "Keelstone", "--for", "bittering", "--stock", stock, "--on", "2026-12-01",
                                 "--top", "3"],
        "blend": ["blend", "--target", "floral=4,citrus=4", "--recipe", pale, "--stock", stock],
        "age": ["age", "--alpha", "11.2", "--packaged", "2025-10-01", "--stored", "-1 C,vacuum", "--variety",
                "Keelstone", "--on", "2026-06-01"],
        "stock-list": ["stock", "list", stock, "--on", "2026-12-01"],
    }


class DomCollector(html.parser.HTMLParser):
    """Elements of the rendered DOM: tags seen, and each element naming a JSON value with its text."""
    VOID = {"meta", "link", "br", "hr", "img", "input", "col", "area", "base", "source", "wbr", "rect", "line",
            "circle", "path", "stop"}

    def __init__(self):
        super().__init__()
        self.tags, self.classes, self.figures, self.unnamed, self.chart_figures = {}, set(), [], [], []
        self._open = []  # [tag, attrs, text]

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        self.tags[tag] = self.tags.get(tag, 0) + 1
        self.classes.update((attrs.get("class") or "").split())
        if tag not in self.VOID:
            self._open.append([tag, attrs, ""])

    def handle_startendtag(self, tag, attrs):
        self.tags[tag] = self.tags.get(tag, 0) + 1

    def handle_data(self, data):
        for entry in self._open:
            entry[2] += data

    def handle_endtag(self, tag):
        if tag in self.VOID:
            return
        while self._open:
            name, attrs, text = self._open.pop()
            if "data-json" in attrs:
                self.figures.append((attrs, text.strip()))
                if name == "text":
                    self.chart_figures.append(attrs["data-json"])
            elif name == "td" and "num" in (attrs.get("class") or "").split() and re.search(r"\d", text):
                self.unnamed.append(text.strip())
            if name == tag:
                break


NUMBER = re.compile(r"(?<![\d.])-?\d+(?:\.\d+)?")


def resolve(doc, pointer):
    node = doc
    for token in pointer.lstrip("/").split("/"):
        token = token.replace("~1", "/").replace("~0", "~")
        node = node[int(token)] if isinstance(node, list) else node[token]
    return node


def decimals(text):
    return len(text.split(".")[1]) if "." in text else 0


def check_figures(name, figures, doc, problems):
    """Each shown value against its JSON value. Words (a date, a package) must appear as they are in
    the JSON; a number must be within half a unit of the last digit shown of value x scale, plus
    the JSON's own rounding (its digits) times the scale. Returns how many values were checked."""
    checked = 0
    for attrs, text in figures:
        pointers = attrs["data-json"].split()
        scale = float(attrs.get("data-scale", "1"))
        numbers = NUMBER.findall(text)
        if attrs.get("data-sum"):
            try:
                total = sum(resolve(doc, p) for p in pointers)
            except (KeyError, IndexError, ValueError, TypeError):
                problems.append(f"{name}: \"{text}\": {pointers} are not numbers in the JSON")
                continue
            doc_total = {"total": total}
            pointers, doc_view = ["/total"], doc_total
        else:
            doc_view = doc
        for k, pointer in enumerate(pointers):
            try:
                value = resolve(doc_view, pointer)
                if isinstance(value, (int, float)) and not isinstance(value, bool) and k == 0:
                    for minus in (attrs.get("data-minus") or "").split():
                        value -= resolve(doc, minus)
            except (KeyError, IndexError, ValueError, TypeError):
                problems.append(f"{name}: \"{text}\": {pointer} is not in the JSON")
                continue
            checked += 1
            if isinstance(value, str):
                if value not in text:
                    problems.append(f"{name}: \"{text}\" does not show {pointer} = \"{value}\"")
                continue
            if not isinstance(value, (int, float)) or isinstance(value, bool):
                problems.append(f"{name}: \"{text}\": {pointer} is {value!r}, not a number")
                continue
            if k >= len(numbers):
                problems.append(f"{name}: \"{text}\" shows {len(numbers)} numbers for {pointers}")
                break
            shown = float(numbers[k])
            # An integer in the JSON is exact; a float was rounded to the digits it has.
            json_error = 0.0 if isinstance(value, int) else 0.5 * 10 ** -decimals(repr(float(value))) * abs(scale)
            tolerance = 0.5 * 10 ** -decimals(numbers[k]) + json_error + 1e-9
            if abs(shown - value * scale) > tolerance:
                problems.append(f"{name}: \"{text}\" shows {shown} but {pointer} x {scale:g} is {value * scale:g}")
    return checked


def check_bittering_alpha(name, dom, doc, problems):
    """A bittering swap from stock charts each charted lot's alpha on the brew day (the alpha its
    grams per gram come from), tied to that JSON value, not the catalog midpoint."""
    if doc.get("for") != "bittering":
        return
    for i, sub in enumerate(doc.get("substitutes", [])[:3]):
        pointer = f"/substitutes/{i}/alpha_today_percent"
        if sub.get("alpha_today_percent") is not None and pointer not in dom.chart_figures:
            problems.append(f"{name}: the chart of substitute {i + 1} does not show its lot's alpha ({pointer})")


def chromium_run(chromium, args, timeout=120):
    return subprocess.run([chromium, "--headless", "--no-sandbox", "--disable-gpu", "--hide-scrollbars"] + args,
                          capture_output=True, text=True, timeout=timeout)


def check_page(name, page, doc, chromium, out_dir, problems):
    size = os.path.getsize(page)
    if size >= MAX_BYTES:
        problems.append(f"{name}: {size} bytes, over {MAX_BYTES}")
    with open(page, encoding="utf-8") as f:
        source = f.read()
    try:
        ET.fromstring(source.split("\n", 1)[1])  # without the <!DOCTYPE html> line
    except ET.ParseError as e:
        problems.append(f"{name}: not well-formed: {e}")
    without_svg_namespace = source.replace('xmlns="http://www.w3.org/2000/svg"', "")
    for banned in ("<script", " src=", "http:", "https:", "@import", "<link", "url(http"):
        if banned in without_svg_namespace:
            problems.append(f"{name}: holds {banned!r} (pages are one file, no script, no request)")
    url = "file://" + os.path.abspath(page)
    run = chromium_run(chromium, ["--dump-dom", "--window-size=800,1200", url])
    if run.returncode != 0 or "<body" not in run.stdout:
        problems.append(f"{name}: chromium --dump-dom failed: {run.stderr[-300:]}")
        return 0
    dom = DomCollector()
    dom.feed(run.stdout)
    for tag in ("table", "thead", "tbody", "th", "td", "svg", "title", "desc", "footer"):
        if not dom.tags.get(tag):
            problems.append(f"{name}: rendered page has no <{tag}>")
    if "caution" not in dom.classes:
        problems.append(f"{name}: no caution box")
    # Every report here reads the shipped demo catalog: the page must say its data are invented.
    if any(c.get("demo") for c in doc.get("catalogs_used", [])) and "demo" not in dom.classes:
        problems.append(f"{name}: the demo catalog was used but the page has no demo-data marker")
    check_bittering_alpha(name, dom, doc, problems)
    for text in dom.unnamed:
        problems.append(f"{name}: figure cell \"{text}\" names no JSON value")
    return check_figures(name, dom.figures, doc, problems)


def check_layout(browser, name, page, out_dir, problems, sizes):
    url = "file://" + os.path.abspath(page)
    cases = [("360", 360, "screen"), ("800", 800, "screen")]
    cases += [(f"print {paper}", width, "print") for paper, width in PRINT_WIDTHS.items()]
    for label, width, media in cases:
        content, viewport = browser.layout(url, width, 1200, media)
        if viewport != width:
            problems.append(f"{name} at {label}: the layout viewport is {viewport} px, not {width} px")
        if content > viewport:
            problems.append(f"{name} at {label}: the document is {content} px wide, wider than the {viewport} px "
                            "viewport (it scrolls sideways)")
        sizes.append(f"{name} {label}: document {content} px, viewport {viewport} px")
    for width in (360, 800):
        shot = os.path.join(out_dir, f"{name}-{width}.png")
        browser.full_page_screenshot(url, width, shot)
        if not os.path.exists(shot) or os.path.getsize(shot) == 0:
            problems.append(f"{name}: no screenshot at {width} px")


def probe_detects_overflow(browser, out_dir):
    """The probe itself: a page wider than the viewport must be reported as such."""
    wide = os.path.join(out_dir, "probe-wide.html")
    with open(wide, "w") as f:
        f.write('<!DOCTYPE html><html><head><meta name="viewport" content="width=device-width"/></head>'
                '<body><table><tr><td style="white-space:nowrap">' + "wide " * 400 + "</td></tr></table></body></html>")
    content, viewport = browser.layout("file://" + wide, 360, 800)
    return content > viewport


def main():
    bine, source, out_dir = (os.path.abspath(a) for a in sys.argv[1:4])
    chromium = shutil.which("chromium")
    if not chromium:
        print("check_reports: chromium is not installed (tools/setup --for-tests installs it); failing, not skipping")
        return 1
    os.makedirs(out_dir, exist_ok=True)
    problems, sizes, checked = [], [], 0
    env = dict(os.environ, BINE_DATA=os.path.join(source, "descriptor-data"))
    pages = {}
    for name, args in reports().items():
        page = os.path.join(out_dir, f"{name}.html")
        run = subprocess.run([bine] + args + ["--json", "--html", page], capture_output=True, text=True,
                             env=env, cwd=source, timeout=300)
        if run.returncode != 0:
            problems.append(f"{name}: bine exited {run.returncode}: {run.stderr.strip()}")
            continue
        doc = json.loads(run.stdout)
        n = check_page(name, page, doc, chromium, out_dir, problems)
        if n == 0:
            problems.append(f"{name}: no number on the page was checked against the JSON")
        checked += n
        pages[name] = page
        sizes.append(f"{name}: {os.path.getsize(page)} bytes, {n} numbers checked against --json")
    browser = cdp_layout.Browser(chromium)
    try:
        if not probe_detects_overflow(browser, out_dir):
            problems.append("the layout probe does not see a page wider than its viewport")
        for name, page in pages.items():
            check_layout(browser, name, page, out_dir, problems, sizes)
    finally:
        browser.close()
    print("\n".join(sizes))
    print(f"screenshots and pages in {out_dir}")
    for p in problems:
        print("FAIL:", p)
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
