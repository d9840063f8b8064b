// Opening a video or a project: the recovery offer for a crashed session's journal, the project
// saved beside a clip, the questions a bare clip needs answered before tagging (New trial
// dialog), finding a moved video by its signature, and attaching the video to the Viewer and
// the lanes.
#include <QDirIterator>
#include <QFileDialog>
#include <QFileInfo>
#include <QMessageBox>
#include <QStatusBar>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/project_file.h"
#include "ui/document/journal.h"
#include "ui/document/project_io.h"
#include "ui/document/project_lock.h"
#include "ui/main_window.h"
#include "ui/main_window_files.h"
#include "ui/session/guarded.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/new_clip_dialog.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

namespace {

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
      if (video::signatureText(video::computeSignature(candidate.toStdString())) == link.signature)
        return candidate;
    } catch (const Error&) {
      // Unreadable candidate: keep looking.
    }
  }
  return {};
}

model::Project projectForClip(const VideoSource& source, const ClipSetup& setup) {
  model::Project project;
  auto& a = project.annotation;
  a.limbs = setup.limbs;
  a.referenceLimb = setup.referenceLimb;
  a.captureRate = setup.captureRate;
  a.clip = model::FrameRange{0, source.info().frameCount - 1};
  a.events = setup.events;
  project.video = source.link();
  return project;
}

}  // namespace

void MainWindow::openDialog() {
  if (!maybeSave()) return;
  const QString path = QFileDialog::getOpenFileName(
      this, tr("Open video or project"), QString(),
      tr("Projects and videos (*.stridemark *.mp4 *.mov *.avi *.mkv *.m4v);;All files (*)"));
  if (!path.isEmpty()) openPath(path);
}

bool MainWindow::openPath(const QString& path) {
  return isProjectFile(path) ? openProject(path) : openVideo(path);
}

std::optional<model::Project> MainWindow::offerRecovery(const QString& journalFile,
                                                        const QString& opensInstead) {
  std::optional<model::Project> journalled;
  try {
    journalled = ProjectDocument::readJournal(journalFile);
  } catch (const Error& e) {
    if (e.category() != ErrorCategory::format) {  // unreadable (permissions): leave it be
      reportError(
          this, tr("Recover unsaved work"),
          tr("%1\nIt was not recovered; %2.").arg(QString::fromStdString(e.what()), opensInstead));
      return std::nullopt;
    }
    setAsideDamagedJournal(journalFile, QString::fromStdString(e.what()), opensInstead);
    return std::nullopt;
  }
  if (!journalled) return std::nullopt;
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

// A damaged journal is never recovered (its project could not be saved and reopened) and
// never deleted (it may hold the only copy of someone's tags): it is renamed for inspection.
void MainWindow::setAsideDamagedJournal(const QString& journalFile, const QString& why,
                                        const QString& opensInstead) {
  QString kept;
  try {
    kept = journal::moveAside(journalFile);
  } catch (const Error& e) {
    reportError(this, tr("Recover unsaved work"),
                tr("%1\n%2\nIt was not recovered; %3.")
                    .arg(why, QString::fromStdString(e.what()), opensInstead));
    return;
  }
  reportError(this, tr("Recover unsaved work"),
              tr("%1\nIt was not recovered. It is kept as %2 for inspection (not deleted); %3.")
                  .arg(why, kept, opensInstead));
}

bool MainWindow::lockFor(const QString& base, std::unique_ptr<ProjectLock>* lock) {
  // This window owns it already (the same file, however the path is spelled).
  if (lock_ && lock_->guarded() == ProjectLock::normalPath(base)) return true;
  return runGuarded(this, tr("Open"), [&] { *lock = ProjectLock::acquire(base); });
}

void MainWindow::keepLock(std::unique_ptr<ProjectLock> lock) {
  if (lock) lock_ = std::move(lock);  // releases the previous project's lock
}

void MainWindow::removeLeftovers(const QString& base) {
  const auto removed =
      formats::removeStaleTemporaries(base.toStdString()).size() +
      formats::removeStaleTemporaries(ProjectDocument::journalPathFor(base).toStdString()).size();
  if (removed > 0)
    statusBar()->showMessage(
        tr("Removed %1 temporary file(s) left beside %2 by a save that was cut off.")
            .arg(removed)
            .arg(QFileInfo(base).fileName()),
        8000);
}

bool MainWindow::openVideo(const QString& path) {
  QString note;
  if (const QString project = projectBesideClip(path, &note); !project.isEmpty())
    return openProject(project);
  std::unique_ptr<VideoSource> source;
  if (!runGuarded(this, tr("Open video"),
                  [&] { source = std::make_unique<VideoSource>(path, videoOptions_); }))
    return false;
  std::unique_ptr<ProjectLock> lock;  // an unsaved clip's journal sits beside the clip
  if (!lockFor(path, &lock)) return false;
  removeLeftovers(path);
  const auto journalled =
      offerRecovery(ProjectDocument::journalPathFor(path), tr("the clip opens without it"));
  ClipSetup setup;
  if (!journalled && !askClipSetup(*source, note, &setup)) return false;  // cancelled
  stopPlayback();
  showJournalWarning({});
  keepLock(std::move(lock));
  const bool imported = !setup.events.empty();
  // Imported tags are unsaved work: marked modified, so the journal keeps them.
  doc_.reset(journalled ? *journalled : projectForClip(*source, setup), QString(),
             journalled.has_value() || imported);
  attachVideo(std::move(source));
  addRecent(path);
  if (imported)
    statusBar()->showMessage(tr("%1 events imported from %2")
                                 .arg(setup.events.size())
                                 .arg(QFileInfo(setup.eventsFile).fileName()),
                             8000);
  return true;
}

// The project saved beside a clip under its name, when its video link leads back to the clip.
QString MainWindow::projectBesideClip(const QString& videoPath, QString* note) const {
  const QFileInfo clip(videoPath);
  const QString candidate = clip.dir().filePath(clip.completeBaseName() + projectExtension());
  if (!QFileInfo::exists(candidate)) return {};
  const QString name = QFileInfo(candidate).fileName();
  model::Project project;
  try {
    project = loadProjectFile(candidate);
  } catch (const Error& e) {
    *note = tr("%1 beside the clip could not be read (%2); this starts a new trial.")
                .arg(name, QString::fromStdString(e.what()));
    return {};
  }
  if (!project.video) {
    *note = tr("%1 beside the clip links no video; this starts a new trial.").arg(name);
    return {};
  }
  QString linked = QString::fromStdString(project.video->path);
  if (QFileInfo(linked).isRelative()) linked = QFileInfo(candidate).dir().absoluteFilePath(linked);
  if (QFileInfo(linked).canonicalFilePath() == clip.canonicalFilePath()) return candidate;
  *note = tr("%1 beside the clip belongs to another video (%2); this starts a new trial.")
              .arg(name, QDir::toNativeSeparators(linked));
  return {};
}

bool MainWindow::askClipSetup(const VideoSource& source, const QString& note, ClipSetup* setup) {
  // The limb set offered first is the one in use, shown as a choice the person confirms.
  const auto& limbs = doc_.annotation().limbs;
  if (bareClip_ == BareClipPolicy::useDefaults) {
    *setup = NewClipDialog::defaults(source.info(), limbs);
    return true;
  }
  NewClipDialog dialog(source.path(), source.info(), limbs, this);
  dialog.setNote(note);
  if (dialog.exec() != QDialog::Accepted) return false;
  *setup = dialog.setup();
  return true;
}

bool MainWindow::openProject(const QString& path) {
  model::Project project;
  if (!runGuarded(this, tr("Open project"), [&] { project = loadProjectFile(path); })) return false;
  std::unique_ptr<ProjectLock> lock;
  if (!lockFor(path, &lock)) return false;
  stopPlayback();
  removeLeftovers(path);
  const auto journalled =
      offerRecovery(ProjectDocument::journalPathFor(path),
                    tr("the saved project %1 is opened instead").arg(QFileInfo(path).fileName()));
  showJournalWarning({});
  keepLock(std::move(lock));
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
    connectVideo();
  } else {
    viewer_->setPlaceholder(tr("No video: tags can still be edited in the Footfall lanes."));
    viewer_->setSourceSize({});
    const auto& clip = doc_.annotation().clip;
    const auto count = clip ? clip->last + 1 : 0;
    viewer_->setFrameCount(count);
    lanes_->setFrameCount(count);
  }
  attachCropReader();
  playhead_ = -1;
  seek(0);
  updateTitle();
  if (video_) {
    video_->setStepOnProxy(action(ActionId::stepOnProxy)->isChecked());
    if (video_->startProxyIfAdvised() && video_->proxyBuilding()) showProxyProgress(true);
  }
}

void MainWindow::connectVideo() {
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
}

}  // namespace stridemark::ui
