"""Shaftbench: bench checks for replacement shafts of motor drives."""

__version__ = "0.1.0"
