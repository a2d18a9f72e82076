#include "drawing/canvas.hpp"

#include <hpdf.h>

#include <cmath>
#include <functional>
#include <string>
#include <unordered_map>
#include <vector>
#include <cstdio>
#include <numbers>

#include "src/errors.hpp"
#include "src/version.hpp"

#ifndef BANDFORGE_FONT_FILE
#define BANDFORGE_FONT_FILE "/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf"
#endif

namespace bandforge::drawing {
namespace {

constexpr double kPt = 72.0 / 25.4;        // points per millimetre
constexpr double kCapHeight = 0.729;       // DejaVu Sans capital height per em (729/1000)

// libharu keeps the first error and refuses everything after it, so the handler only records;
// the checks below turn the record into an exception at the call that failed (throwing through
// libharu's C frames would not unwind safely).
struct ErrorState {
  HPDF_STATUS code = 0;
  HPDF_STATUS detail = 0;
};

void on_error(HPDF_STATUS code, HPDF_STATUS detail, void* user) {
  auto* e = static_cast<ErrorState*>(user);
  if (e->code == 0) {
    e->code = code;
    e->detail = detail;
  }
}

// Dash patterns in whole points (libharu takes HPDF_UINT16, rejects zero-length elements).
// Element lengths after ISO 128 with d = 0.25 mm: dash 12d = 3 mm ≈ 9 pt, gap 3d ≈ 2 pt,
// long dash 24d = 6 mm ≈ 17 pt; the dot is the shortest libharu allows, 1 pt.
const HPDF_UINT16 kDashed[] = {9, 3};
const HPDF_UINT16 kChain[] = {17, 3, 1, 3};
const HPDF_UINT16 kPhantom[] = {17, 3, 1, 3, 1, 3};

}  // namespace

struct Canvas::Impl {
  // Owned here, not by Canvas: a constructor that throws half-way still frees the documents.
  ~Impl() {
    if (doc) HPDF_Free(doc);
    for (HPDF_Doc d : sheets) HPDF_Free(d);
  }
  ErrorState err;
  HPDF_Doc doc = nullptr;
  HPDF_Page page = nullptr;
  HPDF_Font font = nullptr;
  int page_count = 0;
  // With one file per sheet: every page is drawn a second time into a document of its own.
  bool split = false;
  std::vector<HPDF_Doc> sheets;
  HPDF_Page sheet_page = nullptr;
  HPDF_Font sheet_font = nullptr;
  std::string title, author, subject;
  /// HPDF_Font_TextWidth's width of each string measured so far [1/1000 em]: the layout
  /// measures the same words and lines again and again (wrap_lines, tables), and the font's
  /// glyph look-up was ~4 % of the drawing's time. The width is a sum of the glyphs' integer
  /// advances, so the remembered value is the one libharu would give again.
  mutable std::unordered_map<std::string, HPDF_UINT> widths;

  /// Runs `draw(page, font)` on the current page, and on its own sheet's page when split.
  template <class F>
  void each(F&& draw) {
    draw(need_page(), font);
    if (split && sheet_page) draw(sheet_page, sheet_font);
  }
  /// A new document set up for drawing: compression, UTF-8, the embedded font, the info.
  HPDF_Doc open(HPDF_Font* font_out);
  void info(HPDF_Doc d);

  void check(HPDF_STATUS status, const char* what) const {
    if (status == HPDF_OK && err.code == 0) return;
    char buf[160];
    std::snprintf(buf, sizeof buf, "PDF drawing: libharu failed while %s (error 0x%04X, detail %u)",
                  what, static_cast<unsigned>(err.code ? err.code : status),
                  static_cast<unsigned>(err.detail));
    throw BuildError(buf);
  }
  template <class H>
  H check_handle(H h, const char* what) const {
    if (h == nullptr || err.code != 0) check(HPDF_INVALID_OBJECT, what);
    return h;
  }
  HPDF_Page need_page() const {
    if (!page) throw BuildError("PDF drawing: internal error: drawing before the first page");
    return page;
  }
  static float pt(double mm) { return static_cast<float>(mm * kPt); }
  double font_size(double h) const { return h / kCapHeight * kPt; }
};

HPDF_Doc Canvas::Impl::open(HPDF_Font* font_out) {
  HPDF_Doc d = HPDF_New(on_error, &err);
  if (!d) throw BuildError("PDF drawing: libharu could not create a document (out of memory?)");
  if (!doc) doc = d;  // the first is the whole set; owned from here on
  else sheets.push_back(d);
  check(HPDF_SetCompressionMode(d, HPDF_COMP_ALL), "setting compression");
  check(HPDF_UseUTFEncodings(d), "enabling UTF-8 encodings");
  check(HPDF_SetCurrentEncoder(d, "UTF-8"), "selecting the UTF-8 encoder");
  const char* name = HPDF_LoadTTFontFromFile(d, BANDFORGE_FONT_FILE, HPDF_TRUE);
  if (!name || err.code != 0) {
    throw BuildError(std::string("PDF drawing: cannot load the font ") + BANDFORGE_FONT_FILE +
                     " (install the Debian package fonts-dejavu-core)");
  }
  *font_out = check_handle(HPDF_GetFont(d, name, "UTF-8"), "selecting the font");
  return d;
}

void Canvas::Impl::info(HPDF_Doc d) {
  // Only text fields: no creation or modification date, so equal input gives equal bytes.
  check(HPDF_SetInfoAttr(d, HPDF_INFO_CREATOR, "bandforge"), "writing document info");
  const std::string producer = std::string("bandforge ") + version() + " (libharu " HPDF_VERSION_TEXT ")";
  check(HPDF_SetInfoAttr(d, HPDF_INFO_PRODUCER, producer.c_str()), "writing the producer");
  if (!title.empty()) check(HPDF_SetInfoAttr(d, HPDF_INFO_TITLE, title.c_str()), "writing the title");
  if (!author.empty()) check(HPDF_SetInfoAttr(d, HPDF_INFO_AUTHOR, author.c_str()), "writing the author");
  if (!subject.empty()) check(HPDF_SetInfoAttr(d, HPDF_INFO_SUBJECT, subject.c_str()), "writing the subject");
}

Canvas::Canvas(bool one_file_per_sheet) : impl_(std::make_unique<Impl>()) {
  impl_->split = one_file_per_sheet;
  impl_->open(&impl_->font);
}

Canvas::~Canvas() = default;

void Canvas::set_title(const std::string& title, const std::string& author,
                       const std::string& subject) {
  auto& m = *impl_;
  m.title = title;
  m.author = author;
  m.subject = subject;
  m.info(m.doc);
}

void Canvas::new_page(double width_mm, double height_mm) {
  auto& m = *impl_;
  auto setup = [&](HPDF_Page pg) {
    m.check(HPDF_Page_SetWidth(pg, Impl::pt(width_mm)), "setting the page width");
    m.check(HPDF_Page_SetHeight(pg, Impl::pt(height_mm)), "setting the page height");
    m.check(HPDF_Page_SetLineCap(pg, HPDF_BUTT_END), "setting the line cap");
    m.check(HPDF_Page_SetLineJoin(pg, HPDF_ROUND_JOIN), "setting the line join");
  };
  m.page = m.check_handle(HPDF_AddPage(m.doc), "adding a page");
  setup(m.page);
  if (m.split) {
    HPDF_Doc d = m.open(&m.sheet_font);
    m.info(d);
    m.sheet_page = m.check_handle(HPDF_AddPage(d), "adding a page");
    setup(m.sheet_page);
  }
  ++m.page_count;
}

void Canvas::pen(Pen p, Ink ink) {
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font) {
    double width = 0.25;
    const HPDF_UINT16* dash = nullptr;
    HPDF_UINT n = 0;
    switch (p) {
      case Pen::frame: width = 0.7; break;
      case Pen::wide: width = 0.5; break;
      case Pen::narrow: width = 0.25; break;
      case Pen::hidden: width = 0.25; dash = kDashed; n = 2; break;
      case Pen::centre: width = 0.25; dash = kChain; n = 4; break;
      case Pen::phantom: width = 0.25; dash = kPhantom; n = 6; break;
      case Pen::fine: width = 0.18; break;
      case Pen::plot: width = 0.35; break;
      case Pen::plot_dashed: width = 0.35; dash = kDashed; n = 2; break;
    }
    m.check(HPDF_Page_SetLineWidth(pg, Impl::pt(width)), "setting a line width");
    m.check(HPDF_Page_SetDash(pg, dash, n, 0), "setting a dash pattern");
    m.check(HPDF_Page_SetRGBStroke(pg, static_cast<float>(ink.r), static_cast<float>(ink.g),
                                   static_cast<float>(ink.b)),
            "setting the stroke colour");
  });
}

void Canvas::line(Pt a, Pt b) { polyline({a, b}); }

void Canvas::polyline(const std::vector<Pt>& pts) {
  if (pts.size() < 2) return;  // never stroke an empty path: the error would stick
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font) {
    m.check(HPDF_Page_MoveTo(pg, Impl::pt(pts[0].x), Impl::pt(pts[0].y)), "starting a line");
    for (size_t i = 1; i < pts.size(); ++i) {
      m.check(HPDF_Page_LineTo(pg, Impl::pt(pts[i].x), Impl::pt(pts[i].y)), "drawing a line");
    }
    m.check(HPDF_Page_Stroke(pg), "stroking a line");
  });
}

namespace {

// Cubic Bézier segments (at most 90° each) approximating the arc; the standard control-point
// distance k = 4/3·tan(Δ/4) keeps the radial error below 3e-4·r.
template <class Fn>
void bezier_arc(Pt c, double r, double a0, double a1, Fn&& curve_to) {
  const double sweep = a1 - a0;
  const int n = std::max(1, static_cast<int>(std::ceil(std::abs(sweep) / (std::numbers::pi / 2) - 1e-9)));
  const double d = sweep / n;
  const double k = 4.0 / 3.0 * std::tan(d / 4.0);
  for (int i = 0; i < n; ++i) {
    const double t0 = a0 + i * d, t1 = t0 + d;
    const Pt p0{c.x + r * std::cos(t0), c.y + r * std::sin(t0)};
    const Pt p3{c.x + r * std::cos(t1), c.y + r * std::sin(t1)};
    const Pt p1{p0.x - k * r * std::sin(t0), p0.y + k * r * std::cos(t0)};
    const Pt p2{p3.x + k * r * std::sin(t1), p3.y - k * r * std::cos(t1)};
    curve_to(p1, p2, p3);
  }
}

}  // namespace

void Canvas::arc(Pt c, double r, double a0, double a1) {
  if (r <= 0 || a1 == a0) return;
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font) {
    m.check(HPDF_Page_MoveTo(pg, Impl::pt(c.x + r * std::cos(a0)), Impl::pt(c.y + r * std::sin(a0))),
            "starting an arc");
    bezier_arc(c, r, a0, a1, [&](Pt p1, Pt p2, Pt p3) {
      m.check(HPDF_Page_CurveTo(pg, Impl::pt(p1.x), Impl::pt(p1.y), Impl::pt(p2.x), Impl::pt(p2.y),
                                Impl::pt(p3.x), Impl::pt(p3.y)),
              "drawing an arc");
    });
    m.check(HPDF_Page_Stroke(pg), "stroking an arc");
  });
}

void Canvas::circle(Pt c, double r) { arc(c, r, 0, 2 * std::numbers::pi); }

void Canvas::rect(const Box& b) {
  polyline({{b.x0, b.y0}, {b.x1, b.y0}, {b.x1, b.y1}, {b.x0, b.y1}, {b.x0, b.y0}});
}

void Canvas::fill_rect(const Box& b, Ink ink) {
  fill_polygon({{b.x0, b.y0}, {b.x1, b.y0}, {b.x1, b.y1}, {b.x0, b.y1}}, ink);
}

void Canvas::fill_polygon(const std::vector<Pt>& pts, Ink ink) {
  if (pts.size() < 3) return;
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font) {
    m.check(HPDF_Page_SetRGBFill(pg, static_cast<float>(ink.r), static_cast<float>(ink.g),
                                 static_cast<float>(ink.b)),
            "setting the fill colour");
    m.check(HPDF_Page_MoveTo(pg, Impl::pt(pts[0].x), Impl::pt(pts[0].y)), "starting a fill");
    for (size_t i = 1; i < pts.size(); ++i) {
      m.check(HPDF_Page_LineTo(pg, Impl::pt(pts[i].x), Impl::pt(pts[i].y)), "outlining a fill");
    }
    m.check(HPDF_Page_ClosePath(pg), "closing a fill");
    m.check(HPDF_Page_Fill(pg), "filling");
  });
}

void Canvas::fill_circle(Pt c, double r, Ink ink) {
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font) {
    m.check(HPDF_Page_SetRGBFill(pg, static_cast<float>(ink.r), static_cast<float>(ink.g),
                                 static_cast<float>(ink.b)),
            "setting the fill colour");
    m.check(HPDF_Page_MoveTo(pg, Impl::pt(c.x + r), Impl::pt(c.y)), "starting a dot");
    bezier_arc(c, r, 0, 2 * std::numbers::pi, [&](Pt p1, Pt p2, Pt p3) {
      m.check(HPDF_Page_CurveTo(pg, Impl::pt(p1.x), Impl::pt(p1.y), Impl::pt(p2.x), Impl::pt(p2.y),
                                Impl::pt(p3.x), Impl::pt(p3.y)),
              "drawing a dot");
    });
    m.check(HPDF_Page_Fill(pg), "filling a dot");
  });
}

double Canvas::text_width(std::string_view utf8, double h) const {
  if (utf8.empty()) return 0;
  const auto& m = *impl_;
  std::string key(utf8);
  auto it = m.widths.find(key);
  if (it == m.widths.end()) {
    const HPDF_TextWidth w = HPDF_Font_TextWidth(
        m.font, reinterpret_cast<const HPDF_BYTE*>(utf8.data()), static_cast<HPDF_UINT>(utf8.size()));
    m.check(HPDF_OK, "measuring text");
    it = m.widths.emplace(std::move(key), w.width).first;
  }
  return it->second / 1000.0 * h / kCapHeight;
}

void Canvas::text(Pt at, std::string_view utf8, double h, Align align, double angle, Ink ink) {
  if (utf8.empty()) return;
  auto& m = *impl_;
  m.each([&](HPDF_Page pg, HPDF_Font font) {
    double shift = 0;
    if (align != Align::left) {
      shift = text_width(utf8, h) * (align == Align::centre ? 0.5 : 1.0);
    }
    const double c = std::cos(angle), s = std::sin(angle);
    const Pt origin{at.x - shift * c, at.y - shift * s};
    const std::string str(utf8);
    m.check(HPDF_Page_SetRGBFill(pg, static_cast<float>(ink.r), static_cast<float>(ink.g),
                                 static_cast<float>(ink.b)),
            "setting the text colour");
    m.check(HPDF_Page_BeginText(pg), "beginning text");
    m.check(HPDF_Page_SetFontAndSize(pg, font, static_cast<float>(m.font_size(h))), "setting the font");
    m.check(HPDF_Page_SetTextMatrix(pg, static_cast<float>(c), static_cast<float>(s),
                                    static_cast<float>(-s), static_cast<float>(c),
                                    Impl::pt(origin.x), Impl::pt(origin.y)),
            "placing text");
    m.check(HPDF_Page_ShowText(pg, str.c_str()), "writing text");
    m.check(HPDF_Page_EndText(pg), "ending text");
  });
}

namespace {

std::vector<unsigned char> save(HPDF_Doc d, const std::function<void(HPDF_STATUS, const char*)>& check) {
  check(HPDF_SaveToStream(d), "writing the PDF");
  HPDF_UINT32 size = HPDF_GetStreamSize(d);
  std::vector<unsigned char> bytes(size);
  HPDF_UINT32 got = size;
  check(HPDF_ReadFromStream(d, bytes.data(), &got), "reading the PDF back");
  if (got != size) throw BuildError("PDF drawing: libharu returned a short PDF stream");
  return bytes;
}

}  // namespace

std::vector<unsigned char> Canvas::finish() {
  auto& m = *impl_;
  auto check = [&](HPDF_STATUS st, const char* what) { m.check(st, what); };
  std::vector<unsigned char> bytes = save(m.doc, check);
  HPDF_Free(m.doc);
  m.doc = nullptr;
  m.page = nullptr;
  return bytes;
}

std::vector<std::vector<unsigned char>> Canvas::finish_sheets() {
  auto& m = *impl_;
  auto check = [&](HPDF_STATUS st, const char* what) { m.check(st, what); };
  std::vector<std::vector<unsigned char>> out;
  for (HPDF_Doc& d : m.sheets) {
    out.push_back(save(d, check));
    HPDF_Free(d);
    d = nullptr;
  }
  m.sheets.clear();
  m.sheet_page = nullptr;
  return out;
}

}  // namespace bandforge::drawing
