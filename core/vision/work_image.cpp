#include "vision/work_image.h"

#include <algorithm>
#include <cmath>

#include <opencv2/imgproc.hpp>

#include "video/convert.h"

extern "C" {
#include <libavutil/pixdesc.h>
}

namespace stridemark::vision::detail {

namespace {

// True when plane 0 holds 8-bit luma, one byte per pixel (planar and semi-planar YUV).
bool hasPlainLumaPlane(int pixelFormat) {
  const AVPixFmtDescriptor* desc = av_pix_fmt_desc_get(static_cast<AVPixelFormat>(pixelFormat));
  if (!desc || (desc->flags & AV_PIX_FMT_FLAG_RGB) || (desc->flags & AV_PIX_FMT_FLAG_PAL))
    return false;
  const AVComponentDescriptor& y = desc->comp[0];
  return y.plane == 0 && y.step == 1 && y.depth == 8 && y.shift == 0;
}

}  // namespace

double workScaleFor(int width, int height) {
  const int longSide = std::max(width, height);
  return longSide > kWorkLongSide ? static_cast<double>(longSide) / kWorkLongSide : 1.0;
}

WorkImageMaker::WorkImageMaker(int width, int height) : scale_(workScaleFor(width, height)) {
  size_ = cv::Size(std::max(1, static_cast<int>(std::lround(width / scale_))),
                   std::max(1, static_cast<int>(std::lround(height / scale_))));
}

cv::Mat WorkImageMaker::make(const video::DecodedFrame& frame) {
  cv::Mat full;
  if (hasPlainLumaPlane(frame.pixelFormat())) {
    // The decoder's luma plane, viewed without a copy.
    full = cv::Mat(frame.height(), frame.width(), CV_8UC1,
                   const_cast<std::uint8_t*>(frame.planes()[0]),
                   static_cast<std::size_t>(frame.linesizes()[0]));
  } else {
    bgr_.create(frame.height(), frame.width(), CV_8UC3);
    video::toBgr(frame, bgr_.data, static_cast<int>(bgr_.step));
    cv::cvtColor(bgr_, grey_, cv::COLOR_BGR2GRAY);
    full = grey_;
  }
  cv::Mat out;
  if (full.size() == size_)
    out = full.clone();
  else
    cv::resize(full, out, size_, 0, 0, cv::INTER_AREA);
  return out;
}

}  // namespace stridemark::vision::detail
