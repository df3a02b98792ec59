"""The cautions every output carries (DESIGN.md, "Cautions")."""

from __future__ import annotations

__all__ = ["MECHANIC_CAUTION", "PILOT_CAUTION"]

PILOT_CAUTION = (
    "Advisory computation only. The aircraft's approved flight manual and its current "
    "weight-and-balance record govern; the pilot in command is responsible for the "
    "loading and decides whether to fly."
)

MECHANIC_CAUTION = (
    "Advisory computation only. The aircraft's approved flight manual and its current "
    "weight-and-balance record govern; a weight-and-balance record is made and signed "
    "under the local aviation authority's rules and by appropriately licensed persons."
)
