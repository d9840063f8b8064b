#include "ui/session/video_source.h"

#include <QCoreApplication>
#include <QCryptographicHash>
#include <QDir>
#include <QEvent>
#include <QMetaObject>
#include <QPointer>
#include <QStandardPaths>
#include <algorithm>
#include <cstdio>
#include <cstdlib>

#include "common/error.h"
#include "ui/session/proxy_builder.h"
#include "video/intra_proxy.h"

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

// While the proxy serves the display the source only answers export reads: keep it small.
constexpr std::size_t kIdleSourceBudget = std::size_t{64} << 20;

}  // namespace

VideoSource::VideoSource(const QString& path, const VideoSourceOptions& options, QObject* parent)
    : QObject(parent), path_(path), options_(options) {
  const std::string file = path.toStdString();
  index_ = std::make_shared<const video::FrameIndex>(
      video::FrameIndex::buildOrLoad(file, sidecarFor(path)));
  if (index_->frameCount() == 0) {
    throw Error(ErrorCategory::decode,
                file + ": the file holds no video frames. Choose another video file.");
  }
  info_ = video::describeVideo(file, *index_);
  video::FrameServerOptions serverOptions;
  serverOptions.budgetBytes = options_.budgetBytes;
  server_ = std::make_unique<video::FrameServer>(file, index_, serverOptions);
}

VideoSource::~VideoSource() = default;

video::FrameServer& VideoSource::display() const {
  return displayingProxy() ? *proxyServer_ : *server_;
}

bool VideoSource::proxyAdvised() const {
  const auto frameBytes =
      video::planeLayoutFor(info_.width, info_.height, info_.pixelFormatId).bytes;
  return video::intraProxyAdvised(*index_, options_.budgetBytes, frameBytes);
}

QString VideoSource::proxyPath() const {
  return ProxyBuilder::proxyPathFor(options_.proxyDir, signatureText());
}

bool VideoSource::startProxyIfAdvised() {
  if (proxyServer_ || builder_ || !proxyAdvised()) return false;
  builder_ = std::make_unique<ProxyBuilder>(path_, index_, proxyPath());
  if (auto existing = builder_->reuseExisting()) {
    builder_.reset();
    useProxy(std::move(existing));
    return true;
  }
  connect(builder_.get(), &ProxyBuilder::progressed, this, &VideoSource::proxyProgress);
  connect(builder_.get(), &ProxyBuilder::ready, this,
          [this](std::shared_ptr<const video::FrameIndex> proxyIndex) {
            builder_.release()->deleteLater();  // we are inside its signal
            useProxy(std::move(proxyIndex));
          });
  connect(builder_.get(), &ProxyBuilder::failed, this, [this](const QString& message) {
    builder_.release()->deleteLater();
    emit proxyFailed(message);
  });
  builder_->start();
  return true;
}

void VideoSource::cancelProxy() {
  if (builder_) builder_->cancel();  // failed() follows synchronously
}

bool VideoSource::proxyBuilding() const {
  return builder_ && builder_->running();
}

void VideoSource::useProxy(std::shared_ptr<const video::FrameIndex> proxyIndex) {
  try {
    video::FrameServerOptions serverOptions;
    serverOptions.budgetBytes = options_.budgetBytes;
    proxyServer_ = std::make_unique<video::FrameServer>(proxyPath().toStdString(),
                                                        std::move(proxyIndex), serverOptions);
  } catch (const std::exception& e) {
    emit proxyFailed(tr("Stepping proxy unusable: %1 Stepping uses the source video.")
                         .arg(QString::fromStdString(e.what())));
    return;
  }
  switchDisplay(stepOnProxy_);
  emit proxyReady();
}

void VideoSource::setStepOnProxy(bool on) {
  if (on == stepOnProxy_) return;
  stepOnProxy_ = on;
  if (proxyServer_) switchDisplay(on);
}

void VideoSource::setBudget(std::size_t bytes) {
  options_.budgetBytes = bytes;
  if (proxyServer_) proxyServer_->setBudget(bytes);
  server_->setBudget(sourceBudget(displayingProxy()));
}

// While the proxy is displayed the source serves only export and frameNow(): a small cache.
std::size_t VideoSource::sourceBudget(bool proxyDisplayed) const {
  return proxyDisplayed ? std::min(options_.budgetBytes, kIdleSourceBudget) : options_.budgetBytes;
}

void VideoSource::switchDisplay(bool proxy) {
  dropPrepared();
  server_->setBudget(sourceBudget(proxy));
  // Same frame numbers on both: ask the new display server for the frame the user waits for.
  if (wanted_ >= 0) request(wanted_);
}

std::string VideoSource::signatureText() const {
  return video::signatureText(index_->signature());
}

model::VideoLink VideoSource::link() const {
  model::VideoLink link;
  link.path = path_.toStdString();
  link.signature = signatureText();
  link.frameCount = info_.frameCount;
  link.fileRate = info_.fileRate;
  return link;
}

QImage& VideoSource::recycledImage(QSize size) {
  for (QImage& image : recycled_)
    if (image.size() == size && image.isDetached()) return image;
  // None free at this size: replace one the Viewer does not hold (or the first).
  auto slot = std::find_if(recycled_.begin(), recycled_.end(), [](const QImage& image) {
    return image.isNull() || image.isDetached();
  });
  if (slot == recycled_.end()) slot = recycled_.begin();
  // BGRA bytes are Qt's native 0xffRRGGBB on little-endian machines: the raster engine draws
  // Format_RGB32 without a per-paint conversion (RGBA8888 would be re-premultiplied each time).
  *slot = QImage(size, QImage::Format_RGB32);
  return *slot;
}

QImage VideoSource::toDisplayImage(const video::DecodedFrame& frame) {
  // Frames of either server may arrive (a request made just before a switch): pick the
  // converter by origin, told apart by pixel format.
  video::FrameConverter& converter =
      frame.pixelFormat() == info_.pixelFormatId ? converter_ : proxyConverter_;
  const QSize full(frame.width(), frame.height());
  const bool smaller = displayPixels_.isValid() && displayPixels_.width() < full.width() &&
                       displayPixels_.height() < full.height();
  // Written in place: the slot is the only holder, so bits() and setDevicePixelRatio() do not
  // copy (a local copy of the slot would make bits() detach and copy the whole picture).
  QImage& image = recycledImage(smaller ? displayPixels_ : full);
  const auto stride = static_cast<int>(image.bytesPerLine());
  if (smaller) {
    converter.convertScaled(frame, video::PackedFormat::bgra, image.bits(), stride, image.width(),
                            image.height());
  } else {
    converter.convert(frame, video::PackedFormat::bgra, image.bits(), stride);
  }
  image.setDevicePixelRatio(smaller ? displayRatio_ : 1.0);
  return image;  // shared with the slot from here on
}

void VideoSource::setDisplaySize(QSize pixels, qreal devicePixelRatio) {
  if (pixels == displayPixels_ && devicePixelRatio == displayRatio_) return;
  displayPixels_ = pixels;
  dropPrepared();
  displayRatio_ = devicePixelRatio;
  if (wanted_ >= 0) request(wanted_);
}

void VideoSource::deliver(std::int64_t n, std::shared_ptr<const video::DecodedFrame> frame,
                          std::exception_ptr error) {
  if (n != wanted_) return;  // superseded by a newer request
  if (frame) {
    emit frameReady(n, toDisplayImage(*frame));
    noteShown(n);
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
  auto& server = display();
  if (frame == prepared_.frame) {
    // The picture is ready; the server must still follow the user's step (decode-ahead and
    // backward refills are planned from its playhead, the step pace from its moves).
    server.tryGet(frame);
    showPrepared();
    return;
  }
  dropPrepared();  // a picture made ahead is only ever useful for the very next request
  if (auto cached = server.tryGet(frame)) {
    deliver(frame, std::move(cached), nullptr);
    return;
  }
  QPointer<VideoSource> self(this);
  server.request(frame, [self](std::int64_t n, std::shared_ptr<const video::DecodedFrame> f,
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

namespace {

// Posted below the priority of widget repaints (Qt::LowEventPriority), so the picture of the
// next frame is made after the current one is on screen, never before.
const QEvent::Type kPrepareAhead = static_cast<QEvent::Type>(QEvent::registerEventType());
constexpr int kAfterRepaint = Qt::LowEventPriority - 1;

}  // namespace

void VideoSource::noteShown(std::int64_t frame) {
  previous_ = shown_;
  shown_ = frame;
  if (prepareQueued_) return;
  prepareQueued_ = true;
  QCoreApplication::postEvent(this, new QEvent(kPrepareAhead), kAfterRepaint);
}

bool VideoSource::event(QEvent* event) {
  if (event->type() != kPrepareAhead) return QObject::event(event);
  prepareQueued_ = false;
  prepareAhead();
  return true;
}

void VideoSource::prepareAhead() {
  // Steps and playback move by a few frames; a jump says nothing about the next frame.
  constexpr std::int64_t kLongestStride = 16;  // Shift+arrow steps, 1x playback ticks
  const std::int64_t stride = shown_ - previous_;
  if (previous_ < 0 || stride == 0 || std::abs(stride) > kLongestStride) return;
  const std::int64_t next = shown_ + stride;
  if (next < 0 || next >= info_.frameCount || next == prepared_.frame) return;
  // Only a frame the decoder has ready, looked up without moving the server's playhead: asking
  // would replace the user's request, and a move would count as a (very fast) user step.
  const auto frame = display().peek(next);
  if (!frame) return;
  prepared_ = {next, toDisplayImage(*frame)};
}

void VideoSource::showPrepared() {
  const std::int64_t frame = prepared_.frame;
  const QImage image = std::move(prepared_.image);
  dropPrepared();
  ++preparedShown_;
  emit frameReady(frame, image);
  noteShown(frame);
}

QImage VideoSource::frameNow(std::int64_t frame) {
  const auto decoded = server_->get(frame);
  QImage image(decoded->width(), decoded->height(), QImage::Format_RGB32);
  exportConverter_.convert(*decoded, video::PackedFormat::bgra, image.bits(),
                           static_cast<int>(image.bytesPerLine()));
  return image;
}

}  // namespace stridemark::ui
