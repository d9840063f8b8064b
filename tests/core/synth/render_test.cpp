// Image-level checks: a planted foot moves with the ground in the rendered frames, a swinging
// one does not; the same seed gives the same pixels.
#include <gtest/gtest.h>

#include <cmath>

#include <opencv2/imgcodecs.hpp>
#include <opencv2/imgproc.hpp>

#include "common/error.h"
#include "synth/block_artefacts.h"
#include "synth/synth.h"

namespace stridemark::synth {
namespace {

using model::LimbSet;

// Sub-pixel horizontal position of the best (lowest) score in a 1-row SQDIFF result.
double subPixelMinimum(const cv::Mat& scores, cv::Point best) {
  const int x = best.x;
  if (x <= 0 || x >= scores.cols - 1) return x;
  const double a = scores.at<float>(best.y, x - 1), b = scores.at<float>(best.y, x),
               c = scores.at<float>(best.y, x + 1);
  const double denom = a - 2 * b + c;
  return denom > 0 ? x + 0.5 * (a - c) / denom : x;
}

// Finds how far the patch `rect` of `before` moved horizontally in `after` (template match, the
// vertical position free within +-dy). Optional mask limits the compared pixels.
cv::Point2d shiftOf(const cv::Mat& before, const cv::Mat& after, cv::Rect rect, int dx, int dy,
                    const cv::Mat& mask = {}) {
  const cv::Rect search =
      cv::Rect(rect.x - dx, rect.y - dy, rect.width + 2 * dx, rect.height + 2 * dy) &
      cv::Rect(0, 0, after.cols, after.rows);
  cv::Mat scores;
  cv::matchTemplate(after(search), before(rect), scores, cv::TM_SQDIFF, mask);
  cv::Point best;
  cv::minMaxLoc(scores, nullptr, nullptr, &best, nullptr);
  const double x = subPixelMinimum(scores, best);
  return {search.x + x - rect.x, static_cast<double>(search.y + best.y - rect.y)};
}

struct Fixture {
  SynthOptions options;
  std::unique_ptr<Timeline> timeline;
  std::unique_ptr<Renderer> renderer;
  explicit Fixture(Scene scene) {
    options.limbs = LimbSet::quadruped();
    options.gaits = {"walk:1.5"};
    options.timeline.captureRate = {120, 1};
    options.timeline.legLengthM = 0.55;
    options.render.width = 640;
    options.render.height = 360;
    options.render.markers = true;
    options.render.scene = scene;
    timeline = std::make_unique<Timeline>(makeTimeline(options));
    renderer = std::make_unique<Renderer>(*timeline, options.render);
  }
  bool inStance(int limb, std::int64_t f) const {
    return timeline->foot(limb, static_cast<double>(f)).stance;
  }
};

// Common practice, no source: a planted foot shares the ground's motion (here within 1 px per
// frame), a swinging foot moves forward relative to it.
void checkPlantedFoot(Scene scene, cv::Rect groundPatch) {
  Fixture fx(scene);
  const int limb = *fx.options.limbs.indexOf("LH");  // near side, never hidden by the body
  cv::Mat before, after;
  int stancePairs = 0, swingPairs = 0;
  for (std::int64_t f = 0; f + 1 < fx.timeline->frameCount(); ++f) {
    const bool stance = fx.inStance(limb, f) && fx.inStance(limb, f + 1);
    const bool swing = !fx.inStance(limb, f) && !fx.inStance(limb, f + 1);
    if (!stance && !swing) continue;
    fx.renderer->render(f, before);
    fx.renderer->render(f + 1, after);
    const cv::Point2d ground = shiftOf(before, after, groundPatch, 24, 0);
    const cv::Point2d foot = fx.renderer->footPixel(limb, static_cast<double>(f));
    const int r = static_cast<int>(std::max(3.0, 0.05 * 0.55 * fx.renderer->pixelsPerMetre()));
    const cv::Rect markerBox(static_cast<int>(std::lround(foot.x)) - r - 1,
                             static_cast<int>(std::lround(foot.y)) - 2 * r - 1, 2 * r + 3,
                             2 * r + 3);
    // A crossing animal's foot may be near an edge: compare only fully framed markers.
    if ((markerBox & cv::Rect(0, 0, before.cols, before.rows)) != markerBox) continue;
    cv::Mat mask(markerBox.size(), CV_8UC3, cv::Scalar::all(0));
    cv::circle(mask, {r + 1, r + 1}, r, cv::Scalar::all(255), cv::FILLED);
    const cv::Point2d marker = shiftOf(before, after, markerBox, 40, 30, mask);
    if (stance) {
      ++stancePairs;
      EXPECT_NEAR(marker.x, ground.x, 1.0) << "frame " << f << " (stance)";
      EXPECT_NEAR(marker.y, 0.0, 1.0) << "frame " << f << " (stance)";
    } else {
      const double rel = std::abs(marker.x - ground.x) + std::abs(marker.y);
      // Around lift-off and touchdown the swinging foot is nearly still; test mid-swing only.
      const auto pose = fx.timeline->foot(limb, static_cast<double>(f) + 0.5);
      if (pose.lift > 0.5) {
        ++swingPairs;
        EXPECT_GT(rel, 1.0) << "frame " << f << " (swing)";
      }
    }
  }
  EXPECT_GT(stancePairs, 50);
  EXPECT_GT(swingPairs, 10);
}

TEST(PlantedFoot, MovesWithTheBeltOnATreadmill) {
  checkPlantedFoot(Scene::treadmill, cv::Rect(24, 284, 40, 12));
}

TEST(PlantedFoot, MovesWithTheTrackWhenPanning) {
  checkPlantedFoot(Scene::panning, cv::Rect(20, 310, 40, 30));
}

TEST(PlantedFoot, StandsStillOvergroundWithAFixedCamera) {
  checkPlantedFoot(Scene::overground, cv::Rect(20, 320, 40, 30));
}

TEST(Determinism, SameSeedSamePixelsOtherSeedOtherPixels) {
  auto renderAll = [](std::uint64_t seed) {
    SynthOptions o;
    o.gaits = {"trot:0.25"};
    o.render.width = 320;
    o.render.height = 180;
    o.render.noise = 6;
    o.render.flicker = 0.05;
    o.render.blur = true;
    o.render.blockiness = 60;
    o.render.seed = seed;
    o.render.scene = Scene::panning;
    const Timeline t = makeTimeline(o);
    Renderer r(t, o.render);
    std::vector<cv::Mat> frames;
    for (std::int64_t f = 0; f < t.frameCount(); ++f) {
      cv::Mat m;
      r.render(f, m);
      frames.push_back(m.clone());
    }
    return frames;
  };
  const auto a = renderAll(7), b = renderAll(7), c = renderAll(8);
  ASSERT_EQ(a.size(), b.size());
  double differentSeed = 0;
  for (std::size_t i = 0; i < a.size(); ++i) {
    EXPECT_EQ(cv::norm(a[i], b[i], cv::NORM_INF), 0.0) << "frame " << i;
    differentSeed += cv::norm(a[i], c[i], cv::NORM_L1);
  }
  EXPECT_GT(differentSeed, 0.0);
}

// A rendered outdoor frame with noise: edges, flat ground and texture.
cv::Mat busyFrame() {
  SynthOptions o;
  o.gaits = {"trot:0.25"};
  o.render.width = 318;  // not a whole number of 8x8 blocks
  o.render.height = 182;
  o.render.noise = 6;
  o.render.scene = Scene::panning;
  const Timeline t = makeTimeline(o);
  Renderer r(t, o.render);
  cv::Mat frame;
  r.render(3, frame);
  return frame;
}

double meanAbsDifference(const cv::Mat& a, const cv::Mat& b) {
  return cv::norm(a, b, cv::NORM_L1) / static_cast<double>(a.total() * a.channels());
}

TEST(BlockArtefacts, LookLikeAJpegEncoderAtTheSameQuality) {
  // Source: ITU-T T.81 Annex K tables with the IJG quality scaling, which Debian's libjpeg (via
  // OpenCV's imencode, used here only as the outside reference) applies too. Our quantised frame
  // must sit close to libjpeg's round trip, much closer than either sits to the original.
  const cv::Mat original = busyFrame();
  for (const int quality : {20, 50, 85}) {
    cv::Mat ours = original.clone();
    applyBlockArtefacts(ours, quality);
    std::vector<std::uint8_t> jpeg;
    cv::imencode(".jpg", original, jpeg, {cv::IMWRITE_JPEG_QUALITY, quality});
    const cv::Mat reference = cv::imdecode(jpeg, cv::IMREAD_COLOR);
    ASSERT_EQ(ours.size(), original.size());
    const double loss = meanAbsDifference(reference, original);
    const double gap = meanAbsDifference(ours, reference);
    EXPECT_GT(meanAbsDifference(ours, original), 0.5 * loss) << quality;
    EXPECT_LT(gap, 0.2 * loss) << "quality " << quality << ": ours vs libjpeg " << gap
                               << ", libjpeg vs original " << loss;
  }
}

TEST(BlockArtefacts, LowerQualityLosesMore) {
  // Common practice, no source: coarser quantisation, larger error.
  const cv::Mat original = busyFrame();
  double previous = 0;
  for (const int quality : {95, 60, 25, 5}) {
    cv::Mat out = original.clone();
    applyBlockArtefacts(out, quality);
    const double loss = meanAbsDifference(out, original);
    EXPECT_GT(loss, previous) << quality;
    previous = loss;
  }
}

TEST(Errors, BadRenderOptionsAreExplained) {
  SynthOptions o;
  o.gaits = {"walk:1"};
  const Timeline t = makeTimeline(o);
  RenderOptions r;
  r.width = 641;
  EXPECT_THROW(Renderer(t, r), Error);
  r.width = 640;
  r.noise = -1;
  EXPECT_THROW(Renderer(t, r), Error);
}

}  // namespace
}  // namespace stridemark::synth
