#pragma once
// Shared pieces of the export tests: a small clip made by the ffmpeg CLI, an invented trot
// project that links it, and running commands.
#include <filesystem>
#include <string>

#include "model/annotation.h"

namespace stridemark::testing {

struct CommandResult {
  int exitCode = -1;
  std::string out;  // stdout and stderr together
};

// Runs `command` through /bin/sh, capturing stdout and stderr.
CommandResult run(const std::string& command);

// A fresh empty folder under the build tree for one test.
std::filesystem::path freshFolder(const std::string& name);

// 320x240, `frames` frames at 240 fps, H.264 yuv420p, made with ffmpeg's testsrc2.
void makeClip(const std::filesystem::path& path, int frames);

// Invented quadruped trot (period 48 frames, duty factor 0.54, diagonal pairs together),
// starting at frame 5 with LH in stance already (a clip that starts mid-stance).
model::Project trotProject(const std::string& videoPath, std::int64_t frameCount);

// Starts an offscreen QApplication once per process (fonts, painting and the dialog need one).
void ensureQt();

std::string stridemarkBinary();
std::string readText(const std::filesystem::path& path);

}  // namespace stridemark::testing
