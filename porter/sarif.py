"""The report as SARIF 2.1.0, the OASIS format for static-analysis results.

Each TODO site becomes a result of level ``warning`` and each hand-over a result of level
``note``; converted sites are not findings. A result's rule is the site's mapping key, and each
key used is described once under ``tool.driver.rules`` with the mapping's advice as help. A file
porter could not convert becomes a tool execution notification. Locations are the source paths,
relative to the working folder where possible, with forward slashes; a notebook's cell is in
the region's property bag (``properties.cell``) and its lines count within that cell.
"""

from __future__ import annotations

import os
from pathlib import Path, PurePath
from urllib.parse import quote

import porter
from porter.mapping import MappingTable, load_table
from porter.model import FileResult, Site

SCHEMA_URI = "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json"
LEVELS = {"todo": "warning", "handover": "note"}


def to_sarif(results: list[FileResult], *, root: str | Path | None = None,
             table: MappingTable | None = None) -> dict:
    """One SARIF log with one run of porter over ``results``; paths are made relative to
    ``root`` (default: the working folder) when they lie under it."""
    table = table or load_table()
    root = Path(root) if root is not None else Path.cwd()
    rules: dict[str, dict] = {}
    indexes: dict[str, int] = {}
    findings: list[dict] = []
    notifications: list[dict] = []
    for result in results:
        uri = artifact_uri(result.source, root)
        if result.status == "failed":
            notifications.append({
                "level": "error",
                "message": {"text": result.error or "conversion failed"},
                "locations": [{"physicalLocation": {"artifactLocation": {"uri": uri}}}],
            })
        for site in result.sites:
            if site.status not in LEVELS:
                continue
            if site.key not in rules:
                rules[site.key] = _rule(site, table)
                indexes[site.key] = len(indexes)
            findings.append(_result(site, uri, indexes[site.key]))
    return {
        "$schema": SCHEMA_URI,
        "version": "2.1.0",
        "runs": [{
            "tool": {"driver": {
                "name": "porter",
                "version": porter.__version__,
                "rules": list(rules.values()),
            }},
            "invocations": [{
                "executionSuccessful": not notifications,
                "toolExecutionNotifications": notifications,
            }],
            "results": findings,
        }],
    }


def artifact_uri(source: str, root: Path) -> str:
    """``source`` as a URI reference: relative to ``root`` with forward slashes, if under it."""
    path = Path(source)
    if path.is_absolute():
        try:
            path = path.resolve().relative_to(root.resolve())
        except ValueError:
            return path.as_uri()
    return quote(PurePath(os.path.normpath(path)).as_posix(), safe="/")


def _rule(site: Site, table: MappingTable) -> dict:
    entry = table.get(site.key)
    if site.status == "todo":
        short = f"pandas API {site.key} needs porting by hand"
        help_text = (entry.advice if entry else "") or site.message
    else:
        short = f"pandas API {site.key} is left on pandas (hand-over)"
        help_text = (entry and (entry.notes or entry.advice)) or site.message
    return {
        "id": site.key,
        "shortDescription": {"text": short},
        "help": {"text": help_text},
        "defaultConfiguration": {"level": LEVELS[site.status]},
    }


def _result(site: Site, uri: str, rule_index: int) -> dict:
    region: dict[str, object] = {"startLine": max(1, site.line),
                                 "endLine": max(1, site.line, site.end_line)}
    if site.cell is not None:
        region["properties"] = {"cell": site.cell}
    return {
        "ruleId": site.key,
        "ruleIndex": rule_index,
        "level": LEVELS[site.status],
        "message": {"text": site.message or site.key},
        "locations": [{"physicalLocation": {"artifactLocation": {"uri": uri}, "region": region}}],
    }
