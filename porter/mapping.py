"""The mapping table: every pandas API porter knows, read from `mappings/*.toml`.

A table whose body has `rule` (ported or hand-over) or `status = "todo"` is an entry; its
dotted TOML path is the mapping key (`[frame.sort_values]` → `frame.sort_values`).
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator
from dataclasses import dataclass, field
from functools import lru_cache
from pathlib import Path
import sys
import tomllib

from porter.model import MappingEntry

ENTRY_FIELDS = {"rule", "status", "polars", "confidence", "handles", "notes", "advice"}


def default_mapping_dir() -> Path:
    beside_package = Path(__file__).resolve().parent.parent / "mappings"
    if beside_package.is_dir():
        return beside_package
    return Path(sys.prefix) / "share" / "porter" / "mappings"


class MappingFileError(ValueError):
    pass


@dataclass(frozen=True)
class MappingTable:
    entries: dict[str, MappingEntry] = field(default_factory=dict)

    def get(self, key: str) -> MappingEntry | None:
        return self.entries.get(key)

    def __contains__(self, key: str) -> bool:
        return key in self.entries

    def __iter__(self) -> Iterator[MappingEntry]:
        return iter(self.entries.values())

    def areas(self) -> list[str]:
        return sorted({e.area for e in self.entries.values()})


def _walk(table: dict[str, object], prefix: str) -> Iterator[tuple[str, dict[str, object]]]:
    if ENTRY_FIELDS & table.keys():
        # an entry may have entries under it: [series.rolling] and [series.rolling.mean]
        yield prefix, {k: v for k, v in table.items() if not isinstance(v, dict)}
        table = {k: v for k, v in table.items() if isinstance(v, dict)}
    for name, value in table.items():
        if isinstance(value, dict):
            yield from _walk(value, f"{prefix}.{name}" if prefix else name)


def parse_entry(key: str, body: dict[str, object], area: str, source: str) -> MappingEntry:
    status = str(body.get("status", "ported"))
    if status not in ("ported", "handover", "todo"):
        raise MappingFileError(f"{source}: [{key}] has unknown status {status!r}")
    confidence = float(body.get("confidence", 0.0 if status == "todo" else 1.0))  # type: ignore[arg-type]
    if not 0.0 <= confidence <= 1.0:
        raise MappingFileError(f"{source}: [{key}] confidence {confidence} is not in [0, 1]")
    if status != "todo" and not body.get("rule"):
        raise MappingFileError(f"{source}: [{key}] needs a rule (or status = \"todo\")")
    if status == "todo" and not body.get("advice"):
        raise MappingFileError(f"{source}: [{key}] is a todo without advice")
    extra = {k: v for k, v in body.items() if k not in ENTRY_FIELDS}
    return MappingEntry(
        key=key,
        status=status,  # type: ignore[arg-type]
        rule=str(body["rule"]) if body.get("rule") else None,
        polars=str(body["polars"]) if body.get("polars") else None,
        confidence=confidence,
        handles=tuple(str(h) for h in body.get("handles", ())),  # type: ignore[union-attr]
        notes=str(body.get("notes", "")),
        advice=str(body.get("advice", "")),
        area=area,
        extra=extra,
    )


def load_files(paths: Iterable[Path]) -> MappingTable:
    entries: dict[str, MappingEntry] = {}
    for path in paths:
        try:
            data = tomllib.loads(path.read_text(encoding="utf-8"))
        except tomllib.TOMLDecodeError as exc:
            raise MappingFileError(f"{path}: {exc}") from exc
        for key, body in _walk(data, ""):
            entries[key] = parse_entry(key, body, path.stem, str(path))
    return MappingTable(entries)


@lru_cache(maxsize=8)
def load_table(extra_dirs: tuple[str, ...] = ()) -> MappingTable:
    """porter's own table, then the user's files (later files win on the same key)."""
    paths = sorted(default_mapping_dir().glob("*.toml"))
    for extra in extra_dirs:
        extra_path = Path(extra)
        paths += sorted(extra_path.glob("*.toml")) if extra_path.is_dir() else [extra_path]
    return load_files(paths)
