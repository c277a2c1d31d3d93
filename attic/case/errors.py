"""The one error a wrong case file raises: it names the key path, the value and what is allowed."""

from __future__ import annotations

from typing import TYPE_CHECKING

if TYPE_CHECKING:
    pass




class CaseError(ValueError):
    """A case file that cannot be used; the message names the key path, the value and what is allowed."""

    def __init__(self, path, message, source=None):
        self.path = path
        self.source = source
        super().__init__(message)

    def __str__(self):
        where = f"{self.source}: " if self.source else ""
        return f"{where}{self.path}: {self.args[0]}" if self.path else f"{where}{self.args[0]}"


