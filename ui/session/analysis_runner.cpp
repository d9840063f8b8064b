#include "ui/session/analysis_runner.h"

#include <QMetaObject>
#include <exception>

#include "common/error.h"

namespace stridemark::ui {

AnalysisRunner::AnalysisRunner(QObject* parent) : QObject(parent), worker_([this] { loop(); }) {
  qRegisterMetaType<std::shared_ptr<const analysis::Report>>();
  qRegisterMetaType<std::uint64_t>("std::uint64_t");
}

AnalysisRunner::~AnalysisRunner() {
  {
    std::lock_guard lock(mutex_);
    stopping_ = true;
  }
  wake_.notify_all();
  worker_.join();
}

void AnalysisRunner::request(const model::Annotation& annotation,
                             const analysis::AnalysisOptions& options, std::uint64_t revision) {
  {
    std::lock_guard lock(mutex_);
    pending_ = Job{annotation, options, revision};  // replaces any older waiting job
  }
  wake_.notify_one();
}

void AnalysisRunner::waitIdle() {
  std::unique_lock lock(mutex_);
  idle_.wait(lock, [this] { return !pending_ && !busy_; });
}

std::uint64_t AnalysisRunner::completedRuns() const {
  std::lock_guard lock(mutex_);
  return runs_;
}

void AnalysisRunner::loop() {
  std::unique_lock lock(mutex_);
  for (;;) {
    wake_.wait(lock, [this] { return stopping_ || pending_; });
    if (stopping_) return;
    Job job = std::move(*pending_);
    pending_.reset();
    busy_ = true;
    lock.unlock();
    std::shared_ptr<const analysis::Report> report;
    QString error;
    try {
      report =
          std::make_shared<const analysis::Report>(analysis::analyse(job.annotation, job.options));
    } catch (const Error& e) {
      error = QString::fromStdString(e.what());
    } catch (const std::exception& e) {
      error = QStringLiteral("Internal analysis error: %1").arg(QString::fromUtf8(e.what()));
    }
    const auto revision = job.revision;
    // Deliver on the runner's own (UI) thread.
    QMetaObject::invokeMethod(
        this,
        [this, report, error, revision] {
          if (report) {
            emit finished(report, revision);
          } else {
            emit failed(error, revision);
          }
        },
        Qt::QueuedConnection);
    lock.lock();
    busy_ = false;
    ++runs_;
    if (!pending_) idle_.notify_all();
  }
}

}  // namespace stridemark::ui
