"""What the encoder and the decoder of the ``.towboard`` format share.

Every quantity in the file is a plain number in the unit its key names
(``bollard_pull_kN``, ``outline_m``, ``lead_deg``); directions people read are
bearings in degrees clockwise (relative to the hull, or true for headings and
conditions). docs/file-format.md describes the format.
"""

from __future__ import annotations

from typing import Any

from core.units import DisplayUnits, factor, filed

FORMAT_NAME = "towboard"


FORMAT_VERSION = 1


KN = 1000.0


KNOT = factor("speed", "kn")


Json = dict[str, Any]

#: The units the file's numbers are in, as display units: problems with a file's numbers
#: are phrased in these (``"-5.0 kN must be at least 0.980665 kN"``), whatever the user shows on screen.
FILE_UNITS = DisplayUnits(force="kN", moment="kN*m", length="m", speed="kn")

#: A tug's keys: those it must have, and those it may have.
TUG_REQUIRED = ("name", "bollard_pull_kN")
TUG_OPTIONAL = (
    "type",
    "role",
    "astern_pull_kN",
    "towing_point_height_m",
    "certificate_date",
    "towline_length_m",
    "towline_mbl_kN",
    "call_sign",
    "working_channel",
    "towline_warning_share_of_mbl",
    "capability",
    "headway",
)
#: A placement's keys (one of a stage's ``tugs``): those it must have, those it may have.
PLACEMENT_REQUIRED = ("tug", "hull", "point", "setting_percent")
PLACEMENT_OPTIONAL = (
    "lead_deg",
    "line_length_m",
    "push_angle_deg",
    "astern",
    "lead_sector_deg",
    "push_pull",
)


#: A number as the file writes it: 12 significant digits (core.units.filed).
num = filed
