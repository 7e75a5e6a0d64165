"""Panels beside the board: balance, tugs, hull and units."""
