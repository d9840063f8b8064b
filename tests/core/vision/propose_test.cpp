// The whole proposer on synthetic clips with exact ground truth (core/synth renders them).
#include "vision/propose.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

#include <unistd.h>

#include "common/error.h"
#include "synth/synth.h"
#include "vision/proposal_score.h"

namespace stridemark::vision {
namespace {

namespace fs = std::filesystem;

struct Clip {
  synth::SynthOptions options;
  synth::SynthResult result;
  std::vector<model::FootSeed> seeds;
};

// A biped walking under a camera that follows it, with a marker on each foot (the generator's
// tracking aid), so this test measures the stance rule and the ground motion, not appearance.
Clip markedBipedWalk() {
  Clip clip;
  auto& o = clip.options;
  // One folder per process: ctest runs each test of this file as its own process, in parallel.
  o.outDir = fs::temp_directory_path() / ("stridemark-vision-propose-" + std::to_string(getpid()));
  o.limbs = model::LimbSet::biped();
  o.gaits = {"walk:3"};
  o.timeline.captureRate = {120, 1};
  o.render.scene = synth::Scene::panning;  // the follow camera: the backdrop pans
  o.render.markers = true;
  clip.result = synth::generate(o);
  const synth::Timeline timeline = synth::makeTimeline(o);
  synth::Renderer renderer(timeline, o.render);
  for (int limb = 0; limb < o.limbs.size(); ++limb) {
    const cv::Point2d p = renderer.footPixel(limb, 0);
    const double marker = std::max(3.0, 0.05 * o.timeline.legLengthM * renderer.pixelsPerMetre());
    clip.seeds.push_back({limb, 0, p.x, p.y - marker});  // marker centre (synth/body.cpp)
  }
  return clip;
}

struct SharedClip {
  Clip clip = markedBipedWalk();
  ~SharedClip() {
    std::error_code ignored;
    fs::remove_all(clip.options.outDir, ignored);
  }
};

const Clip& sharedClip() {
  static const SharedClip shared;
  return shared.clip;
}

ProposeRequest requestFor(const Clip& clip) {
  ProposeRequest r;
  r.video = clip.result.video;
  r.limbs = clip.options.limbs;
  r.captureRate = clip.options.timeline.captureRate;
  r.scene = Scene::panning;
  r.seeds = clip.seeds;
  return r;
}

// Source: the clip's exact ground truth (synth::groundTruth, same frame convention). The issue
// 18 target is >= 90 % of events within 1 frame and <= 5 % missed and spurious; this clip is
// not there yet (the far foot flickers behind the near leg, see docs/vision.md), so the test
// holds the measured level as a floor: 73 % within 1 frame, 27 % missed, 11 % spurious.
TEST(Propose, MarkedFeetOnAPanningClipHoldTheMeasuredAccuracy) {
  const Clip& clip = sharedClip();
  const ProposeResult result = propose(requestFor(clip));
  const model::Annotation truth = synth::groundTruth(clip.options);
  const ProposalScore s =
      scoreProposals(truth.events, result.proposals, {2, clip.result.frameCount - 3}, 6);
  ASSERT_GT(s.truth, 8);
  EXPECT_GE(s.share(s.within1), 0.7);
  EXPECT_LE(s.share(s.missed), 0.3);
  EXPECT_LE(s.spuriousShare(), 0.15);
  ASSERT_EQ(result.tracks.size(), 2u);
  EXPECT_EQ(result.tracks[0].points.size(), static_cast<std::size_t>(clip.result.frameCount));
}

// Issue 18 item 1: tracking runs forwards and backwards from a seed in the middle of the clip.
TEST(Propose, SeedsLaterInTheClipTrackBackwardsToo) {
  const Clip& clip = sharedClip();
  const synth::Timeline timeline = synth::makeTimeline(clip.options);
  synth::Renderer renderer(timeline, clip.options.render);
  ProposeRequest r = requestFor(clip);
  const std::int64_t middle = clip.result.frameCount / 2;
  const double marker = renderer.footPixel(0, 0).y - clip.seeds[0].y;
  for (auto& seed : r.seeds) {
    const cv::Point2d p = renderer.footPixel(seed.limb, static_cast<double>(middle));
    seed.frame = middle;
    seed.x = p.x;
    seed.y = p.y - marker;
  }
  const ProposeResult result = propose(r);
  const model::Annotation truth = synth::groundTruth(clip.options);
  const ProposalScore early = scoreProposals(truth.events, result.proposals, {2, middle - 1}, 6);
  ASSERT_GT(early.truth, 3);
  EXPECT_GE(early.share(early.within1), 0.85);
}

// Issue 18 item 3 (Cancel): a progress callback that says stop ends the run with an error that
// says so; nothing is returned.
TEST(Propose, CancelStopsWithAClearError) {
  try {
    propose(requestFor(sharedClip()), [](std::int64_t done, std::int64_t) { return done < 40; });
    FAIL() << "not cancelled";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("cancelled"), std::string::npos);
  }
}

// Issue 18 item 2: bad seeds and unreadable video are errors that say what to fix.
TEST(Propose, BadSeedsAndUnreadableVideoSayWhatToFix) {
  ProposeRequest r = requestFor(sharedClip());
  r.seeds = {{0, 0, 9999, 10}};
  try {
    propose(r);
    FAIL();
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::format);
    EXPECT_NE(std::string(e.what()).find("seed L at frame 0: position (9999"), std::string::npos)
        << e.what();
  }
  const fs::path junk = sharedClip().options.outDir / "junk.mp4";
  std::ofstream(junk) << "not a video";
  r.video = junk;
  EXPECT_THROW(propose(r), Error);
}

}  // namespace
}  // namespace stridemark::vision
