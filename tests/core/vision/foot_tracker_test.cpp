// Following a drawn foot across frames with known positions.
#include "vision/foot_tracker.h"

#include <gtest/gtest.h>

#include <opencv2/imgproc.hpp>

namespace stridemark::vision::detail {
namespace {

// A dark hoof-like blob with a lighter leg above it on a textured floor.
cv::Mat scene(cv::Point2d foot, bool coverFoot = false) {
  cv::Mat image(200, 320, CV_8UC1);
  cv::RNG rng(11);
  rng.fill(image, cv::RNG::UNIFORM, 150, 200);
  cv::GaussianBlur(image, image, cv::Size(0, 0), 1.0);
  const int shift = 4;
  const auto fixed = [&](cv::Point2d p) {
    return cv::Point(static_cast<int>(p.x * (1 << shift)), static_cast<int>(p.y * (1 << shift)));
  };
  cv::line(image, fixed(foot + cv::Point2d(-6, -40)), fixed(foot), cv::Scalar(110), 6, cv::LINE_AA,
           shift);
  cv::ellipse(image, fixed(foot), cv::Size(7 << shift, 4 << shift), 0, 0, 360, cv::Scalar(30), -1,
              cv::LINE_AA, shift);
  if (coverFoot)
    cv::rectangle(image, cv::Rect(static_cast<int>(foot.x) - 15, 0, 30, 200), cv::Scalar(240), -1);
  return image;
}

cv::Point2d footAt(int frame) {
  // A swing: forward 4 px per frame and up and down, then standing.
  if (frame < 20) return {80 + 4.0 * frame, 150 - 15 * std::sin(M_PI * frame / 20.0)};
  return {160, 150};
}

// Common practice, no source: a clearly drawn moving foot is followed to within half a pixel
// (normalised cross-correlation with a sub-pixel peak).
TEST(FootTracker, FollowsAMovingFootToHalfAPixel) {
  FootTracker tracker(scene(footAt(0)), footAt(0), 8);
  cv::Mat previous = scene(footAt(0));
  for (int f = 1; f < 30; ++f) {
    const cv::Mat image = scene(footAt(f));
    const TrackSample s = tracker.step(previous, image, cv::Point2d(0, 0));
    ASSERT_TRUE(s.visible) << f;
    EXPECT_NEAR(s.at.x, footAt(f).x, 0.5) << f;
    EXPECT_NEAR(s.at.y, footAt(f).y, 0.5) << f;
    EXPECT_GT(s.quality, 0.7);
    previous = image;
  }
}

// Issue 18 item 1: a foot hidden for a few frames is reported as not visible there and
// re-acquired when it shows again.
TEST(FootTracker, CoveredFootIsLostThenReacquired) {
  FootTracker tracker(scene({160, 150}), {160, 150}, 8);
  cv::Mat previous = scene({160, 150});
  for (int f = 1; f <= 12; ++f) {
    const bool covered = f >= 4 && f <= 8;
    const cv::Mat image = scene({160, 150}, covered);
    const TrackSample s = tracker.step(previous, image, cv::Point2d(0, 0));
    EXPECT_EQ(s.visible, !covered) << f;
    if (!covered) {
      EXPECT_NEAR(cv::norm(s.at - cv::Point2d(160, 150)), 0, 0.5) << f;
    }
    previous = image;
  }
}

}  // namespace
}  // namespace stridemark::vision::detail
