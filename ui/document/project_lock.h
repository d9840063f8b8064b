#pragma once
// One desk window owns a project at a time. The owner holds `<project>.smlock` beside the
// project (beside the clip while unsaved, like the journal) with flock() for as long as it has
// the project open; a second window refuses the project and names the holder. The kernel drops
// a flock when its holder dies, so a crashed desk never blocks the next one.
#include <QString>
#include <memory>

namespace stridemark::ui {

class ProjectLock {
 public:
  inline static const QString kSuffix = QStringLiteral(".smlock");
  static QString pathFor(const QString& projectOrVideoPath) { return projectOrVideoPath + kSuffix; }
  // One spelling per file (absolute, no "." or ".."), so a window knows its own lock.
  static QString normalPath(const QString& path);

  // Takes the lock for `projectOrVideoPath`, or throws stridemark::Error(io) naming the project
  // and the process that holds it. In a folder where no lock file can be made (read-only
  // media) the returned lock is not held: no other desk can write there either.
  static std::unique_ptr<ProjectLock> acquire(const QString& projectOrVideoPath);
  ~ProjectLock();  // removes the lock file, then lets go
  ProjectLock(const ProjectLock&) = delete;
  ProjectLock& operator=(const ProjectLock&) = delete;

  // The absolute path of the project or clip this lock guards.
  QString guarded() const { return guarded_; }
  bool held() const { return fd_ >= 0; }

 private:
  ProjectLock(QString guarded, int fd) : guarded_(std::move(guarded)), fd_(fd) {}
  QString guarded_;
  int fd_ = -1;
};

}  // namespace stridemark::ui
