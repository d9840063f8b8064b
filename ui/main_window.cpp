#include "ui/main_window.h"

#include <QAbstractSpinBox>
#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QComboBox>
#include <QDirIterator>
#include <QDockWidget>
#include <QFileDialog>
#include <QFileInfo>
#include <QInputDialog>
#include <QKeyEvent>
#include <QKeySequenceEdit>
#include <QLabel>
#include <QLineEdit>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QPlainTextEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSettings>
#include <QSplitter>
#include <QStatusBar>
#include <QTextEdit>
#include <QToolBar>
#include <QUndoView>
#include <algorithm>
#include <array>

#include "common/error.h"
#include "formats/project_file.h"
#include "ui/app/guarded.h"
#include "ui/app/palettes.h"
#include "ui/app/video_source.h"
#include "ui/document/project_io.h"
#include "ui/export/export_dialog.h"
#include "ui/export/figure_set.h"
#include "ui/figures/analysis_figures.h"
#include "ui/widgets/figure_view.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/help_dialogs.h"
#include "ui/widgets/hidden_span_dialog.h"
#include "ui/widgets/report_panels.h"
#include "ui/widgets/stride_sheet.h"
#include "ui/widgets/trial_card_dialog.h"
#include "ui/widgets/viewer.h"

// Resources live in the static ui library: register them explicitly (global namespace).
static void initStridemarkResources() {
  Q_INIT_RESOURCE(stridemark);
}

namespace stridemark::ui {

namespace {

// Playback speeds as fractions of real time at the capture rate.
constexpr std::array<double, 6> kSpeeds{1.0 / 32, 1.0 / 16, 1.0 / 8, 1.0 / 4, 1.0 / 2, 1.0};
constexpr int kMaxRecent = 8;

QString speedText(double speed) {
  return speed >= 1.0 ? QStringLiteral("1×") : QStringLiteral("1/%1×").arg(qRound(1.0 / speed));
}

bool isTextInput(QWidget* w) {
  if (!w) return false;
  if (qobject_cast<QLineEdit*>(w) || qobject_cast<QTextEdit*>(w) ||
      qobject_cast<QPlainTextEdit*>(w) || qobject_cast<QAbstractSpinBox*>(w) ||
      qobject_cast<QKeySequenceEdit*>(w))
    return true;
  if (auto* combo = qobject_cast<QComboBox*>(w)) return combo->isEditable();
  return isTextInput(w->focusProxy());
}

bool isProjectFile(const QString& path) {
  return path.endsWith(QString::fromLatin1(formats::kProjectExtension.data(),
                                           static_cast<int>(formats::kProjectExtension.size())),
                       Qt::CaseInsensitive);
}

// A moved video: look for a file with the same signature near the project.
QString findMovedVideo(const QString& projectDir, const model::VideoLink& link) {
  if (link.signature.empty()) return {};
  const auto dash = link.signature.find('-');
  const qint64 size = QString::fromStdString(link.signature.substr(0, dash)).toLongLong();
  QDirIterator it(projectDir, QDir::Files, QDirIterator::Subdirectories);
  int visited = 0;
  while (it.hasNext() && visited++ < 5000) {
    const QString candidate = it.next();
    if (QFileInfo(candidate).size() != size) continue;
    try {
      if (video::signatureText(video::computeSignature(candidate.toStdString())) ==
          link.signature)
        return candidate;
    } catch (const Error&) {
      // Unreadable candidate: keep looking.
    }
  }
  return {};
}

}  // namespace

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
  buildProxyStatus();
  buildDocks();
  buildActions();
  keys_ = TagKeyMap::load(doc_.annotation().limbs);
  legend_->setKeys(keys_);

  connect(&doc_, &ProjectDocument::annotationChanged, this, &MainWindow::onAnnotationChanged);
  connect(&doc_, &ProjectDocument::trialChanged, this, &MainWindow::onAnnotationChanged);
  connect(&doc_, &ProjectDocument::projectReset, this, [this] {
    if (!(keys_.limbs() == doc_.annotation().limbs)) {
      keys_ = TagKeyMap::load(doc_.annotation().limbs);
      legend_->setKeys(keys_);
    }
    selectLimb(std::min(selectedLimb_, doc_.annotation().limbs.size() - 1));
  });
  connect(&doc_, &ProjectDocument::pathChanged, this, &MainWindow::updateTitle);
  connect(doc_.undoStack(), &QUndoStack::cleanChanged, this, &MainWindow::updateTitle);
  connect(&doc_, &ProjectDocument::journalFailed, this,
          [this](const QString& message) { reportError(this, tr("Autosave journal"), message); });
  connect(&runner_, &AnalysisRunner::finished, this, &MainWindow::onReport);
  connect(&runner_, &AnalysisRunner::failed, this, [this](const QString& message, std::uint64_t) {
    statusBar()->showMessage(tr("Analysis: %1").arg(message), 8000);
  });
  connect(lanes_, &FootfallLanes::seekRequested, this, [this](qint64 f) { seek(f); });
  connect(lanes_, &FootfallLanes::limbSelected, this, &MainWindow::selectLimb);
  connect(&playTimer_, &QTimer::timeout, this, &MainWindow::playTick);
  playTimer_.setInterval(15);
  qApp->installEventFilter(this);

  QSettings settings;
  // First start (nothing saved): a size that shows every dock readably.
  if (!restoreGeometry(settings.value(QStringLiteral("mainWindow/geometry")).toByteArray()))
    resize(1400, 900);
  restoreState(settings.value(QStringLiteral("mainWindow/state")).toByteArray());
  autoAdvanceAction_->setChecked(settings.value(QStringLiteral("autoAdvance"), false).toBool());
  bigStep_ = settings.value(QStringLiteral("bigStep"), 10).toLongLong();
  darkAction_->setChecked(settings.value(QStringLiteral("theme")).toString() ==
                          QLatin1String("dark"));
  stepOnProxyAction_->setChecked(
      settings.value(QStringLiteral("video/stepOnProxy"), true).toBool());
  const auto budgetMiB = settings.value(QStringLiteral("video/cacheBudgetMiB"), 0).toULongLong();
  if (budgetMiB > 0) videoOptions_.budgetBytes = static_cast<std::size_t>(budgetMiB) << 20;
  onAnnotationChanged();
  updateTitle();
}

MainWindow::~MainWindow() {
  qApp->removeEventFilter(this);
  stopPlayback();
}

void MainWindow::buildDocks() {
  auto dock = [this](const QString& title, const QString& name, QWidget* w,
                     Qt::DockWidgetArea area) {
    auto* d = new QDockWidget(title, this);
    d->setObjectName(name);
    d->setWidget(w);
    addDockWidget(area, d);
    return d;
  };
  sheet_ = new StrideSheet;
  connect(sheet_, &StrideSheet::seekRequested, this, [this](qint64 f) { seek(f); });
  gaitMap_ = new FigureView(tr("Gait map"), figures::paintGaitMap);
  phaseDial_ = new FigureView(tr("Phase dial"), figures::paintPhaseDial);
  dutyPlot_ = new FigureView(tr("Duty factor per stride"), figures::paintStrideDutyPlot);
  checks_ = new ChecksList;
  connect(checks_, &ChecksList::seekRequested, this, [this](qint64 f) {
    if (f >= 0) seek(f);
  });
  connect(checks_, &ChecksList::limbRequested, this, &MainWindow::selectLimb);
  summary_ = new SummaryView;
  legend_ = new TagKeyLegend;
  auto* undoView = new QUndoView(doc_.undoStack());
  undoView->setAccessibleName(tr("Edit history"));

  auto* gm = dock(tr("Gait map"), QStringLiteral("dockGaitMap"), gaitMap_, Qt::RightDockWidgetArea);
  auto* pd =
      dock(tr("Phase dial"), QStringLiteral("dockPhaseDial"), phaseDial_, Qt::RightDockWidgetArea);
  auto* sm = dock(tr("Summary"), QStringLiteral("dockSummary"), summary_, Qt::RightDockWidgetArea);
  tabifyDockWidget(pd, sm);
  pd->raise();
  (void)gm;
  auto* ss =
      dock(tr("Stride sheet"), QStringLiteral("dockStrideSheet"), sheet_, Qt::BottomDockWidgetArea);
  auto* ck = dock(tr("Checks"), QStringLiteral("dockChecks"), checks_, Qt::BottomDockWidgetArea);
  auto* dp = dock(tr("Duty per stride"), QStringLiteral("dockDutyPlot"), dutyPlot_,
                  Qt::BottomDockWidgetArea);
  auto* hv = dock(tr("History"), QStringLiteral("dockHistory"), undoView, Qt::BottomDockWidgetArea);
  tabifyDockWidget(ss, dp);
  tabifyDockWidget(ck, hv);
  ss->raise();
  ck->raise();
  dock(tr("Tag keys"), QStringLiteral("dockTagKeys"), legend_, Qt::LeftDockWidgetArea);
}

QAction* MainWindow::addAction(QMenu* menu, const QString& text, const QKeySequence& key,
                               std::function<void()> slot) {
  auto* action = menu->addAction(text);
  if (!key.isEmpty()) action->setShortcut(key);
  action->setShortcutContext(Qt::WindowShortcut);
  connect(action, &QAction::triggered, this, [slot = std::move(slot)] { slot(); });
  return action;
}

void MainWindow::buildActions() {
  auto* file = menuBar()->addMenu(tr("&File"));
  addAction(file, tr("&Open video or project…"), QKeySequence::Open, [this] {
    if (!maybeSave()) return;
    const QString path = QFileDialog::getOpenFileName(
        this, tr("Open video or project"), QString(),
        tr("Projects and videos (*.stridemark *.mp4 *.mov *.avi *.mkv *.m4v);;All files (*)"));
    if (!path.isEmpty()) openPath(path);
  });
  recentMenu_ = file->addMenu(tr("Open &recent"));
  rebuildRecentMenu();
  addAction(file, tr("&Save"), QKeySequence::Save, [this] { save(); });
  addAction(file, tr("Save &as…"), QKeySequence::SaveAs, [this] { saveAsDialog(); });
  exportAction_ =
      addAction(file, tr("&Export…"), QKeySequence(tr("Ctrl+E")), [this] { openExport(); });
  addAction(file, tr("Export &figures…"), QKeySequence(tr("Ctrl+Shift+E")),
            [this] { exportFigures(); });
  file->addSeparator();
  addAction(file, tr("&Quit"), QKeySequence::Quit, [this] { close(); });

  auto* edit = menuBar()->addMenu(tr("&Edit"));
  auto* undo = doc_.undoStack()->createUndoAction(this, tr("&Undo"));
  undo->setShortcut(QKeySequence::Undo);
  auto* redo = doc_.undoStack()->createRedoAction(this, tr("&Redo"));
  redo->setShortcuts({QKeySequence::Redo, QKeySequence(QStringLiteral("Ctrl+Y"))});
  edit->addAction(undo);
  edit->addAction(redo);
  edit->addSeparator();
  addAction(edit, tr("Nudge selected events earlier"), QKeySequence(Qt::Key_Comma),
            [this] { lanes_->nudgeSelection(-1); });
  addAction(edit, tr("Nudge selected events later"), QKeySequence(Qt::Key_Period),
            [this] { lanes_->nudgeSelection(1); });
  addAction(edit, tr("&Delete selected events or hidden span"), QKeySequence::Delete,
            [this] { lanes_->deleteSelection(); });
  addAction(edit, tr("Start / end &hidden span of selected limb"), QKeySequence(tr("Ctrl+H")),
            [this] { toggleHiddenSpan(); });
  hiddenSpanAction_ = addAction(edit, tr("Mark hidden span for &limbs…"),
                                QKeySequence(tr("Ctrl+Shift+H")), [this] { hiddenSpanDialog(); });
  edit->addSeparator();
  addAction(edit, tr("&Trial card…"), QKeySequence(tr("Ctrl+T")), [this] { editTrialCard(); });

  auto* transport = menuBar()->addMenu(tr("&Transport"));
  auto* bar = addToolBar(tr("Transport"));
  bar->setObjectName(QStringLiteral("transportBar"));
  auto both = [bar](QAction* a) { bar->addAction(a); };
  both(addAction(transport, tr("First frame"), QKeySequence(Qt::Key_Home), [this] { seek(0); }));
  both(addAction(transport, tr("Back N frames"), QKeySequence(tr("Shift+Left")),
                 [this] { stepBy(-bigStep_); }));
  both(addAction(transport, tr("Step back"), QKeySequence(Qt::Key_Left), [this] { stepBy(-1); }));
  both(addAction(transport, tr("Play backwards"), QKeySequence(tr("Shift+Space")),
                 [this] { playDirection_ == -1 ? stopPlayback() : startPlayback(-1); }));
  both(addAction(transport, tr("Play / pause"), QKeySequence(Qt::Key_Space),
                 [this] { playDirection_ == 1 ? stopPlayback() : startPlayback(1); }));
  both(
      addAction(transport, tr("Step forward"), QKeySequence(Qt::Key_Right), [this] { stepBy(1); }));
  both(addAction(transport, tr("Forward N frames"), QKeySequence(tr("Shift+Right")),
                 [this] { stepBy(bigStep_); }));
  both(addAction(transport, tr("Last frame"), QKeySequence(Qt::Key_End),
                 [this] { seek(frameCount() - 1); }));
  transport->addSeparator();
  addAction(transport, tr("Slower"), QKeySequence(Qt::Key_Minus), [this] { changeSpeed(-1); });
  addAction(transport, tr("Faster"), QKeySequence(Qt::Key_Plus), [this] { changeSpeed(1); });
  addAction(transport, tr("Previous event of selected limb"), QKeySequence(Qt::Key_BracketLeft),
            [this] { jumpToEvent(-1); });
  addAction(transport, tr("Next event of selected limb"), QKeySequence(Qt::Key_BracketRight),
            [this] { jumpToEvent(1); });
  addAction(transport, tr("&Go to frame or time…"), QKeySequence(tr("Ctrl+G")),
            [this] { goToDialog(); });
  addAction(transport, tr("Set big step (N)…"), {}, [this] {
    bool ok = false;
    const int n = QInputDialog::getInt(this, tr("Big step"), tr("Frames per Shift+arrow step:"),
                                       static_cast<int>(bigStep_), 2, 10000, 1, &ok);
    if (ok) {
      bigStep_ = n;
      QSettings().setValue(QStringLiteral("bigStep"), n);
    }
  });
  autoAdvanceAction_ =
      addAction(transport, tr("&Auto-advance after tag"), QKeySequence(tr("Ctrl+Shift+A")), [] {});
  autoAdvanceAction_->setCheckable(true);
  connect(autoAdvanceAction_, &QAction::toggled, this,
          [](bool on) { QSettings().setValue(QStringLiteral("autoAdvance"), on); });

  viewMenu_ = menuBar()->addMenu(tr("&View"));
  for (auto* d : findChildren<QDockWidget*>()) viewMenu_->addAction(d->toggleViewAction());
  viewMenu_->addAction(bar->toggleViewAction());
  viewMenu_->addSeparator();
  addAction(viewMenu_, tr("Zoom lanes in"), QKeySequence(tr("Ctrl+=")),
            [this] { lanes_->setVisibleSpan(lanes_->visibleSpan() * 4 / 5); });
  addAction(viewMenu_, tr("Zoom lanes out"), QKeySequence(tr("Ctrl+-")),
            [this] { lanes_->setVisibleSpan(lanes_->visibleSpan() * 5 / 4); });
  addAction(viewMenu_, tr("Fit video"), QKeySequence(tr("Ctrl+0")),
            [this] { viewer_->resetView(); });
  stepOnProxyAction_ = addAction(viewMenu_, tr("Step on intra &proxy"), {}, [] {});
  stepOnProxyAction_->setCheckable(true);
  stepOnProxyAction_->setChecked(true);
  stepOnProxyAction_->setToolTip(
      tr("Show frames from the all-intra stepping proxy of a long-GOP clip (export always reads "
         "the source)"));
  connect(stepOnProxyAction_, &QAction::toggled, this, [this](bool on) {
    QSettings().setValue(QStringLiteral("video/stepOnProxy"), on);
    if (video_) video_->setStepOnProxy(on);
    updateStatus();
  });
  cancelProxyAction_ =
      addAction(viewMenu_, tr("Cancel stepping proxy build"), {}, [this] { cancelProxyBuild(); });
  cancelProxyAction_->setEnabled(false);
  darkAction_ = addAction(viewMenu_, tr("&Dark palette"), {}, [] {});
  darkAction_->setCheckable(true);
  connect(darkAction_, &QAction::toggled, this, &MainWindow::setTheme);

  auto* settingsMenu = menuBar()->addMenu(tr("&Settings"));
  addAction(settingsMenu, tr("&Tag keys…"), {}, [this] { editTagKeys(); });
  addAction(settingsMenu, tr("Frame &cache…"), {}, [this] { editFrameCacheBudget(); });

  auto* help = menuBar()->addMenu(tr("&Help"));
  addAction(help, tr("&Keyboard cheat sheet"), QKeySequence(Qt::Key_F1),
            [this] { showCheatSheet(this, keys_); });
  addAction(help, tr("&About Stridemark"), {}, [this] { showAbout(this); });
}

// --- opening and saving ---

bool MainWindow::openPath(const QString& path) {
  return isProjectFile(path) ? openProject(path) : openVideo(path);
}

std::optional<model::Project> MainWindow::offerRecovery(const QString& journalFile) {
  std::optional<model::Project> journalled;
  const bool readable = runGuarded(this, tr("Recover unsaved work"),
                                   [&] { journalled = ProjectDocument::readJournal(journalFile); });
  if (!readable || !journalled) return std::nullopt;
  bool recover = recovery_ == RecoveryPolicy::recover;
  if (recovery_ == RecoveryPolicy::ask) {
    const auto answer = QMessageBox::question(
        this, tr("Recover unsaved work"),
        tr("Stridemark found unsaved tags from a session that ended unexpectedly (%1 events).\n"
           "Recover them? Choosing No discards the journal.")
            .arg(journalled->annotation.events.size()),
        QMessageBox::Yes | QMessageBox::No, QMessageBox::Yes);
    recover = answer == QMessageBox::Yes;
  }
  if (!recover) {
    QFile::remove(journalFile);
    return std::nullopt;
  }
  return journalled;
}

bool MainWindow::openVideo(const QString& path) {
  std::unique_ptr<VideoSource> source;
  if (!runGuarded(this, tr("Open video"),
                  [&] { source = std::make_unique<VideoSource>(path, videoOptions_); }))
    return false;
  stopPlayback();
  model::Project project;
  project.annotation.limbs = doc_.annotation().limbs;
  project.annotation.referenceLimb = project.annotation.limbs.defaultReference();
  const auto& info = source->info();
  project.annotation.captureRate = info.captureRate.valid() ? info.captureRate : Rational{30, 1};
  project.annotation.clip = model::FrameRange{0, info.frameCount - 1};
  project.video = source->link();
  const auto journalled = offerRecovery(ProjectDocument::journalPathFor(path));
  doc_.reset(journalled ? *journalled : project, QString(), journalled.has_value());
  attachVideo(std::move(source));
  addRecent(path);
  return true;
}

bool MainWindow::openProject(const QString& path) {
  model::Project project;
  if (!runGuarded(this, tr("Open project"), [&] { project = loadProjectFile(path); })) return false;
  stopPlayback();
  const auto journalled = offerRecovery(ProjectDocument::journalPathFor(path));
  doc_.reset(journalled ? *journalled : project, path, journalled.has_value());
  attachVideo(nullptr);
  openVideoForProject(path);
  addRecent(path);
  return true;
}

bool MainWindow::openVideoForProject(const QString& projectPath) {
  if (!doc_.project().video) return false;
  QString videoPath = doc_.videoPath();
  if (!QFileInfo::exists(videoPath)) {
    // Moved: look for the same file (by signature) near the project, else ask the user.
    videoPath = findMovedVideo(QFileInfo(projectPath).absolutePath(), *doc_.project().video);
    if (videoPath.isEmpty() && recovery_ == RecoveryPolicy::ask) {
      QMessageBox::information(
          this, tr("Video not found"),
          tr("The video %1 was not found. Please locate it.").arg(doc_.videoPath()));
      videoPath = QFileDialog::getOpenFileName(this, tr("Locate the video"),
                                               QFileInfo(projectPath).absolutePath());
    }
    if (videoPath.isEmpty()) {
      statusBar()->showMessage(
          tr("Video not found: %1 (tags are still editable)").arg(doc_.videoPath()));
      return false;
    }
  }
  std::unique_ptr<VideoSource> source;
  if (!runGuarded(this, tr("Open video"),
                  [&] { source = std::make_unique<VideoSource>(videoPath, videoOptions_); }))
    return false;
  attachVideo(std::move(source));
  return true;
}

void MainWindow::attachVideo(std::unique_ptr<VideoSource> video) {
  video_ = std::move(video);
  showProxyProgress(false);
  viewer_->setFrame(-1, QImage());
  if (video_) {
    connect(video_.get(), &VideoSource::frameReady, this, &MainWindow::onFrame);
    connect(video_.get(), &VideoSource::frameFailed, this, [this](qint64 f, const QString& m) {
      statusBar()->showMessage(tr("Frame %1: %2").arg(f).arg(m), 8000);
    });
    connectProxySignals();
    // Pictures are made at the Viewer's fitted size (see Viewer::displayPixels).
    connect(viewer_, &Viewer::displayPixelsChanged, video_.get(),
            [this](QSize pixels, qreal ratio) { video_->setDisplaySize(pixels, ratio); });
    viewer_->setSourceSize(QSize(video_->info().width, video_->info().height));
    video_->setDisplaySize(viewer_->displayPixels(), viewer_->devicePixelRatioF());
    viewer_->setFrameCount(video_->frameCount());
    lanes_->setFrameCount(video_->frameCount());
  } else {
    viewer_->setPlaceholder(tr("No video: tags can still be edited in the Footfall lanes."));
    viewer_->setSourceSize({});
    const auto& clip = doc_.annotation().clip;
    const auto count = clip ? clip->last + 1 : 0;
    viewer_->setFrameCount(count);
    lanes_->setFrameCount(count);
  }
  playhead_ = -1;
  seek(0);
  updateTitle();
  if (video_) {
    video_->setStepOnProxy(stepOnProxyAction_->isChecked());
    if (video_->startProxyIfAdvised() && video_->proxyBuilding()) showProxyProgress(true);
  }
}

// --- stepping proxy (long-GOP clips) ---

void MainWindow::buildProxyStatus() {
  proxyBar_ = new QProgressBar;
  proxyBar_->setAccessibleName(tr("Stepping proxy progress"));
  proxyBar_->setRange(0, 1000);
  proxyBar_->setFormat(tr("Building stepping proxy %p%"));
  proxyBar_->setMaximumWidth(proxyBar_->fontMetrics().horizontalAdvance(proxyBar_->format()) * 2);
  proxyCancel_ = new QPushButton(tr("Cancel"));
  proxyCancel_->setAccessibleName(tr("Cancel stepping proxy"));
  proxyCancel_->setToolTip(tr("Stop building the stepping proxy; stepping uses the source video"));
  proxyCancel_->setFocusPolicy(Qt::StrongFocus);
  connect(proxyCancel_, &QPushButton::clicked, this, &MainWindow::cancelProxyBuild);
  statusBar()->addPermanentWidget(proxyBar_);
  statusBar()->addPermanentWidget(proxyCancel_);
  showProxyProgress(false);
}

void MainWindow::showProxyProgress(bool on) {
  proxyBar_->setVisible(on);
  proxyCancel_->setVisible(on);
  if (cancelProxyAction_) cancelProxyAction_->setEnabled(on);
  if (on) proxyBar_->setValue(0);
}

void MainWindow::connectProxySignals() {
  connect(video_.get(), &VideoSource::proxyProgress, this,
          [this](double f) { proxyBar_->setValue(static_cast<int>(f * 1000)); });
  connect(video_.get(), &VideoSource::proxyReady, this, [this] {
    showProxyProgress(false);
    statusBar()->showMessage(tr("Stepping proxy ready: backward steps are now as quick as forward "
                                "ones (export still reads the source)."),
                             8000);
    updateStatus();
  });
  connect(video_.get(), &VideoSource::proxyFailed, this, [this](const QString& message) {
    showProxyProgress(false);
    statusBar()->showMessage(message, 10000);
    updateStatus();
  });
}

void MainWindow::cancelProxyBuild() {
  if (video_) video_->cancelProxy();
}

bool MainWindow::saveProjectAs(const QString& path) {
  QString target = path;
  if (!isProjectFile(target)) target += QString::fromLatin1(formats::kProjectExtension.data());
  const bool ok = runGuarded(this, tr("Save project"), [&] { doc_.saveAs(target); });
  if (ok) {
    addRecent(target);
    statusBar()->showMessage(tr("Saved %1").arg(target), 4000);
  }
  return ok;
}

bool MainWindow::save() {
  if (doc_.projectPath().isEmpty()) return saveAsDialog();
  return saveProjectAs(doc_.projectPath());
}

bool MainWindow::saveAsDialog() {
  QString suggestion = doc_.projectPath();
  if (suggestion.isEmpty() && !doc_.videoPath().isEmpty()) {
    const QFileInfo v(doc_.videoPath());
    suggestion = v.absolutePath() + QLatin1Char('/') + v.completeBaseName() +
                 QString::fromLatin1(formats::kProjectExtension.data());
  }
  const QString path = QFileDialog::getSaveFileName(this, tr("Save project"), suggestion,
                                                    tr("Stridemark projects (*.stridemark)"));
  return !path.isEmpty() && saveProjectAs(path);
}

bool MainWindow::maybeSave() {
  if (!doc_.isModified() || !askBeforeDiscard_) return true;
  const auto answer = QMessageBox::warning(
      this, tr("Unsaved changes"), tr("The project has unsaved changes. Save them?"),
      QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
  if (answer == QMessageBox::Cancel) return false;
  if (answer == QMessageBox::Save) return save();
  doc_.removeJournal();  // the user chose to drop these edits
  return true;
}

void MainWindow::closeEvent(QCloseEvent* event) {
  if (!maybeSave()) {
    event->ignore();
    return;
  }
  stopPlayback();
  QSettings settings;
  settings.setValue(QStringLiteral("mainWindow/geometry"), saveGeometry());
  settings.setValue(QStringLiteral("mainWindow/state"), saveState());
  event->accept();
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event) {
  if (event->mimeData()->hasUrls()) event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event) {
  const auto urls = event->mimeData()->urls();
  if (urls.isEmpty() || !urls.front().isLocalFile()) return;
  if (maybeSave()) openPath(urls.front().toLocalFile());
}

bool MainWindow::saveBeforeExport() {
  // The export reads the project file, so it must hold what the user sees.
  if (!doc_.projectPath().isEmpty() && !doc_.isModified()) return true;
  return save();  // Save As prompt when never saved; cancel returns false
}

void MainWindow::openExport() {
  if (!saveBeforeExport()) return;
  const std::int64_t frames = video_ ? video_->frameCount() : 0;
  exports::ExportDialog dialog(doc_.projectPath(), frames, doc_.annotation().captureRate, this);
  dialog.exec();
}

void MainWindow::exportFigures() {
  if (!report_) {
    reportError(this, tr("Export figures"), tr("Nothing to export yet: tag some strides first."));
    return;
  }
  const QString dir = QFileDialog::getExistingDirectory(this, tr("Export figures to folder"));
  if (!dir.isEmpty()) exportFiguresTo(dir);
}

bool MainWindow::exportFiguresTo(const QString& dir) {
  if (!report_) return false;
  // The export's figure set: same painters, sizes and file names as `stridemark export`.
  return runGuarded(this, tr("Export figures"), [&] {
    exports::writeFigureFolder(doc_.annotation(), *report_, dir.toStdString());
    statusBar()->showMessage(tr("Figures written to %1").arg(dir), 5000);
  });
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

// --- playhead and transport ---

std::int64_t MainWindow::frameCount() const {
  if (video_) return video_->frameCount();
  const auto& clip = doc_.annotation().clip;
  if (clip) return clip->last + 1;
  const auto& events = doc_.annotation().events;
  std::int64_t last = 0;
  for (const auto& e : events) last = std::max(last, e.frame);
  return last + 1;
}

void MainWindow::seek(std::int64_t frame) {
  frame = std::clamp<std::int64_t>(frame, 0, std::max<std::int64_t>(0, frameCount() - 1));
  if (frame == playhead_) return;
  playhead_ = frame;
  viewer_->setPendingFrame(frame);
  lanes_->setPlayhead(frame);
  if (video_) video_->request(frame);
  updateStatus();
}

void MainWindow::onFrame(qint64 frame, const QImage& image) {
  viewer_->setFrame(frame, image);
}

void MainWindow::stepBy(std::int64_t delta) {
  stopPlayback();
  seek(playhead_ + delta);
}

void MainWindow::jumpToEvent(int direction) {
  const auto events = doc_.annotation().eventsOf(selectedLimb_);
  if (direction > 0) {
    for (const auto& e : events)
      if (e.frame > playhead_) return seek(e.frame);
  } else {
    for (auto it = events.rbegin(); it != events.rend(); ++it)
      if (it->frame < playhead_) return seek(it->frame);
  }
}

void MainWindow::startPlayback(int direction) {
  playDirection_ = direction;
  playOrigin_ = playhead_;
  playClock_.start();
  playTimer_.start();
  updateStatus();
}

void MainWindow::stopPlayback() {
  if (playDirection_ == 0) return;
  playDirection_ = 0;
  playTimer_.stop();
  updateStatus();
}

void MainWindow::playTick() {
  const double fps = doc_.annotation().captureRate.toDouble();
  const double frames =
      playClock_.elapsed() / 1000.0 * fps * kSpeeds[static_cast<std::size_t>(speedIndex_)];
  const auto target = playOrigin_ + playDirection_ * static_cast<std::int64_t>(frames);
  seek(target);
  if (target <= 0 || target >= frameCount() - 1) stopPlayback();
}

void MainWindow::changeSpeed(int direction) {
  speedIndex_ = std::clamp(speedIndex_ + direction, 0, static_cast<int>(kSpeeds.size()) - 1);
  if (playDirection_ != 0) startPlayback(playDirection_);  // restart the clock at the new speed
  updateStatus();
}

void MainWindow::goToDialog() {
  bool ok = false;
  const QString text = QInputDialog::getText(
      this, tr("Go to"), tr("Frame number, or time in seconds ending in 's' (e.g. 1.25s):"),
      QLineEdit::Normal, QString::number(playhead_), &ok);
  if (!ok) return;
  const QString t = text.trimmed();
  if (t.endsWith(QLatin1Char('s'))) {
    const double seconds = t.chopped(1).toDouble(&ok);
    if (ok) seek(secondsToFrame(seconds, doc_.annotation().captureRate));
  } else {
    const auto frame = t.toLongLong(&ok);
    if (ok) seek(frame);
  }
  if (!ok)
    reportError(this, tr("Go to"),
                tr("'%1' is neither a frame number nor a time like 1.25s.").arg(t));
}

// --- tagging ---

bool MainWindow::tagLimb(int limb, bool opposite) {
  if (limb < 0 || limb >= doc_.annotation().limbs.size()) return false;
  selectLimb(limb);
  const auto added = doc_.tag(limb, playhead_, opposite);
  if (added && autoAdvanceAction_->isChecked()) seek(playhead_ + autoAdvanceFrames_);
  return added.has_value();
}

void MainWindow::setAutoAdvance(bool on, std::int64_t frames) {
  autoAdvanceFrames_ = std::max<std::int64_t>(1, frames);
  autoAdvanceAction_->setChecked(on);
}

void MainWindow::toggleHiddenSpan() {
  if (!hiddenStart_) {
    hiddenStart_ = playhead_;
    statusBar()->showMessage(
        tr("Hidden span of %1 starts at frame %2; press Ctrl+H again at its "
           "last frame.")
            .arg(QString::fromStdString(doc_.annotation().limbs.label(selectedLimb_)))
            .arg(playhead_));
    return;
  }
  doc_.addHiddenSpan({selectedLimb_, *hiddenStart_, playhead_});
  hiddenStart_.reset();
  statusBar()->clearMessage();
}

void MainWindow::hiddenSpanDialog() {
  // A span started with Ctrl+H ends here; otherwise the dialog starts at the playhead.
  const auto first = hiddenStart_.value_or(playhead_);
  HiddenSpanDialog dialog(doc_.annotation().limbs, first, playhead_, frameCount(), selectedLimb_,
                          this);
  if (dialog.exec() != QDialog::Accepted) return;
  hiddenStart_.reset();
  markHiddenSpans(dialog.spans());
}

bool MainWindow::markHiddenSpans(const std::vector<model::HiddenSpan>& spans) {
  if (spans.empty()) return false;
  // Several limbs hidden at once are one edit: one undo step removes them all.
  doc_.undoStack()->beginMacro(spans.size() == 1 ? tr("Hide a limb")
                                                 : tr("Hide %1 limbs").arg(spans.size()));
  for (const auto& span : spans) doc_.addHiddenSpan(span);
  doc_.undoStack()->endMacro();
  statusBar()->clearMessage();
  return true;
}

void MainWindow::selectLimb(int limb) {
  if (limb < 0) return;
  selectedLimb_ = limb;
  lanes_->setSelectedLimb(limb);
  updateStatus();
}

bool MainWindow::eventFilter(QObject* watched, QEvent* event) {
  if (event->type() != QEvent::KeyPress) return QMainWindow::eventFilter(watched, event);
  auto* widget = qobject_cast<QWidget*>(watched);
  if (!widget || widget->window() != this) return QMainWindow::eventFilter(watched, event);
  auto* key = static_cast<QKeyEvent*>(event);
  const auto mods = key->modifiers() & ~Qt::KeypadModifier;
  // Tag keys never fire while a text field has focus, nor with Ctrl/Alt/Meta held.
  if ((mods & ~Qt::ShiftModifier) != Qt::NoModifier || isTextInput(QApplication::focusWidget()))
    return QMainWindow::eventFilter(watched, event);
  if (const auto limb = keys_.limbFor(key->key())) {
    if (!key->isAutoRepeat()) tagLimb(*limb, mods & Qt::ShiftModifier);
    return true;
  }
  return QMainWindow::eventFilter(watched, event);
}

// --- analysis and display ---

void MainWindow::onAnnotationChanged() {
  const auto& a = doc_.annotation();
  viewer_->setCaptureRate(a.captureRate);
  analysis::AnalysisOptions options;
  options.speedMs = doc_.project().trial.speedMs;
  options.legLengthM = doc_.project().trial.legLengthM;
  runner_.request(a, options, doc_.revision());
  lanes_->update();
  updateStatus();
}

void MainWindow::onReport(std::shared_ptr<const analysis::Report> report, std::uint64_t revision) {
  if (revision < shownRevision_) return;  // an older run finished late
  shownRevision_ = revision;
  report_ = report;
  sheet_->setReport(report);
  gaitMap_->setReport(report);
  phaseDial_->setReport(report);
  dutyPlot_->setReport(report);
  checks_->setReport(report);
  summary_->setReport(report);
}

void MainWindow::updateTitle() {
  QString name =
      doc_.projectPath().isEmpty()
          ? (doc_.videoPath().isEmpty() ? tr("untitled") : QFileInfo(doc_.videoPath()).fileName())
          : QFileInfo(doc_.projectPath()).fileName();
  setWindowTitle(QStringLiteral("%1[*] — Stridemark").arg(name));
  setWindowModified(doc_.isModified());
}

void MainWindow::updateStatus() {
  const auto& a = doc_.annotation();
  const QString limb =
      QString::fromStdString(a.limbs.label(std::min(selectedLimb_, a.limbs.size() - 1)));
  const bool stance = a.inStance(selectedLimb_, playhead_);
  status_->setText(tr("limb %1 (%2) · %3 events · speed %4%5%6")
                       .arg(limb, stance ? tr("stance") : tr("swing"))
                       .arg(a.events.size())
                       .arg(speedText(kSpeeds[static_cast<std::size_t>(speedIndex_)]))
                       .arg(playDirection_ > 0   ? tr(" · playing")
                            : playDirection_ < 0 ? tr(" · playing backwards")
                                                 : QString())
                       .arg(video_ && video_->displayingProxy() ? tr(" · proxy") : QString()));
}

void MainWindow::setTheme(bool dark) {
  applyTheme(dark ? Theme::dark : Theme::light);
  QSettings().setValue(QStringLiteral("theme"), themeName(dark ? Theme::dark : Theme::light));
}

void MainWindow::editTrialCard() {
  const bool locked = !doc_.annotation().events.empty() || !doc_.annotation().hidden.empty();
  TrialCardDialog dialog(doc_.project(), locked, this);
  if (dialog.exec() != QDialog::Accepted) return;
  runGuarded(this, tr("Trial card"), [&] {
    doc_.undoStack()->beginMacro(tr("Edit trial card"));
    if (!locked) doc_.setLimbSet(dialog.limbSet());
    doc_.setCaptureRate(dialog.captureRate());
    doc_.setReferenceLimb(dialog.referenceLimb());
    doc_.setTrialCard(dialog.trialCard());
    doc_.undoStack()->endMacro();
  });
  if (!(keys_.limbs() == doc_.annotation().limbs)) {
    keys_ = TagKeyMap::load(doc_.annotation().limbs);
    legend_->setKeys(keys_);
  }
}

void MainWindow::editFrameCacheBudget() {
  constexpr int kLeastMiB = 64, kMostMiB = 64 * 1024;
  const int current = static_cast<int>(
      std::clamp<std::size_t>(videoOptions_.budgetBytes >> 20, kLeastMiB, kMostMiB));
  bool ok = false;
  const int mib = QInputDialog::getInt(
      this, tr("Frame cache"),
      tr("Memory for decoded frames (MiB).\nMore keeps stepping backwards smooth on clips\n"
         "with far-apart keyframes; less leaves memory to other programs."),
      current, kLeastMiB, kMostMiB, 64, &ok);
  if (ok) setFrameCacheBudget(static_cast<std::size_t>(mib) << 20);
}

void MainWindow::setFrameCacheBudget(std::size_t bytes) {
  videoOptions_.budgetBytes = bytes;
  QSettings().setValue(QStringLiteral("video/cacheBudgetMiB"),
                       static_cast<qulonglong>(bytes >> 20));
  if (!video_) return;
  video_->setBudget(bytes);
  // As at open: a budget too small for the clip's keyframe spacing gets the stepping proxy.
  if (video_->startProxyIfAdvised() && video_->proxyBuilding()) showProxyProgress(true);
  updateStatus();
}

void MainWindow::editTagKeys() {
  TagKeyDialog dialog(keys_, this);
  if (dialog.exec() != QDialog::Accepted) return;
  keys_ = dialog.keys();
  keys_.save();
  legend_->setKeys(keys_);
}

}  // namespace stridemark::ui
