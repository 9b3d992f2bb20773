"""Shared test set-up: Qt runs offscreen; no shared mutable fixtures."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("MPLBACKEND", "Agg")
