#pragma once
// Checks (annotation problems, click to jump) and the summary panel (per-limb means, Hildebrand
// point, symmetry indices, speed and Froude number).
#include <QListWidget>
#include <QTextBrowser>
#include <memory>

#include "analysis/report.h"

namespace stridemark::ui {

class ChecksList : public QListWidget {
  Q_OBJECT
 public:
  explicit ChecksList(QWidget* parent = nullptr);
  void setReport(std::shared_ptr<const analysis::Report> report);
  // "Swap this limb's tags from here", enabled on a problem that says a limb's tags look
  // swapped (its context menu and the list's actions).
  QAction* swapAction() const { return swapAction_; }

 signals:
  void seekRequested(qint64 frame);
  void limbRequested(int limb);
  void swapRequested(int limb, qint64 fromFrame);

 private:
  QAction* swapAction_ = nullptr;
};

class SummaryView : public QTextBrowser {
  Q_OBJECT
 public:
  explicit SummaryView(QWidget* parent = nullptr);
  void setReport(std::shared_ptr<const analysis::Report> report);
  static QString summaryHtml(const analysis::Report& report);
};

}  // namespace stridemark::ui
