// Proposals from video: decode the range once forwards (and, for feet seeded later than the
// start, backwards in short chunks), track every seeded foot, measure the ground's motion, then
// apply the stance rule per foot. See propose.h and docs/methods.md §13.
#include "vision/propose.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <memory>
#include <utility>

#include "common/error.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "vision/foot_tracker.h"
#include "vision/ground_flow.h"
#include "vision/order_stats.h"
#include "vision/stance_rule.h"
#include "vision/work_image.h"

namespace stridemark::vision {

namespace {

using detail::FootTracker;
using detail::TrackSample;

constexpr std::int64_t kBackwardChunk = 96;  // frames held at once when tracking backwards

struct Span {
  std::int64_t first = 0, last = 0;
  std::size_t size() const { return static_cast<std::size_t>(last - first + 1); }
};

class Run {
 public:
  Run(const ProposeRequest& request, const ProposeProgress& progress)
      : request_(request), progress_(progress) {}

  ProposeResult go();

 private:
  void open();
  void checkSeeds();
  void setUpGeometry(const video::DecodedFrame& frame);
  void forwardPass();
  void backwardPass();
  void tick();
  void measureFlow(std::int64_t pair, const cv::Mat& first, const cv::Mat& second);
  void unmergeTracks();
  // The ground's shift near a foot from frame `pair` to `pair` + 1, for the tracker's prior.
  std::optional<cv::Point2d> shiftNear(std::int64_t pair, cv::Point2d foot) const;
  cv::Point2d seedPoint(const model::FootSeed& seed) const;
  std::vector<std::optional<detail::Vec2>> groundUnder(int limb) const;
  ProposeResult collect() const;

  const ProposeRequest& request_;
  const ProposeProgress& progress_;
  std::shared_ptr<const video::FrameIndex> index_;
  std::unique_ptr<video::FrameReader> reader_;
  Span span_;
  std::map<int, std::vector<model::FootSeed>> seeds_;  // by limb, ascending frames
  std::unique_ptr<detail::WorkImageMaker> maker_;
  std::unique_ptr<detail::GroundFlow> grid_;
  int radius_ = 8;
  int width_ = 0, height_ = 0;
  std::map<int, std::vector<TrackSample>> samples_;     // per limb, one per frame of the span
  std::vector<std::optional<detail::FlowField>> flow_;  // per frame pair of the span
  std::int64_t done_ = 0, total_ = 0, decoded_ = 0;
};

using ShiftFor = std::function<std::optional<cv::Point2d>(cv::Point2d foot)>;

// Steps every tracker from `from` to `to`. Where two feet end up on one place, the one that
// left its own course more steps again, kept off the other's place (crossing legs).
std::map<int, TrackSample> stepFeet(std::map<int, std::unique_ptr<FootTracker>>& trackers,
                                    const std::vector<int>& active, const cv::Mat& from,
                                    const cv::Mat& to, const ShiftFor& shiftFor) {
  std::map<int, TrackSample> out;
  std::map<int, FootTracker> before;
  std::vector<int> lost;
  for (const int limb : active) {
    FootTracker& tracker = *trackers.at(limb);
    before.emplace(limb, tracker);
    if (!tracker.current().visible) {
      lost.push_back(limb);
      continue;
    }
    out[limb] = tracker.step(from, to, shiftFor(tracker.current().at));
  }
  // Lost feet search after the followed ones are placed, and never where one of them is.
  std::vector<cv::Point2d> placed;
  for (const auto& [limb, sample] : out)
    if (sample.visible) placed.push_back(sample.at);
  for (const int limb : lost) {
    FootTracker& tracker = *trackers.at(limb);
    out[limb] = tracker.step(from, to, shiftFor(tracker.current().at), placed);
  }
  for (std::size_t i = 0; i < active.size(); ++i)
    for (std::size_t j = i + 1; j < active.size(); ++j) {
      const int a = active[i], b = active[j];
      if (!out[a].visible || !out[b].visible) continue;
      const double r = trackers.at(a)->radius();
      if (cv::norm(out[a].at - out[b].at) >= 0.7 * r) continue;
      const double offA = cv::norm(out[a].at - before.at(a).predicted());
      const double offB = cv::norm(out[b].at - before.at(b).predicted());
      const int loser = offA > offB ? a : b, winner = loser == a ? b : a;
      FootTracker& tracker = *trackers.at(loser);
      tracker = before.at(loser);
      out[loser] = tracker.step(from, to, shiftFor(tracker.current().at), {out[winner].at});
    }
  return out;
}

std::size_t at(const Span& span, std::int64_t frame) {
  return static_cast<std::size_t>(frame - span.first);
}

void Run::open() {
  const std::string path = request_.video.string();
  index_ = std::make_shared<const video::FrameIndex>(video::FrameIndex::openCached(path));
  if (index_->frameCount() < 2)
    throw Error(ErrorCategory::decode,
                path + ": the clip has fewer than 2 frames; nothing to track");
  video::ReaderOptions options;
  options.decodeThreads = 2;  // throughput: frames are read in order
  reader_ = std::make_unique<video::FrameReader>(path, index_, options);
  span_ = {0, index_->frameCount() - 1};
  if (request_.range) {
    const auto& r = *request_.range;
    if (r.first < 0 || r.last >= index_->frameCount() || r.last <= r.first)
      throw Error(ErrorCategory::format,
                  path + ": range " + std::to_string(r.first) + ".." + std::to_string(r.last) +
                      " is not inside the clip's frames 0.." +
                      std::to_string(index_->frameCount() - 1) + " (or has fewer than 2 frames)");
    span_ = {r.first, r.last};
  }
}

void Run::checkSeeds() {
  const std::string problem =
      seedProblem(request_.seeds, request_.limbs, index_->frameCount(), width_, height_);
  if (!problem.empty())
    throw Error(ErrorCategory::format, request_.video.string() + ": " + problem);
  for (const auto& seed : request_.seeds) {
    if (seed.frame < span_.first || seed.frame > span_.last) continue;
    seeds_[seed.limb].push_back(seed);
  }
  for (const auto& seed : request_.seeds) {
    if (seeds_.count(seed.limb)) continue;
    throw Error(ErrorCategory::format,
                request_.video.string() + ": the seed of " + request_.limbs.label(seed.limb) +
                    " at frame " + std::to_string(seed.frame) + " is outside the range " +
                    std::to_string(span_.first) + ".." + std::to_string(span_.last) +
                    "; add a seed for it inside the range");
  }
  for (auto& [limb, list] : seeds_)
    std::sort(list.begin(), list.end(),
              [](const auto& a, const auto& b) { return a.frame < b.frame; });
}

void Run::setUpGeometry(const video::DecodedFrame& frame) {
  width_ = frame.width();
  height_ = frame.height();
  maker_ = std::make_unique<detail::WorkImageMaker>(width_, height_);
  const cv::Size work = maker_->size();
  radius_ = std::max(5, static_cast<int>(std::lround(std::min(work.width, work.height) / 40.0)));
}

cv::Point2d Run::seedPoint(const model::FootSeed& seed) const {
  return {seed.x / maker_->scale(), seed.y / maker_->scale()};
}

void Run::tick() {
  ++done_;
  if (progress_ && done_ % 4 == 0 && !progress_(done_, total_))
    throw Error(ErrorCategory::analysis, "proposing events was cancelled; nothing was changed");
}

void Run::measureFlow(std::int64_t pair, const cv::Mat& first, const cv::Mat& second) {
  if (request_.scene == Scene::overground || !grid_) return;
  auto& slot = flow_[at(span_, pair)];
  if (!slot) slot = grid_->measure(first, second);
}

std::optional<cv::Point2d> Run::shiftNear(std::int64_t pair, cv::Point2d foot) const {
  if (request_.scene == Scene::overground) return cv::Point2d(0, 0);
  const auto& field = flow_[at(span_, pair)];
  if (!field) return std::nullopt;
  return detail::groundShiftNear(*field, foot, foot.y, radius_, {foot});
}

void Run::forwardPass() {
  std::int64_t start = span_.last;
  for (const auto& [limb, list] : seeds_) start = std::min(start, list.front().frame);
  std::map<int, std::unique_ptr<FootTracker>> trackers;
  std::map<int, std::size_t> nextSeed;
  cv::Mat previous;
  std::int64_t previousFrame = -1;
  reader_->decodeSpan(
      start, span_.last,
      [&](video::DecodedFrame&& frame) {
        const std::int64_t t = frame.index();
        ++decoded_;
        cv::Mat image = maker_->make(frame);
        const bool usable = !frame.damaged;
        // (previousFrame starts at -1: frame 0 has no pair before it.)
        const bool follows = !previous.empty() && previousFrame == t - 1;
        if (usable && follows) measureFlow(t - 1, previous, image);
        std::vector<int> stepping;
        for (const auto& [limb, list] : seeds_) {
          auto& tracker = trackers[limb];
          std::size_t& next = nextSeed[limb];
          if (usable && next < list.size() && list[next].frame == t) {
            if (!tracker)
              tracker = std::make_unique<FootTracker>(image, seedPoint(list[next]), radius_);
            else
              tracker->reseed(image, seedPoint(list[next]));
            ++next;
            samples_[limb][at(span_, t)] = tracker->current();
          } else if (tracker && usable && !previous.empty()) {
            stepping.push_back(limb);
          } else if (tracker) {
            samples_[limb][at(span_, t)] = {tracker->current().at, 0, false};
          }
        }
        if (!stepping.empty()) {
          const bool consecutive = follows;
          const auto steps = stepFeet(trackers, stepping, previous, image, [&](cv::Point2d foot) {
            return consecutive ? shiftNear(t - 1, foot) : std::nullopt;
          });
          for (const auto& [limb, sample] : steps) samples_[limb][at(span_, t)] = sample;
        }
        if (usable) {
          previous = image;
          previousFrame = t;
        }
        tick();
        return true;
      },
      [&](std::int64_t, const std::string&) { tick(); });
}

void Run::backwardPass() {
  std::int64_t top = span_.first;
  for (const auto& [limb, list] : seeds_) top = std::max(top, list.front().frame);
  std::map<int, std::unique_ptr<FootTracker>> trackers;
  std::int64_t high = top;
  while (high > span_.first) {
    const std::int64_t low = std::max(span_.first, high - kBackwardChunk);
    std::vector<cv::Mat> images(static_cast<std::size_t>(high - low + 1));
    reader_->decodeSpan(
        low, high,
        [&](video::DecodedFrame&& frame) {
          ++decoded_;
          if (!frame.damaged)
            images[static_cast<std::size_t>(frame.index() - low)] = maker_->make(frame);
          return true;
        },
        [&](std::int64_t, const std::string&) {});
    auto image = [&](std::int64_t t) -> const cv::Mat& {
      return images[static_cast<std::size_t>(t - low)];
    };
    for (std::int64_t t = high - 1; t >= low; --t) {
      if (!image(t).empty() && !image(t + 1).empty()) measureFlow(t, image(t), image(t + 1));
      std::vector<int> stepping;
      for (const auto& [limb, list] : seeds_) {
        const model::FootSeed& first = list.front();
        if (first.frame <= t) continue;
        auto& tracker = trackers[limb];
        if (!tracker && first.frame == t + 1 && !image(t + 1).empty())
          tracker = std::make_unique<FootTracker>(image(t + 1), seedPoint(first), radius_);
        if (!tracker) continue;
        samples_[limb][at(span_, t)] = {tracker->current().at, 0, false};
        stepping.push_back(limb);
      }
      // A damaged frame is skipped: the next step goes from the last good picture.
      std::int64_t from = t + 1;
      while (from <= high && image(from).empty()) ++from;
      if (!stepping.empty() && !image(t).empty() && from <= high) {
        const auto steps =
            stepFeet(trackers, stepping, image(from), image(t), [&](cv::Point2d foot) {
              auto shift = from == t + 1 ? shiftNear(t, foot) : std::nullopt;
              if (shift) *shift = -*shift;  // tracking runs backwards in time
              return shift;
            });
        for (const auto& [limb, sample] : steps) samples_[limb][at(span_, t)] = sample;
      }
      tick();
    }
    high = low;
  }
}

std::vector<std::optional<detail::Vec2>> Run::groundUnder(int limb) const {
  const auto& mine = samples_.at(limb);
  std::vector<std::optional<detail::Vec2>> ground(span_.size() - 1);
  if (request_.scene == Scene::overground) {
    std::fill(ground.begin(), ground.end(), detail::Vec2{0, 0});
    return ground;
  }
  // The foot's stance level: feet are lowest in the picture while they stand.
  std::vector<double> rows;
  for (const auto& s : mine)
    if (s.visible) rows.push_back(s.at.y);
  if (rows.empty()) return ground;
  std::sort(rows.begin(), rows.end());
  const double stanceRow =
      rows[static_cast<std::size_t>(0.85 * static_cast<double>(rows.size() - 1))];
  std::vector<std::optional<detail::Vec2>> raw(ground.size());
  for (std::size_t t = 0; t < raw.size(); ++t) {
    if (!flow_[t] || !mine[t].visible) continue;
    std::vector<cv::Point2d> feet;
    for (const auto& [other, track] : samples_)
      if (track[t].visible) feet.push_back(track[t].at);
    if (const auto shift = detail::groundShiftNear(*flow_[t], mine[t].at, stanceRow, radius_, feet))
      raw[t] = detail::Vec2{shift->x, shift->y};
  }
  // A running median over five pairs: belts and pans change speed slowly, samples jitter.
  for (std::size_t t = 0; t < raw.size(); ++t) {
    std::vector<double> xs, ys;
    for (std::size_t k = t >= 2 ? t - 2 : 0; k <= std::min(raw.size() - 1, t + 2); ++k) {
      if (!raw[k]) continue;
      xs.push_back(raw[k]->x);
      ys.push_back(raw[k]->y);
    }
    if (xs.empty()) continue;
    ground[t] =
        detail::Vec2{detail::upperMedian(std::move(xs)), detail::upperMedian(std::move(ys))};
  }
  return ground;
}

// Two trackers on one foot (one lost its own foot to a look-alike): neither can say which foot
// it is, so both count as not seen there. A wrong limb's events are worse than a hidden span.
void Run::unmergeTracks() {
  constexpr std::size_t kShortestMerge = 2;  // frames
  for (auto a = samples_.begin(); a != samples_.end(); ++a)
    for (auto b = std::next(a); b != samples_.end(); ++b) {
      auto& first = a->second;
      auto& second = b->second;
      std::size_t t = 0;
      while (t < first.size()) {
        auto together = [&](std::size_t k) {
          return first[k].visible && second[k].visible &&
                 cv::norm(first[k].at - second[k].at) < radius_;
        };
        if (!together(t)) {
          ++t;
          continue;
        }
        std::size_t end = t;
        while (end < first.size() && together(end)) ++end;
        if (end - t >= kShortestMerge)
          for (std::size_t k = t; k < end; ++k) first[k].visible = second[k].visible = false;
        t = end;
      }
    }
}

ProposeResult Run::collect() const {
  ProposeResult result;
  result.framesDecoded = decoded_;
  const double scale = maker_->scale();
  detail::RuleSettings settings;
  settings.fps = request_.captureRate.toDouble();
  for (const auto& [limb, samples] : samples_) {
    detail::FootMotion motion;
    motion.first = span_.first;
    FootTrack track;
    track.limb = limb;
    track.first = span_.first;
    for (const auto& s : samples) {
      motion.position.push_back({s.at.x, s.at.y});
      motion.quality.push_back(s.quality);
      motion.visible.push_back(s.visible);
      track.points.push_back(
          {s.at.x * scale, s.at.y * scale, static_cast<float>(s.quality), s.visible});
    }
    motion.ground = groundUnder(limb);
    auto found = detail::proposeFromMotion(limb, motion, settings);
    result.proposals.events.insert(result.proposals.events.end(), found.events.begin(),
                                   found.events.end());
    result.proposals.hidden.insert(result.proposals.hidden.end(), found.hidden.begin(),
                                   found.hidden.end());
    result.tracks.push_back(std::move(track));
  }
  std::sort(result.proposals.events.begin(), result.proposals.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
  return result;
}

ProposeResult Run::go() {
  open();
  // The first frame gives the upright picture size the seeds are in.
  setUpGeometry(reader_->frameAt(span_.first));
  checkSeeds();
  for (const auto& [limb, list] : seeds_) samples_[limb].resize(span_.size());
  flow_.resize(span_.size() - 1);
  if (request_.scene != Scene::overground) {
    double top = maker_->size().height, bottom = 0;
    for (const auto& [limb, list] : seeds_)
      for (const auto& seed : list) {
        top = std::min(top, seedPoint(seed).y);
        bottom = std::max(bottom, seedPoint(seed).y);
      }
    // Ground samples are taken just below the feet (groundShiftNear), so the grid covers the
    // rows from the highest seed to a little below the lowest one.
    grid_ = std::make_unique<detail::GroundFlow>(maker_->size(), static_cast<int>(top),
                                                 static_cast<int>(bottom) + 4 * radius_,
                                                 std::max(4, radius_));
  }
  std::int64_t start = span_.last, top = span_.first;
  for (const auto& [limb, list] : seeds_) {
    start = std::min(start, list.front().frame);
    top = std::max(top, list.front().frame);
  }
  total_ = (span_.last - start + 1) + (top - span_.first);
  forwardPass();
  backwardPass();
  unmergeTracks();
  return collect();
}

}  // namespace

ProposeResult propose(const ProposeRequest& request, const ProposeProgress& progress) {
  Run run(request, progress);
  return run.go();
}

}  // namespace stridemark::vision
