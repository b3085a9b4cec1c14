"""The direction of dependency: model, mechanics and codes load no plotting, CLI or pint."""

from __future__ import annotations

import subprocess
import sys

import pytest

PROBE = """
import sys
import plyshear
from plyshear.model import catalog, modelfile
from plyshear.mechanics import assembly, beam, bearing, loadpath, solve
from plyshear.codes import aisc360, en1993_1_8
joint = modelfile.loads(open(sys.argv[1]).read())
plyshear.solve(joint)
print(",".join(m for m in ("matplotlib", "click", "pint") if m in sys.modules))
"""


@pytest.mark.parametrize("model", ["gusset-three-members.toml"])
def test_core_imports_no_matplotlib_click_or_pint(model: str) -> None:
    from tests.conftest import MODELS

    out = subprocess.run(
        [sys.executable, "-c", PROBE, str(MODELS / model)],
        capture_output=True,
        text=True,
        check=True,
        timeout=120,
    )
    assert out.stdout.strip() == ""


def test_help_does_not_load_scipy_or_matplotlib() -> None:
    code = (
        "import sys\nfrom plyshear.cli import main\n"
        "try:\n    main(['--help'])\nexcept SystemExit:\n    pass\n"
        "print('loaded:' + ','.join(m for m in ('scipy', 'matplotlib', 'pint') "
        "if m in sys.modules))"
    )
    out = subprocess.run(
        [sys.executable, "-c", code], capture_output=True, text=True, check=True, timeout=120
    )
    assert out.stdout.strip().splitlines()[-1] == "loaded:"


def test_solve_command_loads_only_what_a_solve_uses() -> None:
    # networkx (the graph functions), scipy.optimize (the collapse LP), matplotlib
    # (figures) and pint (strings with units) are imported where they are used
    from tests.conftest import MODELS

    code = (
        "import sys\nfrom plyshear.cli import main\n"
        f"try:\n    main(['solve', {str(MODELS / 'fork-four-planes.toml')!r}])\n"
        "except SystemExit:\n    pass\n"
        "print('loaded:' + ','.join(m for m in ('networkx', 'scipy.optimize', "
        "'matplotlib', 'pint') if m in sys.modules))"
    )
    out = subprocess.run(
        [sys.executable, "-c", code], capture_output=True, text=True, check=True, timeout=120
    )
    assert out.stdout.strip().splitlines()[-1] == "loaded:"
