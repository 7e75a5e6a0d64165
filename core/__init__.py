"""Towboard's engineering core: hulls, tugs, forces, conditions, solving and the plan.

Everything here works in SI magnitudes (N, m, N*m, kg, rad) in the hull frame
(x forward, y to port, yaw moment positive counter-clockwise seen from above).
Nothing here imports Qt.
"""
