"""Towboard's Qt program: the board, the panels and the briefing, over ``core``."""
