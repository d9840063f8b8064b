#pragma once
// The desk benchmarks' application: reports the end of every repaint (all dirty widgets painted
// and the window flushed). Qt repaints a window when it handles QEvent::UpdateRequest.
#include <QApplication>
#include <QEvent>
#include <functional>

namespace stridemark::bench {

class RepaintProbeApplication : public QApplication {
 public:
  using QApplication::QApplication;
  std::function<void()> afterRepaint;
  bool notify(QObject* receiver, QEvent* event) override {
    const bool repaint = event->type() == QEvent::UpdateRequest;
    const bool result = QApplication::notify(receiver, event);
    if (repaint && afterRepaint) afterRepaint();
    return result;
  }
};

}  // namespace stridemark::bench
