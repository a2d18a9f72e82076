// The PDF drawing, checked by independent readers: poppler (pdfinfo, pdffonts, pdftotext,
// pdftoppm), qpdf, and `bandforge solve --json` for the values. Sheet sizes come from ISO 216
// (REFERENCE §5.1) converted to points here, not from the drawing code.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <array>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "drawing/drawing.hpp"
#include "geometry/brake_model.hpp"
#include "geometry/flat_patterns.hpp"
#include "geometry/projection.hpp"
#include "src/design_reader.hpp"
#include "src/fits.hpp"
#include "src/errors.hpp"
#include "src/mechanics.hpp"
#include "tests/support.hpp"

// The drum sheet's diameters are checked against the STEP file as OCCT itself reads it back.
#include <BRepAdaptor_Surface.hxx>
#include <IFSelect_ReturnStatus.hxx>
#include <STEPCAFControl_Reader.hxx>
#include <TCollection_AsciiString.hxx>
#include <TDF_LabelSequence.hxx>
#include <TDataStd_Name.hxx>
#include <TDocStd_Document.hxx>
#include <TopExp_Explorer.hxx>
#include <TopoDS.hxx>
#include <XCAFDoc_DocumentTool.hxx>
#include <XCAFDoc_ShapeTool.hxx>
#include <gp_Cylinder.hxx>

#include "geometry/xcaf_document.hpp"

namespace bandforge::drawing {
namespace {

namespace fs = std::filesystem;

const std::string kSource = BANDFORGE_SOURCE_DIR;
const std::string kExample = kSource + "/examples/bin-hoist.toml";

using test::scratch_root;
using test::slurp;
using test::Shell;

// Runs a shell command, stdout captured, stderr discarded (poppler warns about libharu's
// ToUnicode CMap on every call; TOOLCHAIN.md).
Shell run(const std::string& cmd) { return test::run(cmd + " 2>/dev/null"); }

std::string quote(const fs::path& p) {
  std::string out;  // appended piecewise: GCC 12 warns falsely (-Wrestrict) on "literal" + string
  out.append(1, '\'').append(p.string()).append(1, '\'');
  return out;
}

// One drawn design: the model built once per design and kept for the tests that share it.
struct Drawn {
  Design design;
  Solution solution;
  std::unique_ptr<geom::BrakeModel> applied, released;
  CutList cut;  ///< geom::cut_list() of the applied model, as `build` gives the drawing
  SheetPlan plan;
  fs::path pdf;
};

std::unique_ptr<Drawn> draw(const std::string& design_file, const std::string& out_name,
                            UnitSystem units = UnitSystem::si, const std::string& sheet = "") {
  auto d = std::make_unique<Drawn>();
  d->design = read_design_file(design_file);
  if (!sheet.empty()) d->design.drawing.sheet = sheet;
  d->solution = solve(d->design);
  if (!d->design.concept_arms.present) {
    d->applied = std::make_unique<geom::BrakeModel>(geom::build_brake(d->design, d->solution, {}));
    geom::BuildOptions rel;
    rel.released = true;
    d->released = std::make_unique<geom::BrakeModel>(geom::build_brake(d->design, d->solution, rel));
    d->cut = geom::cut_list(d->design, d->solution, *d->applied);
  }
  d->pdf = scratch_root() / out_name;
  d->plan = write_drawing(d->design, d->solution, d->applied.get(), d->released.get(), d->cut, units,
                          d->pdf.string());
  return d;
}

const Drawn& example() {
  static std::unique_ptr<Drawn> d = draw(kExample, "bin-hoist.pdf");
  return *d;
}

std::string text_of(const fs::path& pdf, int page = 0, bool layout = false) {
  std::string cmd = "pdftotext";
  if (layout) cmd += " -layout";
  if (page > 0) cmd += " -f " + std::to_string(page) + " -l " + std::to_string(page);
  return run(cmd + " " + quote(pdf) + " -").out;
}

// ---- sheet ----------------------------------------------------------------------------------

// ISO 216 trimmed sizes in mm (REFERENCE §5.1), 1 in = 25.4 mm = 72 pt.
double pt(double mm) { return mm / 25.4 * 72.0; }

void expect_page_sizes(const fs::path& pdf, int pages, double w_mm, double h_mm) {
  const Shell info = run("pdfinfo -f 1 -l 99 " + quote(pdf));
  ASSERT_EQ(info.status, 0);
  std::smatch m;
  ASSERT_TRUE(std::regex_search(info.out, m, std::regex(R"(Pages:\s+(\d+))")));
  EXPECT_EQ(std::stoi(m[1]), pages);
  const std::regex size(R"(Page\s+(\d+) size:\s+([\d.]+) x ([\d.]+) pts)");
  int seen = 0;
  for (auto it = std::sregex_iterator(info.out.begin(), info.out.end(), size); it != std::sregex_iterator(); ++it) {
    ++seen;
    EXPECT_NEAR(std::stod((*it)[2]), pt(w_mm), 0.01) << "page " << (*it)[1];
    EXPECT_NEAR(std::stod((*it)[3]), pt(h_mm), 0.01) << "page " << (*it)[1];
  }
  EXPECT_EQ(seen, pages);
}

TEST(DrawingSheet, DefaultIsA3LandscapeOnEveryPage) {
  const Drawn& d = example();
  EXPECT_EQ(d.plan.sheet, "A3");
  EXPECT_TRUE(d.plan.assembly);
  ASSERT_GE(d.plan.pages, 2);  // assembly drawing + calculation sheet(s)
  expect_page_sizes(d.pdf, d.plan.pages, 420, 297);  // 1190.55 × 841.89 pt
}

TEST(DrawingSheet, A4IsPortraitAndA2Landscape) {
  auto a4 = draw(kExample, "a4.pdf", UnitSystem::si, "A4");
  expect_page_sizes(a4->pdf, a4->plan.pages, 210, 297);
  auto a2 = draw(kExample, "a2.pdf", UnitSystem::si, "A2");
  expect_page_sizes(a2->pdf, a2->plan.pages, 594, 420);
  // A larger sheet never gets a smaller scale (ISO 5455 steps).
  EXPECT_GE(static_cast<double>(a2->plan.scale_num) / a2->plan.scale_den,
            static_cast<double>(example().plan.scale_num) / example().plan.scale_den);
  EXPECT_GE(static_cast<double>(example().plan.scale_num) / example().plan.scale_den,
            static_cast<double>(a4->plan.scale_num) / a4->plan.scale_den);
}

TEST(DrawingSheet, ScaleIsAnIso5455Scale) {
  // REFERENCE §5.4: full size and reductions 1:2, 1:5, 1:10, 1:20, 1:50, 1:100 ...
  const SheetPlan& p = example().plan;
  EXPECT_EQ(p.scale_num, 1);
  const std::vector<int> iso = {1, 2, 5, 10, 20, 50, 100, 200, 500, 1000};
  EXPECT_NE(std::find(iso.begin(), iso.end(), p.scale_den), iso.end()) << p.scale_den;
  EXPECT_NE(text_of(example().pdf, 1).find(std::to_string(p.scale_num) + ":" + std::to_string(p.scale_den)),
            std::string::npos);
}

TEST(DrawingSheet, QpdfFindsNoErrors) {
  const Shell r = run("qpdf --check " + quote(example().pdf));
  EXPECT_EQ(r.status, 0) << r.out;
  EXPECT_NE(r.out.find("No syntax or stream encoding errors"), std::string::npos) << r.out;
}

TEST(DrawingSheet, FontIsEmbedded) {
  const Shell r = run("pdffonts " + quote(example().pdf));
  ASSERT_EQ(r.status, 0);
  // name, type, encoding, emb, sub, uni: the DejaVu row must say emb = yes.
  std::smatch m;
  ASSERT_TRUE(std::regex_search(r.out, m, std::regex(R"((\S*DejaVuSans\S*)\s+CID TrueType\s+\S+\s+(yes|no))")))
      << r.out;
  EXPECT_EQ(m[2], "yes") << r.out;
  // Only that font: nothing falls back to a non-embedded base-14 font.
  EXPECT_EQ(r.out.find(" no  "), std::string::npos) << r.out;
}

// ---- text -----------------------------------------------------------------------------------

TEST(DrawingText, TitleBlockCarriesTheProjectFields) {
  const Drawn& d = example();
  const std::string page1 = text_of(d.pdf, 1);
  const Project& p = d.design.project;
  for (const std::string& field : {p.title, p.number, p.owner, p.creator, p.approver, p.date}) {
    ASSERT_FALSE(field.empty());
    EXPECT_NE(page1.find(field), std::string::npos) << field;
  }
  // ISO 7200 field labels and the values that are not in [project].
  for (const char* s : {"Identification number", "Rev.", "Date of issue", "Sheet", "Scale", "Units",
                        "Projection", "Assembly drawing"}) {
    EXPECT_NE(page1.find(s), std::string::npos) << s;
  }
  // Sheet n of m (pdftotext may drop the spaces around the slash).
  const std::string m = std::to_string(d.plan.pages);
  EXPECT_TRUE(std::regex_search(page1, std::regex("\\b1\\s*/\\s*" + m + "\\b"))) << "sheet 1 / " << m;
  const std::string last = text_of(d.pdf, d.plan.pages);
  EXPECT_TRUE(std::regex_search(last, std::regex("\\b" + m + "\\s*/\\s*" + m + "\\b"))) << "sheet " << m;
  EXPECT_NE(last.find("Calculation sheet"), std::string::npos);
}

TEST(DrawingText, CautionOnEveryPage) {
  const Drawn& d = example();
  for (int page = 1; page <= d.plan.pages; ++page) {
    const std::string t = text_of(d.pdf, page);
    EXPECT_NE(t.find("CAUTION"), std::string::npos) << "page " << page;
    EXPECT_NE(t.find("licensed engineer"), std::string::npos) << "page " << page;
  }
}

TEST(DrawingText, DrumDiameterCarriesTheDiameterSign) {
  // examples/bin-hoist.toml: [drum] diameter = "400 mm".
  EXPECT_NE(text_of(example().pdf, 1).find("Ø400"), std::string::npos);
}

Shell solve_json(const std::string& design) {
  return run(std::string(BANDFORGE_EXE) + " solve --json " + quote(design));
}

// The number printed after `label` on one line of pdftotext -layout output, `index`-th.
std::vector<std::string> numbers_after(const std::string& text, const std::string& label) {
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) {
    const size_t at = line.find(label);
    if (at == std::string::npos) continue;
    std::vector<std::string> out;
    const std::string rest = line.substr(at + label.size());
    const std::regex num(R"((-?\d+(?:\.\d+)?))");
    for (auto it = std::sregex_iterator(rest.begin(), rest.end(), num); it != std::sregex_iterator(); ++it) {
      out.push_back((*it)[1]);
    }
    return out;
  }
  return {};
}

// Equal at the printed precision: the JSON value rounds to the printed digits.
void expect_printed(const std::string& printed, double json_value, const std::string& what) {
  const size_t dot = printed.find('.');
  const int decimals = dot == std::string::npos ? 0 : static_cast<int>(printed.size() - dot - 1);
  const double half_ulp = 0.5 * std::pow(10.0, -decimals);
  EXPECT_LE(std::abs(std::stod(printed) - json_value), half_ulp * (1 + 1e-9))
      << what << ": printed " << printed << ", solve --json " << json_value;
}

TEST(DrawingText, ResultsEqualSolveJson) {
  const Shell r = solve_json(kExample);
  ASSERT_EQ(r.status, 0) << r.out;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  const std::string primary = j.at("primary");
  const std::string reverse = primary == "a_tight" ? "b_tight" : "a_tight";
  const std::string page1 = text_of(example().pdf, 1, true);

  const auto wrap = numbers_after(page1, "Wrap angle");
  ASSERT_GE(wrap.size(), 1u);
  expect_printed(wrap[0], j.at("wrap_angle_deg").get<double>(), "wrap angle [°]");

  struct Row {
    const char* label;
    const char* key;
    double scale;  // SI → printed unit
  };
  const Row rows[] = {
      {"Tight tension P1", "tension_tight_N", 1.0},
      {"Slack tension P2", "tension_slack_N", 1.0},
      {"Braking torque T", "torque_Nm", 1.0},
      {"Lever force F", "lever_force_N", 1.0},
      {"Max lining pressure", "pressure_max_Pa", 1e-6},  // printed in MPa
      {"Band stress", "band_stress_Pa", 1e-6},
  };
  for (const Row& row : rows) {
    const auto v = numbers_after(page1, row.label);
    ASSERT_GE(v.size(), 2u) << row.label;
    expect_printed(v[0], j["directions"][primary][row.key].get<double>() * row.scale,
                   std::string(row.label) + " (design rotation)");
    expect_printed(v[1], j["directions"][reverse][row.key].get<double>() * row.scale,
                   std::string(row.label) + " (reverse)");
  }
}

TEST(DrawingText, WrapAngleIsDimensionedOnTheView) {
  // The angular dimension prints the same value as the results table, so it appears at least
  // twice on page 1 (dimension, results table twice, subtitle).
  const Shell r = solve_json(kExample);
  ASSERT_EQ(r.status, 0);
  const double wrap = nlohmann::json::parse(r.out).at("wrap_angle_deg").get<double>();
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f°", wrap);
  const std::string page1 = text_of(example().pdf, 1);
  size_t count = 0;
  for (size_t at = page1.find(buf); at != std::string::npos; at = page1.find(buf, at + 1)) ++count;
  EXPECT_GE(count, 4u) << buf;
}

TEST(DrawingText, UsUnitsGiveInchesAndPoundForce) {
  auto us = draw(kExample, "us.pdf", UnitSystem::us);
  const std::string page1 = text_of(us->pdf, 1);
  // 400 mm = 15.748 in (exact inch 25.4 mm), printed to 0.01 in.
  EXPECT_NE(page1.find("Ø15.75"), std::string::npos);
  EXPECT_NE(page1.find("lbf"), std::string::npos);
  EXPECT_EQ(page1.find(" N·m"), std::string::npos);
  const std::string page2 = text_of(us->pdf, 2);
  EXPECT_NE(page2.find("lbf"), std::string::npos);
  EXPECT_NE(page2.find("psi"), std::string::npos);
}

// Words on a page with the box of their capitals and digits. pdftotext -bbox gives the font's
// em box, taller than the ink; DejaVu Sans metrics (from the font's own tables): ascent 0.928,
// descent 0.235, capital height 0.729 em.
struct Word {
  double x0, y0, x1, y1;
  std::string text;
};

std::vector<Word> cap_boxes(const fs::path& pdf, int page) {
  const std::string html =
      run("pdftotext -bbox -f " + std::to_string(page) + " -l " + std::to_string(page) + " " + quote(pdf) + " -").out;
  const std::regex word(R"re(<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</word>)re");
  const double asc = 0.928, desc = 0.235, cap = 0.729, em = asc + desc;
  std::vector<Word> out;
  for (auto it = std::sregex_iterator(html.begin(), html.end(), word); it != std::sregex_iterator(); ++it) {
    double x0 = std::stod((*it)[1]), y0 = std::stod((*it)[2]), x1 = std::stod((*it)[3]), y1 = std::stod((*it)[4]);
    const std::string t = (*it)[5];
    if (t.size() >= 3 && (y1 - y0) > 1.5 * (x1 - x0)) {  // set vertically: the em box runs along x
      const double h = x1 - x0;
      x0 += desc / em * h;
      x1 = x0 + cap / em * h;
    } else {
      const double h = y1 - y0, base = y1 - desc / em * h;
      y0 = base - cap / em * h;
      y1 = base;
    }
    out.push_back({x0, y0, x1, y1, t});
  }
  return out;
}

// Capital-height boxes of two words may touch but not overlap by more than 0.3 pt either way.
void expect_no_two_words_overlap(const std::vector<Word>& words) {
  for (size_t i = 0; i < words.size(); ++i) {
    for (size_t j = i + 1; j < words.size(); ++j) {
      const Word& a = words[i];
      const Word& b = words[j];
      const double ix = std::min(a.x1, b.x1) - std::max(a.x0, b.x0);
      const double iy = std::min(a.y1, b.y1) - std::max(a.y0, b.y0);
      EXPECT_FALSE(ix > 0.3 && iy > 0.3) << "'" << a.text << "' overlaps '" << b.text << "'";
    }
  }
}

TEST(DrawingText, NoTwoWordsOverlapOnTheAssemblySheet) {
  // Dimension values, labels, balloons, tables and the title block: no text over other text.
  const auto us = draw(kExample, "overlap-us.pdf", UnitSystem::us);
  const auto a4 = draw(kExample, "overlap-a4.pdf", UnitSystem::si, "A4");
  for (const fs::path& pdf : {example().pdf, us->pdf, a4->pdf}) {
    SCOPED_TRACE(pdf.string());
    const auto words = cap_boxes(pdf, 1);
    ASSERT_GT(words.size(), 100u);
    expect_no_two_words_overlap(words);
  }
}

// ---- rendering ------------------------------------------------------------------------------

// A greyscale image from pdftoppm (-gray: binary PGM).
struct Gray {
  int w = 0, h = 0;
  std::vector<unsigned char> px;
  int at(int x, int y) const { return x < 0 || y < 0 || x >= w || y >= h ? 255 : px[static_cast<size_t>(y) * w + x]; }
};

Gray render(const fs::path& pdf, int page, int dpi) {
  const fs::path stem = scratch_root() / ("render-" + std::to_string(page) + "-" + std::to_string(dpi));
  const Shell r = run("pdftoppm -gray -r " + std::to_string(dpi) + " -f " + std::to_string(page) + " -l " +
                    std::to_string(page) + " -singlefile " + quote(pdf) + " " + quote(stem));
  Gray g;
  if (r.status != 0) return g;
  std::ifstream in(stem.string() + ".pgm", std::ios::binary);
  std::string magic;
  int maxval = 0;
  in >> magic >> g.w >> g.h >> maxval;
  in.get();
  g.px.resize(static_cast<size_t>(g.w) * g.h);
  in.read(reinterpret_cast<char*>(g.px.data()), static_cast<std::streamsize>(g.px.size()));
  return g;
}

// Darkest pixel within `r` pixels of a sheet point given in mm from the lower-left corner.
int darkest_near(const Gray& g, double x_mm, double y_mm, double sheet_h_mm, int dpi, int r) {
  const double k = dpi / 25.4;
  const int cx = static_cast<int>(std::lround(x_mm * k)), cy = static_cast<int>(std::lround((sheet_h_mm - y_mm) * k));
  int best = 255;
  for (int dy = -r; dy <= r; ++dy)
    for (int dx = -r; dx <= r; ++dx) best = std::min(best, g.at(cx + dx, cy + dy));
  return best;
}

TEST(DrawingRender, DrumOutlineIsInkAtItsScaledRadius) {
  const Drawn& d = example();
  const int dpi = 150;
  const Gray g = render(d.pdf, 1, dpi);
  ASSERT_GT(g.w, 0);
  const double scale = static_cast<double>(d.plan.scale_num) / d.plan.scale_den;
  // Drum radius from the design file (400 mm friction diameter), scaled to the sheet.
  const double r_mm = d.design.drum.diameter / 2 * 1000 * scale;
  int inked = 0;
  for (int i = 0; i < 72; ++i) {
    const double a = i * 2 * M_PI / 72 + 0.01;
    const int v = darkest_near(g, d.plan.drum_x_mm + r_mm * std::cos(a), d.plan.drum_y_mm + r_mm * std::sin(a),
                               d.plan.height_mm, dpi, 1);
    inked += v < 128;
  }
  // The rim is a visible edge all round in the front view (the drum face is in front of the band).
  EXPECT_EQ(inked, 72);
  // Control: inside the bore, off the centre lines, the paper is blank.
  const double bore = d.design.drum.bore / 2 * 1000 * scale;
  EXPECT_GT(darkest_near(g, d.plan.drum_x_mm + 0.5 * bore * std::cos(0.8), d.plan.drum_y_mm + 0.5 * bore * std::sin(0.8),
                         d.plan.height_mm, dpi, 1),
            200);
}

TEST(DrawingRender, TitleBlockIsClearOfViewGeometry) {
  const Drawn& d = example();
  const double* tb = d.plan.title_block;
  const double* vb = d.plan.views_box;
  // The views' geometry does not reach the title block ...
  EXPECT_TRUE(vb[2] < tb[0] || vb[0] > tb[2] || vb[3] < tb[1] || vb[1] > tb[3])
      << "views " << vb[0] << " " << vb[1] << " " << vb[2] << " " << vb[3];
  // ... and on the rendered page nothing crosses the white margins around it: the strip left of
  // the title block and the gap between it and the caution box above are blank.
  const int dpi = 150;
  const Gray g = render(d.pdf, 1, dpi);
  const double k = dpi / 25.4;
  int ink = 0;
  for (double y = tb[1] + 1; y < tb[3] - 1; y += 0.2) {
    for (double x = tb[0] - 3.0; x < tb[0] - 1.0; x += 0.2) ink += darkest_near(g, x, y, d.plan.height_mm, dpi, 0) < 128;
  }
  for (double x = tb[0] + 1; x < tb[2] - 1; x += 0.2) {
    for (double y = tb[3] + 0.8; y < tb[3] + 2.2; y += 0.2) ink += darkest_near(g, x, y, d.plan.height_mm, dpi, 0) < 128;
  }
  (void)k;
  EXPECT_EQ(ink, 0);
}

// ---- reproducibility and failures -------------------------------------------------------------

TEST(DrawingOutput, SameInputGivesTheSameBytes) {
  const Drawn& d = example();
  const fs::path again = scratch_root() / "again.pdf";
  write_drawing(d.design, d.solution, d.applied.get(), d.released.get(), d.cut, UnitSystem::si,
                again.string());
  EXPECT_EQ(slurp(d.pdf), slurp(again));
  // No clock time in the file (libharu writes no CreationDate/ID unless asked).
  const std::string bytes = slurp(d.pdf);
  EXPECT_EQ(bytes.find("/CreationDate"), std::string::npos);
  EXPECT_EQ(bytes.find("/ModDate"), std::string::npos);
  EXPECT_EQ(bytes.find("/ID"), std::string::npos);
}

TEST(DrawingOutput, BuildCommandWritesTheSamePdfInTwoProcesses) {
  const fs::path a = scratch_root() / "proc-a", b = scratch_root() / "proc-b";
  const std::string exe = BANDFORGE_EXE;
  ASSERT_EQ(run(exe + " build " + quote(kExample) + " -o " + quote(a)).status, 0);
  ASSERT_EQ(run(exe + " build " + quote(kExample) + " -o " + quote(b)).status, 0);
  const std::string number = example().design.project.number;
  ASSERT_TRUE(fs::exists(a / (number + ".pdf")));
  EXPECT_EQ(slurp(a / (number + ".pdf")), slurp(b / (number + ".pdf")));
  EXPECT_EQ(slurp(a / (number + ".pdf")), slurp(example().pdf));
}

// `build - -o OUT` reads the design from standard input (through the hand-over to bandforge-cad)
// and writes the same files as `build FILE -o OUT`: byte for byte, but for the PDF, whose
// calculation sheet names the design file it read ("(design file <stdin>)").
TEST(DrawingOutput, BuildFromStandardInputWritesTheSameFiles) {
  const fs::path a = scratch_root() / "stdin-file", b = scratch_root() / "stdin-pipe";
  const std::string exe = BANDFORGE_EXE;
  ASSERT_EQ(run(exe + " build " + quote(kExample) + " -o " + quote(a)).status, 0);
  ASSERT_EQ(run(exe + " build - -o " + quote(b) + " < " + quote(kExample)).status, 0);
  const std::string number = example().design.project.number;
  int files = 0;
  for (const auto& e : fs::recursive_directory_iterator(a)) {
    if (!e.is_regular_file() || e.path().extension() == ".pdf") continue;
    ++files;
    const fs::path other = b / fs::relative(e.path(), a);
    ASSERT_TRUE(fs::exists(other)) << other;
    EXPECT_TRUE(slurp(e.path()) == slurp(other)) << fs::relative(e.path(), a) << " differs";
  }
  EXPECT_GE(files, 3);  // STEP, cut list and at least one DXF
  std::string from_file = text_of(a / (number + ".pdf"));
  const std::string from_stdin = text_of(b / (number + ".pdf"));
  ASSERT_NE(from_stdin.find("<stdin>"), std::string::npos) << "the sheet names the input";
  const std::string name = "(design file " + fs::path(kExample).filename().string() + ")";
  for (std::size_t at; (at = from_file.find(name)) != std::string::npos;) {
    from_file.replace(at, name.size(), "(design file <stdin>)");
  }
  EXPECT_TRUE(from_file == from_stdin) << "the PDF's text differs beyond the design file's name";
}

TEST(DrawingOutput, LayoutThatCannotFitNamesSheetAndScale) {
  Design d = example().design;
  d.drawing.sheet = "A4";
  d.drawing.scale_num = 1;
  d.drawing.scale_den = 1;  // a 1 m brake at full size on A4
  const fs::path out = scratch_root() / "nofit.pdf";
  try {
    write_drawing(d, example().solution, example().applied.get(), example().released.get(), example().cut,
                  UnitSystem::si, out.string());
    FAIL() << "expected a BuildError";
  } catch (const BuildError& e) {
    const std::string msg = e.what();
    EXPECT_NE(msg.find("A4"), std::string::npos) << msg;
    EXPECT_NE(msg.find("1:1"), std::string::npos) << msg;
    EXPECT_EQ(e.code(), Exit::cannot_build);
  }
  EXPECT_FALSE(fs::exists(out));
  EXPECT_FALSE(fs::exists(out.string() + ".tmp"));
}

TEST(DrawingOutput, UnwritablePathIsAnIoErrorAndLeavesNothing) {
  const fs::path out = scratch_root() / "no-such-dir" / "x.pdf";
  EXPECT_THROW(write_drawing(example().design, example().solution, example().applied.get(),
                             example().released.get(), example().cut, UnitSystem::si, out.string()),
               IoError);
  EXPECT_FALSE(fs::exists(out));
}

// ---- cut list on the calculation sheet ----------------------------------------------------------
// The independent reference is OUTDIR/fab/cutlist.csv as the fab code writes it in the same
// `bandforge build`; the sheet is read back with pdftotext -layout.

// RFC 4180 records: quoted fields with doubled quotes, '\n' line ends.
std::vector<std::vector<std::string>> parse_csv(const std::string& text) {
  std::vector<std::vector<std::string>> out;
  std::vector<std::string> record;
  std::string field;
  bool quoted = false;
  for (size_t i = 0; i < text.size(); ++i) {
    const char ch = text[i];
    if (quoted) {
      if (ch == '"' && i + 1 < text.size() && text[i + 1] == '"') {
        field += '"';
        ++i;
      } else if (ch == '"') {
        quoted = false;
      } else {
        field += ch;
      }
    } else if (ch == '"') {
      quoted = true;
    } else if (ch == ',') {
      record.push_back(field);
      field.clear();
    } else if (ch == '\n') {
      record.push_back(field);
      field.clear();
      out.push_back(record);
      record.clear();
    } else {
      field += ch;
    }
  }
  return out;
}

struct CsvRow {
  std::map<std::string, std::string> f;
  const std::string& operator[](const std::string& k) const { return f.at(k); }
};

std::vector<CsvRow> read_cutlist(const fs::path& csv) {
  const auto records = parse_csv(slurp(csv));
  std::vector<CsvRow> rows;
  if (records.empty()) return rows;
  for (size_t r = 1; r < records.size(); ++r) {
    CsvRow row;
    for (size_t i = 0; i < records[0].size() && i < records[r].size(); ++i) row.f[records[0][i]] = records[r][i];
    rows.push_back(row);
  }
  return rows;
}

double half_unit(const std::string& printed) {
  const size_t dot = printed.find('.');
  const int decimals = dot == std::string::npos ? 0 : static_cast<int>(printed.size() - dot - 1);
  return 0.5 * std::pow(10.0, -decimals);
}

// Both are roundings of one value: the sheet's `printed` (in the display unit) and the CSV's
// `csv` (mm or kg, `k` converts to the display unit), so they differ by at most the two half units.
void expect_same_value(const std::string& printed, const std::string& csv, double k, const std::string& what) {
  const double tol = half_unit(printed) + half_unit(csv) * k;
  EXPECT_LE(std::abs(std::stod(printed) - std::stod(csv) * k), tol * (1 + 1e-9))
      << what << ": sheet " << printed << ", cutlist.csv " << csv;
}

std::string regex_escaped(const std::string& s) {
  static const std::regex special(R"([.^$|()\[\]{}*+?\\])");
  return std::regex_replace(s, special, R"(\$&)");
}

int page_count(const fs::path& pdf) {
  std::smatch m;
  const std::string info = run("pdfinfo " + quote(pdf)).out;
  return std::regex_search(info, m, std::regex(R"(Pages:\s+(\d+))")) ? std::stoi(m[1]) : 0;
}

struct Built {
  fs::path pdf;
  std::vector<CsvRow> csv;
  std::string calc;  // pdftotext -layout of the calculation sheets (page 2 on)
  int pages = 0;
};

Built build_example(const std::string& dir, const std::string& units) {
  Built b;
  const fs::path out = scratch_root() / dir;
  const Shell r = run(std::string(BANDFORGE_EXE) + " build " + quote(kExample) + " --units " + units + " -o " + quote(out));
  EXPECT_EQ(r.status, 0) << r.out;
  b.pdf = out / (example().design.project.number + ".pdf");
  b.csv = read_cutlist(out / "fab" / "cutlist.csv");
  b.pages = page_count(b.pdf);
  for (int p = 2; p <= b.pages; ++p) b.calc += text_of(b.pdf, p, true);
  return b;
}

// Each CSV row's line in the sheet's table: part, material, stock, thickness, length [× width],
// quantity, mass each, mass total, then the note's first line.
struct SheetRow {
  std::string thickness, length, width, quantity, mass_each, mass_total, note;
};

std::vector<SheetRow> rows_on_sheet(const std::string& calc, const CsvRow& row) {
  const std::string n = R"((\d+(?:\.\d+)?))";
  const std::regex re(regex_escaped(row["part"]) + R"(\s+)" + regex_escaped(row["material"]) + R"(\s+)" +
                      regex_escaped(row["stock"]) + R"(\s+(?:Ø)?)" + n + R"(\s+)" + n + R"((?:\s*×\s*)" + n +
                      R"()?\s+(\d+)\s+)" + n + R"(\s+)" + n + R"( ([^\n]*))");
  std::vector<SheetRow> out;
  for (auto it = std::sregex_iterator(calc.begin(), calc.end(), re); it != std::sregex_iterator(); ++it) {
    const auto& m = *it;
    std::string note = m[7];
    note = note.substr(0, note.find("   "));  // the other column of the sheet, if any, follows
    while (!note.empty() && note.front() == ' ') note.erase(0, 1);
    out.push_back({m[1], m[2], m[3], m[4], m[5], m[6], note});
  }
  return out;
}

void expect_cut_list_on_sheet(const Built& b, double mm_to_unit, double kg_to_unit) {
  ASSERT_GE(b.csv.size(), 4u);  // band and lining blanks, lever plate, pins at least
  EXPECT_NE(b.calc.find("Cut list"), std::string::npos);
  double total = 0, csv_rounding = 0;
  for (const CsvRow& row : b.csv) {
    SCOPED_TRACE(row["part"]);
    const auto found = rows_on_sheet(b.calc, row);
    ASSERT_EQ(found.size(), 1u) << "the row of " << row["part"] << " on the calculation sheet";
    const SheetRow& s = found[0];
    expect_same_value(s.length, row["length_mm"], mm_to_unit, "blank length");
    EXPECT_EQ(s.quantity, row["quantity"]);
    expect_same_value(s.thickness, row["thickness_mm"], mm_to_unit, "thickness");
    if (!s.width.empty()) expect_same_value(s.width, row["width_mm"], mm_to_unit, "blank width");
    else EXPECT_EQ(row["stock"], "round bar");  // a bar shows its sawn length only
    expect_same_value(s.mass_each, row["mass_each_kg"], kg_to_unit, "mass each");
    expect_same_value(s.mass_total, row["mass_total_kg"], kg_to_unit, "mass total");
    // The note is shortened, never changed: its first line starts the CSV's note.
    std::string head = s.note;
    if (head.size() >= 4 && head.compare(head.size() - 4, 4, " …") == 0) head.resize(head.size() - 4);
    ASSERT_FALSE(head.empty());
    EXPECT_EQ(row["note"].rfind(head, 0), 0u) << "sheet: '" << s.note << "', csv: '" << row["note"] << "'";
    total += std::stod(row["mass_total_kg"]);
    csv_rounding += half_unit(row["mass_total_kg"]);
  }
  // The total row: the sum of the CSV's totals, each rounded to 1 g there (hand sum in the test).
  const auto t = numbers_after(b.calc, "Total ");
  ASSERT_EQ(t.size(), 1u);
  EXPECT_LE(std::abs(std::stod(t[0]) - total * kg_to_unit), half_unit(t[0]) + csv_rounding * kg_to_unit)
      << "total mass " << t[0];
  // Where the full notes are.
  EXPECT_NE(b.calc.find("NOTES layer"), std::string::npos);
  EXPECT_NE(b.calc.find("fab/cutlist.csv"), std::string::npos);
}

TEST(DrawingCutList, EveryRowOfCutlistCsvIsOnTheCalculationSheet) {
  const Built b = build_example("cut-si", "si");
  expect_cut_list_on_sheet(b, 1.0, 1.0);
  // The band blank's developed length is printed to 0.1 mm (ISO 129 style), the CSV to 0.01 mm:
  // the band's note is shortened on the sheet (its allowances are listed in full in the CSV).
  const auto band = std::find_if(b.csv.begin(), b.csv.end(), [](const CsvRow& r) { return r["part"] == "BAND-BLANK"; });
  ASSERT_NE(band, b.csv.end());
  EXPECT_EQ(b.calc.find((*band)["note"]), std::string::npos);
  // Not on the assembly sheet: the table belongs to the calculation sheet.
  EXPECT_EQ(text_of(b.pdf, 1).find("BAND-BLANK"), std::string::npos);
  // The in-process drawing (cut_list() of the test's model) gives the same bytes as `build`.
  EXPECT_EQ(slurp(b.pdf), slurp(example().pdf));
}

TEST(DrawingCutList, UsUnitsGiveInchesAndPounds) {
  const Built b = build_example("cut-us", "us");
  // 1 in = 25.4 mm, 1 lb = 0.45359237 kg (exact definitions, 1959 international yard and pound).
  expect_cut_list_on_sheet(b, 1 / 25.4, 1 / 0.45359237);
  EXPECT_NE(b.calc.find("[in]"), std::string::npos);
  EXPECT_NE(b.calc.find("[lb]"), std::string::npos);
  EXPECT_NE(b.calc.find("in millimetres"), std::string::npos);  // the notes quote mm
}

TEST(DrawingCutList, ConceptDesignHasNoCutList) {
  const fs::path out = scratch_root() / "cut-concept";
  const std::string design = kSource + "/examples/concept-differential.toml";
  ASSERT_EQ(run(std::string(BANDFORGE_EXE) + " build " + quote(design) + " -o " + quote(out)).status, 0);
  EXPECT_FALSE(fs::exists(out / "fab"));
  fs::path pdf;
  for (const auto& e : fs::directory_iterator(out)) {
    if (e.path().extension() == ".pdf") pdf = e.path();
  }
  ASSERT_FALSE(pdf.empty());
  const std::string text = text_of(pdf);
  EXPECT_NE(text.find("Calculation sheet"), std::string::npos);
  EXPECT_EQ(text.find("Cut list"), std::string::npos);
  EXPECT_EQ(text.find("cutlist.csv"), std::string::npos);
}

TEST(DrawingCutList, NoTwoWordsOverlapOnItsSheet) {
  // The page that carries the table, on A3, in US units and on A4 (one narrow column).
  const auto us = draw(kExample, "cut-overlap-us.pdf", UnitSystem::us);
  const auto a4 = draw(kExample, "cut-overlap-a4.pdf", UnitSystem::si, "A4");
  for (const Drawn* d : std::vector<const Drawn*>{&example(), us.get(), a4.get()}) {
    SCOPED_TRACE(d->pdf.string());
    int page = 0;
    for (int p = 2; p <= d->plan.pages && page == 0; ++p) {
      if (text_of(d->pdf, p).find("BAND-BLANK") != std::string::npos) page = p;
    }
    ASSERT_GT(page, 0);
    SCOPED_TRACE("page " + std::to_string(page));
    const auto words = cap_boxes(d->pdf, page);
    ASSERT_GT(words.size(), 40u);  // the table is there to be checked
    expect_no_two_words_overlap(words);
  }
}

// ---- every example ------------------------------------------------------------------------

TEST(DrawingExamples, EveryExampleIsDrawn) {
  int pin_layouts = 0;
  for (const auto& entry : fs::directory_iterator(kSource + "/examples")) {
    if (entry.path().extension() != ".toml") continue;
    SCOPED_TRACE(entry.path().string());
    auto d = draw(entry.path().string(), entry.path().stem().string() + ".pdf");
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
    const std::string page1 = text_of(d->pdf, 1);
    char dia[32];
    std::snprintf(dia, sizeof dia, "Ø%g", d->design.drum.diameter * 1000);
    if (d->design.concept_arms.present) {
      // A concept design has no pins: calculation sheet only.
      EXPECT_FALSE(d->plan.assembly);
      EXPECT_EQ(page1.find("Assembly drawing"), std::string::npos);
      EXPECT_NE(page1.find("Calculation sheet"), std::string::npos);
      continue;
    }
    ++pin_layouts;
    EXPECT_TRUE(d->plan.assembly);
    EXPECT_NE(page1.find("Assembly drawing"), std::string::npos);
    EXPECT_NE(page1.find(dia), std::string::npos) << dia;
    // Then the detail sheets of the made parts (issue 10), then the calculation.
    EXPECT_GE(d->plan.detail_sheets, 4);  // drum, band, lever and at least one frame bracket
    for (int page = 2; page < 2 + d->plan.detail_sheets; ++page) {
      EXPECT_NE(text_of(d->pdf, page).find("Detail drawing"), std::string::npos) << "page " << page;
    }
    EXPECT_NE(text_of(d->pdf, 2 + d->plan.detail_sheets).find("Calculation sheet"), std::string::npos);
    // The drum outline is where the plan says, at the sheet scale.
    const Gray g = render(d->pdf, 1, 100);
    const double r = d->design.drum.diameter / 2 * 1000 * d->plan.scale_num / d->plan.scale_den;
    int inked = 0;
    for (int i = 0; i < 24; ++i) {
      const double a = i * 2 * M_PI / 24 + 0.02;
      inked += darkest_near(g, d->plan.drum_x_mm + r * std::cos(a), d->plan.drum_y_mm + r * std::sin(a),
                            d->plan.height_mm, 100, 1) < 128;
    }
    EXPECT_EQ(inked, 24);
  }
  EXPECT_GE(pin_layouts, 1);
}

// ---- fits and tolerances (issue 10) --------------------------------------------------------

namespace {
// Text with runs of white space (line breaks of the column flow) made single spaces.
std::string squeezed(std::string t) {
  std::string out;
  for (char c : t) {
    const bool space = c == ' ' || c == '\n' || c == '\r' || c == '\t';
    if (space && (out.empty() || out.back() == ' ')) continue;
    out += space ? ' ' : c;
  }
  return out;
}
}  // namespace

// The limit deviations printed on the calculation sheet equal ISO 286's values for three sizes
// (REFERENCE §5.8: ISO 286-1 IT grades and ISO 286-2 fundamental deviations, from memory, high
// confidence): Ø16 (10–18 mm: IT11 110 µm, c −95 µm), Ø60 (50–65 mm: IT7 30, IT6 19, k +2 µm),
// Ø50 (30–50 mm: IT7 25, IT6 16, k +2 µm). The assembly sheet names the fits and ISO 2768-mK.
TEST(DrawingFits, LimitDeviationsOnTheCalculationSheetAreIso286) {
  const std::string hoist = squeezed(text_of(example().pdf));
  EXPECT_NE(hoist.find("Ø16 H11/c11: hole H11 +0.110/0 mm, shaft c11 -0.095/-0.205 mm"), std::string::npos);
  EXPECT_NE(hoist.find("Ø60 H7/k6: hole H7 +0.030/0 mm, shaft k6 +0.021/+0.002 mm"), std::string::npos);
  // ISO 2768-1 class m, over 120 up to 400 mm: ±0.5 mm (REFERENCE §5.8).
  EXPECT_NE(hoist.find("Drum friction surface Ø400 mm: ±0.5 mm (ISO 2768-1 class m); total runout 0.1 mm to "
                       "the bore axis"),
            std::string::npos);
  EXPECT_NE(hoist.find("even over the wrap)."), std::string::npos);  // the whole sentence, not cut
  const std::string page1 = squeezed(text_of(example().pdf, 1));
  EXPECT_NE(page1.find("pins Ø16 H11/c11"), std::string::npos) << page1;
  EXPECT_NE(page1.find("ISO 2768-mK"), std::string::npos);
  auto ferry = draw(kSource + "/examples/ferry-differential.toml", "ferry-fits.pdf");
  const std::string f = squeezed(text_of(ferry->pdf));
  EXPECT_NE(f.find("Ø50 H7/k6: hole H7 +0.025/0 mm, shaft k6 +0.018/+0.002 mm"), std::string::npos);
  EXPECT_NE(f.find("Ø14 H11/c11: hole H11 +0.110/0 mm, shaft c11 -0.095/-0.205 mm"), std::string::npos);
}


// ---- projection method (issue 10) -----------------------------------------------------------

namespace {

/// The design file with `line` added after its [drawing] header (or a new [drawing] section).
fs::path with_drawing_line(const std::string& source, const std::string& line, const std::string& name) {
  std::string text = slurp(source);
  const auto at = text.find("[drawing]\n");
  if (at == std::string::npos) text += "\n[drawing]\n" + line + "\n";
  else text.insert(at + 10, line + "\n");
  const fs::path out = scratch_root() / name;
  std::ofstream(out) << text;
  return out;
}

/// x of the centroid of the dark pixels in the title block's projection cell, relative to the
/// cell's centre [mm] (pdftoppm renders page 1 in grey at 300 dpi).
double symbol_ink_offset(const Drawn& d) {
  const double dpi = 300, px = dpi / 25.4;
  const double x0 = d.plan.title_block[0] + 144, x1 = d.plan.title_block[0] + 180;
  const double y0 = d.plan.title_block[1] + 0.5, y1 = d.plan.title_block[1] + 10.5;  // the bottom row, below its label
  const int X = static_cast<int>(x0 * px), W = static_cast<int>((x1 - x0) * px);
  const int Y = static_cast<int>((d.plan.height_mm - y1) * px), H = static_cast<int>((y1 - y0) * px);
  const fs::path base = scratch_root() / ("symbol-" + d.pdf.stem().string());
  const Shell r = run("pdftoppm -gray -r 300 -f 1 -l 1 -singlefile -x " + std::to_string(X) + " -y " +
                      std::to_string(Y) + " -W " + std::to_string(W) + " -H " + std::to_string(H) + " " +
                      quote(d.pdf) + " " + quote(base));
  EXPECT_EQ(r.status, 0);
  std::ifstream in(base.string() + ".pgm", std::ios::binary);
  std::string magic;
  int w = 0, h = 0, maxval = 0;
  in >> magic >> w >> h >> maxval;
  in.get();
  EXPECT_EQ(magic, "P5");
  std::vector<unsigned char> pixels(static_cast<std::size_t>(w) * static_cast<std::size_t>(h));
  in.read(reinterpret_cast<char*>(pixels.data()), static_cast<std::streamsize>(pixels.size()));
  double sum = 0;
  long n = 0;
  for (int j = 0; j < h; ++j)
    for (int i = 0; i < w; ++i)
      if (pixels[static_cast<std::size_t>(j) * static_cast<std::size_t>(w) + static_cast<std::size_t>(i)] < 128) {
        sum += i;
        ++n;
      }
  EXPECT_GT(n, 50) << "no symbol in the projection cell";
  return n > 0 ? (sum / static_cast<double>(n) - w / 2.0) / px : 0.0;
}

}  // namespace

// ISO 5456-2: first angle places the view from the left on the right of the front view and
// draws the symbol's circles right of the cone; third angle (ASME Y14.3) both on the left.
TEST(DrawingProjection, ThirdAngleMovesTheSideViewAndMirrorsTheSymbol) {
  const Drawn& first = example();
  EXPECT_FALSE(first.plan.third_angle);
  EXPECT_GT(first.plan.side_x_mm, first.plan.drum_x_mm);
  const double first_ink = symbol_ink_offset(first);
  EXPECT_GT(first_ink, 0.5);  // the circles (more ink than the cone) on the right

  auto third = draw(with_drawing_line(kExample, "projection = \"third\"", "third.toml").string(), "third.pdf");
  EXPECT_TRUE(third->plan.third_angle);
  EXPECT_LT(third->plan.side_x_mm, third->plan.drum_x_mm);
  EXPECT_NEAR(third->plan.side_y_mm, third->plan.drum_y_mm, 1e-9);  // still level with the front view
  const double third_ink = symbol_ink_offset(*third);
  EXPECT_LT(third_ink, -0.5);
  EXPECT_NEAR(third_ink, -first_ink, 0.3);  // the mirror image
  // Nothing else moves into the title block or off the sheet.
  EXPECT_LE(third->plan.views_box[2], third->plan.width_mm);
  EXPECT_GE(third->plan.views_box[0], 0);
}

TEST(DrawingProjection, UnknownProjectionIsABadDesign) {
  const fs::path bad = with_drawing_line(kExample, "projection = \"second\"", "bad-projection.toml");
  try {
    read_design_file(bad.string());
    ADD_FAILURE() << "no error";
  } catch (const DesignError& e) {
    EXPECT_NE(std::string(e.what()).find("drawing.projection"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("\"first\" or \"third\""), std::string::npos) << e.what();
  }
}


// ---- the lever's detail sheet (issue 10) ----------------------------------------------------

// The hole table, read back with pdftotext, gives hole centre distances equal to the distances
// between the pin centres on the lever in the design file (at the printed 0.1 mm), and the
// holes carry the pin fit; every example with pins.
TEST(DrawingDetail, LeverHoleTableMatchesThePinsOfTheDesign) {
  for (const char* name : {"bin-hoist.toml", "ferry-differential.toml", "trolley-two-way.toml"}) {
    SCOPED_TRACE(name);
    auto d = draw(kSource + "/examples/" + name, std::string("lever-") + name + ".pdf");
    const std::string page = text_of(d->pdf, 4, true);  // assembly, drum, band, lever (detail_parts order)
    EXPECT_NE(page.find("Detail drawing"), std::string::npos);
    // Lever holes of the design: the pivot, and each band end on the lever (not at the pivot).
    std::vector<Vec2> pins{d->design.lever.pivot};
    for (const BandEnd* e : {&d->design.band.end_a, &d->design.band.end_b}) {
      const double off = std::hypot(e->at.x - d->design.lever.pivot.x, e->at.y - d->design.lever.pivot.y);
      if (e->mount == Mount::lever && off > 1e-6) pins.push_back(e->at);
    }
    // Rows "H1   0.0   0.0   Ø16.0 H11".
    std::vector<std::array<double, 3>> rows;
    const std::regex row(R"(H(\d+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+Ø([\d.]+) H11)");
    for (auto it = std::sregex_iterator(page.begin(), page.end(), row); it != std::sregex_iterator(); ++it) {
      rows.push_back({std::stod((*it)[2]), std::stod((*it)[3]), std::stod((*it)[4])});
    }
    ASSERT_EQ(rows.size(), pins.size()) << page;
    // Every pairwise centre distance, sorted: the table's equal the design's.
    std::vector<double> from_design, from_table;
    for (std::size_t i = 0; i < pins.size(); ++i)
      for (std::size_t k = i + 1; k < pins.size(); ++k)
        from_design.push_back(1000 * std::hypot(pins[i].x - pins[k].x, pins[i].y - pins[k].y));
    for (std::size_t a = 0; a < rows.size(); ++a)
      for (std::size_t b = a + 1; b < rows.size(); ++b)
        from_table.push_back(std::hypot(rows[a][0] - rows[b][0], rows[a][1] - rows[b][1]));
    std::sort(from_design.begin(), from_design.end());
    std::sort(from_table.begin(), from_table.end());
    for (std::size_t i = 0; i < from_design.size(); ++i) {
      EXPECT_NEAR(from_table[i], from_design[i], 0.1) << "distance " << i;  // printed to 0.1 mm
    }
    for (const auto& r : rows) EXPECT_NEAR(r[2], d->design.band.pin_diameter * 1000, 0.05);
    // The examples' pins (Ø12, Ø14, Ø16) are all in ISO 286's 10–18 mm range: H11 = +0.110/0
    // (REFERENCE §5.8).
    EXPECT_NE(page.find("H11 (+0.110/0 mm, ISO 286)"), std::string::npos) << page;
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
  }
}


// A frame pin beside the pivot shares one bracket with it (src/hardware.cpp): its detail sheet's
// hole table gives the distance between the two pin centres of the design file, 30 mm apart in x
// and y: √(30² + 30²) = 42.4 mm. End A above the pivot's right: below it (-80, -330) the pivot's
// pin would stand 7.3 mm outside run A's centreline where the lap's rivet heads reach 8.1 mm
// (3t/2 + k, DIN 660 Ø6 k = 3.6), so the plan moves the pivot in front and the bracket is not shared.
TEST(DrawingDetail, SharedBracketHoleTableMatchesThePins) {
  std::string text = slurp(kExample);
  const std::string from = "end_a = { mount = \"frame\", at = [\"-60 mm\", \"-300 mm\"] }";
  const auto at = text.find(from);
  ASSERT_NE(at, std::string::npos);
  text.replace(at, from.size(), "end_a = { mount = \"frame\", at = [\"-80 mm\", \"-270 mm\"] }");
  const fs::path file = scratch_root() / "shared-bracket.toml";
  std::ofstream(file) << text;
  auto d = draw(file.string(), "shared-bracket.pdf");
  ASSERT_EQ(d->solution.hardware.brackets.size(), 1u);
  ASSERT_EQ(d->solution.hardware.brackets[0].holes.size(), 2u);
  ASSERT_EQ(d->plan.detail_sheets, 4);  // drum, band, lever, the shared bracket
  const std::string page = text_of(d->pdf, 5, true);
  EXPECT_NE(page.find("BRACKET-A-PIVOT"), std::string::npos);
  std::vector<std::array<double, 2>> rows;
  const std::regex row(R"(H(\d+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+Ø16.0 H11)");
  for (auto it = std::sregex_iterator(page.begin(), page.end(), row); it != std::sregex_iterator(); ++it) {
    rows.push_back({std::stod((*it)[2]), std::stod((*it)[3])});
  }
  ASSERT_EQ(rows.size(), 2u) << page;
  EXPECT_NEAR(std::hypot(rows[1][0] - rows[0][0], rows[1][1] - rows[0][1]), std::hypot(30.0, 30.0), 0.1);
}


// No text over other text on any detail sheet, on A3, in US units and on A4 portrait.
TEST(DrawingDetail, NoTwoWordsOverlapOnTheDetailSheets) {
  const auto us = draw(kExample, "detail-overlap-us.pdf", UnitSystem::us);
  const auto a4 = draw(kExample, "detail-overlap-a4.pdf", UnitSystem::si, "A4");
  for (const Drawn* d : std::vector<const Drawn*>{&example(), us.get(), a4.get()}) {
    SCOPED_TRACE(d->pdf.string());
    ASSERT_GE(d->plan.detail_sheets, 4);
    for (int page = 2; page < 2 + d->plan.detail_sheets; ++page) {
      SCOPED_TRACE("page " + std::to_string(page));
      const auto words = cap_boxes(d->pdf, page);
      ASSERT_GT(words.size(), 30u);
      expect_no_two_words_overlap(words);
    }
  }
}


// ---- the drum's detail sheet (issue 10, item 1) --------------------------------------------

namespace {

/// Diameters of the cylindrical faces of the product `name` in a STEP file re-read by OCCT's own
/// reader (STEPCAFControl_Reader), distinct to 0.001 mm, ascending [mm].
std::vector<double> step_cylinder_diameters(const fs::path& step, const std::string& name) {
  geom::DocumentScope scope;
  STEPCAFControl_Reader reader;
  reader.SetNameMode(Standard_True);
  EXPECT_EQ(reader.ReadFile(step.string().c_str()), IFSelect_RetDone);
  EXPECT_TRUE(reader.Transfer(scope.doc));
  Handle(XCAFDoc_ShapeTool) shapes = XCAFDoc_DocumentTool::ShapeTool(scope.doc->Main());
  TDF_LabelSequence labels;
  shapes->GetShapes(labels);
  std::vector<double> out;
  for (int i = 1; i <= labels.Length(); ++i) {
    Handle(TDataStd_Name) n;
    if (!labels(i).FindAttribute(TDataStd_Name::GetID(), n)) continue;
    if (TCollection_AsciiString(n->Get()) != name.c_str() || shapes->IsAssembly(labels(i))) continue;
    for (TopExp_Explorer ex(shapes->GetShape(labels(i)), TopAbs_FACE); ex.More(); ex.Next()) {
      BRepAdaptor_Surface s(TopoDS::Face(ex.Current()));
      if (s.GetType() != GeomAbs_Cylinder) continue;
      const double d = 2 * s.Cylinder().Radius();
      if (std::none_of(out.begin(), out.end(), [&](double x) { return std::abs(x - d) < 1e-3; })) out.push_back(d);
    }
  }
  std::sort(out.begin(), out.end());
  return out;
}

/// Every "Ø<number>" on a page of pdftotext output.
std::vector<double> diameters_printed(const std::string& text) {
  std::vector<double> out;
  const std::regex dia(R"(Ø(\d+(?:\.\d+)?))");
  for (auto it = std::sregex_iterator(text.begin(), text.end(), dia); it != std::sregex_iterator(); ++it)
    out.push_back(std::stod((*it)[1]));
  return out;
}

/// Dark pixels (< 128) inside a box given in sheet mm from the lower-left corner.
int ink_in(const Gray& g, const std::array<double, 4>& box, double sheet_h_mm, int dpi) {
  const double k = dpi / 25.4;
  int n = 0;
  for (int y = static_cast<int>((sheet_h_mm - box[3]) * k); y <= static_cast<int>((sheet_h_mm - box[1]) * k); ++y)
    for (int x = static_cast<int>(box[0] * k); x <= static_cast<int>(box[2] * k); ++x) n += g.at(x, y) < 128;
  return n;
}

}  // namespace

// The four diameters the drum sheet prints (bore, hub, rim inside, friction surface) equal the
// drum solid's cylinders as OCCT reads them back from the STEP file, at the printed 0.1 mm, and
// the sheet sits where the plan says (after the assembly sheet, first of the details).
TEST(DrawingDrumSheet, DiametersEqualTheSolidsReadBackFromStep) {
  // The examples, and a drum sized in inches (tests/data/inch-drum.toml).
  for (const char* name : {"examples/bin-hoist.toml", "examples/ferry-differential.toml",
                           "examples/trolley-two-way.toml", "tests/data/inch-drum.toml"}) {
    SCOPED_TRACE(name);
    const std::string base = fs::path(name).filename().string();
    auto d = draw(kSource + "/" + name, "drum-" + base + ".pdf");
    ASSERT_EQ(d->plan.drum_page, 2);
    const fs::path step = scratch_root() / ("drum-" + base + ".step");
    geom::write_step(*d->applied, d->design, step.string());
    const std::vector<double> solid = step_cylinder_diameters(step, "DRUM");
    ASSERT_EQ(solid.size(), 4u);  // bore, hub, rim inside, friction surface
    const std::string page = text_of(d->pdf, d->plan.drum_page);
    EXPECT_NE(page.find("Detail drawing"), std::string::npos);
    const std::vector<double> printed = diameters_printed(page);
    for (double s : solid) {
      const bool found = std::any_of(printed.begin(), printed.end(), [&](double p) { return std::abs(p - s) <= 0.05 + 1e-9; });
      EXPECT_TRUE(found) << "Ø" << s << " of the solid is not printed";
    }
    // Which is which: the bore carries its fit, the friction surface its ISO 2768-1 m tolerance.
    // At the printed precision, 0.1 mm, a whole number without decimals.
    auto printed_mm = [](double v) {
      char b[32];
      const double r = std::round(v * 10) / 10;
      std::snprintf(b, sizeof b, std::abs(r - std::round(r)) < 1e-9 ? "%.0f" : "%.1f", r);
      return std::string(b);
    };
    // The fit where ISO 286's tables (as carried, shafts to 120 mm) give one; else a note says so.
    if (fits::fit(solid[0] / 1000, fits::kBoreHole, fits::kBoreShaft)) {
      EXPECT_NE(page.find("Ø" + printed_mm(solid[0]) + " H7"), std::string::npos) << printed_mm(solid[0]);
    } else {
      EXPECT_NE(page.find("Bore: fit to be specified"), std::string::npos);
    }
    EXPECT_NE(page.find("Ø" + printed_mm(solid[3]) + " ±"), std::string::npos) << printed_mm(solid[3]);
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
  }
}

// The bore's limit deviations are ISO 286-2's: H7 is 0/+IT7 with IT7 = 30 µm over 50 up to
// 65 mm (Ø60, bin hoist) and 25 µm over 30 up to 50 mm (Ø50 ferry, Ø45 trolley) (REFERENCE §5.8,
// the ISO 286-1 IT table); ISO 2768-1 class m over 120 up to 400 mm: ±0.5 mm (REFERENCE §5.8).
TEST(DrawingDrumSheet, BoreFitLimitsAreIso286) {
  const std::string hoist = squeezed(text_of(example().pdf, example().plan.drum_page));
  EXPECT_NE(hoist.find("Ø60 H7 (+0.030/0)"), std::string::npos) << hoist;
  EXPECT_NE(hoist.find("Ø400 ±0.5"), std::string::npos) << hoist;
  // k6 over 50 up to 65: ei = +2 µm, es = ei + IT6 = +2 + 19 = +21 µm (REFERENCE §5.8).
  EXPECT_NE(hoist.find("k6 shaft (+0.021/+0.002 mm)"), std::string::npos) << hoist;
  auto ferry = draw(kSource + "/examples/ferry-differential.toml", "drum-fit-ferry.pdf");
  const std::string f = squeezed(text_of(ferry->pdf, ferry->plan.drum_page));
  EXPECT_NE(f.find("Ø50 H7 (+0.025/0)"), std::string::npos) << f;
  EXPECT_NE(f.find("Ø300 ±0.5"), std::string::npos) << f;  // 120–400 mm: ±0.5
}

// The surface texture symbol (Ra 1.6, common practice, no source) and the total-runout frame
// (0.1 mm to datum A, common practice, no source) are drawn: their texts are on the page and
// there is ink inside the boxes the plan records, and none in a box of the same size beside the
// texture symbol's box on the far side of the view (a control that the test can fail).
TEST(DrawingDrumSheet, TextureSymbolAndRunoutFrameAreDrawn) {
  for (const char* projection : {"first", "third"}) {
    SCOPED_TRACE(projection);
    auto d = draw(with_drawing_line(kExample, std::string("projection = \"") + projection + "\"",
                                    std::string("drum-") + projection + ".toml").string(),
                  std::string("drum-") + projection + ".pdf");
    const std::string page = text_of(d->pdf, d->plan.drum_page);
    EXPECT_NE(page.find("Ra 1.6"), std::string::npos);
    EXPECT_NE(page.find("A–A"), std::string::npos);  // the section's designation (ISO 128-44)
    const int dpi = 150;
    const Gray g = render(d->pdf, d->plan.drum_page, dpi);
    ASSERT_GT(g.w, 0);
    const auto& ts = d->plan.drum_texture_symbol;
    const auto& rf = d->plan.drum_runout_frame;
    ASSERT_GT(ts[2] - ts[0], 5);  // recorded
    ASSERT_GT(rf[2] - rf[0], 10);
    EXPECT_GT(ink_in(g, ts, d->plan.height_mm, dpi), 60);
    EXPECT_GT(ink_in(g, rf, d->plan.height_mm, dpi), 150);
    EXPECT_GT(ink_in(g, d->plan.drum_datum, d->plan.height_mm, dpi), 40);
    // The frame's outline: its left side is ink all the way up (ISO 1101 frame).
    int left = 0;
    for (double y = rf[1] + 0.5; y < rf[3] - 0.5; y += 0.5) left += darkest_near(g, rf[0], y, d->plan.height_mm, dpi, 1) < 128;
    EXPECT_GE(left, 7);
    // Control: the same box 40 mm further up the sheet from the frame is blank paper.
    const std::array<double, 4> above_title{d->plan.title_block[0] + 2, d->plan.title_block[3] + 40,
                                            d->plan.title_block[0] + 2 + (rf[2] - rf[0]), d->plan.title_block[3] + 45};
    EXPECT_EQ(ink_in(g, above_title, d->plan.height_mm, dpi), 0);
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
  }
}

// No text over other text on the drum sheet, on A3, in US units and on A4 portrait.
TEST(DrawingDrumSheet, NoTwoWordsOverlap) {
  const auto us = draw(kExample, "drum-overlap-us.pdf", UnitSystem::us);
  const auto a4 = draw(kExample, "drum-overlap-a4.pdf", UnitSystem::si, "A4");
  for (const Drawn* d : std::vector<const Drawn*>{&example(), us.get(), a4.get()}) {
    SCOPED_TRACE(d->pdf.string());
    const auto words = cap_boxes(d->pdf, d->plan.drum_page);
    ASSERT_GT(words.size(), 40u);
    expect_no_two_words_overlap(words);
  }
  // Fits stay in millimetres in US units (as ISO 286 gives them), dimensions in inches:
  // 400 mm = 15.748 in, printed to 0.01 in.
  const std::string t = squeezed(text_of(us->pdf, us->plan.drum_page));
  EXPECT_NE(t.find("Ø60 mm H7 (+0.030/0)"), std::string::npos) << t;
  EXPECT_NE(t.find("Ø15.75"), std::string::npos) << t;
}

// ---- the band assembly's detail sheet (issue 10, item 1) ----------------------------------

namespace {

/// Round holes of a DXF read by ezdxf (the independent reader the fab tests use): diameter →
/// count, diameters to 0.01 mm.
std::map<double, int> dxf_holes(const fs::path& dxf) {
  const Shell r = run("/usr/bin/python3 -c \"import ezdxf, collections, sys; d = ezdxf.readfile(sys.argv[1]); "
                      "c = collections.Counter(round(2 * e.dxf.radius, 2) for e in d.modelspace().query('CIRCLE')); "
                      "print(' '.join(f'{k}:{v}' for k, v in sorted(c.items())))\" " + quote(dxf));
  std::map<double, int> out;
  std::istringstream in(r.out);
  std::string item;
  while (in >> item) out[std::stod(item.substr(0, item.find(':')))] = std::stoi(item.substr(item.find(':') + 1));
  return out;
}

}  // namespace

// Built by the executable, as a user builds it: the band sheet's band thickness and width and
// lining thickness are the design's; its developed length is the cut list's BAND-BLANK length;
// its rivet counts are the DXF's holes (read by ezdxf): a joint rivet passes through the tail
// and the run (two holes in the band blank), a lining rivet through lining and band (one hole in
// each blank).
TEST(DrawingBandSheet, SizesLengthAndRivetsMatchTheDesignAndTheFabPack) {
  for (const char* name : {"bin-hoist.toml", "ferry-differential.toml", "trolley-two-way.toml"}) {
    SCOPED_TRACE(name);
    const fs::path out = scratch_root() / (std::string("band-") + name);
    const Shell b = run(std::string(BANDFORGE_EXE) + " build " + quote(kSource + "/examples/" + name) + " -o " + quote(out));
    ASSERT_EQ(b.status, 0) << b.out;
    const Design design = read_design_file(kSource + "/examples/" + name);
    fs::path pdf;
    for (const auto& e : fs::directory_iterator(out))
      if (e.path().extension() == ".pdf") pdf = e.path();
    ASSERT_FALSE(pdf.empty());
    const int band_page = 3;  // assembly, drum, band (detail_parts order, issue 10)
    const std::string page = squeezed(text_of(pdf, band_page));
    EXPECT_NE(page.find("Band assembly"), std::string::npos) << page;
    auto mm = [](double m) {
      char buf[32];
      std::snprintf(buf, sizeof buf, "%g", std::round(m * 1e4) / 10);
      return std::string(buf);
    };
    EXPECT_NE(page.find("strip " + mm(design.band.thickness) + " × " + mm(design.band.width)), std::string::npos) << page;
    EXPECT_NE(page.find(design.lining.material + " " + mm(design.lining.thickness) + " thick"), std::string::npos) << page;
    // Developed length: the cut list's BAND-BLANK length (2 decimals) at the printed 0.1 mm.
    double blank = 0;
    for (const CsvRow& r : read_cutlist(out / "fab" / "cutlist.csv"))
      if (r["part"] == "BAND-BLANK") blank = std::stod(r["length_mm"]);
    ASSERT_GT(blank, 0);
    std::smatch m;
    ASSERT_TRUE(std::regex_search(page, m, std::regex(R"(developed length ([\d.]+) mm)"))) << page;
    EXPECT_NEAR(std::stod(m[1]), blank, 0.05 + 0.005);
    // Rivets: the parts table rows "Rivet DIN 660 - 6 × 16  steel, bought  16" (read with -layout):
    // the joint rivets by their standard (DIN 660 for 1–8 mm), nominal = the blank's hole.
    const std::string table = squeezed(text_of(pdf, band_page, true));
    const auto band_holes = dxf_holes(out / "fab" / "band-blank.dxf");
    const auto lining_holes = dxf_holes(out / "fab" / "lining-blank.dxf");
    int lining_rivets = 0, band_all = 0;
    for (const auto& [dia, n] : lining_holes) lining_rivets += n;
    for (const auto& [dia, n] : band_holes) band_all += n;
    ASSERT_EQ((band_all - lining_rivets) % 2, 0);
    const int joint_rivets = (band_all - lining_rivets) / 2;
    ASSERT_TRUE(std::regex_search(table, m, std::regex(R"(Rivet DIN \d+ - ([\d.]+) × [\d.]+ steel, bought (\d+))"))) << table;
    EXPECT_EQ(std::stoi(m[2]), joint_rivets);
    EXPECT_EQ(band_holes.count(std::stod(m[1])), 1u) << "joint rivet Ø" << m[1] << " is a hole size of the band blank";
    if (lining_rivets > 0) {
      ASSERT_TRUE(std::regex_search(table, m, std::regex(R"(Rivet Ø([\d.]+) \(lining\) brass or copper, bought (\d+))")));
      EXPECT_EQ(std::stoi(m[2]), lining_rivets);
    }
    EXPECT_EQ(run("qpdf --check " + quote(pdf)).status, 0);
  }
}

// A welded end block (band.end_joint = "welded-block"): its detail gives the bore with the pin
// fit, Ø16 H11 = +0.110/0 mm over 10 up to 18 mm (REFERENCE §5.8: IT11 = 110 µm), the block in
// the parts table and the ISO 2553 leg size; in third angle as well.
TEST(DrawingBandSheet, WeldedEndBlocksCarryTheBoreFit) {
  std::string text = slurp(kExample);
  const auto at = text.find("pin_diameter = ");
  ASSERT_NE(at, std::string::npos);
  text.insert(at, "end_joint = \"welded-block\"\n");
  const fs::path file = scratch_root() / "band-welded.toml";
  std::ofstream(file) << text;
  for (const char* projection : {"first", "third"}) {
    SCOPED_TRACE(projection);
    auto d = draw(with_drawing_line(file.string(), std::string("projection = \"") + projection + "\"",
                                    std::string("band-welded-") + projection + ".toml").string(),
                  std::string("band-welded-") + projection + ".pdf");
    ASSERT_EQ(d->plan.band_page, 3);
    const std::string page = squeezed(text_of(d->pdf, d->plan.band_page));
    EXPECT_NE(page.find("Ø16 H11 (+0.110/0)"), std::string::npos) << page;
    EXPECT_NE(page.find("END-BLOCK-A"), std::string::npos);
    EXPECT_NE(page.find("END-BLOCK-B"), std::string::npos);
    char leg[32];
    std::snprintf(leg, sizeof leg, "z%g", d->solution.hardware.joint_a.weld_leg * 1000);
    EXPECT_NE(page.find(leg), std::string::npos) << leg;
    EXPECT_EQ(page.find("(joints)"), std::string::npos);  // no joint rivets
    expect_no_two_words_overlap(cap_boxes(d->pdf, d->plan.band_page));
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
  }
}

// No text over other text on the band sheet, on A3, in US units and on A4 portrait.
TEST(DrawingBandSheet, NoTwoWordsOverlap) {
  const auto us = draw(kExample, "band-overlap-us.pdf", UnitSystem::us);
  const auto a4 = draw(kExample, "band-overlap-a4.pdf", UnitSystem::si, "A4");
  for (const Drawn* d : std::vector<const Drawn*>{&example(), us.get(), a4.get()}) {
    SCOPED_TRACE(d->pdf.string());
    ASSERT_EQ(d->plan.band_page, 3);
    const auto words = cap_boxes(d->pdf, d->plan.band_page);
    ASSERT_GT(words.size(), 40u);
    expect_no_two_words_overlap(words);
  }
}

// ---- the isometric view and the list of sheets on the assembly sheet (issue 10, item 5) ------

namespace {

// The ISO 5457 drawing space: 20 mm filing margin on the left, 10 mm on the other edges
// (REFERENCE §5.2), of the ISO 216 sheet as drawn (REFERENCE §5.1).
std::array<double, 4> drawing_space(const SheetPlan& p) { return {20, 10, p.width_mm - 10, p.height_mm - 10}; }

bool boxes_overlap(const std::array<double, 4>& a, const std::array<double, 4>& b) {
  return a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3];
}

// The isometric view's box lies in the drawing space and overlaps no other box page 1 records
// (views, detail X, tables, notes, caution, title block); its scale is an ISO 5455 reduction no
// larger than the sheet's (REFERENCE §5.4: 1:1, 1:2, 1:5, 1:10, 1:20, 1:50, 1:100 …).
void expect_isometric_clear(const Drawn& d) {
  const SheetPlan& p = d.plan;
  const std::array<double, 4> iso{p.iso_box[0], p.iso_box[1], p.iso_box[2], p.iso_box[3]};
  const auto space = drawing_space(p);
  EXPECT_GT(iso[2] - iso[0], 0);
  EXPECT_GT(iso[3] - iso[1], 0);
  EXPECT_TRUE(iso[0] >= space[0] && iso[1] >= space[1] && iso[2] <= space[2] && iso[3] <= space[3])
      << iso[0] << " " << iso[1] << " " << iso[2] << " " << iso[3];
  int listed = 0;
  for (const PlacedBox& b : p.page1_boxes) {
    if (b.what == "isometric view") {
      ++listed;
      EXPECT_EQ(b.box, iso);
      continue;
    }
    EXPECT_FALSE(boxes_overlap(iso, b.box)) << "isometric view over the " << b.what;
  }
  EXPECT_EQ(listed, 1);
  for (const char* what : {"front view", "side view", "parts list", "results", "notes", "caution", "title block"}) {
    EXPECT_TRUE(std::any_of(p.page1_boxes.begin(), p.page1_boxes.end(),
                            [&](const PlacedBox& b) { return b.what == what && b.box[2] > b.box[0]; }))
        << what << " not recorded: the overlap check would miss it";
  }
  EXPECT_EQ(p.iso_scale_num, 1);
  const std::vector<int> iso5455 = {1, 2, 5, 10, 20, 50, 100, 200, 500, 1000};
  EXPECT_NE(std::find(iso5455.begin(), iso5455.end(), p.iso_scale_den), iso5455.end()) << p.iso_scale_den;
  EXPECT_LE(static_cast<double>(p.iso_scale_num) / p.iso_scale_den,
            static_cast<double>(p.scale_num) / p.scale_den);
  // Labelled as detail X is: the name and its own scale under the view.
  EXPECT_NE(text_of(d.pdf, 1).find("ISOMETRIC (1:" + std::to_string(p.iso_scale_den) + ")"), std::string::npos);
}

}  // namespace

// ISO 5456-3 isometric axonometry (from memory, high confidence): the projections of the three
// coordinate axes meet at 120° on paper, one of them upright, and each axis is foreshortened
// equally, to √(2/3) = 0.8165 in a true orthographic projection (the standard also allows the
// simplified scale 1). Paper coordinates of a model vector v: (v·right, v·up), up = view × right.
TEST(DrawingIsometric, AxesAre120DegreesApartAndEquallyForeshortened) {
  const geom::ViewSpec v = geom::isometric_view();
  auto dot = [](geom::Vec3 a, geom::Vec3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; };
  auto cross = [](geom::Vec3 a, geom::Vec3 b) {
    return geom::Vec3{a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x};
  };
  EXPECT_NEAR(dot(v.toward_viewer, v.toward_viewer), 1.0, 1e-12);
  EXPECT_NEAR(dot(v.right, v.right), 1.0, 1e-12);
  EXPECT_NEAR(dot(v.toward_viewer, v.right), 0.0, 1e-12);
  const geom::Vec3 up = cross(v.toward_viewer, v.right);
  const geom::Vec3 axes[3] = {{1, 0, 0}, {0, 1, 0}, {0, 0, 1}};
  double px[3], py[3];
  for (int i = 0; i < 3; ++i) {
    px[i] = dot(axes[i], v.right);
    py[i] = dot(axes[i], up);
    EXPECT_NEAR(std::hypot(px[i], py[i]), std::sqrt(2.0 / 3.0), 1e-12) << "axis " << i;  // 0.8165
  }
  EXPECT_NEAR(std::sqrt(2.0 / 3.0), 0.8165, 5e-5);
  for (int i = 0; i < 3; ++i) {
    const int j = (i + 1) % 3;
    const double cos_ij = (px[i] * px[j] + py[i] * py[j]) / (2.0 / 3.0);
    EXPECT_NEAR(std::acos(cos_ij) * 180 / M_PI, 120.0, 1e-9) << "axes " << i << " and " << j;
  }
  // The model's y axis (up in the front view) stays upright; x runs down to the right at 30°,
  // z down to the left: the front (+z), right side (+x) and top (+y) are the faces seen.
  EXPECT_NEAR(px[1], 0.0, 1e-12);
  EXPECT_GT(py[1], 0);
  EXPECT_NEAR(std::atan2(py[0], px[0]) * 180 / M_PI, -30.0, 1e-9);
  EXPECT_NEAR(std::atan2(py[2], px[2]) * 180 / M_PI, -150.0, 1e-9);
  EXPECT_GT(dot(v.toward_viewer, {0, 0, 1}), 0);
}

// The view is on the default A3 sheet of every example with pins, clear of everything else; on
// A4 and A2, in US units and in third angle it is there or a note says why not.
TEST(DrawingIsometric, PlacedInsideTheFrameAndClearOfTheOtherBoxes) {
  int drawn = 0;
  for (const auto& entry : fs::directory_iterator(kSource + "/examples")) {
    if (entry.path().extension() != ".toml") continue;
    if (read_design_file(entry.path().string()).concept_arms.present) continue;
    for (const std::string sheet : {"A3", "A4", "A2"}) {
      SCOPED_TRACE(entry.path().filename().string() + " on " + sheet);
      auto d = draw(entry.path().string(), "iso-" + sheet + "-" + entry.path().stem().string() + ".pdf",
                    UnitSystem::si, sheet);
      ASSERT_TRUE(d->plan.assembly);
      if (sheet == "A3") {
        ASSERT_GT(d->plan.iso_scale_den, 0) << "the default sheet must carry the view";
      }
      if (d->plan.iso_scale_den > 0) {
        expect_isometric_clear(*d);
        ++drawn;
      } else {
        EXPECT_NE(squeezed(text_of(d->pdf, 1)).find("No room on sheet " + sheet + " for the isometric view"),
                  std::string::npos);
      }
    }
  }
  EXPECT_GE(drawn, 3);
  const auto us = draw(kExample, "iso-us.pdf", UnitSystem::us);
  const auto third = draw(with_drawing_line(kExample, "projection = \"third\"", "iso-third.toml").string(),
                          "iso-third.pdf");
  ASSERT_GT(us->plan.iso_scale_den, 0);  // US units change no geometry: the view is there
  for (const Drawn* d : {us.get(), third.get()}) {
    SCOPED_TRACE(d->pdf.string());
    if (d->plan.iso_scale_den > 0) {
      expect_isometric_clear(*d);
    } else {
      EXPECT_NE(squeezed(text_of(d->pdf, 1)).find("No room on sheet A3 for the isometric view"), std::string::npos);
    }
    expect_no_two_words_overlap(cap_boxes(d->pdf, 1));
  }
}

// The view was drawn where it is recorded: ink inside the box, and the 1–3 mm ring around it
// blank (nothing drawn up to it, and its lines stay inside). pdftoppm renders page 1.
TEST(DrawingIsometric, InkInsideTheRecordedBoxAndClearPaperAroundIt) {
  const Drawn& d = example();
  ASSERT_GT(d.plan.iso_scale_den, 0);
  const int dpi = 150;
  const Gray g = render(d.pdf, 1, dpi);
  ASSERT_GT(g.w, 0);
  const double* b = d.plan.iso_box;
  int inside = 0, samples = 0, ring = 0;
  for (double x = b[0] - 3; x <= b[2] + 3; x += 0.25) {
    for (double y = b[1] - 3; y <= b[3] + 3; y += 0.25) {
      const bool in = x >= b[0] && x <= b[2] && y >= b[1] && y <= b[3];
      const bool near_ring = !in && x >= b[0] - 3 && x <= b[2] + 3 && y >= b[1] - 3 && y <= b[3] + 3 &&
                             (x < b[0] - 1 || x > b[2] + 1 || y < b[1] - 1 || y > b[3] + 1);
      const bool dark = darkest_near(g, x, y, d.plan.height_mm, dpi, 0) < 128;
      if (in) {
        ++samples;
        inside += dark;
      } else if (near_ring) {
        ring += dark;
      }
    }
  }
  // A whole brake in wide 0.5 mm lines: well over 1 % of the box is ink (hand count on the
  // example's render: several per cent; an empty box gives 0).
  EXPECT_GT(inside, samples / 100) << inside << " of " << samples;
  EXPECT_EQ(ring, 0);
}

// Page 1 lists every sheet of the PDF: n/N with N the page count pdfinfo reads, in order, each
// with the title its own title block carries and the ISO 216 size pdfinfo measures
// (REFERENCE §5.1: A2 594 × 420, A3 420 × 297, A4 210 × 297 mm as drawn).
// On A4 portrait (every zone spans the frame; the views keep 2 mm to spare at 1:100) the list
// may have no room: then a note on the sheet says so.
TEST(DrawingIsometric, SheetListNamesEveryPageOfThePdf) {
  const auto a2 = draw(kExample, "list-a2.pdf", UnitSystem::si, "A2");
  const auto a4 = draw(kExample, "list-a4.pdf", UnitSystem::si, "A4");
  const auto us = draw(kExample, "list-us.pdf", UnitSystem::us);
  for (const Drawn* d : std::vector<const Drawn*>{&example(), a2.get(), a4.get(), us.get()}) {
    SCOPED_TRACE(d->pdf.string());
    const bool listed = std::any_of(d->plan.page1_boxes.begin(), d->plan.page1_boxes.end(),
                                    [](const PlacedBox& b) { return b.what == "sheet list"; });
    if (d->plan.sheet != "A4") {
      ASSERT_TRUE(listed);
    } else if (!listed) {
      EXPECT_NE(squeezed(text_of(d->pdf, 1)).find("the list of sheets (each title block gives its sheet n / N)"),
                std::string::npos);
      continue;
    }
    const Shell info = run("pdfinfo -f 1 -l 99 " + quote(d->pdf));
    std::smatch m;
    ASSERT_TRUE(std::regex_search(info.out, m, std::regex(R"(Pages:\s+(\d+))")));
    const int pages = std::stoi(m[1]);
    std::map<int, std::string> size_of_page;
    const std::regex size(R"(Page\s+(\d+) size:\s+([\d.]+) x ([\d.]+) pts)");
    for (auto it = std::sregex_iterator(info.out.begin(), info.out.end(), size); it != std::sregex_iterator(); ++it) {
      const double w = std::stod((*it)[2]), h = std::stod((*it)[3]);
      auto is = [&](double a, double b) { return std::abs(w - pt(a)) < 0.5 && std::abs(h - pt(b)) < 0.5; };
      size_of_page[std::stoi((*it)[1])] = is(594, 420) ? "A2" : is(420, 297) ? "A3" : is(210, 297) ? "A4" : "?";
    }
    const std::string page1 = text_of(d->pdf, 1, true);
    // pdftotext -layout may put more than one space between the words of a title.
    const std::regex entry(
        R"((\d+)/(\d+)\s+(Assembly\s+drawing|Detail\s+drawing:\s+[A-Z0-9-]+|Calculation\s+sheet(?:,\s+cont\.)?)\s+(A\d))");
    const std::regex spaces(R"(\s+)");
    // Two groups of entries side by side come out of -layout row by row: keyed by n.
    std::map<int, std::array<std::string, 3>> rows;  // n → N, title, size
    for (auto it = std::sregex_iterator(page1.begin(), page1.end(), entry); it != std::sregex_iterator(); ++it) {
      rows[std::stoi((*it)[1])] = {(*it)[2], std::regex_replace((*it)[3].str(), spaces, " "), (*it)[4]};
    }
    ASSERT_EQ(static_cast<int>(rows.size()), pages) << page1;
    int expected = 1;
    for (const auto& [n, row] : rows) {
      SCOPED_TRACE("sheet " + std::to_string(n));
      EXPECT_EQ(n, expected++);
      EXPECT_EQ(std::stoi(row[0]), pages);
      EXPECT_EQ(row[2], size_of_page[n]);
      const std::string text = text_of(d->pdf, n);
      const std::string& title = row[1];
      if (title == "Assembly drawing") {
        EXPECT_EQ(n, 1);
        EXPECT_NE(text.find("Assembly drawing"), std::string::npos);
      } else if (title.rfind("Detail drawing: ", 0) == 0) {
        EXPECT_NE(text.find("Detail drawing"), std::string::npos);
        EXPECT_NE(text.find(title.substr(16)), std::string::npos) << "the part's name on its sheet";
      } else {
        EXPECT_NE(text.find("Calculation sheet"), std::string::npos);
      }
      // The sheet's own title block says n / N.
      EXPECT_TRUE(std::regex_search(text, std::regex("\\b" + std::to_string(n) + "\\s*/\\s*" + std::to_string(pages) + "\\b")));
    }
    EXPECT_EQ(d->plan.sheet_list.size(), static_cast<std::size_t>(pages));
  }
}

}  // namespace
}  // namespace bandforge::drawing

// ---- applying the brake on the calculation sheet (issue 11) ---------------------------------

namespace bandforge::drawing {
namespace {

// The pages of the set that are calculation sheets, by the set's own list.
std::vector<int> calculation_pages(const Drawn& d) {
  std::vector<int> out;
  for (const SheetEntry& e : d.plan.sheet_list) {
    if (e.title.rfind("Calculation sheet", 0) == 0) out.push_back(e.number);
  }
  return out;
}

std::string calculation_text(const Drawn& d) {
  std::string out;
  for (int p : calculation_pages(d)) out += text_of(d.pdf, p, true);
  return out;
}

// The example with its [apply] section replaced (an empty `block`: applied by hand).
fs::path example_applied_by(const std::string& block, const std::string& name) {
  const std::string text = slurp(kExample);
  const size_t from = text.find("[apply]"), to = text.find("[load]");
  EXPECT_NE(from, std::string::npos);
  EXPECT_LT(from, to);
  const fs::path out = scratch_root() / name;
  std::ofstream(out) << text.substr(0, from) << block << text.substr(to);
  return out;
}

// 25 kg hung at the handle point, 810 mm from the pivot along x (the example's lever.pivot
// (−110, −300) mm and handle (700, −300) mm): W·a = 25 kg · 9.80665 m/s² · 0.810 m = 198.6 N·m
// (standard gravity, 3rd CGPM 1901), which with the lever's own weight covers the 193.7 N·m the
// example needs at f_min; `solve` passes every check with it.
constexpr double kWeightMass = 25.0;
constexpr double kWeightArm = 0.810;
const char* const kWeightApply = "[apply]\nby = \"weight\"\nat = [\"700 mm\", \"-300 mm\"]\nmass = \"25 kg\"\n\n";

size_t occurrences(const std::string& text, const std::string& what) {
  size_t n = 0;
  for (size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

TEST(DrawingApplyCalc, SpringAndActuatorFiguresEqualSolveJson) {
  const Shell r = solve_json(kExample);
  ASSERT_EQ(r.status, 0) << r.out;
  const nlohmann::json j = nlohmann::json::parse(r.out).at("apply");
  ASSERT_EQ(j.at("by"), "spring");
  const nlohmann::json& sp = j.at("spring");
  const std::string calc = calculation_text(example());
  struct Row {
    const char* label;
    const char* key;
    double scale;  // SI → printed unit: mm, N/mm, a count
  };
  const Row rows[] = {
      {"Wire diameter d", "wire_diameter_m", 1e3},  {"Mean coil diameter D", "mean_diameter_m", 1e3},
      {"Outside diameter D_o", "outer_diameter_m", 1e3}, {"Coils, active N_a", "active_coils", 1.0},
      {"Coils, total N_t", "total_coils", 1.0},      {"Free length L_0", "free_length_m", 1e3},
      {"Solid length L_s", "solid_length_m", 1e3},  {"Spring rate k", "rate_N_per_m", 1e-3},
  };
  for (const Row& row : rows) {
    const auto v = numbers_after(calc, row.label);
    ASSERT_GE(v.size(), 1u) << row.label;
    expect_printed(v[0], sp.at(row.key).get<double>() * row.scale, row.label);
  }
  EXPECT_NE(calc.find(sp.at("material").get<std::string>()), std::string::npos);
  // The three lever positions, in the order applied, worn, released.
  const char* positions[3] = {"applied", "worn", "released"};
  const auto force = numbers_after(calc, "Spring force F [N]");
  const auto length = numbers_after(calc, "Spring length L [mm]");
  ASSERT_GE(force.size(), 3u);
  ASSERT_GE(length.size(), 3u);
  for (int i = 0; i < 3; ++i) {
    expect_printed(force[i], sp.at(std::string("force_") + positions[i] + "_N").get<double>(),
                   std::string("spring force, ") + positions[i]);
    expect_printed(length[i], sp.at(std::string("length_") + positions[i] + "_m").get<double>() * 1e3,
                   std::string("spring length, ") + positions[i]);
  }
  // The spring maker's sentence carries the same working points.
  EXPECT_NE(calc.find("Specification: helical compression spring"), std::string::npos);
  // The release actuator: stroke [mm] and force [N] at its point.
  const nlohmann::json& act = j.at("actuator");
  const auto stroke = numbers_after(calc, "Actuator stroke");
  const auto push = numbers_after(calc, "Actuator force");
  ASSERT_GE(stroke.size(), 1u);
  ASSERT_GE(push.size(), 1u);
  expect_printed(stroke[0], act.at("stroke_m").get<double>() * 1e3, "actuator stroke [mm]");
  expect_printed(push[0], act.at("force_N").get<double>(), "actuator force [N]");
  const auto lift = numbers_after(calc, "Actuator lift");
  ASSERT_GE(lift.size(), 1u);
  expect_printed(lift[0], act.at("travel_m").get<double>() * 1e3, "actuator lift [mm]");
}

TEST(DrawingApplyCalc, UsUnitsPrintTheSpringInInchesAndPoundsForce) {
  const Shell r = solve_json(kExample);
  ASSERT_EQ(r.status, 0) << r.out;
  const nlohmann::json j = nlohmann::json::parse(r.out).at("apply");
  const auto us = draw(kExample, "apply-us-values.pdf", UnitSystem::us);
  const std::string calc = calculation_text(*us);
  // 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N (exact: 0.45359237 kg × 9.80665 m/s²).
  const double in = 1 / 0.0254, lbf = 1 / 4.4482216152605;
  const auto d = numbers_after(calc, "Wire diameter d");
  const auto k = numbers_after(calc, "Spring rate k");
  const auto force = numbers_after(calc, "Spring force F [lbf]");
  const auto stroke = numbers_after(calc, "Actuator stroke");
  ASSERT_GE(d.size(), 1u);
  ASSERT_GE(k.size(), 1u);
  ASSERT_GE(force.size(), 3u);
  ASSERT_GE(stroke.size(), 1u);
  expect_printed(d[0], j["spring"]["wire_diameter_m"].get<double>() * in, "wire diameter [in]");
  expect_printed(k[0], j["spring"]["rate_N_per_m"].get<double>() * lbf / in, "rate [lbf/in]");
  expect_printed(force[2], j["spring"]["force_released_N"].get<double>() * lbf, "released force [lbf]");
  expect_printed(stroke[0], j["actuator"]["stroke_m"].get<double>() * in, "actuator stroke [in]");
  EXPECT_NE(calc.find("lbf/in"), std::string::npos);
}

TEST(DrawingApplyCalc, FormulasAndTheirSourcesArePrinted) {
  const std::string calc = calculation_text(example());
  // Shigley's Mechanical Engineering Design, 9th ed., ch. 10: index (10-1), Bergsträsser factor
  // (10-5), stress (10-7), rate (10-9), buckling (10-13), strength (10-14, Table 10-4), ends
  // (Table 10-1), allowable (Table 10-6), shear modulus (Table 10-5) — REFERENCE §8.2.
  for (const char* source : {"eq. 10-1", "eq. 10-5", "eq. 10-7", "eq. 10-9", "eq. 10-13", "Table 10-1",
                             "Table 10-4", "Table 10-5", "Table 10-6"}) {
    EXPECT_TRUE(std::regex_search(calc, std::regex(std::string("Shigley 9th ed\\. ") +
                                                   regex_escaped(source) + "\\b")))
        << source;
  }
  EXPECT_NE(calc.find("EN 13906-1"), std::string::npos);
  for (const char* formula : {"C = D/d", "(4C + 2)/(4C − 3)", "K_B·8·F·D/(π·d³)", "d⁴·G/(8·D³·N_a)", "A/d^m",
                              "2.63·D/α", "φ·w/|m_A + m_B|", "φ·c/|m_A + m_B|", "L_a·δψ", "L_a·δψ_w",
                              "m_l·g·σ·(x_O − x_G)", "1.25·m·g·r_rope"}) {
    EXPECT_NE(calc.find(formula), std::string::npos) << formula;
  }
  // The hoist rules: in the checks table and again beside the applying element's figures.
  EXPECT_GE(occurrences(calc, "29 CFR 1910.179(f)(2)(i)"), 2u);
  EXPECT_GE(occurrences(calc, "29 CFR 1910.179(f)(2):"), 2u);
}

TEST(DrawingApplyCalc, WeightAppliedVariantPrintsItsMassAndMoment) {
  const fs::path design = example_applied_by(kWeightApply, "weight-applied.toml");
  const Shell r = solve_json(design.string());
  ASSERT_EQ(r.status, 0) << r.out;
  const nlohmann::json all = nlohmann::json::parse(r.out);
  for (const auto& c : all.at("checks")) EXPECT_TRUE(c.at("ok").get<bool>()) << c.at("id");
  const nlohmann::json& j = all.at("apply");
  ASSERT_EQ(j.at("by"), "weight");
  const auto d = draw(design.string(), "weight-applied.pdf");
  const std::string calc = calculation_text(*d);
  const auto mass = numbers_after(calc, "Hanging mass m");
  const auto weight = numbers_after(calc, "Weight W");
  const auto moment = numbers_after(calc, "Weight's moment M_el");
  ASSERT_GE(mass.size(), 1u);
  ASSERT_GE(weight.size(), 1u);
  ASSERT_GE(moment.size(), 3u);
  expect_printed(mass[0], j.at("weight").at("mass_kg").get<double>(), "mass [kg]");
  expect_printed(mass[0], kWeightMass, "mass [kg], the design file");
  expect_printed(weight[0], kWeightMass * 9.80665, "W = m·g [N]");
  expect_printed(moment[0], kWeightMass * 9.80665 * kWeightArm, "W·a, applied [N·m], by hand");
  const char* positions[3] = {"applied", "worn", "released"};
  for (int i = 0; i < 3; ++i) {
    expect_printed(moment[i], j.at("positions").at(positions[i]).at("element_moment_Nm").get<double>(),
                   std::string("weight's moment, ") + positions[i]);
  }
  const auto push = numbers_after(calc, "Actuator force");
  ASSERT_GE(push.size(), 1u);
  expect_printed(push[0], j.at("actuator").at("force_N").get<double>(), "actuator force [N]");
  // A weight: no spring on the sheet.
  EXPECT_EQ(calc.find("Spring rate k"), std::string::npos);
  EXPECT_EQ(calc.find("compression spring"), std::string::npos);
  EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
}

TEST(DrawingApplyCalc, HandAppliedExampleShowsNoSpringSection) {
  const auto ferry = draw(kSource + "/examples/ferry-differential.toml", "ferry-hand.pdf");
  const std::string calc = calculation_text(*ferry);
  EXPECT_NE(calc.find("Applied by hand"), std::string::npos);
  for (const char* absent : {"Spring rate k", "Wire diameter d", "Actuator stroke", "Hanging mass",
                             "compression spring", "Hoist rules"}) {
    EXPECT_EQ(calc.find(absent), std::string::npos) << absent;
  }
}

TEST(DrawingApplyCalc, HandAppliedHoistShowsTheFailedSelfSettingRule) {
  // The example without [apply]: a powered hoist's holding brake applied by hand fails
  // 29 CFR 1910.179(f)(2) ("applied automatically when power is removed").
  const fs::path design = example_applied_by("", "hoist-by-hand.toml");
  const auto d = draw(design.string(), "hoist-by-hand.pdf");
  const std::string calc = calculation_text(*d);
  EXPECT_NE(calc.find("Applied by hand"), std::string::npos);
  EXPECT_NE(calc.find("Hoist rules"), std::string::npos);
  // Its row in the checks table and again in the section, each ending in FAIL.
  const std::regex failed(R"(Hoist holding brake[^\n]*FAIL)");
  EXPECT_GE(std::distance(std::sregex_iterator(calc.begin(), calc.end(), failed), std::sregex_iterator()), 2)
      << calc;
  EXPECT_EQ(calc.find("Spring rate k"), std::string::npos);
}

TEST(DrawingApplyCalc, NoTwoWordsOverlapOnTheCalculationPages) {
  const auto us = draw(kExample, "apply-overlap-us.pdf", UnitSystem::us);
  const auto weight = draw(example_applied_by(kWeightApply, "weight-overlap.toml").string(), "apply-overlap-weight.pdf");
  const auto a4 = draw(kExample, "apply-overlap-a4.pdf", UnitSystem::si, "A4");
  const auto a4_us = draw(kExample, "apply-overlap-a4-us.pdf", UnitSystem::us, "A4");
  for (const Drawn* d : std::vector<const Drawn*>{&example(), us.get(), weight.get(), a4.get(), a4_us.get()}) {
    SCOPED_TRACE(d->pdf.string());
    EXPECT_EQ(run("qpdf --check " + quote(d->pdf)).status, 0);
    const std::vector<int> pages = calculation_pages(*d);
    ASSERT_GE(pages.size(), 2u);
    bool section = false;
    for (int p : pages) {
      SCOPED_TRACE("page " + std::to_string(p));
      section = section || text_of(d->pdf, p).find("Applying the brake") != std::string::npos;
      const auto words = cap_boxes(d->pdf, p);
      ASSERT_FALSE(words.empty());
      expect_no_two_words_overlap(words);
    }
    EXPECT_TRUE(section) << "the section is on one of the pages checked";
  }
}

}  // namespace
}  // namespace bandforge::drawing
