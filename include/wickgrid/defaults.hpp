#pragma once
// Every default of the program in one place: the scenario reader, the command line, the engine and
// the writers take them from here.
#include <cstddef>

namespace wickgrid::defaults {

// Search range.
inline constexpr double spacing_increment_m = 0.05;  // chosen spacings are rounded down to this step
inline constexpr double spacing_tolerance_m = 1e-7;  // spacing-limit roots are solved to this width
inline constexpr double time_tolerance_s = 1.0;      // time-to-criterion roots are solved to this width
inline constexpr double search_horizon_years = 100.0;  // a criterion not met by then is "not reached"
inline constexpr int root_iterations = 200;            // cap of every root finder (checked)

// Numerical unit cell built without a mesh given (engine default).
inline constexpr int numerical_radial_cells = 40;
inline constexpr int numerical_vertical_cells = 80;
inline constexpr double numerical_max_degree_step = 0.005;
// Numerical unit cell used by `method: numerical` designs.
inline constexpr int design_radial_cells = 20;
inline constexpr int design_vertical_cells = 40;
inline constexpr double design_max_degree_step = 0.005;
// Numerical unit cell used by `verify` as the reference.
inline constexpr int verify_radial_cells = 40;
inline constexpr int verify_vertical_cells = 80;
inline constexpr double verify_max_degree_step = 0.002;
inline constexpr double verify_threshold = 0.02;  // |ΔU| above which verify warns
inline constexpr int verify_points = 25;

// Layered series method (layered.hpp): terms of the series and the cap a scenario may ask for.
inline constexpr int layered_terms = 48;
inline constexpr int max_layered_terms = 400;

// Vacuum: at most one atmosphere; without a tip ratio the vacuum reaches the drain tip undiminished.
inline constexpr double max_vacuum_kPa = 100.0;
inline constexpr double vacuum_tip_ratio = 1.0;

// Settlement.
inline constexpr int slices_per_layer = 10;
inline constexpr double secant_probe_kPa = 50.0;  // load for a layer's secant mv when no loading is given

// Stage stability (strength.hpp, embankment.hpp): the gain ratio Δsu/Δσ'v of the profile form
// (Mesri 1975, su/σ'p ≈ 0.22, from memory), the exponent m of the normalised form (Ladd & Foott
// 1974, from memory) and the target factor of safety of a stage when the scenario gives none
// (common practice for the end of each stage of an embankment on soft clay).
inline constexpr double su_gain_ratio = 0.22;
inline constexpr double strength_exponent = 0.8;
inline constexpr double target_factor_of_safety = 1.3;

// Secondary compression counts from the end of primary consolidation, taken as the time the unit
// cell reaches this average degree (common practice: the log-time law needs a finite start).
inline constexpr double end_of_primary_degree = 0.95;

// Curves.
inline constexpr int curve_points = 31;
inline constexpr double curve_span_of_deadline = 1.5;  // curves run to 1.5 × deadline by default
inline constexpr int chart_points = 121;

// Studies.
inline constexpr int grid_steps = 11;
inline constexpr double monte_carlo_reliability = 0.9;
inline constexpr double monte_carlo_confidence = 0.95;

// Limits on the work one input may ask for (each checked up front, or counted, with a named error).
inline constexpr double max_spacing_candidates = 10000;        // (max − min)/increment of a spacing range
inline constexpr int max_design_mesh_cells = 20000;             // radial × vertical cells, design method
inline constexpr int max_reference_mesh_cells = 200000;         // radial × vertical cells, verify
inline constexpr double min_max_degree_step = 1e-4;             // numerical_mesh.max_degree_step in a scenario
inline constexpr unsigned long max_time_steps = 1000000;        // one march of the numerical cell
inline constexpr double max_monte_carlo_values = 2e7;           // samples × design rows (8 bytes each)
// Spacing searches one study may run: the closed form's exact fast path, its generic search
// (staged loading, residual criterion), the numerical cell.
inline constexpr double max_searches_fast = 1e6;
inline constexpr double max_searches_generic = 2e4;
inline constexpr double max_searches_numerical = 500;
// Drains one layout may lay (about 10 km² at 1 m spacing; each drain costs ~100 bytes of output).
inline constexpr std::size_t max_layout_drains = 20000000;
// Projected coordinates in metres stay within a few times the Earth's circumference; beyond ±10⁹ m a
// coordinate (area vertex or borehole) is no place on a projected grid.
inline constexpr double max_coordinate_m = 1e9;
// A borehole's depth from the top of the clay to its base, metres. Band drains are installed to
// some tens of metres (common practice); no soft deposit treated with drains is a kilometre deep, so
// a larger depth is a unit or typing error, refused at its line.
inline constexpr double max_base_depth_m = 1000.0;
// How much a scenario may list, so that reading and every command stay bounded (far beyond any real
// section: a log of a few dozen layers, a couple of berms, a dozen lifts).
inline constexpr std::size_t max_layers = 200;
// A lift placed over less than this (days, about 1.4 minutes) is taken as placed at once (with a
// warning): shorter ramps are below what the time integration resolves and only cost time.
inline constexpr double shortest_placing_days = 1e-3;
inline constexpr std::size_t max_berms = 20;
inline constexpr std::size_t max_load_stages = 100;
inline constexpr std::size_t max_drain_products = 200;

// The scheme search (schedule.hpp). Surcharges are a few metres of fill (common practice): a height
// above max_surcharge_height_m is a typing error. A search plans every product × pattern × surcharge
// height × spacing (about a second of one core each on a four-lift section): at most
// max_schedule_schemes schemes, so that a run stays within minutes.
inline constexpr double max_surcharge_height_m = 20.0;
// Basal reinforcement: the strongest basal geosynthetics have short-term strengths of one to two
// thousand kN/m (from memory); a larger design force is a unit or typing error.
inline constexpr double max_reinforcement_kN_per_m = 2000.0;
inline constexpr std::size_t max_surcharge_heights = 20;
inline constexpr std::size_t max_schedule_schemes = 1000;

// Layout.
inline constexpr double layout_edge_offset_m = 0.0;  // drains may stand on the treatment area's edge

}  // namespace wickgrid::defaults
