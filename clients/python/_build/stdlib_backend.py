"""A PEP 517 build backend that needs nothing beyond Python's standard library.

``pip install ./clients/python`` builds the client's wheel in an isolated
environment; with setuptools as the backend that environment must first be
filled from a package index, which fails offline. This backend writes the
wheel (PEP 427) and the source distribution itself with ``zipfile`` and
``tarfile``, so the install works on a machine with no index at all. It
knows exactly one project: the ``gusset`` package beside it, whose name and
version it reads from pyproject.toml's ``[project]`` table.
"""

import base64
import hashlib
import io
import os
import re
import tarfile
import zipfile

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
PACKAGE = "gusset"


def _project():
    """Reads name, version, description and requires-python from pyproject.toml.

    Python 3.8 has no tomllib, so the few plain ``key = "value"`` lines of
    the ``[project]`` table are read with a regular expression.
    """
    with open(os.path.join(ROOT, "pyproject.toml"), encoding="utf-8") as f:
        text = f.read()
    table = text.split("[project]", 1)[1].split("\n[", 1)[0]
    fields = dict(re.findall(r'^([A-Za-z-]+)\s*=\s*"([^"]*)"\s*$', table, re.M))
    return fields


def _metadata():
    p = _project()
    lines = [
        "Metadata-Version: 2.1",
        "Name: " + p["name"],
        "Version: " + p["version"],
        "Summary: " + p.get("description", ""),
        "Requires-Python: " + p.get("requires-python", ">=3.8"),
    ]
    return "\n".join(lines) + "\n"


def _package_files():
    """Yields (archive name, path) of every file of the package, sorted."""
    base = os.path.join(ROOT, PACKAGE)
    for dirpath, dirnames, filenames in os.walk(base):
        dirnames[:] = sorted(d for d in dirnames if d != "__pycache__")
        for name in sorted(filenames):
            if name.endswith((".pyc", ".pyo")):
                continue
            path = os.path.join(dirpath, name)
            yield os.path.relpath(path, ROOT).replace(os.sep, "/"), path


def _record_line(name, data):
    digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
    return "%s,sha256=%s,%d" % (name, digest, len(data))


def _dist_info(p):
    return "%s-%s.dist-info" % (p["name"], p["version"])


def get_requires_for_build_wheel(config_settings=None):
    return []


def get_requires_for_build_sdist(config_settings=None):
    return []


def prepare_metadata_for_build_wheel(metadata_directory, config_settings=None):
    p = _project()
    info = os.path.join(metadata_directory, _dist_info(p))
    os.makedirs(info, exist_ok=True)
    with open(os.path.join(info, "METADATA"), "w", encoding="utf-8") as f:
        f.write(_metadata())
    return _dist_info(p)


def build_wheel(wheel_directory, config_settings=None, metadata_directory=None):
    """Writes gusset-VERSION-py3-none-any.whl into wheel_directory (PEP 427)."""
    p = _project()
    name = "%s-%s-py3-none-any.whl" % (p["name"], p["version"])
    info = _dist_info(p)
    entries = []
    for arcname, path in _package_files():
        with open(path, "rb") as f:
            entries.append((arcname, f.read()))
    entries.append((info + "/METADATA", _metadata().encode()))
    wheel = "Wheel-Version: 1.0\nGenerator: gusset stdlib_backend\nRoot-Is-Purelib: true\nTag: py3-none-any\n"
    entries.append((info + "/WHEEL", wheel.encode()))
    entries.append((info + "/top_level.txt", (PACKAGE + "\n").encode()))
    record = [_record_line(n, d) for n, d in entries] + [info + "/RECORD,,"]
    entries.append((info + "/RECORD", ("\n".join(record) + "\n").encode()))
    with zipfile.ZipFile(os.path.join(wheel_directory, name), "w", zipfile.ZIP_DEFLATED) as z:
        for arcname, data in entries:
            z.writestr(zipfile.ZipInfo(arcname, date_time=(1980, 1, 1, 0, 0, 0)), data)
    return name


def build_sdist(sdist_directory, config_settings=None):
    """Writes gusset-VERSION.tar.gz: the package, pyproject.toml, this backend."""
    p = _project()
    base = "%s-%s" % (p["name"], p["version"])
    name = base + ".tar.gz"
    files = list(_package_files())
    files.append(("pyproject.toml", os.path.join(ROOT, "pyproject.toml")))
    files.append(("_build/stdlib_backend.py", os.path.abspath(__file__)))
    with tarfile.open(os.path.join(sdist_directory, name), "w:gz") as t:
        pkg_info = _metadata().encode()
        info = tarfile.TarInfo(base + "/PKG-INFO")
        info.size = len(pkg_info)
        t.addfile(info, io.BytesIO(pkg_info))
        for arcname, path in files:
            t.add(path, arcname=base + "/" + arcname)
    return name
