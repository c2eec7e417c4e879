#include "low_energy_stopping.hpp"

#include "units.hpp"

#include <array>
#include <cmath>

namespace crewdose::exposure {
namespace {

struct ElementProtonRow {
    int Z;
    ProtonFit fit;
};
struct ElementHeliumRow {
    int Z;
    HeliumFit fit;
};

// ICRU Report 49 (1993) proton coefficients, Andersen-Ziegler form; rows not refitted by ICRU 49
// are the Andersen & Ziegler (1977) values. Transcribed from the ICRU 49 table as reproduced in
// the public Geant4 source (G4BraggModel.cc, "ICRU Report 49, 1993. Ziegler's type of
// parametrisations"), checked row by row against the Andersen-Ziegler 1977 table.
constexpr std::array kProtonRows{
    ElementProtonRow{1, {1.254, 1.440, 242.6, 12000.0, 0.1159}},
    ElementProtonRow{2, {1.229, 1.397, 484.5, 5873.0, 0.05225}},
    ElementProtonRow{3, {1.411, 1.600, 725.6, 3013.0, 0.04578}},
    ElementProtonRow{4, {2.248, 2.590, 966.0, 153.8, 0.03475}},
    ElementProtonRow{5, {2.474, 2.815, 1206.0, 1060.0, 0.02855}},
    ElementProtonRow{6, {2.631, 2.601, 1701.0, 1279.0, 0.01638}}, // ICRU 49 amorphous carbon
    ElementProtonRow{7, {2.954, 3.350, 1683.0, 1900.0, 0.02513}},
    ElementProtonRow{8, {2.652, 3.000, 1920.0, 2000.0, 0.02230}},
    ElementProtonRow{9, {2.085, 2.352, 2157.0, 2634.0, 0.01816}},
    ElementProtonRow{10, {1.951, 2.199, 2393.0, 2699.0, 0.01568}},
    ElementProtonRow{11, {2.542, 2.869, 2628.0, 1854.0, 0.01472}},
    ElementProtonRow{12, {3.791, 4.293, 2862.0, 1009.0, 0.01397}},
    ElementProtonRow{13, {4.154, 4.739, 2766.0, 164.5, 0.02023}},
    ElementProtonRow{14, {4.914, 5.598, 3193.0, 232.7, 0.01419}},
    ElementProtonRow{15, {3.232, 3.647, 3561.0, 1560.0, 0.01267}},
    ElementProtonRow{16, {3.447, 3.891, 3792.0, 1219.0, 0.01211}},
    ElementProtonRow{17, {5.301, 6.008, 3969.0, 645.1, 0.01183}},
    ElementProtonRow{18, {5.731, 6.500, 4253.0, 530.0, 0.01123}},
    ElementProtonRow{19, {5.152, 5.833, 4482.0, 545.7, 0.01129}},
    ElementProtonRow{20, {5.521, 6.252, 4710.0, 553.3, 0.01112}},
    ElementProtonRow{22, {4.858, 5.489, 5260.0, 651.1, 0.008930}},
    ElementProtonRow{24, {3.983, 4.489, 5616.0, 1336.0, 0.008413}},
    ElementProtonRow{25, {3.469, 3.907, 5725.0, 1461.0, 0.008829}},
    ElementProtonRow{26, {3.519, 3.963, 6065.0, 1243.0, 0.007782}},
    ElementProtonRow{28, {3.553, 4.004, 6205.0, 555.1, 0.008763}},
    ElementProtonRow{29, {3.696, 4.194, 4649.0, 81.13, 0.02242}},
    ElementProtonRow{74, {4.587, 5.160, 15410.0, 415.3, 0.003406}},
    ElementProtonRow{82, {5.319, 5.982, 17400.0, 586.3, 0.002871}},
};

// ICRU Report 49 helium coefficients (Ziegler 1977 form), same transcription route
// (G4BraggIonModel.cc, "ICRU Report N49, 1993. Ziegler model for He").
constexpr std::array kHeliumRows{
    ElementHeliumRow{1, {0.35485, 0.6456, 6.01525, 20.8933, 4.3515}},
    ElementHeliumRow{2, {0.58, 0.59, 6.3, 130.0, 44.07}},
    ElementHeliumRow{3, {1.42, 0.49, 12.25, 32.0, 9.161}},
    ElementHeliumRow{4, {2.206, 0.51, 15.32, 0.25, 8.995}},
    ElementHeliumRow{5, {3.691, 0.4128, 18.48, 50.72, 9.0}},
    ElementHeliumRow{6, {3.83523, 0.42993, 12.6125, 227.41, 188.97}},
    ElementHeliumRow{7, {1.9259, 0.5550, 27.15125, 26.0665, 6.2768}},
    ElementHeliumRow{8, {2.81015, 0.4759, 50.0253, 10.556, 1.0382}},
    ElementHeliumRow{9, {1.533, 0.531, 40.44, 18.41, 2.718}},
    ElementHeliumRow{10, {2.303, 0.4861, 37.01, 37.96, 5.092}},
    ElementHeliumRow{11, {9.894, 0.3081, 23.65, 0.384, 92.93}},
    ElementHeliumRow{12, {4.3, 0.47, 34.3, 3.3, 12.74}},
    ElementHeliumRow{13, {2.5, 0.625, 45.7, 0.1, 4.359}},
    ElementHeliumRow{14, {2.1, 0.65, 49.34, 1.788, 4.133}},
    ElementHeliumRow{15, {1.729, 0.6562, 53.41, 2.405, 3.845}},
    ElementHeliumRow{16, {1.402, 0.6791, 58.98, 3.528, 3.211}},
    ElementHeliumRow{17, {1.117, 0.7044, 69.69, 3.705, 2.156}},
    ElementHeliumRow{18, {2.291, 0.6284, 73.88, 4.478, 2.066}},
    ElementHeliumRow{19, {8.554, 0.3817, 83.61, 11.84, 1.875}},
    ElementHeliumRow{20, {6.297, 0.4622, 65.39, 10.14, 5.036}},
    ElementHeliumRow{22, {4.71, 0.5087, 65.28, 8.806, 5.948}},
    ElementHeliumRow{24, {6.57, 0.4322, 84.76, 15.53, 2.779}},
    ElementHeliumRow{25, {5.738, 0.4492, 84.6, 14.18, 3.101}},
    ElementHeliumRow{26, {5.013, 0.4707, 85.8, 16.55, 3.211}},
    ElementHeliumRow{28, {4.652, 0.4571, 80.73, 22.0, 4.952}},
    ElementHeliumRow{29, {3.114, 0.5236, 76.67, 7.62, 6.385}},
    ElementHeliumRow{74, {6.335, 0.4825, 255.1, 2.834, 0.8228}},
    ElementHeliumRow{82, {6.18, 0.52, 170.0, 4.0, 3.224}},
};

} // namespace

double ProtonFit::cross_section(double T) const noexcept {
    if (T < 10.0) {
        return a1 * std::sqrt(T);
    }
    const double s_low = a2 * std::pow(T, 0.45);
    const double s_high = (a3 / T) * std::log(1.0 + a4 / T + a5 * T);
    return s_low * s_high / (s_low + s_high);
}

double HeliumFit::cross_section(double T) const noexcept {
    const double s_low = a1 * std::pow(1000.0 * T, a2);
    const double s_high = (a3 / T) * std::log(1.0 + a4 / T + a5 * T);
    return s_low * s_high / (s_low + s_high);
}

std::optional<ProtonFit> proton_fit_for_element(int Z) {
    for (const auto& row : kProtonRows) {
        if (row.Z == Z) {
            return row.fit;
        }
    }
    return std::nullopt;
}

std::optional<HeliumFit> helium_fit_for_element(int Z) {
    for (const auto& row : kHeliumRows) {
        if (row.Z == Z) {
            return row.fit;
        }
    }
    return std::nullopt;
}

double cross_section_to_mass_stopping(double cross_section_eV_1e15,
                                      double molar_mass_g_mol) noexcept {
    return cross_section_eV_1e15 * 1e-21 * kAvogadro_per_mol / molar_mass_g_mol;
}

} // namespace crewdose::exposure
