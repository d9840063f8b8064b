#include "ui/export/clip_overlay.h"

#include <QPainter>
#include <QPainterPath>
#include <algorithm>
#include <cmath>
#include <limits>

#include "ui/figures/figure_style.h"

namespace stridemark::ui::exports {

using model::EventKind;
namespace figs = stridemark::ui::figures;

namespace {

constexpr std::int64_t kOpenStart = std::numeric_limits<std::int64_t>::min();
constexpr std::int64_t kOpenEnd = std::numeric_limits<std::int64_t>::max();

std::vector<StanceSpan> stancesOf(const model::Annotation& annotation, int limb) {
  std::vector<StanceSpan> spans;
  std::optional<std::int64_t> open;
  bool first = true;
  for (const model::Event& e : annotation.eventsOf(limb)) {
    if (e.kind == EventKind::touchdown) {
      if (open) spans.push_back({*open, e.frame});  // a missed lift-off: close at next touchdown
      open = e.frame;
    } else if (open) {
      spans.push_back({*open, e.frame});
      open.reset();
    } else if (first) {
      spans.push_back({kOpenStart, e.frame});  // the clip starts mid-stance
    }
    first = false;
  }
  if (open) spans.push_back({*open, kOpenEnd});  // the clip ends mid-stance
  return spans;
}

QColor withAlpha(QColor c, int alpha) {
  c.setAlpha(alpha);
  return c;
}

QFont pixelFont(double px, bool bold = false) {
  QFont f(QStringLiteral("DejaVu Sans"));
  f.setPixelSize(std::max(6, static_cast<int>(std::lround(px))));
  f.setBold(bold);
  return f;
}

QString timeText(std::int64_t frame, Rational rate) {
  return QStringLiteral("%1 s").arg(framesToSeconds(frame, rate), 0, 'f', 4);
}

void drawCaption(QPainter& p, const QRectF& area, const OverlayModel& m, std::int64_t frame,
                 double unit) {
  const std::optional<std::size_t> stride = m.strideAt(frame);
  const QString line1 = QStringLiteral("frame %1").arg(frame);
  const QString line2 =
      QStringLiteral("%1  at %2 fps capture")
          .arg(timeText(frame, m.captureRate()), QString::fromStdString(toString(m.captureRate())));
  const QString line3 = stride ? QStringLiteral("stride %1 · %2")
                                     .arg(*stride + 1)
                                     .arg(QString::fromStdString(m.strides()[*stride].gait))
                               : QStringLiteral("outside scored strides");
  const QFont big = pixelFont(unit * 2.6, true);
  const QFont small = pixelFont(unit * 1.7);
  const double width = std::max({QFontMetricsF(big).horizontalAdvance(line1),
                                 QFontMetricsF(small).horizontalAdvance(line2),
                                 QFontMetricsF(small).horizontalAdvance(line3)}) +
                       unit * 2;
  const QRectF box(area.left() + unit, area.top() + unit, width, unit * 8.6);
  p.setPen(Qt::NoPen);
  p.setBrush(QColor(0, 0, 0, 150));
  p.drawRoundedRect(box, unit * 0.6, unit * 0.6);
  p.setPen(Qt::white);
  p.setFont(big);
  p.drawText(box.adjusted(unit, unit * 0.4, 0, 0), Qt::AlignLeft | Qt::AlignTop, line1);
  p.setFont(small);
  p.drawText(box.adjusted(unit, unit * 3.6, 0, 0), Qt::AlignLeft | Qt::AlignTop, line2);
  p.drawText(box.adjusted(unit, unit * 5.9, 0, 0), Qt::AlignLeft | Qt::AlignTop, line3);
}

// Discs placed as seen from above: one row per segment (front on top), left limbs left.
void drawLimbPad(QPainter& p, const QRectF& area, const OverlayModel& m, std::int64_t frame,
                 double unit) {
  const model::LimbSet& limbs = m.limbs();
  int rows = 0;
  for (const model::Limb& l : limbs.limbs()) rows = std::max(rows, l.segment + 1);
  const double cell = unit * 4.4;
  const QRectF box(area.right() - unit - cell * 2 - unit * 1.2, area.top() + unit,
                   cell * 2 + unit * 1.2, cell * rows + unit * 1.2);
  p.setPen(Qt::NoPen);
  p.setBrush(QColor(0, 0, 0, 150));
  p.drawRoundedRect(box, unit * 0.6, unit * 0.6);
  p.setFont(pixelFont(unit * 1.5, true));
  for (int i = 0; i < limbs.size(); ++i) {
    const model::Limb& l = limbs.limb(i);
    const int col = l.side == model::Side::left ? 0 : 1;
    const QPointF centre(box.left() + unit * 0.6 + cell * (col + 0.5),
                         box.top() + unit * 0.6 + cell * (l.segment + 0.5));
    const double r = cell * 0.4;
    const QColor colour = figs::limbColour(i);
    const bool hiddenNow = m.hidden(i, frame);
    const bool stance = !hiddenNow && m.inStance(i, frame);
    if (hiddenNow) {
      p.setPen(QPen(QColor(170, 170, 170), unit * 0.35, Qt::DotLine));
      p.setBrush(Qt::NoBrush);
    } else if (stance) {
      p.setPen(QPen(Qt::white, unit * 0.25));
      p.setBrush(colour);
    } else {
      p.setPen(QPen(colour, unit * 0.45));
      p.setBrush(Qt::NoBrush);
    }
    p.drawEllipse(centre, r, r);
    p.setPen(stance ? Qt::black : Qt::white);
    p.drawText(QRectF(centre.x() - r, centre.y() - r, 2 * r, 2 * r), Qt::AlignCenter,
               QString::fromStdString(l.label));
  }
}

}  // namespace

OverlayModel::OverlayModel(const model::Annotation& annotation, const analysis::Report& report)
    : limbs_(annotation.limbs), captureRate_(annotation.captureRate), hidden_(annotation.hidden) {
  model::Annotation sorted = annotation;
  sorted.normalize();
  for (int limb = 0; limb < limbs_.size(); ++limb) stances_.push_back(stancesOf(sorted, limb));
  for (const analysis::StrideRecord& s : report.strides) {
    strides_.push_back({s.startFrame, s.endFrame, s.gait});
  }
}

const std::vector<StanceSpan>& OverlayModel::stances(int limb) const {
  return stances_.at(static_cast<std::size_t>(limb));
}

bool OverlayModel::inStance(int limb, std::int64_t frame) const {
  const auto& spans = stances(limb);
  // First span whose lift-off is after `frame`; stance covers [touchdown, lift-off).
  auto it = std::upper_bound(spans.begin(), spans.end(), frame,
                             [](std::int64_t f, const StanceSpan& s) { return f < s.last; });
  return it != spans.end() && it->first <= frame;
}

bool OverlayModel::hidden(int limb, std::int64_t frame) const {
  return std::any_of(hidden_.begin(), hidden_.end(), [&](const model::HiddenSpan& h) {
    return h.limb == limb && h.first <= frame && frame <= h.last;
  });
}

std::optional<std::size_t> OverlayModel::strideAt(std::int64_t frame) const {
  auto it = std::upper_bound(strides_.begin(), strides_.end(), frame,
                             [](std::int64_t f, const StrideSpan& s) { return f < s.first; });
  if (it == strides_.begin()) return std::nullopt;
  --it;
  if (frame >= it->end) return std::nullopt;
  return static_cast<std::size_t>(it - strides_.begin());
}

std::int64_t OverlayModel::stripHalfWindow() const {
  return std::max<std::int64_t>(8, std::llround(0.6 * captureRate_.toDouble()));
}

void drawFootfallStrip(QPainter& p, const QRectF& area, const OverlayModel& m, std::int64_t first,
                       std::int64_t last, std::int64_t playhead, double fontPx, bool onDark) {
  const int lanes = m.limbs().size();
  const QFont labelFont = pixelFont(fontPx, true);
  const double labelWidth = QFontMetricsF(labelFont).horizontalAdvance(QStringLiteral("WWW"));
  const QRectF plot = area.adjusted(labelWidth, 0, 0, 0);
  const double laneHeight = plot.height() / lanes;
  const double span = static_cast<double>(last - first + 1);
  auto xOf = [&](std::int64_t f) {
    const double clamped = static_cast<double>(std::clamp(f, first, last + 1) - first);
    return plot.left() + plot.width() * clamped / span;
  };
  const QColor text = onDark ? Qt::white : Qt::black;
  p.setFont(labelFont);
  for (int i = 0; i < lanes; ++i) {
    const QRectF lane(plot.left(), plot.top() + laneHeight * i, plot.width(), laneHeight);
    p.setPen(text);
    p.drawText(QRectF(area.left(), lane.top(), labelWidth - fontPx * 0.4, laneHeight),
               Qt::AlignRight | Qt::AlignVCenter, QString::fromStdString(m.limbs().label(i)));
    p.setPen(QPen(withAlpha(text, 60), 1));
    p.drawLine(QPointF(lane.left(), lane.bottom()), QPointF(lane.right(), lane.bottom()));
    const QRectF barBand = lane.adjusted(0, laneHeight * 0.18, 0, -laneHeight * 0.18);
    for (const model::HiddenSpan& h : m.hiddenSpans()) {
      if (h.limb != i || h.last < first || h.first > last) continue;
      p.fillRect(
          QRectF(QPointF(xOf(h.first), barBand.top()), QPointF(xOf(h.last + 1), barBand.bottom())),
          QBrush(QColor(150, 150, 150, 160), Qt::Dense5Pattern));
    }
    const QColor colour = figs::limbColour(i);
    const Qt::BrushStyle pattern = figs::limbPattern(m.limbs(), i);
    for (const StanceSpan& s : m.stances(i)) {
      if (s.last < first || s.first > last) continue;
      const QRectF bar(QPointF(xOf(s.first), barBand.top()),
                       QPointF(xOf(s.last), barBand.bottom()));
      p.fillRect(bar, colour);
      if (pattern != Qt::SolidPattern) p.fillRect(bar, QBrush(QColor(0, 0, 0, 110), pattern));
      p.setPen(QPen(onDark ? QColor(255, 255, 255, 140) : QColor(0, 0, 0, 140), 1));
      p.setBrush(Qt::NoBrush);
      p.drawRect(bar);
    }
  }
  const double x = xOf(playhead) + plot.width() / span * 0.5;
  p.setPen(QPen(onDark ? QColor(255, 255, 255) : QColor(200, 0, 0), std::max(1.5, fontPx * 0.18)));
  p.drawLine(QPointF(x, plot.top()), QPointF(x, plot.bottom()));
}

void drawOverlay(QPainter& p, const QRectF& area, const OverlayModel& m, std::int64_t frame) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing);
  p.setRenderHint(QPainter::TextAntialiasing);
  const double unit = std::max(4.0, area.height() / 72.0);  // 10 px at 720p
  drawCaption(p, area, m, frame, unit);
  drawLimbPad(p, area, m, frame, unit);
  const double stripHeight = std::min(area.height() * 0.26, unit * 2.6 * m.limbs().size() + unit);
  const QRectF strip(area.left() + unit, area.bottom() - unit - stripHeight,
                     area.width() - 2 * unit, stripHeight);
  p.setPen(Qt::NoPen);
  p.setBrush(QColor(0, 0, 0, 150));
  p.drawRoundedRect(strip, unit * 0.6, unit * 0.6);
  const std::int64_t half = m.stripHalfWindow();
  drawFootfallStrip(p, strip.adjusted(unit * 0.5, unit * 0.5, -unit * 0.5, -unit * 0.5), m,
                    frame - half, frame + half, frame, unit * 1.5, true);
  p.restore();
}

}  // namespace stridemark::ui::exports
