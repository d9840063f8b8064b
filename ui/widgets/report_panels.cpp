#include "ui/widgets/report_panels.h"

#include <QAction>
#include <QMenu>
#include <algorithm>
#include <cmath>

#include "analysis/bouts.h"
#include "analysis/summary.h"

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

void SummaryView::setReport(std::shared_ptr<const analysis::Report> report, const QString& scope) {
  // Laying the text out again is most of the dock's cost after an edit (a few ms); one moved
  // tag in a long trial seldom changes a printed figure, so the same text is not set again.
  QString html = report ? summaryHtml(*report, scope) : QString();
  if (html == shown_) return;
  shown_ = std::move(html);
  setHtml(shown_);
}

namespace {

QString limbTable(const analysis::Summary& s, const model::LimbSet& limbs) {
  QString html = QStringLiteral(
      "<table cellspacing=4><tr><th align=left>limb</th>"
      "<th>strides</th><th>stride s</th><th>stance s</th>"
      "<th>swing s</th><th>duty %</th><th>phase %</th></tr>");
  for (int i = 0; i < limbs.size(); ++i) {
    const auto at = static_cast<std::size_t>(i);
    const auto& l = s.limbs.size() > at ? s.limbs[at] : analysis::LimbSummary{};
    const auto& ph = s.phase.size() > at ? s.phase[at] : analysis::PhaseSummary{};
    html += QStringLiteral(
                "<tr><td><b>%1</b></td><td align=right>%2</td><td align=right>%3</td>"
                "<td align=right>%4</td><td align=right>%5</td><td align=right>%6</td>"
                "<td align=right>%7 (r %8)</td></tr>")
                .arg(QString::fromStdString(limbs.label(i)))
                .arg(l.strides)
                .arg(stat(l.strideS, 1, 3), stat(l.stanceS, 1, 3), stat(l.swingS, 1, 3),
                     stat(l.dutyFactor, 100, 1), num(ph.mean * 100, 1), num(ph.r, 2));
  }
  return html + QStringLiteral("</table>");
}

QString speedText(const analysis::SpeedSummary& v) {
  QString text = QStringLiteral("<p>Speed %1 m/s; stride length %2 m")
                     .arg(num(v.ms, 2), num(v.strideLengthM, 2));
  if (v.froude) text += QStringLiteral("; Froude number %1").arg(num(*v.froude, 3));
  if (v.relativeStrideLength)
    text += QStringLiteral("; relative stride length %1").arg(num(*v.relativeStrideLength, 2));
  return text + QStringLiteral("</p>");
}

// Every figure of one summary (a gait's, a bout's or the pooled trial's), in the same order.
QString summaryBody(const analysis::Summary& s, const model::LimbSet& limbs) {
  QString html = limbTable(s, limbs);
  if (s.hildebrand)
    html += QStringLiteral(
                "<p>Gait map point: hind duty factor %1 %, limb phase %2 % — %3 (n = %4)</p>")
                .arg(num(s.hildebrand->dutyFactor * 100, 1), num(s.hildebrand->limbPhase * 100, 1),
                     QString::fromStdString(s.hildebrand->band))
                .arg(s.hildebrand->n);
  const QString sym = symmetryRows(QStringLiteral("stance"), s.symmetry.stanceS) +
                      symmetryRows(QStringLiteral("swing"), s.symmetry.swingS) +
                      symmetryRows(QStringLiteral("duty factor"), s.symmetry.dutyFactor);
  if (!sym.isEmpty())
    html += QStringLiteral("<p>Symmetry index (right vs left)</p><table cellspacing=4>%1</table>")
                .arg(sym);
  if (s.speed) html += speedText(*s.speed);
  if (!s.support.empty()) {
    html += QStringLiteral("<p>Support: ");
    for (std::size_t k = 0; k < s.support.size(); ++k)
      html += QStringLiteral("%1 limbs %2 %&nbsp;&nbsp; ").arg(k).arg(num(s.support[k] * 100, 1));
    html += QStringLiteral("</p>");
  }
  return html;
}

QString strideCount(int n) {
  return n == 1 ? QStringLiteral("1 stride") : QStringLiteral("%1 strides").arg(n);
}

int boutsOf(const analysis::Report& r, const std::string& gait) {
  return static_cast<int>(std::count_if(r.bouts.begin(), r.bouts.end(),
                                        [&](const analysis::Bout& b) { return b.gait == gait; }));
}

}  // namespace

QString SummaryView::summaryHtml(const analysis::Report& r, const QString& scope) {
  QString html;
  if (!scope.isEmpty())
    html += QStringLiteral("<p><b>Showing: %1</b></p>").arg(scope.toHtmlEscaped());
  // Per gait first (docs/methods.md §11): pooled means of a walk and a trot describe neither.
  for (const auto& gait : analysis::gaitsInOrder(r.bouts)) {
    const auto it = r.byGait.find(gait);
    if (it == r.byGait.end()) continue;
    const int bouts = boutsOf(r, gait);
    html += QStringLiteral("<h3>%1 — %2%3</h3>")
                .arg(QString::fromStdString(gait), strideCount(it->second.strides),
                     r.mixedGaits
                         ? QStringLiteral(" in %1 bout%2").arg(bouts).arg(bouts == 1 ? "" : "s")
                         : QString());
    html += summaryBody(it->second, r.limbs);
  }
  const analysis::Summary pooled = analysis::trialSummary(r);
  if (r.byGait.empty()) {
    html += QStringLiteral("<h3>All strides — %1</h3>").arg(strideCount(pooled.strides));
    html += summaryBody(pooled, r.limbs);
  } else if (r.mixedGaits) {
    html += QStringLiteral(
                "<h3>All strides pooled — %1</h3><p><i>Mixed gaits: these means mix every "
                "gait above; read the per-gait figures.</i></p>")
                .arg(strideCount(pooled.strides));
    html += summaryBody(pooled, r.limbs);
  }
  const bool anySpeed =
      pooled.speed || std::any_of(r.byGait.begin(), r.byGait.end(),
                                  [](const auto& g) { return g.second.speed.has_value(); });
  if (!anySpeed)
    html += QStringLiteral(
        "<p><i>Enter speed and leg length on the Trial card to get the Froude "
        "number.</i></p>");
  const auto excluded =
      std::count_if(r.strides.begin(), r.strides.end(),
                    [](const analysis::StrideRecord& s) { return s.excluded.has_value(); });
  if (excluded > 0)
    html += QStringLiteral(
                "<p><i>%1 excluded by hand (reasons in the Stride sheet); not in these "
                "figures.</i></p>")
                .arg(strideCount(static_cast<int>(excluded)));
  return html;
}

}  // namespace stridemark::ui
