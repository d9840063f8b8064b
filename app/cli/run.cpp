#include "cli/run.h"

#include "cli/arguments.h"

#include <exception>
#include <iostream>
#include <string>

#include "common/caution.h"
#include "common/error.h"
#include "stridemark/version.h"

namespace stridemark::cli {

int runVerbs(int argc, char** argv, std::span<const AddVerb> verbs) {
  CLI::App app{std::string("stridemark - score animal locomotion from video tags (headless part of "
                           "Stridemark).\n") +
               std::string(kCaution)};
  app.set_version_flag("--version", std::string("stridemark ") + kVersion);
  app.require_subcommand(1);
  VerbAction action;
  for (const AddVerb addVerb : verbs) addVerb(app, action);  // in the order `--help` lists them

  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    // CLI11 quotes the value it refused; a 300-digit number must not flood the terminal.
    std::cerr << withLongWordsCut(e.what()) << "\nRun with --help for more information.\n";
    return kExitUsage;
  }
  // The one place where core errors reach the user.
  try {
    return action ? action() : kExitUsage;
  } catch (const UsageProblem& problem) {
    std::cerr << "stridemark: " << problem.message << '\n';
    return kExitUsage;
  } catch (const Error& e) {
    std::cerr << "stridemark: " << e.what() << '\n';
    return kExitBadInput;
  } catch (const std::exception& e) {
    std::cerr << "stridemark: internal error: " << e.what()
              << "\nPlease report this with the command line and input that caused it.\n";
    return kExitInternal;
  }
}

}  // namespace stridemark::cli
