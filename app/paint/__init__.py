"""One way to paint the plan, shared by the board and the printed briefing: the palette,
the tug shape, the arrows and the ring steps."""
