#pragma once
// Asked when a clip without a project is opened, before tagging starts: the capture rate (a
// high-speed clip is often stored at a lower file rate, and every time would come out too
// long), the limb set, and tags already made elsewhere (an events CSV) to start from.
#include <QDialog>
#include <QString>
#include <vector>

#include "common/rational.h"
#include "model/annotation.h"
#include "video/video_info.h"

class QComboBox;
class QLabel;
class QLineEdit;

namespace stridemark::ui {

// The answers: what a new project on the clip starts with.
struct ClipSetup {
  Rational captureRate;
  model::LimbSet limbs = model::LimbSet::quadruped();
  int referenceLimb = 0;
  std::vector<model::Event> events;  // from the events CSV, model order
  QString eventsFile;                // empty: nothing imported
};

class NewClipDialog : public QDialog {
  Q_OBJECT
 public:
  // `limbs` is offered first (the set the desk used last); the person may choose another.
  NewClipDialog(const QString& videoPath, const video::VideoInfo& info, const model::LimbSet& limbs,
                QWidget* parent = nullptr);

  // What the dialog starts with: the capture-rate metadata, else the file rate; `limbs`.
  static ClipSetup defaults(const video::VideoInfo& info, const model::LimbSet& limbs);

  // A line above the questions (e.g. why a project beside the clip was not opened).
  void setNote(const QString& note);
  // Reads an events CSV (what Import… does with the chosen file): takes the limb set, capture
  // rate and reference limb the file states; shows what was read or what is wrong with it.
  bool importEvents(const QString& path);
  void clearEvents();

  ClipSetup setup() const { return setup_; }  // after accept()
  void accept() override;

 private:
  void chooseEventsFile();
  void fillReferences(int reference);
  void showDuration();
  Rational enteredRate() const;  // throws Error
  // The chosen CSV read with the rate and limb set as now entered; throws Error.
  std::vector<model::Event> readChosenEvents() const;

  QString videoDir_;
  video::VideoInfo info_;
  QString eventsFile_;
  ClipSetup setup_;
  QLabel *note_, *duration_, *eventsStatus_, *error_;
  QComboBox *rate_, *limbSet_, *reference_;
  QLineEdit* eventsPath_;
};

}  // namespace stridemark::ui
