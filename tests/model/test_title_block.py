"""The title block's top-level keys: free text (a TOML date for `date`), optional."""

from __future__ import annotations

import pytest

from plyshear.model import modelfile
from tests.conftest import MODELS

SOURCE = (MODELS / "fork-four-planes.toml").read_text(encoding="utf-8")


def test_title_block_keys_are_read() -> None:
    joint = modelfile.loads('job = "J-1"\nchecked_by = "B. C."\ndate = 2026-12-01\n' + SOURCE)
    assert joint.title_block.job == "J-1"
    assert joint.title_block.checked_by == "B. C."
    assert joint.title_block.date == "2026-12-01"  # the TOML date, as YYYY-MM-DD
    assert joint.title_block.revision == ""  # absent: a blank box


def test_a_title_block_key_that_is_not_text_names_the_key() -> None:
    with pytest.raises(modelfile.ModelError, match="revision: must be a string"):
        modelfile.loads("revision = 3\n" + SOURCE, "calc.toml")
