"""Drawings in and out: pictures of the board and the stage diagram, headless commands."""
