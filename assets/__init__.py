"""Plystack: built-up timber and steel beams.

This root package holds the data files bundled with the program (material library,
fonts, demo projects, icons); the code is in ``plystack.core`` (computation) and
``plystack.app`` (the desktop program).
"""
