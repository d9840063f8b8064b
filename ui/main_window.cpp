#include "ui/main_window.h"

#include <QApplication>
#include <QIcon>
#include <QLabel>
#include <QSettings>
#include <QSplitter>
#include <QStatusBar>
#include <algorithm>

#include "ui/document/project_lock.h"
#include "ui/keys/cheat_sheet.h"
#include "ui/session/frame_crops.h"
#include "ui/session/guarded.h"
#include "ui/session/propose_job.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

// Resources live in the static ui library: register them explicitly (global namespace).
static void initStridemarkResources() {
  Q_INIT_RESOURCE(stridemark);
}

namespace stridemark::ui {

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent), keys_(model::LimbSet::quadruped()) {
  initStridemarkResources();
  setObjectName(QStringLiteral("StridemarkMainWindow"));
  setWindowIcon(QIcon(QStringLiteral(":/stridemark/icons/stridemark.svg")));
  setAcceptDrops(true);
  viewer_ = new Viewer;
  lanes_ = new FootfallLanes(&doc_);
  auto* split = new QSplitter(Qt::Vertical);
  split->setObjectName(QStringLiteral("centreSplit"));
  split->addWidget(viewer_);
  split->addWidget(lanes_);
  split->setStretchFactor(0, 3);
  split->setStretchFactor(1, 1);
  setCentralWidget(split);
  status_ = new QLabel;
  status_->setAccessibleName(tr("Status"));
  statusBar()->addPermanentWidget(status_);
  journalWarning_ = new QLabel;
  journalWarning_->setObjectName(QStringLiteral("journalWarning"));
  journalWarning_->setAccessibleName(tr("Autosave warning"));
  journalWarning_->setWordWrap(true);
  journalWarning_->setStyleSheet(
      QStringLiteral("QLabel { color: white; background: #b00020; padding: 2px 6px; }"));
  journalWarning_->hide();
  statusBar()->addPermanentWidget(journalWarning_, 1);
  buildProxyStatus();
  buildProposeStatus();
  buildDocks();
  buildActions();
  showProposeProgress(false);
  keys_ = TagKeyMap::load(doc_.annotation().limbs);
  legend_->setKeys(keys_);
  updateTagKeyHints();
  connectDocument();
  connect(lanes_, &FootfallLanes::seekRequested, this, [this](qint64 f) { seek(f); });
  connect(lanes_, &FootfallLanes::limbSelected, this, &MainWindow::selectLimb);
  connect(lanes_, &FootfallLanes::proposalClicked, this, [this](const model::Event& e) {
    if (const auto* p = doc_.findProposal(e)) setCurrentProposal(*p);
  });
  connect(&playTimer_, &QTimer::timeout, this, &MainWindow::playTick);
  playTimer_.setInterval(15);
  qApp->installEventFilter(this);
  restoreSettings();
  onAnnotationChanged();
  updateTitle();
}

MainWindow::~MainWindow() {
  qApp->removeEventFilter(this);
  stopPlayback();
  proposeJob_.reset();  // cancels and waits for a run still going
}

void MainWindow::connectDocument() {
  connect(&doc_, &ProjectDocument::annotationChanged, this, &MainWindow::onAnnotationChanged);
  connect(&doc_, &ProjectDocument::trialChanged, this, &MainWindow::onAnnotationChanged);
  connect(&doc_, &ProjectDocument::projectReset, this, [this] {
    reloadTagKeysIfLimbsChanged();
    selectLimb(std::min(selectedLimb_, doc_.annotation().limbs.size() - 1));
    // Another project: a run still going belongs to the old one, and so do its tracks.
    ++proposeTicket_;
    proposeJob_->cancel();
    tracks_.clear();
    setCurrentProposal(std::nullopt);
    refillSeedLimbs();
  });
  connect(&doc_, &ProjectDocument::pathChanged, this, &MainWindow::updateTitle);
  connect(doc_.undoStack(), &QUndoStack::cleanChanged, this, &MainWindow::updateTitle);
  // Not a dialog per keystroke: a red line that stays until a journal write succeeds again.
  connect(&doc_, &ProjectDocument::journalFailed, this, &MainWindow::showJournalWarning);
  connect(&doc_, &ProjectDocument::journalWritten, this, [this] { showJournalWarning({}); });
  connect(&runner_, &AnalysisRunner::finished, this, &MainWindow::onReport);
  connect(&runner_, &AnalysisRunner::failed, this, [this](const QString& message, std::uint64_t) {
    statusBar()->showMessage(tr("Analysis: %1").arg(message), 8000);
  });
}

void MainWindow::restoreSettings() {
  QSettings settings;
  // First start (nothing saved): a size that shows every dock readably.
  if (!restoreGeometry(settings.value(QStringLiteral("mainWindow/geometry")).toByteArray()))
    resize(1400, 900);
  restoreState(settings.value(QStringLiteral("mainWindow/state")).toByteArray());
  action(ActionId::autoAdvance)
      ->setChecked(settings.value(QStringLiteral("autoAdvance"), false).toBool());
  bigStep_ = settings.value(QStringLiteral("bigStep"), 10).toLongLong();
  action(ActionId::darkPalette)
      ->setChecked(settings.value(QStringLiteral("theme")).toString() == QLatin1String("dark"));
  action(ActionId::stepOnProxy)
      ->setChecked(settings.value(QStringLiteral("video/stepOnProxy"), true).toBool());
  const auto budgetMiB = settings.value(QStringLiteral("video/cacheBudgetMiB"), 0).toULongLong();
  if (budgetMiB > 0) videoOptions_.budgetBytes = static_cast<std::size_t>(budgetMiB) << 20;
}

void MainWindow::showJournalWarning(const QString& message) {
  journalWarning_->setText(message);
  journalWarning_->setToolTip(message);
  journalWarning_->setVisible(!message.isEmpty());
}

QString MainWindow::journalWarning() const {
  return journalWarning_->isVisibleTo(this) ? journalWarning_->text() : QString();
}

QAction* MainWindow::action(ActionId id) const {
  const auto it = actions_.find(id);
  return it == actions_.end() ? nullptr : it->second;
}

QString MainWindow::cheatSheetHtml() const {
  return stridemark::ui::cheatSheetHtml(bindings_, keys_);
}

}  // namespace stridemark::ui
