#pragma once
// Each verb adds its subcommand to the app. When the subcommand is parsed, it stores in
// `action` the work to run; main runs it inside the one place that catches errors.
#include <functional>

#include <CLI/CLI.hpp>

namespace stridemark::cli {

using VerbAction = std::function<int()>;

// One line per verb (each defined in app/cli/verb_<name>.cpp):
void addProbeVerb(CLI::App& app, VerbAction& action);
void addFrameVerb(CLI::App& app, VerbAction& action);
void addScoreVerb(CLI::App& app, VerbAction& action);
void addSynthVerb(CLI::App& app, VerbAction& action);
void addExportVerb(CLI::App& app, VerbAction& action);
void addSuggestVerb(CLI::App& app, VerbAction& action);

}  // namespace stridemark::cli
