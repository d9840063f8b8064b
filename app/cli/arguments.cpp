#include "cli/arguments.h"

#include <charconv>
#include <limits>

#include "common/error.h"
#include "formats/file_io.h"

namespace stridemark::cli {

namespace {

constexpr std::size_t kShown = 40;

std::string cut(std::string_view text) {
  return std::string(text.substr(0, kShown)) + "...(" + std::to_string(text.size()) +
         " characters)";
}

}  // namespace

std::string shortened(std::string_view text) {
  return text.size() <= kShown ? std::string(text) : cut(text);
}

std::string shownValue(std::string_view text) {
  if (text.size() <= kShown) return "'" + std::string(text) + "'";
  return "'" + cut(text) + "'";
}

std::string withLongWordsCut(std::string_view message) {
  constexpr std::size_t kLongest = 120;  // paths stay whole, runaway numbers do not
  std::string result;
  std::size_t pos = 0;
  while (pos < message.size()) {
    const std::size_t end = std::min(message.find_first_of(" \n\t", pos), message.size());
    const std::string_view word = message.substr(pos, end - pos);
    result += word.size() > kLongest ? cut(word) : std::string(word);
    if (end < message.size()) result += message[end];
    pos = end + 1;
  }
  return result;
}

std::string frameList(const std::vector<std::int64_t>& frames) {
  std::string text;
  for (std::size_t i = 0; i < frames.size() && i < 20; ++i)
    text += (i ? ", " : "") + std::to_string(frames[i]);
  if (frames.size() > 20) text += " and " + std::to_string(frames.size() - 20) + " more";
  return text;
}

std::int64_t parseFrameNumber(std::string_view text, std::string_view flag) {
  const std::string what = std::string(flag) + " " + shownValue(text) + ": ";
  if (text.empty()) throw UsageProblem{what + "give a frame number (0, 1, 2, ...)"};
  if (text.front() == '-' && text.size() > 1) {
    throw UsageProblem{what + "frame numbers count from 0 at the clip's first frame"};
  }
  for (const char c : text) {
    if (c < '0' || c > '9') {
      throw UsageProblem{what +
                         "a frame number is written with the digits 0-9 only (no sign, "
                         "hex, decimals or exponent)"};
    }
  }
  std::int64_t value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec == std::errc::result_out_of_range || end != text.data() + text.size()) {
    throw UsageProblem{what + "too large; frame numbers go up to " +
                       std::to_string(std::numeric_limits<std::int64_t>::max())};
  }
  return value;
}

std::function<std::string(const std::string&)> checkedBy(
    std::function<void(const std::string&)> parse) {
  return [parse = std::move(parse)](const std::string& value) -> std::string {
    try {
      parse(value);
      return {};
    } catch (const Error& e) {
      return e.what();
    } catch (const UsageProblem& problem) {
      return problem.message;
    }
  };
}

CLI::Validator regularFileInput() {
  return CLI::Validator(
      [](std::string& value) -> std::string {
        const std::string kind = formats::nonRegularKind(value);
        if (kind.empty()) return {};
        return shownValue(value) + " is " + kind +
               ", not a regular file — stridemark reads whole files; save the data to a file "
               "and give its path";
      },
      "FILE");
}

CLI::Validator nonEmptyPath(std::string what) {
  return CLI::Validator(
      [what](std::string& value) -> std::string {
        return value.empty() ? "is empty — give " + what : std::string();
      },
      "PATH");
}

void refuseToReplaceInputs(const std::filesystem::path& output, std::string_view flag,
                           const std::vector<NamedInput>& inputs) {
  const auto written = formats::fileIdentity(output);
  if (!written) return;  // a new file replaces nothing
  for (const NamedInput& input : inputs) {
    if (formats::fileIdentity(input.path) != written) continue;
    std::string message =
        std::string(flag) + " " + output.string() + " is " + input.role + " " + input.path.string();
    if (output != input.path) message += " (the same file under another name or through a link)";
    throw UsageProblem{message + ": writing there would replace it — give another output path"};
  }
}

}  // namespace stridemark::cli
