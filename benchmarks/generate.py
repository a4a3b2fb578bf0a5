"""Write a synthetic machine catalog of any size (seeded), for benchmarks.

    python benchmarks/generate.py 10000 > big.toml
"""

from __future__ import annotations

import random
import sys

KW_SIZES = (0.75, 1.1, 1.5, 2.2, 3, 4, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 160)
HP_SIZES = (1, 2, 3, 5, 7.5, 10, 15, 20, 25, 30, 40, 50, 60, 75, 100, 125, 150, 200)


def _machine(rng: random.Random, index: int) -> str:
    poles = rng.choice((2, 4, 4, 4, 6, 8))
    lines = ["[[machine]]", f'id = "SYN-{index:06d}"', f'description = "synthetic machine {index}"']
    kind = rng.random()
    if kind < 0.04:
        lines += ['kind = "synchronous-generator"', "poles = 4"]
        f = rng.choice((50, 60))
        volts = 400 if f == 50 else 480
        lines += ["  [[machine.rating]]", f'  frequency = "{f} Hz"', f'  voltage = "{volts} V"',
                  f'  power = "{rng.choice((100, 250, 500, 800))} kVA"', "  power_factor = 0.8"]
        return "\n".join(lines)
    sync = kind < 0.07
    if sync:
        lines += ['kind = "synchronous-motor"', f"poles = {poles}"]
    if rng.random() < 0.3:
        lines.append(f'efficiency_class = "{rng.choice(("IE2", "IE3", "IE4"))}"')
    if rng.random() < 0.3:
        lines.append(f'code_letter = "{rng.choice("FGHJ")}"')
    iec = rng.random() < 0.55
    f = 50 if iec else 60
    n_s = 120 * f / poles
    speed = n_s if sync else n_s * (1 - rng.uniform(0.01, 0.05))
    if iec:
        kw = rng.choice(KW_SIZES)
        power = f'"{kw} kW"'
        volts, conn = (["400 V", "690 V"], ["delta", "star"]) if kw >= 4 else (
            ["230 V", "400 V"], ["delta", "star"])
    else:
        hp = rng.choice(HP_SIZES)
        kw = hp * 0.7457
        power = f'"{hp} hp"'
        volts, conn = (["230 V", "460 V"], ["low", "high"]) if rng.random() < 0.5 else (["460 V"], None)
    eta = min(0.97, 0.80 + 0.03 * (kw ** 0.25))
    pf = 0.82 + rng.uniform(0, 0.06)
    currents = [f'"{kw * 1000 / (3 ** 0.5 * float(v.split()[0]) * eta * pf):.1f} A"' for v in volts]
    lines += ["  [[machine.rating]]", f'  frequency = "{f} Hz"',
              "  voltage = [" + ", ".join(f'"{v}"' for v in volts) + "]",
              "  current = [" + ", ".join(currents) + "]", f"  power = {power}",
              f'  speed = "{speed:.0f} rpm"', f"  power_factor = {pf:.2f}",
              f'  efficiency = "{100 * eta:.1f} %"']
    if conn:
        lines.append("  connection = [" + ", ".join(f'"{c}"' for c in conn) + "]")
    if rng.random() < 0.5:
        load_type = rng.choice(("centrifugal", "centrifugal", "constant-torque"))
        lines += ["  [machine.load]", f'  type = "{load_type}"',
                  f'  power = "{kw * rng.uniform(0.5, 0.95):.2f} kW"']
    return "\n".join(lines)


def catalog(count: int, seed: int = 7) -> str:
    rng = random.Random(seed)
    parts = ['[catalog]\ntitle = "synthetic benchmark fleet"']
    parts += [_machine(rng, i) for i in range(count)]
    return "\n\n".join(parts) + "\n"


SITES = """
[[site]]
id = "bench-50"
frequency = "50 Hz"
voltage = "400 V"
standard = "IEC"
altitude = "1200 m"

[[site]]
id = "bench-60"
frequency = "60 Hz"
voltage = "480 V"
standard = "NEMA"
unbalance = "1.5 %"

[[site]]
id = "bench-208"
frequency = "60 Hz"
voltage = "208 V"
standard = "NEMA"
"""


if __name__ == "__main__":
    sys.stdout.write(catalog(int(sys.argv[1]) if len(sys.argv) > 1 else 1000))
