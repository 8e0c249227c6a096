#pragma once
// Writers of a drain layout: terminal summary, JSON (keys fixed by the contract), CSV and GeoJSON
// drain lists for the setting-out rig and the surveyor, an SVG plan view and an HTML page.
#include <nlohmann/json.hpp>
#include <string>

#include "results/layout_record.hpp"

namespace wickgrid::report {

std::string layout_table(const results::LayoutRecord& r);
// Everything but the drains as a JSON object (the contract's keys; "drains" absent).
nlohmann::json layout_json(const results::LayoutRecord& r);
// The whole JSON document as text, the drains written straight into it ({id, x, y, length_m} each,
// coordinates to the millimetre, lengths to the centimetre): about 60 bytes a drain, where a JSON
// tree would hold about 600, so the largest layout allowed prints in a few GB.
std::string layout_json_text(const results::LayoutRecord& r);
// id,x_m,y_m,length_m; coordinates to the millimetre, lengths to the centimetre.
std::string layout_csv(const results::LayoutRecord& r);
// A FeatureCollection of Points with properties id, x, y and length_m, in the area file's coordinates
// (its "crs" member repeated when it had one).
std::string layout_geojson(const results::LayoutRecord& r);
// Plan view: area, holes, exclusion zones, drains, a scale bar; a north arrow when the area file
// names its coordinate system (grid north of that system). Above 100,000 drains one dot is drawn
// per half pixel of the plan (denser dots merge on screen and paper alike), so the file stays small.
std::string layout_svg(const results::LayoutRecord& r);
std::string layout_html(const results::LayoutRecord& r);

}  // namespace wickgrid::report
