// Verbs that have a new name: the old word is still recognised, and refused with the new one named
// (as the scene reader refuses a renamed key), so a script written for the old name fails clearly.
#include <cstdio>
#include <string>

#include "commands.h"

namespace yeegap::cli {

void add_renamed_verb(CLI::App& app, int& exit_code, const std::string& old_verb, const std::string& new_verb) {
  CLI::App* cmd = app.add_subcommand(old_verb, "now '" + new_verb + "'");
  cmd->group("");           // not listed in --help
  cmd->set_help_flag();     // `yeegap OLD --help` gets the message too, not an empty help page
  cmd->allow_extras();      // the old verb's options are the new one's: accept any, say the new word
  const std::string message = "yeegap: the verb '" + old_verb + "' is now '" + new_verb +
                              "' (same options): yeegap " + new_verb + " ...\n";
  cmd->callback([message, &exit_code] {
    std::fputs(message.c_str(), stderr);
    exit_code = exit_user_error;
  });
}

}  // namespace yeegap::cli
