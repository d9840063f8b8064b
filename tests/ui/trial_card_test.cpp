// The Trial card dialog keeps the exam date the report names (issue 16 item 7) and refuses a
// date that is not a calendar date, saying how to write it.
#include <gtest/gtest.h>
#include <QLabel>
#include <QLineEdit>

#include "ui/widgets/trial_card_dialog.h"

namespace stridemark::ui {
namespace {

QLineEdit* examDateField(TrialCardDialog& dialog) {
  return dialog.findChild<QLineEdit*>(QStringLiteral("examDate"));
}

// Source: ISO 8601 calendar dates (YYYY-MM-DD).
TEST(TrialCard, ExamDateIsKeptAndAWrongOneIsRefusedWithHowToWriteIt) {
  model::Project project;
  project.annotation.captureRate = Rational{240, 1};
  project.trial.examDate = "2026-03-14";
  TrialCardDialog dialog(project, false);
  QLineEdit* date = examDateField(dialog);
  ASSERT_NE(date, nullptr);
  EXPECT_EQ(date->text(), QStringLiteral("2026-03-14"));
  EXPECT_EQ(dialog.trialCard().examDate, "2026-03-14");

  date->setText(QStringLiteral("31/04/2026"));
  dialog.accept();
  EXPECT_NE(dialog.result(), QDialog::Accepted);
  bool said = false;
  for (const QLabel* label : dialog.findChildren<QLabel*>())
    said = said || label->text().contains(QStringLiteral("YYYY-MM-DD"));
  EXPECT_TRUE(said) << "the dialog does not say how to write the date";

  date->setText(QStringLiteral(" 2026-04-30 "));
  dialog.accept();
  EXPECT_EQ(dialog.result(), QDialog::Accepted);
  EXPECT_EQ(dialog.trialCard().examDate, "2026-04-30");

  // Empty: not given.
  date->clear();
  EXPECT_TRUE(dialog.trialCard().examDate.empty());
}

}  // namespace
}  // namespace stridemark::ui
