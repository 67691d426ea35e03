"""Analysis: closed-form beam cases, 2D frame solver, diagrams and serviceability checks."""

__all__: list[str] = []
