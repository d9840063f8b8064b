// The Scope toolbar: one selector for what the Summary dock, Gait map, Phase dial and Stride
// sheet show (all strides, one gait's bouts, or one bout; issue 16 item 7). The Checks dock,
// the duty plot and the lanes always show the whole trial.
#include <QComboBox>
#include <QLabel>
#include <QToolBar>
#include <algorithm>

#include "analysis/bouts.h"
#include "ui/main_window.h"
#include "ui/widgets/figure_view.h"
#include "ui/widgets/report_panels.h"
#include "ui/widgets/stride_sheet.h"

namespace stridemark::ui {

namespace {

QString scopeLabel(const analysis::Report& r, const ReportScope& scope) {
  const auto gait = QString::fromStdString(scope.gait);
  switch (scope.kind) {
    case ReportScope::Kind::all: {
      QStringList gaits;
      for (const auto& g : analysis::gaitsInOrder(r.bouts)) gaits << QString::fromStdString(g);
      return gaits.size() > 1
                 ? QObject::tr("All strides (%1)").arg(gaits.join(QStringLiteral(", ")))
                 : QObject::tr("All strides");
    }
    case ReportScope::Kind::gait: {
      const auto it = r.byGait.find(scope.gait);
      return QObject::tr("%1, every bout (%2 strides)")
          .arg(gait)
          .arg(it == r.byGait.end() ? 0 : it->second.strides);
    }
    case ReportScope::Kind::bout: {
      const int b = boutIndex(r, scope);
      if (b < 0) return gait;
      const auto& bout = r.bouts[static_cast<std::size_t>(b)];
      return QObject::tr("Bout %1: %2, strides %3–%4")
          .arg(b + 1)
          .arg(gait)
          .arg(bout.firstStride + 1)
          .arg(bout.lastStride + 1);
    }
  }
  return {};
}

}  // namespace

void MainWindow::buildScopeBar() {
  auto* bar = addToolBar(tr("Scope"));
  bar->setObjectName(QStringLiteral("scopeBar"));
  auto* label = new QLabel(tr("Show: "));
  scopeBox_ = new QComboBox;
  scopeBox_->setObjectName(QStringLiteral("scopeSelector"));
  scopeBox_->setAccessibleName(tr("Scope"));
  scopeBox_->setToolTip(
      tr("What the Summary, Gait map, Phase dial and Stride sheet show: every stride, the "
         "bouts of one gait, or one bout."));
  scopeBox_->setSizeAdjustPolicy(QComboBox::AdjustToContents);
  label->setBuddy(scopeBox_);
  bar->addWidget(label);
  bar->addWidget(scopeBox_);
  scopeBox_->addItem(tr("All strides"));
  scopes_ = {ReportScope{}};
  connect(scopeBox_, &QComboBox::currentIndexChanged, this, [this](int index) {
    if (index < 0 || index >= static_cast<int>(scopes_.size())) return;
    scope_ = scopes_[static_cast<std::size_t>(index)];
    showScope();
  });
}

void MainWindow::setScope(const ReportScope& scope) {
  const auto it = std::find(scopes_.begin(), scopes_.end(), scope);
  if (it == scopes_.end()) return;
  scopeBox_->setCurrentIndex(static_cast<int>(it - scopes_.begin()));
}

// The selector's entries follow the newest report; rebuilt only when they change.
void MainWindow::updateScopeChoices() {
  if (!report_) return;
  scope_ = refit(scope_, *report_);
  std::vector<ReportScope> scopes = scopesOf(*report_);
  QStringList labels;
  for (const auto& s : scopes) labels << scopeLabel(*report_, s);
  QStringList shown;
  for (int i = 0; i < scopeBox_->count(); ++i) shown << scopeBox_->itemText(i);
  const int current =
      static_cast<int>(std::find(scopes.begin(), scopes.end(), scope_) - scopes.begin());
  if (labels != shown) {
    const QSignalBlocker block(scopeBox_);
    scopeBox_->clear();
    scopeBox_->addItems(labels);
  }
  scopes_ = std::move(scopes);
  const QSignalBlocker block(scopeBox_);
  scopeBox_->setCurrentIndex(current);
}

void MainWindow::showScope() {
  const bool all = scope_.kind == ReportScope::Kind::all;
  const auto scoped = scopedReport(report_, scope_);
  if (all || !report_) {
    sheet_->setReport(report_);
  } else {
    sheet_->setReport(report_, scopeStrides(*report_, scope_));
  }
  gaitMap_->setReport(scoped);
  phaseDial_->setReport(scoped);
  summary_->setReport(scoped, all || !report_ ? QString() : scopeBox_->currentText());
}

}  // namespace stridemark::ui
