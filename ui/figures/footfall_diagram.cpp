#include "ui/figures/footfall_diagram.h"

#include <QFontMetricsF>
#include <QPainterPath>
#include <algorithm>
#include <cmath>

namespace stridemark::ui::figures {

namespace {

// Two text lines (frame, seconds) under the lanes.
constexpr double kAxisHeight = 30;

bool isSelected(const FootfallOptions& o, const model::Event& e) {
  return std::find(o.selected.begin(), o.selected.end(), e) != o.selected.end();
}

double niceStep(double span, double targetTicks) {
  const double raw = span / targetTicks;
  const double mag = std::pow(10.0, std::floor(std::log10(std::max(raw, 1e-9))));
  for (double m : {1.0, 2.0, 5.0, 10.0})
    if (raw <= m * mag) return std::max(1.0, m * mag);
  return std::max(1.0, 10 * mag);
}

QString secondsLabel(std::int64_t frame, Rational rate) {
  return QStringLiteral("%1 s").arg(framesToSeconds(frame, rate), 0, 'f', 3);
}

// Ticks at 1-2-5 x 10^k frames, spaced so the widest label fits between neighbours: the frame
// number on the first line, its time in seconds on a second line. Labels stay inside the
// plotted span (never under the lane labels) and are skipped, tick kept, where they would
// touch the previous one.
void paintAxis(QPainter& p, const QRectF& rect, const FrameAxis& axis, const model::Annotation& a,
               const FigureStyle& style) {
  p.setFont(style.font(-2));
  p.setPen(style.muted);
  const QFontMetricsF fm(p.font());
  const double gap = fm.horizontalAdvance(QStringLiteral("MM"));
  const auto widest = static_cast<std::int64_t>(std::ceil(axis.frameLast));
  const double labelWidth = std::max(fm.horizontalAdvance(QString::number(widest)),
                                     fm.horizontalAdvance(secondsLabel(widest, a.captureRate))) +
                            gap;
  const double span = axis.frameLast - axis.frameFirst;
  const double pixels = std::max(1.0, axis.right - axis.left);
  const double step = niceStep(span, std::max(1.0, pixels / labelWidth));
  const double start = std::ceil(axis.frameFirst / step) * step;
  double lastRight = -1e300;
  for (double f = start; f <= axis.frameLast; f += step) {
    const double x = axis.x(f);
    p.drawLine(QPointF(x, rect.top()), QPointF(x, rect.top() + 4));
    const auto frame = static_cast<std::int64_t>(f);
    const QString text =
        QString::number(frame) + QLatin1Char('\n') + secondsLabel(frame, a.captureRate);
    const double w = std::max(fm.horizontalAdvance(QString::number(frame)),
                              fm.horizontalAdvance(secondsLabel(frame, a.captureRate)));
    const double left = std::clamp(x - w / 2, axis.left, std::max(axis.left, rect.right() - w));
    if (left < lastRight + gap / 2) continue;
    p.drawText(QRectF(left, rect.top() + 3, w + 1, rect.height() - 3),
               Qt::AlignHCenter | Qt::AlignTop, text);
    lastRight = left + w;
  }
}

QPainterPath eventMark(const model::Event& e, double x, const QRectF& lane) {
  // Touchdown ticks carry a down triangle, lift-off ticks an up triangle.
  QPainterPath mark;
  const double s = std::min(5.0, lane.height() * 0.18);
  if (e.kind == model::EventKind::touchdown) {
    mark.moveTo(x - s, lane.top() + 1);
    mark.lineTo(x + s, lane.top() + 1);
    mark.lineTo(x, lane.top() + 1 + s * 1.4);
  } else {
    mark.moveTo(x - s, lane.bottom() - 1);
    mark.lineTo(x + s, lane.bottom() - 1);
    mark.lineTo(x, lane.bottom() - 1 - s * 1.4);
  }
  mark.closeSubpath();
  return mark;
}

// Proposed stance as an outline in the limb's colour, proposed hidden spans as a dotted box:
// drawn first, so a person's bars cover them.
void paintProposedSpans(QPainter& p, const QRectF& lane, const model::Annotation& a, int limb,
                        const FrameAxis& axis, const FootfallOptions& o) {
  if (!o.proposals) return;
  const QColor colour = limbColour(limb).darker(115);
  QPen dotted(colour, 1, Qt::DotLine);
  p.setBrush(Qt::NoBrush);
  for (const auto& span : o.proposals->hidden) {
    if (span.limb != limb) continue;
    p.setPen(dotted);
    p.drawRect(QRectF(QPointF(axis.x(static_cast<double>(span.first)), lane.top() + 2),
                      QPointF(axis.x(static_cast<double>(span.last + 1)), lane.bottom() - 2)));
  }
  model::Annotation proposed;
  proposed.limbs = a.limbs;
  proposed.clip = a.clip;
  for (const auto& pe : o.proposals->events)
    if (pe.event.limb == limb) proposed.events.push_back(pe.event);
  proposed.normalize();
  p.setPen(QPen(colour, 1.2, Qt::DashLine));
  const double top = lane.top() + lane.height() * 0.3;
  const double height = lane.height() * 0.4;
  for (const auto& bar : stanceBars(proposed, limb, o.viewFirst, o.viewLast))
    p.drawRect(QRectF(QPointF(axis.x(static_cast<double>(bar.first)), top),
                      QPointF(axis.x(static_cast<double>(bar.last)), top + height)));
}

// Proposal ticks: dashed, lighter, with a hollow triangle; the current one in the highlight
// colour with a band behind it so it is found at a glance.
void paintProposalTicks(QPainter& p, const QRectF& lane, int limb, const FrameAxis& axis,
                        const FootfallOptions& o, const FigureStyle& style) {
  if (!o.proposals) return;
  for (const auto& pe : o.proposals->events) {
    const auto& e = pe.event;
    if (e.limb != limb || e.frame < o.viewFirst || e.frame > o.viewLast + 1) continue;
    const double x = axis.x(static_cast<double>(e.frame));
    const bool current = o.currentProposal && *o.currentProposal == e;
    QColor colour = current ? style.highlight : style.foreground;
    if (!current) colour.setAlphaF(0.55);
    if (current) {
      // A tinted box around the tick, wider than the playhead line that often sits on it.
      QColor band = style.highlight;
      band.setAlphaF(0.18);
      const QRectF box(x - 7, lane.top() + 1, 14, lane.height() - 2);
      p.fillRect(box, band);
      p.setPen(QPen(style.highlight, 1.5));
      p.setBrush(Qt::NoBrush);
      p.drawRect(box);
    }
    p.setPen(QPen(colour, current ? 2 : 1, current ? Qt::SolidLine : Qt::DashLine));
    p.drawLine(QPointF(x, lane.top() + 2), QPointF(x, lane.bottom() - 2));
    p.setPen(QPen(colour, current ? 1.6 : 1.1));
    p.setBrush(Qt::NoBrush);
    p.drawPath(eventMark(e, x, lane));
  }
}

void paintLane(QPainter& p, const QRectF& lane, const model::Annotation& a, int limb,
               const FrameAxis& axis, const FootfallOptions& o, const FigureStyle& style) {
  const QColor colour = limbColour(limb);
  const double barTop = lane.top() + lane.height() * 0.2;
  const double barHeight = lane.height() * 0.6;
  for (const auto& span : a.hidden) {
    if (span.limb != limb) continue;
    const QRectF r(QPointF(axis.x(static_cast<double>(span.first)), lane.top() + 1),
                   QPointF(axis.x(static_cast<double>(span.last + 1)), lane.bottom() - 1));
    p.fillRect(r, QBrush(style.muted, Qt::DiagCrossPattern));
  }
  paintProposedSpans(p, lane, a, limb, axis, o);
  for (const auto& bar : stanceBars(a, limb, o.viewFirst, o.viewLast)) {
    QRectF r(QPointF(axis.x(static_cast<double>(bar.first)), barTop),
             QPointF(axis.x(static_cast<double>(bar.last)), barTop + barHeight));
    QColor fill = colour;
    if (bar.openStart || bar.openEnd) fill.setAlpha(140);
    p.fillRect(r, fill);
    const auto pattern = limbPattern(a.limbs, limb);
    if (pattern != Qt::SolidPattern) p.fillRect(r, QBrush(style.background, pattern));
    p.setPen(QPen(colour.darker(130), 1));
    p.setBrush(Qt::NoBrush);
    p.drawRect(r);
  }
  if (!o.drawTicks) return;
  paintProposalTicks(p, lane, limb, axis, o, style);
  // A person's tags last: on top of every proposal.
  for (const auto& e : a.eventsOf(limb)) {
    if (e.frame < o.viewFirst || e.frame > o.viewLast + 1) continue;
    const double x = axis.x(static_cast<double>(e.frame));
    const bool sel = isSelected(o, e);
    p.setPen(QPen(sel ? style.highlight : style.foreground, sel ? 3 : 1.5));
    p.drawLine(QPointF(x, lane.top() + 2), QPointF(x, lane.bottom() - 2));
    p.fillPath(eventMark(e, x, lane), sel ? style.highlight : style.foreground);
  }
}

}  // namespace

std::vector<StanceBar> stanceBars(const model::Annotation& a, int limb, std::int64_t clipFirst,
                                  std::int64_t clipLast) {
  std::vector<StanceBar> bars;
  std::optional<std::int64_t> open;
  bool firstEvent = true;
  for (const auto& e : a.eventsOf(limb)) {
    if (e.kind == model::EventKind::touchdown) {
      if (!open) open = e.frame;
    } else {
      if (open) {
        bars.push_back({*open, e.frame, false, false});
      } else if (firstEvent) {
        // The clip starts in stance: the bar runs from the clip's first frame.
        const auto start = a.clip ? a.clip->first : std::min(clipFirst, e.frame);
        bars.push_back({start, e.frame, true, false});
      }
      open.reset();
    }
    firstEvent = false;
  }
  if (open) {
    const auto end = a.clip ? a.clip->last + 1 : std::max(clipLast + 1, *open);
    bars.push_back({*open, end, false, true});
  }
  return bars;
}

QRectF laneRect(const QRectF& rect, int laneCount, int index, bool withAxis) {
  const double h = (rect.height() - (withAxis ? kAxisHeight : 0)) / std::max(1, laneCount);
  return QRectF(rect.left(), rect.top() + h * index, rect.width(), h);
}

FrameAxis frameAxis(const QRectF& rect, const FootfallOptions& o) {
  FrameAxis axis;
  axis.frameFirst = static_cast<double>(o.viewFirst);
  axis.frameLast = static_cast<double>(std::max(o.viewLast + 1, o.viewFirst + 1));
  axis.left = rect.left() + o.labelWidth;
  axis.right = std::max(axis.left + 1, rect.right() - 4);
  return axis;
}

void paintFootfallDiagram(QPainter& p, const QRectF& rect, const model::Annotation& a,
                          const FootfallOptions& o, const FigureStyle& style) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing, true);
  p.fillRect(rect, style.background);
  const FrameAxis axis = frameAxis(rect, o);
  const int n = a.limbs.size();
  for (int limb = 0; limb < n; ++limb) {
    const QRectF lane = laneRect(rect, n, limb, o.drawTimeAxis);
    if (limb % 2 == 1)
      p.fillRect(lane, QColor(style.grid.red(), style.grid.green(), style.grid.blue(), 60));
    p.setPen(style.foreground);
    p.setFont(style.font(0, true));
    p.drawText(QRectF(lane.left() + 4, lane.top(), o.labelWidth - 8, lane.height()),
               Qt::AlignVCenter | Qt::AlignLeft, QString::fromStdString(a.limbs.label(limb)));
    p.save();
    p.setClipRect(QRectF(QPointF(axis.left, lane.top()), QPointF(axis.right, lane.bottom())));
    paintLane(p, lane, a, limb, axis, o, style);
    p.restore();
  }
  if (o.drawTimeAxis) {
    const QRectF axisRect(rect.left(), rect.bottom() - kAxisHeight, rect.width(), kAxisHeight);
    paintAxis(p, axisRect, axis, a, style);
  }
  if (o.playhead) {
    const double x = axis.x(static_cast<double>(*o.playhead) + 0.5);
    p.setPen(QPen(QColor(0xd5, 0x5e, 0x00), 2));
    p.drawLine(QPointF(x, rect.top()), QPointF(x, rect.bottom()));
  }
  p.restore();
}

std::vector<int> supportCounts(const model::Annotation& a, std::int64_t first, std::int64_t last) {
  const auto len = static_cast<std::size_t>(std::max<std::int64_t>(0, last - first + 1));
  std::vector<int> counts(len, 0);
  for (int limb = 0; limb < a.limbs.size(); ++limb) {
    for (const auto& bar : stanceBars(a, limb, first, last)) {
      for (auto f = std::max(bar.first, first); f < std::min(bar.last, last + 1); ++f)
        ++counts[static_cast<std::size_t>(f - first)];
    }
  }
  for (const auto& span : a.hidden) {
    for (auto f = std::max(span.first, first); f <= std::min(span.last, last); ++f)
      counts[static_cast<std::size_t>(f - first)] = -1;
  }
  // Until every limb has its first event, the number on the ground is unknown.
  std::int64_t latestStart = first;
  for (int limb = 0; limb < a.limbs.size(); ++limb) {
    const auto ev = a.eventsOf(limb);
    if (ev.empty()) latestStart = last + 1;
    // A first lift-off means the clip starts in stance: known from the first frame.
    else if (ev.front().kind == model::EventKind::touchdown)
      latestStart = std::max(latestStart, ev.front().frame);
  }
  for (auto f = first; f < std::min(latestStart, last + 1); ++f)
    counts[static_cast<std::size_t>(f - first)] = -1;
  return counts;
}

void paintSupportStrip(QPainter& p, const QRectF& rect, const model::Annotation& a,
                       const FrameAxis& axis, const FigureStyle& style, double labelWidth) {
  p.save();
  p.fillRect(rect, style.background);
  p.setPen(style.foreground);
  p.setFont(style.font(-1, true));
  p.drawText(QRectF(rect.left() + 4, rect.top(), labelWidth - 6, rect.height()),
             Qt::AlignVCenter | Qt::AlignLeft, QStringLiteral("Σ"));
  const auto first = static_cast<std::int64_t>(std::floor(axis.frameFirst));
  const auto last = static_cast<std::int64_t>(std::ceil(axis.frameLast));
  const auto counts = supportCounts(a, first, last);
  const int n = std::max(1, a.limbs.size());
  p.setClipRect(QRectF(QPointF(axis.left, rect.top()), QPointF(axis.right, rect.bottom())));
  p.setFont(style.font(-2));
  std::size_t i = 0;
  while (i < counts.size()) {
    std::size_t j = i;
    while (j < counts.size() && counts[j] == counts[i]) ++j;
    const double x0 = axis.x(static_cast<double>(first) + static_cast<double>(i));
    const double x1 = axis.x(static_cast<double>(first) + static_cast<double>(j));
    const QRectF r(QPointF(x0, rect.top() + 1), QPointF(x1, rect.bottom() - 1));
    const int c = counts[i];
    if (c < 0) {
      p.fillRect(r, QBrush(style.muted, Qt::Dense6Pattern));
    } else {
      // More limbs on the ground = darker; zero support (suspension) stays empty.
      QColor fill = style.foreground;
      fill.setAlphaF(0.08 + 0.72 * c / n);
      p.fillRect(r, fill);
      if (r.width() > 10) {
        p.setPen(c * 2 > n ? style.background : style.foreground);
        p.drawText(r, Qt::AlignCenter, QString::number(c));
      }
    }
    i = j;
  }
  p.restore();
}

}  // namespace stridemark::ui::figures
