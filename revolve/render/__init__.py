"""Rendering shared by the command line and the library (pictures for now)."""
