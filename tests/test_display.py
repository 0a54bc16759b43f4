"""Display conversions and the sheet's spec builder.

Conversion checks: NIST Special Publication 811 (2008 ed.), Appendix B.8/B.9 factors
(1 lbf·in = 0.1129848 N·m, 1 psi = 6894.757 Pa, 1 lb/ft = 1.488164 kg/m, 1 in = 25.4 mm exact);
each test states its check value and tolerance.
"""

from __future__ import annotations

import pytest

from workbench.report import display
from workbench.tui.fields import compose_spec, profile_words_tip, split_spec


def test_torque_inch_matches_nist_factor():
    # NIST SP 811 B.9: 1 lbf·in = 0.1129848 N·m; 100 N·m = 885.07 lbf·in, tolerance 0.01 %
    assert display.NM_PER_LBF_IN == pytest.approx(0.1129848, rel=1e-6)
    assert display.torque(100.0, "inch") == "885 lbf·in"
    assert display.torque(100.0, "metric") == "100 N·m"


def test_stress_kpsi_matches_nist_factor():
    # NIST SP 811 B.9: 1 psi = 6894.757 Pa; 530 MPa = 76.87 kpsi, tolerance 1e-6 relative
    assert display.PA_PER_PSI == pytest.approx(6894.757, rel=1e-6)
    assert display.stress(530e6, "inch") == "76.9 kpsi"
    assert display.stress(17.99e6, "metric") == "18.0 MPa"


def test_mass_and_twist_per_length():
    # NIST SP 811 B.9: 1 lb/ft = 1.488164 kg/m (tolerance 1e-6 rel); 1 ft = 0.3048 m exact
    assert display.KG_PER_M_PER_LB_PER_FT == pytest.approx(1.488164, rel=1e-6)
    assert display.mass_per_length(12.56, "inch") == "8.44 lb/ft"
    assert display.twist(1.0, "inch") == "0.305 °/ft"
    assert display.length(0.0254, "inch") == "1.00 in"
    assert display.length(0.04, "metric") == "40.0 mm"


def test_verdict_reads_without_colour():
    assert display.verdict("pass") == "✓ PASS"
    assert display.verdict("marginal") == "▲ MARGINAL"
    assert display.verdict("fail") == "✗ FAIL"


@pytest.mark.parametrize(
    ("sf", "expected"),
    [(0.75, "███░░░┃░░░░░"), (1.5, "██████┃░░░░░"), (3.0, "██████┃█████"), (9.0, "██████┃████▶")],
)
def test_margin_gauge_marks_the_requirement(sf, expected):
    # scale 0 … 2 × required (3.0), 12 cells, ┃ at the required safety factor (cell 6)
    assert display.margin_gauge(sf, 1.5, 12) == expected


def test_number_and_factor_edge_cases():
    assert display.number(None) == "—"
    assert display.number(float("inf")) == "∞"
    assert display.factor(float("inf")) == "∞"
    assert display.number(0.0123) == "0.0123"


@pytest.mark.parametrize(
    ("parts", "spec"),
    [
        (("round", "40", "", "keyed", "machined"), "round 40mm keyed"),
        (("square", "40", "", "keyed", "machined"), "square 40mm keyed"),  # keyseat in the turned seat (issue 8)
        (("tube", "60", "50", "plain", "ground"), "tube 60mm/50mm ground"),
        (("flat", "50", "20", "plain", "machined"), "flat 50mm x 20mm"),
        (("round", "1-1/4in", "", "plain", "machined"), "round 1-1/4in"),
        (("hex", "hex 27mm sharp-shoulder", "", "plain", "machined"), "hex 27mm sharp-shoulder"),
        (("round", "", "", "keyed", "machined"), ""),
        # shape words typed after the size (ground flats, corner radius, chamfer; bare = mm)
        (("round", "40 d-flat 2", "", "plain", "machined"), "round 40mm d-flat 2mm"),
        (("round", "40 double-d 2.5mm", "", "plain", "ground"), "round 40mm double-d 2.5mm ground"),
        (("square", "40 radius 3", "", "plain", "machined"), "square 40mm radius 3mm"),
        (("flat", "50 chamfer 2", "20", "plain", "machined"), "flat 50mm x 20mm chamfer 2mm"),
    ],
)
def test_compose_spec(parts, spec):
    assert compose_spec(*parts) == spec


@pytest.mark.parametrize(
    "spec",
    [
        "round 40mm keyed",
        "tube 60mm/50mm ground",
        "flat 50mm x 20mm",
        "square 1-1/4in",
        "round 25mm d-flat 2mm",
        "square 30mm chamfer 2mm hot-rolled",
        "flat 50mm x 20mm radius 3mm ground",
    ],
)
def test_split_then_compose_round_trips(spec):
    parts = split_spec(spec)
    assert parts is not None
    assert compose_spec(*(parts[k] for k in ("profile", "size", "second", "keyseat", "finish"))) == spec


def test_split_spec_keeps_words_it_has_no_field_for():
    assert split_spec("hex 27mm sharp-shoulder") is None
    assert split_spec("oval 30mm") is None


def test_profile_words_ride_in_the_size_field():
    parts = split_spec("square 30mm radius 3mm ground")
    assert parts == {"profile": "square", "size": "30 radius 3mm", "second": "", "keyseat": "plain",
                     "finish": "ground"}
    assert "d-flat" in profile_words_tip("round") and "chamfer" in profile_words_tip("flat")
    assert profile_words_tip("hex") == "" and profile_words_tip("tube") == ""
