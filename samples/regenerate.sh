#!/usr/bin/env bash
# Regenerates the demo samples with our own synthetic generator (`stridemark synth`).
# Usage: samples/regenerate.sh [path/to/stridemark]   (default: build/ci/app/stridemark)
# Same arguments and seed -> the same events CSV byte for byte (checked by synth_samples_test).
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
bin="${1:-${STRIDEMARK:-$here/../build/ci/app/stridemark}}"
if [[ ! -x "$bin" ]]; then
  echo "regenerate.sh: no stridemark binary at '$bin'; build it first or pass its path" >&2
  exit 1
fi

"$bin" synth --out "$here/dog-rehab-treadmill" \
  --limbs quadruped --feet paw --scene treadmill \
  --gait walk:4 --gait trot:4 \
  --capture-fps 120 --size 640x360 --leg-length 0.55 --seed 11 --noise 2 --x264-preset veryfast \
  --subject "Demo dog (invented)" --species "dog (synthetic)" --condition "rehab follow-up, treadmill" \
  --note "Invented scenario: a dog in rehabilitation walks, then trots, on a treadmill."

"$bin" synth --out "$here/paddock-gallop" \
  --limbs quadruped --feet hoof --scene panning \
  --gait trot:2.5@1.4 --gait canter:2@1.7 --gait transverse-gallop:2@2.1 \
  --capture-fps 240 --file-fps 30 --size 640x360 --leg-length 1.5 --seed 23 --noise 3 --flicker 0.03 --x264-preset veryfast \
  --subject "Demo horse (invented)" --species "horse (synthetic)" --condition "paddock, free movement" \
  --note "Invented scenario: a hoofed animal crosses a paddock and breaks into a gallop; high-speed capture stored at 30 fps."

"$bin" synth --out "$here/lab-hexapod" \
  --limbs hexapod --scene treadmill \
  --gait tetrapod:2@4 --gait tripod:2@7 \
  --capture-fps 200 --size 640x360 --leg-length 0.012 --seed 5 --noise 2 --x264-preset veryfast \
  --subject "Demo insect (invented)" --species "six-legged (synthetic)" --condition "lab treadmill" \
  --note "Invented scenario: a six-legged lab subject speeds up from tetrapod to tripod coordination."
