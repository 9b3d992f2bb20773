"""Plain-text tables of the command line: each column as wide as its widest text, so no
text is cut and no row is pushed out of line.
"""

from __future__ import annotations

from collections.abc import Sequence


def text_table(header: Sequence[str], rows: Sequence[Sequence[str]],
               right: frozenset[int] = frozenset(), gap: int = 2) -> list[str]:
    """The lines of a table: ``header`` and ``rows`` (texts), the columns whose index is
    in ``right`` aligned right, the others left, ``gap`` spaces between columns.
    """
    widths = [max([len(header[k])] + [len(r[k]) for r in rows]) for k in range(len(header))]

    def line(cells: Sequence[str]) -> str:
        parts = [c.rjust(w) if k in right else c.ljust(w)
                 for k, (c, w) in enumerate(zip(cells, widths, strict=True))]
        return (" " * gap).join(parts).rstrip()

    return [line(header), *(line(r) for r in rows)]
