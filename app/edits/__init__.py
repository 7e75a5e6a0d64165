"""Edits of the project value, as pure functions (no Qt): each returns a new project."""
