"""The safety cautions printed with every report, job card and workbench help page."""

CAUTIONS = (
    "Lock out and tag out the drive, and prove it dead, before any work on the shaft.",
    "Refit every guard over couplings, belts, chains and shaft ends before the drive is restarted.",
    "These results are a bench check of a like-for-like replacement, not a design approval.",
    "Local codes and a licensed engineer have the last word; consult one for any changed duty, "
    "a safety-critical drive, or a result near its limit.",
)
