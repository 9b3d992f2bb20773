"""Plystack core: everything that computes. Never imports Qt or matplotlib.

Layers, lowest first (each imports only those below it): model, codes, section, actions,
design, pipeline, study, io, report, cli. See DEVELOPERS.md.
"""

#: The version (the one place it is written: pyproject.toml reads it from here, and
#: `plystack --version`, the sheets and the schedule print it).
__version__ = "0.1.0"
