"""How result numbers are shown: metric or inch, with the unit beside every figure.

The result dicts carry SI floats; this module turns them into short strings for the screens.
It is display only (inputs accept either system anywhere; parsing lives in ``workbench.units``).
Conversion factors are the exact definitions of NIST SP 811 (2008), Appendix B.8/B.9:
1 in = 0.0254 m, 1 lbf = 4.4482216152605 N, 1 lb = 0.45359237 kg, 1 ft = 0.3048 m.
"""

from __future__ import annotations

import math

SYSTEMS = ("metric", "inch")

M_PER_IN = 0.0254
N_PER_LBF = 4.4482216152605
NM_PER_LBF_IN = N_PER_LBF * M_PER_IN  # 0.112984829...
PA_PER_PSI = N_PER_LBF / M_PER_IN**2  # 6894.757...
KG_PER_M_PER_LB_PER_FT = 0.45359237 / 0.3048  # 1.488163943...
M_PER_FT = 0.3048


def number(value: float | None, digits: int = 3) -> str:
    """A compact number with about ``digits`` significant figures; "—" for missing, "∞" for inf."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "—"
    if math.isinf(value):
        return "∞" if value > 0 else "-∞"
    magnitude = abs(value)
    if magnitude >= 10 ** (digits - 1) or magnitude == 0:
        return f"{value:.0f}"
    decimals = max(0, digits - 1 - int(math.floor(math.log10(magnitude))))
    return f"{value:.{decimals}f}"


def journal_limit(journal_m: float | None, system: str) -> str:
    """The largest journal a bar gives, rounded DOWN (0.01 mm / 0.0001 in): it is an upper limit."""
    if journal_m is None:
        return "—"
    if system == "inch":
        return f"{math.floor(journal_m / 0.0254 * 1e4 + 1e-6) / 1e4:.4f} in"
    return f"{math.floor(journal_m * 1e5 + 1e-6) / 100:.2f} mm"


def torque(torque_Nm: float | None, system: str) -> str:
    """Torque as ``N·m`` (metric) or ``lbf·in`` (inch)."""
    if torque_Nm is None:
        return "—"
    if system == "inch":
        return f"{number(torque_Nm / NM_PER_LBF_IN)} lbf·in"
    return f"{number(torque_Nm)} N·m"


def stress(stress_Pa: float | None, system: str) -> str:
    """Stress as ``MPa`` (metric) or ``kpsi`` (inch)."""
    if stress_Pa is None:
        return "—"
    if system == "inch":
        return f"{number(stress_Pa / PA_PER_PSI / 1000.0)} kpsi"
    return f"{number(stress_Pa / 1e6)} MPa"


def length(length_m: float | None, system: str) -> str:
    """A length (shaft size, overhang) as ``mm`` or ``in``."""
    if length_m is None:
        return "—"
    if system == "inch":
        return f"{number(length_m / M_PER_IN)} in"
    return f"{number(length_m * 1000.0)} mm"


def twist(twist_deg_per_m: float | None, system: str) -> str:
    """Angle of twist per length as ``°/m`` or ``°/ft``."""
    if twist_deg_per_m is None:
        return "—"
    if system == "inch":
        return f"{number(twist_deg_per_m * M_PER_FT)} °/ft"
    return f"{number(twist_deg_per_m)} °/m"


def mass_per_length(mass_kg_per_m: float | None, system: str) -> str:
    """Bar mass per length as ``kg/m`` or ``lb/ft``."""
    if mass_kg_per_m is None:
        return "—"
    if system == "inch":
        return f"{number(mass_kg_per_m / KG_PER_M_PER_LB_PER_FT)} lb/ft"
    return f"{number(mass_kg_per_m)} kg/m"


def force(force_N: float | None, system: str) -> str:
    """A force (side load) as ``N``/``kN`` or ``lbf``."""
    if force_N is None:
        return "—"
    if system == "inch":
        return f"{number(force_N / N_PER_LBF)} lbf"
    if abs(force_N) >= 10000:
        return f"{number(force_N / 1000.0)} kN"
    return f"{number(force_N)} N"


def factor(value: float | None) -> str:
    """A dimensionless factor or ratio, two decimals (safety factors are read to 0.01)."""
    if value is None:
        return "—"
    if math.isinf(value):
        return "∞"
    if abs(value) >= 100:
        return f"{value:.0f}"
    return f"{value:.2f}"


VERDICT_MARKS = {"pass": "✓ PASS", "marginal": "▲ MARGINAL", "fail": "✗ FAIL"}


def verdict(word: str | None) -> str:
    """The verdict as symbol + word, so it reads without colour."""
    if not word:
        return "· —"
    return VERDICT_MARKS.get(word, f"? {word.upper()}")


def margin_gauge(safety_factor: float | None, required_sf: float, width: int = 12) -> str:
    """A text bar of ``safety_factor`` on a scale 0 … 2 × ``required_sf``; ``┃`` marks the requirement.

    Filled cells are ``█``, empty ones ``░`` so the bar reads with NO_COLOR; a bar longer than the
    scale ends in ``▶``.
    """
    width = max(4, width)
    mark = width // 2
    if safety_factor is None or required_sf <= 0:
        cells = ["·"] * width
        cells[mark] = "┃"
        return "".join(cells)
    scale = 2.0 * required_sf
    filled = 0 if safety_factor <= 0 else min(width, int(round(safety_factor / scale * width)))
    cells = ["█" if i < filled else "░" for i in range(width)]
    cells[mark] = "┃"
    if safety_factor > scale:
        cells[-1] = "▶"
    return "".join(cells)
