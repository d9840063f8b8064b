// Undo/redo of every document command, nudge merging, and the autosave journal round trip.
#include <gtest/gtest.h>
#include <QFile>
#include <QTemporaryDir>

#include "common/error.h"
#include "formats/project_file.h"
#include "tests/ui/test_support.h"
#include "ui/document/commands.h"
#include "ui/document/journal.h"
#include "ui/document/project_document.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;

constexpr int LF = 0, RF = 1, LH = 2;

model::Project quadrupedProject() {
  model::Project p;
  p.annotation.clip = model::FrameRange{0, 999};
  return p;
}

std::vector<Event> events(const ProjectDocument& doc) {
  return doc.annotation().events;
}

TEST(Document, TagChoosesTouchdownInSwingAndLiftoffInStance) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  // Common practice, no source: a limb with no tag yet is in swing, so the first press is a
  // touchdown; the next press (limb now in stance) is a lift-off.
  ASSERT_EQ(doc.tag(LF, 10)->kind, EventKind::touchdown);
  ASSERT_EQ(doc.tag(LF, 40)->kind, EventKind::liftoff);
  ASSERT_EQ(doc.tag(LF, 70)->kind, EventKind::touchdown);
  EXPECT_FALSE(doc.tag(LF, 70).has_value()) << "same event twice is refused";
  EXPECT_EQ(doc.undoStack()->count(), 3);
}

TEST(Document, UndoRedoAddRemoveMove) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.addEvent({10, LF, EventKind::touchdown});
  doc.addEvent({50, LF, EventKind::liftoff});
  const auto afterAdds = events(doc);
  doc.removeEvents({{10, LF, EventKind::touchdown}});
  EXPECT_EQ(events(doc).size(), 1u);
  doc.undoStack()->undo();
  EXPECT_EQ(events(doc), afterAdds);
  doc.undoStack()->redo();
  EXPECT_EQ(events(doc).size(), 1u);
  doc.undoStack()->undo();

  ASSERT_TRUE(doc.moveEvents({{50, LF, EventKind::liftoff}}, 7, false));
  EXPECT_TRUE(doc.contains({57, LF, EventKind::liftoff}));
  doc.undoStack()->undo();
  EXPECT_EQ(events(doc), afterAdds);
  doc.undoStack()->redo();
  EXPECT_TRUE(doc.contains({57, LF, EventKind::liftoff}));
  // Undo everything back to the empty project.
  while (doc.undoStack()->canUndo()) doc.undoStack()->undo();
  EXPECT_TRUE(events(doc).empty());
  EXPECT_FALSE(doc.isModified());
}

TEST(Document, MoveRefusesCollisionsAndLeavingTheClip) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.addEvent({10, LF, EventKind::touchdown});
  doc.addEvent({12, LF, EventKind::touchdown});
  EXPECT_FALSE(doc.moveEvents({{10, LF, EventKind::touchdown}}, 2, false));
  EXPECT_FALSE(doc.moveEvents({{10, LF, EventKind::touchdown}}, -11, false));
  EXPECT_FALSE(doc.moveEvents({{12, LF, EventKind::touchdown}}, 988, false));
  // Moving both together past each other's old places is fine.
  EXPECT_TRUE(
      doc.moveEvents({{10, LF, EventKind::touchdown}, {12, LF, EventKind::touchdown}}, 2, false));
  EXPECT_TRUE(doc.contains({14, LF, EventKind::touchdown}));
}

TEST(Document, ConsecutiveNudgesMergeIntoOneUndoEntry) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.addEvent({100, LH, EventKind::touchdown});
  doc.addEvent({100, RF, EventKind::touchdown});
  const int before = doc.undoStack()->count();
  std::vector<Event> sel{{100, LH, EventKind::touchdown}, {100, RF, EventKind::touchdown}};
  for (int i = 0; i < 5; ++i) {
    ASSERT_TRUE(doc.moveEvents(sel, 1, true));
    for (auto& e : sel) ++e.frame;
  }
  ASSERT_TRUE(doc.moveEvents(sel, -1, true));
  EXPECT_EQ(doc.undoStack()->count(), before + 1) << "six nudges are one history entry";
  EXPECT_TRUE(doc.contains({104, LH, EventKind::touchdown}));
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.contains({100, LH, EventKind::touchdown}));
  EXPECT_TRUE(doc.contains({100, RF, EventKind::touchdown}));
  doc.undoStack()->redo();
  EXPECT_TRUE(doc.contains({104, RF, EventKind::touchdown}));
  // A drag (not a nudge) after nudges is its own entry; a nudge of other events too.
  const int count = doc.undoStack()->count();
  ASSERT_TRUE(doc.moveEvents({{104, LH, EventKind::touchdown}}, 3, false));
  ASSERT_TRUE(doc.moveEvents({{107, LH, EventKind::touchdown}}, 1, true));
  ASSERT_TRUE(doc.moveEvents({{104, RF, EventKind::touchdown}}, 1, true));
  EXPECT_EQ(doc.undoStack()->count(), count + 3);
}

TEST(Document, NudgesThatCancelOutLeaveNoEntry) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.addEvent({100, LH, EventKind::touchdown});
  const int before = doc.undoStack()->count();
  ASSERT_TRUE(doc.moveEvents({{100, LH, EventKind::touchdown}}, 1, true));
  ASSERT_TRUE(doc.moveEvents({{101, LH, EventKind::touchdown}}, -1, true));
  EXPECT_EQ(doc.undoStack()->count(), before);
}

TEST(Document, UndoRedoTrialCardHiddenSpanAndSettings) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  model::TrialCard card;
  card.subject = "Invented pony";
  card.speedMs = 2.5;
  card.legLengthM = 0.9;
  doc.setTrialCard(card);
  EXPECT_EQ(doc.project().trial, card);
  doc.undoStack()->undo();
  EXPECT_EQ(doc.project().trial, model::TrialCard{});
  doc.undoStack()->redo();
  EXPECT_EQ(doc.project().trial, card);

  doc.addHiddenSpan({RF, 90, 80});  // reversed ends are put in order
  ASSERT_EQ(doc.annotation().hidden.size(), 1u);
  EXPECT_EQ(doc.annotation().hidden[0], (model::HiddenSpan{RF, 80, 90}));
  doc.removeHiddenSpan({RF, 80, 90});
  EXPECT_TRUE(doc.annotation().hidden.empty());
  doc.undoStack()->undo();
  EXPECT_EQ(doc.annotation().hidden.size(), 1u);
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.annotation().hidden.empty());

  doc.setCaptureRate({30000, 1001});
  doc.setReferenceLimb(LF);
  EXPECT_EQ(doc.annotation().captureRate, (Rational{30000, 1001}));
  EXPECT_EQ(doc.annotation().referenceLimb, LF);
  doc.undoStack()->undo();
  doc.undoStack()->undo();
  EXPECT_EQ(doc.annotation().captureRate, (Rational{240, 1}));
  EXPECT_EQ(doc.annotation().referenceLimb, LH);
}

TEST(Document, SwapTagsFromAFrameIsOneUndoStep) {
  // Issue 16 item 2: the fix for one key press too many swaps a limb's tags from a frame on.
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  for (const Event& e : {Event{10, LF, EventKind::touchdown}, Event{40, LF, EventKind::liftoff},
                         Event{70, LF, EventKind::touchdown}, Event{100, LF, EventKind::liftoff},
                         Event{50, RF, EventKind::touchdown}})
    doc.addEvent(e);
  const std::vector<Event> before = events(doc);
  doc.swapTagsFrom(LF, 70);
  EXPECT_TRUE(doc.contains({70, LF, EventKind::liftoff}));
  EXPECT_TRUE(doc.contains({100, LF, EventKind::touchdown}));
  EXPECT_TRUE(doc.contains({40, LF, EventKind::liftoff}));    // before the frame: as it was
  EXPECT_TRUE(doc.contains({50, RF, EventKind::touchdown}));  // other limbs: as they were
  doc.undoStack()->undo();
  EXPECT_EQ(events(doc), before);
}

TEST(Document, ExcludeAndIncludeAStrideAreUndoSteps) {
  // Issue 16 item 6: an exclusion carries its reason and is undone like any edit.
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  EXPECT_TRUE(doc.excludeStride(120, "looked at the handler"));
  EXPECT_FALSE(doc.excludeStride(120, "again"));
  ASSERT_EQ(doc.annotation().excluded.size(), 1u);
  EXPECT_EQ(doc.annotation().excluded[0].reason, "looked at the handler");
  EXPECT_TRUE(doc.includeStride(120));
  EXPECT_TRUE(doc.annotation().excluded.empty());
  doc.undoStack()->undo();  // include undone: excluded again, with its reason
  ASSERT_EQ(doc.annotation().excluded.size(), 1u);
  EXPECT_EQ(doc.annotation().excluded[0].reason, "looked at the handler");
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.annotation().excluded.empty());
}

TEST(Document, LimbSetChangesOnlyWhileUntagged) {
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  EXPECT_TRUE(doc.setLimbSet(model::LimbSet::hexapod()));
  EXPECT_EQ(doc.annotation().limbs.size(), 6);
  doc.undoStack()->undo();
  EXPECT_EQ(doc.annotation().limbs.size(), 4);
  doc.addEvent({1, LF, EventKind::touchdown});
  EXPECT_FALSE(doc.setLimbSet(model::LimbSet::biped()));
  EXPECT_EQ(doc.annotation().limbs.size(), 4);
}

TEST(Document, JournalFollowsEveryEditAndGoesAwayOnSave) {
  QTemporaryDir dir;
  const QString project = dir.filePath(QStringLiteral("trial.stridemark"));
  ProjectDocument doc;
  doc.reset(quadrupedProject(), {});
  doc.saveAs(project);
  const QString journalFile = doc.journalPath();
  EXPECT_TRUE(journalFile.endsWith(QStringLiteral(".stridemark.smjournal")));
  EXPECT_FALSE(QFile::exists(journalFile));
  doc.addEvent({5, LF, EventKind::touchdown});
  ASSERT_TRUE(QFile::exists(journalFile));
  auto journalled = ProjectDocument::readJournal(journalFile);
  ASSERT_TRUE(journalled);
  EXPECT_EQ(journalled->annotation.events, doc.annotation().events);
  doc.addEvent({25, LF, EventKind::liftoff});
  EXPECT_EQ(ProjectDocument::readJournal(journalFile)->annotation.events.size(), 2u);
  // Undo back to the saved state: nothing unsaved, no journal.
  doc.undoStack()->undo();
  doc.undoStack()->undo();
  EXPECT_FALSE(QFile::exists(journalFile));
  doc.undoStack()->redo();
  EXPECT_TRUE(QFile::exists(journalFile));
  doc.save();
  EXPECT_FALSE(QFile::exists(journalFile));
  // The saved file is read back by core/formats with the same events.
  const auto saved = formats::readProjectFile(project.toStdString());
  EXPECT_EQ(saved.annotation.events, doc.annotation().events);
}

// A document destroyed with unsaved edits (the desk quitting without its close dialog) leaves
// the journal for recovery; its undo stack clearing itself must not reach the journal code
// after the document's path is gone. Common practice, no source.
TEST(Document, DestroyedWithUnsavedEditsKeepsTheJournal) {
  QTemporaryDir dir;
  QString journalFile;
  {
    ProjectDocument doc;
    doc.reset(quadrupedProject(), dir.filePath(QStringLiteral("trial.stridemark")));
    doc.addEvent({5, LF, EventKind::touchdown});
    journalFile = doc.journalPath();
    ASSERT_TRUE(QFile::exists(journalFile));
  }
  EXPECT_TRUE(QFile::exists(journalFile));
}

TEST(Document, JournalRoundTripKeepsEverything) {
  model::Project p = quadrupedProject();
  p.annotation.limbs = model::LimbSet::hexapod();
  p.annotation.referenceLimb = 3;
  p.annotation.captureRate = {30000, 1001};
  p.annotation.events = {
      {3, 0, EventKind::touchdown}, {9, 0, EventKind::liftoff}, {4, 5, EventKind::liftoff}};
  p.annotation.hidden = {{2, 10, 20}};
  p.annotation.normalize();
  p.trial.subject = "Beetle (invented)";
  p.trial.notes = "line one\nline \"two\"";
  p.trial.speedMs = 0.05;
  p.trial.speedChanges = {{300, 0.08}};
  p.annotation.excluded = {{40, "stumbled on the belt edge"}};
  p.video = model::VideoLink{"clips/a.mp4", "123-00ab-00cd", 500, {30, 1}};
  const auto back = journal::decode(journal::encode(p, QStringLiteral("/x/y.stridemark")), "j");
  EXPECT_EQ(back.annotation.events, p.annotation.events);
  EXPECT_EQ(back.annotation.hidden, p.annotation.hidden);
  EXPECT_EQ(back.annotation.captureRate, p.annotation.captureRate);
  EXPECT_EQ(back.annotation.referenceLimb, 3);
  EXPECT_EQ(back.annotation.limbs, p.annotation.limbs);
  EXPECT_EQ(back.annotation.clip, p.annotation.clip);
  EXPECT_EQ(back.annotation.excluded, p.annotation.excluded);
  EXPECT_EQ(back.trial, p.trial);
  EXPECT_EQ(back.video, p.video);
}

TEST(Document, JournalHiddenSpanOfAnUnknownLimbIsAClearError) {
  // Found by tests/fuzz (fuzz_journal): a hidden span of limb 5 in a quadruped journal reached
  // the project writer's label lookup (std::out_of_range, a crash) instead of being refused.
  const QByteArray bytes = "{\"schema\":\"stridemark.journal.v1\",\"limb_set\":\"quadruped\","
                           "\"capture_rate\":\"120\",\"reference_limb\":2,"
                           "\"hidden\":[[5,0,4]]}";
  try {
    journal::decode(bytes, "odd.smjournal");
    FAIL() << "a hidden span of an unknown limb was accepted";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("bad hidden span entry"), std::string::npos) << e.what();
  }
}

TEST(Document, CorruptJournalIsAClearError) {
  try {
    journal::decode("{\"schema\": \"stridemark.journal.v1\", \"limb_set\": 5", "broken.smjournal");
    FAIL() << "expected an error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("broken.smjournal"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace stridemark::ui
