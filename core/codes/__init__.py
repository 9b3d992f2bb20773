"""Code-clause functions, one module per standard: NDS 2018 (nds), EN 1995-1-1 (en1995),
dowel-type fasteners (dowels).
"""
