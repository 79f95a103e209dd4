"""Finding the gusset binary."""

import os
import shutil
import sys
from pathlib import Path
from typing import List, Mapping, Optional, Sequence

from .errors import GussetNotFound

__all__ = ["BUILD_HINT", "find_binary", "default_hints"]

#: BUILD_HINT says how to build the binary; it ends every GussetNotFound message.
BUILD_HINT = (
    "Build it from the root of the Gusset repository with:\n"
    "    go build -o gusset ./cmd/gusset\n"
    "then pass its path to Client(binary=...), set GUSSET_BINARY to it, or put it on PATH."
)

_EXE = "gusset.exe" if sys.platform == "win32" else "gusset"


def default_hints() -> List[Path]:
    """default_hints returns the build locations tried last.

    The client lives in clients/python/gusset of the repository, so the
    binary that ``go build -o gusset ./cmd/gusset`` leaves at the root of
    the repository is three directories up.
    """
    root = Path(__file__).resolve().parents[3]
    return [root / _EXE]


def _runnable(path: Path) -> bool:
    return path.is_file() and os.access(str(path), os.X_OK)


def find_binary(
    binary: Optional[str] = None,
    env: Optional[Mapping[str, str]] = None,
    hints: Optional[Sequence[Path]] = None,
) -> str:
    """find_binary returns the path of the gusset binary to start.

    It tries, in order: ``binary`` when given (a path, or a name looked up
    on PATH), the GUSSET_BINARY environment variable, ``gusset`` on PATH,
    and the build hints (by default the root of the repository this client
    sits in). ``env`` replaces os.environ, for tests.

    Raises:
        GussetNotFound: when none of these names a runnable file; the
            message lists what was tried and how to build the binary.
    """
    environ = os.environ if env is None else env
    searched: List[str] = []

    def resolve(name: str, origin: str) -> Optional[str]:
        searched.append("%s: %s" % (origin, name))
        path = Path(name).expanduser()
        if _runnable(path):
            return str(path.resolve())
        if os.sep not in name and (os.altsep is None or os.altsep not in name):
            found = shutil.which(name, path=environ.get("PATH", os.defpath))
            if found:
                return found
        return None

    if binary is not None:
        found = resolve(str(binary), "the binary argument")
        if found is None:
            raise GussetNotFound(
                "The gusset binary %r given to Client does not exist or is not executable.\n%s"
                % (str(binary), BUILD_HINT),
                searched,
            )
        return found
    configured = environ.get("GUSSET_BINARY")
    if configured:
        found = resolve(configured, "GUSSET_BINARY")
        if found is None:
            raise GussetNotFound(
                "GUSSET_BINARY is set to %r, which does not exist or is not executable.\n%s"
                % (configured, BUILD_HINT),
                searched,
            )
        return found
    searched.append("PATH: gusset")
    found = shutil.which("gusset", path=environ.get("PATH", os.defpath))
    if found:
        return found
    for hint in default_hints() if hints is None else hints:
        searched.append("build location: %s" % hint)
        if _runnable(Path(hint)):
            return str(Path(hint).resolve())
    raise GussetNotFound(
        "The gusset binary was not found (looked at: %s).\n%s" % ("; ".join(searched), BUILD_HINT),
        searched,
    )
