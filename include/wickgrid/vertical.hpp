#pragma once
// One-dimensional (vertical) consolidation: Terzaghi's average degree and its inverse.

namespace wickgrid {

enum class VerticalDrainage { both_faces, top_only, bottom_only };

// Longest drainage path d: the layer thickness H for one drained face, H/2 for two (common practice).
double drainage_path_m(double thickness_m, VerticalDrainage drainage);

// Time factor c·t/d² for a coefficient of consolidation c (m²/s), time t (s) and length d (m).
double time_factor(double c_m2_per_s, double time_s, double length_m);

// Average degree of vertical consolidation Uv(Tv) for a uniform initial excess pore pressure,
// Tv >= 0, accurate to about 1e-15 absolute.
double degree_vertical(double tv);

// Inverse: the time factor Tv at which Uv is reached, 0 < Uv < 1.
double time_factor_vertical(double uv);

// Terzaghi's isochrone: the excess pore pressure left u/u0 at depth ratio Z = z/d (0 at a drained
// face; 0..1 for one drained face, 0..2 between two) and time factor Tv, for a uniform initial excess.
// Throws InputError for Z outside [0, 2] or Tv < 0. Accurate to about 1e-14 absolute.
double excess_fraction_vertical(double z_over_d, double tv);

namespace terzaghi {
// The two convergent representations behind degree_vertical, exposed so that checks can compare
// them where both converge. Each sums terms until they no longer change the result.
double degree_short_time(double tv);  // error-function (image) series, fast for small Tv
double degree_fourier(double tv);     // Fourier series, fast for large Tv
// The isochrone's two forms: images (a sum of erfc, Carslaw & Jaeger 1959 §3.3) and Fourier.
double excess_images(double z_over_d, double tv);
double excess_fourier(double z_over_d, double tv);
}  // namespace terzaghi

}  // namespace wickgrid
