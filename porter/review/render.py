"""The review page as one self-contained HTML string (inline CSS and JS, no network).

Escaping is on for every template value; the only markup marked safe is Pygments' output,
which escapes the code it highlights.
"""

from __future__ import annotations

from functools import lru_cache

from jinja2 import Environment, PackageLoader
from markupsafe import Markup
from pygments.formatters import HtmlFormatter
from pygments.lexers import PythonLexer
from pygments.token import Token

from porter import __version__
from porter.mapping import MappingTable
from porter.model import FileResult
from porter.review.model import CONTEXT, DEFAULT_LOW, Page, SiteView, build_page
from porter.verify.model import VerifyResult
from porter.verify.trials import TrialsResult

PYGMENTS_STYLE = "friendly"


@lru_cache(maxsize=1)
def _environment() -> Environment:
    env = Environment(loader=PackageLoader("porter.review"), autoescape=True,
                      trim_blocks=True, lstrip_blocks=True)
    env.filters["pct"] = lambda x: "—" if x is None else f"{float(x):.2f}"
    return env


def highlight_lines(text: str) -> list[Markup]:
    """Each line of `text` as highlighted HTML; the lexer sees the whole text, so strings and
    brackets spanning lines are coloured right. Pygments escapes the code: safe to mark."""
    formatter = HtmlFormatter(nowrap=True)
    lines: list[list[tuple[object, str]]] = [[]]
    for ttype, value in PythonLexer(ensurenl=True, stripnl=False).get_tokens(text):
        parts = value.split("\n")
        for index, part in enumerate(parts):
            if index:
                lines.append([])
            if part:
                lines[-1].append((ttype, part))
    out = []
    for tokens in lines:
        html = []
        formatter.format(iter(tokens or [(Token.Text, "")]), _Sink(html))
        out.append(Markup("".join(html).removesuffix("\n")))
    return out


class _Sink:
    def __init__(self, parts: list[str]) -> None:
        self.parts = parts

    def write(self, text: str) -> None:
        self.parts.append(text)


@lru_cache(maxsize=1)
def pygments_css() -> str:
    rules = HtmlFormatter(style=PYGMENTS_STYLE).get_style_defs(".code").splitlines()
    # the page colours the panes' backgrounds itself (changed, inserted, TODO rows)
    return "\n".join(r for r in rules if not r.startswith(".code { background"))


def render_page(page: Page) -> str:
    template = _environment().get_template("review.html.j2")
    return template.render(page=page, version=__version__, css=Markup(_css()),
                           script=Markup(_script()), pygments_css=Markup(pygments_css()),
                           highlight=_highlighter(page), differences=_differences(page))


def _differences(page: Page) -> list[SiteView]:
    """One site per mapping key used on the page: what its rule handles is printed once, at
    the end, and every site of that key links to it (a page of hundreds of files stays small)."""
    first: dict[str, SiteView] = {}
    for view in page.files:
        for site in view.sites:
            if site.handles or site.notes or site.polars or site.advice:
                first.setdefault(site.key, site)
    return [first[key] for key in sorted(first)]


def _css() -> str:
    return _environment().loader.get_source(_environment(), "review.css")[0]  # type: ignore[union-attr]


def _script() -> str:
    source = _environment().loader.get_source(_environment(), "review.js")[0]  # type: ignore[union-attr]
    return source.replace("</", "<\\/")  # never closes its <script> element


def _highlighter(page: Page):  # type: ignore[no-untyped-def]
    """`highlight(block)` → (left lines, right lines) as highlighted HTML, by line number."""
    cache: dict[int, tuple[dict[int, Markup], dict[int, Markup]]] = {}

    def highlight(block) -> tuple[dict[int, Markup], dict[int, Markup]]:  # type: ignore[no-untyped-def]
        key = id(block)
        if key not in cache:
            rows = block.rows
            left = _by_number([r.left for r in rows if r.left])
            right = _by_number([r.right for r in rows if r.right])
            cache[key] = (left, right)
        return cache[key]

    return highlight


def _by_number(sides) -> dict[int, Markup]:  # type: ignore[no-untyped-def]
    """Highlight the lines of one side as one text (in line order), keyed by line number."""
    sides = sorted(sides, key=lambda s: s.number)
    html = highlight_lines("\n".join(s.text for s in sides))
    return {s.number: html[k] for k, s in enumerate(sides)}


def render_review(results: list[FileResult], *, verdicts: dict[str, VerifyResult] | None = None,
                  title: str = "porter review", low: float = DEFAULT_LOW,
                  folder: bool | None = None, table: MappingTable | None = None,
                  context: int = CONTEXT, trials: dict[str, TrialsResult] | None = None) -> str:
    """One self-contained HTML page reviewing `results` (and their verdicts and randomised
    trials, by source)."""
    page = build_page(results, verdicts=verdicts, title=title, low=low, folder=folder,
                      table=table, context=context, trials=trials)
    return render_page(page)
