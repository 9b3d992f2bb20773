"""The cross-section: clipping by stacking order, exact polygon moments, the transformed
section, templates.
"""
