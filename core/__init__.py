"""Plystack core: everything that computes. Never imports Qt or matplotlib."""

__version__ = "0.1.0"
