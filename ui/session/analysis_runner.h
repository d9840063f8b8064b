#pragma once
// Reruns analysis off the UI thread after every edit. Bursts coalesce: while one run is busy
// only the newest request waits, older ones are dropped. Results come back as a queued signal
// tagged with the document revision they belong to.
#include <QObject>
#include <condition_variable>
#include <cstdint>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>

#include "analysis/analyse.h"

namespace stridemark::ui {

class AnalysisRunner : public QObject {
  Q_OBJECT
 public:
  explicit AnalysisRunner(QObject* parent = nullptr);
  ~AnalysisRunner() override;

  void request(const model::Annotation& annotation, const analysis::AnalysisOptions& options,
               std::uint64_t revision);
  // Blocks until every request made so far has been answered (tests, export).
  void waitIdle();
  std::uint64_t completedRuns() const;

 signals:
  void finished(std::shared_ptr<const analysis::Report> report, std::uint64_t revision);
  void failed(const QString& message, std::uint64_t revision);

 private:
  struct Job {
    model::Annotation annotation;
    analysis::AnalysisOptions options;
    std::uint64_t revision = 0;
  };
  void loop();

  mutable std::mutex mutex_;
  std::condition_variable wake_, idle_;
  std::optional<Job> pending_;
  bool busy_ = false;
  bool stopping_ = false;
  std::uint64_t runs_ = 0;
  std::thread worker_;  // last: starts after the state above exists
};

}  // namespace stridemark::ui
