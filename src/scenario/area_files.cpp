// Treatment areas (GeoJSON RFC 7946 or CSV vertices) and borehole base depths, with every error
// pointed at its place in the file.
#include "area_files.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <array>
#include <cmath>
#include <functional>
#include <map>
#include <variant>

#include "csv_table.hpp"
#include "text_encoding.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid::scenario {

namespace {
using json = nlohmann::json;
using Step = std::variant<std::string, std::size_t>;
using Path = std::vector<Step>;

std::string path_text(const Path& path) {
    std::string out;
    for (const auto& step : path) {
        if (const auto* key = std::get_if<std::string>(&step)) out += (out.empty() ? "" : ".") + *key;
        else out += "[" + std::to_string(std::get<std::size_t>(step)) + "]";
    }
    return out;
}

Mark mark_at(const std::string& text, std::size_t offset) {
    Mark m{1, 1};
    for (std::size_t i = 0; i < offset && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++m.line;
            m.column = 1;
        } else {
            ++m.column;
        }
    }
    return m;
}

// Finds where a value sits in JSON text that has already parsed: walks the text along the path
// (the last of repeated keys wins, as in the parser). Cost O(text length).
class JsonLocator {
public:
    explicit JsonLocator(const std::string& text) : text_(text) {}

    Mark locate(const Path& path) const {
        std::size_t pos = skip_space(0);
        for (const auto& step : path) {
            const auto found = std::holds_alternative<std::string>(step) ? member(pos, std::get<std::string>(step))
                                                                         : element(pos, std::get<std::size_t>(step));
            if (!found) break;
            pos = *found;
        }
        return mark_at(text_, pos);
    }

private:
    const std::string& text_;

    std::size_t skip_space(std::size_t pos) const {
        while (pos < text_.size() && std::string_view(" \t\r\n").find(text_[pos]) != std::string_view::npos) ++pos;
        return pos;
    }
    std::size_t skip_string(std::size_t pos) const {  // pos at the opening quote
        for (++pos; pos < text_.size() && text_[pos] != '"'; ++pos)
            if (text_[pos] == '\\') ++pos;
        return pos + 1;
    }
    std::size_t skip_value(std::size_t pos) const {
        pos = skip_space(pos);
        if (pos >= text_.size()) return pos;
        if (text_[pos] == '"') return skip_string(pos);
        if (text_[pos] == '{' || text_[pos] == '[') {
            int depth = 0;
            for (; pos < text_.size(); ++pos) {
                const char c = text_[pos];
                if (c == '"') pos = skip_string(pos) - 1;
                else if (c == '{' || c == '[') ++depth;
                else if ((c == '}' || c == ']') && --depth == 0) return pos + 1;
            }
            return pos;
        }
        while (pos < text_.size() && std::string_view(",]} \t\r\n").find(text_[pos]) == std::string_view::npos) ++pos;
        return pos;
    }
    std::optional<std::size_t> member(std::size_t pos, const std::string& key) const {
        if (pos >= text_.size() || text_[pos] != '{') return std::nullopt;
        std::optional<std::size_t> found;
        pos = skip_space(pos + 1);
        while (pos < text_.size() && text_[pos] == '"') {
            const std::size_t end = skip_string(pos);
            const std::string name = text_.substr(pos + 1, end - pos - 2);
            pos = skip_space(end);
            pos = skip_space(pos + 1);  // the colon
            if (name == key) found = pos;
            pos = skip_space(skip_value(pos));
            if (pos < text_.size() && text_[pos] == ',') pos = skip_space(pos + 1);
        }
        return found;
    }
    std::optional<std::size_t> element(std::size_t pos, std::size_t index) const {
        if (pos >= text_.size() || text_[pos] != '[') return std::nullopt;
        pos = skip_space(pos + 1);
        for (std::size_t i = 0; i < index; ++i) {
            pos = skip_space(skip_value(pos));
            if (pos >= text_.size() || text_[pos] != ',') return std::nullopt;
            pos = skip_space(pos + 1);
        }
        return pos;
    }
};

// Where each ring of the area came from, to point an area problem back at the file. CSV keeps the
// marks as it reads; GeoJSON keeps the JSON paths and locates one only when it is at fault (walking
// the text costs its length, so locating every ring of a parcel export would be quadratic).
struct RingPlaces {
    std::vector<std::vector<Mark>> rings;  // [part][ring]
    std::vector<Mark> parts;
    std::vector<std::string> part_paths;
    std::vector<std::vector<std::string>> ring_paths;
    std::vector<Path> part_json;
    std::vector<std::vector<Path>> ring_json;
    const JsonLocator* locator = nullptr;
};

// Coordinate systems in longitude and latitude that GIS programs commonly name (common practice;
// EPSG codes from memory): WGS 84, ETRS89, NAD83, GDA94, GDA2020, NZGD2000, SIRGAS 2000, JGD2011.
bool is_geographic_crs(const std::string& name) {
    static const std::array<const char*, 9> codes = {"4326", "4258", "4269", "4283", "7844", "4167", "4674", "6668", "CRS84"};
    for (const char* code : codes) {
        const std::string c(code);
        const auto at = name.rfind(c);
        if (at != std::string::npos && at + c.size() == name.size() &&
            (at == 0 || name[at - 1] == ':' || name[at - 1] == '/'))
            return true;
    }
    return false;
}

class GeoJsonReader {
public:
    GeoJsonReader(const std::string& text, const std::string& file) : text_(text), file_(file), locator_(text) {}

    AreaFile read() {
        json root;
        try {
            root = json::parse(text_);
        } catch (const json::parse_error& e) {
            throw ScenarioError(file_, mark_at(text_, e.byte > 0 ? e.byte - 1 : 0), "",
                                "JSON syntax: " + std::string(e.what()).substr(std::string(e.what()).find(':') + 2));
        } catch (const json::exception& e) {
            // A number beyond double range ("number overflow parsing '5e2040'"): the parser names
            // the text, not its place; the first occurrence of that text is where it stands.
            const std::string what = e.what();
            const auto open = what.find('\'');
            const auto close = what.rfind('\'');
            const auto at = open != std::string::npos && close > open ? text_.find(what.substr(open + 1, close - open - 1))
                                                                     : std::string::npos;
            throw ScenarioError(file_, at == std::string::npos ? Mark{0, 0} : mark_at(text_, at), "",
                                "JSON: " + what.substr(what.find(']') + 2) + " (a number beyond the range of a double)");
        }
        AreaFile out;
        out.file = file_;
        if (!root.is_object()) fail({}, "a GeoJSON object is needed (a Polygon, MultiPolygon, Feature or FeatureCollection)");
        if (root.contains("crs")) out.crs_name = crs_name(root["crs"]);
        object(root, {}, out.area);
        if (out.area.parts.empty()) fail({}, "holds no Polygon or MultiPolygon");
        return out;
    }

    RingPlaces places() const {
        RingPlaces out = places_;
        out.locator = &locator_;
        return out;
    }

    [[noreturn]] void fail(const Path& path, const std::string& message) const {
        throw ScenarioError(file_, locator_.locate(path), path_text(path), message);
    }

private:
    static constexpr std::size_t max_nesting = 32;
    const std::string& text_;
    const std::string& file_;
    JsonLocator locator_;
    RingPlaces places_;

    std::string type_of(const json& node, const Path& path) const {
        if (!node.is_object() || !node.contains("type") || !node["type"].is_string())
            fail(path, "a GeoJSON object with a \"type\" is needed here");
        return node["type"].get<std::string>();
    }

    std::string crs_name(const json& crs) const {
        const Path path{std::string("crs")};
        if (crs.is_object() && crs.contains("properties") && crs["properties"].is_object() &&
            crs["properties"].contains("name") && crs["properties"]["name"].is_string())
            return crs["properties"]["name"].get<std::string>();
        fail(path, "a \"crs\" member must name its system: {\"type\": \"name\", \"properties\": {\"name\": …}}");
    }

    void object(const json& node, const Path& path, layout::Area& area) {
        // Features within features within collections: a real export nests two or three deep.
        if (path.size() > max_nesting) fail(path, "objects nested more than " + std::to_string(max_nesting) + " levels deep");
        const std::string type = type_of(node, path);
        if (type == "FeatureCollection") {
            if (!node.contains("features") || !node["features"].is_array())
                fail(path, "a FeatureCollection needs a \"features\" array");
            for (std::size_t i = 0; i < node["features"].size(); ++i) {
                Path p = path;
                p.push_back(std::string("features"));
                p.push_back(i);
                object(node["features"][i], p, area);
            }
        } else if (type == "Feature") {
            Path p = path;
            p.push_back(std::string("geometry"));
            if (!node.contains("geometry") || node["geometry"].is_null())
                fail(path, "a Feature without a geometry; give it a Polygon or MultiPolygon");
            object(node["geometry"], p, area);
        } else if (type == "Polygon") {
            polygon(coordinates(node, path), with(path, "coordinates"), area);
        } else if (type == "MultiPolygon") {
            const json& polygons = coordinates(node, path);
            for (std::size_t i = 0; i < polygons.size(); ++i) {
                Path p = with(path, "coordinates");
                p.push_back(i);
                polygon(polygons[i], p, area);
            }
        } else {
            fail(with(path, "type"), "a " + type + " is not an area; give a Polygon or MultiPolygon");
        }
    }

    static Path with(Path path, const std::string& key) {
        path.push_back(key);
        return path;
    }

    const json& coordinates(const json& node, const Path& path) const {
        if (!node.contains("coordinates") || !node["coordinates"].is_array())
            fail(path, "a \"coordinates\" array is needed");
        return node["coordinates"];
    }

    void polygon(const json& rings, const Path& path, layout::Area& area) {
        if (!rings.is_array() || rings.empty()) fail(path, "a polygon needs an array of rings (its outline first)");
        layout::Polygon out;
        places_.part_json.push_back(path);
        places_.ring_json.emplace_back();
        for (std::size_t r = 0; r < rings.size(); ++r) {
            Path p = path;
            p.push_back(r);
            places_.ring_json.back().push_back(p);
            layout::Ring ring = this->ring(rings[r], p);
            if (r == 0) out.outer = std::move(ring);
            else out.holes.push_back(std::move(ring));
        }
        area.parts.push_back(std::move(out));
    }

    layout::Ring ring(const json& positions, const Path& path) const {
        if (!positions.is_array()) fail(path, "a ring must be an array of positions [x, y]");
        layout::Ring out;
        for (std::size_t i = 0; i < positions.size(); ++i) {
            const json& pos = positions[i];
            Path p = path;
            p.push_back(i);
            if (!pos.is_array() || pos.size() < 2 || pos.size() > 3 || !pos[0].is_number() || !pos[1].is_number())
                fail(p, "a position must be [x, y] (or [x, y, z]) in metres");
            out.push_back({pos[0].get<double>(), pos[1].get<double>()});
        }
        // RFC 7946 §3.1.6: a linear ring has four or more positions, the last equal to the first.
        if (out.size() < 4) fail(path, "a ring needs at least 3 distinct vertices and the first repeated at the end (RFC 7946 §3.1.6)");
        if (out.front().x_m != out.back().x_m || out.front().y_m != out.back().y_m)
            fail(path, "the ring is not closed: its last position must repeat the first (RFC 7946 §3.1.6)");
        out.pop_back();
        return out;
    }
};

void check_projected(const AreaFile& f, bool projected_confirmed, const std::function<void(const std::string&)>& fail) {
    if (f.crs_name && is_geographic_crs(*f.crs_name))
        fail("the file's coordinate system " + *f.crs_name +
             " is in longitude and latitude; wickgrid lays drains in metres: export the area in a projected "
             "system (for example the local UTM zone)");
    if (projected_confirmed) return;
    bool all_in_range = true;
    for (const auto& part : f.area.parts) {
        auto check = [&](const layout::Ring& ring) {
            for (const auto& p : ring) all_in_range = all_in_range && std::abs(p.x_m) <= 180.0 && std::abs(p.y_m) <= 90.0;
        };
        check(part.outer);
        for (const auto& h : part.holes) check(h);
    }
    if (all_in_range)
        fail("every coordinate lies within longitude/latitude ranges (|x| ≤ 180, |y| ≤ 90), which is what GeoJSON "
             "means by default; wickgrid lays drains in metres of a projected system. Export the area in a projected "
             "system, or pass --projected if these are metres of a local grid");
}

// A CSV of vertices: x_m, y_m and optionally part and ring.
struct CsvArea {
    layout::Area area;
    RingPlaces places;
};

CsvArea parse_csv_area(const std::string& text, const std::string& file) {
    const CsvTable t = parse_csv(text, file);
    const std::size_t cx = t.required_column("x_m");
    const std::size_t cy = t.required_column("y_m");
    const auto cpart = t.column("part");
    const auto cring = t.column("ring");
    if (t.rows.empty()) throw ScenarioError(file, t.header.front().mark, "", "has a header but no vertices");
    auto whole = [&](const CsvCell& cell, const std::string& column) {
        const double v = csv_number(t, cell, column, "a whole number of at least 0");
        if (v < 0.0 || v != std::floor(v) || v > 1e6)
            throw ScenarioError(file, cell.mark, column, "'" + cell.text + "' must be a whole number of at least 0");
        return static_cast<std::size_t>(v);
    };
    CsvArea out;
    std::map<std::pair<std::size_t, std::size_t>, bool> seen;
    std::pair<std::size_t, std::size_t> current{SIZE_MAX, SIZE_MAX};
    std::map<std::size_t, std::size_t> part_index;  // file's part number → index in the area
    for (const auto& row : t.rows) {
        const std::size_t part = cpart ? whole(row[*cpart], "part") : 0;
        const std::size_t ring = cring ? whole(row[*cring], "ring") : 0;
        const layout::Point p{csv_number(t, row[cx], "x_m", "a coordinate in metres"),
                              csv_number(t, row[cy], "y_m", "a coordinate in metres")};
        if (std::pair{part, ring} != current) {
            current = {part, ring};
            const Mark at = row.front().mark;
            if (seen.count(current))
                throw ScenarioError(file, at, "", "part " + std::to_string(part) + " ring " + std::to_string(ring) +
                                                      " starts again here; list each ring's vertices together");
            seen[current] = true;
            if (ring == 0) {
                if (part_index.count(part) == 0) {
                    part_index[part] = out.area.parts.size();
                    out.area.parts.emplace_back();
                    out.places.parts.push_back(at);
                    out.places.part_paths.push_back("part " + std::to_string(part));
                    out.places.rings.emplace_back();
                    out.places.ring_paths.emplace_back();
                }
            } else if (part_index.count(part) == 0) {
                throw ScenarioError(file, at, "", "a hole (ring " + std::to_string(ring) + ") of part " +
                                                      std::to_string(part) + " comes before that part's outline (ring 0)");
            }
            auto& polygon = out.area.parts[part_index[part]];
            if (ring > 0) polygon.holes.emplace_back();
            out.places.rings[part_index[part]].push_back(at);
            out.places.ring_paths[part_index[part]].push_back("part " + std::to_string(part) + " ring " + std::to_string(ring));
        }
        auto& polygon = out.area.parts[part_index[part]];
        (ring == 0 ? polygon.outer : polygon.holes.back()).push_back(p);
    }
    // The first vertex may be repeated at the end; the ring closes itself either way.
    for (auto& polygon : out.area.parts) {
        auto close = [](layout::Ring& r) {
            if (r.size() > 1 && r.front().x_m == r.back().x_m && r.front().y_m == r.back().y_m) r.pop_back();
        };
        close(polygon.outer);
        for (auto& h : polygon.holes) close(h);
    }
    return out;
}

void check_area(const AreaFile& f, const RingPlaces& places, layout::PartOverlap overlap) {
    const auto problem = layout::area_problem(f.area, overlap);
    if (!problem) return;
    if (places.locator) {
        const bool by_ring = problem->ring && problem->part < places.ring_json.size() &&
                             *problem->ring < places.ring_json[problem->part].size();
        const Path& path = by_ring ? places.ring_json[problem->part][*problem->ring] : places.part_json.at(problem->part);
        throw ScenarioError(f.file, places.locator->locate(path), path_text(path), "the area's " + problem->reason);
    }
    const bool by_ring = problem->ring && problem->part < places.rings.size() && *problem->ring < places.rings[problem->part].size();
    const Mark at = by_ring ? places.rings[problem->part][*problem->ring] : places.parts.at(problem->part);
    const std::string where = by_ring ? places.ring_paths[problem->part][*problem->ring] : places.part_paths.at(problem->part);
    throw ScenarioError(f.file, at, where, "the area's " + problem->reason);
}
}  // namespace

AreaFile parse_area(const std::string& text, const std::string& file, bool projected_confirmed, layout::PartOverlap overlap) {
    require_utf8(text, file, "area file");
    // A UTF-8 byte-order mark may open either kind (RFC 7946 lets a reader ignore it).
    const std::size_t start = text.rfind("\xEF\xBB\xBF", 0) == 0 ? 3 : 0;
    const auto first = text.find_first_not_of(" \t\r\n", start);
    const bool named_geojson = file.ends_with(".geojson") || file.ends_with(".json");
    if (first == std::string::npos)
        throw ScenarioError(file, {1, 1}, "",
                            named_geojson ? "is empty; a GeoJSON Polygon, MultiPolygon, Feature or FeatureCollection is needed"
                                          : "is empty; a header row (x,y or x_m,y_m) and vertex rows are needed");
    AreaFile out;
    if (text[first] == '{') {
        GeoJsonReader reader(text, file);
        out = reader.read();
        check_projected(out, projected_confirmed, [&](const std::string& m) { reader.fail(out.crs_name ? Path{std::string("crs")} : Path{}, m); });
        check_area(out, reader.places(), overlap);  // while the reader (its locator) lives
    } else {
        CsvArea csv = parse_csv_area(text, file);
        out.file = file;
        out.area = std::move(csv.area);
        check_projected(out, projected_confirmed, [&](const std::string& m) { throw ScenarioError(file, {0, 0}, "", m); });
        check_area(out, csv.places, overlap);
    }
    return out;
}

AreaFile read_area_file(const std::string& path, bool projected_confirmed, layout::PartOverlap overlap) {
    return parse_area(read_input_file(path, "area file"), display_path(path), projected_confirmed, overlap);
}

namespace {
std::string base_depth_allowed() {
    return "a depth in metres greater than 0 and at most " + format_value(defaults::max_base_depth_m) +
           " (from the top of the clay to its base)";
}

// A borehole coordinate within the bound every projected grid in metres keeps (as the area's).
double borehole_coordinate(const CsvTable& t, const CsvCell& cell, const std::string& column) {
    const std::string allowed = "a coordinate in metres of a projected system, within ±10⁹ m";
    const double v = csv_number(t, cell, column, allowed);
    if (std::abs(v) > defaults::max_coordinate_m)
        throw ScenarioError(t.file, cell.mark, column, "'" + cell.text + "' is not allowed: " + allowed);
    return v;
}
}  // namespace

std::vector<layout::BaseDepthPoint> parse_base_depths(const std::string& text, const std::string& file) {
    const CsvTable t = parse_csv(text, file);
    const std::size_t cx = t.required_column("x_m");
    const std::size_t cy = t.required_column("y_m");
    const std::size_t cd = t.required_column("base_depth_m");
    if (t.rows.empty()) throw ScenarioError(file, t.header.front().mark, "", "has a header but no boreholes");
    std::vector<layout::BaseDepthPoint> out;
    std::map<std::pair<double, double>, std::pair<double, int>> at;  // position → depth, line
    for (const auto& row : t.rows) {
        const layout::BaseDepthPoint p{borehole_coordinate(t, row[cx], "x_m"), borehole_coordinate(t, row[cy], "y_m"),
                                       csv_number(t, row[cd], "base_depth_m", base_depth_allowed())};
        if (!(p.depth_m > 0.0 && p.depth_m <= defaults::max_base_depth_m))
            throw ScenarioError(file, row[cd].mark, "base_depth_m", "'" + row[cd].text + "' is not allowed: " + base_depth_allowed());
        const auto [it, fresh] = at.emplace(std::pair{p.x_m, p.y_m}, std::pair{p.depth_m, row.front().mark.line});
        if (!fresh && it->second.first != p.depth_m)
            throw ScenarioError(file, row.front().mark, "",
                                "this borehole stands where line " + std::to_string(it->second.second) +
                                    " has one, with another base depth; give one depth per position");
        if (fresh) out.push_back(p);
    }
    return out;
}

std::vector<layout::BaseDepthPoint> read_base_depth_file(const std::string& path) {
    return parse_base_depths(read_input_file(path, "base depth file"), display_path(path));
}

}  // namespace wickgrid::scenario
