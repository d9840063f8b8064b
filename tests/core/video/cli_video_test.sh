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
echo "cli video checks passed"
