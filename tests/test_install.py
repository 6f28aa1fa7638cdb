"""The installed package carries what it needs, and never reads the repository.

A wheel is built from this checkout (``pip wheel``), installed into a new virtual
environment, and every command a firmware team runs is started from an empty temporary
directory under an audit hook that stops the process the moment anything opens, lists or
runs a path inside the repository (``sys.addaudithook``, PEP 578): the repository is also
dropped from ``sys.path``. So a pass proves the commands read only the installed copy.

Also checked: the wheel and the sdist hold every file of ``airdata.resources.SHARED_FILES``
(the sdist must be able to build the wheel), and a ``vectors/`` folder in the working
directory is not picked up unless named.

Slow (about two minutes: the wheel compiles the four cffi modules). CI runs it.
"""

from __future__ import annotations

import os
import subprocess
import sys
import tarfile
import textwrap
import zipfile
from collections.abc import Iterator
from pathlib import Path

import pytest
from toolchains import need

from airdata import resources

ROOT = Path(__file__).resolve().parents[1]

pytestmark = pytest.mark.slow

# Runs one airdata command with the repository out of reach; exit 97 on any access to it.
_GUARD = textwrap.dedent('''\
    import os, sys

    REPO = sys.argv[1]
    EVENTS = ("open", "os.listdir", "os.scandir", "os.chdir", "os.exec", "os.posix_spawn",
              "os.spawn", "os.system", "subprocess.Popen", "shutil.copyfile", "shutil.copytree")

    def _paths(event, args):
        if event == "subprocess.Popen":        # (executable, args, cwd, env): not env
            args = args[:3]
        for a in args:
            if isinstance(a, (list, tuple)):
                yield from (str(x) for x in a)
            elif isinstance(a, (str, bytes, os.PathLike)):
                yield os.fsdecode(a)

    def hook(event, args):
        if event in EVENTS:
            for p in _paths(event, args):
                if REPO in p:
                    sys.stderr.write(f"GUARD: {event} touched the repository: {p}\\n")
                    sys.stderr.flush()
                    os._exit(97)

    sys.path[:] = [p for p in sys.path if REPO not in p and p not in ("", ".")]
    sys.addaudithook(hook)
    import airdata.cli
    sys.exit(airdata.cli.main(sys.argv[2:]))
    ''')


def _shared_names() -> list[str]:
    """Every file SHARED_FILES names, relative to the data root, from this checkout."""
    names = []
    for folder, patterns in resources.SHARED_FILES:
        for pattern in patterns:
            found = sorted((ROOT / folder).glob(pattern))
            assert found, f"{folder}/{pattern} matches nothing in the checkout"
            names += [str(p.relative_to(ROOT)) for p in found]
    return names


@pytest.fixture(scope="module")
def wheel(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """The wheel of this checkout (pip wheel, no build isolation: no network needed)."""
    out = tmp_path_factory.mktemp("wheel")
    r = subprocess.run([sys.executable, "-m", "pip", "wheel", str(ROOT), "-w", str(out),
                        "--no-deps", "--no-build-isolation", "-q"],
                       capture_output=True, text=True, timeout=900)
    assert r.returncode == 0, r.stdout + r.stderr
    (whl,) = out.glob("airdata-*.whl")
    return whl


@pytest.fixture(scope="module")
def venv(wheel: Path, tmp_path_factory: pytest.TempPathFactory) -> Path:
    """A new virtual environment with the wheel installed (numpy and cffi from the base)."""
    env_dir = tmp_path_factory.mktemp("venv")
    subprocess.run([sys.executable, "-m", "venv", "--system-site-packages", str(env_dir)],
                   check=True, timeout=300)
    r = subprocess.run([str(env_dir / "bin" / "python"), "-m", "pip", "install", "-q",
                        "--no-deps", "--no-index", str(wheel)],
                       capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stdout + r.stderr
    return env_dir


@pytest.fixture()
def empty(tmp_path: Path) -> Iterator[Path]:
    """An empty working directory, with a decoy ``vectors/`` folder that must be ignored."""
    work = tmp_path / "work"
    (work / "vectors").mkdir(parents=True)
    (work / "vectors" / "manifest.json").write_text("{ not a suite")
    yield work


def _env(work: Path) -> dict[str, str]:
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "PYTHONHOME")}
    env["PWD"] = str(work)
    return env


def _run(venv: Path, work: Path, *args: str, timeout: int = 600
         ) -> subprocess.CompletedProcess[str]:
    guard = work.parent / "guard.py"
    guard.write_text(_GUARD)
    r = subprocess.run([str(venv / "bin" / "python"), str(guard), str(ROOT), *args],
                       cwd=work, env=_env(work), capture_output=True, text=True,
                       timeout=timeout)
    assert r.returncode != 97, r.stderr
    return r


def test_wheel_holds_every_shared_file_and_the_compiled_port(wheel: Path) -> None:
    names = set(zipfile.ZipFile(wheel).namelist())
    missing = [n for n in _shared_names() if f"airdata/_share/{n}" not in names]
    assert not missing, missing[:10]
    for mod in ("_cport64", "_cport32", "_cport64_us1976", "_cport32_us1976"):
        assert any(n.startswith(f"airdata/{mod}.") and n.endswith(".so") for n in names), mod
    assert "airdata/portcheck/report.schema.json" in names


def test_sdist_holds_what_the_wheel_is_built_from(tmp_path: Path) -> None:
    r = subprocess.run([sys.executable, "-m", "build", "--sdist", "--no-isolation",
                        "--outdir", str(tmp_path), str(ROOT)],
                       capture_output=True, text=True, timeout=600)
    assert r.returncode == 0, r.stdout[-2000:] + r.stderr[-2000:]
    (sdist,) = tmp_path.glob("airdata-*.tar.gz")
    with tarfile.open(sdist) as tar:
        top = tar.getnames()[0].split("/")[0]
        names = {n[len(top) + 1:] for n in tar.getnames()}
    wanted = [*_shared_names(), "setup.py", "pyproject.toml", "airdata/_cport_build.py",
              "airdata/portcheck/report.schema.json"]
    missing = [n for n in wanted if n not in names]
    assert not missing, missing[:10]
    assert not any(n.endswith((".so", ".o")) for n in names)


def test_installed_package_imports_from_the_environment(venv: Path, empty: Path) -> None:
    r = _run(venv, empty, "vectors", "path")
    assert r.returncode == 0, r.stderr
    assert str(venv) in r.stdout and "_share" in r.stdout
    assert str(ROOT) not in r.stdout


@pytest.mark.parametrize("profile", ["icao", "us1976"])
def test_installed_vectors_verify(venv: Path, empty: Path, profile: str) -> None:
    r = _run(venv, empty, "vectors", "verify", "--profile", profile)
    assert r.returncode == 0, r.stdout[-3000:] + r.stderr[-3000:]
    assert f"profile {profile}" in r.stdout and "OK" in r.stdout
    assert "_share" in r.stdout


@pytest.mark.parametrize("profile", ["icao", "us1976"])
def test_installed_port_check_both_precisions(venv: Path, empty: Path, profile: str) -> None:
    r = _run(venv, empty, "port", "check", "--profile", profile, "--precision", "both")
    assert r.returncode == 0, r.stdout[-3000:] + r.stderr[-3000:]
    assert "PASS: all 60 implemented function check(s) pass" in r.stdout


def test_installed_evidence_report_carries_the_equation_sources(venv: Path, empty: Path
                                                                ) -> None:
    """The traceability table of the report comes from the installed docs/equations.md."""
    import json

    r = _run(venv, empty, "port", "check", "--only", "pressure_altitude", "--precision",
             "double", "--report", "r.json")
    assert r.returncode == 0, r.stderr
    eqs = json.loads((empty / "r.json").read_text())["equations"]
    assert eqs["ALT-1"]["source"].startswith("USSA 1976"), eqs
    assert eqs["ALT-1"]["c"] == "ad_pressure_altitude"


def test_installed_copies_build_and_run_the_runner(venv: Path, empty: Path) -> None:
    need("make")
    need("cc")  # make's built-in $(CC): the Makefile's "CC ?= gcc" leaves it as it is
    hdr, port = empty / "fw" / "vectors", empty / "fw" / "airdata"
    r = _run(venv, empty, "vectors", "copy", str(hdr))
    assert r.returncode == 0, r.stderr
    assert (hdr / "ad_vectors.h").is_file()
    r = _run(venv, empty, "port", "copy", str(port))
    assert r.returncode == 0, r.stderr
    for rel in ("Makefile", "include/airdata.h", "include/airdata_batch.h", "src/pitot.c",
                "runner/ad_vector_runner.c", "runner/ad_runner_functions.h",
                "tests/driver.c"):
        assert (port / rel).is_file(), rel
    # A second copy refuses, names a file it would overwrite, and writes nothing.
    (port / "src" / "pitot.c").write_text("/* edited by the team */\n")
    r = _run(venv, empty, "port", "copy", str(port))
    assert r.returncode == 1 and "pitot.c exists (pass --force to overwrite)" in r.stderr
    assert (port / "src" / "pitot.c").read_text() == "/* edited by the team */\n"
    r = _run(venv, empty, "port", "copy", str(port), "--force")
    assert r.returncode == 0 and "ad_i_ratio_from_mach" in (port / "src" / "pitot.c").read_text()
    # The copied runner, compiled against the copied headers only, passes every case.
    m = subprocess.run(["make", "-C", str(port), "runner", f"VECTORS={hdr}"],
                       cwd=empty, env=_env(empty), capture_output=True, text=True,
                       timeout=600)
    assert m.returncode == 0, m.stdout[-3000:] + m.stderr[-3000:]
    assert m.stdout.count("30 functions: all passed") == 2
    assert str(ROOT) not in m.stdout


def test_the_guard_stops_a_process_that_reads_the_repository(tmp_path: Path) -> None:
    """The base interpreter imports airdata from this checkout: the guard must stop it."""
    guard = tmp_path / "guard.py"
    guard.write_text(_GUARD)
    r = subprocess.run([sys.executable, str(guard), str(ROOT), "vectors", "path"],
                       cwd=tmp_path, env=_env(tmp_path), capture_output=True, text=True,
                       timeout=120)
    if r.returncode == 0:
        pytest.skip("the base interpreter does not import airdata from this checkout")
    assert r.returncode == 97 and "GUARD:" in r.stderr and str(ROOT) in r.stderr
