#pragma once
// Painters for the analysis figures: Gait map (Hildebrand plot with band shading), Phase dial
// and the per-stride parameter plot. Pure functions of a Report; every output reuses them.
#include <QPainter>
#include <QRectF>

#include "analysis/report.h"
#include "ui/figures/figure_style.h"

namespace stridemark::ui::figures {

// x = limb phase (0-1), y = hind duty factor (0-1). Shades the eight limb-phase bands
// (docs/methods.md §2.2, scheme B), marks duty factor 0.5 (walking/running) and plots each stride.
void paintGaitMap(QPainter& p, const QRectF& rect, const analysis::Report& report,
                  const FigureStyle& style);

// One ring per limb: each stride's phase as a dot, the circular mean as a spoke whose length
// is the mean resultant length r. Zero at the top, clockwise.
void paintPhaseDial(QPainter& p, const QRectF& rect, const analysis::Report& report,
                    const FigureStyle& style);

// Duty factor of each limb per reference stride (line per limb, dash for right limbs).
void paintStrideDutyPlot(QPainter& p, const QRectF& rect, const analysis::Report& report,
                         const FigureStyle& style);

}  // namespace stridemark::ui::figures
