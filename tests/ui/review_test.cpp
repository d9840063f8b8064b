// Foot seeds and proposals in the document (issue 18 item 3): every seed, stored run, accept,
// reject, nudge and accept-all is an undo step; proposals never reach analysis until accepted;
// the review order by frame and least confident first.
#include <gtest/gtest.h>
#include <QTemporaryDir>

#include "analysis/analyse.h"
#include "synth/synth.h"
#include "ui/document/project_document.h"
#include "ui/document/project_io.h"
#include "ui/session/proposal_review.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;
using model::FootSeed;
using model::ProposedEvent;

constexpr int LF = 0, RF = 1, LH = 2, RH = 3;
constexpr auto TD = EventKind::touchdown;
constexpr auto LO = EventKind::liftoff;

model::Project quadrupedProject() {
  model::Project p;
  p.annotation.clip = model::FrameRange{0, 599};
  return p;
}

model::Proposals someProposals() {
  model::Proposals p;
  p.events = {{{10, LF, TD}, 0.9}, {{40, LF, LO}, 0.4}, {{25, RF, TD}, 0.7}, {{55, RF, LO}, 0.2}};
  std::sort(p.events.begin(), p.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
  p.hidden = {{RF, 60, 64}};
  return p;
}

ProposedEvent proposalAt(const ProjectDocument& doc, const Event& e) {
  const auto* p = doc.findProposal(e);
  EXPECT_NE(p, nullptr) << "no proposal at frame " << e.frame;
  return p ? *p : ProposedEvent{};
}

TEST(Seeds, OneSeedPerLimbAndFrameReplacingIsUndoable) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  // Source: issue 18 item 3 (a seed per limb per frame, stored through an undo command).
  ASSERT_TRUE(doc.setSeed({LF, 12, 100.5, 80.25}));
  ASSERT_TRUE(doc.setSeed({RF, 12, 140, 82}));
  ASSERT_TRUE(doc.setSeed({LF, 12, 104, 79}));  // replaces LF's seed on frame 12
  EXPECT_FALSE(doc.setSeed({LF, 12, 104, 79})) << "an unchanged seed is no edit";
  EXPECT_FALSE(doc.setSeed({7, 12, 1, 1})) << "unknown limb";
  const std::vector<FootSeed> expected{{LF, 12, 104, 79}, {RF, 12, 140, 82}};
  EXPECT_EQ(doc.project().seeds, expected);
  EXPECT_EQ(doc.undoStack()->count(), 3);
  doc.undoStack()->undo();  // the replacement: LF is back where it was first clicked
  EXPECT_EQ(doc.project().seeds,
            (std::vector<FootSeed>{{LF, 12, 100.5, 80.25}, {RF, 12, 140, 82}}));
  doc.undoStack()->redo();
  EXPECT_EQ(doc.project().seeds, expected);
  ASSERT_TRUE(doc.removeSeed(RF, 12));
  EXPECT_EQ(doc.project().seeds, (std::vector<FootSeed>{{LF, 12, 104, 79}}));
  doc.undoStack()->undo();
  EXPECT_EQ(doc.project().seeds, expected);
  doc.undoStack()->setIndex(0);
  EXPECT_TRUE(doc.project().seeds.empty());
}

TEST(Seeds, KeepTheLimbSetFromChanging) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.setSeed({RH, 30, 10, 20});
  // Found while writing the desk's seeding: a biped has no limb 3, so RH's seed would have no
  // label to be saved under. The limb set stays while seeds or proposals exist, as for tags.
  EXPECT_FALSE(doc.setLimbSet(model::LimbSet::biped()));
  doc.undoStack()->undo();
  doc.storeProposals({{}, {{RH, 5, 9}}}, {RH}, {0, 599});
  EXPECT_FALSE(doc.setLimbSet(model::LimbSet::biped())) << "a proposed hidden span of RH";
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.setLimbSet(model::LimbSet::biped()));
}

TEST(Seeds, SavedAndLoadedWithTheProject) {
  QTemporaryDir dir;
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.setSeed({RH, 30, 10.5, 20.75});
  doc.setSeed({LF, 2, 300, 170});
  const QString path = dir.filePath(QStringLiteral("seeded.stridemark"));
  doc.saveAs(path);
  const model::Project back = loadProjectFile(path);
  // Source: issue 18 item 3 ("seeds are saved in the project"); order by limb, then frame.
  EXPECT_EQ(back.seeds, (std::vector<FootSeed>{{LF, 2, 300, 170}, {RH, 30, 10.5, 20.75}}));
}

TEST(Proposals, StoredRunReplacesEarlierProposalsOfItsLimbsInItsRangeOnly) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.addEvent({25, RF, TD});  // a person's tag: the same proposal is left out
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  EXPECT_EQ(doc.project().proposals.events.size(), 3u);
  EXPECT_EQ(doc.findProposal({25, RF, TD}), nullptr);
  // A second run on LF only, frames 0-20: LF's proposal at 10 goes, LF's at 40 and RF's stay.
  model::Proposals rerun;
  rerun.events = {{{12, LF, TD}, 0.95}};
  doc.storeProposals(rerun, {LF}, {0, 20});
  // Source: issue 18 item 3 ("replacing earlier proposals of those limbs in that range").
  EXPECT_EQ(doc.findProposal({10, LF, TD}), nullptr);
  EXPECT_NE(doc.findProposal({12, LF, TD}), nullptr);
  EXPECT_NE(doc.findProposal({40, LF, LO}), nullptr);
  EXPECT_NE(doc.findProposal({55, RF, LO}), nullptr);
  EXPECT_EQ(doc.project().proposals.hidden, (std::vector<model::HiddenSpan>{{RF, 60, 64}}));
  doc.undoStack()->undo();
  EXPECT_NE(doc.findProposal({10, LF, TD}), nullptr);
  EXPECT_EQ(doc.findProposal({12, LF, TD}), nullptr);
}

TEST(Proposals, AcceptMakesATagAndRejectDropsItBothUndoable) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  const int base = doc.undoStack()->count();
  // Source: issue 18 item 3 (accept turns a proposal into a tag; every accept and reject is an
  // undo command).
  ASSERT_EQ(doc.acceptProposal({10, LF, TD}), ProjectDocument::AcceptOutcome::accepted);
  EXPECT_TRUE(doc.contains({10, LF, TD}));
  EXPECT_EQ(doc.findProposal({10, LF, TD}), nullptr);
  ASSERT_TRUE(doc.rejectProposal({25, RF, TD}));
  EXPECT_EQ(doc.findProposal({25, RF, TD}), nullptr);
  EXPECT_FALSE(doc.contains({25, RF, TD}));
  EXPECT_EQ(doc.undoStack()->count(), base + 2);
  doc.undoStack()->undo();  // the reject
  EXPECT_NE(doc.findProposal({25, RF, TD}), nullptr);
  doc.undoStack()->undo();  // the accept: tag gone, proposal back with its confidence
  EXPECT_FALSE(doc.contains({10, LF, TD}));
  EXPECT_DOUBLE_EQ(proposalAt(doc, {10, LF, TD}).confidence, 0.9);
  doc.undoStack()->redo();
  EXPECT_TRUE(doc.contains({10, LF, TD}));
  EXPECT_EQ(doc.findProposal({10, LF, TD}), nullptr);
}

TEST(Proposals, AcceptNeverOverwritesAPersonsTagOnThatFrame) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  doc.addEvent({40, LF, TD});  // the person says touchdown where a lift-off is proposed
  // Source: issue 18 item 3 (proposals never overwrite a person's tags).
  EXPECT_EQ(doc.acceptProposal({40, LF, LO}), ProjectDocument::AcceptOutcome::tagOnFrame);
  EXPECT_TRUE(doc.contains({40, LF, TD}));
  EXPECT_FALSE(doc.contains({40, LF, LO}));
  EXPECT_NE(doc.findProposal({40, LF, LO}), nullptr);
}

TEST(Proposals, NudgesMoveOneFrameAndMergeIntoOneUndoStep) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  const int base = doc.undoStack()->count();
  // Source: issue 18 item 3 (nudge ±1 frame); common practice, no source: repeated nudges of
  // one item are one history entry, as for tags.
  auto at = doc.nudgeProposal({10, LF, TD}, 1);
  ASSERT_TRUE(at);
  at = doc.nudgeProposal(*at, 1);
  ASSERT_TRUE(at);
  EXPECT_EQ(*at, (Event{12, LF, TD}));
  EXPECT_DOUBLE_EQ(proposalAt(doc, {12, LF, TD}).confidence, 0.9);
  EXPECT_EQ(doc.undoStack()->count(), base + 1);
  doc.undoStack()->undo();
  EXPECT_NE(doc.findProposal({10, LF, TD}), nullptr);
  EXPECT_EQ(doc.findProposal({12, LF, TD}), nullptr);
  // Never before frame 0 or past the clip.
  doc.storeProposals({{{{0, LH, TD}, 0.5}, {{599, LH, LO}, 0.5}}, {}}, {LH}, {0, 599});
  EXPECT_FALSE(doc.nudgeProposal({0, LH, TD}, -1));
  EXPECT_FALSE(doc.nudgeProposal({599, LH, LO}, 1));
}

TEST(Proposals, AcceptAllAboveAConfidenceIsOneUndoStepAndSkipsTaggedFrames) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  doc.addEvent({10, LF, LO});  // a tag on LF's frame 10: that proposal cannot become a tag
  // Confidences 0.9 (LF 10, blocked), 0.7 (RF 25), 0.4, 0.2.
  EXPECT_EQ(doc.acceptableFrom(0.5).size(), 1u);
  EXPECT_EQ(doc.acceptableFrom(0.3).size(), 2u);
  const int base = doc.undoStack()->count();
  // Source: issue 18 item 3 (accept all above a confidence; every accept is an undo command).
  EXPECT_EQ(doc.acceptProposalsFrom(0.3), 2);
  EXPECT_EQ(doc.undoStack()->count(), base + 1);
  EXPECT_TRUE(doc.contains({25, RF, TD}));
  EXPECT_TRUE(doc.contains({40, LF, LO}));
  EXPECT_NE(doc.findProposal({10, LF, TD}), nullptr);
  EXPECT_NE(doc.findProposal({55, RF, LO}), nullptr);
  doc.undoStack()->undo();
  EXPECT_FALSE(doc.contains({25, RF, TD}));
  EXPECT_EQ(doc.project().proposals.events.size(), 4u);
}

TEST(Proposals, ProposedHiddenSpansAreAcceptedAsOneUndoStep) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.storeProposals(someProposals(), {LF, RF}, {0, 599});
  ASSERT_TRUE(doc.annotation().hidden.empty());
  // Source: issue 18 item 1 (a span where the foot could not be seen is "proposed as a hidden
  // span"); item 3 (every accept is an undo command).
  EXPECT_EQ(doc.acceptProposedHiddenSpans(), 1);
  EXPECT_EQ(doc.annotation().hidden, (std::vector<model::HiddenSpan>{{RF, 60, 64}}));
  EXPECT_TRUE(doc.project().proposals.hidden.empty());
  EXPECT_EQ(doc.project().proposals.events.size(), 4u) << "proposed events stay for review";
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.annotation().hidden.empty());
  EXPECT_EQ(doc.project().proposals.hidden.size(), 1u);
}

TEST(Proposals, NeverChangeAnalysisUntilAccepted) {
  synth::SynthOptions o;
  o.gaits = {"trot:3"};
  o.timeline.captureRate = Rational{120, 1};
  model::Annotation truth = synth::groundTruth(o);
  truth.normalize();
  // The person has tagged all but LF's last touchdown; the proposals hold it and two more.
  auto lfEvents = truth.eventsOf(LF);
  const Event held = lfEvents.back().kind == TD ? lfEvents.back() : lfEvents[lfEvents.size() - 2];
  model::Project project = quadrupedProject();
  project.annotation = truth;
  std::erase(project.annotation.events, held);
  ProjectDocument doc;
  doc.reset(project, {});
  const auto before = analysis::analyse(doc.annotation());
  model::Proposals proposals;
  proposals.events = {{held, 0.9}, {{held.frame + 3, RH, TD}, 0.3}, {{2, LH, LO}, 0.6}};
  std::sort(proposals.events.begin(), proposals.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
  proposals.hidden = {{LF, 100, 110}};
  doc.storeProposals(proposals, {LF, LH, RH}, {0, 599});
  ASSERT_EQ(doc.project().proposals.events.size(), 3u);
  const auto withProposals = analysis::analyse(doc.annotation());
  // Source: issue 18 item 3 (proposals never count in analysis).
  EXPECT_EQ(doc.annotation().events, project.annotation.events);
  EXPECT_EQ(doc.annotation().hidden, project.annotation.hidden);
  EXPECT_EQ(withProposals.cycles.size(), before.cycles.size());
  EXPECT_EQ(withProposals.strides.size(), before.strides.size());
  ASSERT_EQ(doc.acceptProposal(held), ProjectDocument::AcceptOutcome::accepted);
  const auto accepted = analysis::analyse(doc.annotation());
  EXPECT_GT(accepted.cycles.size(), before.cycles.size()) << "the accepted tag closes a cycle";
}

model::Proposals orderSample() {
  // Frames 30, 10, 20, 20 (two limbs on one frame), confidences chosen to differ from frame order.
  model::Proposals p;
  p.events = {{{30, LF, TD}, 0.2}, {{10, LF, LO}, 0.8}, {{20, RF, TD}, 0.5}, {{20, LF, TD}, 0.5}};
  return p;
}

TEST(ReviewOrder, ByFrameThenLimbAndFromThePlayhead) {
  const auto p = orderSample();
  const auto list = inReviewOrder(p, ReviewOrder::byFrame);
  // Common practice, no source: time order, ties by limb.
  ASSERT_EQ(list.size(), 4u);
  EXPECT_EQ(list[0].event, (Event{10, LF, LO}));
  EXPECT_EQ(list[1].event, (Event{20, LF, TD}));
  EXPECT_EQ(list[2].event, (Event{20, RF, TD}));
  EXPECT_EQ(list[3].event, (Event{30, LF, TD}));
  // Source: issue 18 item 3 (next / previous proposal). Without a current one, from the playhead.
  EXPECT_EQ(stepProposal(p, ReviewOrder::byFrame, std::nullopt, 15, 1)->event, (Event{20, LF, TD}));
  EXPECT_EQ(stepProposal(p, ReviewOrder::byFrame, std::nullopt, 15, -1)->event,
            (Event{10, LF, LO}));
  EXPECT_FALSE(stepProposal(p, ReviewOrder::byFrame, std::nullopt, 31, 1));
  const auto second = list[1];
  EXPECT_EQ(stepProposal(p, ReviewOrder::byFrame, second, 0, 1)->event, (Event{20, RF, TD}));
  EXPECT_EQ(stepProposal(p, ReviewOrder::byFrame, second, 0, -1)->event, (Event{10, LF, LO}));
  EXPECT_FALSE(stepProposal(p, ReviewOrder::byFrame, list[3], 0, 1));
  EXPECT_EQ(reviewPosition(p, ReviewOrder::byFrame, list[2]), 3);
}

TEST(ReviewOrder, LeastConfidentFirstAndOnFromAProposalThatIsGone) {
  auto p = orderSample();
  const auto list = inReviewOrder(p, ReviewOrder::leastConfidentFirst);
  // Source: issue 18 item 3 ("least confident first, as an option"); ties by frame, then limb.
  ASSERT_EQ(list.size(), 4u);
  EXPECT_EQ(list[0].event, (Event{30, LF, TD}));
  EXPECT_EQ(list[1].event, (Event{20, LF, TD}));
  EXPECT_EQ(list[2].event, (Event{20, RF, TD}));
  EXPECT_EQ(list[3].event, (Event{10, LF, LO}));
  EXPECT_EQ(stepProposal(p, ReviewOrder::leastConfidentFirst, std::nullopt, 25, 1)->event,
            list[0].event);
  // Common practice, no source: after an accept the current proposal is gone; the next one is
  // the one that followed it.
  const auto gone = list[1];
  std::erase(p.events, gone);
  EXPECT_EQ(stepProposal(p, ReviewOrder::leastConfidentFirst, gone, 0, 1)->event, list[2].event);
  EXPECT_EQ(stepProposal(p, ReviewOrder::leastConfidentFirst, gone, 0, -1)->event, list[0].event);
  EXPECT_EQ(reviewPosition(p, ReviewOrder::leastConfidentFirst, gone), 0);
}

}  // namespace
}  // namespace stridemark::ui
