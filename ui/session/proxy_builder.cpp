#include "ui/session/proxy_builder.h"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QStandardPaths>

#include "common/error.h"
#include "video/intra_proxy.h"

namespace stridemark::ui {

namespace {
constexpr int kPollMs = 100;  // progress updates ten times a second are smooth enough
}

ProxyBuilder::ProxyBuilder(QString sourcePath, std::shared_ptr<const video::FrameIndex> sourceIndex,
                           QString proxyPath, QObject* parent)
    : QObject(parent),
      sourcePath_(std::move(sourcePath)),
      sourceIndex_(std::move(sourceIndex)),
      proxyPath_(std::move(proxyPath)) {
  pollTimer_.setInterval(kPollMs);
  connect(&pollTimer_, &QTimer::timeout, this, &ProxyBuilder::poll);
}

ProxyBuilder::~ProxyBuilder() {
  if (job_) {
    job_.reset();  // cancels and joins; the job removes its partial file
    removeLeftovers();
  }
}

QString ProxyBuilder::proxyPathFor(const QString& dir, const std::string& signatureText) {
  const QString base = dir.isEmpty()
                           ? QStandardPaths::writableLocation(QStandardPaths::CacheLocation) +
                                 QStringLiteral("/proxy")
                           : dir;
  return base + QLatin1Char('/') + QString::fromStdString(signatureText) +
         QStringLiteral(".proxy.avi");
}

std::shared_ptr<const video::FrameIndex> ProxyBuilder::reuseExisting() {
  if (!QFile::exists(proxyPath_)) return nullptr;
  try {
    auto index = std::make_shared<const video::FrameIndex>(
        video::FrameIndex::build(proxyPath_.toStdString()));
    if (index->frameCount() == sourceIndex_->frameCount() && index->isIntraOnly()) return index;
  } catch (const Error&) {
    // Unreadable: fall through and rebuild it.
  }
  QFile::remove(proxyPath_);  // stale (other frame count) or damaged
  return nullptr;
}

void ProxyBuilder::start() {
  if (job_) return;
  QDir().mkpath(QFileInfo(proxyPath_).absolutePath());
  job_ = std::make_unique<video::IntraProxyJob>(sourcePath_.toStdString(), sourceIndex_,
                                                proxyPath_.toStdString());
  pollTimer_.start();
  emit progressed(0);
}

double ProxyBuilder::progress() const {
  return job_ ? job_->progress() : 0.0;
}

void ProxyBuilder::cancel() {
  if (!job_) return;
  pollTimer_.stop();
  job_.reset();  // cancels and joins (one frame's work at most)
  removeLeftovers();
  emit failed(tr("Stepping proxy cancelled; stepping uses the source video."));
}

void ProxyBuilder::poll() {
  if (!job_) return;
  if (!job_->finished()) {
    emit progressed(job_->progress());
    return;
  }
  pollTimer_.stop();
  std::shared_ptr<const video::FrameIndex> index;
  QString error;
  try {
    index = job_->wait();
  } catch (const std::exception& e) {
    error = QString::fromStdString(e.what());
  }
  job_.reset();
  if (index) {
    emit ready(std::move(index));
  } else {
    removeLeftovers();  // e.g. the disk filled up mid-write
    emit failed(tr("Stepping proxy not built: %1 Stepping uses the source video.").arg(error));
  }
}

void ProxyBuilder::removeLeftovers() const {
  // buildIntraProxy writes to "<proxy>.part.avi" and renames it when verified.
  QFile::remove(proxyPath_ + QStringLiteral(".part.avi"));
  QFile::remove(proxyPath_);
}

}  // namespace stridemark::ui
