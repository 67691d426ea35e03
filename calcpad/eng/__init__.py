"""Engineering knowledge: sections, materials, loads, analysis and checks (adds steps to sheets)."""

__all__: list[str] = []
