#include "ui/document/project_lock.h"

#include <fcntl.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <unistd.h>

#include <QDateTime>
#include <QDir>
#include <QFileInfo>
#include <QSysInfo>
#include <cerrno>
#include <cstring>

#include "common/error.h"

namespace stridemark::ui {

namespace {

// "pid=123 host=lab-3 since=2026-12-04T18:50:02Z": who holds the lock, for the refusal message.
QByteArray holderNote() {
  return QStringLiteral("pid=%1 host=%2 since=%3\n")
      .arg(::getpid())
      .arg(QSysInfo::machineHostName(), QDateTime::currentDateTimeUtc().toString(Qt::ISODate))
      .toUtf8();
}

QString readNote(int fd) {
  char buffer[512] = {};
  const ssize_t got = ::pread(fd, buffer, sizeof buffer - 1, 0);
  return got > 0 ? QString::fromUtf8(buffer, static_cast<qsizetype>(got)).trimmed() : QString();
}

// After a holder removes its lock file, a waiter may lock the removed file: only a lock on
// the file the path names now counts.
bool lockIsOnCurrentFile(int fd, const QByteArray& path) {
  struct stat locked {
  }, named{};
  return ::fstat(fd, &locked) == 0 && ::stat(path.constData(), &named) == 0 &&
         locked.st_dev == named.st_dev && locked.st_ino == named.st_ino;
}

[[noreturn]] void refuse(const QString& guarded, const QString& note) {
  throw Error(ErrorCategory::io,
              QStringLiteral("%1 is open in another Stridemark desk (%2). Two windows on one "
                             "project would overwrite each other's edits, so this window does "
                             "not open it. Close it in the other window first; if that desk is "
                             "hung, end its process (the lock goes with it).")
                  .arg(guarded, note.isEmpty() ? QStringLiteral("it is just starting") : note)
                  .toStdString());
}

}  // namespace

std::unique_ptr<ProjectLock> ProjectLock::acquire(const QString& projectOrVideoPath) {
  const QString guarded = normalPath(projectOrVideoPath);
  const QByteArray path = pathFor(guarded).toLocal8Bit();
  for (int attempt = 0; attempt < 5; ++attempt) {
    const int fd = ::open(path.constData(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
    if (fd < 0) {
      if (errno == EACCES || errno == EROFS || errno == EPERM)
        return std::unique_ptr<ProjectLock>(new ProjectLock(guarded, -1));
      throw Error(ErrorCategory::io, QStringLiteral("%1: cannot create the project lock (%2)")
                                         .arg(QString::fromLocal8Bit(path),
                                              QString::fromLocal8Bit(std::strerror(errno)))
                                         .toStdString());
    }
    if (::flock(fd, LOCK_EX | LOCK_NB) != 0) {
      const QString note = readNote(fd);
      ::close(fd);
      refuse(guarded, note);
    }
    if (!lockIsOnCurrentFile(fd, path)) {
      ::close(fd);
      continue;
    }
    const QByteArray note = holderNote();
    if (::ftruncate(fd, 0) == 0) {
      [[maybe_unused]] const ssize_t wrote = ::pwrite(fd, note.constData(), note.size(), 0);
    }
    return std::unique_ptr<ProjectLock>(new ProjectLock(guarded, fd));
  }
  refuse(guarded, QString());
}

QString ProjectLock::normalPath(const QString& path) {
  return QDir::cleanPath(QFileInfo(path).absoluteFilePath());
}

ProjectLock::~ProjectLock() {
  if (fd_ < 0) return;
  ::unlink(pathFor(guarded_).toLocal8Bit().constData());
  ::close(fd_);
}

}  // namespace stridemark::ui
