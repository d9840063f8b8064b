// The stepping proxy of long-GOP clips as the window shows it: a progress bar and a Cancel
// button in the status bar while it builds, and a message when it is ready or failed.
#include <QAction>
#include <QProgressBar>
#include <QPushButton>
#include <QStatusBar>

#include "ui/main_window.h"

namespace stridemark::ui {

void MainWindow::buildProxyStatus() {
  proxyBar_ = new QProgressBar;
  proxyBar_->setAccessibleName(tr("Stepping proxy progress"));
  proxyBar_->setRange(0, 1000);
  proxyBar_->setFormat(tr("Building stepping proxy %p%"));
  proxyBar_->setMaximumWidth(proxyBar_->fontMetrics().horizontalAdvance(proxyBar_->format()) * 2);
  proxyCancel_ = new QPushButton(tr("Cancel"));
  proxyCancel_->setAccessibleName(tr("Cancel stepping proxy"));
  proxyCancel_->setToolTip(tr("Stop building the stepping proxy; stepping uses the source video"));
  proxyCancel_->setFocusPolicy(Qt::StrongFocus);
  connect(proxyCancel_, &QPushButton::clicked, this, &MainWindow::cancelProxyBuild);
  statusBar()->addPermanentWidget(proxyBar_);
  statusBar()->addPermanentWidget(proxyCancel_);
  showProxyProgress(false);
}

void MainWindow::showProxyProgress(bool on) {
  proxyBar_->setVisible(on);
  proxyCancel_->setVisible(on);
  if (auto* cancel = action(ActionId::cancelProxy)) cancel->setEnabled(on);
  if (on) proxyBar_->setValue(0);
}

void MainWindow::connectProxySignals() {
  connect(video_.get(), &VideoSource::proxyProgress, this,
          [this](double f) { proxyBar_->setValue(static_cast<int>(f * 1000)); });
  connect(video_.get(), &VideoSource::proxyReady, this, [this] {
    showProxyProgress(false);
    statusBar()->showMessage(tr("Stepping proxy ready: backward steps are now as quick as forward "
                                "ones (export still reads the source)."),
                             8000);
    updateStatus();
  });
  connect(video_.get(), &VideoSource::proxyFailed, this, [this](const QString& message) {
    showProxyProgress(false);
    statusBar()->showMessage(message, 10000);
    updateStatus();
  });
}

void MainWindow::cancelProxyBuild() {
  if (video_) video_->cancelProxy();
}

}  // namespace stridemark::ui
