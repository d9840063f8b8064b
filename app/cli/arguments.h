#pragma once
// Strict reading of command-line values and the checks every verb shares: inputs must be
// regular files, outputs must not replace an input, quoted values stay short.
#include <cstdint>
#include <filesystem>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include <CLI/CLI.hpp>

namespace stridemark::cli {

// A flag or argument that does not fit (exit 2, like other usage errors).
struct UsageProblem {
  std::string message;
};

// `text` in single quotes, cut to its first 40 characters (with its length) when longer, so a
// 300-digit number cannot flood a message.
std::string shownValue(std::string_view text);

// The same without the quotes.
std::string shortened(std::string_view text);

// A CLI11 message with every word longer than 120 characters cut to its first 40 (paths stay
// whole; a runaway number does not).
std::string withLongWordsCut(std::string_view message);

// "3, 17, 40": the first 20 frames of a list for a message, then how many more.
std::string frameList(const std::vector<std::int64_t>& frames);

// A frame number: decimal digits only, 0 up to 2^63 - 1. No sign, no hex, no exponent, no
// spaces. Throws UsageProblem naming `flag` and the value.
std::int64_t parseFrameNumber(std::string_view text, std::string_view flag);

// CLI11 check from a parse function that throws stridemark::Error or UsageProblem.
std::function<std::string(const std::string&)> checkedBy(
    std::function<void(const std::string&)> parse);

// CLI11 check for an input file: a FIFO, device, socket or folder is refused at once (reading a
// FIFO would wait for a writer forever). A missing file passes: the verb says it is missing.
CLI::Validator regularFileInput();

// CLI11 check for a path option that must not be empty (`--json ""`).
CLI::Validator nonEmptyPath(std::string what);

// One input the command reads and must never replace.
struct NamedInput {
  std::string role;  // "the input", "the project's video"
  std::filesystem::path path;
};

// Throws UsageProblem when `output` is one of `inputs`: the same file by device and inode, so
// also through a symlink or a hard link. `flag` names the output in the message ("--json").
void refuseToReplaceInputs(const std::filesystem::path& output, std::string_view flag,
                           const std::vector<NamedInput>& inputs);

}  // namespace stridemark::cli
