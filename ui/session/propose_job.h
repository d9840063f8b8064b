#pragma once
// Proposes events from the video (vision::propose, issue 18) on a worker thread so the desk
// stays responsive: progress comes back to the UI thread now and then, Cancel makes the
// progress callback return false, and the end (result, error or cancel) is one finished()
// signal; takeOutcome() then says which. The core's errors are carried as they were thrown,
// for the desk's one error path (runGuarded) to show.
#include <QObject>
#include <atomic>
#include <cstdint>
#include <exception>
#include <optional>
#include <thread>

#include "vision/propose.h"

namespace stridemark::ui {

class ProposeJob : public QObject {
  Q_OBJECT
 public:
  struct Outcome {
    vision::ProposeRequest request;
    std::optional<vision::ProposeResult> result;
    std::exception_ptr error;  // what propose() threw, unless cancelled
    bool cancelled = false;
  };

  explicit ProposeJob(QObject* parent = nullptr);
  ~ProposeJob() override;  // cancels a running job and waits for it

  // False (and nothing started) while another run is going.
  bool start(vision::ProposeRequest request);
  void cancel();
  bool running() const { return running_; }
  bool cancelRequested() const { return cancel_; }
  // After finished(): how the run ended (moves it out).
  Outcome takeOutcome();

 signals:
  void progressed(qint64 done, qint64 total);
  void finished();

 private:
  void run(vision::ProposeRequest request);
  void join();

  std::atomic<bool> cancel_{false};
  std::atomic<int> reportedPermille_{-1};
  bool running_ = false;
  Outcome outcome_;  // written by the worker before it posts finished, read after
  std::thread worker_;
};

}  // namespace stridemark::ui
