"""Saves that respect the file: permission bits kept, symbolic links written through, a new
file made as the user's umask says, nothing half-written."""

from __future__ import annotations

import os
import stat
from collections.abc import Iterator
from pathlib import Path

import pytest

from core.io.projectfile import backup_path, current_umask, load, save, write_atomic
from tests.conftest import SAMPLES

SAMPLE = SAMPLES / "deck_barge_unberth.towboard"

pytestmark = pytest.mark.skipif(os.name != "posix", reason="POSIX permission bits")


def _mode(path: Path) -> int:
    return stat.S_IMODE(os.stat(path).st_mode)


@pytest.fixture
def umask_027() -> Iterator[None]:
    old = os.umask(0o027)
    try:
        yield
    finally:
        os.umask(old)


def test_the_umask_is_read_without_changing_it(umask_027: None) -> None:
    assert current_umask() == 0o027
    assert current_umask() == 0o027


def test_a_new_file_gets_the_users_umask(tmp_path: Path, umask_027: None) -> None:
    out = save(load(SAMPLE), tmp_path / "new.towboard")
    assert _mode(out) == 0o640  # 0666 less the umask 027, as open() would make it


@pytest.mark.parametrize("bits", [0o644, 0o640, 0o600, 0o664, 0o444])
def test_a_save_keeps_the_old_files_permission_bits(tmp_path: Path, bits: int) -> None:
    path = tmp_path / "plan.towboard"
    project = load(SAMPLE)
    save(project, path)
    os.chmod(path, bits)
    save(project.with_units(project.units.with_unit("force", "kN")), path)
    assert _mode(path) == bits
    assert _mode(backup_path(path)) == bits  # the backup is the old file, bits and all
    assert load(path).units.force == "kN"


def test_a_save_through_a_symbolic_link_writes_its_target(tmp_path: Path) -> None:
    shared = tmp_path / "shared"
    shared.mkdir()
    target = shared / "plan.towboard"
    project = load(SAMPLE)
    save(project, target)
    os.chmod(target, 0o664)
    link = tmp_path / "my plan.towboard"
    link.symlink_to(target)
    changed = project.with_units(project.units.with_unit("length", "ft"))
    save(changed, link)
    assert link.is_symlink() and link.resolve() == target.resolve()
    assert load(target).units.length == "ft"
    assert _mode(target) == 0o664
    assert backup_path(target).exists()  # the backup sits beside the real file
    assert load(backup_path(target)).units.length == "m"
    assert not backup_path(link).exists()


def test_a_dangling_link_is_written_through_to_a_new_target(tmp_path: Path) -> None:
    target = tmp_path / "real.towboard"
    link = tmp_path / "link.towboard"
    link.symlink_to(target)
    save(load(SAMPLE), link)
    assert link.is_symlink() and target.is_file()
    assert load(link) == load(SAMPLE)


def test_write_atomic_can_make_a_private_file(tmp_path: Path) -> None:
    path = tmp_path / "secret.json"
    write_atomic(path, b"{}", 0o600)
    assert _mode(path) == 0o600
    write_atomic(path, b"[]")  # and the next write keeps it private
    assert _mode(path) == 0o600


def test_a_file_name_with_a_nul_character_is_refused_with_a_message(tmp_path: Path) -> None:
    # Python refuses such a name with a ValueError, which no caller catches; the project
    # gives the OSError its writers and readers already turn into a message, and no file.
    from core.errors import DrawingError, ProjectFileError
    from core.io.dxf_geometry import Drawing
    from core.io.tables import write_csv

    project = load(sorted(SAMPLES.glob("*.towboard"))[0])
    bad = tmp_path / "plan\x00b.towboard"
    with pytest.raises(ProjectFileError) as e:
        save(project, bad)
    said = str(e.value)
    assert "plan\\0b.towboard" in said and "\x00" not in said  # shown as \0, never itself
    assert "cannot be written: a file name cannot hold a NUL character" in said
    with pytest.raises(ProjectFileError, match="cannot be read: a file name cannot hold a NUL"):
        load(bad)
    with pytest.raises(OSError, match="a file name cannot hold a NUL character"):
        write_csv(tmp_path / "t\x00.csv", [["a", "b"]])
    with pytest.raises(OSError, match="a file name cannot hold a NUL character"):
        write_atomic(tmp_path / "x\x00", b"data")
    with pytest.raises(DrawingError, match="cannot be read: a file name cannot hold a NUL"):
        Drawing.open(tmp_path / "d\x00.dxf")
    assert list(tmp_path.iterdir()) == []  # nothing written, no temporary file left
