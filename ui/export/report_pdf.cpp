#include "ui/export/report_pdf.h"

#include <algorithm>
#include <cmath>
#include <set>

#include "analysis/summary.h"
#include "stridemark/version.h"
#include "ui/export/pdf_document.h"

namespace stridemark::ui::exports {

using analysis::Report;
using analysis::Stat;

QString formatNumber(double value, int decimals) {
  if (std::isnan(value)) return QStringLiteral("–");
  QString text = QString::number(value, 'f', decimals);
  // A value that rounds to zero is shown without a sign ("-0.0" reads like an asymmetry).
  if (text.startsWith(QLatin1Char('-')) && text.toDouble() == 0.0) text.remove(0, 1);
  return text;
}

QString formatStat(const Stat& stat, int decimals) {
  if (stat.n == 0 || std::isnan(stat.mean)) return QStringLiteral("–");
  QString text = formatNumber(stat.mean, decimals);
  if (!std::isnan(stat.sd)) text += QStringLiteral(" ± ") + formatNumber(stat.sd, decimals);
  if (!std::isnan(stat.cv))
    text += QStringLiteral(" (CV %1 %)").arg(formatNumber(stat.cv * 100, 1));
  return text;
}

namespace {

QString qs(const std::string& s) {
  return QString::fromStdString(s);
}
QString orDash(const std::string& s) {
  return s.empty() ? QStringLiteral("–") : qs(s);
}

QString limbLabel(const Report& r, int limb) {
  return qs(r.limbs.label(limb));
}

// "1.00 m/s (belt), 2.50 m/s from frame 620": the speed from the start and each change.
QString speedSchedule(const model::TrialCard& t) {
  if (!t.speedMs) return QStringLiteral("not given");
  QString text = QStringLiteral("%1 m/s (%2)").arg(formatNumber(*t.speedMs, 2), qs(t.speedSource));
  for (const model::SpeedStep& step : t.speedChanges)
    text +=
        QStringLiteral(", %1 m/s from frame %2").arg(formatNumber(step.ms, 2)).arg(step.fromFrame);
  return text;
}

void trialCard(PdfDocument& doc, const ReportSource& src) {
  const model::Project& p = *src.project;
  const model::TrialCard& t = p.trial;
  const Report& r = *src.report;
  doc.heading(QStringLiteral("Trial card"));
  std::vector<std::pair<QString, QString>> rows = {
      {QStringLiteral("Project"), qs(src.projectName)},
      {QStringLiteral("Subject"), orDash(t.subject)},
      {QStringLiteral("Species"), orDash(t.species)},
      {QStringLiteral("Condition"), orDash(t.condition)},
      {QStringLiteral("Scorer"), orDash(t.observer)},
      {QStringLiteral("Exam date"), orDash(t.examDate)},
      {QStringLiteral("Limb set"), qs(r.limbs.name()) + QStringLiteral(" (reference limb ") +
                                       limbLabel(r, r.referenceLimb) + QStringLiteral(")")},
      {QStringLiteral("Capture rate"), qs(toString(r.fps)) + QStringLiteral(" frames/s")},
      {QStringLiteral("Speed"), speedSchedule(t)},
      {QStringLiteral("Leg length"),
       t.legLengthM ? QStringLiteral("%1 m").arg(formatNumber(*t.legLengthM, 3))
                    : QStringLiteral("not given")},
  };
  if (p.video) {
    rows.push_back({QStringLiteral("Video"), qs(p.video->path)});
    rows.push_back({QStringLiteral("Video signature"), orDash(p.video->signature)});
    rows.push_back({QStringLiteral("Frames in video"), QString::number(p.video->frameCount)});
  } else {
    rows.push_back({QStringLiteral("Video"), QStringLiteral("none linked")});
  }
  if (!t.notes.empty()) rows.push_back({QStringLiteral("Notes"), qs(t.notes)});
  rows.push_back({QStringLiteral("Exported"), qs(src.exportedAt) + QStringLiteral(" UTC")});
  rows.push_back({QStringLiteral("Software"), QStringLiteral("Stridemark ") + kVersion});
  doc.keyValues(rows);
}

void limbTable(PdfDocument& doc, const Report& r, const analysis::Summary& summary) {
  doc.heading(QStringLiteral("Per limb: mean ± SD (coefficient of variation)"));
  const std::vector<TableColumn> cols = {
      {QStringLiteral("Limb"), 0.6},     {QStringLiteral("n"), 0.4, Qt::AlignRight},
      {QStringLiteral("Stride (s)"), 2}, {QStringLiteral("Stance (s)"), 2},
      {QStringLiteral("Swing (s)"), 2},  {QStringLiteral("Duty factor"), 2}};
  std::vector<QStringList> rows;
  for (int limb = 0; limb < r.limbs.size() && limb < static_cast<int>(summary.limbs.size());
       ++limb) {
    const analysis::LimbSummary& s = summary.limbs[static_cast<std::size_t>(limb)];
    rows.push_back({limbLabel(r, limb), QString::number(s.strides), formatStat(s.strideS, 3),
                    formatStat(s.stanceS, 3), formatStat(s.swingS, 3),
                    formatStat(s.dutyFactor, 3)});
  }
  doc.table(cols, rows);
}

void phaseTable(PdfDocument& doc, const Report& r, const analysis::Summary& summary) {
  doc.heading(QStringLiteral("Relative phase to ") + limbLabel(r, r.referenceLimb) +
              QStringLiteral(" (cycles, 0–1)"));
  const std::vector<TableColumn> cols = {{QStringLiteral("Limb"), 1},
                                         {QStringLiteral("n"), 1, Qt::AlignRight},
                                         {QStringLiteral("Mean phase"), 1.5, Qt::AlignRight},
                                         {QStringLiteral("R"), 1, Qt::AlignRight},
                                         {QStringLiteral("Circular SD"), 1.5, Qt::AlignRight},
                                         {QStringLiteral("Rayleigh p"), 1.5, Qt::AlignRight}};
  std::vector<QStringList> rows;
  for (int limb = 0; limb < r.limbs.size() && limb < static_cast<int>(summary.phase.size());
       ++limb) {
    const analysis::PhaseSummary& s = summary.phase[static_cast<std::size_t>(limb)];
    rows.push_back({limbLabel(r, limb), QString::number(s.n), formatNumber(s.mean, 3),
                    formatNumber(s.r, 3), formatNumber(s.circSd, 3), formatNumber(s.rayleighP, 4)});
  }
  doc.table(cols, rows);
}

void hildebrandAndSupport(PdfDocument& doc, const analysis::Summary& r) {
  if (r.hildebrand) {
    doc.heading(QStringLiteral("Hildebrand values"));
    doc.keyValues({
        {QStringLiteral("Strides"), QString::number(r.hildebrand->n)},
        {QStringLiteral("Duty factor (hind)"), formatNumber(r.hildebrand->dutyFactor, 3)},
        {QStringLiteral("Limb phase (LF to LH)"), formatNumber(r.hildebrand->limbPhase, 3)},
        {QStringLiteral("Band"), orDash(r.hildebrand->band)},
    });
  }
  if (!r.support.empty()) {
    doc.heading(QStringLiteral("Support: share of the strides' time with k limbs in stance"));
    std::vector<TableColumn> cols = {{QStringLiteral("Limbs in stance"), 2}};
    QStringList row = {QStringLiteral("Share (%)")};
    for (std::size_t k = 0; k < r.support.size(); ++k) {
      cols.push_back({QString::number(k), 1, Qt::AlignRight});
      row << formatNumber(r.support[k] * 100, 1);
    }
    doc.table(cols, {row});
  }
  if (r.speed) {
    doc.heading(QStringLiteral("Speed"));
    const analysis::SpeedSummary& s = *r.speed;
    doc.keyValues({
        {QStringLiteral("Speed"), formatNumber(s.ms, 2) + QStringLiteral(" m/s")},
        {QStringLiteral("Froude number"),
         s.froude ? formatNumber(*s.froude, 3) : QStringLiteral("–")},
        {QStringLiteral("Stride length"), formatNumber(s.strideLengthM, 3) + QStringLiteral(" m")},
        {QStringLiteral("Relative stride length"),
         s.relativeStrideLength ? formatNumber(*s.relativeStrideLength, 2) : QStringLiteral("–")},
    });
  }
  if (r.dap) {
    doc.heading(QStringLiteral("Diagonal advanced placement (ms; positive = hind limb first)"));
    const analysis::DapSummary& d = *r.dap;
    doc.keyValues({
        {QStringLiteral("LH–RF"), formatStat(d.lhRfMs, 1)},
        {QStringLiteral("RH–LF"), formatStat(d.rhLfMs, 1)},
        {QStringLiteral("Mean of the two"), formatNumber(d.meanMs, 1)},
        {QStringLiteral("Difference (LH–RF minus RH–LF)"), formatNumber(d.differenceMs, 1)},
    });
  }
}

void symmetryTable(PdfDocument& doc, const analysis::Summary& r) {
  std::vector<std::pair<QString, const analysis::SymmetryValues*>> measures;
  for (const analysis::SymmetryMeasure& m : analysis::kSymmetryMeasures)
    measures.push_back({QString::fromLatin1(m.title), &(r.symmetry.*m.values)});
  std::set<std::string> pairs;
  for (const auto& m : measures) {
    for (const auto& [pair, si] : m.second->si) pairs.insert(pair);
  }
  if (pairs.empty()) return;
  doc.heading(QStringLiteral("Symmetry index (Robinson, %; positive = right larger)"));
  std::vector<TableColumn> cols = {{QStringLiteral("Measure"), 1.6}};
  for (const std::string& pair : pairs) {
    cols.push_back({qs(pair) + QStringLiteral(" SI (%)"), 1, Qt::AlignRight});
    cols.push_back({qs(pair) + QStringLiteral(" R/L"), 1, Qt::AlignRight});
  }
  std::vector<QStringList> rows;
  for (const auto& [name, values] : measures) {
    QStringList row = {name};
    for (const std::string& pair : pairs) {
      const auto si = values->si.find(pair);
      const auto ratio = values->ratio.find(pair);
      row << (si == values->si.end() ? QStringLiteral("–") : formatNumber(si->second, 1));
      row << (ratio == values->ratio.end() ? QStringLiteral("–") : formatNumber(ratio->second, 3));
    }
    rows.push_back(row);
  }
  doc.table(cols, rows);
}

void boutTable(PdfDocument& doc, const Report& r) {
  doc.heading(QStringLiteral("Gait bouts"));
  if (r.bouts.empty()) {
    doc.paragraph(QStringLiteral("No complete reference strides, so no gait bouts."));
    return;
  }
  const std::vector<TableColumn> cols = {{QStringLiteral("Gait"), 2},
                                         {QStringLiteral("Stride nos."), 1, Qt::AlignRight},
                                         {QStringLiteral("Summarised"), 1, Qt::AlignRight},
                                         {QStringLiteral("Frames"), 1.6, Qt::AlignRight},
                                         {QStringLiteral("Duration (s)"), 1.2, Qt::AlignRight}};
  std::vector<QStringList> rows;
  for (const analysis::Bout& b : r.bouts) {
    rows.push_back({qs(b.gait),
                    QStringLiteral("%1–%2").arg(b.firstStride + 1).arg(b.lastStride + 1),
                    QString::number(b.summary.strides),
                    QStringLiteral("%1–%2").arg(b.startFrame).arg(b.endFrame),
                    formatNumber(framesToSeconds(b.endFrame - b.startFrame, r.fps), 3)});
  }
  doc.table(cols, rows);
}

void strideTable(PdfDocument& doc, const Report& r) {
  doc.heading(QStringLiteral("Reference strides (") + limbLabel(r, r.referenceLimb) +
              QStringLiteral(" touchdown to touchdown)"));
  std::vector<TableColumn> cols = {{QStringLiteral("#"), 0.5, Qt::AlignRight},
                                   {QStringLiteral("Frames"), 1.4, Qt::AlignRight},
                                   {QStringLiteral("Time (s)"), 0.9, Qt::AlignRight},
                                   {QStringLiteral("Gait"), 1.6}};
  for (int limb = 0; limb < r.limbs.size(); ++limb) {
    cols.push_back({limbLabel(r, limb) + QStringLiteral(" DF"), 0.8, Qt::AlignRight});
  }
  std::vector<QStringList> rows;
  int index = 0;
  for (const analysis::StrideRecord& s : r.strides) {
    QStringList row = {QString::number(++index),
                       QStringLiteral("%1–%2").arg(s.startFrame).arg(s.endFrame),
                       formatNumber(s.durationS, 3), qs(s.gait)};
    for (int limb = 0; limb < r.limbs.size(); ++limb) {
      const auto& df = s.dutyFactor;
      const auto i = static_cast<std::size_t>(limb);
      row << (i < df.size() && df[i] ? formatNumber(*df[i], 2) : QStringLiteral("–"));
    }
    rows.push_back(row);
  }
  if (rows.empty()) {
    doc.paragraph(QStringLiteral("No complete reference strides were scored."));
    return;
  }
  doc.table(cols, rows);
}

void problemsAndExclusions(PdfDocument& doc, const Report& r) {
  doc.heading(QStringLiteral("Problems found in the tags"));
  if (r.problems.empty()) {
    doc.paragraph(QStringLiteral("None: every tag fits a complete touchdown/lift-off sequence."));
  } else {
    const std::vector<TableColumn> cols = {{QStringLiteral("Frame"), 0.8, Qt::AlignRight},
                                           {QStringLiteral("Limb"), 0.6},
                                           {QStringLiteral("What is wrong"), 5}};
    std::vector<QStringList> rows;
    for (const analysis::Problem& p : r.problems) {
      rows.push_back({QString::number(p.frame),
                      p.limb ? limbLabel(r, *p.limb) : QStringLiteral("–"), qs(p.message)});
    }
    doc.table(cols, rows);
  }
  doc.heading(QStringLiteral("Strides left out of the figures"));
  QStringList lines;
  for (std::size_t i = 0; i < r.strides.size(); ++i) {
    const analysis::StrideRecord& s = r.strides[i];
    if (s.gait != "unclassified" && s.gait != "transition" && s.steady && !s.excluded) continue;
    const QString why = s.excluded ? QStringLiteral("excluded by the scorer: ") + qs(*s.excluded)
                        : s.note   ? qs(*s.note)
                                   : qs(s.gait);
    lines << QStringLiteral("Stride %1 (frames %2–%3, %4): %5.")
                 .arg(i + 1)
                 .arg(s.startFrame)
                 .arg(s.endFrame)
                 .arg(qs(s.gait), why);
  }
  doc.paragraph(lines.isEmpty()
                    ? QStringLiteral("None: every reference stride is complete and steady.")
                    : lines.join(QLatin1Char('\n')));
}

// One gait's figures (or, when no bout has formed, every scored stride's).
void gaitSection(PdfDocument& doc, const Report& r, const std::string& gait,
                 const analysis::Summary& summary) {
  doc.heading(gait.empty() ? QStringLiteral("All scored strides (no gait bout formed)")
                           : QStringLiteral("%1 (%2 strides)").arg(qs(gait)).arg(summary.strides));
  limbTable(doc, r, summary);
  symmetryTable(doc, summary);
  phaseTable(doc, r, summary);
  hildebrandAndSupport(doc, summary);
}

void methodsParagraph(PdfDocument& doc, const Report& r) {
  doc.heading(QStringLiteral("Methods"));
  doc.paragraph(
      QStringLiteral(
          "Strides run from one touchdown of the reference limb (%1) to its next. Duty factor "
          "is stance over stride time of each limb's own cycle; relative phase is a limb's "
          "touchdown after the reference touchdown, as a share of the stride (0–1). Times come "
          "from frame numbers at the capture rate (%2 frames/s). A stride is classified only "
          "when every limb lands once in it with its own cycle fully tagged; a bout is at least "
          "two strides of one gait, and figures are given per gait over the steady strides of "
          "its bouts. Symmetrical quadruped gaits follow Hildebrand's limb phase and duty "
          "factor; uneven walking strides stay walks. Symmetry index (Robinson): (R − L) / "
          "(½ (R + L)) × 100, positive when the right value is larger. Diagonal advanced "
          "placement: fore touchdown minus hind touchdown of each diagonal, positive when the "
          "hind limb lands first. Definitions and sources: docs/methods.md of Stridemark %3.")
          .arg(limbLabel(r, r.referenceLimb), qs(toString(r.fps)), QString::fromLatin1(kVersion)));
}

}  // namespace

int writeReportPdf(const ReportSource& source, const std::vector<NamedFigure>& figures,
                   const QString& path) {
  const Report& r = *source.report;
  const QString footer = QStringLiteral("Stridemark %1 · %2 · exported %3 UTC")
                             .arg(kVersion, qs(source.projectName), qs(source.exportedAt));
  PdfDocument doc(path, QStringLiteral("Gait report – ") + qs(source.projectName), footer);
  doc.title(QStringLiteral("Gait report"),
            qs(source.project->trial.subject.empty() ? source.projectName
                                                     : source.project->trial.subject) +
                QStringLiteral(" · scored by ") + orDash(source.project->trial.observer) +
                QStringLiteral(" · ") + qs(source.exportedAt) + QStringLiteral(" UTC"));
  trialCard(doc, source);
  boutTable(doc, r);
  if (r.mixedGaits) {
    doc.paragraph(QStringLiteral(
        "This trial has more than one gait, so its figures are given per gait; pooled figures "
        "would mix gaits (for example a walk's and a trot's duty factors) and are not shown."));
    std::vector<std::string> order;  // gaits in the order the trial shows them
    for (const analysis::Bout& b : r.bouts)
      if (std::find(order.begin(), order.end(), b.gait) == order.end()) order.push_back(b.gait);
    for (const std::string& gait : order) gaitSection(doc, r, gait, r.byGait.at(gait));
  } else if (r.byGait.size() == 1) {
    gaitSection(doc, r, r.byGait.begin()->first, r.byGait.begin()->second);
  } else {
    gaitSection(doc, r, {}, analysis::trialSummary(r));
  }
  methodsParagraph(doc, r);
  for (const NamedFigure& f : figures) {
    // Slightly larger than the standalone file, still with the same proportions and fonts.
    doc.figure(f.paint, f.size, 1.5, f.title + QStringLiteral(". ") + f.caption);
  }
  strideTable(doc, r);
  problemsAndExclusions(doc, r);
  doc.finish();
  return doc.pageCount();
}

}  // namespace stridemark::ui::exports
