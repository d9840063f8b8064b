#pragma once
// The multi-page PDF report of one scored trial: trial card, summary tables, figures, problems
// and excluded strides, scorer and date, software version; the clinical caution on every page.
#include <QString>
#include <string>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"
#include "ui/export/figure_set.h"

namespace stridemark::ui::exports {

struct ReportSource {
  const model::Project* project = nullptr;
  const analysis::Report* report = nullptr;
  std::string projectName;  // file name of the project
  std::string exportedAt;   // ISO date-time of the export (UTC)
};

// Writes the report to `path`; returns the number of pages. Throws stridemark::Error(export_).
int writeReportPdf(const ReportSource& source, const std::vector<NamedFigure>& figures,
                   const QString& path);

// Text helpers shared with the clip overlay and tests.
QString formatStat(const analysis::Stat& stat, int decimals);  // "0.512 ± 0.013 (CV 2.5 %)"
QString formatNumber(double value, int decimals);              // "–" for NaN

}  // namespace stridemark::ui::exports
