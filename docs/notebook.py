"""plyshear in a notebook: paste these cells into Jupyter (CI runs this file as a script).

In Jupyter, a solution, a check result or a capacity summary left as the last
line of a cell shows itself as tables (a solution also with its shear and moment
diagram, inline SVG). ``to_frame()`` gives pandas DataFrames (``pip install
'plyshear[pandas]'``), in the model's units.
"""

# %% Load and solve the demo's fork (the examples ship inside the package)
from importlib import resources

import plyshear

with resources.as_file(resources.files("plyshear") / "models" / "fork-four-planes.toml") as p:
    joint = plyshear.load_model(p)
sol = plyshear.solve(joint)
sol  # noqa: B018 -- in Jupyter: the plane shears, ply bearings and the diagram

# %% The plane shears as a DataFrame: the worst plane against the equal split
planes = sol.to_frame()  # also sol.to_frame("plies"), sol.to_frame("members")
worst = planes.loc[planes["shear"].idxmax()]
equal = 250 / 4  # kN: the hanger's load over four planes
print(f"worst plane {worst['index']}: {worst['shear']:.1f} kN = {worst['shear'] / equal:.2f} "
      "x the equal split")

# %% The check: every item, the governing one marked
res = plyshear.check(joint, sol)
items = res.to_frame()
print(items.sort_values("utilization", ascending=False)[["what", "where", "utilization"]]
      .head(3).to_string(index=False))
res  # noqa: B018 -- in Jupyter: the check table

# %% Many variants at once: the plane shears as the middle leg thickens
rows = []
for t in (16, 20, 24):
    variant = joint.with_ply(2, thickness=float(t))
    frame = plyshear.solve(variant).to_frame()
    rows.append((t, frame["shear"].max()))
for t, v in rows:
    print(f"middle leg {t} mm: worst plane {v:.1f} kN")
