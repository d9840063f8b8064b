#include "ui/figures/stride_time_plots.h"

#include <QPainterPath>
#include <algorithm>
#include <cmath>
#include <vector>

namespace stridemark::ui::figures {

namespace {

struct LimbTimes {
  std::vector<double> stance;  // seconds, NaN where the lift-off is missing
  std::vector<double> swing;
};

LimbTimes timesOf(const analysis::Report& r, int limb) {
  LimbTimes t;
  for (const analysis::LimbCycle& c : r.cycles) {
    if (c.limb != limb) continue;
    const auto stance = c.stanceFrames();
    t.stance.push_back(stance ? framesToSeconds(*stance, r.fps) : std::nan(""));
    t.swing.push_back(stance ? framesToSeconds(c.strideFrames() - *stance, r.fps) : std::nan(""));
  }
  return t;
}

double niceCeiling(double v) {
  if (!(v > 0)) return 1;
  const double mag = std::pow(10.0, std::floor(std::log10(v)));
  for (double m : {1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 8.0, 10.0}) {
    if (v <= m * mag) return m * mag;
  }
  return 10 * mag;
}

void drawSeries(QPainter& p, const QRectF& plot, const std::vector<double>& values, double yMax,
                const QColor& colour, bool filledDiscs, double marker) {
  const std::size_t n = values.size();
  auto at = [&](std::size_t i) {
    const double x = n > 1 ? static_cast<double>(i) / static_cast<double>(n - 1) : 0.5;
    return QPointF(plot.left() + x * plot.width(),
                   plot.bottom() - std::clamp(values[i] / yMax, 0.0, 1.0) * plot.height());
  };
  QPainterPath path;
  bool open = false;
  for (std::size_t i = 0; i < n; ++i) {
    if (std::isnan(values[i])) {
      open = false;
      continue;
    }
    open ? path.lineTo(at(i)) : path.moveTo(at(i));
    open = true;
  }
  p.setBrush(Qt::NoBrush);
  p.setPen(QPen(colour, 1.3, filledDiscs ? Qt::SolidLine : Qt::DashLine));
  p.drawPath(path);
  for (std::size_t i = 0; i < n; ++i) {
    if (std::isnan(values[i])) continue;
    const QPointF c = at(i);
    if (filledDiscs) {
      p.setPen(QPen(colour.darker(140), 0.8));
      p.setBrush(colour);
      p.drawEllipse(c, marker, marker);
    } else {
      p.setPen(QPen(colour, 1.3));
      p.setBrush(Qt::white);
      p.drawRect(QRectF(c.x() - marker, c.y() - marker, 2 * marker, 2 * marker));
    }
  }
}

void drawPanel(QPainter& p, const QRectF& cell, const analysis::Report& r, int limb,
               const LimbTimes& t, double yMax, const FigureStyle& style, bool leftColumn,
               bool bottomRow) {
  const double fp = style.fontPx;
  const QRectF plot = cell.adjusted(fp * 4.2, fp * 1.5, -fp * 0.6, -fp * 1.9);
  p.setPen(QPen(style.grid, 0.8));
  for (int i = 1; i < 4; ++i) {
    const double y = plot.bottom() - i / 4.0 * plot.height();
    p.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
  }
  p.setPen(QPen(style.foreground, 1));
  p.setBrush(Qt::NoBrush);
  p.drawRect(plot);
  p.setFont(style.font(-3));
  for (int i = 0; i <= 4; i += 2) {
    const double y = plot.bottom() - i / 4.0 * plot.height();
    p.drawText(QRectF(cell.left() + fp * 1.2, y - fp * 0.6, fp * 2.8, fp * 1.2),
               Qt::AlignRight | Qt::AlignVCenter, QString::number(yMax * i / 4.0, 'g', 3));
  }
  const std::size_t n = std::max(t.stance.size(), std::size_t{1});
  p.drawText(QRectF(plot.left() - fp, plot.bottom() + 1, fp * 2, fp * 1.2), Qt::AlignCenter,
             QStringLiteral("1"));
  p.drawText(QRectF(plot.right() - fp, plot.bottom() + 1, fp * 2, fp * 1.2), Qt::AlignCenter,
             QString::number(n));
  if (bottomRow) {
    p.drawText(QRectF(plot.left(), plot.bottom() + fp * 0.6, plot.width(), fp * 1.3),
               Qt::AlignCenter, QStringLiteral("stride of this limb"));
  }
  if (leftColumn) {
    p.save();
    p.translate(cell.left() + fp * 0.55, plot.center().y());
    p.rotate(-90);
    p.drawText(QRectF(-plot.height() / 2, -fp * 0.6, plot.height(), fp * 1.2), Qt::AlignCenter,
               QStringLiteral("time (s)"));
    p.restore();
  }
  const QColor colour = limbColour(limb);
  p.setFont(style.font(-1, true));
  p.setPen(colour.darker(130));
  p.drawText(QRectF(plot.left(), cell.top(), plot.width(), fp * 1.4),
             Qt::AlignLeft | Qt::AlignVCenter,
             QString::fromStdString(r.limbs.label(limb)) +
                 QStringLiteral("  (%1 strides)").arg(t.stance.size()));
  drawSeries(p, plot, t.swing, yMax, colour, false, fp * 0.22);
  drawSeries(p, plot, t.stance, yMax, colour, true, fp * 0.24);
}

void drawLegend(QPainter& p, const QRectF& rect, const FigureStyle& style) {
  const double fp = style.fontPx;
  p.setFont(style.font(-2));
  const double y = rect.top() + fp * 0.7;
  double x = rect.right() - fp * 10.5;
  p.setPen(QPen(style.foreground, 0.8));
  p.setBrush(style.foreground);
  p.drawEllipse(QPointF(x, y), fp * 0.24, fp * 0.24);
  p.drawText(QRectF(x + fp * 0.5, y - fp * 0.7, fp * 4, fp * 1.4), Qt::AlignVCenter,
             QStringLiteral("stance"));
  x += fp * 5;
  p.setBrush(Qt::white);
  p.drawRect(QRectF(x - fp * 0.22, y - fp * 0.22, fp * 0.44, fp * 0.44));
  p.drawText(QRectF(x + fp * 0.5, y - fp * 0.7, fp * 4, fp * 1.4), Qt::AlignVCenter,
             QStringLiteral("swing"));
}

}  // namespace

void paintStrideTimePlots(QPainter& p, const QRectF& rect, const analysis::Report& report,
                          const FigureStyle& style) {
  p.save();
  p.setRenderHint(QPainter::Antialiasing, true);
  p.fillRect(rect, style.background);
  const model::LimbSet& limbs = report.limbs;
  int rows = 0;
  for (const model::Limb& l : limbs.limbs()) rows = std::max(rows, l.segment + 1);
  std::vector<LimbTimes> times;
  double yMax = 0;
  for (int limb = 0; limb < limbs.size(); ++limb) {
    times.push_back(timesOf(report, limb));
    for (double v : times.back().stance) yMax = std::max(yMax, std::isnan(v) ? 0 : v);
    for (double v : times.back().swing) yMax = std::max(yMax, std::isnan(v) ? 0 : v);
  }
  yMax = niceCeiling(yMax * 1.05);  // one scale for every panel, so limbs compare directly
  const double fp = style.fontPx;
  const QRectF grid = rect.adjusted(0, fp * 1.4, 0, 0);
  const double cellW = grid.width() / 2;
  const double cellH = grid.height() / std::max(rows, 1);
  for (int limb = 0; limb < limbs.size(); ++limb) {
    const model::Limb& l = limbs.limb(limb);
    const int col = l.side == model::Side::left ? 0 : 1;
    const QRectF cell(grid.left() + col * cellW, grid.top() + l.segment * cellH, cellW, cellH);
    drawPanel(p, cell, report, limb, times[static_cast<std::size_t>(limb)], yMax, style, col == 0,
              l.segment == rows - 1);
  }
  drawLegend(p, rect, style);
  p.restore();
}

}  // namespace stridemark::ui::figures
