// A drawing surface in sheet millimetres (origin at the sheet's lower-left corner, y up) over
// libharu. The one place that knows points, dash patterns in whole points and libharu's sticky
// errors: every call is checked and a failure becomes a BuildError naming what was being drawn.
// libharu types stay in canvas.cpp.
#pragma once

#include <memory>
#include <string>
#include <string_view>
#include <vector>

namespace bandforge::drawing {

struct Pt {
  double x = 0;
  double y = 0;
};

inline Pt operator+(Pt a, Pt b) { return {a.x + b.x, a.y + b.y}; }
inline Pt operator-(Pt a, Pt b) { return {a.x - b.x, a.y - b.y}; }
inline Pt operator*(Pt a, double k) { return {a.x * k, a.y * k}; }

/// Axis-aligned box in sheet millimetres.
struct Box {
  double x0 = 0, y0 = 0, x1 = 0, y1 = 0;
  double width() const { return x1 - x0; }
  double height() const { return y1 - y0; }
  bool overlaps(const Box& o, double gap = 0) const {
    return x0 < o.x1 + gap && o.x0 < x1 + gap && y0 < o.y1 + gap && o.y0 < y1 + gap;
  }
  bool contains(const Box& o) const { return o.x0 >= x0 && o.x1 <= x1 && o.y0 >= y0 && o.y1 <= y1; }
  Box grown(double d) const { return {x0 - d, y0 - d, x1 + d, y1 + d}; }
};

/// ISO 128 line types at the 0.5/0.25 mm pair (REFERENCE §5.5).
enum class Pen {
  frame,    ///< 0.7 mm continuous: sheet frame, centring marks
  wide,     ///< 01.2 continuous wide 0.5 mm: visible edges
  narrow,   ///< 01.1 continuous narrow 0.25 mm: dimension, extension, leader lines, tables
  hidden,   ///< 02.1 dashed narrow 0.25 mm: hidden edges
  centre,   ///< 04.1 long-dashed dotted narrow: centre lines
  phantom,  ///< 05.1 long-dashed double-dotted narrow: extreme positions of movable parts
  fine,     ///< 0.18 mm continuous: smooth (tangent) edges, plot grids
  plot,     ///< 0.35 mm continuous: plot curves
  plot_dashed,  ///< 0.35 mm dashed: second plot curve
};

enum class Align { left, centre, right };

/// Grey level or colour for fills and strokes (0 = black).
struct Ink {
  double r = 0, g = 0, b = 0;
};

class Canvas {
 public:
  /// `one_file_per_sheet`: every page is also drawn into a document of its own
  /// (finish_sheets()), for `build --sheets separate`.
  explicit Canvas(bool one_file_per_sheet = false);
  ~Canvas();
  Canvas(const Canvas&) = delete;
  Canvas& operator=(const Canvas&) = delete;

  void set_title(const std::string& title, const std::string& author, const std::string& subject);
  /// Starts a new page of the given sheet size [mm].
  void new_page(double width_mm, double height_mm);

  void pen(Pen p, Ink ink = {});
  void line(Pt a, Pt b);
  void polyline(const std::vector<Pt>& pts);
  /// Arc about `c` from angle a0 to a1 [rad], counter-clockwise when a1 > a0.
  void arc(Pt c, double r, double a0, double a1);
  void circle(Pt c, double r);
  void rect(const Box& b);
  void fill_rect(const Box& b, Ink ink);
  void fill_polygon(const std::vector<Pt>& pts, Ink ink = {});
  void fill_circle(Pt c, double r, Ink ink = {});

  /// Text of capital height `h` [mm] (ISO 3098 nominal height), baseline at `at`, rotated by
  /// `angle` [rad]; `align` refers to the baseline's start, middle or end.
  void text(Pt at, std::string_view utf8, double h, Align align = Align::left, double angle = 0,
            Ink ink = {});
  /// Advance width of `utf8` at capital height `h` [mm].
  double text_width(std::string_view utf8, double h) const;

  /// The finished PDF bytes. The canvas is unusable afterwards.
  std::vector<unsigned char> finish();
  /// With one_file_per_sheet: one finished PDF per page, in page order (empty otherwise).
  std::vector<std::vector<unsigned char>> finish_sheets();

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

/// The font's descender below the baseline as a fraction of the capital height.
constexpr double kDescent = 0.235 / 0.729;

}  // namespace bandforge::drawing
