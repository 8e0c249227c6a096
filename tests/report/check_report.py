#!/usr/bin/env python3
"""Report checks: well-formed HTML and SVG (parsed by xml.etree and html.parser), numbers equal to
`design --json`, no external references, and a render in Debian's headless Chromium to PNG and PDF
that must not be blank and must not request anything from the network (read from Chromium's
NetLog; a control page that does load a loopback URL proves the detector sees requests)."""
import html.parser
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET

BINARY, SOURCE = sys.argv[1], sys.argv[2]
SVG_NS = "{http://www.w3.org/2000/svg}"
failures = []
passed = 0


def check(condition, message):
    global passed
    if condition:
        passed += 1
    else:
        failures.append(message)


def wickgrid(*args):
    return subprocess.run([BINARY, *args], capture_output=True, text=True)


def chromium_flags(profile):
    return ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", "--disable-quic", f"--user-data-dir={profile}"]


def page_requests(netlog_path):
    """Network URLs requested by pages (browser-internal requests have no origin)."""
    with open(netlog_path) as f:
        text = f.read()
    if not text.rstrip().endswith("}"):  # Chromium may leave the closing brackets off when killed
        text = text.rstrip().rstrip(",") + "]}"
    log = json.loads(text)
    names = {v: k for k, v in log["constants"]["logEventTypes"].items()}
    urls = []
    for e in log["events"]:
        p = e.get("params", {})
        if names.get(e["type"]) == "URL_REQUEST_START_JOB" and p.get("initiator") != "not an origin":
            if re.match(r"^(https?|wss?|ftp)://", p.get("url", "")):
                urls.append(p["url"])
    return urls


def render(chromium, page, work, tag):
    png, pdf, netlog = (os.path.join(work, f"{tag}.{ext}") for ext in ("png", "pdf", "netlog.json"))
    profile = tempfile.mkdtemp(prefix="wickgrid-chromium-")
    base = [chromium, *chromium_flags(profile), f"--log-net-log={netlog}", "--window-size=1100,1600"]
    shot = subprocess.run([*base, f"--screenshot={png}", "file://" + page], capture_output=True, text=True, timeout=120)
    requests = page_requests(netlog) if os.path.exists(netlog) else None
    printed = subprocess.run([chromium, *chromium_flags(profile), f"--print-to-pdf={pdf}", "file://" + page],
                             capture_output=True, text=True, timeout=120)
    shutil.rmtree(profile, ignore_errors=True)
    return shot, printed, png, pdf, requests


def not_blank(png):
    from PIL import Image
    with Image.open(png) as img:
        colours = img.convert("RGB").getcolors(maxcolors=1 << 20)
        return colours is not None and len(colours) > 20


def printed_inputs(text):
    """What the printed Inputs table must show for a scenario file's keys: the phrase and, where the
    file gives one number, that number as the note formats it."""
    def number(key):
        m = re.search(rf"\b{key}:\s*(-?[\d.]+)", text)
        return float(m.group(1)) if m else None
    wanted = []
    for key, phrase, digits, unit in (("crest_width_m", "crest width", 2, " m"), ("side_slope_h_per_v", "side slopes", 2, " horizontal"),
                                      ("fill_friction_angle_deg", "φ′ =", 1, "°"), ("fill_cohesion_kPa", "c′ =", 1, " kPa"),
                                      ("target_factor_of_safety", "", 2, " for every stage"),
                                      ("finished_height_m", "", 2, " m above the original ground"),
                                      ("su_top_kPa", "su =", 1, " kPa at the top of the layer"),
                                      ("groundwater_depth_m", "", 2, " m below the top of the clay")):
        value = number(key)
        if value is not None:
            wanted.append(f"{phrase}{' ' if phrase else ''}{value:.{digits}f}{unit}")
    if "berms:" in text:
        wanted += ["berm 1", "on each side"]
    if "finished_height_m" in text:
        wanted += ["finished level", "top-up"]
    if "embankment:" in text:
        wanted += ["target factor of safety", "fill strength", "embankment section"]
    if "su_ratio" in text:
        wanted.append("(Ladd & Foott 1974)")
    if "su_top_kPa" in text:
        wanted.append("gain Δsu/Δσ′v =")
    if "c_alpha" in text:
        wanted.append("Δe per log cycle of time")
    if "vacuum:" in text:
        wanted.append("kPa at the drain head")
    if "service_days" in text:
        wanted.append("days of service")
    if "schedule:" in text:
        wanted += ["scheme search: surcharge heights", "scheme search: costs", "Scheme search"]
        for key, unit in (("fill_cost_per_m3", " per m³"), ("cost_per_hectare_per_day", " per hectare per day")):
            value = number(key)
            if value is not None:
                wanted.append(f"{value:.2f}{unit}")
    if "c_prime_kPa" in text:
        wanted.append("(the effective-stress stage check)")
    return wanted


def main():
    work = tempfile.mkdtemp(prefix="wickgrid-report-")
    bundled = ["demo/scenario.yaml"] + sorted("configs/" + f for f in os.listdir(os.path.join(SOURCE, "configs")) if f.endswith(".yaml"))
    for scenario in bundled:
        out = os.path.join(work, os.path.basename(scenario).replace(".yaml", ""))
        r = wickgrid("report", os.path.join(SOURCE, scenario), "--out", out)
        check(r.returncode == 0, f"report {scenario}: exit {r.returncode}: {r.stderr}")
        page = os.path.join(out, "report.html")
        text = open(page, encoding="utf-8").read()
        root = ET.fromstring(text)  # well-formed as XML
        html.parser.HTMLParser().feed(text)  # and as HTML
        check(root.tag == "html", f"{scenario}: root element {root.tag}")
        svgs = [f for f in os.listdir(out) if f.endswith(".svg")]
        check(len(svgs) >= 3, f"{scenario}: only {len(svgs)} charts")
        for f in svgs:
            svg = ET.parse(os.path.join(out, f)).getroot()
            check(svg.tag == SVG_NS + "svg", f"{f}: root {svg.tag}")
            check(svg.find(SVG_NS + "title") is not None, f"{f}: no title")
            desc = svg.find(SVG_NS + "desc")
            check(desc is not None and "scenario SHA-256: " in (desc.text or "") and "caution:" in (desc.text or ""),
                  f"{f}: no trace (<desc> with the scenario's SHA-256 and the caution)")
            check(any(t.text for t in svg.iter(SVG_NS + "text")), f"{f}: no axis text")
        # Nothing external: no URLs other than the SVG namespace, no src/href attributes.
        external = [u for u in re.findall(r"(?:https?|ftp)://[^\s\"'<>)]+", text) if u != "http://www.w3.org/2000/svg"]
        check(not external, f"{scenario}: external references {external[:3]}")
        check(not re.search(r"\s(src|href)=", text), f"{scenario}: src/href attribute")
        for word in ("Cautions", "Method and sources", "Hansbo (1981)", "site investigation", "RECOMMENDED", "References"):
            check(word in text, f"{scenario}: '{word}' missing")
        # Study charts speak in words and units, not scenario keys.
        for f in svgs:
            if f.startswith(("tornado", "grid")):
                chart = open(os.path.join(out, f), encoding="utf-8").read()
                check("smear_permeability_ratio" not in chart and "ch_m2_per_year" not in chart, f"{f}: a scenario key as a label")
                check("kh/ks, undisturbed over smeared permeability" in chart, f"{f}: no human label for kh/ks")
        if "staged" in scenario:
            check("load-time.svg" in svgs, f"{scenario}: no load–time chart")
        # Numbers equal those of design --json.
        doc = json.loads(wickgrid("design", os.path.join(SOURCE, scenario), "--json").stdout)
        rows = {(d["drain"], d["pattern"]): d for d in doc["designs"]}
        compared = 0
        for tr in root.iter("tr"):
            key = (tr.get("data-drain"), tr.get("data-pattern"))
            if key not in rows:
                continue
            for td in tr.iter("td"):
                field = td.get("data-key")
                if field is None:
                    continue
                expected = rows[key][field]
                got = float(td.get("data-value"))
                check(abs(got - expected) <= 1e-9 * max(1.0, abs(expected)), f"{scenario} {key} {field}: {got} vs {expected}")
                compared += 1
        check(compared >= 20, f"{scenario}: only {compared} numbers compared")
        # The Markdown note beside the report has the same sections and links every chart file.
        note = open(os.path.join(out, "report.md"), encoding="utf-8").read()
        for f in svgs:
            check(f"]({f})" in note, f"{scenario}: report.md does not link {f}")
        for section in ("## Inputs", "## Results", "## References", "## Cautions"):
            check(section in note, f"{scenario}: report.md has no '{section}'")
        # The reliability table repeats sweep's Monte Carlo (same samples and seed), with a histogram per design.
        reliability = [t for t in root.iter("table") if t.get("class") == "reliability"]
        if "uncertain:" in open(os.path.join(SOURCE, scenario), encoding="utf-8").read():
            check(len(reliability) == 1, f"{scenario}: no reliability table")
            sweep = json.loads(wickgrid("sweep", os.path.join(SOURCE, scenario), "--only", "monte_carlo", "--json").stdout)
            expected = {(m["drain"], m["pattern"]): m for m in sweep["monte_carlo"]["rows"]}
            shown = 0
            for tr in reliability[0].iter("tr") if reliability else []:
                cells = ["".join(td.itertext()) for td in tr.iter("td")]
                if not cells:
                    continue
                m = expected[(cells[0], cells[1])]
                check(abs(float(cells[3]) - 100 * m["probability"]) <= 0.051, f"{scenario}: P {cells[3]} vs sweep")
                check(abs(float(cells[5]) - m["reliability_spacing_m"]) <= 0.0006, f"{scenario}: reliability spacing vs sweep")
                shown += 1
            check(shown == len(expected), f"{scenario}: {shown} reliability rows for {len(expected)} designs")
            check(sum(1 for f in svgs if f.startswith("monte-carlo-")) == len(expected), f"{scenario}: histograms missing")
        # The unit-cell sketch shows the recommended design's spacing and influence diameter.
        best = [d for d in doc["designs"] if d["rank"] == 1]
        if best:
            sketch = open(os.path.join(out, "unit-cell.svg"), encoding="utf-8").read()
            check(f"s = {best[0]['spacing_m']:.2f} m" in sketch, f"{scenario}: the sketch's spacing is not the design's")
            check(f"De = {best[0]['influence_diameter_m']:.3f} m" in sketch, f"{scenario}: the sketch's De is not the design's")

    chromium = shutil.which("chromium")
    check(chromium is not None, "chromium is not installed (scripts/install-deps.sh --test installs it)")
    if chromium:
        page = os.path.join(work, "scenario", "report.html")
        shot, printed, png, pdf, requests = render(chromium, page, work, "report")
        check(shot.returncode == 0 and os.path.exists(png), f"screenshot failed: {shot.stderr[-400:]}")
        check(printed.returncode == 0 and os.path.exists(pdf), f"PDF failed: {printed.stderr[-400:]}")
        if os.path.exists(png):
            check(not_blank(png), "the rendered PNG is blank")
        if os.path.exists(pdf):
            check(open(pdf, "rb").read(5) == b"%PDF-" and os.path.getsize(pdf) > 10000, "the PDF is empty")
            # On paper the results table keeps its last columns (a landscape page, no scrolling box)
            # and no page is larger than A4 (Debian poppler-utils reads the PDF).
            if shutil.which("pdftotext") and shutil.which("pdfinfo"):
                text = subprocess.run(["pdftotext", "-layout", pdf, "-"], capture_output=True, text=True).stdout
                for heading in ("drains/ha", "cost/ha", "t90"):
                    check(heading in text, f"printed report: column heading '{heading}' missing")
                # The running header (project, number, revision) and page numbers on every page.
                pages = text.count("\f") + 1
                check(text.count("(HR-2041)") >= pages - 1, f"printed report: running header on {text.count('(HR-2041)')} of {pages} pages")
                check(f"page 1 of {pages - 1}" in text or f"page 1 of {pages}" in text, "printed report: no 'page 1 of N'")
                info = subprocess.run(["pdfinfo", "-f", "1", "-l", "999", pdf], capture_output=True, text=True).stdout
                sizes = re.findall(r"Page\s+\d+ size:\s+([\d.]+) x ([\d.]+) pts", info)
                check(bool(sizes), "pdfinfo gave no page sizes")
                for w, h in sizes:
                    check(max(float(w), float(h)) <= 842.5 and min(float(w), float(h)) <= 595.5,
                          f"a printed page is larger than A4: {w} x {h} pts")
            else:
                check(False, "poppler-utils (pdftotext, pdfinfo) is not installed (scripts/install-deps.sh --test)")
        check(requests == [], f"the report requested {requests}")
        # Every bundled scenario's report prints whole: every results heading on paper, no page over A4.
        for scenario in bundled[1:]:
            tag = os.path.basename(scenario).replace(".yaml", "")
            page = os.path.join(work, tag, "report.html")
            pdf = os.path.join(work, f"{tag}.pdf")
            profile = tempfile.mkdtemp(prefix="wickgrid-chromium-")
            printed = subprocess.run([chromium, *chromium_flags(profile), f"--print-to-pdf={pdf}", "file://" + page],
                                     capture_output=True, text=True, timeout=120)
            shutil.rmtree(profile, ignore_errors=True)
            check(printed.returncode == 0 and os.path.exists(pdf), f"{scenario}: PDF failed")
            if os.path.exists(pdf) and shutil.which("pdftotext"):
                text = subprocess.run(["pdftotext", "-layout", pdf, "-"], capture_output=True, text=True).stdout
                # Each heading of the results table (its first word: a heading may wrap on paper).
                root = ET.fromstring(open(page, encoding="utf-8").read())
                table = next(t for t in root.iter("table") if t.get("class") == "results")
                headings = ["".join(th.itertext()).split()[0] for th in table.iter("th")]
                check(len(headings) >= 10, f"{scenario}: only {len(headings)} result headings")
                for heading in headings:
                    check(heading in text, f"{scenario}: printed column heading '{heading}' missing")
                info = subprocess.run(["pdfinfo", "-f", "1", "-l", "999", pdf], capture_output=True, text=True).stdout
                for w, h in re.findall(r"Page\s+\d+ size:\s+([\d.]+) x ([\d.]+) pts", info):
                    check(max(float(w), float(h)) <= 842.5 and min(float(w), float(h)) <= 595.5,
                          f"{scenario}: a printed page is larger than A4: {w} x {h} pts")
                # Every input a number depends on can be read from the paper (reading order, spaces collapsed).
                flowing = " ".join(subprocess.run(["pdftotext", pdf, "-"], capture_output=True, text=True).stdout.split())
                for expected in printed_inputs(open(os.path.join(SOURCE, scenario), encoding="utf-8").read()):
                    check(expected in flowing, f"{scenario}: printed inputs lack '{expected}'")
        # The layout page: the plan view renders, prints on A4 and requests nothing.
        layout_out = os.path.join(work, "layout")
        r = wickgrid("layout", os.path.join(SOURCE, "demo/scenario.yaml"), "--area", os.path.join(SOURCE, "demo/zone-c-area.geojson"),
                     "--drain", "band-100x4", "--pattern", "triangular", "--spacing", "1.2", "--out", layout_out)
        check(r.returncode == 0, f"layout: exit {r.returncode}: {r.stderr}")
        layout_page = os.path.join(layout_out, "layout.html")
        ET.fromstring(open(layout_page, encoding="utf-8").read())
        shot, printed, png, pdf, requests = render(chromium, layout_page, work, "layout")
        check(shot.returncode == 0 and os.path.exists(png) and not_blank(png), "layout: screenshot failed or blank")
        check(printed.returncode == 0 and os.path.exists(pdf), "layout: PDF failed")
        check(requests == [], f"the layout page requested {requests}")
        if os.path.exists(pdf) and shutil.which("pdftotext"):
            text = subprocess.run(["pdftotext", "-layout", pdf, "-"], capture_output=True, text=True).stdout
            for word in ("idealised count", "Cautions", "HR-2041"):
                check(word in text, f"printed layout: '{word}' missing")
        # The monitoring page: its charts are well-formed SVG, it renders, prints and requests nothing.
        monitor_out = os.path.join(work, "monitor")
        r = wickgrid("monitor", os.path.join(SOURCE, "configs/staged-surcharge.yaml"), "--readings",
                     os.path.join(SOURCE, "configs/staged-surcharge-readings.csv"), "--drain", "band-100x4",
                     "--pattern", "triangular", "--spacing", "1.5", "--out", monitor_out)
        check(r.returncode == 0, f"monitor: exit {r.returncode}: {r.stderr}")
        monitor_page = os.path.join(monitor_out, "monitor.html")
        root = ET.fromstring(open(monitor_page, encoding="utf-8").read())
        check(len(list(root.iter(SVG_NS + "svg"))) >= 4, "monitor: fewer than 4 charts")
        shot, printed, png, pdf, requests = render(chromium, monitor_page, work, "monitor")
        check(shot.returncode == 0 and os.path.exists(png) and not_blank(png), "monitor: screenshot failed or blank")
        check(printed.returncode == 0 and os.path.exists(pdf), "monitor: PDF failed")
        check(requests == [], f"the monitoring page requested {requests}")
        if os.path.exists(pdf) and shutil.which("pdftotext"):
            text = subprocess.run(["pdftotext", "-layout", pdf, "-"], capture_output=True, text=True).stdout
            for word in ("Asaoka plot", "Cautions", "Asaoka, A. (1978)"):
                check(word in text, f"printed monitoring page: '{word}' missing")
        # Control: a page that loads a loopback URL is seen by the same detector.
        control = os.path.join(work, "control.html")
        with open(control, "w") as f:
            f.write('<html><body><img src="http://127.0.0.1:9/probe.png"/>control</body></html>')
        _, _, _, _, seen = render(chromium, control, work, "control")
        check(bool(seen), "the network detector missed the control page's request")
    shutil.rmtree(work, ignore_errors=True)
    for f in failures:
        print("FAIL:", f)
    print(f"report: {passed} passed, {len(failures)} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
