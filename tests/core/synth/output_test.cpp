// Written files, checked from outside: Debian's ffprobe for the video, our readers for the
// events CSV and project file.
#include <gtest/gtest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <map>
#include <memory>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>
#include <opencv2/imgcodecs.hpp>
#include "common/error.h"

#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "formats/project_file.h"
#include "synth/synth.h"

namespace stridemark::synth {
namespace {

namespace fs = std::filesystem;

std::string runCommand(const std::string& command) {
  std::unique_ptr<FILE, int (*)(FILE*)> pipe(popen(command.c_str(), "r"), pclose);
  if (!pipe) return {};
  std::string out;
  std::array<char, 4096> buffer{};
  while (std::fgets(buffer.data(), buffer.size(), pipe.get())) out += buffer.data();
  return out;
}

// ffprobe (Debian ffmpeg) decodes every frame and reports count, size and rates.
std::string probe(const fs::path& video) {
  return runCommand(
      "ffprobe -v error -count_frames -select_streams v:0 -show_entries "
      "stream=codec_name,pix_fmt,width,height,r_frame_rate,nb_read_frames "
      "-of default=noprint_wrappers=1 '" +
      video.string() + "'");
}

fs::path freshDir(const std::string& name) {
  const fs::path dir =
      fs::temp_directory_path() / ("stridemark-synth-" + name + "-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  return dir;
}

SynthOptions smallClip(const fs::path& dir) {
  SynthOptions o;
  o.outDir = dir;
  o.gaits = {"walk:0.8", "trot:0.7"};
  o.timeline.captureRate = {90, 1};
  o.fileRate = {30, 1};
  o.render.width = 320;
  o.render.height = 240;
  o.render.noise = 3;
  return o;
}

// Source: ffprobe(1) from Debian ffmpeg is the reference for what the file holds.
TEST(Output, H264FileHasExactFrameCountSizeAndStoredRate) {
  const fs::path dir = freshDir("h264");
  const auto result = generate(smallClip(dir));
  EXPECT_EQ(result.frameCount, 135);
  const std::string info = probe(result.video);
  EXPECT_NE(info.find("codec_name=h264"), std::string::npos) << info;
  EXPECT_NE(info.find("pix_fmt=yuv420p"), std::string::npos) << info;
  EXPECT_NE(info.find("width=320"), std::string::npos) << info;
  EXPECT_NE(info.find("height=240"), std::string::npos) << info;
  EXPECT_NE(info.find("r_frame_rate=30/1"), std::string::npos) << info;
  EXPECT_NE(info.find("nb_read_frames=135"), std::string::npos) << info;
  fs::remove_all(dir);
}

TEST(Output, MjpegFileWhenAsked) {
  const fs::path dir = freshDir("mjpeg");
  auto options = smallClip(dir);
  options.codec = ClipCodec::mjpeg;
  options.fileRate = {0, 1};  // stored at the capture rate
  const auto result = generate(options);
  EXPECT_EQ(result.video.extension(), ".avi");
  const std::string info = probe(result.video);
  EXPECT_NE(info.find("codec_name=mjpeg"), std::string::npos) << info;
  EXPECT_NE(info.find("r_frame_rate=90/1"), std::string::npos) << info;
  EXPECT_NE(info.find("nb_read_frames=135"), std::string::npos) << info;
  fs::remove_all(dir);
}

TEST(Output, EventsCsvAndProjectHoldTheGroundTruth) {
  const fs::path dir = freshDir("truth");
  auto options = smallClip(dir);
  options.writeVideo = false;
  options.timeline.legLengthM = 0.61;
  const auto result = generate(options);
  const auto truth = groundTruth(options);
  const auto csv = formats::readEventsCsv(result.events);
  auto events = csv.events;
  std::sort(events.begin(), events.end());
  EXPECT_EQ(events, truth.events);
  EXPECT_EQ(result.eventCount, truth.events.size());
  const auto project = formats::readProjectFile(result.project);
  EXPECT_EQ(project.annotation.events, truth.events);
  EXPECT_EQ(project.annotation.captureRate, (Rational{90, 1}));
  ASSERT_TRUE(project.trial.legLengthM);
  EXPECT_DOUBLE_EQ(*project.trial.legLengthM, 0.61);
  ASSERT_TRUE(project.trial.speedMs);
  EXPECT_NEAR(*project.trial.speedMs, result.meanSpeedMs, 1e-9);
  const std::string manifest = formats::readWholeFile(result.manifest);
  EXPECT_NE(manifest.find("\"synthetic\": true"), std::string::npos);
  EXPECT_NE(manifest.find("trot"), std::string::npos);
  fs::remove_all(dir);
}

TEST(Output, ProjectLinksTheVideo) {
  const fs::path dir = freshDir("link");
  const auto result = generate(smallClip(dir));
  const auto project = formats::readProjectFile(result.project);
  ASSERT_TRUE(project.video);
  EXPECT_EQ(project.video->frameCount, 135);
  EXPECT_EQ(project.video->fileRate, (Rational{30, 1}));
  EXPECT_TRUE(fs::exists(dir / project.video->path));
  // size-headhash-tailhash, size first (as the workstation writes it)
  EXPECT_EQ(project.video->signature.substr(0, project.video->signature.find('-')),
            std::to_string(fs::file_size(dir / project.video->path)));
  fs::remove_all(dir);
}

// Source: ffmpeg(1) (Debian) decodes the written files; the first frame must match what the
// renderer drew (colour matrix and range handled for both codecs). Tolerance: common practice,
// no source (lossy codecs; mean absolute error of a few grey levels).
TEST(Output, DecodedFirstFrameMatchesTheRenderedOne) {
  for (const auto codec : {ClipCodec::h264, ClipCodec::mjpeg}) {
    const fs::path dir = freshDir(codec == ClipCodec::h264 ? "colour-h264" : "colour-mjpeg");
    auto options = smallClip(dir);
    options.render.noise = 0;
    options.codec = codec;
    const auto result = generate(options);
    const Timeline timeline = makeTimeline(options);
    Renderer renderer(timeline, options.render);
    cv::Mat drawn;
    renderer.render(0, drawn);
    const fs::path png = dir / "first.png";
    runCommand("ffmpeg -v error -y -i '" + result.video.string() + "' -frames:v 1 '" +
               png.string() + "'");
    const cv::Mat decoded = cv::imread(png.string(), cv::IMREAD_COLOR);
    ASSERT_FALSE(decoded.empty()) << png;
    ASSERT_EQ(decoded.size(), drawn.size());
    const double meanError =
        cv::norm(decoded, drawn, cv::NORM_L1) / static_cast<double>(drawn.total() * 3);
    EXPECT_LT(meanError, 4.0) << result.video;
    fs::remove_all(dir);
  }
}

std::vector<std::vector<std::string>> csvRows(const fs::path& path, std::string* header) {
  std::istringstream in(formats::readWholeFile(path));
  std::vector<std::vector<std::string>> rows;
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#') continue;
    if (header->empty()) {
      *header = line;
      continue;
    }
    std::vector<std::string> cells;
    std::istringstream cellsIn(line);
    std::string cell;
    while (std::getline(cellsIn, cell, ',')) cells.push_back(cell);
    rows.push_back(cells);
  }
  return rows;
}

TEST(Output, FootTruthFilesHoldEveryFrameAndOneSeedPerFoot) {
  // Our definition (docs/synth.md, issue 18): feet.csv = frame,limb,x,y,visible for every
  // frame and limb; seeds.csv = limb,frame,x,y at each foot's first visible frame; both listed
  // in the manifest. Written without the video too (the truth needs no pixels).
  const fs::path dir = freshDir("feet");
  auto options = smallClip(dir);
  options.writeVideo = false;
  options.render.scene = Scene::overground;
  options.render.occluder = true;
  const auto result = generate(options);
  std::string feetHeader, seedsHeader;
  const auto feet = csvRows(result.feet, &feetHeader);
  const auto seeds = csvRows(result.seeds, &seedsHeader);
  EXPECT_EQ(feetHeader, "frame,limb,x,y,visible");
  EXPECT_EQ(seedsHeader, "limb,frame,x,y");
  ASSERT_EQ(feet.size(), static_cast<std::size_t>(result.frameCount * 4));
  const Timeline timeline = makeTimeline(options);
  const Renderer renderer(timeline, options.render);
  std::map<std::string, std::string> firstVisible;
  int hidden = 0;
  for (const auto& row : feet) {
    ASSERT_EQ(row.size(), 5u);
    const int limb = *options.limbs.indexOf(row[1]);
    const FootView foot = renderer.footView(limb, std::stoll(row[0]));
    EXPECT_NEAR(std::stod(row[2]), foot.centre.x, 0.006);
    EXPECT_NEAR(std::stod(row[3]), foot.centre.y, 0.006);
    EXPECT_EQ(row[4], foot.visible() ? "1" : "0");
    if (row[4] == "0") ++hidden;
    if (row[4] == "1" && !firstVisible.count(row[1])) firstVisible[row[1]] = row[0];
  }
  EXPECT_GT(hidden, 0);
  ASSERT_EQ(seeds.size(), firstVisible.size());
  for (const auto& row : seeds) EXPECT_EQ(row[1], firstVisible[row[0]]) << row[0];
  const auto manifest = nlohmann::json::parse(formats::readWholeFile(result.manifest));
  EXPECT_EQ(manifest["files"]["feet"], "feet.csv");
  EXPECT_EQ(manifest["files"]["seeds"], "seeds.csv");
  EXPECT_EQ(manifest["render"]["scene"], "overground");
  EXPECT_EQ(manifest["render"]["occluder"], true);
  fs::remove_all(dir);
}

TEST(Output, HigherCrfGivesASmallerFile) {
  // From memory: libx264's constant rate factor, higher values quantise harder (fewer bits).
  const fs::path dir = freshDir("crf");
  auto options = smallClip(dir / "default");
  const auto normal = generate(options);
  options.outDir = dir / "crf30";
  options.crf = 30;
  const auto heavy = generate(options);
  EXPECT_LT(fs::file_size(heavy.video), 0.8 * static_cast<double>(fs::file_size(normal.video)));
  const auto manifest = nlohmann::json::parse(formats::readWholeFile(heavy.manifest));
  EXPECT_EQ(manifest["crf"], 30);
  options.crf = 52;
  try {
    generate(options);
    FAIL() << "expected an error for crf 52";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("0 (lossless) to 51"), std::string::npos) << e.what();
  }
  options.crf = 30;
  options.codec = ClipCodec::mjpeg;
  EXPECT_THROW(generate(options), Error);
  fs::remove_all(dir);
}

TEST(Output, UnwritableFolderIsAClearError) {
  auto options = smallClip("/proc/stridemark-cannot-write-here");
  options.writeVideo = false;
  try {
    generate(options);
    FAIL() << "expected an error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("/proc/stridemark-cannot-write-here"), std::string::npos);
  }
}

}  // namespace
}  // namespace stridemark::synth
