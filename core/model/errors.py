"""Named problems: every user-facing error says which field and what is wrong."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Problem:
    """One problem with the input.

    Attributes:
        path: where it is, e.g. ``plies[2].height`` (empty for the whole project).
        message: what is wrong, in plain words.

    """

    path: str
    message: str

    def __str__(self) -> str:
        return f"{self.path}: {self.message}" if self.path else self.message


@dataclass(frozen=True)
class MissingCheck(Problem):
    """A check that the design basis requires but that could not be made (the verdict is
    then INCOMPLETE, never OK); ``path`` names the field that would make it possible.
    """


class ProjectError(ValueError):
    """Input that cannot be analysed; carries one :class:`Problem` per fault."""

    def __init__(self, problems: list[Problem] | Problem | str):
        if isinstance(problems, str):
            problems = [Problem("", problems)]
        elif isinstance(problems, Problem):
            problems = [problems]
        self.problems: list[Problem] = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))
