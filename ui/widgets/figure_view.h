#pragma once
// Shows one figure painter (Gait map, Phase dial, duty plot) on screen, redrawn when the
// report changes. The painter is the same function export uses.
#include <QWidget>
#include <functional>
#include <memory>

#include "analysis/report.h"
#include "ui/figures/figure_style.h"

namespace stridemark::ui {

class FigureView : public QWidget {
  Q_OBJECT
 public:
  using Paint = std::function<void(QPainter&, const QRectF&, const analysis::Report&,
                                   const figures::FigureStyle&)>;
  FigureView(const QString& accessibleName, Paint paint, QWidget* parent = nullptr);
  void setReport(std::shared_ptr<const analysis::Report> report);
  const std::shared_ptr<const analysis::Report>& report() const { return report_; }
  QSize sizeHint() const override { return {360, 300}; }

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  Paint paint_;
  std::shared_ptr<const analysis::Report> report_;
};

}  // namespace stridemark::ui
