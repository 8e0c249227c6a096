#include "svg_chart.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>
#include <stdexcept>

namespace wickgrid::report {

namespace {
// The house palette: deep teal, burnt orange, slate, olive, plum; dashes tell series apart in print.
const char* const colours[] = {"#0f6b6b", "#c4621d", "#4a5868", "#7a8b2c", "#7d3c6e"};
const char* const dashes[] = {"", "6 3", "2 3", "8 3 2 3", "4 4"};
constexpr double width = 720, height = 400, left = 72, right = 24, top = 44, bottom = 58;

std::string num(double v) {
    char b[32];
    std::snprintf(b, sizeof b, "%.2f", v);
    return b;
}

std::string header(const std::string& title, double h = height) {
    std::ostringstream o;
    o << "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 " << width << ' ' << h << "\" width=\"" << width
      << "\" height=\"" << h << "\" role=\"img\" aria-label=\"" << escape_xml(title) << "\" class=\"wg-chart\">\n"
      << "<title>" << escape_xml(title) << "</title>\n"
      << "<rect x=\"0\" y=\"0\" width=\"" << width << "\" height=\"" << h << "\" fill=\"#ffffff\"/>\n"
      << "<text x=\"" << left << "\" y=\"24\" font-family=\"sans-serif\" font-size=\"15\" font-weight=\"bold\" fill=\"#1d2a33\">"
      << escape_xml(title) << "</text>\n";
    return o.str();
}

struct Axis {
    double lo, hi;
    bool log;
    double px_lo, px_hi;
    double map(double v) const {
        const double t = log ? (std::log10(v) - std::log10(lo)) / (std::log10(hi) - std::log10(lo)) : (v - lo) / (hi - lo);
        return px_lo + t * (px_hi - px_lo);
    }
};

void widen(double& lo, double& hi) {
    if (!(hi > lo)) {
        const double pad = lo == 0.0 ? 1.0 : std::fabs(lo) * 0.1;
        lo -= pad;
        hi += pad;
    }
}
}  // namespace

std::string escape_xml(const std::string& text) {
    std::string out;
    for (const char c : text) {
        switch (c) {
            case '&': out += "&amp;"; break;
            case '<': out += "&lt;"; break;
            case '>': out += "&gt;"; break;
            case '"': out += "&quot;"; break;
            case '\t':
            case '\n':
            case '\r': out += c; break;
            // XML 1.0 allows no other C0 control character, escaped or not.
            default: out += static_cast<unsigned char>(c) < 0x20 ? std::string("\xEF\xBF\xBD") : std::string(1, c);
        }
    }
    return out;
}

std::vector<double> nice_ticks(double lo, double hi, int count) {
    widen(lo, hi);
    auto nice = [](double x, bool round) {
        const double e = std::floor(std::log10(x)), f = x / std::pow(10.0, e);
        double nf;
        if (round) nf = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
        else nf = f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
        return nf * std::pow(10.0, e);
    };
    const double range = nice(hi - lo, false);
    const double step = nice(range / std::max(1, count - 1), true);
    // From the last tick at or below lo to the first at or above hi, so the axis ends on ticks.
    std::vector<double> ticks;
    const double first = std::floor(lo / step + 1e-9) * step;
    for (int k = 0; first + k * step < hi + step * (1 - 1e-9) && k < 1000; ++k) {
        const double t = first + k * step;
        ticks.push_back(std::fabs(t) < 1e-12 * step ? 0.0 : t);
    }
    return ticks;
}

std::vector<double> log_ticks(double lo, double hi) {
    std::vector<double> ticks;
    for (double decade = std::pow(10.0, std::floor(std::log10(lo))); decade <= hi; decade *= 10.0)
        for (const double m : {1.0, 2.0, 5.0})
            if (m * decade >= lo * (1 - 1e-12) && m * decade <= hi * (1 + 1e-12)) ticks.push_back(m * decade);
    return ticks;
}

std::string tick_text(double value) {
    std::ostringstream o;
    o.precision(6);
    o << value;
    return o.str();
}

std::string render(const LineChart& chart) {
    double xlo = std::numeric_limits<double>::infinity(), xhi = -xlo, ylo = xlo, yhi = -xlo;
    for (const auto& s : chart.series) {
        if (s.x.size() != s.y.size()) throw std::logic_error("series with unequal x and y");
        for (std::size_t i = 0; i < s.x.size(); ++i) {
            if (chart.log_x && !(s.x[i] > 0)) continue;
            if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) throw std::logic_error("non-finite chart value");
            xlo = std::min(xlo, s.x[i]);
            xhi = std::max(xhi, s.x[i]);
            ylo = std::min(ylo, s.y[i]);
            yhi = std::max(yhi, s.y[i]);
        }
    }
    if (!std::isfinite(xlo)) xlo = 0, xhi = 1, ylo = 0, yhi = 1;
    if (chart.y_min) ylo = *chart.y_min;
    if (chart.y_max) yhi = *chart.y_max;
    widen(ylo, yhi);
    if (!chart.log_x) widen(xlo, xhi);
    else if (!(xhi > xlo)) xhi = xlo * 10.0;
    const std::vector<double> yt = nice_ticks(ylo, yhi, 6);
    ylo = std::min(ylo, yt.front());
    yhi = std::max(yhi, yt.back());
    std::vector<double> xt = chart.log_x ? log_ticks(xlo, xhi) : nice_ticks(xlo, xhi, 7);
    if (!chart.log_x) {
        xlo = std::min(xlo, xt.front());
        xhi = std::max(xhi, xt.back());
    }
    const Axis ax{xlo, xhi, chart.log_x, left, width - right - 150};
    const Axis ay{ylo, yhi, false, height - bottom, top};
    std::ostringstream o;
    o << header(chart.title);
    o << "<g font-family=\"sans-serif\" font-size=\"11\" fill=\"#33424d\">\n";
    for (const double t : yt) {
        const double y = ay.map(t);
        o << "<line x1=\"" << num(ax.px_lo) << "\" y1=\"" << num(y) << "\" x2=\"" << num(ax.px_hi) << "\" y2=\"" << num(y)
          << "\" stroke=\"#dde3e7\" stroke-width=\"1\"/>\n<text x=\"" << num(ax.px_lo - 6) << "\" y=\"" << num(y + 4)
          << "\" text-anchor=\"end\">" << tick_text(t) << "</text>\n";
    }
    for (const double t : xt) {
        const double x = ax.map(t);
        o << "<line x1=\"" << num(x) << "\" y1=\"" << num(ay.px_lo) << "\" x2=\"" << num(x) << "\" y2=\"" << num(ay.px_hi)
          << "\" stroke=\"#eef1f3\" stroke-width=\"1\"/>\n<text x=\"" << num(x) << "\" y=\"" << num(ay.px_lo + 16)
          << "\" text-anchor=\"middle\">" << tick_text(t) << "</text>\n";
    }
    o << "<rect x=\"" << num(ax.px_lo) << "\" y=\"" << num(ay.px_hi) << "\" width=\"" << num(ax.px_hi - ax.px_lo)
      << "\" height=\"" << num(ay.px_lo - ay.px_hi) << "\" fill=\"none\" stroke=\"#7b8a95\" stroke-width=\"1\"/>\n";
    o << "<text x=\"" << num(0.5 * (ax.px_lo + ax.px_hi)) << "\" y=\"" << num(height - 14)
      << "\" text-anchor=\"middle\" font-size=\"12\">" << escape_xml(chart.x_label) << "</text>\n";
    o << "<text transform=\"translate(18 " << num(0.5 * (ay.px_lo + ay.px_hi)) << ") rotate(-90)\" text-anchor=\"middle\" font-size=\"12\">"
      << escape_xml(chart.y_label) << "</text>\n";
    if (chart.marker_x && *chart.marker_x >= xlo && *chart.marker_x <= xhi) {
        const double x = ax.map(*chart.marker_x);
        o << "<line x1=\"" << num(x) << "\" y1=\"" << num(ay.px_lo) << "\" x2=\"" << num(x) << "\" y2=\"" << num(ay.px_hi)
          << "\" stroke=\"#1d2a33\" stroke-width=\"1\" stroke-dasharray=\"3 3\"/>\n<text x=\"" << num(x + 4) << "\" y=\""
          << num(ay.px_hi + 12) << "\">" << escape_xml(chart.marker_label) << "</text>\n";
    }
    o << "</g>\n";
    for (std::size_t k = 0; k < chart.series.size(); ++k) {
        const auto& s = chart.series[k];
        const int st = s.style % 5;
        const double ly = top + 18 + 20.0 * static_cast<double>(k);
        if (s.points) {
            for (std::size_t i = 0; i < s.x.size(); ++i) {
                if (chart.log_x && !(s.x[i] > 0)) continue;
                o << "<circle cx=\"" << num(ax.map(s.x[i])) << "\" cy=\"" << num(ay.map(std::clamp(s.y[i], ylo, yhi)))
                  << "\" r=\"2.5\" fill=\"" << colours[st] << "\"/>\n";
            }
            o << "<circle cx=\"" << num(width - 146) << "\" cy=\"" << num(ly) << "\" r=\"3\" fill=\"" << colours[st]
              << "\"/>\n<text x=\"" << num(width - 126) << "\" y=\"" << num(ly + 4)
              << "\" font-family=\"sans-serif\" font-size=\"11\" fill=\"#1d2a33\">" << escape_xml(s.name) << "</text>\n";
            continue;
        }
        o << "<polyline fill=\"none\" stroke=\"" << colours[st] << "\" stroke-width=\"2\"";
        if (*dashes[st]) o << " stroke-dasharray=\"" << dashes[st] << "\"";
        o << " points=\"";
        for (std::size_t i = 0; i < s.x.size(); ++i) {
            if (chart.log_x && !(s.x[i] > 0)) continue;
            o << num(ax.map(s.x[i])) << ',' << num(ay.map(std::clamp(s.y[i], ylo, yhi))) << ' ';
        }
        o << "\"/>\n";
        o << "<line x1=\"" << num(width - 160) << "\" y1=\"" << num(ly) << "\" x2=\"" << num(width - 132) << "\" y2=\""
          << num(ly) << "\" stroke=\"" << colours[st] << "\" stroke-width=\"2\"";
        if (*dashes[st]) o << " stroke-dasharray=\"" << dashes[st] << "\"";
        o << "/>\n<text x=\"" << num(width - 126) << "\" y=\"" << num(ly + 4)
          << "\" font-family=\"sans-serif\" font-size=\"11\" fill=\"#1d2a33\">" << escape_xml(s.name) << "</text>\n";
    }
    o << "</svg>\n";
    return o.str();
}

std::string render(const RangeChart& chart) {
    const double row = 34, h = top + bottom + row * static_cast<double>(std::max<std::size_t>(1, chart.bars.size()));
    double lo = chart.base, hi = chart.base;
    for (const auto& b : chart.bars)
        for (const auto& v : {b.low_value, b.high_value})
            if (v) {
                lo = std::min(lo, *v);
                hi = std::max(hi, *v);
            }
    widen(lo, hi);
    // Room for the value labels at the bar ends.
    const double pad = 0.12 * (hi - lo);
    lo -= pad;
    hi += pad;
    const auto ticks = nice_ticks(lo, hi, 6);
    lo = ticks.front();
    hi = ticks.back();
    const Axis ax{lo, hi, false, 250, width - right - 10};
    std::ostringstream o;
    o << header(chart.title, h) << "<g font-family=\"sans-serif\" font-size=\"11\" fill=\"#33424d\">\n";
    for (const double t : ticks) {
        const double x = ax.map(t);
        o << "<line x1=\"" << num(x) << "\" y1=\"" << num(top) << "\" x2=\"" << num(x) << "\" y2=\"" << num(h - bottom)
          << "\" stroke=\"#eef1f3\"/>\n<text x=\"" << num(x) << "\" y=\"" << num(h - bottom + 16) << "\" text-anchor=\"middle\">"
          << tick_text(t) << "</text>\n";
    }
    for (std::size_t i = 0; i < chart.bars.size(); ++i) {
        const auto& b = chart.bars[i];
        const double y = top + row * static_cast<double>(i) + 6;
        o << "<text x=\"12\" y=\"" << num(y + 15) << "\" text-anchor=\"start\">" << escape_xml(b.label) << "</text>\n";
        if (!b.low_value || !b.high_value) {
            // No bar from a value that does not exist: mark the feasible end, name the other.
            std::string missing = std::string(!b.low_value ? "low" : "") + (!b.low_value && !b.high_value ? " and " : "") +
                                  (!b.high_value ? "high" : "");
            for (const auto& [v, text] : {std::pair{b.low_value, b.low_text}, std::pair{b.high_value, b.high_text}})
                if (v)
                    o << "<circle cx=\"" << num(ax.map(*v)) << "\" cy=\"" << num(y + 10) << "\" r=\"5\" fill=\"" << colours[0]
                      << "\"/>\n<text x=\"" << num(ax.map(*v) + 8) << "\" y=\"" << num(y + 14)
                      << "\" text-anchor=\"start\" font-size=\"10\">" << escape_xml(text) << "</text>\n";
            o << "<text x=\"150\" y=\"" << num(y + 15) << "\" text-anchor=\"start\" font-size=\"10\" fill=\"" << colours[1]
              << "\">" << escape_xml(missing + ": no feasible spacing") << "</text>\n";
            continue;
        }
        const double low = *b.low_value, high = *b.high_value;
        const double x1 = ax.map(std::min(low, high)), x2 = ax.map(std::max(low, high));
        o << "<rect x=\"" << num(x1) << "\" y=\"" << num(y) << "\" width=\"" << num(std::max(1.0, x2 - x1))
          << "\" height=\"20\" fill=\"" << colours[0] << "\" fill-opacity=\"0.75\"/>\n";
        o << "<text x=\"" << num(ax.map(low) + (low <= high ? -4 : 4)) << "\" y=\"" << num(y + 14)
          << "\" text-anchor=\"" << (low <= high ? "end" : "start") << "\" font-size=\"10\">"
          << escape_xml(b.low_text) << "</text>\n";
        o << "<text x=\"" << num(ax.map(high) + (low <= high ? 4 : -4)) << "\" y=\"" << num(y + 14)
          << "\" text-anchor=\"" << (low <= high ? "start" : "end") << "\" font-size=\"10\">"
          << escape_xml(b.high_text) << "</text>\n";
    }
    const double xb = ax.map(chart.base);
    o << "<line x1=\"" << num(xb) << "\" y1=\"" << num(top - 4) << "\" x2=\"" << num(xb) << "\" y2=\"" << num(h - bottom)
      << "\" stroke=\"" << colours[1] << "\" stroke-width=\"2\"/>\n";
    o << "<text x=\"" << num(0.5 * (ax.px_lo + ax.px_hi)) << "\" y=\"" << num(h - 14) << "\" text-anchor=\"middle\" font-size=\"12\">"
      << escape_xml(chart.x_label) << " (orange line: base case)</text>\n</g>\n</svg>\n";
    return o.str();
}

std::string render(const ShadedGrid& chart) {
    const double cell_w = std::min(52.0, 520.0 / std::max<std::size_t>(1, chart.xs.size()));
    const double cell_h = std::min(28.0, 300.0 / std::max<std::size_t>(1, chart.ys.size()));
    const double h = top + bottom + cell_h * static_cast<double>(chart.ys.size()) + 10;
    double lo = std::numeric_limits<double>::infinity(), hi = -lo;
    for (const auto& v : chart.values)
        if (v) lo = std::min(lo, *v), hi = std::max(hi, *v);
    if (!std::isfinite(lo)) lo = 0, hi = 1;
    widen(lo, hi);
    std::ostringstream o;
    o << header(chart.title, h) << "<g font-family=\"sans-serif\" font-size=\"10\" fill=\"#1d2a33\">\n";
    const double x0 = 110, y0 = top + 6;
    for (std::size_t j = 0; j < chart.ys.size(); ++j) {
        o << "<text x=\"" << num(x0 - 6) << "\" y=\"" << num(y0 + cell_h * (j + 0.5) + 3) << "\" text-anchor=\"end\">"
          << tick_text(chart.ys[j]) << "</text>\n";
        for (std::size_t i = 0; i < chart.xs.size(); ++i) {
            const auto& v = chart.values[j * chart.xs.size() + i];
            const double t = v ? (*v - lo) / (hi - lo) : 0.0;
            // Light to deep teal with the spacing; hatched grey where no spacing works.
            const int r = static_cast<int>(232 - t * (232 - 15)), g = static_cast<int>(244 - t * (244 - 107)),
                      b = static_cast<int>(242 - t * (242 - 107));
            char fill[16];
            std::snprintf(fill, sizeof fill, "#%02x%02x%02x", r, g, b);
            o << "<rect x=\"" << num(x0 + cell_w * i) << "\" y=\"" << num(y0 + cell_h * j) << "\" width=\"" << num(cell_w)
              << "\" height=\"" << num(cell_h) << "\" fill=\"" << (v ? fill : "#c9cfd3") << "\" stroke=\"#ffffff\"/>\n";
            o << "<text x=\"" << num(x0 + cell_w * (i + 0.5)) << "\" y=\"" << num(y0 + cell_h * (j + 0.5) + 3)
              << "\" text-anchor=\"middle\" fill=\"" << (t > 0.55 ? "#ffffff" : "#1d2a33") << "\">"
              << (v ? num(*v) : std::string("—")) << "</text>\n";
        }
    }
    for (std::size_t i = 0; i < chart.xs.size(); ++i)
        o << "<text x=\"" << num(x0 + cell_w * (i + 0.5)) << "\" y=\"" << num(y0 + cell_h * chart.ys.size() + 14)
          << "\" text-anchor=\"middle\">" << tick_text(chart.xs[i]) << "</text>\n";
    o << "<text x=\"" << num(x0 + 0.5 * cell_w * chart.xs.size()) << "\" y=\"" << num(h - 12)
      << "\" text-anchor=\"middle\" font-size=\"12\">" << escape_xml(chart.x_label) << "</text>\n";
    o << "<text transform=\"translate(18 " << num(y0 + 0.5 * cell_h * chart.ys.size()) << ") rotate(-90)\" text-anchor=\"middle\" font-size=\"12\">"
      << escape_xml(chart.y_label) << "</text>\n";
    o << "<text x=\"" << num(x0 + cell_w * chart.xs.size() + 12) << "\" y=\"" << num(y0 + 12) << "\">cells: "
      << escape_xml(chart.value_label) << "</text>\n<text x=\"" << num(x0 + cell_w * chart.xs.size() + 12) << "\" y=\""
      << num(y0 + 28) << "\">— : no spacing works</text>\n</g>\n</svg>\n";
    return o.str();
}

}  // namespace wickgrid::report
