"""The HTML review page in a real headless Chromium (Debian's `chromium`, driven by Playwright's
Python package through its executable-path option; .ci/run installs the browser).

Skipped, with the reason, where no Chromium is installed.
"""

from __future__ import annotations

from pathlib import Path
import shutil

import pytest

from porter.cli import main

CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")
playwright = pytest.importorskip("playwright.sync_api")
pytestmark = pytest.mark.skipif(CHROMIUM is None, reason="Debian's chromium is not installed")

HOSTILE = '''import pandas as pd

note = "</script><script>alert(1)</script>"
df = pd.read_csv("data/hives.csv")
df["label"] = note
df.to_csv("out.csv", index=False)
'''

WITH_TODOS = '''import pandas as pd

df = pd.read_csv("data/loans.csv")
wide = df.pivot_table(index="branch", columns="month", values="days", margins=True)
for _, row in df.iterrows():
    print(row["member"])
df = df[df["days"] > 14]
df.sort_values("days").to_csv("late.csv", index=False)
'''

CLEAN = '''import pandas as pd

df = pd.read_csv("data/meters.csv")
totals = df.groupby("village")["litres"].sum().reset_index()
totals.to_csv("totals.csv", index=False)
'''


@pytest.fixture(scope="module")
def review_page(tmp_path_factory) -> Path:
    src = tmp_path_factory.mktemp("scripts")
    (src / "hostile.py").write_text(HOSTILE)
    (src / "loans.py").write_text(WITH_TODOS)
    (src / "meters.py").write_text(CLEAN)
    page = src.parent / "review.html"
    assert main(["review", str(src), "-o", str(page)]) == 0
    return page


@pytest.fixture(scope="module")
def browser():
    with playwright.sync_playwright() as p:
        instance = p.chromium.launch(executable_path=CHROMIUM, args=[
            "--no-sandbox", "--disable-gpu", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", "--no-first-run"])
        yield instance
        instance.close()


@pytest.fixture
def page(browser, review_page):
    context = browser.new_context(viewport={"width": 1280, "height": 800})
    tab = context.new_page()
    requests: list[str] = []
    dialogs: list[str] = []
    tab.on("request", lambda request: requests.append(request.url))
    tab.on("dialog", lambda dialog: (dialogs.append(dialog.message), dialog.dismiss()))
    tab.goto(review_page.as_uri())
    tab.wait_for_load_state("load")
    tab.requests, tab.dialogs = requests, dialogs  # type: ignore[attr-defined]
    yield tab
    context.close()


def _in_view(page, element) -> bool:
    box = element.bounding_box()
    height = page.viewport_size["height"]
    return box is not None and box["y"] >= -1 and box["y"] < height


def test_opens_from_a_file_url_without_network(page):
    assert page.requests, "the page itself was requested"
    assert all(url.startswith(("file://", "data:", "about:")) for url in page.requests), page.requests


def test_side_by_side_panes_show_the_code(page):
    original = page.locator(".pane-original").all_inner_texts()
    converted = page.locator(".pane-converted").all_inner_texts()
    assert any("pd.read_csv" in text for text in original)
    assert any("pl.scan_csv" in text for text in converted)
    assert not any("pl.scan_csv" in text for text in original)


def test_clicking_a_todo_in_the_list_scrolls_to_it(page):
    links = page.locator("#todo-list a")
    assert links.count() >= 2
    last = links.nth(links.count() - 1)
    target_id = last.get_attribute("href").lstrip("#")
    target = page.locator(f"[id='{target_id}']")
    page.evaluate("window.scrollTo(0, 0)")
    last.click()
    page.wait_for_timeout(300)
    assert _in_view(page, target)


def test_the_keyboard_moves_between_todos(page):
    rows = page.locator(".todo-row")
    assert rows.count() >= 2
    page.evaluate("window.scrollTo(0, 0)")
    page.keyboard.press("n")
    page.wait_for_timeout(300)
    assert _in_view(page, rows.nth(0))
    page.keyboard.press("n")
    page.wait_for_timeout(300)
    assert _in_view(page, rows.nth(1))
    page.keyboard.press("p")
    page.wait_for_timeout(300)
    assert _in_view(page, rows.nth(0))


def test_the_index_filters_and_sorts(page):
    table = page.locator("#file-index")
    body_rows = table.locator("tbody tr")
    assert body_rows.count() == 3
    page.fill("#filter", "loans")
    page.wait_for_timeout(200)
    visible = [r for r in body_rows.all() if r.is_visible()]
    assert len(visible) == 1 and "loans" in visible[0].inner_text()
    page.fill("#filter", "")
    page.wait_for_timeout(200)
    first_before = body_rows.nth(0).inner_text()
    header = table.locator("thead th").first
    header.click()
    page.wait_for_timeout(200)
    order_one = [r.inner_text() for r in body_rows.all()]
    header.click()
    page.wait_for_timeout(200)
    order_two = [r.inner_text() for r in body_rows.all()]
    assert order_one == list(reversed(order_two))
    assert first_before in order_one


def test_code_from_users_shows_as_text_and_runs_nothing(page):
    assert page.dialogs == []
    assert "</script><script>alert(1)</script>" in page.locator("body").inner_text()
