#include "planner/report/cautions.hpp"

#include <algorithm>

namespace crewdose::planner {

std::string caution_text() {
    return "Cautions: crewdose is a planning tool. Any limit it shows is a planning value; the\n"
           "limits that apply to a crew come from the responsible agency. These results support,\n"
           "and never replace, review by licensed radiation-protection staff.\n";
}

std::string chart_caution_note() {
    std::string cautions = caution_text();
    std::replace(cautions.begin(), cautions.end(), '\n', ' ');
    return cautions + "A dose that was not computed is never drawn as a value: its line breaks and "
                      "the stretch is marked \"not computed\".";
}

} // namespace crewdose::planner
