"""Widgets of the workbench, one per file."""
