#include "planner/report/cautions.hpp"

namespace crewdose::planner {

std::string caution_text() {
    return "Cautions: crewdose is a planning tool. Any limit it shows is a planning value; the\n"
           "limits that apply to a crew come from the responsible agency. These results support,\n"
           "and never replace, review by licensed radiation-protection staff.\n";
}

} // namespace crewdose::planner
