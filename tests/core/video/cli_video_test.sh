#!/usr/bin/env bash
# End-to-end check of `stridemark probe` and `stridemark frame` against the ffmpeg CLI.
# Source of truth: `ffmpeg -f framemd5` (per-frame MD5 of the raw planes) and ffprobe.
# Usage: cli_video_test.sh STRIDEMARK_BINARY WORK_DIR
set -euo pipefail
bin=$1
dir=$2/cli-video
mkdir -p "$dir"
clip=$dir/cli_bframes.mp4
if [ ! -f "$clip" ]; then
  ffmpeg -nostdin -v error -y -f lavfi -i testsrc2=size=160x120:rate=30,noise=alls=12:allf=t \
    -frames:v 90 -c:v libx264 -preset veryfast -bf 3 -g 40 -sc_threshold 0 -pix_fmt yuv420p \
    "$clip.part.mp4"
  mv "$clip.part.mp4" "$clip"
fi
mapfile -t ref < <(ffmpeg -nostdin -v error -i "$clip" -map 0:v:0 -fps_mode passthrough \
  -f framemd5 - | grep -v '^#' | awk -F', *' '{print $6}')
for n in 0 1 39 40 41 77 89 12; do
  got=$("$bin" frame "$clip" --index "$n" --md5)
  if [ "$got" != "${ref[$n]}" ]; then
    echo "frame $n: stridemark $got, ffmpeg framemd5 ${ref[$n]}" >&2
    exit 1
  fi
done
"$bin" frame "$clip" --index 45 --png "$dir/f45.png"
[ "$(head -c 8 "$dir/f45.png" | od -An -tx1 | tr -d ' \n')" = "89504e470d0a1a0a" ] || {
  echo "--png did not write a PNG" >&2; exit 1; }
json=$("$bin" probe "$clip" --json)
/usr/bin/python3 - "$json" <<'PY'
import json, sys
j = json.loads(sys.argv[1])
for key in ["frame_count", "capture_fps", "file_fps", "width", "height", "pixel_format", "codec",
            "duration_s", "keyframe_interval", "warnings"]:
    assert key in j, key
assert j["frame_count"] == 90 and j["width"] == 160 and j["height"] == 120, j
assert j["codec"] == "h264" and j["pixel_format"] == "yuv420p", j
assert abs(j["file_fps"] - 30) < 1e-9 and abs(j["duration_s"] - 3.0) < 1e-9, j
assert j["keyframe_interval"]["max"] == 40 and j["keyframe_interval"]["min"] == 40, j  # keys 0, 40, 80
PY
# Bad input: exit code 1 and a message naming the file; out-of-range frame also 1.
set +e
"$bin" probe "$dir/missing.mp4" 2> "$dir/err.txt"; rc=$?
set -e
[ $rc -eq 1 ] && grep -q "missing.mp4" "$dir/err.txt" || { echo "missing file: rc $rc" >&2; exit 1; }
set +e
"$bin" frame "$clip" --index 90 --md5 2> "$dir/err.txt"; rc=$?
set -e
[ $rc -eq 1 ] && grep -q "frame 90" "$dir/err.txt" || { echo "out of range: rc $rc" >&2; exit 1; }

# Issue 17 item 5: a damaged sidecar is noted on stderr, rebuilt, and the frame stays exact.
export STRIDEMARK_INDEX_CACHE=$dir/index-cache
rm -rf "$STRIDEMARK_INDEX_CACHE"
"$bin" frame "$clip" --index 41 --md5 > /dev/null
sidecar=$(ls "$STRIDEMARK_INDEX_CACHE"/*.smindex)
sed -i '5s/^[0-9]/9/' "$sidecar"   # one packet line changed: pts of a packet
got=$("$bin" frame "$clip" --index 41 --md5 2> "$dir/err.txt")
[ "$got" = "${ref[41]}" ] || { echo "frame 41 after a damaged sidecar: $got" >&2; exit 1; }
grep -q "index cache is damaged" "$dir/err.txt" || { echo "no note about the sidecar" >&2; exit 1; }
[ "$(wc -l < "$dir/err.txt")" -eq 1 ] || { echo "the note is not one line" >&2; exit 1; }
got=$("$bin" frame "$clip" --index 41 --md5 2> "$dir/err.txt")
[ ! -s "$dir/err.txt" ] || { echo "the rebuilt sidecar was not trusted" >&2; exit 1; }

# Issue 17 item 10: a synth clip stored with rotate=90: probe says so, frames match ffmpeg's
# autorotated framemd5 (ffmpeg turns such frames by default).
"$bin" synth --out "$dir/synth" --gait trot:1 --size 160x96 --capture-fps 30 --seed 3 > /dev/null
synthclip=$(ls "$dir"/synth/*.mp4 | head -1)
for r in 90 180 270; do
  ffmpeg -nostdin -v error -y -i "$synthclip" -c copy -metadata:s:v rotate=$r "$dir/rot$r.mp4"
  mapfile -t rref < <(ffmpeg -nostdin -v error -i "$dir/rot$r.mp4" -map 0:v:0 \
    -fps_mode passthrough -f framemd5 - | grep -v '^#' | awk -F', *' '{print $6}')
  for n in 0 7 29; do
    got=$("$bin" frame "$dir/rot$r.mp4" --index $n --md5)
    [ "$got" = "${rref[$n]}" ] || { echo "rotate=$r frame $n: $got vs ${rref[$n]}" >&2; exit 1; }
  done
  "$bin" probe "$dir/rot$r.mp4" --json > "$dir/rot.json"
  /usr/bin/python3 - "$dir/rot.json" "$r" <<'PY'
import json, sys
j = json.load(open(sys.argv[1]))
r = int(sys.argv[2])
assert j["rotation"] == r and j["rotation_applied"] is True, j
assert (j["width"], j["height"]) == ((96, 160) if r != 180 else (160, 96)), j
assert any("upright" in w for w in j["warnings"]), j
PY
done

# Issue 17 item 11: damaged packets. probe lists what ffmpeg cannot decode; frame N fails
# naming the frame.
cp "$clip" "$dir/damaged.mp4"
read -r size pos < <(ffprobe -v error -select_streams v:0 -show_entries packet=pos,size \
  -of csv=p=0 "$clip" | sed -n 20p | tr , " ")  # ffprobe prints size before pos
/usr/bin/python3 - "$dir/damaged.mp4" "$pos" "$size" <<'PY'
import random, sys
path, pos, size = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
data = bytearray(open(path, "rb").read())
rng = random.Random(5)
for i in range(pos, pos + size):
    data[i] = rng.randrange(256)
open(path, "wb").write(data)
PY
mapfile -t missing < <(ffmpeg -nostdin -v quiet -i "$dir/damaged.mp4" -map 0:v:0 \
  -fps_mode passthrough -f framemd5 - | grep -v '^#' | awk -F', *' '{print $3}' |
  /usr/bin/python3 -c 'import sys; seen={int(l) for l in sys.stdin}; [print(n) for n in range(90) if n not in seen]')
[ "${#missing[@]}" -ge 1 ] || { echo "the damage broke no frame" >&2; exit 1; }
"$bin" probe "$dir/damaged.mp4" --json > "$dir/damaged.json"
/usr/bin/python3 - "$dir/damaged.json" "${missing[@]}" <<'PY'
import json, sys
j = json.load(open(sys.argv[1]))
want = [int(a) for a in sys.argv[2:]]
assert j["damaged_frames"] == want, (j["damaged_frames"], want)
assert all(d["reason"] for d in j["damaged_frame_details"]), j
PY
"$bin" probe "$dir/damaged.mp4" | grep -q "damaged       ${#missing[@]} frame(s): ${missing[0]}" ||
  { echo "probe text does not list the damaged frames" >&2; exit 1; }
set +e
"$bin" frame "$dir/damaged.mp4" --index "${missing[0]}" --md5 > /dev/null 2> "$dir/err.txt"; rc=$?
set -e
[ $rc -eq 1 ] && grep -q "frame ${missing[0]} is damaged" "$dir/err.txt" ||
  { echo "frame on a damaged frame: rc $rc $(cat "$dir/err.txt")" >&2; exit 1; }
echo "cli video checks passed"
