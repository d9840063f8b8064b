#pragma once
// Proposed touchdowns and lift-offs from plain video (docs/methods.md §13).
//
// From one seed per foot (its pixel position in one frame), each foot is tracked forwards and
// backwards through the range; the ground's image motion near the foot is estimated for the
// scene; stance is where the foot moves with the ground. Every proposal carries a confidence
// from the evidence, and spans where a foot could not be seen come back as hidden spans with no
// events inside. Classical vision only (OpenCV), no GPU, no model files.
#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "common/rational.h"
#include "model/annotation.h"

namespace stridemark::vision {

// How the ground moves in the picture: a treadmill belt runs under a still camera; over ground
// with a fixed camera the ground is still; a panning camera moves the whole background.
enum class Scene { treadmill, overground, panning };

Scene parseScene(std::string_view text);  // "treadmill" | "overground" | "panning"; Error(format)
std::string_view sceneName(Scene scene);

struct ProposeRequest {
  std::filesystem::path video;
  model::LimbSet limbs = model::LimbSet::quadruped();
  Rational captureRate{240, 1};
  Scene scene = Scene::treadmill;
  std::vector<model::FootSeed> seeds;      // at least one per limb to propose for
  std::optional<model::FrameRange> range;  // default: the whole clip
};

// One frame of a foot's track. quality is 0-1 (patch match with the seed, forward-backward
// agreement); visible is false where the foot was lost or covered.
struct TrackPoint {
  double x = 0, y = 0;
  float quality = 0;
  bool visible = false;
};

struct FootTrack {
  int limb = 0;
  std::int64_t first = 0;          // frame of points[0]
  std::vector<TrackPoint> points;  // one per frame of the range
};

struct ProposeResult {
  model::Proposals proposals;
  std::vector<FootTrack> tracks;  // one per seeded limb, for overlays and review
  std::int64_t framesDecoded = 0;
};

// Called now and then with frames processed so far and the total; return false to cancel, and
// propose() throws Error(analysis) "cancelled".
using ProposeProgress = std::function<bool(std::int64_t done, std::int64_t total)>;

// Throws stridemark::Error: io/decode for an unreadable video, format for bad seeds (outside
// the frame, unknown limb, frame out of range; the message names the seed and what to fix).
ProposeResult propose(const ProposeRequest& request, const ProposeProgress& progress = {});

// The seeds checked against the clip (frame count, frame size) without running anything:
// the first problem as a message naming the seed, or empty when all are usable.
std::string seedProblem(const std::vector<model::FootSeed>& seeds, const model::LimbSet& limbs,
                        std::int64_t frameCount, int width, int height);

}  // namespace stridemark::vision
