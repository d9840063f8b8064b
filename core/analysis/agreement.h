#pragma once
// Observer agreement (docs/methods.md §9): intraclass correlations of an n targets x k raters table
// (Shrout & Fleiss 1979 forms) and Bland-Altman limits of agreement.
#include <span>
#include <vector>

namespace stridemark::analysis {

struct IccResult {
  double icc11 = 0, icc21 = 0, icc31 = 0;  // single rater: one-way, two-way random, mixed
  double icc1k = 0, icc2k = 0, icc3k = 0;  // mean of k raters
  double msr = 0, msc = 0, mse = 0, msw = 0;
};

// `table[i][j]` = rater j's value for target i. Needs >= 2 targets, >= 2 raters, equal row
// lengths, finite values; throws stridemark::Error(analysis) otherwise.
IccResult intraclassCorrelation(const std::vector<std::vector<double>>& table);

struct BlandAltman {
  int n = 0;
  double bias = 0;              // mean of (second - first)
  double sd = 0;                // sample SD of the differences
  double lower = 0, upper = 0;  // bias -/+ z SD
};

// Differences second - first; needs >= 2 pairs of equal-length inputs.
BlandAltman blandAltman(std::span<const double> first, std::span<const double> second,
                        double z = 1.96);

}  // namespace stridemark::analysis
