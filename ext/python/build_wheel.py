# SPDX-License-Identifier: MIT
"""Builds the wheel of the Python package `almanac` around a built module.

    python3 ext/python/build_wheel.py --module build/almanac.so --version 0.1.0 --out build/wheel

The wheel is written directly as the zip file the wheel format (PEP 427)
describes, with the standard library only: no network, no build backend, and
the same bytes for the same inputs (sorted entries, fixed times).

Its tag is py3-none-<platform>: any Python 3 can use it (the module is loaded
by SQLite, not imported by Python, so no Python ABI is involved), on the one
platform the module was compiled for. The platform is read from the module's
own ELF header, not from the Python that runs this script, so a cross-built
module cannot get a wrong tag. It is linux_<machine>, not a manylinux tag: a
manylinux tag promises the module runs on older distributions than the one
that built it, which nothing here checks.
"""
import argparse
import base64
import hashlib
import pathlib
import re
import struct
import sys
import zipfile

HERE = pathlib.Path(__file__).resolve().parent
NAME = "almanac"
# ELF e_machine values (System V ABI) and the machine names Python's platform
# tags use for them (uname -m).
ELF_MACHINES = {3: "i686", 62: "x86_64", 183: "aarch64", 243: "riscv64", 22: "s390x"}
# The zip format cannot store times before 1980; every entry gets this one.
FIXED_TIME = (1980, 1, 1, 0, 0, 0)


def platform_tag(module):
    header = module.read_bytes()[:20]
    if header[:4] != b"\x7fELF":
        raise SystemExit(f"build_wheel.py: {module} is not an ELF shared object; "
                         "only Linux wheels are built here")
    byte_order = "<" if header[5] == 1 else ">"
    (machine,) = struct.unpack(byte_order + "H", header[18:20])
    if machine not in ELF_MACHINES:
        raise SystemExit(f"build_wheel.py: {module} is for ELF machine {machine}, which has no platform tag here")
    return f"linux_{ELF_MACHINES[machine]}"


def record_line(path, data):
    digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
    return f"{path},sha256={digest},{len(data)}"


def metadata(version):
    readme = (HERE / "README.md").read_text(encoding="utf-8")
    return (f"Metadata-Version: 2.1\nName: {NAME}\nVersion: {version}\n"
            "Summary: Calendar periods, exact windows, trend and season statistics and SVG charts "
            "as SQLite functions: the compiled module and a loader for Python's sqlite3\n"
            "License: MIT\nLicense-File: LICENSE\nRequires-Python: >=3.8\n"
            "Description-Content-Type: text/markdown\n\n" + readme)


def build(module, version, out):
    if not re.fullmatch(r"[0-9]+(\.[0-9]+)*", version):
        raise SystemExit(f"build_wheel.py: version {version!r} is not a plain release number")
    tag = f"py3-none-{platform_tag(module)}"
    dist_info = f"{NAME}-{version}.dist-info"
    files = {
        f"{NAME}/__init__.py": (HERE / NAME / "__init__.py").read_bytes(),
        f"{NAME}/_version.py": f'# SPDX-License-Identifier: MIT\n__version__ = "{version}"\n'.encode(),
        f"{NAME}/almanac.so": module.read_bytes(),
        f"{dist_info}/METADATA": metadata(version).encode(),
        f"{dist_info}/WHEEL": (f"Wheel-Version: 1.0\nGenerator: almanac build_wheel.py\n"
                               f"Root-Is-Purelib: false\nTag: {tag}\n").encode(),
        f"{dist_info}/licenses/LICENSE": (HERE.parent.parent / "LICENSE").read_bytes(),
    }
    record = f"{dist_info}/RECORD"
    lines = [record_line(path, data) for path, data in sorted(files.items())] + [f"{record},,"]
    files[record] = ("\n".join(lines) + "\n").encode()

    out.mkdir(parents=True, exist_ok=True)
    wheel = out / f"{NAME}-{version}-{tag}.whl"
    # One wheel in the folder: an older version's or platform's would be installed by mistake.
    for old in out.glob(f"{NAME}-*.whl"):
        if old != wheel:
            old.unlink()
    partial = wheel.with_suffix(".partial")
    with zipfile.ZipFile(partial, "w", zipfile.ZIP_DEFLATED) as archive:
        # RECORD last, as the format recommends; the rest in a stable order.
        for path in sorted(files, key=lambda p: (p == record, p)):
            entry = zipfile.ZipInfo(path, FIXED_TIME)
            entry.compress_type = zipfile.ZIP_DEFLATED
            entry.external_attr = (0o100755 if path.endswith(".so") else 0o100644) << 16
            archive.writestr(entry, files[path])
    partial.replace(wheel)
    return wheel


def main():
    parser = argparse.ArgumentParser(description="Builds the almanac wheel around a built module.")
    parser.add_argument("--module", required=True, type=pathlib.Path, help="the built almanac.so")
    parser.add_argument("--version", required=True, help="the project version, e.g. 0.1.0")
    parser.add_argument("--out", required=True, type=pathlib.Path, help="the folder the wheel goes into")
    arguments = parser.parse_args()
    print(build(arguments.module, arguments.version, arguments.out))


if __name__ == "__main__":
    sys.exit(main())
