#pragma once
// Internal: the ground's image motion between two frames, measured on a grid of points in the
// band where the feet walk (pyramidal Lucas-Kanade with a forward-backward check, Kalal et al.
// 2010). Points on flat areas or that do not track back to where they started are dropped, so
// a plain belt or a uniform floor gives no samples rather than wrong ones.
#include <cstdint>
#include <optional>
#include <vector>

#include <opencv2/core.hpp>

namespace stridemark::vision::detail {

struct FlowField {
  std::vector<cv::Point2f> from;   // grid points that tracked (working pixels, first image)
  std::vector<cv::Point2f> shift;  // their motion to the second image
};

class GroundFlow {
 public:
  // Grid over rows [top, bottom] of an image of `size`, one point every `spacing` pixels.
  GroundFlow(cv::Size size, int top, int bottom, int spacing);
  // Motion from `first` to `second` (consecutive frames in presentation order).
  FlowField measure(const cv::Mat& first, const cv::Mat& second) const;

 private:
  std::vector<cv::Point2f> grid_;
};

// The ground's motion under a foot: the median shift of samples in the rows just below the
// foot's stance level and within `reach` pixels sideways, leaving out samples on any foot
// (`feet`, within `radius`). Empty when fewer than `minSamples` remain.
std::optional<cv::Point2d> groundShiftNear(const FlowField& field, cv::Point2d foot,
                                           double stanceRow, int radius,
                                           const std::vector<cv::Point2d>& feet,
                                           int minSamples = 4);

}  // namespace stridemark::vision::detail
