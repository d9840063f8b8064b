#pragma once
// Internal: the picture the vision code works on. Luma only, scaled so the long side is at most
// kWorkWidth pixels: feet stay several pixels wide at that size, and the cost of a frame no
// longer grows with the video's resolution.
#include <opencv2/core.hpp>

#include "video/decoded_frame.h"

namespace stridemark::vision::detail {

inline constexpr int kWorkLongSide = 720;

// Video pixels per working pixel (>= 1).
double workScaleFor(int width, int height);

// Converts a decoded frame (any pixel format) to 8-bit grey at the working size.
class WorkImageMaker {
 public:
  WorkImageMaker(int width, int height);
  cv::Mat make(const video::DecodedFrame& frame);
  double scale() const { return scale_; }
  cv::Size size() const { return size_; }

 private:
  double scale_ = 1;
  cv::Size size_;
  cv::Mat bgr_, grey_;
};

}  // namespace stridemark::vision::detail
