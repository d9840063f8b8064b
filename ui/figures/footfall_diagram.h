#pragma once
// Footfall diagram and Support strip painters. The Footfall lanes widget draws through these
// same functions and adds only interaction (selection, drag, playhead).
#include <QPainter>
#include <QRectF>
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"
#include "ui/figures/figure_style.h"

namespace stridemark::ui::figures {

// A stretch of stance of one limb. Open ends mean the clip starts or ends in stance.
struct StanceBar {
  std::int64_t first = 0;
  std::int64_t last = 0;  // exclusive: the lift-off frame
  bool openStart = false;
  bool openEnd = false;
};

std::vector<StanceBar> stanceBars(const model::Annotation& a, int limb, std::int64_t clipFirst,
                                  std::int64_t clipLast);

// Maps frames to x inside a lane rectangle.
struct FrameAxis {
  double frameFirst = 0;  // frame at the left edge (may be fractional while zoomed)
  double frameLast = 1;   // frame at the right edge
  double left = 0, right = 1;
  double x(double frame) const {
    return left + (frame - frameFirst) * (right - left) / (frameLast - frameFirst);
  }
  double frameAt(double px) const {
    return frameFirst + (px - left) * (frameLast - frameFirst) / (right - left);
  }
};

struct FootfallOptions {
  std::int64_t viewFirst = 0;
  std::int64_t viewLast = 100;  // inclusive
  double labelWidth = 40;       // room for limb labels at the left
  std::optional<std::int64_t> playhead;
  std::vector<model::Event> selected;
  bool drawTicks = true;
  bool drawTimeAxis = true;  // frame / seconds ruler under the lanes
  // Proposals under review (the desk's lanes only; figures never show them): hollow, lighter
  // and under a person's tags, which are always drawn on top.
  const model::Proposals* proposals = nullptr;
  std::optional<model::Event> currentProposal;  // drawn highlighted
};

// Lane rectangle of limb `index` inside `rect` (shared with hit-testing in the widget).
QRectF laneRect(const QRectF& rect, int laneCount, int index, bool withAxis);
FrameAxis frameAxis(const QRectF& rect, const FootfallOptions& options);

void paintFootfallDiagram(QPainter& p, const QRectF& rect, const model::Annotation& a,
                          const FootfallOptions& options, const FigureStyle& style);

// Number of limbs in stance for each frame in [first, last]; hidden limbs count as unknown
// and make the frame's count unknown (-1).
std::vector<int> supportCounts(const model::Annotation& a, std::int64_t first, std::int64_t last);

void paintSupportStrip(QPainter& p, const QRectF& rect, const model::Annotation& a,
                       const FrameAxis& axis, const FigureStyle& style, double labelWidth);

}  // namespace stridemark::ui::figures
