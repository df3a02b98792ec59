"""Renderers: they turn results into text, tables, pictures and pages, and compute nothing.

terminal (rich tables), chart (matplotlib, imported only when drawing), sheet (HTML pages),
textplot (a character plot).
"""

__all__: list[str] = []
