#pragma once
// Internal: one foot followed from frame to frame in working-size grey images.
//
// Each step matches the foot's patch from the previous frame inside a window around where its
// last motion predicts it (normalised cross-correlation, sub-pixel peak). The match must also
// still look like the foot: like the patch a person clicked, or the last patch that matched
// well. Otherwise the foot counts as covered or lost, and later steps search for those patches
// in a growing window until it shows again (the foot is re-acquired).
#include <optional>
#include <vector>

#include <opencv2/core.hpp>

namespace stridemark::vision::detail {

struct TrackSample {
  cv::Point2d at;      // working pixels
  double quality = 0;  // 0-1
  bool visible = false;
};

class FootTracker {
 public:
  // `radius`: half the patch side in working pixels.
  FootTracker(const cv::Mat& image, cv::Point2d seed, int radius);

  // A person's click on this foot in `image`: jump there and remember the look.
  void reseed(const cv::Mat& image, cv::Point2d seed);
  // From `from` (the image of the current position) to the next image in tracking order.
  // `groundShift`: how the ground near the foot moves between the two images, when known.
  // `avoid`: where other feet were found in `to`; two feet never take the same place.
  TrackSample step(const cv::Mat& from, const cv::Mat& to, std::optional<cv::Point2d> groundShift,
                   const std::vector<cv::Point2d>& avoid = {});
  // Where the foot would be if it kept its last motion.
  cv::Point2d predicted() const { return at_ + velocity_; }
  int radius() const { return radius_; }
  TrackSample current() const;

 private:
  TrackSample follow(const cv::Mat& from, const cv::Mat& to, std::optional<cv::Point2d> groundShift,
                     const std::vector<cv::Point2d>& avoid);
  TrackSample reacquire(const cv::Mat& to, std::optional<cv::Point2d> groundShift,
                        const std::vector<cv::Point2d>& avoid);
  cv::Mat patchAt(const cv::Mat& image, cv::Point2d centre) const;
  double looksLikeFoot(const cv::Mat& patch) const;

  int radius_;
  cv::Point2d at_, velocity_;
  bool visible_ = true;
  int framesLost_ = 0;
  bool lostStanding_ = false;  // lost while moving with the ground
  double quality_ = 1;
  double speedScale_ = 0;  // recent top speed, for how far the next step may reach
  cv::Mat seedPatch_, goodPatch_;
};

}  // namespace stridemark::vision::detail
