"""``python -m app`` is the ``towboard`` command."""

import sys

from app.cli import main

sys.exit(main())
