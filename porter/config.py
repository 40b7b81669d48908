"""`[tool.porter]` in pyproject.toml: defaults a team keeps with its code, overridden by the CLI."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
import tomllib

from porter.model import ConversionError

KEYS = {"min-confidence", "exclude", "jobs", "fail-on-todo"}


@dataclass(frozen=True)
class Config:
    min_confidence: float | None = None
    exclude: tuple[str, ...] = ()
    jobs: int | None = None
    fail_on_todo: bool | None = None
    path: str | None = None  # the pyproject.toml it came from


def find_pyproject(start: str | Path | None = None) -> Path | None:
    """The nearest pyproject.toml with a [tool.porter] table, walking up from `start` (cwd)."""
    folder = Path(start or Path.cwd()).resolve()
    for candidate in (folder, *folder.parents):
        path = candidate / "pyproject.toml"
        if path.is_file():
            try:
                data = tomllib.loads(path.read_text(encoding="utf-8"))
            except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError) as exc:
                raise ConversionError(f"cannot read pyproject.toml: {exc}", str(path)) from None
            if isinstance(data.get("tool"), dict) and "porter" in data["tool"]:
                return path
    return None


def load_config(start: str | Path | None = None) -> Config:
    path = find_pyproject(start)
    if path is None:
        return Config()
    table = tomllib.loads(path.read_text(encoding="utf-8"))["tool"]["porter"]
    where = f"{path} [tool.porter]"
    if not isinstance(table, dict):
        raise ConversionError("must be a table", where)
    unknown = sorted(set(table) - KEYS)
    if unknown:
        raise ConversionError(f"unknown key(s) {', '.join(unknown)}; known: "
                              f"{', '.join(sorted(KEYS))}", where)
    min_confidence = table.get("min-confidence")
    if min_confidence is not None and (isinstance(min_confidence, bool)
                                       or not isinstance(min_confidence, (int, float))
                                       or not 0.0 <= min_confidence <= 1.0):
        raise ConversionError("min-confidence must be a number between 0 and 1", where)
    exclude = table.get("exclude", [])
    if isinstance(exclude, str):
        exclude = [exclude]
    if not isinstance(exclude, list) or not all(isinstance(e, str) for e in exclude):
        raise ConversionError("exclude must be a list of glob patterns", where)
    jobs = table.get("jobs")
    if jobs is not None and (isinstance(jobs, bool) or not isinstance(jobs, int) or jobs < 1):
        raise ConversionError("jobs must be a positive integer", where)
    fail_on_todo = table.get("fail-on-todo")
    if fail_on_todo is not None and not isinstance(fail_on_todo, bool):
        raise ConversionError("fail-on-todo must be true or false", where)
    return Config(
        min_confidence=None if min_confidence is None else float(min_confidence),
        exclude=tuple(exclude),
        jobs=jobs,
        fail_on_todo=fail_on_todo,
        path=str(path),
    )
