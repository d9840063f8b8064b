#!/usr/bin/env python3
"""Writes events.csv: an INVENTED quadruped trial (no real animal), walk then trot, 120 fps.

Walk: 1.0 s strides, duty factor 0.65, touchdowns LH 0, LF 0.25, RH 0.5, RF 0.75 of the stride.
Trot: 0.6 s strides, duty factor 0.40, diagonal pairs LH+RF at 0 and RH+LF at 0.5.
Each touchdown gets a seeded jitter of -1..+1 frame. Lift-off = touchdown + duty factor x the
limb's own cycle, so every limb keeps touchdown < lift-off < next touchdown.
"""
import random

FPS = 120
WALK = {"stride_s": 1.0, "df": 0.65, "phase": {"LH": 0.0, "LF": 0.25, "RH": 0.5, "RF": 0.75}}
TROT = {"stride_s": 0.6, "df": 0.40, "phase": {"LH": 0.0, "RF": 0.0, "RH": 0.5, "LF": 0.5}}
SCHEDULE = [WALK] * 6 + [TROT] * 8


def main():
    rng = random.Random(2026)
    start = 30  # frame of the first reference (LH) touchdown
    touchdowns = {limb: [] for limb in ("LF", "RF", "LH", "RH")}
    duty = {limb: [] for limb in touchdowns}
    for gait in SCHEDULE:
        length = round(gait["stride_s"] * FPS)
        for limb, phase in gait["phase"].items():
            jitter = 0 if limb == "LH" else rng.randint(-1, 1)
            touchdowns[limb].append(start + round(phase * length) + jitter)
            duty[limb].append(gait["df"])
        start += length
    rows = []
    for limb, tds in touchdowns.items():
        for k, td in enumerate(tds):
            rows.append((td, limb, "touchdown"))
            if k + 1 < len(tds):
                rows.append((td + round(duty[limb][k] * (tds[k + 1] - td)), limb, "liftoff"))
    rows.sort()
    with open("events.csv", "w", encoding="utf-8") as out:
        out.write("# Invented demo trial made by samples/demo-events/make_events.py (no real animal)\n")
        out.write("# walk (6 strides) then trot (8 strides)\n")
        out.write("# fps: 120\n# limbs: quadruped\n# reference: LH\n")
        out.write("limb,event,frame\n")
        for frame, limb, event in rows:
            out.write(f"{limb},{event},{frame}\n")


if __name__ == "__main__":
    main()
