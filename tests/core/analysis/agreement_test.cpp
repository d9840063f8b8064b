#include "analysis/agreement.h"

#include <gtest/gtest.h>

#include "common/error.h"

namespace stridemark::analysis {
namespace {

TEST(Agreement, ShroutFleissTable) {
  // Source: Shrout & Fleiss 1979 data via psych package test file [src]; docs/methods.md check 26:
  // ICC(1,1) .166, (2,1) .290, (3,1) .715, (1,4) .443, (2,4) .620, (3,4) .909 (1e-3).
  const std::vector<std::vector<double>> table = {{9, 2, 5, 8}, {6, 1, 3, 2},  {8, 4, 6, 8},
                                                  {7, 1, 2, 6}, {10, 5, 6, 9}, {6, 2, 4, 7}};
  const IccResult r = intraclassCorrelation(table);
  EXPECT_NEAR(r.icc11, 0.16574, 1e-3);
  EXPECT_NEAR(r.icc21, 0.28976, 1e-3);
  EXPECT_NEAR(r.icc31, 0.71484, 1e-3);
  EXPECT_NEAR(r.icc1k, 0.44280, 1e-3);
  EXPECT_NEAR(r.icc2k, 0.62005, 1e-3);
  EXPECT_NEAR(r.icc3k, 0.90932, 1e-3);
  // [calc] mean squares, docs/methods.md §9.2.
  EXPECT_NEAR(r.msr, 11.2417, 1e-4);
  EXPECT_NEAR(r.msc, 32.4861, 1e-4);
  EXPECT_NEAR(r.mse, 1.0194, 1e-4);
  EXPECT_NEAR(r.msw, 6.2639, 1e-4);
}

TEST(Agreement, ConsistencyVersusAbsoluteAgreement) {
  // Source: McGraw & Wong via R rel docs [src]; docs/methods.md check 27: (2,4), (4,6), (6,8) ->
  // consistency 1.000, absolute agreement 0.667.
  const IccResult r = intraclassCorrelation({{2, 4}, {4, 6}, {6, 8}});
  EXPECT_NEAR(r.icc31, 1.0, 1e-9);
  EXPECT_NEAR(r.icc21, 0.667, 1e-3);
}

TEST(Agreement, BlandAltmanFormula) {
  // Common practice, no source: bias and 1.96 SD limits on a small hand-checked set
  // (differences 1, 2, 3: bias 2, SD 1).
  const std::vector<double> a{10, 20, 30}, b{11, 22, 33};
  const BlandAltman ba = blandAltman(a, b);
  EXPECT_DOUBLE_EQ(ba.bias, 2.0);
  EXPECT_DOUBLE_EQ(ba.sd, 1.0);
  EXPECT_DOUBLE_EQ(ba.lower, 2.0 - 1.96);
  EXPECT_DOUBLE_EQ(ba.upper, 2.0 + 1.96);
}

TEST(Agreement, BadInputIsAClearError) {
  EXPECT_THROW(intraclassCorrelation({{1, 2}}), Error);
  EXPECT_THROW(intraclassCorrelation({{1, 2}, {3}}), Error);
  const std::vector<double> a{1, 2}, b{1};
  EXPECT_THROW(blandAltman(a, b), Error);
}

}  // namespace
}  // namespace stridemark::analysis
