"""The Shaftbench terminal workbench (Textual).

Only :func:`workbench.tui.app.run` is public. Nothing here is imported by ``workbench.core``; the
calculation is reached through the job contract in :mod:`workbench.job` (see ``engine.py``).
"""
