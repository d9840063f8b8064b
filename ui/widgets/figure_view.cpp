#include "ui/widgets/figure_view.h"

#include <QPainter>

namespace stridemark::ui {

FigureView::FigureView(const QString& accessibleName, Paint paint, QWidget* parent)
    : QWidget(parent), paint_(std::move(paint)) {
  setAccessibleName(accessibleName);
  setMinimumSize(200, 160);
}

void FigureView::setReport(std::shared_ptr<const analysis::Report> report) {
  report_ = std::move(report);
  update();
}

void FigureView::paintEvent(QPaintEvent*) {
  QPainter p(this);
  const auto style = figures::FigureStyle::fromPalette(palette());
  if (!report_) {
    p.fillRect(rect(), style.background);
    p.setPen(style.muted);
    p.drawText(rect(), Qt::AlignCenter, tr("Tag some strides to see this figure."));
    return;
  }
  paint_(p, QRectF(rect()), *report_, style);
}

}  // namespace stridemark::ui
