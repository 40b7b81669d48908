"""Screenshot of a demo review page for the README, run on demand.

    .venv/bin/python tests/screenshot_review.py    # writes docs/review.png

Reviews two corpus scripts (one with TODOs) and photographs the page in Debian's chromium.
"""

from __future__ import annotations

from pathlib import Path
import shutil
import sys
import tempfile

from playwright.sync_api import sync_playwright

from porter.cli import main as porter

ROOT = Path(__file__).resolve().parent.parent


def main() -> int:
    chromium = shutil.which("chromium")
    if chromium is None:
        print("needs Debian's chromium", file=sys.stderr)
        return 2
    with tempfile.TemporaryDirectory() as tmp:
        src = Path(tmp) / "scripts"
        src.mkdir()
        for case in ("school_canteen_meals", "orchard_harvest"):
            shutil.copy(ROOT / "corpus" / case / f"{case}.py", src / f"{case}.py")
        page = Path(tmp) / "review.html"
        porter(["review", str(src), "-o", str(page), "-q"])
        with sync_playwright() as p:
            browser = p.chromium.launch(executable_path=chromium, args=[
                "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--no-first-run"])
            tab = browser.new_page(viewport={"width": 1400, "height": 900})
            tab.goto(page.as_uri())
            tab.keyboard.press("n")
            tab.wait_for_timeout(400)
            tab.screenshot(path=str(ROOT / "docs" / "review.png"))
            browser.close()
    print(ROOT / "docs" / "review.png")
    return 0


if __name__ == "__main__":
    sys.exit(main())
