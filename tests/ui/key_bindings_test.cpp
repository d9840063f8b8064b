// One action table behind the menus, Settings > Key bindings, the Tag keys dialog and the Help
// cheat sheet, checked on the real main window: every shortcut of every QAction is in the cheat
// sheet, every menu path the cheat sheet names exists, and the key fields leave Escape to the
// dialog. Common practice, no source.
#include <gtest/gtest.h>
#include <QAction>
#include <QApplication>
#include <QKeySequenceEdit>
#include <QMenu>
#include <QMenuBar>
#include <QRegularExpression>
#include <QSettings>
#include <QShortcut>
#include <QTest>
#include <QTextDocumentFragment>
#include <QTimer>
#include <set>

#include "tests/ui/test_support.h"
#include "ui/keys/action_table.h"
#include "ui/keys/key_bindings.h"
#include "ui/keys/key_bindings_dialog.h"
#include "ui/keys/shortcut_edit.h"
#include "ui/main_window.h"

namespace stridemark::ui {
namespace {

QString plain(const QString& html) {
  return QTextDocumentFragment::fromHtml(html).toPlainText();
}

// The texts the cheat sheet writes in <b> (keys) or <i> (menu paths).
std::set<QString> tagged(const QString& html, const QString& tag) {
  std::set<QString> found;
  const QRegularExpression re(QStringLiteral("<%1>(.*?)</%1>").arg(tag));
  for (auto it = re.globalMatch(html); it.hasNext();) found.insert(plain(it.next().captured(1)));
  return found;
}

// Every QAction the window holds or shows: its children and everything its menus reach.
QList<QAction*> allActions(const QMainWindow& w) {
  QList<QAction*> all = w.findChildren<QAction*>();
  QList<QMenu*> menus;
  for (auto* a : w.menuBar()->actions())
    if (a->menu()) menus << a->menu();
  while (!menus.isEmpty()) {
    for (auto* a : menus.takeFirst()->actions()) {
      if (!all.contains(a)) all << a;
      if (a->menu()) menus << a->menu();
    }
  }
  return all;
}

QAction* findMenuItem(const QMainWindow& w, const QString& path) {
  const auto parts = path.split(QStringLiteral(" %1 ").arg(QChar(kMenuArrow)));
  QList<QAction*> level = w.menuBar()->actions();
  QAction* found = nullptr;
  for (const auto& part : parts) {
    found = nullptr;
    for (auto* a : level)
      if (!a->isSeparator() && withoutMnemonic(a->text()) == part) found = a;
    if (!found) return nullptr;
    level = found->menu() ? found->menu()->actions() : QList<QAction*>{};
  }
  return found;
}

struct CleanBindings {
  CleanBindings() { QSettings().remove(QStringLiteral("keyBindings")); }
  ~CleanBindings() { QSettings().remove(QStringLiteral("keyBindings")); }
};

TEST(CheatSheet, ListsEveryShortcutOfEveryActionInTheWindow) {
  CleanBindings clean;
  MainWindow w;
  const QString html = w.cheatSheetHtml();
  const auto keys = tagged(html, QStringLiteral("b"));
  int shortcuts = 0;
  for (auto* a : allActions(w)) {
    for (const auto& seq : a->shortcuts()) {
      ++shortcuts;
      EXPECT_TRUE(keys.count(seq.toString(QKeySequence::NativeText)))
          << seq.toString().toStdString() << " of '" << a->text().toStdString()
          << "' is missing from the cheat sheet";
    }
  }
  EXPECT_GE(shortcuts, 30) << "the walk found the window's actions";
  for (auto* s : w.findChildren<QShortcut*>())
    EXPECT_TRUE(keys.count(s->key().toString(QKeySequence::NativeText))) << "a QShortcut";
  for (int limb = 0; limb < w.tagKeys().limbs().size(); ++limb)
    EXPECT_TRUE(keys.count(TagKeyMap::keyText(w.tagKeys().keyFor(limb)))) << "tag key " << limb;
  const QString text = plain(html);
  for (const auto& g : gestureTable()) {
    EXPECT_TRUE(text.contains(gestureText(g))) << gestureText(g).toStdString();
    EXPECT_TRUE(text.contains(gestureEffect(g))) << gestureEffect(g).toStdString();
  }
}

TEST(CheatSheet, NamesOnlyMenuItemsThatExist) {
  CleanBindings clean;
  MainWindow w;
  const QString html = w.cheatSheetHtml();
  const auto paths = tagged(html, QStringLiteral("i"));
  EXPECT_GE(paths.size(), 30u);
  for (const auto& path : paths)
    EXPECT_NE(findMenuItem(w, path), nullptr) << "no menu item " << path.toStdString();
  // No menu path outside the checked <i> ones.
  QString rest = html;
  rest.remove(QRegularExpression(QStringLiteral("<i>.*?</i>")));
  EXPECT_EQ(plain(rest).count(QChar(kMenuArrow)), 0) << plain(rest).toStdString();
  // The walk itself tells a missing item from a present one.
  EXPECT_NE(findMenuItem(w, menuPath(ActionId::setBigStep)), nullptr);
  EXPECT_EQ(findMenuItem(w, QStringLiteral("Transport %1 Big step").arg(QChar(kMenuArrow))),
            nullptr);
}

TEST(CheatSheet, OpensFromTheHelpMenu) {
  CleanBindings clean;
  MainWindow w;
  w.show();
  QString shown;
  QTimer::singleShot(0, [&] {
    if (auto* d = QApplication::activeModalWidget()) {
      shown = d->windowTitle();
      d->close();
    }
  });
  auto* item = findMenuItem(w, menuPath(ActionId::cheatSheet));
  ASSERT_NE(item, nullptr);
  item->trigger();
  EXPECT_EQ(shown, QStringLiteral("Keyboard cheat sheet"));
}

TEST(KeyBindings, RebindingReachesTheActionTheCheatSheetAndTheTagKeys) {
  CleanBindings clean;
  KeyBindings bindings = KeyBindings::load();
  const QKeySequence play(QStringLiteral("F5"));
  ASSERT_TRUE(bindings.problemWith(ActionId::playPause, play, TagKeyMap()).isEmpty());
  bindings.set(ActionId::playPause, {play});
  bindings.save();
  MainWindow w;
  EXPECT_EQ(w.action(ActionId::playPause)->shortcuts(), QList<QKeySequence>{play});
  const auto keys = tagged(w.cheatSheetHtml(), QStringLiteral("b"));
  EXPECT_TRUE(keys.count(QStringLiteral("F5")));
  EXPECT_FALSE(keys.count(QStringLiteral("Space"))) << "Space is no longer bound";
  TagKeyMap tags(model::LimbSet::quadruped());
  EXPECT_FALSE(tags.bind(0, Qt::Key_F5)) << "a command's key is no tag key";
  EXPECT_TRUE(tags.bind(0, Qt::Key_Space)) << "Space is free now";
  EXPECT_FALSE(tags.bind(1, Qt::Key_F1)) << "F1 opens the cheat sheet";
}

TEST(KeyBindings, ProblemsAreNamed) {
  CleanBindings clean;
  const KeyBindings bindings;
  const TagKeyMap tags(model::LimbSet::quadruped());
  const auto problem = [&](const char* key) {
    return bindings.problemWith(ActionId::playPause, QKeySequence(QString::fromLatin1(key)), tags);
  };
  EXPECT_TRUE(problem("P").contains(QStringLiteral("tag keys"))) << problem("P").toStdString();
  EXPECT_TRUE(problem("Esc").contains(QStringLiteral("dialogs")));
  EXPECT_TRUE(problem("Ctrl+S").contains(menuPath(ActionId::save)));
  EXPECT_TRUE(problem("Space").isEmpty()) << "its own key";
  EXPECT_TRUE(problem("Ctrl+P").isEmpty());
}

TEST(KeyBindings, DialogRefusesATagLikeKeyAndKeepsTheSecondKeyOfRedo) {
  CleanBindings clean;
  const KeyBindings before;
  KeyBindingsDialog dialog(before, TagKeyMap(model::LimbSet::quadruped()));
  dialog.show();
  dialog.editFor(ActionId::playPause)->setKeySequence(QKeySequence(QStringLiteral("P")));
  dialog.accept();
  EXPECT_TRUE(dialog.isVisible()) << "a plain letter belongs to tag keys";
  dialog.editFor(ActionId::playPause)->setKeySequence(QKeySequence(QStringLiteral("Ctrl+P")));
  dialog.accept();
  EXPECT_EQ(dialog.result(), QDialog::Accepted);
  EXPECT_EQ(dialog.bindings().shortcutsFor(ActionId::playPause),
            QList<QKeySequence>{QKeySequence(QStringLiteral("Ctrl+P"))});
  EXPECT_EQ(dialog.bindings().shortcutsFor(ActionId::redo), before.shortcutsFor(ActionId::redo));
}

// Escape in a key field cancels the dialog instead of becoming the key; Tab moves on.
void expectEscapeCancels(QDialog& dialog, QKeySequenceEdit* edit) {
  dialog.show();
  ASSERT_TRUE(QTest::qWaitForWindowExposed(&dialog));
  dialog.activateWindow();
  edit->setFocus();
  ASSERT_TRUE(test::waitUntil([&] { return edit->hasFocus(); }, 2000));
  const QKeySequence before = edit->keySequence();
  QTest::keyClick(edit, Qt::Key_Tab);
  EXPECT_FALSE(edit->hasFocus()) << "Tab moves the focus";
  EXPECT_EQ(edit->keySequence(), before);
  edit->setFocus();
  QTest::keyClick(edit, Qt::Key_Escape);
  EXPECT_EQ(edit->keySequence(), before) << "Escape was recorded as a key";
  EXPECT_EQ(dialog.result(), QDialog::Rejected);
  EXPECT_FALSE(dialog.isVisible()) << "Escape did not cancel the dialog";
}

TEST(TagKeysDialog, EscapeIsNotCapturedAsAKey) {
  TagKeyDialog dialog(TagKeyMap(model::LimbSet::quadruped()));
  const auto edits = dialog.findChildren<QKeySequenceEdit*>();
  ASSERT_EQ(edits.size(), 4);
  expectEscapeCancels(dialog, edits.front());
}

TEST(KeyBindings, DialogLeavesEscapeToTheDialog) {
  CleanBindings clean;
  KeyBindingsDialog dialog(KeyBindings(), TagKeyMap(model::LimbSet::quadruped()));
  expectEscapeCancels(dialog, dialog.editFor(ActionId::goTo));
}

TEST(ActionTable, EveryIdHasOneEntryAndAUniqueName) {
  std::set<ActionId> ids;
  std::set<std::string> names;
  for (const auto& spec : actionTable()) {
    EXPECT_TRUE(ids.insert(spec.id).second) << spec.name;
    EXPECT_TRUE(names.insert(spec.name).second) << spec.name;
  }
  EXPECT_EQ(ids.size(), static_cast<std::size_t>(ActionId::about) + 1);
}

}  // namespace
}  // namespace stridemark::ui
