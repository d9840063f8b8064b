// Issue 17 items 10 and 11 at the export: a clip stored with a display rotation is exported
// upright, and damaged frames in the range are skipped and listed instead of aborting the clip.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <set>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "export_fixture.h"
#include "formats/project_file.h"
#include "tests/support/damaged_clip.h"
#include "video/frame_index.h"

using namespace stridemark;
using namespace stridemark::testing;
namespace fs = std::filesystem;

namespace {

std::string ffprobeStream(const fs::path& clip) {
  return run("ffprobe -v error -select_streams v:0 -count_frames -show_entries "
             "stream=width,height,nb_read_frames:stream_side_data=rotation -of default=nw=1 '" +
             clip.string() + "'")
      .out;
}

// Source: the ffmpeg CLI: frames (pts in the 1/240 time base of the 240 fps test clip) in
// [first, last] that `ffmpeg -f framemd5` does not output.
std::set<std::int64_t> framesFfmpegCannotDecode(const fs::path& path, std::int64_t first,
                                                std::int64_t last) {
  const CommandResult r = run("ffmpeg -nostdin -v quiet -i '" + path.string() +
                              "' -map 0:v:0 -fps_mode passthrough -f framemd5 - 2>/dev/null");
  EXPECT_NE(r.out.find("#tb 0: 1/240"), std::string::npos) << r.out.substr(0, 300);
  return testsupport::framesMissingFromFramemd5(r.out, first, last);
}

}  // namespace

TEST(ExportVideoDefects, DamagedFramesAreSkippedAndListedAndTheClipFinishes) {
  const fs::path dir = freshFolder("damaged");
  makeClip(dir / "trot.mp4", 200);
  testsupport::damagePackets(dir / "trot.mp4", {50, 51, 90});
  formats::writeProjectFile(dir / "trot.stridemark", trotProject("trot.mp4", 200));
  const std::set<std::int64_t> bad = framesFfmpegCannotDecode(dir / "trot.mp4", 10, 129);
  // Common practice, no source: the damage must really break frames for the test to count.
  ASSERT_FALSE(bad.empty());
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (dir / "trot.stridemark").string() + "' --out '" +
          (dir / "out").string() + "' --clip --from 10 --to 129 --figures none");
  // Source: issue 17 item 11: one undecodable frame must not abort the marked clip.
  ASSERT_EQ(r.exitCode, 0) << r.out;
  std::string list;
  for (const std::int64_t n : bad) list += (list.empty() ? "" : ", ") + std::to_string(n);
  EXPECT_NE(r.out.find("skipped " + std::to_string(bad.size()) + " damaged frame(s): " + list),
            std::string::npos)
      << r.out;
  // Source: ffprobe counts the frames of the written clip: the range minus the skipped ones.
  const std::string probe = ffprobeStream(dir / "out" / "clip" / "marked_clip.mp4");
  EXPECT_NE(probe.find("nb_read_frames=" + std::to_string(120 - bad.size())), std::string::npos)
      << probe;
  // Common practice, no source: the export folder keeps the list too (export.json).
  const auto provenance = nlohmann::json::parse(readText(dir / "out" / "export.json"));
  const auto listed = provenance.at("marked_clip").at("skipped_damaged_frames");
  EXPECT_EQ(listed.get<std::set<std::int64_t>>(), bad) << provenance.dump();
  EXPECT_EQ(provenance.at("marked_clip").at("frames"), 120 - static_cast<int>(bad.size()));
  std::cout << "export skipped " << bad.size() << " damaged frame(s): " << list << "\n";
}

TEST(ExportVideoDefects, RotatedVideoGivesAnUprightClip) {
  const fs::path dir = freshFolder("rotated");
  makeClip(dir / "stored.mp4", 200);
  ASSERT_EQ(run("ffmpeg -nostdin -v error -y -i '" + (dir / "stored.mp4").string() +
                "' -c copy -metadata:s:v rotate=90 '" + (dir / "trot.mp4").string() + "'")
                .exitCode,
            0);
  formats::writeProjectFile(dir / "trot.stridemark", trotProject("trot.mp4", 200));
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (dir / "trot.stridemark").string() + "' --out '" +
          (dir / "out").string() + "' --clip --from 10 --to 49 --figures none");
  ASSERT_EQ(r.exitCode, 0) << r.out;
  EXPECT_NE(r.out.find("turned upright"), std::string::npos) << r.out;
  // Source: ffprobe: the 320x240 stored picture, turned a quarter, is 240 wide and 320 high,
  // and the clip carries no rotation of its own (players show it as encoded).
  const std::string probe = ffprobeStream(dir / "out" / "clip" / "marked_clip.mp4");
  EXPECT_NE(probe.find("width=240"), std::string::npos) << probe;
  EXPECT_NE(probe.find("height=320"), std::string::npos) << probe;
  EXPECT_EQ(probe.find("rotation="), std::string::npos) << probe;
}
