"""Loads: wind (ASCE 7-16 ch. 26/29) and load combinations (ASCE 7-16 Sec. 2.3/2.4)."""

__all__: list[str] = []
