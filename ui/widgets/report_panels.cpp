#include "ui/widgets/report_panels.h"

#include <QAction>
#include <QMenu>
#include <cmath>

namespace stridemark::ui {

namespace {

constexpr int kFrameRole = Qt::UserRole + 1;
constexpr int kLimbRole = Qt::UserRole + 2;
constexpr int kSwapRole = Qt::UserRole + 3;  // the problem is a swap the list can fix

QString num(double v, int decimals) {
  return std::isfinite(v) ? QString::number(v, 'f', decimals) : QStringLiteral("–");
}

QString stat(const analysis::Stat& s, double scale, int decimals) {
  if (s.n == 0 || !std::isfinite(s.mean)) return QStringLiteral("–");
  QString text = num(s.mean * scale, decimals);
  if (std::isfinite(s.sd)) text += QStringLiteral(" ± ") + num(s.sd * scale, decimals);
  return text;
}

QString symmetryRows(const QString& name, const analysis::SymmetryValues& v) {
  QString rows;
  for (const auto& [pair, si] : v.si)
    rows += QStringLiteral("<tr><td>%1</td><td>%2</td><td align=right>%3 %</td></tr>")
                .arg(name, QString::fromStdString(pair), num(si, 1));
  return rows;
}

}  // namespace

ChecksList::ChecksList(QWidget* parent) : QListWidget(parent) {
  setAccessibleName(tr("Checks"));
  setAccessibleDescription(
      tr("Annotation problems with frame and limb. Enter or click jumps to the frame; a "
         "problem with a fix offers it in its context menu."));
  // Messages say what is wrong and what to do: show them whole.
  setWordWrap(true);
  setResizeMode(QListView::Adjust);
  connect(this, &QListWidget::itemClicked, this, &ChecksList::jumpTo);
  connect(this, &QListWidget::itemActivated, this, &ChecksList::jumpTo);
  swapAction_ = new QAction(tr("Swap this limb's tags from here"), this);
  swapAction_->setObjectName(QStringLiteral("checksSwapTags"));
  swapAction_->setToolTip(
      tr("Touchdown becomes lift-off and lift-off touchdown for this limb's tags from the "
         "problem's frame on (one undo step). Then delete the extra tag Checks points to."));
  swapAction_->setEnabled(false);
  setContextMenuPolicy(Qt::CustomContextMenu);
  connect(this, &QWidget::customContextMenuRequested, this, &ChecksList::showMenu);
  connect(this, &QListWidget::currentItemChanged, this, [this](QListWidgetItem* item) {
    swapAction_->setEnabled(item && item->data(kSwapRole).toBool());
  });
  connect(swapAction_, &QAction::triggered, this, [this] {
    const QListWidgetItem* item = currentItem();
    if (!item || !item->data(kSwapRole).toBool()) return;
    emit swapRequested(item->data(kLimbRole).toInt(), item->data(kFrameRole).toLongLong());
  });
}

void ChecksList::jumpTo(QListWidgetItem* item) {
  if (!item || item->data(kFrameRole).toLongLong() < 0) return;
  const int limb = item->data(kLimbRole).toInt();
  if (limb >= 0) emit limbRequested(limb);
  emit seekRequested(item->data(kFrameRole).toLongLong());
}

void ChecksList::showMenu(const QPoint& pos) {
  QListWidgetItem* item = itemAt(pos);
  if (!item || item->data(kFrameRole).toLongLong() < 0) return;
  setCurrentItem(item);
  QMenu menu(this);
  const qint64 frame = item->data(kFrameRole).toLongLong();
  menu.addAction(tr("Go to frame %1").arg(frame), this, [this, item] { jumpTo(item); });
  if (item->data(kSwapRole).toBool()) menu.addAction(swapAction_);
  menu.exec(viewport()->mapToGlobal(pos));
}

void ChecksList::setHasFixes(bool any) {
  if (any == hasFixes_) return;
  hasFixes_ = any;
  emit hasFixesChanged(any);
}

void ChecksList::setReport(std::shared_ptr<const analysis::Report> report,
                           std::optional<bool> anyTags) {
  // Keep the entry of the same frame and limb current across a re-score.
  std::optional<std::pair<qlonglong, int>> current;
  if (const QListWidgetItem* item = currentItem())
    current = {item->data(kFrameRole).toLongLong(), item->data(kLimbRole).toInt()};
  clear();
  swapAction_->setEnabled(false);
  bool fixes = false;
  if (!report) return setHasFixes(false);
  const bool nothingTagged =
      anyTags ? !*anyTags
              : report->problems.empty() && report->cycles.empty() && report->strides.empty();
  if (nothingTagged) {
    auto* item = new QListWidgetItem(
        tr("Nothing tagged yet: press a limb's tag key at its touchdown (Tag keys dock)."), this);
    item->setFlags(Qt::ItemIsEnabled);
    item->setData(kFrameRole, -1);
    return setHasFixes(false);
  }
  QListWidgetItem* keep = nullptr;
  for (const auto& problem : report->problems) {
    const QString limb =
        problem.limb ? QString::fromStdString(report->limbs.label(*problem.limb)) : tr("all");
    const QString message = QString::fromStdString(problem.message);
    auto* item =
        new QListWidgetItem(tr("frame %1 · %2 · %3").arg(problem.frame).arg(limb, message), this);
    item->setToolTip(message);
    item->setData(kFrameRole, static_cast<qlonglong>(problem.frame));
    item->setData(kLimbRole, problem.limb ? *problem.limb : -1);
    // The wording of core/analysis/tag_checks.cpp's swapped-tags check; its frame is where the
    // swap starts (the extra tag).
    const bool swap =
        problem.limb && problem.message.find("look swapped from frame") != std::string::npos;
    item->setData(kSwapRole, swap);
    fixes = fixes || swap;
    if (!keep && current &&
        *current == std::pair<qlonglong, int>{problem.frame, problem.limb.value_or(-1)})
      keep = item;
  }
  if (report->problems.empty()) {
    auto* item = new QListWidgetItem(tr("No problems found."), this);
    item->setFlags(Qt::ItemIsEnabled);
    item->setData(kFrameRole, -1);
  }
  if (keep) setCurrentItem(keep);
  setHasFixes(fixes);
}

SummaryView::SummaryView(QWidget* parent) : QTextBrowser(parent) {
  setAccessibleName(tr("Summary"));
  setOpenLinks(false);
}

void SummaryView::setReport(std::shared_ptr<const analysis::Report> report) {
  setHtml(report ? summaryHtml(*report) : QString());
}

QString SummaryView::summaryHtml(const analysis::Report& r) {
  QString html = QStringLiteral(
      "<h4>Per limb</h4><table cellspacing=4><tr><th align=left>limb</th>"
      "<th>strides</th><th>stride s</th><th>stance s</th>"
      "<th>swing s</th><th>duty %</th><th>phase %</th></tr>");
  for (int i = 0; i < r.limbs.size(); ++i) {
    const auto& s = r.limbSummary.size() > static_cast<std::size_t>(i)
                        ? r.limbSummary[static_cast<std::size_t>(i)]
                        : analysis::LimbSummary{};
    const auto& ph = r.phase.size() > static_cast<std::size_t>(i)
                         ? r.phase[static_cast<std::size_t>(i)]
                         : analysis::PhaseSummary{};
    html += QStringLiteral(
                "<tr><td><b>%1</b></td><td align=right>%2</td><td align=right>%3</td>"
                "<td align=right>%4</td><td align=right>%5</td><td align=right>%6</td>"
                "<td align=right>%7 (r %8)</td></tr>")
                .arg(QString::fromStdString(r.limbs.label(i)))
                .arg(s.strides)
                .arg(stat(s.strideS, 1, 3), stat(s.stanceS, 1, 3), stat(s.swingS, 1, 3),
                     stat(s.dutyFactor, 100, 1), num(ph.mean * 100, 1), num(ph.r, 2));
  }
  html += QStringLiteral("</table>");
  if (r.hildebrand) {
    html += QStringLiteral(
                "<h4>Gait map point</h4><p>hind duty factor %1 %, limb phase %2 % — "
                "%3</p>")
                .arg(num(r.hildebrand->dutyFactor * 100, 1), num(r.hildebrand->limbPhase * 100, 1),
                     QString::fromStdString(r.hildebrand->band));
  }
  QString sym = symmetryRows(QStringLiteral("stance"), r.symmetry.stanceS) +
                symmetryRows(QStringLiteral("swing"), r.symmetry.swingS) +
                symmetryRows(QStringLiteral("duty factor"), r.symmetry.dutyFactor);
  if (!sym.isEmpty())
    html += QStringLiteral("<h4>Symmetry index (right vs left)</h4><table cellspacing=4>%1</table>")
                .arg(sym);
  if (r.speed) {
    html += QStringLiteral("<h4>Speed</h4><p>%1 m/s; stride length %2 m")
                .arg(num(r.speed->ms, 2), num(r.speed->strideLengthM, 2));
    if (r.speed->froude) html += QStringLiteral("; Froude number %1").arg(num(*r.speed->froude, 3));
    if (r.speed->relativeStrideLength)
      html +=
          QStringLiteral("; relative stride length %1").arg(num(*r.speed->relativeStrideLength, 2));
    html += QStringLiteral("</p>");
  } else {
    html += QStringLiteral(
        "<p><i>Enter speed and leg length on the Trial card to get the Froude "
        "number.</i></p>");
  }
  if (!r.support.empty()) {
    html += QStringLiteral("<h4>Support</h4><p>");
    for (std::size_t k = 0; k < r.support.size(); ++k)
      html += QStringLiteral("%1 limbs: %2 %&nbsp;&nbsp; ").arg(k).arg(num(r.support[k] * 100, 1));
    html += QStringLiteral("</p>");
  }
  return html;
}

}  // namespace stridemark::ui
