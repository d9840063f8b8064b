// Menus, the toolbar and every command, made from the action table (ui/keys/action_table.cpp):
// this file only says what each command does in this window.
#include <QAction>
#include <QCoreApplication>
#include <QDockWidget>
#include <QFileInfo>
#include <QMenu>
#include <QMenuBar>
#include <QSettings>
#include <QStatusBar>
#include <QToolBar>

#include "ui/keys/cheat_sheet.h"
#include "ui/main_window.h"
#include "ui/session/video_source.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/help_dialogs.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

namespace {
constexpr int kMaxRecent = 8;
}  // namespace

void MainWindow::buildActions() {
  bindings_ = KeyBindings::load();
  std::map<Menu, QMenu*> menus;
  for (const Menu menu : kMenus) menus[menu] = menuBar()->addMenu(menuTitle(menu));
  auto* bar = addToolBar(tr("Transport"));
  bar->setObjectName(QStringLiteral("transportBar"));
  for (const auto& spec : actionTable()) {
    QMenu* menu = menus.at(spec.menu);
    if (spec.traits & kSeparatorBefore) menu->addSeparator();
    QAction* a = makeAction(spec);
    menu->addAction(a);
    if (spec.traits & kOnToolbar) bar->addAction(a);
    actions_[spec.id] = a;
  }
  // Open recent sits under Open.
  recentMenu_ = new QMenu(tr("Open &recent"), menus.at(Menu::file));
  menus.at(Menu::file)->insertMenu(action(ActionId::save), recentMenu_);
  rebuildRecentMenu();
  viewMenu_ = menus.at(Menu::view);
  buildReviewBar();
  insertViewToggles();
  connectToggles();
}

QAction* MainWindow::makeAction(const ActionSpec& spec) {
  QAction* a = nullptr;
  if (spec.id == ActionId::undo) {
    a = doc_.undoStack()->createUndoAction(this, actionText(spec));
  } else if (spec.id == ActionId::redo) {
    a = doc_.undoStack()->createRedoAction(this, actionText(spec));
  } else {
    a = new QAction(actionText(spec), this);
    if (auto slot = handlerFor(spec.id))
      connect(a, &QAction::triggered, this, [slot = std::move(slot)] { slot(); });
  }
  a->setShortcuts(bindings_.shortcutsFor(spec.id));
  a->setShortcutContext(Qt::WindowShortcut);
  a->setCheckable(spec.traits & kCheckable);
  if (spec.tip) a->setToolTip(QCoreApplication::translate("Actions", spec.tip));
  return a;
}

std::function<void()> MainWindow::handlerFor(ActionId id) {
  switch (id) {
    case ActionId::open:
      return [this] { openDialog(); };
    case ActionId::save:
      return [this] { save(); };
    case ActionId::saveAs:
      return [this] { saveAsDialog(); };
    case ActionId::exportProject:
      return [this] { openExport(); };
    case ActionId::exportFigures:
      return [this] { exportFigures(); };
    case ActionId::quit:
      return [this] { close(); };
    case ActionId::nudgeEarlier:
      return [this] { lanes_->nudgeSelection(-1); };
    case ActionId::nudgeLater:
      return [this] { lanes_->nudgeSelection(1); };
    case ActionId::deleteSelection:
      return [this] { lanes_->deleteSelection(); };
    case ActionId::toggleHiddenSpan:
      return [this] { toggleHiddenSpan(); };
    case ActionId::markHiddenSpans:
      return [this] { hiddenSpanDialog(); };
    case ActionId::trialCard:
      return [this] { editTrialCard(); };
    case ActionId::firstFrame:
      return [this] { seek(0); };
    case ActionId::backBigStep:
      return [this] { stepBy(-bigStep_); };
    case ActionId::stepBack:
      return [this] { stepBy(-1); };
    case ActionId::playBackwards:
      return [this] { togglePlayback(-1); };
    case ActionId::playPause:
      return [this] { togglePlayback(1); };
    case ActionId::stepForward:
      return [this] { stepBy(1); };
    case ActionId::forwardBigStep:
      return [this] { stepBy(bigStep_); };
    case ActionId::lastFrame:
      return [this] { seek(frameCount() - 1); };
    case ActionId::slower:
      return [this] { changeSpeed(-1); };
    case ActionId::faster:
      return [this] { changeSpeed(1); };
    case ActionId::previousEvent:
      return [this] { jumpToEvent(-1); };
    case ActionId::nextEvent:
      return [this] { jumpToEvent(1); };
    case ActionId::goTo:
      return [this] { goToDialog(); };
    case ActionId::setBigStep:
      return [this] { bigStepDialog(); };
    case ActionId::proposeEvents:
      return [this] { proposeDialog(); };
    case ActionId::cancelProposing:
      return [this] { cancelProposing(); };
    case ActionId::previousProposal:
      return [this] { stepProposal(-1); };
    case ActionId::nextProposal:
      return [this] { stepProposal(1); };
    case ActionId::acceptProposal:
      return [this] { acceptCurrentProposal(); };
    case ActionId::rejectProposal:
      return [this] { rejectCurrentProposal(); };
    case ActionId::nudgeProposalEarlier:
      return [this] { nudgeCurrentProposal(-1); };
    case ActionId::nudgeProposalLater:
      return [this] { nudgeCurrentProposal(1); };
    case ActionId::acceptProposalsAbove:
      return [this] { acceptAboveDialog(); };
    case ActionId::acceptProposedHidden:
      return [this] {
        const int n = doc_.acceptProposedHiddenSpans();
        statusBar()->showMessage(tr("%1 proposed hidden spans are hidden spans now.").arg(n), 8000);
      };
    case ActionId::zoomLanesIn:
      return [this] { lanes_->setVisibleSpan(lanes_->visibleSpan() * 4 / 5); };
    case ActionId::zoomLanesOut:
      return [this] { lanes_->setVisibleSpan(lanes_->visibleSpan() * 5 / 4); };
    case ActionId::fitVideo:
      return [this] { viewer_->resetView(); };
    case ActionId::cancelProxy:
      return [this] { cancelProxyBuild(); };
    case ActionId::tagKeys:
      return [this] { editTagKeys(); };
    case ActionId::keyBindings:
      return [this] { editKeyBindings(); };
    case ActionId::frameCache:
      return [this] { editFrameCacheBudget(); };
    case ActionId::cheatSheet:
      return [this] { showCheatSheet(this, cheatSheetHtml()); };
    case ActionId::about:
      return [this] { showAbout(this); };
    case ActionId::undo:  // the undo stack's own actions
    case ActionId::redo:
    case ActionId::autoAdvance:  // on/off settings: connectToggles()
    case ActionId::seedMode:
    case ActionId::leastConfidentFirst:
    case ActionId::stepOnProxy:
    case ActionId::darkPalette:
      return {};
  }
  return {};
}

void MainWindow::connectToggles() {
  connect(action(ActionId::autoAdvance), &QAction::toggled, this,
          [](bool on) { QSettings().setValue(QStringLiteral("autoAdvance"), on); });
  auto* proxy = action(ActionId::stepOnProxy);
  proxy->setChecked(true);
  connect(proxy, &QAction::toggled, this, [this](bool on) {
    QSettings().setValue(QStringLiteral("video/stepOnProxy"), on);
    if (video_) video_->setStepOnProxy(on);
    updateStatus();
  });
  action(ActionId::cancelProxy)->setEnabled(false);
  connect(action(ActionId::darkPalette), &QAction::toggled, this, &MainWindow::setTheme);
  connect(action(ActionId::seedMode), &QAction::toggled, this, [this](bool on) {
    viewer_->setSeeding(on);
    legend_->setSeeding(on);
    if (on) {
      setSeedLimb(seedLimb_);  // says what a click does now
    } else {
      statusBar()->clearMessage();
    }
  });
  connect(action(ActionId::leastConfidentFirst), &QAction::toggled, this, [this](bool on) {
    order_ = on ? ReviewOrder::leastConfidentFirst : ReviewOrder::byFrame;
    showReview();
  });
}

// View starts with a switch for every dock and the toolbar.
void MainWindow::insertViewToggles() {
  QList<QAction*> toggles;
  for (auto* d : findChildren<QDockWidget*>()) toggles << d->toggleViewAction();
  for (auto* bar : findChildren<QToolBar*>()) toggles << bar->toggleViewAction();
  QAction* first = viewMenu_->actions().value(0);
  viewMenu_->insertActions(first, toggles);
  viewMenu_->insertSeparator(first);
}

void MainWindow::applyKeyBindings() {
  for (const auto& spec : actionTable())
    if (auto* a = action(spec.id)) a->setShortcuts(bindings_.shortcutsFor(spec.id));
}

void MainWindow::addRecent(const QString& path) {
  QSettings settings;
  auto list = settings.value(QStringLiteral("recentFiles")).toStringList();
  list.removeAll(path);
  list.prepend(path);
  while (list.size() > kMaxRecent) list.removeLast();
  settings.setValue(QStringLiteral("recentFiles"), list);
  rebuildRecentMenu();
}

void MainWindow::rebuildRecentMenu() {
  recentMenu_->clear();
  const auto list = QSettings().value(QStringLiteral("recentFiles")).toStringList();
  for (const auto& path : list) {
    recentMenu_
        ->addAction(QFileInfo(path).fileName(), this,
                    [this, path] {
                      if (maybeSave()) openPath(path);
                    })
        ->setToolTip(path);
  }
  recentMenu_->setEnabled(!list.isEmpty());
}

}  // namespace stridemark::ui
