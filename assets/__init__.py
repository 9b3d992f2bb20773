"""Data files bundled with Plystack: material library, fonts, demo projects, icons."""
