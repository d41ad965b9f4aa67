# SPDX-License-Identifier: MIT
"""PostgreSQL servers of our own for the tests of the almanac extension.

Each test file starts the servers it needs and stops them when it ends, also
when a test fails:

    with PrivateInstallation() as installation, Server(installation, "single") as server:
        with server.connect() as connection: ...

The tests are ctests with the label postgres (tests/postgres/CMakeLists.txt,
when the build has ALMANAC_POSTGRES); one file by hand, after building the
targets almanac and almanac_postgres:

    cd tests && ALMANAC_BUILD=../build /usr/bin/python3 -m pytest -q postgres/test_sharded.py

Where things go, and why:

- Everything lives in one temporary folder under /tmp (mode 0755): the checkout
  may sit under a folder the server's user cannot enter (/root is 0700).
- PostgreSQL refuses to run as root. Run as root, the servers run as the
  system user `almanac_pg`, created here with useradd when it does not exist
  (no home, no login shell); run as anyone else, as that user.
- The extension is installed privately, never into the machine's PostgreSQL:
  `cmake --install <build> --component postgres` with DESTDIR puts the
  extension's files (module, control file, versioned script) into a staging
  folder exactly where they would go (the folders pg_config names), and a
  private copy of Debian's PostgreSQL 15 picks them up there. PostgreSQL finds
  its share and lib folders relative to where its executable really is, so the
  three programs the tests run (postgres, initdb, pg_ctl) are copied (not
  linked) into a tree that mirrors /usr; the rest of the tree is symbolic links
  to the machine's files, plus the staged extension files. So a test run never
  changes /usr, and two worktrees testing two versions of the extension at the
  same time do not see each other's.
- A server listens only on a Unix socket in its own folder
  (listen_addresses = ''), with trust authentication for the superuser
  `almanac`; nothing is reachable from the network.
- Stopping: pg_ctl stop -m fast, then -m immediate, then SIGKILL of the
  postmaster named in postmaster.pid; then the folder is removed.
"""
import contextlib
import json
import os
import pathlib
import pwd
import shutil
import signal
import subprocess
import tempfile
import time

import psycopg2

SOURCE = pathlib.Path(os.environ.get("ALMANAC_SOURCE", pathlib.Path(__file__).resolve().parents[2]))
BUILD = pathlib.Path(os.environ.get("ALMANAC_BUILD", SOURCE / "build"))
PG_CONFIG = os.environ.get("ALMANAC_PG_CONFIG", "/usr/bin/pg_config")
SERVER_USER = "almanac_pg"
SUPERUSER = "almanac"
PROGRAMS = ("postgres", "initdb", "pg_ctl")


def pg_config(option):
    return subprocess.run([PG_CONFIG, option], check=True, capture_output=True, text=True).stdout.strip()


def server_account():
    """(uid, gid) the servers run as: our own unprivileged user when we are root."""
    if os.geteuid() != 0:
        return os.geteuid(), os.getegid()
    try:
        entry = pwd.getpwnam(SERVER_USER)
    except KeyError:
        # Two test files started at once may both get here: whichever useradd loses
        # finds the user made by the other.
        made = subprocess.run(["useradd", "--system", "--no-create-home", "--home-dir", "/nonexistent",
                               "--shell", "/usr/sbin/nologin", SERVER_USER], capture_output=True, text=True)
        try:
            entry = pwd.getpwnam(SERVER_USER)
        except KeyError:
            raise RuntimeError(f"useradd {SERVER_USER} failed: {made.stderr}") from None
    return entry.pw_uid, entry.pw_gid


def mirror(source, target, skip=()):
    """target/<name> -> source/<name> for every entry of source, except those in skip."""
    target.mkdir(parents=True, exist_ok=True)
    for entry in source.iterdir():
        if entry.name not in skip and not (target / entry.name).exists():
            (target / entry.name).symlink_to(entry)


class PrivateInstallation:
    """Debian's PostgreSQL 15 with this build's almanac extension, under /tmp."""

    def __init__(self, build=BUILD):
        self.build = pathlib.Path(build)

    def __enter__(self):
        self.folder = pathlib.Path(tempfile.mkdtemp(prefix="almanac-pg-", dir="/tmp"))
        try:
            self.folder.chmod(0o755)
            self._install()
        except BaseException:
            shutil.rmtree(self.folder, ignore_errors=True)
            raise
        return self

    def __exit__(self, *exc):
        shutil.rmtree(self.folder, ignore_errors=True)

    def _install(self):
        stage = self.folder / "stage"
        result = subprocess.run(["cmake", "--install", str(self.build), "--component", "postgres"],
                                capture_output=True, text=True,
                                env={**os.environ, "DESTDIR": str(stage)})
        if result.returncode != 0:
            raise RuntimeError(f"cmake --install {self.build} failed:\n{result.stdout}{result.stderr}")
        bindir, pkglibdir, sharedir = (pathlib.Path(pg_config(o)) for o in ("--bindir", "--pkglibdir", "--sharedir"))
        root = self.folder / "root"
        self.bindir = root / bindir.relative_to("/")
        self.pkglibdir = root / pkglibdir.relative_to("/")
        self.sharedir = root / sharedir.relative_to("/")
        staged_lib = stage / pkglibdir.relative_to("/")
        staged_extension = stage / sharedir.relative_to("/") / "extension"
        if not (staged_extension / "almanac.control").is_file():
            raise RuntimeError(f"cmake --install {self.build} installed no almanac.control into "
                               f"{sharedir / 'extension'} (is the build configured with ALMANAC_POSTGRES=ON?)")
        self.bindir.mkdir(parents=True)
        for program in PROGRAMS:
            shutil.copy2(bindir / program, self.bindir / program)
        # The staged files first, so they win over anything of the same name on the machine.
        mirror(staged_lib, self.pkglibdir)
        mirror(pkglibdir, self.pkglibdir)
        mirror(staged_extension, self.sharedir / "extension")
        mirror(sharedir / "extension", self.sharedir / "extension")
        mirror(sharedir, self.sharedir, skip={"extension"})
        self.staged = sorted(str(p.relative_to(stage)) for p in stage.rglob("*")
                             if p.is_file() and (p.is_relative_to(staged_lib) or p.is_relative_to(staged_extension)))


class Server:
    """One PostgreSQL cluster: initdb, start, and always stop (a context manager)."""

    def __init__(self, installation, name, port=5432, settings=None):
        self.installation = installation
        self.name = name
        self.port = port
        self.settings = {
            "listen_addresses": "''",
            "port": str(port),
            "fsync": "off",
            "synchronous_commit": "off",
            "full_page_writes": "off",
            "shared_buffers": "'64MB'",
            "max_worker_processes": "8",
            "max_parallel_workers": "8",
            "lc_messages": "'C'",
            "timezone": "'UTC'",
            **(settings or {}),
        }

    def __enter__(self):
        self.uid, self.gid = server_account()
        self.folder = self.installation.folder / self.name
        self.data = self.folder / "data"
        self.socket = self.folder / "socket"
        self.log = self.folder / "server.log"
        self.folder.mkdir()
        self.socket.mkdir()
        for path in (self.folder, self.socket):
            os.chown(path, self.uid, self.gid)
        try:
            self._run("initdb", "-D", str(self.data), "-U", SUPERUSER, "--auth=trust", "-E", "UTF8",
                      "--no-locale", "--no-sync", "--no-instructions")
            with open(self.data / "postgresql.conf", "a") as conf:
                conf.write(f"unix_socket_directories = '{self.socket}'\n")
                for key, value in self.settings.items():
                    conf.write(f"{key} = {value}\n")
            self._run("pg_ctl", "-D", str(self.data), "-l", str(self.log), "-w", "-t", "60", "start")
        except BaseException:
            self.stop()
            raise
        return self

    def __exit__(self, *exc):
        self.stop()

    def _run(self, program, *args, timeout=120):
        # As root, the program runs as the server's user, with no other groups.
        account = {"user": self.uid, "group": self.gid, "extra_groups": []} if os.geteuid() == 0 else {}
        result = subprocess.run([str(self.installation.bindir / program), *args], **account, cwd=self.folder,
                                capture_output=True, text=True, timeout=timeout)
        if result.returncode != 0:
            log = self.log.read_text() if self.log.exists() else ""
            raise RuntimeError(f"{program} {' '.join(args)} failed ({result.returncode}):\n"
                               f"{result.stdout}{result.stderr}{log}")
        return result

    def stop(self):
        """Stops the server whatever state it is in; never raises."""
        pid_file = self.data / "postmaster.pid" if hasattr(self, "data") else None
        if pid_file is None or not pid_file.exists():
            return
        for mode in ("fast", "immediate"):
            try:
                self._run("pg_ctl", "-D", str(self.data), "-m", mode, "-w", "-t", "30", "stop", timeout=60)
                return
            except (RuntimeError, subprocess.TimeoutExpired):
                continue
        try:
            os.kill(int(pid_file.read_text().split()[0]), signal.SIGKILL)
            time.sleep(0.5)
        except (OSError, ValueError, IndexError):
            pass

    def dsn(self):
        return {"host": str(self.socket), "port": self.port, "user": SUPERUSER, "dbname": "postgres"}

    def connect(self, **options):
        connection = psycopg2.connect(**self.dsn(), **options)
        connection.autocommit = True
        return connection

    def server_log(self):
        return self.log.read_text() if self.log.exists() else ""


@contextlib.contextmanager
def almanac_server(name, rows=None, **options):
    """A connection to a server of our own with CREATE EXTENSION almanac done and, when
    rows are given, the seeded sales (seeded_sales.py) loaded into `sales`."""
    import seeded_sales
    with PrivateInstallation() as installation, Server(installation, name, **options) as server:
        connection = server.connect()
        try:
            connection.cursor().execute("CREATE EXTENSION almanac")
            if rows is not None:
                seeded_sales.load_postgres(connection, rows)
            yield connection
        finally:
            connection.close()


def run(connection, settings, sql):
    """The rows of sql, after the SET commands in settings."""
    with connection.cursor() as cursor:
        cursor.execute(settings)
        cursor.execute(sql)
        return cursor.fetchall()


def explained_plan(connection, settings, sql, options="VERBOSE"):
    """The root of EXPLAIN (options, FORMAT JSON) sql: PostgreSQL's own account of its plan."""
    explained = run(connection, settings, f"EXPLAIN ({options}, FORMAT JSON) {sql}")[0][0]
    return (explained if isinstance(explained, list) else json.loads(explained))[0]["Plan"]


def plan_nodes(plan):
    """Every node of a plan, the root first."""
    yield plan
    for child in plan.get("Plans", []):
        yield from plan_nodes(child)
