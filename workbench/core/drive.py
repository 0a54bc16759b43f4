"""Drive -> torque: from the motor nameplate (or a given torque) to the torques the shaft must carry.

All values SI: power [W], speed [rpm], torque [N*m].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

SECONDS_PER_MINUTE = 60.0


def angular_speed_rad_s(speed_rpm: float) -> float:
    """Angular speed omega [rad/s] of a shaft turning at ``speed_rpm`` [rev/min]: omega = 2 pi n / 60."""
    return 2.0 * math.pi * speed_rpm / SECONDS_PER_MINUTE


def torque_from_power_Nm(power_W: float, speed_rpm: float) -> float:
    """Torque T [N*m] transmitted by power P [W] at speed n [rpm]: T = P / omega.

    Source: definition of power in rotation, P = T omega (Shigley's Mechanical Engineering Design,
    9th ed., Sec. 3-8, Eq. 3-40/3-42). Trade forms: T[N m] = 9549 P[kW] / n[rpm];
    T[lbf in] = 63025 H[hp] / n[rpm].
    """
    return power_W / angular_speed_rad_s(speed_rpm)


def shaft_speed_rpm(motor_speed_rpm: float, ratio: float) -> float:
    """Speed of the driven shaft [rpm] behind a reduction ``ratio`` (motor speed / shaft speed)."""
    return motor_speed_rpm / ratio


@dataclass(frozen=True)
class DriveLoads:
    """The torques at the checked shaft.

    running_torque_Nm: steady torque at rated power (after ratio and efficiency)
    design_torque_Nm:  running torque x service factor (fatigue and twist checks use this)
    peak_torque_Nm:    running torque x start/peak factor (checked for static yield on its own)
    """

    power_W: float | None
    motor_speed_rpm: float | None
    shaft_speed_rpm: float | None
    ratio: float
    efficiency: float
    service_factor: float
    peak_factor: float
    running_torque_Nm: float
    design_torque_Nm: float
    peak_torque_Nm: float

    @property
    def static_torque_Nm(self) -> float:
        """The torque static yield is checked at: the larger of peak and design torque [N*m]
        (a service factor above the start factor must not leave static below the design torque)."""
        return max(self.peak_torque_Nm, self.design_torque_Nm)


def drive_loads(
    *,
    power_W: float | None = None,
    motor_speed_rpm: float | None = None,
    torque_Nm: float | None = None,
    ratio: float = 1.0,
    efficiency: float = 1.0,
    service_factor: float = 1.0,
    peak_factor: float = 2.0,
) -> DriveLoads:
    """Running, design and peak torque at the shaft.

    With power and motor speed: shaft speed = motor speed / ratio; shaft torque =
    efficiency x P / omega_shaft (the shaft receives the power left after the drive's losses).
    With ``torque_Nm`` given directly, it is taken as the running torque at the shaft (ratio and
    efficiency then only set the shaft speed when a motor speed is also known).
    Design torque = running x service factor; peak torque = running x peak factor.
    Sources: T = P/omega (Shigley 9th ed., Eq. 3-40); service factor as applied to the nominal
    torque (AGMA 6010-E88 practice, reproduced in reducer catalogues); a start/peak multiple of
    full-load torque (NEMA MG 10 design B locked-rotor torque 70-275 %, EASA handbook).
    """
    speed = shaft_speed_rpm(motor_speed_rpm, ratio) if motor_speed_rpm else None
    if torque_Nm is None:
        if power_W is None or speed is None:
            raise ValueError("power and speed, or a torque, are needed")
        running = efficiency * torque_from_power_Nm(power_W, speed)
    else:
        running = torque_Nm
    return DriveLoads(
        power_W=power_W,
        motor_speed_rpm=motor_speed_rpm,
        shaft_speed_rpm=speed,
        ratio=ratio,
        efficiency=efficiency,
        service_factor=service_factor,
        peak_factor=peak_factor,
        running_torque_Nm=running,
        design_torque_Nm=running * service_factor,
        peak_torque_Nm=running * peak_factor,
    )
