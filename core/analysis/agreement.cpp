#include "analysis/agreement.h"

#include <cmath>
#include <string>

#include "common/error.h"

namespace stridemark::analysis {
namespace {

void checkTable(const std::vector<std::vector<double>>& table) {
  const auto fail = [](const std::string& m) { throw Error(ErrorCategory::analysis, m); };
  if (table.size() < 2)
    fail("agreement needs at least 2 targets (rows), got " + std::to_string(table.size()));
  const std::size_t k = table.front().size();
  if (k < 2) fail("agreement needs at least 2 raters (columns), got " + std::to_string(k));
  for (std::size_t i = 0; i < table.size(); ++i) {
    if (table[i].size() != k)
      fail("row " + std::to_string(i + 1) + " has " + std::to_string(table[i].size()) +
           " values but row 1 has " + std::to_string(k) + "; every target needs every rater");
    for (double v : table[i])
      if (!std::isfinite(v)) fail("row " + std::to_string(i + 1) + " holds a non-finite value");
  }
}

}  // namespace

IccResult intraclassCorrelation(const std::vector<std::vector<double>>& table) {
  checkTable(table);
  const std::size_t n = table.size();
  const std::size_t k = table.front().size();
  const double nd = static_cast<double>(n);
  const double kd = static_cast<double>(k);
  double grand = 0;
  std::vector<double> rowMean(n, 0.0), colMean(k, 0.0);
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = 0; j < k; ++j) {
      rowMean[i] += table[i][j] / kd;
      colMean[j] += table[i][j] / nd;
      grand += table[i][j] / (nd * kd);
    }
  }
  double ssr = 0, ssc = 0, sst = 0;
  for (double m : rowMean) ssr += kd * (m - grand) * (m - grand);
  for (double m : colMean) ssc += nd * (m - grand) * (m - grand);
  for (const auto& row : table)
    for (double v : row) sst += (v - grand) * (v - grand);
  IccResult r;
  r.msr = ssr / (nd - 1);
  r.msc = ssc / (kd - 1);
  r.mse = (sst - ssr - ssc) / ((nd - 1) * (kd - 1));
  r.msw = (sst - ssr) / (nd * (kd - 1));
  r.icc11 = (r.msr - r.msw) / (r.msr + (kd - 1) * r.msw);
  r.icc21 = (r.msr - r.mse) / (r.msr + (kd - 1) * r.mse + kd * (r.msc - r.mse) / nd);
  r.icc31 = (r.msr - r.mse) / (r.msr + (kd - 1) * r.mse);
  r.icc1k = (r.msr - r.msw) / r.msr;
  r.icc2k = (r.msr - r.mse) / (r.msr + (r.msc - r.mse) / nd);
  r.icc3k = (r.msr - r.mse) / r.msr;
  return r;
}

BlandAltman blandAltman(std::span<const double> first, std::span<const double> second, double z) {
  if (first.size() != second.size())
    throw Error(ErrorCategory::analysis,
                "Bland-Altman needs paired values: " + std::to_string(first.size()) + " vs " +
                    std::to_string(second.size()));
  if (first.size() < 2) throw Error(ErrorCategory::analysis, "Bland-Altman needs at least 2 pairs");
  BlandAltman out;
  out.n = static_cast<int>(first.size());
  for (std::size_t i = 0; i < first.size(); ++i) out.bias += second[i] - first[i];
  out.bias /= out.n;
  double squares = 0;
  for (std::size_t i = 0; i < first.size(); ++i) {
    const double d = second[i] - first[i] - out.bias;
    squares += d * d;
  }
  out.sd = std::sqrt(squares / (out.n - 1));
  out.lower = out.bias - z * out.sd;
  out.upper = out.bias + z * out.sd;
  return out;
}

}  // namespace stridemark::analysis
