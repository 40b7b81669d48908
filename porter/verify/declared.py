"""The pandas a script was written for, declared beside it, and a Python that has it.

A corpus case written for an older pandas says so in `reference.txt` in its folder: one pip
requirement a line (`pandas==1.5.3`, and what that pandas needs, `numpy<2`), `#` starts a
comment. Its original then runs under a virtual environment with exactly those packages, built
once from the package index and kept under the cache folder (`$PORTER_REFERENCE_CACHE`, else
`porter-reference-pythons` in the temporary folder), so later runs reuse it. The converted
script still runs under porter's own Python. Where the environment cannot be built (no network,
no venv module) `python_for` raises `ReferenceUnavailable` with the reason, and callers skip the
case saying so.
"""

from __future__ import annotations

import hashlib
import os
from pathlib import Path
import re
import shutil
import subprocess
import sys
import tempfile

REFERENCE_FILE = "reference.txt"


class ReferenceUnavailable(Exception):
    """The declared pandas cannot be had here; str() is the reason."""


def declared_requirements(folder: str | Path) -> tuple[str, ...]:
    """The requirements in `folder`/reference.txt; () when the folder declares none."""
    path = Path(folder) / REFERENCE_FILE
    if not path.is_file():
        return ()
    lines = (line.split("#", 1)[0].strip() for line in path.read_text(encoding="utf-8").splitlines())
    return tuple(line for line in lines if line)


def cache_folder() -> Path:
    return Path(os.environ.get("PORTER_REFERENCE_CACHE")
                or Path(tempfile.gettempdir()) / "porter-reference-pythons")


_BUILT: dict[tuple[str, ...], str | ReferenceUnavailable] = {}


def python_for(folder: str | Path) -> str | None:
    """The Python to run the original script in `folder` under: None for porter's own (nothing
    declared), else the path of a Python with the declared packages (built on first use)."""
    requirements = declared_requirements(folder)
    return python_with(*requirements) if requirements else None


def python_with(*requirements: str) -> str:
    """The path of a Python with exactly `requirements` installed (built on first use, kept
    in the cache folder); ReferenceUnavailable with the reason where it cannot be built."""
    if requirements not in _BUILT:
        try:
            _BUILT[requirements] = _build(requirements)
        except ReferenceUnavailable as exc:
            _BUILT[requirements] = exc
    found = _BUILT[requirements]
    if isinstance(found, ReferenceUnavailable):
        raise found
    return found


def _build(requirements: tuple[str, ...]) -> str:
    spelled = "_".join(requirements).replace("==", "-").replace("<", "-lt-").replace(">", "-gt-")
    label = re.sub(r"[^A-Za-z0-9.]+", "-", spelled).strip("-")[:60]
    digest = hashlib.sha256("\n".join(requirements).encode()).hexdigest()[:8]
    place = cache_folder() / f"{label}-{digest}"
    python = place / "bin" / "python"
    if (place / "porter-ready").is_file() and python.exists():
        return str(python)
    building = cache_folder() / f".building-{os.getpid()}-{digest}"
    shutil.rmtree(building, ignore_errors=True)
    building.parent.mkdir(parents=True, exist_ok=True)
    try:
        subprocess.run([sys.executable, "-m", "venv", str(building)], check=True,
                       capture_output=True, timeout=300)
        subprocess.run([str(building / "bin" / "python"), "-m", "pip", "install", "-q",
                        "--disable-pip-version-check", *requirements],
                       check=True, capture_output=True, timeout=900)
    except (subprocess.CalledProcessError, subprocess.TimeoutExpired, OSError) as exc:
        shutil.rmtree(building, ignore_errors=True)
        detail = getattr(exc, "stderr", b"") or str(exc)
        detail = detail.decode(errors="replace") if isinstance(detail, bytes) else detail
        lines = [line for line in detail.strip().splitlines() if not line.startswith("WARNING")]
        raise ReferenceUnavailable(
            f"cannot build a Python with {' '.join(requirements)} here: "
            f"{(lines or ['no output'])[-1][-300:]}") from None
    (building / "porter-ready").write_text("\n".join(requirements) + "\n", encoding="utf-8")
    try:
        building.rename(place)
    except OSError:  # another process built it meanwhile: use theirs
        shutil.rmtree(building, ignore_errors=True)
        if not (place / "porter-ready").is_file():
            raise ReferenceUnavailable(f"cannot keep the Python with {' '.join(requirements)} "
                                       f"at {place}") from None
    return str(python)
