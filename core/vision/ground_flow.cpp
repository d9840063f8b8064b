#include "vision/ground_flow.h"

#include <algorithm>
#include <cmath>
#include <utility>

#include <opencv2/video/tracking.hpp>

#include "vision/order_stats.h"

namespace stridemark::vision::detail {

namespace {

constexpr float kForwardBackwardLimit = 0.5f;  // pixels
const cv::Size kWindow(11, 11);
constexpr int kLevels = 2;

}  // namespace

GroundFlow::GroundFlow(cv::Size size, int top, int bottom, int spacing) {
  top = std::clamp(top, 0, size.height - 1);
  bottom = std::clamp(bottom, top, size.height - 1);
  spacing = std::max(2, spacing);
  for (int y = top + spacing / 2; y <= bottom; y += spacing)
    for (int x = spacing / 2; x < size.width; x += spacing)
      grid_.emplace_back(static_cast<float>(x), static_cast<float>(y));
}

FlowField GroundFlow::measure(const cv::Mat& first, const cv::Mat& second) const {
  FlowField field;
  if (grid_.empty()) return field;
  std::vector<cv::Point2f> ahead, back;
  std::vector<unsigned char> okAhead, okBack;
  std::vector<float> error;
  const cv::TermCriteria stop(cv::TermCriteria::COUNT | cv::TermCriteria::EPS, 20, 0.03);
  // A minimum eigenvalue threshold drops points on flat areas (no texture to track).
  cv::calcOpticalFlowPyrLK(first, second, grid_, ahead, okAhead, error, kWindow, kLevels, stop, 0,
                           5e-3);
  cv::calcOpticalFlowPyrLK(second, first, ahead, back, okBack, error, kWindow, kLevels, stop, 0,
                           5e-3);
  for (std::size_t i = 0; i < grid_.size(); ++i) {
    if (!okAhead[i] || !okBack[i]) continue;
    if (cv::norm(back[i] - grid_[i]) > kForwardBackwardLimit) continue;
    field.from.push_back(grid_[i]);
    field.shift.push_back(ahead[i] - grid_[i]);
  }
  return field;
}

std::optional<cv::Point2d> groundShiftNear(const FlowField& field, cv::Point2d foot,
                                           double stanceRow, int radius,
                                           const std::vector<cv::Point2d>& feet, int minSamples) {
  std::vector<double> dx, dy;
  const double rowTop = stanceRow + 0.3 * radius, rowBottom = stanceRow + 3.0 * radius;
  const double sideways = 5.0 * radius;
  for (std::size_t i = 0; i < field.from.size(); ++i) {
    const cv::Point2f p = field.from[i];
    if (p.y < rowTop || p.y > rowBottom || std::abs(p.x - foot.x) > sideways) continue;
    const bool onAFoot = std::any_of(feet.begin(), feet.end(), [&](const cv::Point2d& f) {
      return std::abs(p.x - f.x) <= radius && std::abs(p.y - f.y) <= radius;
    });
    if (onAFoot) continue;
    dx.push_back(field.shift[i].x);
    dy.push_back(field.shift[i].y);
  }
  if (static_cast<int>(dx.size()) < minSamples) return std::nullopt;
  return cv::Point2d(upperMedian(std::move(dx)), upperMedian(std::move(dy)));
}

}  // namespace stridemark::vision::detail
