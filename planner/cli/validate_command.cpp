// The validate command: the scenario checked as check would accept it, no dose computed.
#include "planner/cli/command.hpp"
#include "planner/report/check_report.hpp"
#include "planner/scenario/scenario.hpp"

#include <memory>
#include <string>

namespace crewdose::cli {

Command add_validate_command(CLI::App& app) {
    struct Options {
        std::string scenario_path;
        bool allow_gaps = false;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& scenario_path = o->scenario_path;
        auto& allow_gaps = o->allow_gaps;
        auto* validate = app.add_subcommand(
            "validate",
            "Parse and check a scenario file, without computing any dose, and list what "
            "it defines. It accepts exactly the files 'check' accepts: every section, "
            "key and reference, the solids against overlaps, each dose point against "
            "the walls, shielding tables read, and each crew member's timeline covering "
            "the mission (gaps refused unless --allow-gaps, as in 'check').\nExit 0: "
            "valid; 2: not valid (the message names the file, line and key).");
        validate->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
        validate->add_flag("--allow-gaps", allow_gaps,
                           "accept gaps in a crew member's timeline, as 'check --allow-gaps' does");

        return validate;
    }();
    return {sub, [o] {
                auto& scenario_path = o->scenario_path;
                auto& allow_gaps = o->allow_gaps;
                const auto sc = planner::load_scenario(scenario_path);
                if (!allow_gaps) {
                    planner::refuse_timeline_gaps(sc);
                }
                write_stdout(planner::format_validation(sc));
                return 0;
            }};
}

} // namespace crewdose::cli
