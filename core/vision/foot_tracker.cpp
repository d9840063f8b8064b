#include "vision/foot_tracker.h"

#include <algorithm>
#include <cmath>

#include <opencv2/imgproc.hpp>

namespace stridemark::vision::detail {

namespace {

// A match this good with the previous frame's patch counts as the same foot.
constexpr double kFollowScore = 0.6;
// ... and it must still resemble a remembered look of the foot this much.
constexpr double kLookScore = 0.35;
// A lost foot is found again only by a clear match with a remembered look.
constexpr double kReacquireScore = 0.7;

struct Peak {
  cv::Point2d at;
  double score = -1;
};

// Offset of a parabola's vertex through three samples (-0.5..0.5).
double vertexOffset(float left, float centre, float right) {
  const double curvature = left - 2.0 * centre + right;
  if (curvature >= 0) return 0;
  return std::clamp(0.5 * (left - right) / curvature, -0.5, 0.5);
}

// Normalised cross-correlation of `patch` at every centre inside `window`; `area` receives
// the image rectangle searched (scores(y, x) is the centre area.tl() + (x + r, y + r)).
cv::Mat scoreMap(const cv::Mat& image, const cv::Mat& patch, cv::Rect window, cv::Rect& area) {
  const int r = patch.cols / 2;
  area = cv::Rect(window.x - r, window.y - r, window.width + 2 * r, window.height + 2 * r);
  area &= cv::Rect(0, 0, image.cols, image.rows);
  if (area.width < patch.cols + 2 || area.height < patch.rows + 2) return {};
  cv::Mat scores;
  cv::matchTemplate(image(area), patch, scores, cv::TM_CCOEFF_NORMED);
  cv::patchNaNs(scores, -1);
  return scores;
}

// Where a foot can be next: it keeps its motion, or it moves with the ground (it landed).
struct MotionPrior {
  std::vector<cv::Point2d> expected;
  std::vector<cv::Point2d> taken;  // other feet: a place one of them holds
  double takenRadius = 0;
  double sigma = 1;   // pixels
  double weight = 0;  // score lost at one sigma from every expectation
  double cap = 0.25;  // at most: a clear match far from every expectation still wins
  double penalty(cv::Point2d at) const {
    double nearest = 1e30;
    for (const auto& e : expected)
      nearest = std::min(nearest, (at.x - e.x) * (at.x - e.x) + (at.y - e.y) * (at.y - e.y));
    double cost = std::min(cap, weight * nearest / (sigma * sigma));
    for (const auto& t : taken)
      if (std::hypot(at.x - t.x, at.y - t.y) < takenRadius) cost += 1.0;
    return cost;
  }
};

// The best centre of a score map, to a fraction of a pixel. With a prior, scores fall with the
// distance from where the foot can be: of two similar feet, the one where this foot should be
// wins.
Peak peakOf(const cv::Mat& scores, cv::Rect area, int r, const MotionPrior* prior = nullptr) {
  if (scores.empty()) return {};
  cv::Mat ranked = scores;
  if (prior) {
    ranked = scores.clone();
    for (int y = 0; y < ranked.rows; ++y) {
      auto* row = ranked.ptr<float>(y);
      for (int x = 0; x < ranked.cols; ++x)
        row[x] -= static_cast<float>(prior->penalty({area.x + x + r + 0.0, area.y + y + r + 0.0}));
    }
  }
  cv::Point loc;
  cv::minMaxLoc(ranked, nullptr, nullptr, nullptr, &loc);
  // The prior picks the peak; the fraction of a pixel comes from the match alone, so the prior
  // does not pull the position towards the expectation.
  double dx = 0, dy = 0;
  if (loc.x > 0 && loc.x + 1 < scores.cols)
    dx = vertexOffset(scores.at<float>(loc.y, loc.x - 1), scores.at<float>(loc.y, loc.x),
                      scores.at<float>(loc.y, loc.x + 1));
  if (loc.y > 0 && loc.y + 1 < scores.rows)
    dy = vertexOffset(scores.at<float>(loc.y - 1, loc.x), scores.at<float>(loc.y, loc.x),
                      scores.at<float>(loc.y + 1, loc.x));
  return {{area.x + loc.x + r + dx, area.y + loc.y + r + dy}, scores.at<float>(loc)};
}

double correlation(const cv::Mat& a, const cv::Mat& b) {
  cv::Mat score;
  cv::matchTemplate(a, b, score, cv::TM_CCOEFF_NORMED);
  const float value = score.at<float>(0, 0);
  return std::isfinite(value) ? value : 0.0;
}

cv::Rect windowAround(cv::Point2d centre, double halfSize) {
  const int h = static_cast<int>(std::ceil(halfSize));
  return {static_cast<int>(std::lround(centre.x)) - h, static_cast<int>(std::lround(centre.y)) - h,
          2 * h + 1, 2 * h + 1};
}

}  // namespace

FootTracker::FootTracker(const cv::Mat& image, cv::Point2d seed, int radius)
    : radius_(radius), speedScale_(2.0 * radius) {
  reseed(image, seed);
}

void FootTracker::reseed(const cv::Mat& image, cv::Point2d seed) {
  at_ = seed;
  velocity_ = {0, 0};
  visible_ = true;
  framesLost_ = 0;
  quality_ = 1;
  seedPatch_ = patchAt(image, seed);
  goodPatch_ = seedPatch_.clone();
}

cv::Mat FootTracker::patchAt(const cv::Mat& image, cv::Point2d centre) const {
  cv::Mat patch;
  const int side = 2 * radius_ + 1;
  cv::getRectSubPix(image, cv::Size(side, side), cv::Point2f(centre), patch);
  return patch;
}

double FootTracker::looksLikeFoot(const cv::Mat& patch) const {
  return std::max(correlation(patch, seedPatch_), correlation(patch, goodPatch_));
}

TrackSample FootTracker::current() const {
  return {at_, quality_, visible_};
}

TrackSample FootTracker::step(const cv::Mat& from, const cv::Mat& to,
                              std::optional<cv::Point2d> groundShift,
                              const std::vector<cv::Point2d>& avoid) {
  const TrackSample sample =
      visible_ ? follow(from, to, groundShift, avoid) : reacquire(to, groundShift, avoid);
  at_ = sample.at;
  quality_ = sample.quality;
  visible_ = sample.visible;
  return sample;
}

TrackSample FootTracker::follow(const cv::Mat& from, const cv::Mat& to,
                                std::optional<cv::Point2d> groundShift,
                                const std::vector<cv::Point2d>& avoid) {
  const cv::Mat previous = patchAt(from, at_);
  const cv::Point2d predicted = at_ + velocity_;
  // Room to stop, start or turn (a swinging foot can double its speed), or to move with a fast
  // belt from the first frame on.
  const double ground = groundShift ? cv::norm(*groundShift) : 0.0;
  const double reach =
      std::max({1.0 * radius_, 2.0 * cv::norm(velocity_) + 3, 1.2 * speedScale_, 1.5 * ground + 3});
  // Where the previous frame's patch fits, held to the foot's remembered looks so the match
  // does not slide up the leg or onto a crossing leg.
  const cv::Rect window = windowAround(predicted, reach);
  cv::Rect area;
  cv::Mat scores = scoreMap(to, previous, window, area);
  if (!scores.empty()) {
    cv::Rect same;
    const cv::Mat seedScores = scoreMap(to, seedPatch_, window, same);
    const cv::Mat goodScores = scoreMap(to, goodPatch_, window, same);
    cv::Mat look;
    cv::max(seedScores, goodScores, look);
    scores = 0.25 * scores + 0.75 * look;
  }
  MotionPrior prior;
  prior.expected = {predicted};
  if (groundShift) prior.expected.push_back(at_ + *groundShift);
  prior.sigma = std::max(1.5, 0.15 * reach);
  prior.weight = 0.15;
  prior.taken = avoid;
  prior.takenRadius = 0.7 * radius_;
  Peak peak = peakOf(scores, area, radius_, &prior);
  const double look = peak.score > -1 ? looksLikeFoot(patchAt(to, peak.at)) : 0;
  peak.score = peak.score > -1 ? correlation(patchAt(to, peak.at), previous) : -1;
  const bool inside = peak.at.x >= radius_ && peak.at.y >= radius_ &&
                      peak.at.x <= to.cols - 1 - radius_ && peak.at.y <= to.rows - 1 - radius_;
  if (peak.score >= kFollowScore && look >= kLookScore && inside) {
    velocity_ = peak.at - at_;
    speedScale_ = std::max(0.995 * speedScale_, cv::norm(velocity_));
    // Remember a clear current look: feet turn and blur over a stride.
    if (peak.score > 0.9 && correlation(patchAt(to, peak.at), seedPatch_) > 0.8)
      goodPatch_ = patchAt(to, peak.at);
    return {peak.at, std::clamp(std::min(peak.score, 0.4 + look), 0.0, 1.0), true};
  }
  framesLost_ = 1;
  return {predicted, 0, false};
}

TrackSample FootTracker::reacquire(const cv::Mat& to, std::optional<cv::Point2d> groundShift,
                                   const std::vector<cv::Point2d>& avoid) {
  ++framesLost_;
  // A foot lost while standing stays on the ground: it moves with it. A swinging one drifts on
  // as it last moved. The longer it has been gone, the wider the search.
  if (framesLost_ == 2)
    lostStanding_ =
        groundShift && cv::norm(velocity_ - *groundShift) < 0.3 * cv::norm(velocity_) + 0.5;
  if (lostStanding_ && groundShift) {
    velocity_ = *groundShift;
  } else {
    velocity_ *= 0.85;
  }
  const cv::Point2d predicted = at_ + velocity_;
  const double reach = std::min(3.0 * radius_ + 2.0 * framesLost_, 12.0 * radius_);
  const cv::Rect window = windowAround(predicted, reach);
  cv::Rect area;
  cv::Mat scores = scoreMap(to, goodPatch_, window, area);
  if (scores.empty()) return {predicted, 0, false};
  cv::Rect same;
  cv::max(scores, scoreMap(to, seedPatch_, window, same), scores);
  // Never re-found on top of another foot that is being followed.
  MotionPrior prior;
  prior.expected = {predicted};
  prior.sigma = std::max(2.0, 0.5 * reach);
  prior.weight = 0.1;
  prior.taken = avoid;
  prior.takenRadius = 1.0 * radius_;
  const Peak best = peakOf(scores, area, radius_, &prior);
  if (best.score >= kReacquireScore && prior.penalty(best.at) < 1.0) {
    framesLost_ = 0;
    velocity_ = {0, 0};
    return {best.at, std::clamp(best.score, 0.0, 1.0), true};
  }
  return {predicted, 0, false};
}

}  // namespace stridemark::vision::detail
