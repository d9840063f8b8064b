// One-to-one matching of proposals with exact event trains.
#include "vision/proposal_score.h"

#include <gtest/gtest.h>

namespace stridemark::vision {
namespace {

using model::EventKind;

model::Proposals offered(const std::vector<model::Event>& events) {
  model::Proposals p;
  for (const auto& e : events) p.events.push_back({e, 0.5});
  return p;
}

// Source: docs/methods.md §13 (one-to-one matching; hits within 0, 1, 2 frames; missed and
// spurious events); the counts below are worked by hand.
TEST(ProposalScore, CountsHitsMissesAndSpuriousEventsOneToOne) {
  const std::vector<model::Event> truth = {{10, 0, EventKind::touchdown},
                                           {40, 0, EventKind::liftoff},
                                           {70, 0, EventKind::touchdown},
                                           {100, 0, EventKind::liftoff},
                                           {12, 1, EventKind::touchdown}};
  const auto score = scoreProposals(truth,
                                    offered({{10, 0, EventKind::touchdown},
                                             {42, 0, EventKind::liftoff},
                                             {69, 0, EventKind::touchdown},
                                             {71, 0, EventKind::touchdown},     // second: spurious
                                             {12, 1, EventKind::liftoff},       // wrong kind
                                             {300, 0, EventKind::touchdown}}),  // far: spurious
                                    {0, 1000}, 5);
  EXPECT_EQ(score.truth, 5);
  EXPECT_EQ(score.proposed, 6);
  EXPECT_EQ(score.within0, 1);
  EXPECT_EQ(score.within1, 2);
  EXPECT_EQ(score.within2, 3);
  EXPECT_EQ(score.matched, 3);
  EXPECT_EQ(score.missed, 2);  // LF liftoff at 100 and the other limb's touchdown
  EXPECT_EQ(score.spurious, 3);
  EXPECT_DOUBLE_EQ(score.meanSignedError(EventKind::touchdown), -0.5);  // 0 and -1
  EXPECT_DOUBLE_EQ(score.meanSignedError(EventKind::liftoff), 2.0);
}

// Issue 18 item 1: an event inside a proposed hidden span is left to a person, not missed.
TEST(ProposalScore, EventsInsideProposedHiddenSpansAreDeferred) {
  model::Proposals p = offered({});
  p.hidden = {{0, 60, 75}};
  const auto score =
      scoreProposals({{70, 0, EventKind::touchdown}, {90, 0, EventKind::liftoff}}, p, {0, 200}, 3);
  EXPECT_EQ(score.deferred, 1);
  EXPECT_EQ(score.truth, 1);
  EXPECT_EQ(score.missed, 1);
}

}  // namespace
}  // namespace stridemark::vision
