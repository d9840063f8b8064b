#include "ui/session/report_scope.h"

#include <algorithm>

#include "analysis/bouts.h"
#include "analysis/summary.h"

namespace stridemark::ui {

namespace {

using analysis::Report;
using analysis::Summary;

// The scope's summary: the gait's (over all its bouts) or the bout's.
const Summary* summaryOf(const Report& report, const ReportScope& scope) {
  if (scope.kind == ReportScope::Kind::gait) {
    const auto it = report.byGait.find(scope.gait);
    return it == report.byGait.end() ? nullptr : &it->second;
  }
  const int bout = boutIndex(report, scope);
  return bout < 0 ? nullptr : &report.bouts[static_cast<std::size_t>(bout)].summary;
}

}  // namespace

std::vector<ReportScope> scopesOf(const Report& report) {
  std::vector<ReportScope> scopes{ReportScope{}};
  for (const auto& gait : analysis::gaitsInOrder(report.bouts))
    scopes.push_back({ReportScope::Kind::gait, gait, 0});
  for (const auto& bout : report.bouts)
    scopes.push_back({ReportScope::Kind::bout, bout.gait, bout.startFrame});
  return scopes;
}

int boutIndex(const Report& report, const ReportScope& scope) {
  if (scope.kind != ReportScope::Kind::bout) return -1;
  for (std::size_t i = 0; i < report.bouts.size(); ++i)
    if (report.bouts[i].gait == scope.gait && report.bouts[i].startFrame == scope.boutStart)
      return static_cast<int>(i);
  return -1;
}

ReportScope refit(const ReportScope& scope, const Report& report) {
  return summaryOf(report, scope) || scope.kind == ReportScope::Kind::all ? scope : ReportScope{};
}

std::vector<int> scopeStrides(const Report& report, const ReportScope& scope) {
  std::vector<int> rows;
  const int bout = boutIndex(report, scope);
  for (std::size_t i = 0; i < report.strides.size(); ++i) {
    const int b = report.strides[i].bout;
    const bool in = scope.kind == ReportScope::Kind::all ||
                    (scope.kind == ReportScope::Kind::bout && b == bout && b >= 0) ||
                    (scope.kind == ReportScope::Kind::gait && b >= 0 &&
                     report.bouts[static_cast<std::size_t>(b)].gait == scope.gait);
    if (in) rows.push_back(static_cast<int>(i));
  }
  return rows;
}

std::shared_ptr<const Report> scopedReport(const std::shared_ptr<const Report>& report,
                                           const ReportScope& scope) {
  if (!report || scope.kind == ReportScope::Kind::all) return report;
  const Summary* summary = summaryOf(*report, scope);
  if (!summary) return report;
  auto out = std::make_shared<Report>();
  out->limbs = report->limbs;
  out->fps = report->fps;
  out->referenceLimb = report->referenceLimb;
  out->bouts = report->bouts;  // strides keep their bout index
  for (const int i : scopeStrides(*report, scope))
    out->strides.push_back(report->strides[static_cast<std::size_t>(i)]);
  analysis::setTrialMembers(*out, *summary);
  out->byGait[scope.gait] = *summary;
  out->mixedGaits = false;
  return out;
}

}  // namespace stridemark::ui
