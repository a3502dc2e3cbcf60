"""Serve a built site and take screenshots of pages at tablet and laptop sizes.

    .venv/bin/python build/screenshots.py SITE_DIR OUT_DIR [page ...]

Used by maintainers to look at pages as users do (and for the README's pictures).
"""

import os
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tests", "browser"))  # browserkit

from browserkit import CHROMIUM, CHROMIUM_ARGS, Served  # noqa: E402

PAGES = ["", "calculators/joint/", "calculators/matrix/", "calculators/couple/", "calculators/electrode/",
         "calculators/convert/", "calculators/activity/", "reference/series/", "reference/galvanic-series/",
         "reference/materials/carbon-steel/"]
SIZES = {"tablet": (768, 1024), "laptop": (1280, 800)}


def main(site, out, pages):
    from playwright.sync_api import sync_playwright

    os.makedirs(out, exist_ok=True)
    srv = Served(site)
    with sync_playwright() as pw:
        br = pw.chromium.launch(executable_path=CHROMIUM, headless=True, args=CHROMIUM_ARGS)
        for label, (w, hgt) in SIZES.items():
            ctx = br.new_context(viewport={"width": w, "height": hgt})
            page = ctx.new_page()
            page.on("console", lambda m: print("console:", m.type, m.text) if m.type in ("error", "warning") else None)
            for p in pages:
                page.goto(srv.url(p))
                if "calculators" in p:
                    try:
                        page.wait_for_selector(".cw-runtime[data-stage='ready']", timeout=120_000)
                        page.wait_for_selector(".cw-result > :not(.cw-pending)", timeout=90_000)
                        page.wait_for_timeout(2500)
                    except Exception as exc:  # noqa: BLE001 - a screenshot of the failure is the point
                        print("no result on", p, exc)
                name = (p.strip("/").replace("/", "_") or "home") + f"-{label}.png"
                page.screenshot(path=os.path.join(out, name), full_page=True)
                width = page.evaluate("document.documentElement.scrollWidth")
                print(f"{name}: scrollWidth {width} (viewport {w})")
            ctx.close()
        br.close()
    srv.stop()


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2], sys.argv[3:] or PAGES)
