"""Reports: the JSON report of one script or a folder, merged shard reports, and the summaries
printed on the terminal (see docs/report.md)."""

from __future__ import annotations

from collections import Counter
import json
from dataclasses import replace
from pathlib import Path
import re
from typing import Iterable, Literal

from porter import __version__
from porter.model import ConversionError, FileResult, Site, summarize

Mode = Literal["convert", "scan"]
TODO_MARKER = re.compile(r"#\s*TODO\(porter\)")


def todo_markers(result: FileResult) -> int:
    """TODO(porter) comments already in the file (left by an earlier conversion)."""
    return len(TODO_MARKER.findall(result.original_text))


def report_json(results: list[FileResult]) -> dict[str, object]:
    sites = [s for r in results for s in r.sites]
    total = summarize(sites)
    total["files"] = len(results)
    return {"porter_version": __version__, "files": [r.to_json() for r in results], "summary": total}


def summary_text(results: list[FileResult]) -> str:
    sites = [s for r in results for s in r.sites]
    summary = summarize(sites)
    lines = [f"porter: {summary['converted']} sites converted, {summary['handover']} handed over "
             f"to pandas, {summary['todo']} TODOs"]
    todo_keys = summary["todo_by_key"]
    assert isinstance(todo_keys, dict)
    for key, count in list(todo_keys.items())[:8]:
        lines.append(f"  TODO {count:>3} × {key}")
    if len(todo_keys) > 8:
        lines.append(f"  … and {len(todo_keys) - 8} more keys (see --report)")
    lowest = [s for s in sites if s.status == "converted"]
    if lowest:
        low = min(lowest, key=lambda s: s.confidence)
        where = next((r.source for r in results if low in r.sites), "")
        lines.append(f"  lowest confidence {low.confidence:.2f}: {low.key} at {where}:{low.line}"
                     + (f" ({low.message})" if low.message else ""))
    return "\n".join(lines)


def _sites_of(entry: dict) -> list[Site]:
    sites = []
    for s in entry.get("sites", []):
        site = Site(s["line"], s["end_line"], s["key"], s["rule"], s["status"], s["confidence"],
                    s.get("message", ""))
        if s.get("cell") is not None and hasattr(site, "cell"):  # notebooks: the cell of the site
            site = replace(site, cell=s["cell"])
        sites.append(site)
    return sites


def folder_summary(entries: list[dict]) -> dict[str, object]:
    """The top-level summary of a report from its file entries (as in `FileResult.to_json`)."""
    sites = [s for e in entries for s in _sites_of(e)]
    statuses = Counter(e.get("status") for e in entries)
    summary: dict[str, object] = {
        "files": len(entries),
        "files_converted": statuses["converted"],
        "files_unchanged": statuses["unchanged"],
        "files_failed": statuses["failed"],
    }
    summary.update(summarize(sites))
    summary["keys"] = dict(Counter(s.key for s in sites).most_common())
    lowest = []
    for entry in entries:
        confidences = [s.confidence for s in _sites_of(entry) if s.status == "converted"]
        if confidences:
            lowest.append((min(confidences), entry["source"]))
    lowest.sort()
    summary["lowest_confidence_files"] = [{"source": source, "lowest_confidence": round(c, 3)}
                                          for c, source in lowest[:10]]
    return summary


def folder_report(results: list[FileResult], *, command: Mode = "convert",
                  shard_of: tuple[int, int] | None = None, notes: list[str] = ()) -> dict[str, object]:
    entries = [r.to_json() for r in results]
    report: dict[str, object] = {"porter_version": __version__, "command": command}
    if shard_of is not None:
        report["shard"] = f"{shard_of[0]}/{shard_of[1]}"
    report["files"] = entries
    report["summary"] = folder_summary(entries)
    if notes:
        report["notes"] = list(notes)
    return report


def merge_reports(paths: list[str]) -> dict[str, object]:
    """Shard reports merged: files concatenated in order, the summary recomputed."""
    entries: list[dict] = []
    commands: set[str] = set()
    notes: list[str] = []
    seen: dict[str, str] = {}
    for path in paths:
        try:
            data = json.loads(Path(path).read_text(encoding="utf-8"))
        except FileNotFoundError:
            raise ConversionError("no such file", path) from None
        except (OSError, UnicodeDecodeError, json.JSONDecodeError) as exc:
            raise ConversionError(f"not a porter report: {exc}", path) from None
        if not isinstance(data, dict) or not isinstance(data.get("files"), list):
            raise ConversionError("not a porter report (no \"files\" list)", path)
        for entry in data["files"]:
            if not isinstance(entry, dict) or "source" not in entry:
                raise ConversionError("not a porter report (a file entry has no \"source\")", path)
            if entry["source"] in seen:
                raise ConversionError(f"{entry['source']} is also in {seen[entry['source']]} "
                                      "(overlapping shards?)", path)
            seen[entry["source"]] = path
            entries.append(entry)
        if "command" in data:
            commands.add(data["command"])
        notes += [n for n in data.get("notes", []) if n not in notes]
    report: dict[str, object] = {"porter_version": __version__}
    if len(commands) == 1:
        report["command"] = commands.pop()
    report["files"] = entries
    report["summary"] = folder_summary(entries)
    if notes:
        report["notes"] = notes
    return report


def check_problems(results: list[FileResult]) -> list[str]:
    """Why `--check` fails: files with pandas code porter could convert, TODOs, failures."""
    convertible = [r for r in results if any(s.status == "converted" for s in r.sites)]
    todos = [r for r in results if r.todos]
    markers = [r for r in results if todo_markers(r)]
    failures = [r for r in results if r.status == "failed"]
    problems = []
    if convertible:
        problems.append(f"{len(convertible)} file(s) still have pandas code porter can convert")
    if todos:
        problems.append(f"{len(todos)} file(s) have TODOs ({sum(len(r.todos) for r in todos)} in all)")
    if markers:
        problems.append(f"{len(markers)} file(s) still carry TODO(porter) markers "
                        f"({sum(todo_markers(r) for r in markers)} in all)")
    if failures:
        problems.append(f"{len(failures)} file(s) failed")
    return problems


def _counts_line(summary: dict, *, scan: bool) -> str:
    verb = "would convert" if scan else "converted"
    return (f"{summary['files']} files: {summary['files_converted']} {verb}, "
            f"{summary['files_unchanged']} unchanged, {summary['files_failed']} failed; "
            f"{summary['sites']} pandas sites: {summary['converted']} {verb}, "
            f"{summary['handover']} handed over to pandas, {summary['todo']} TODOs")


def _tail(summary: dict, results: list[FileResult], notes: Iterable[str], top: int) -> list[str]:
    lines = []
    todo_keys = summary["todo_by_key"]
    if todo_keys:
        lines.append("  TODOs by mapping key (the migration's to-do list):")
        for key, count in list(todo_keys.items())[:top]:
            lines.append(f"    {count:>4} × {key}")
        if len(todo_keys) > top:
            lines.append(f"    … and {len(todo_keys) - top} more keys (see --report)")
    lowest = summary["lowest_confidence_files"][:5]
    if lowest:
        lines.append("  lowest confidence: " + ", ".join(
            f"{e['source']} ({e['lowest_confidence']:.2f})" for e in lowest))
    failures = [r for r in results if r.status == "failed"]
    for result in failures[:top]:
        lines.append(f"  failed: {result.source}: {result.error}")
    if len(failures) > top:
        lines.append(f"  … and {len(failures) - top} more failed files (see --report)")
    lines += [f"  note: {n}" for n in notes]
    return lines


def folder_summary_text(results: list[FileResult], notes: Iterable[str] = (), top: int = 10) -> str:
    summary = folder_summary([r.to_json() for r in results])
    return "\n".join([f"porter: {_counts_line(summary, scan=False)}",
                      *_tail(summary, results, notes, top)])


def scan_text(results: list[FileResult], notes: Iterable[str] = (), top: int = 10) -> str:
    """The readiness report: per file, then the pandas APIs of the whole code base."""
    summary = folder_summary([r.to_json() for r in results])
    lines = []
    for result in results:
        if result.status == "failed":
            lines.append(f"{result.source}: failed: {result.error}")
            continue
        markers = todo_markers(result)
        if markers and not result.sites:
            lines.append(f"{result.source}: {markers} TODO(porter) marker(s) left")
        if not result.sites:
            continue
        s = result.summary()
        line = (f"{result.source}: {s['sites']} sites, {s['converted']} would convert, "
                f"{s['handover']} handover, {s['todo']} TODO")
        if s["todo"]:
            line += " (" + ", ".join(s["todo_by_key"]) + ")"
        if s["lowest_confidence"] is not None:
            line += f", lowest confidence {s['lowest_confidence']:.2f}"
        if markers:
            line += f", {markers} TODO(porter) marker(s) left"
        lines.append(line)
        keys = Counter(site.key for site in result.sites)
        lines.append("    uses " + ", ".join(k if n == 1 else f"{k} ×{n}" for k, n in sorted(keys.items())))
    by_status: dict[str, Counter] = {}
    for result in results:
        for site in result.sites:
            by_status.setdefault(site.key, Counter())[site.status] += 1
    if by_status:
        lines.append("pandas APIs used (sites: would convert / handover / TODO):")
        width = max(len(k) for k in by_status)
        for key, total in summary["keys"].items():
            c = by_status[key]
            lines.append(f"  {key:<{width}} {total:>5}   {c['converted']} / {c['handover']} / {c['todo']}")
    lines.append(f"total: {_counts_line(summary, scan=True)}")
    lines += _tail(summary, results, notes, top)
    return "\n".join(lines)
