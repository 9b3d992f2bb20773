"""Plain frozen data: units, named problems, materials, plies, the member, design choices
and the project.
"""
