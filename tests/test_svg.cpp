// The SVG chart writer: tick choice, escaping, and what a chart contains. (Well-formedness of
// every chart and page is parsed by tests/report/check_report.py.)
#include <gtest/gtest.h>

#include <limits>
#include <stdexcept>

#include "report/svg_chart.hpp"

using namespace wickgrid::report;

TEST(SvgChart, NiceTicksCoverTheRangeOnRoundNumbers) {
    // Heckbert (1990) labels: steps of 1, 2 or 5 × 10^k, the axis ending on ticks.
    EXPECT_EQ(nice_ticks(0.0, 1413.0, 6), (std::vector<double>{0, 500, 1000, 1500}));
    EXPECT_EQ(nice_ticks(0.0, 100.0, 6), (std::vector<double>{0, 20, 40, 60, 80, 100}));
    const auto t = nice_ticks(0.93, 1.46, 6);
    EXPECT_LE(t.front(), 0.93);
    EXPECT_GE(t.back(), 1.46);
    EXPECT_EQ(log_ticks(1.0, 300.0), (std::vector<double>{1, 2, 5, 10, 20, 50, 100, 200}));
    EXPECT_EQ(tick_text(0.25), "0.25");
}

TEST(SvgChart, EscapesTextAndDrawsEverySeries) {
    EXPECT_EQ(escape_xml("a < b & \"c\" > d"), "a &lt; b &amp; &quot;c&quot; &gt; d");
    LineChart c;
    c.title = "U & t";
    c.x_label = "days";
    c.y_label = "%";
    c.series = {{"one", {0, 1, 2}, {0, 50, 90}, 0}, {"two", {0, 1, 2}, {0, 40, 80}, 1}};
    const std::string svg = render(c);
    EXPECT_EQ(svg.rfind("<svg xmlns=\"http://www.w3.org/2000/svg\"", 0), 0u);
    EXPECT_NE(svg.find("<title>U &amp; t</title>"), std::string::npos);
    std::size_t lines = 0;
    for (std::size_t at = svg.find("<polyline"); at != std::string::npos; at = svg.find("<polyline", at + 1)) ++lines;
    EXPECT_EQ(lines, 2u);
    c.series[0].y[1] = std::numeric_limits<double>::quiet_NaN();
    EXPECT_THROW(render(c), std::logic_error);  // never a NaN in a drawing
}

TEST(SvgChart, RangeBarsAndGrid) {
    RangeChart r{"swing", "spacing (m)", 1.2, {{"ch", 0.9, 1.5, "2.5", "6"}}};
    EXPECT_NE(render(r).find(">ch</text>"), std::string::npos);
    ShadedGrid g{"grid", "x", "y", "m", {1, 2}, {3}, {1.5, std::nullopt}};
    const std::string svg = render(g);
    EXPECT_NE(svg.find(">1.50</text>"), std::string::npos);
    EXPECT_NE(svg.find("no spacing works"), std::string::npos);
}
