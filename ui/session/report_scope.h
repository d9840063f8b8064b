#pragma once
// What the Summary dock, Gait map, Phase dial and Stride sheet show: every stride (All), the
// strides of one gait's bouts, or one bout (docs/methods.md §11). A scope is kept across
// re-scores while the trial still has it (the same gait; a bout of the same gait starting on
// the same frame), else it falls back to All.
#include <cstdint>
#include <memory>
#include <string>
#include <vector>

#include "analysis/report.h"

namespace stridemark::ui {

struct ReportScope {
  enum class Kind { all, gait, bout };
  Kind kind = Kind::all;
  std::string gait;            // gait and bout scopes
  std::int64_t boutStart = 0;  // bout scope: the bout's start frame (its identity)
  friend bool operator==(const ReportScope&, const ReportScope&) = default;
};

// All, then each gait, then each bout, in that order.
std::vector<ReportScope> scopesOf(const analysis::Report& report);

// `scope` when `report` still has it, else All.
ReportScope refit(const ReportScope& scope, const analysis::Report& report);

// Index into report.bouts of a bout scope; -1 when the report has no such bout.
int boutIndex(const analysis::Report& report, const ReportScope& scope);

// Indices into report.strides of the scope's strides: every stride (All), the strides of the
// gait's bouts, or the bout's. Excluded and unsteady strides of a bout are in it.
std::vector<int> scopeStrides(const analysis::Report& report, const ReportScope& scope);

// The report as the scope's panels read it: for All the report itself; else a report whose
// strides are the scope's, whose trial-level members are the scope's summary and whose
// `byGait` holds that one summary. Cycles and problems stay with the whole trial (the Checks
// dock and the lanes read the whole report).
std::shared_ptr<const analysis::Report> scopedReport(
    const std::shared_ptr<const analysis::Report>& report, const ReportScope& scope);

}  // namespace stridemark::ui
