"""Beam actions: the direct-stiffness solver, load combinations, creep, results per combination."""
