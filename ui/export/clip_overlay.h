#pragma once
// The marked-clip overlay (our own design), drawn with QPainter on each exported frame:
//  - a caption box, top left: frame number, time at the capture rate, the current stride's
//    number and gait label;
//  - a limb pad, top right: one disc per limb placed as the animal is seen from above (front
//    pairs on top, left limbs on the left); filled in the limb colour when in stance, an
//    outlined ring when in swing, always with the label;
//  - a footfall strip along the bottom: one lane per limb over a window of frames centred on
//    the playhead, stance bars in the limb colour (right limbs hatched), hidden spans grey.
#include <QImage>
#include <QRectF>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"

class QPainter;

namespace stridemark::ui::exports {

// Stance of one limb from touchdown to lift-off. A clip may start or end mid-stance, so an
// open end is the start or end of time.
struct StanceSpan {
  std::int64_t first = 0;  // touchdown frame (or INT64_MIN when the clip starts mid-stance)
  std::int64_t last = 0;   // lift-off frame (or INT64_MAX when the clip ends mid-stance)
};

struct StrideSpan {
  std::int64_t first = 0;  // reference touchdown k
  std::int64_t end = 0;    // reference touchdown k + 1 (exclusive)
  std::string gait;
};

// Everything the overlay needs, precomputed once per export.
class OverlayModel {
 public:
  OverlayModel(const model::Annotation& annotation, const analysis::Report& report);

  const model::LimbSet& limbs() const { return limbs_; }
  Rational captureRate() const { return captureRate_; }
  bool inStance(int limb, std::int64_t frame) const;
  bool hidden(int limb, std::int64_t frame) const;
  const std::vector<StanceSpan>& stances(int limb) const;
  const std::vector<model::HiddenSpan>& hiddenSpans() const { return hidden_; }
  // Index into strides() of the reference stride containing `frame`, if any.
  std::optional<std::size_t> strideAt(std::int64_t frame) const;
  const std::vector<StrideSpan>& strides() const { return strides_; }
  // Frames shown either side of the playhead in the footfall strip (about 0.6 s).
  std::int64_t stripHalfWindow() const;

 private:
  model::LimbSet limbs_;
  Rational captureRate_;
  std::vector<std::vector<StanceSpan>> stances_;  // per limb, in frame order
  std::vector<model::HiddenSpan> hidden_;
  std::vector<StrideSpan> strides_;
};

// Draws the overlay for `frame` over an image of `size` (whole frame, pixels).
void drawOverlay(QPainter& painter, const QRectF& area, const OverlayModel& model,
                 std::int64_t frame);

// Footfall strip alone (also used by the side-by-side panel): lanes over [first, last] frames
// with a playhead at `playhead`.
void drawFootfallStrip(QPainter& painter, const QRectF& area, const OverlayModel& model,
                       std::int64_t first, std::int64_t last, std::int64_t playhead, double fontPx,
                       bool onDark);

}  // namespace stridemark::ui::exports
