#include "ui/app/video_source.h"

#include <QCryptographicHash>
#include <QDir>
#include <QMetaObject>
#include <QPointer>
#include <QStandardPaths>
#include <cstdio>

#include "common/error.h"

namespace stridemark::ui {

namespace {

// Index sidecars go to the user's cache folder: the video's own folder may be read-only.
std::string sidecarFor(const QString& videoPath) {
  const QString dir =
      QStandardPaths::writableLocation(QStandardPaths::CacheLocation) + QStringLiteral("/index");
  QDir().mkpath(dir);
  const auto key = QCryptographicHash::hash(videoPath.toUtf8(), QCryptographicHash::Sha1).toHex();
  return (dir + QLatin1Char('/') + QString::fromLatin1(key) + QStringLiteral(".smindex"))
      .toStdString();
}

}  // namespace

VideoSource::VideoSource(const QString& path, QObject* parent) : QObject(parent), path_(path) {
  const std::string file = path.toStdString();
  index_ = std::make_shared<const video::FrameIndex>(
      video::FrameIndex::buildOrLoad(file, sidecarFor(path)));
  if (index_->frameCount() == 0) {
    throw Error(ErrorCategory::decode,
                file + ": the file holds no video frames. Choose another video file.");
  }
  info_ = video::describeVideo(file, *index_);
  server_ = std::make_unique<video::FrameServer>(file, index_);
}

VideoSource::~VideoSource() = default;

std::string VideoSource::signatureText(const video::VideoSignature& s) {
  char text[64];
  std::snprintf(
      text, sizeof text, "%llu-%016llx-%016llx", static_cast<unsigned long long>(s.fileSize),
      static_cast<unsigned long long>(s.headHash), static_cast<unsigned long long>(s.tailHash));
  return text;
}

std::string VideoSource::signatureText() const {
  return signatureText(index_->signature());
}

model::VideoLink VideoSource::link() const {
  model::VideoLink link;
  link.path = path_.toStdString();
  link.signature = signatureText();
  link.frameCount = info_.frameCount;
  link.fileRate = info_.fileRate;
  return link;
}

QImage VideoSource::toImage(const video::DecodedFrame& frame) {
  // BGRA bytes are Qt's native 0xffRRGGBB on little-endian machines: the raster engine draws
  // Format_RGB32 without a per-paint conversion (RGBA8888 would be re-premultiplied each time).
  QImage image(frame.width(), frame.height(), QImage::Format_RGB32);
  converter_.convert(frame, video::PackedFormat::bgra, image.bits(),
                     static_cast<int>(image.bytesPerLine()));
  return image;
}

void VideoSource::deliver(std::int64_t n, std::shared_ptr<const video::DecodedFrame> frame,
                          std::exception_ptr error) {
  if (n != wanted_) return;  // superseded by a newer request
  if (frame) {
    emit frameReady(n, toImage(*frame));
  } else if (error) {
    try {
      std::rethrow_exception(error);
    } catch (const std::exception& e) {
      emit frameFailed(n, QString::fromStdString(e.what()));
    }
  }
}

void VideoSource::request(std::int64_t frame) {
  wanted_ = frame;
  if (auto cached = server_->tryGet(frame)) {
    deliver(frame, std::move(cached), nullptr);
    return;
  }
  QPointer<VideoSource> self(this);
  server_->request(frame, [self](std::int64_t n, std::shared_ptr<const video::DecodedFrame> f,
                                 std::exception_ptr e) {
    if (!f && !e) return;  // cancelled by a newer request
    // Runs on the decode worker: hop to the UI thread before touching anything.
    QMetaObject::invokeMethod(
        self.data(),
        [self, n, f = std::move(f), e] {
          if (self) self->deliver(n, f, e);
        },
        Qt::QueuedConnection);
  });
}

QImage VideoSource::frameNow(std::int64_t frame) {
  return toImage(*server_->get(frame));
}

}  // namespace stridemark::ui
