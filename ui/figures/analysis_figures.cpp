#include "ui/figures/analysis_figures.h"

#include <QFontMetricsF>
#include <QPainterPath>
#include <algorithm>
#include <array>
#include <cmath>
#include <numbers>
#include <vector>

#include "analysis/bouts.h"

namespace stridemark::ui::figures {

namespace {

struct Band {
  double from, to;  // limb phase
  const char* shortName;
};

// docs/methods.md §2.2 scheme B: eight 12.5 %-wide bands; pace wraps around 0/1.
constexpr std::array<Band, 9> kBands{{{0.0, 0.0625, "P"},
                                      {0.0625, 0.1875, "LS-LC"},
                                      {0.1875, 0.3125, "LS-SF"},
                                      {0.3125, 0.4375, "LS-DC"},
                                      {0.4375, 0.5625, "T"},
                                      {0.5625, 0.6875, "DS-DC"},
                                      {0.6875, 0.8125, "DS-SF"},
                                      {0.8125, 0.9375, "DS-LC"},
                                      {0.9375, 1.0, "P"}}};

void drawEmpty(QPainter& p, const QRectF& rect, const FigureStyle& style, const QString& text) {
  p.setPen(style.muted);
  p.setFont(style.font());
  p.drawText(rect, Qt::AlignCenter | Qt::TextWordWrap, text);
}

void drawMarker(QPainter& p, QPointF c, double r, const QColor& fill, const QColor& edge) {
  p.setPen(QPen(edge, 1));
  p.setBrush(fill);
  p.drawEllipse(c, r, r);
}

// The band's short name as the map's top row prints it (the Summary gives the whole name).
QString shortBandName(double limbPhase) {
  const double x = limbPhase - std::floor(limbPhase);
  for (const Band& b : kBands)
    if (x >= b.from && x < b.to) return QString::fromLatin1(b.shortName);
  return QStringLiteral("P");
}

// A gait's mean point on the Gait map.
struct MeanPoint {
  QString name;
  analysis::HildebrandSummary point;
  QColor colour;
};

// Gaits take the palette's colours in the order they first appear, starting away from the
// first limb's orange so a gait's point does not read as a limb.
QColor gaitColour(int index) {
  static const std::array<std::size_t, 5> order{4, 1, 2, 3, 5};  // vermillion, blue, ...
  return okabeIto()[order[static_cast<std::size_t>(std::max(index, 0)) % order.size()]];
}

// The mean's label goes beside its marker, on whichever side keeps it inside the plot and
// off the 50 % line and the walking/running labels; elided when the plot is too narrow.
// Returns where the label went, for the next label to avoid.
QRectF drawMeanLabel(QPainter& p, const QRectF& plot, QPointF c, double fp, const QString& text,
                     const std::vector<QRectF>& avoid) {
  const QFontMetricsF fm(p.font());
  const double pad = fp * 0.3;
  const QString shown = fm.elidedText(text, Qt::ElideRight, plot.width() - 2 * pad);
  const QSizeF size(fm.horizontalAdvance(shown) + 2, fm.height());
  const double gap = fp * 0.7;
  const std::array<QPointF, 4> corners{{{c.x() + gap, c.y() - gap - size.height()},
                                        {c.x() - gap - size.width(), c.y() - gap - size.height()},
                                        {c.x() + gap, c.y() + gap},
                                        {c.x() - gap - size.width(), c.y() + gap}}};
  const QRectF inner = plot.adjusted(pad, pad, -pad, -pad);
  auto fits = [&](const QRectF& r) {
    if (!inner.contains(r)) return false;
    for (const auto& a : avoid)
      if (r.intersects(a)) return false;
    return true;
  };
  // Fallback: a free plot corner away from the 50 % line.
  QRectF chosen(QPointF(inner.right() - size.width(), inner.top()), size);
  bool found = false;
  for (const auto& corner : corners) {
    const QRectF r(corner, size);
    if (fits(r)) {
      chosen = r;
      found = true;
      break;
    }
  }
  if (!found && !fits(chosen))
    chosen.moveTopLeft(QPointF(inner.right() - size.width(), inner.bottom() - size.height()));
  p.save();
  p.setClipRect(plot);
  p.drawText(chosen, Qt::AlignLeft | Qt::AlignVCenter, shown);
  p.restore();
  return chosen;
}

// Box for the label of quarter `q` (0 %, 25 %, 50 %, 75 %) just outside the dial's edge.
QRectF quarterLabelRect(int q, QPointF centre, double radius, double gap, const QFontMetricsF& fm) {
  const QString text = QString::number(q * 25) + "%";
  const QSizeF size(fm.horizontalAdvance(text) + 1, fm.height());
  QRectF r(QPointF(), size);
  const double edge = radius + gap;
  switch (q) {
    case 0:
      r.moveCenter(centre - QPointF(0, edge + size.height() / 2));
      break;
    case 1:
      r.moveCenter(centre + QPointF(edge + size.width() / 2, 0));
      break;
    case 2:
      r.moveCenter(centre + QPointF(0, edge + size.height() / 2));
      break;
    default:
      r.moveCenter(centre - QPointF(edge + size.width() / 2, 0));
      break;
  }
  return r;
}

}  // namespace

void paintGaitMap(QPainter& p, const QRectF& rect, const analysis::Report& report,
                  const FigureStyle& style) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing, true);
  p.fillRect(rect, style.background);
  const double fp = style.fontPx;
  // Left margin from the fonts: rotated axis title, then the widest tick label, so neither
  // is clipped nor touches the other at column width.
  const double titleH = QFontMetricsF(style.font(-1)).height();
  const double tickW = QFontMetricsF(style.font(-2)).horizontalAdvance(QStringLiteral("100%"));
  const QRectF plot = rect.adjusted(titleH + tickW + fp * 0.6, fp * 2.6, -fp * 1.6, -fp * 3.2);
  auto px = [&](double phase, double duty) {
    return QPointF(plot.left() + phase * plot.width(), plot.bottom() - duty * plot.height());
  };
  // Bands: alternate shading so neighbours read apart; trot and pace slightly stronger.
  p.setFont(style.font(-3));
  for (std::size_t i = 0; i < kBands.size(); ++i) {
    const auto& b = kBands[i];
    const QRectF r(px(b.from, 1), px(b.to, 0));
    QColor shade = style.highlight;
    const bool strong = b.shortName[0] == 'T' || b.shortName[0] == 'P';
    shade.setAlphaF(strong ? 0.16 : (i % 2 ? 0.08 : 0.03));
    p.fillRect(r, shade);
    p.setPen(style.muted);
    p.drawText(QRectF(r.left(), plot.top() - fp * 1.4, r.width(), fp * 1.3), Qt::AlignCenter,
               QString::fromLatin1(b.shortName));
  }
  // Grid, axes, walking/running line.
  p.setPen(QPen(style.grid, 1));
  for (int i = 0; i <= 10; ++i) {
    p.drawLine(px(i / 10.0, 0), px(i / 10.0, 1));
    p.drawLine(px(0, i / 10.0), px(1, i / 10.0));
  }
  p.setPen(QPen(style.foreground, 1.2, Qt::DashLine));
  p.drawLine(px(0, 0.5), px(1, 0.5));
  p.setPen(QPen(style.foreground, 1.2));
  p.setBrush(Qt::NoBrush);
  p.drawRect(plot);
  p.setFont(style.font(-2));
  for (int i = 0; i <= 4; ++i) {
    const double v = i / 4.0;
    p.drawText(QRectF(px(v, 0).x() - 20, plot.bottom() + 2, 40, fp * 1.3), Qt::AlignCenter,
               QString::number(v * 100) + "%");
    p.drawText(QRectF(plot.left() - tickW - fp * 0.4, px(0, v).y() - fp * 0.7, tickW, fp * 1.4),
               Qt::AlignRight | Qt::AlignVCenter, QString::number(v * 100) + "%");
  }
  p.setFont(style.font(-1));
  p.drawText(QRectF(plot.left(), plot.bottom() + fp * 1.4, plot.width(), fp * 1.6), Qt::AlignCenter,
             QStringLiteral("limb phase (% of hind stride)"));
  p.save();
  p.translate(rect.left() + fp * 0.1, plot.center().y());
  p.rotate(-90);
  p.drawText(QRectF(-plot.height() / 2, 0, plot.height(), titleH), Qt::AlignCenter,
             QStringLiteral("hind duty factor"));
  p.restore();
  p.setFont(style.font(-3));
  p.drawText(QRectF(plot.left() + 3, px(0, 0.5).y() - fp * 1.2, plot.width() / 2, fp * 1.1),
             Qt::AlignLeft | Qt::AlignVCenter, QStringLiteral("walking ↑"));
  p.drawText(QRectF(plot.left() + 3, px(0, 0.5).y() + fp * 0.1, plot.width() / 2, fp * 1.1),
             Qt::AlignLeft | Qt::AlignVCenter, QStringLiteral("running ↓"));
  // Strides, coloured by their bout's gait when the trial has more than one gait; a stride a
  // person excluded is a ring, so it stays visible but reads as left out.
  const std::vector<std::string> gaits = analysis::gaitsInOrder(report.bouts);
  auto gaitIndex = [&](const std::string& gait) {
    return static_cast<int>(std::find(gaits.begin(), gaits.end(), gait) - gaits.begin());
  };
  int plotted = 0;
  p.setPen(QPen(style.foreground, 1));
  for (const auto& s : report.strides) {
    if (!s.limbPhase || !s.hindDutyFactor) continue;
    QColor fill = style.foreground;
    if (gaits.size() > 1)
      fill = s.bout >= 0
                 ? gaitColour(gaitIndex(report.bouts[static_cast<std::size_t>(s.bout)].gait))
                 : style.muted;
    fill.setAlphaF(s.symmetrical ? 0.75 : 0.25);
    if (s.excluded) fill = Qt::transparent;
    p.setBrush(fill);
    const double r = fp * 0.35;
    p.drawEllipse(px(*s.limbPhase, std::clamp(*s.hindDutyFactor, 0.0, 1.0)), r, r);
    ++plotted;
  }
  // Mean points: one per gait (docs/methods.md §11) labelled with the symmetrical strides it
  // averages, so a walk→trot trial shows two points and none in a band no stride was in; the
  // pooled mean only when no bout was found.
  std::vector<MeanPoint> means;
  for (const auto& gait : gaits) {
    const auto it = report.byGait.find(gait);
    if (it != report.byGait.end() && it->second.hildebrand)
      means.push_back(
          {QString::fromStdString(gait), *it->second.hildebrand, gaitColour(gaitIndex(gait))});
  }
  if (report.byGait.empty() && report.hildebrand)
    means.push_back({QStringLiteral("mean"), *report.hildebrand, QColor(0xd5, 0x5e, 0x00)});
  const QRectF keepOut(QPointF(plot.left(), px(0, 0.5).y() - fp * 1.3),
                       QPointF(plot.left() + fp * 6, px(0, 0.5).y() + fp * 1.3));
  std::vector<QRectF> avoid{
      keepOut, QRectF(px(0, 0.5) - QPointF(0, fp * 0.45), px(1, 0.5) + QPointF(0, fp * 0.45))};
  p.setFont(style.font(-1, true));
  for (const MeanPoint& m : means) {
    if (!std::isfinite(m.point.limbPhase) || !std::isfinite(m.point.dutyFactor)) continue;
    const QPointF c = px(m.point.limbPhase, std::clamp(m.point.dutyFactor, 0.0, 1.0));
    drawMarker(p, c, fp * 0.6, m.colour, style.foreground);
    avoid.push_back(QRectF(c - QPointF(fp * 0.6, fp * 0.6), c + QPointF(fp * 0.6, fp * 0.6)));
  }
  for (const MeanPoint& m : means) {
    if (!std::isfinite(m.point.limbPhase) || !std::isfinite(m.point.dutyFactor)) continue;
    const QPointF c = px(m.point.limbPhase, std::clamp(m.point.dutyFactor, 0.0, 1.0));
    p.setPen(style.foreground);
    const QString text = QStringLiteral("%1 · %2 · n = %3")
                             .arg(m.name, shortBandName(m.point.limbPhase))
                             .arg(m.point.n);
    avoid.push_back(drawMeanLabel(p, plot, c, fp, text, avoid));
  }
  if (plotted == 0) {
    // Above the walking label, so the message never runs over the 50 % line's labels.
    const QRectF upper(plot.left(), plot.top(), plot.width(),
                       std::max(fp * 1.2, px(0, 0.5).y() - fp * 1.3 - plot.top()));
    drawEmpty(p, upper, style,
              report.limbs.kind() == model::LimbSetKind::quadruped
                  ? QStringLiteral("No complete quadruped strides yet")
                  : QStringLiteral("The Gait map needs a quadruped limb set"));
  }
  p.restore();
}

void paintPhaseDial(QPainter& p, const QRectF& rect, const analysis::Report& report,
                    const FigureStyle& style) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing, true);
  p.fillRect(rect, style.background);
  const double fp = style.fontPx;
  const double legendW = fp * 7;
  const QRectF area = rect.adjusted(fp * 0.3, fp * 1.6, -legendW, -fp * 0.3);
  // Leave room around the dial for the quarter labels so "75%" and "25%" are never clipped.
  p.setFont(style.font(-2));
  const QFontMetricsF fm(p.font());
  const double labelGap = fp * 0.3;
  const double labelW = fm.horizontalAdvance(QStringLiteral("75%")) + labelGap;
  const double labelH = fm.height() + labelGap;
  const double radius =
      std::max(fp, std::min(area.width() / 2 - labelW, area.height() / 2 - labelH));
  const QPointF centre = area.center();
  const int n = report.limbs.size();
  const double inner = radius * 0.25;
  auto ringR = [&](int limb) { return inner + (radius - inner) * (limb + 1) / n; };
  auto at = [&](double phase, double r) {
    const double a = 2 * std::numbers::pi * phase;
    return QPointF(centre.x() + r * std::sin(a), centre.y() - r * std::cos(a));
  };
  p.setPen(QPen(style.grid, 1));
  p.setBrush(Qt::NoBrush);
  for (int limb = 0; limb < n; ++limb) p.drawEllipse(centre, ringR(limb), ringR(limb));
  p.setFont(style.font(-2));
  for (int q = 0; q < 4; ++q) {
    p.setPen(QPen(style.grid, 1));
    p.drawLine(centre, at(q / 4.0, radius));
    p.setPen(style.muted);
    p.drawText(quarterLabelRect(q, centre, radius, labelGap, fm), Qt::AlignCenter,
               QString::number(q * 25) + "%");
  }
  for (int limb = 0; limb < n; ++limb) {
    const QColor c = limbColour(limb);
    for (const auto& s : report.strides) {
      const auto& ph = s.phase.size() > static_cast<std::size_t>(limb)
                           ? s.phase[static_cast<std::size_t>(limb)]
                           : std::optional<double>();
      if (ph) drawMarker(p, at(*ph, ringR(limb)), fp * 0.28, c, c.darker(140));
    }
    if (static_cast<std::size_t>(limb) < report.phase.size()) {
      const auto& ps = report.phase[static_cast<std::size_t>(limb)];
      if (std::isfinite(ps.mean) && std::isfinite(ps.r)) {
        p.setPen(QPen(c, 3, limbDash(report.limbs, limb), Qt::RoundCap));
        p.drawLine(centre, at(ps.mean, inner + (radius - inner) * ps.r));
      }
    }
  }
  // Legend with label text as the second cue.
  p.setFont(style.font(-1));
  for (int limb = 0; limb < n; ++limb) {
    const double y = rect.top() + fp * 1.6 + limb * fp * 1.6;
    const double x = rect.right() - legendW + fp * 0.5;
    p.setPen(QPen(limbColour(limb), 3, limbDash(report.limbs, limb)));
    p.drawLine(QPointF(x, y + fp * 0.6), QPointF(x + fp * 1.5, y + fp * 0.6));
    p.setPen(style.foreground);
    QString text = QString::fromStdString(report.limbs.label(limb));
    if (static_cast<std::size_t>(limb) < report.phase.size() &&
        std::isfinite(report.phase[static_cast<std::size_t>(limb)].mean))
      text +=
          QStringLiteral("  %1").arg(report.phase[static_cast<std::size_t>(limb)].mean, 0, 'f', 2);
    p.drawText(QRectF(x + fp * 2, y, legendW - fp * 2.5, fp * 1.3), Qt::AlignVCenter, text);
  }
  p.setPen(style.muted);
  p.setFont(style.font(-2));
  p.drawText(QRectF(rect.left() + fp * 0.3, rect.top(), rect.width() - fp * 0.6, fp * 1.4),
             Qt::AlignLeft,
             QStringLiteral("phase relative to %1; spoke length = r")
                 .arg(QString::fromStdString(report.limbs.label(report.referenceLimb))));
  if (report.strides.empty()) drawEmpty(p, area, style, QStringLiteral("No strides yet"));
  p.restore();
}

void paintStrideDutyPlot(QPainter& p, const QRectF& rect, const analysis::Report& report,
                         const FigureStyle& style) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing, true);
  p.fillRect(rect, style.background);
  const double fp = style.fontPx;
  const QRectF plot = rect.adjusted(fp * 3.4, fp, -fp, -fp * 2.4);
  const auto count = report.strides.size();
  auto px = [&](std::size_t i, double v) {
    const double t = count > 1 ? static_cast<double>(i) / static_cast<double>(count - 1) : 0.5;
    return QPointF(plot.left() + t * plot.width(), plot.bottom() - v * plot.height());
  };
  p.setPen(QPen(style.grid, 1));
  for (int i = 0; i <= 4; ++i) {
    const double y = plot.bottom() - i / 4.0 * plot.height();
    p.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
  }
  p.setPen(style.foreground);
  p.setBrush(Qt::NoBrush);
  p.drawRect(plot);
  p.setFont(style.font(-2));
  for (int i = 0; i <= 4; ++i)
    p.drawText(QRectF(rect.left(), px(0, i / 4.0).y() - fp * 0.7, fp * 3.1, fp * 1.4),
               Qt::AlignRight | Qt::AlignVCenter, QString::number(i * 25) + "%");
  p.drawText(QRectF(plot.left(), plot.bottom() + 2, plot.width(), fp * 1.4), Qt::AlignCenter,
             QStringLiteral("duty factor per stride (%1 strides)").arg(count));
  for (int limb = 0; limb < report.limbs.size(); ++limb) {
    QPainterPath path;
    bool started = false;
    for (std::size_t i = 0; i < count; ++i) {
      const auto& df = report.strides[i].dutyFactor;
      if (static_cast<std::size_t>(limb) >= df.size() || !df[static_cast<std::size_t>(limb)]) {
        started = false;
        continue;
      }
      const QPointF pt = px(i, std::clamp(*df[static_cast<std::size_t>(limb)], 0.0, 1.0));
      started ? path.lineTo(pt) : path.moveTo(pt);
      started = true;
      drawMarker(p, pt, fp * 0.2, limbColour(limb), limbColour(limb));
    }
    p.setPen(QPen(limbColour(limb), 1.8, limbDash(report.limbs, limb)));
    p.setBrush(Qt::NoBrush);
    p.drawPath(path);
  }
  p.restore();
}

}  // namespace stridemark::ui::figures
