#pragma once
// Reading crewdose's SVG output back in tests: a minimal well-formedness check (the subset of
// XML the writer uses: a declaration, elements, attributes in double quotes, text, the five
// predefined entities), and the helpers that find what a reader of the chart would see.
#include <cmath>
#include <cstdlib>
#include <map>
#include <set>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace svg_check {

/// One element's start tag: its name, attributes and, for <text>, its text.
struct Element {
    std::string name;
    std::map<std::string, std::string> attributes;
    std::string text;
    std::vector<std::string> open;    ///< names of the elements it lies in, outermost first
    std::vector<std::string> classes; ///< their class attributes ("" without one)
};

inline bool is_name_char(char c) {
    return std::isalnum(static_cast<unsigned char>(c)) != 0 || c == '-' || c == '_' || c == ':' ||
           c == '.';
}

/// True when every '&' of `s` starts one of the five predefined entities.
inline bool entities_ok(const std::string& s) {
    for (std::size_t at = s.find('&'); at != std::string::npos; at = s.find('&', at + 1)) {
        bool ok = false;
        for (const char* e : {"&amp;", "&lt;", "&gt;", "&quot;", "&apos;"}) {
            ok = ok || s.compare(at, std::string(e).size(), e) == 0;
        }
        if (!ok) {
            return false;
        }
    }
    return true;
}

/// The elements of `xml` in document order; std::runtime_error saying what is wrong when it
/// is not well-formed: a tag that does not close or closes the wrong element, an attribute
/// without a quoted value or twice on one element, a '<' in a value, an '&' that starts no
/// entity, text outside the root, more than one root.
inline std::vector<Element> parse(const std::string& xml) {
    std::vector<Element> elements;
    std::vector<std::string> open;
    std::vector<std::string> classes;
    std::size_t text_target = std::string::npos; // the element whose text follows, if any
    std::size_t roots = 0;
    std::size_t i = 0;
    const auto fail = [&](const std::string& why) {
        throw std::runtime_error("not well-formed at byte " + std::to_string(i) + ": " + why);
    };
    if (xml.compare(0, 5, "<?xml") == 0) {
        i = xml.find("?>");
        if (i == std::string::npos) {
            fail("the declaration does not end");
        }
        i += 2;
    }
    while (i < xml.size()) {
        if (xml[i] != '<') {
            const auto next = xml.find('<', i);
            const std::string text = xml.substr(i, next - i);
            if (open.empty() && text.find_first_not_of(" \n\t\r") != std::string::npos) {
                fail("text outside the root element");
            }
            if (!entities_ok(text) || text.find('>') != std::string::npos) {
                fail("text with a bare '&' or '>'");
            }
            if (text_target != std::string::npos) {
                elements[text_target].text += text;
            }
            i = next == std::string::npos ? xml.size() : next;
            continue;
        }
        if (xml.compare(i, 2, "</") == 0) {
            std::size_t j = i + 2;
            while (j < xml.size() && is_name_char(xml[j])) {
                ++j;
            }
            const std::string name = xml.substr(i + 2, j - i - 2);
            if (j >= xml.size() || xml[j] != '>') {
                fail("an end tag that does not close");
            }
            if (open.empty() || open.back() != name) {
                fail("</" + name + "> closes " + (open.empty() ? "nothing" : open.back()));
            }
            open.pop_back();
            classes.pop_back();
            text_target = std::string::npos;
            i = j + 1;
            continue;
        }
        Element e;
        e.open = open;
        e.classes = classes;
        text_target = std::string::npos;
        std::size_t j = i + 1;
        while (j < xml.size() && is_name_char(xml[j])) {
            ++j;
        }
        e.name = xml.substr(i + 1, j - i - 1);
        if (e.name.empty()) {
            fail("a '<' that starts no tag");
        }
        bool empty_element = false;
        while (true) {
            while (j < xml.size() && (xml[j] == ' ' || xml[j] == '\n')) {
                ++j;
            }
            if (j >= xml.size()) {
                fail("a start tag that does not close");
            }
            if (xml[j] == '>') {
                ++j;
                break;
            }
            if (xml.compare(j, 2, "/>") == 0) {
                empty_element = true;
                j += 2;
                break;
            }
            const std::size_t name_start = j;
            while (j < xml.size() && is_name_char(xml[j])) {
                ++j;
            }
            const std::string attr = xml.substr(name_start, j - name_start);
            if (attr.empty() || xml.compare(j, 2, "=\"") != 0) {
                fail("an attribute without a quoted value in <" + e.name + ">");
            }
            const std::size_t value_start = j + 2;
            const std::size_t value_end = xml.find('"', value_start);
            if (value_end == std::string::npos) {
                fail("an attribute value that does not end");
            }
            const std::string value = xml.substr(value_start, value_end - value_start);
            if (value.find('<') != std::string::npos || !entities_ok(value)) {
                fail("a '<' or a bare '&' in attribute " + attr);
            }
            if (!e.attributes.emplace(attr, value).second) {
                fail("attribute " + attr + " twice in <" + e.name + ">");
            }
            j = value_end + 1;
        }
        if (open.empty()) {
            ++roots;
            if (roots > 1) {
                fail("a second root element");
            }
        }
        if (!empty_element) {
            open.push_back(e.name);
            const auto cls = e.attributes.find("class");
            classes.push_back(cls == e.attributes.end() ? "" : cls->second);
            text_target = elements.size();
        }
        elements.push_back(std::move(e));
        i = j;
    }
    if (!open.empty()) {
        throw std::runtime_error("not well-formed: <" + open.back() + "> is never closed");
    }
    if (roots != 1) {
        throw std::runtime_error("not well-formed: no root element");
    }
    return elements;
}

/// The points of an SVG path's "M x,y L x,y ..." data, one vector per unbroken stretch.
inline std::vector<std::vector<std::pair<double, double>>> path_points(const std::string& d) {
    std::vector<std::vector<std::pair<double, double>>> stretches;
    std::size_t i = 0;
    while (i < d.size()) {
        const char command = d[i];
        if (command == ' ') {
            ++i;
            continue;
        }
        if (command != 'M' && command != 'L') {
            throw std::runtime_error("path command other than M and L: " + d.substr(i, 10));
        }
        char* end = nullptr;
        const double x = std::strtod(d.c_str() + i + 1, &end);
        if (*end != ',') {
            throw std::runtime_error("path point without a comma: " + d.substr(i, 20));
        }
        const double y = std::strtod(end + 1, &end);
        if (command == 'M' || stretches.empty()) {
            stretches.emplace_back();
        }
        stretches.back().emplace_back(x, y);
        i = static_cast<std::size_t>(end - d.c_str());
    }
    return stretches;
}

/// An axis of one chart as a reader uses it: the tick labels' values at their positions.
struct Axis {
    std::vector<std::pair<double, double>> ticks; ///< (pixel, value)
    /// The value at pixel `py`, by the two outermost ticks (the axis is linear).
    [[nodiscard]] double value_at(double py) const {
        if (ticks.size() < 2) {
            throw std::runtime_error("an axis with fewer than two ticks");
        }
        const auto& [p0, v0] = ticks.front();
        const auto& [p1, v1] = ticks.back();
        return v0 + (py - p0) / (p1 - p0) * (v1 - v0);
    }
    /// The size of a value step of one pixel.
    [[nodiscard]] double per_pixel() const {
        const auto& [p0, v0] = ticks.front();
        const auto& [p1, v1] = ticks.back();
        return std::abs((v1 - v0) / (p1 - p0));
    }
};

/// The charts of a document: per chart (a <g class="chart">), its y axis and its series paths
/// by label.
struct Chart {
    Axis x;
    Axis y;
    std::map<std::string, std::string> paths; ///< data-label -> d
    std::vector<std::string> texts;           ///< every text drawn in the chart
};

inline std::vector<Chart> charts(const std::vector<Element>& elements) {
    std::vector<Chart> out;
    for (const auto& e : elements) {
        const auto cls = e.attributes.find("class");
        const std::string c = cls == e.attributes.end() ? "" : cls->second;
        if (e.name == "g" && c == "chart") {
            out.emplace_back();
            continue;
        }
        bool inside = false;
        for (const auto& open_class : e.classes) {
            inside = inside || open_class == "chart";
        }
        if (out.empty() || !inside) {
            continue;
        }
        if (e.name == "text") {
            out.back().texts.push_back(e.text);
        }
        if (e.name == "text" && c == "y-tick") {
            out.back().y.ticks.emplace_back(std::stod(e.attributes.at("y")), std::stod(e.text));
        }
        if (e.name == "text" && c == "x-tick") {
            out.back().x.ticks.emplace_back(std::stod(e.attributes.at("x")), std::stod(e.text));
        }
        if (e.name == "path" && c == "series") {
            out.back().paths[e.attributes.at("data-label")] = e.attributes.at("d");
        }
    }
    return out;
}

} // namespace svg_check
