"""The one error a wrong case file raises: it names the key path, the value and what is allowed."""

from __future__ import annotations


class CaseError(ValueError):
    """A case file that cannot be used; the message names the key path, the value and what is allowed."""

    def __init__(self, path, message, source=None):
        self.path = path
        self.source = source
        super().__init__(message)

    def __str__(self):
        where = f"{self.source}: " if self.source else ""
        return f"{where}{self.path}: {self.args[0]}" if self.path else f"{where}{self.args[0]}"

    def __reduce__(self):  # whole across processes (sweep --jobs): an exception pickles by its args alone
        return (type(self), (self.path, self.args[0], self.source))


class CombinationError(CaseError):
    """Values each allowed alone that cannot go together (say, supply air no colder than the room). A study
    (sweep, pick) lists such a point as failed, with this message, and solves the others; a single case stops."""
