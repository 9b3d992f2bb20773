"""Fabrication data of the steel plates: each plate's size and bolt holes (``plates``), its
drawing as a DXF file (``drawing``), the cut list (``cut_list``) and the files of
``plystack plates`` written together (``export``).
"""
