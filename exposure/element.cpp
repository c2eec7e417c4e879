#include "element.hpp"

#include <algorithm>
#include <array>

namespace crewdose::exposure {
namespace {

// Atomic weights: the values used by the NIST PSTAR/ESTAR programs that implement ICRU Reports
// 37 and 49 (they match the IUPAC standard atomic weights of the 1990s to the digits given).
// Mean excitation energies: ICRU Report 37 (1984), Table 4.3 as adopted by ICRU Report 49 for
// elements (gas-phase value for the gaseous elements H, He, N, O, F, Ar; condensed otherwise).
constexpr std::array kElements{
    Element{1, "H", "hydrogen", 1.00794, 19.2},
    Element{2, "He", "helium", 4.002602, 41.8},
    Element{3, "Li", "lithium", 6.941, 40.0},
    Element{4, "Be", "beryllium", 9.012182, 63.7},
    Element{5, "B", "boron", 10.811, 76.0},
    Element{6, "C", "carbon", 12.0107, 78.0},
    Element{7, "N", "nitrogen", 14.0067, 82.0},
    Element{8, "O", "oxygen", 15.9994, 95.0},
    Element{9, "F", "fluorine", 18.9984032, 115.0},
    Element{10, "Ne", "neon", 20.1797, 137.0},
    Element{11, "Na", "sodium", 22.989770, 149.0},
    Element{12, "Mg", "magnesium", 24.3050, 156.0},
    Element{13, "Al", "aluminium", 26.981538, 166.0},
    Element{14, "Si", "silicon", 28.0855, 173.0},
    Element{15, "P", "phosphorus", 30.973761, 173.0},
    Element{16, "S", "sulfur", 32.065, 180.0},
    Element{17, "Cl", "chlorine", 35.453, 174.0},
    Element{18, "Ar", "argon", 39.948, 188.0},
    Element{19, "K", "potassium", 39.0983, 190.0},
    Element{20, "Ca", "calcium", 40.078, 191.0},
    Element{22, "Ti", "titanium", 47.867, 233.0},
    Element{24, "Cr", "chromium", 51.9961, 257.0},
    Element{25, "Mn", "manganese", 54.938049, 272.0},
    Element{26, "Fe", "iron", 55.845, 286.0},
    Element{28, "Ni", "nickel", 58.6934, 311.0},
    Element{29, "Cu", "copper", 63.546, 322.0},
    Element{74, "W", "tungsten", 183.84, 727.0},
    Element{82, "Pb", "lead", 207.2, 823.0},
};

} // namespace

std::span<const Element> elements() {
    return kElements;
}

std::optional<Element> element_by_Z(int Z) {
    const auto it = std::find_if(kElements.begin(), kElements.end(),
                                 [Z](const Element& e) { return e.Z == Z; });
    if (it == kElements.end()) {
        return std::nullopt;
    }
    return *it;
}

std::optional<Element> element_by_symbol(std::string_view symbol) {
    const auto it = std::find_if(kElements.begin(), kElements.end(),
                                 [symbol](const Element& e) { return e.symbol == symbol; });
    if (it == kElements.end()) {
        return std::nullopt;
    }
    return *it;
}

} // namespace crewdose::exposure
