#pragma once
// Linear summary statistics for durations and duty factors (n, mean, sample SD, CV).
#include <span>

#include "analysis/report.h"

namespace stridemark::analysis {

// Mean, sample SD (n - 1) and CV = SD / mean; fields stay NaN where undefined.
Stat describe(std::span<const double> values);

}  // namespace stridemark::analysis
