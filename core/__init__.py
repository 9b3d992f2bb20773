"""Plystack core: everything that computes. Never imports Qt or matplotlib.

Layers, lowest first (each imports only those below it): model, codes, section, actions,
design, pipeline, study, io, report, cli. See DEVELOPERS.md.
"""

from importlib import metadata as _metadata

try:
    #: The version, from the installed distribution's metadata (pyproject.toml).
    __version__ = _metadata.version("plystack")
except _metadata.PackageNotFoundError:  # running from a source tree that is not installed
    __version__ = "0+unknown"
