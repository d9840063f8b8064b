// The Checks dock's one-step fix for one key press too many (issue 16 item 2), on a real
// document, the real analysis and the real list widget.
#include <gtest/gtest.h>
#include <QAction>
#include <QSignalSpy>

#include <algorithm>

#include "analysis/analyse.h"
#include "ui/document/project_document.h"
#include "ui/widgets/report_panels.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;

constexpr int LF = 0, LH = 2;

// A trot (DF 0.40, 1200-frame strides, LH reference) whose LF got one extra touchdown at 5100
// in its swing; from there its tags read the other way round, as a tag key makes them.
model::Project trotWithAStrayPress() {
  model::Project p;
  model::Annotation& a = p.annotation;
  a.captureRate = Rational{1200, 1};
  a.referenceLimb = LH;
  const double offset[] = {0.5, 1.0, 0.0, 0.5};
  for (int limb = 0; limb < 4; ++limb)
    for (int k = 0; k <= 10; ++k) {
      const auto td = 1000 + k * 1200 + static_cast<std::int64_t>(offset[limb] * 1200);
      a.events.push_back({td, limb, EventKind::touchdown});
      a.events.push_back({td + 480, limb, EventKind::liftoff});
    }
  for (Event& e : a.events)
    if (e.limb == LF && e.frame > 5100)
      e.kind = e.kind == EventKind::touchdown ? EventKind::liftoff : EventKind::touchdown;
  a.events.push_back({5100, LF, EventKind::touchdown});
  a.normalize();
  return p;
}

bool saysSwapped(const analysis::Report& r) {
  return std::any_of(r.problems.begin(), r.problems.end(), [](const analysis::Problem& p) {
    return p.message.find("look swapped") != std::string::npos;
  });
}

TEST(Checks, SwapThisLimbsTagsFromHereIsOneUndoableFix) {
  // Source: issue 16 item 2 (a one-step, undoable fix in the desk).
  ProjectDocument doc;
  doc.reset(trotWithAStrayPress(), {});
  ChecksList checks;
  QObject::connect(&checks, &ChecksList::swapRequested,
                   [&](int limb, qint64 frame) { doc.swapTagsFrom(limb, frame); });
  const auto before = std::make_shared<const analysis::Report>(analysis::analyse(doc.project()));
  ASSERT_TRUE(saysSwapped(*before));
  checks.setReport(before);
  EXPECT_FALSE(checks.swapAction()->isEnabled());
  for (int row = 0; row < checks.count(); ++row)
    if (checks.item(row)->text().contains(QStringLiteral("look swapped")))
      checks.setCurrentRow(row);
  ASSERT_TRUE(checks.swapAction()->isEnabled());
  QSignalSpy spy(&checks, &ChecksList::swapRequested);
  checks.swapAction()->trigger();
  ASSERT_EQ(spy.count(), 1);
  EXPECT_EQ(spy.at(0).at(0).toInt(), LF);
  EXPECT_EQ(spy.at(0).at(1).toLongLong(), 5100);
  // Swapped from the extra tag on: what is left is the extra tag itself, a pair problem there.
  const analysis::Report after = analysis::analyse(doc.project());
  EXPECT_FALSE(saysSwapped(after));
  ASSERT_FALSE(after.problems.empty());
  EXPECT_EQ(after.problems.front().frame, 5100);
  doc.undoStack()->undo();
  EXPECT_TRUE(saysSwapped(analysis::analyse(doc.project())));
}

TEST(Checks, NothingTaggedIsNotNoProblems) {
  // Issue 19 / our wording: with no tags the list must not claim the annotation is clean.
  ChecksList checks;
  checks.setReport(std::make_shared<const analysis::Report>(analysis::analyse(model::Project{})));
  ASSERT_EQ(checks.count(), 1);
  EXPECT_TRUE(checks.item(0)->text().startsWith(QStringLiteral("Nothing tagged yet")));
}

}  // namespace
}  // namespace stridemark::ui
