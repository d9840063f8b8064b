#include "ui/session/propose_job.h"

#include <QMetaObject>

namespace stridemark::ui {

ProposeJob::ProposeJob(QObject* parent) : QObject(parent) {}

ProposeJob::~ProposeJob() {
  cancel();
  join();
}

void ProposeJob::join() {
  if (worker_.joinable()) worker_.join();
}

bool ProposeJob::start(vision::ProposeRequest request) {
  if (running_) return false;
  join();  // the previous worker has posted its end already
  cancel_ = false;
  reportedPermille_ = -1;
  outcome_ = {};
  running_ = true;
  worker_ =
      std::thread([this, request = std::move(request)]() mutable { run(std::move(request)); });
  return true;
}

void ProposeJob::cancel() {
  cancel_ = true;
}

void ProposeJob::run(vision::ProposeRequest request) {
  Outcome outcome;
  outcome.request = request;
  const auto progress = [this](std::int64_t done, std::int64_t total) {
    // At most one message per 0.1 %: the core may call for every frame.
    const int permille = total > 0 ? static_cast<int>(done * 1000 / total) : 0;
    if (reportedPermille_.exchange(permille) != permille) {
      QMetaObject::invokeMethod(
          this, [this, done, total] { emit progressed(done, total); }, Qt::QueuedConnection);
    }
    return !cancel_.load();
  };
  try {
    outcome.result = vision::propose(request, progress);
  } catch (...) {
    outcome.error = std::current_exception();
  }
  // Cancelled runs end with an error ("cancelled") or, if the cancel came late, a result:
  // either way the person asked for nothing to be stored.
  outcome.cancelled = cancel_.load();
  if (outcome.cancelled) {
    outcome.result.reset();
    outcome.error = nullptr;
  }
  outcome_ = std::move(outcome);
  QMetaObject::invokeMethod(
      this,
      [this] {
        running_ = false;
        join();
        emit finished();
      },
      Qt::QueuedConnection);
}

ProposeJob::Outcome ProposeJob::takeOutcome() {
  return std::move(outcome_);
}

}  // namespace stridemark::ui
