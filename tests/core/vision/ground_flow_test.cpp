// Ground motion measured on textures moved by known amounts.
#include "vision/ground_flow.h"

#include <gtest/gtest.h>

#include <opencv2/imgproc.hpp>

namespace stridemark::vision::detail {
namespace {

cv::Mat gravel(cv::Size size, unsigned seed) {
  cv::Mat noise(size, CV_8UC1);
  cv::RNG rng(seed);
  rng.fill(noise, cv::RNG::UNIFORM, 0, 255);
  cv::Mat smooth;
  cv::GaussianBlur(noise, smooth, cv::Size(0, 0), 1.5);
  return smooth;
}

cv::Mat shifted(const cv::Mat& image, double dx, double dy) {
  const cv::Mat m = (cv::Mat_<double>(2, 3) << 1, 0, dx, 0, 1, dy);
  cv::Mat out;
  cv::warpAffine(image, out, m, image.size(), cv::INTER_CUBIC, cv::BORDER_REFLECT);
  return out;
}

// Source: Kalal, Mikolajczyk & Matas 2010 (forward-backward error) and the Lucas-Kanade
// method; a textured belt moved by a known sub-pixel shift is measured to 0.1 px.
TEST(GroundFlow, MeasuresABeltShiftedByAKnownAmount) {
  const cv::Mat first = gravel({320, 180}, 3);
  const cv::Mat second = shifted(first, -2.6, 0.0);
  const GroundFlow flow({320, 180}, 60, 170, 8);
  const FlowField field = flow.measure(first, second);
  ASSERT_GT(field.from.size(), 100u);
  const auto shift = groundShiftNear(field, {160, 80}, 80, 8, {});
  ASSERT_TRUE(shift);
  EXPECT_NEAR(shift->x, -2.6, 0.1);
  EXPECT_NEAR(shift->y, 0.0, 0.1);
}

// Common practice, no source: a flat surface has nothing to track; no samples is the honest
// answer (the caller then knows the ground's motion is unknown there).
TEST(GroundFlow, AFlatSurfaceGivesNoSamples) {
  const cv::Mat flat(180, 320, CV_8UC1, cv::Scalar(90));
  const GroundFlow flow({320, 180}, 60, 170, 8);
  EXPECT_TRUE(flow.measure(flat, flat).from.empty());
  EXPECT_FALSE(groundShiftNear(flow.measure(flat, flat), {160, 80}, 80, 8, {}));
}

// Source: docs/methods.md §13 (v_ground is the belt's image velocity near the foot): samples
// above the foot's stance row (the animal, the room) and on other feet are left out.
TEST(GroundFlow, UsesOnlyTheRowsBelowTheFoot) {
  cv::Mat first = gravel({320, 180}, 5);
  cv::Mat second = first.clone();
  // The lower band moves (the belt); the upper part stays (the room).
  shifted(first, 3.0, 0).rowRange(100, 180).copyTo(second.rowRange(100, 180));
  const GroundFlow flow({320, 180}, 20, 175, 6);
  const FlowField field = flow.measure(first, second);
  const auto belt = groundShiftNear(field, {160, 98}, 98, 8, {});
  ASSERT_TRUE(belt);
  EXPECT_NEAR(belt->x, 3.0, 0.15);
  const auto room = groundShiftNear(field, {160, 40}, 40, 8, {});
  ASSERT_TRUE(room);
  EXPECT_NEAR(room->x, 0.0, 0.15);
}

}  // namespace
}  // namespace stridemark::vision::detail
