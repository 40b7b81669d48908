"""The three verbs of a rule case, shared by the tests/test_rules_*.py files.

- ports:     the converted text contains the expected Polars fragment;
- todo:      the output carries `# TODO(porter): <key>` and still runs;
- unchanged: a method of the same name on a non-pandas object is left alone, byte for byte.
"""

from __future__ import annotations

import textwrap

from support import convert, converted_text, run


def _flat(text: str) -> str:
    """Code without layout: chains and argument lists may be broken over lines."""
    flat = "".join(text.split())
    return flat.replace(",)", ")").replace(",]", "]")


def check_ports(before: str, fragment: str) -> str:
    text = converted_text(before)
    assert _flat(fragment) in _flat(text), f"expected {fragment!r} in:\n{text}"
    assert "TODO(porter)" not in text, f"unexpected TODO in:\n{text}"
    return text


def check_todo(before: str, key: str) -> str:
    result = convert(before)
    text = result.converted_text
    assert f"# TODO(porter): {key}" in text, f"expected a TODO for {key} in:\n{text}"
    assert any(s.key == key and s.status == "todo" for s in result.sites)
    run(text)  # the hand-over to pandas keeps the script running
    return text


def check_unchanged(before: str) -> None:
    source = textwrap.dedent(before)
    result = convert(source)
    assert result.converted_text == source
    assert not result.sites
