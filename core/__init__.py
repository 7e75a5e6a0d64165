"""Towboard's engineering core: hulls, tugs, forces, conditions, solving and the plan.

Everything here works in SI magnitudes (N, m, N*m, kg, rad) in the hull frame
(x forward, y to port, yaw moment positive counter-clockwise seen from above).
Nothing here imports Qt.
"""

import os as _os

from threadpoolctl import threadpool_limits as _threadpool_limits

# The core's linear algebra is many small products (half-spaces x directions, three
# rows deep): a threaded BLAS gains nothing there and, on a machine whose cores are
# busy, its threads wait on each other (the hold limits sweep at 200 tugs ran 2-3x
# slower with OpenBLAS's own threads than with one, on 2 busy cores). So one thread,
# unless the user has set OPENBLAS_NUM_THREADS. numpy is loaded first so that the
# limit holds whatever imported numpy before the core.
if "OPENBLAS_NUM_THREADS" not in _os.environ:
    import numpy as _numpy  # noqa: F401  (loads the BLAS the limit applies to)

    _threadpool_limits(1, user_api="blas")
