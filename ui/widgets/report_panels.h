#pragma once
// Checks (annotation problems, click to jump) and the summary panel (per gait, then pooled:
// per-limb means, Hildebrand point, symmetry indices, speed and Froude number).
#include <QListWidget>
#include <QTextBrowser>
#include <memory>
#include <optional>

#include "analysis/report.h"

namespace stridemark::ui {

class ChecksList : public QListWidget {
  Q_OBJECT
 public:
  explicit ChecksList(QWidget* parent = nullptr);
  // `anyTags` false: the list says nothing is tagged yet instead of listing problems (the
  // window knows; without it the list guesses from the report: no cycle, stride or problem).
  // The entry of the same frame and limb as the current one stays current, so after a fix the
  // problem that is left there is the one selected.
  void setReport(std::shared_ptr<const analysis::Report> report,
                 std::optional<bool> anyTags = std::nullopt);
  // "Swap this limb's tags from here", enabled on a problem that says a limb's tags look
  // swapped (its context menu, and the button under the list in the Checks dock).
  QAction* swapAction() const { return swapAction_; }
  // True when some entry offers a fix.
  bool hasFixes() const { return hasFixes_; }

 signals:
  void seekRequested(qint64 frame);
  void limbRequested(int limb);
  void swapRequested(int limb, qint64 fromFrame);
  void hasFixesChanged(bool any);

 private:
  void jumpTo(QListWidgetItem* item);
  void showMenu(const QPoint& pos);
  void setHasFixes(bool any);
  QAction* swapAction_ = nullptr;
  bool hasFixes_ = false;
};

class SummaryView : public QTextBrowser {
  Q_OBJECT
 public:
  explicit SummaryView(QWidget* parent = nullptr);
  // `scope`: what the report covers when it is not the whole trial (the scope selector's
  // text), shown on top.
  void setReport(std::shared_ptr<const analysis::Report> report, const QString& scope = {});
  // Per gait first when the trial has bouts (docs/methods.md §11), then the pooled figures
  // only when gaits are mixed (labelled as such) or no bout was found.
  static QString summaryHtml(const analysis::Report& report, const QString& scope = {});

 private:
  QString shown_;  // the text set last
};

}  // namespace stridemark::ui
