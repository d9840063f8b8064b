#pragma once
// Per-limb stride-parameter plot for exports and the Stride sheet: one small panel per limb
// (laid out as the animal is seen from above), stance and swing time of each of that limb's
// strides against the stride number. Stance: filled discs joined by a solid line; swing:
// hollow squares joined by a dashed line (shape and dash are the cue beside the limb colour).
// Written by the export engineer (issue 6) because no such painter existed yet.
#include <QPainter>
#include <QRectF>

#include "analysis/report.h"
#include "ui/figures/figure_style.h"

namespace stridemark::ui::figures {

void paintStrideTimePlots(QPainter& p, const QRectF& rect, const analysis::Report& report,
                          const FigureStyle& style);

}  // namespace stridemark::ui::figures
