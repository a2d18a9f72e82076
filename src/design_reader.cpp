#include "src/design_reader.hpp"

#include <toml++/toml.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <initializer_list>
#include <iostream>
#include <numbers>
#include <optional>
#include <vector>

#include "src/errors.hpp"
#include "src/materials.hpp"
#include "src/units.hpp"

namespace bandforge {
namespace {

// A design file is a page of text; anything far larger is something else given by mistake.
constexpr std::size_t kMaxFileBytes = 1 << 20;
// toml++ 3.3 recurses once per dotted-key segment and overflows the stack at ~40 000 segments
// ("[a.a.a...]"). A design nests three deep; a file with this many dots outside strings is not one.
constexpr std::size_t kMaxBareDots = 1000;

constexpr double kDefaultClearance = 0.0015;  // m; common practice, no source

std::string in_quotes(std::string_view s) {
  std::string out;  // built by append: GCC 12 warns falsely (-Wrestrict) on "literal" + string
  out.reserve(s.size() + 2);
  out.append(1, '"').append(s).append(1, '"');
  return out;
}

std::string join(const std::vector<std::string>& items) {
  std::string out;
  for (std::size_t i = 0; i < items.size(); ++i) {
    if (i > 0) out += i + 1 == items.size() ? " or " : ", ";
    out += items[i];
  }
  return out;
}

std::string join_quoted(std::initializer_list<std::string_view> items) {
  std::vector<std::string> q;
  for (auto s : items) q.push_back(in_quotes(s));
  return join(q);
}

// Optimal string alignment distance: a swapped pair of letters ("bnad") costs one edit.
std::size_t edit_distance(std::string_view a, std::string_view b) {
  const auto lower = [](char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c + 32) : c; };
  std::vector<std::vector<std::size_t>> d(a.size() + 1, std::vector<std::size_t>(b.size() + 1));
  for (std::size_t i = 0; i <= a.size(); ++i) d[i][0] = i;
  for (std::size_t j = 0; j <= b.size(); ++j) d[0][j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t cost = lower(a[i - 1]) == lower(b[j - 1]) ? 0 : 1;
      d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
      if (i > 1 && j > 1 && lower(a[i - 1]) == lower(b[j - 2]) &&
          lower(a[i - 2]) == lower(b[j - 1])) {
        d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
      }
    }
  }
  return d[a.size()][b.size()];
}

// The known name closest to `given`, or "" when none is plausibly meant.
std::string nearest(std::string_view given, const std::vector<std::string>& known) {
  if (given.size() > 64) return {};  // keeps the distance table small on garbage input
  std::string best;
  std::size_t best_d = std::string::npos;
  for (const std::string& k : known) {
    const std::size_t dist = edit_distance(given, k);
    if (dist < best_d) {
      best_d = dist;
      best = k;
    }
  }
  const std::size_t limit = std::max<std::size_t>(1, std::min<std::size_t>(3, given.size() / 3));
  if (best_d <= limit) return best;
  // A key given by a part of its name: "pressure" for "pressure_limit", "diameter" for
  // "pin_diameter".
  if (given.size() >= 4) {
    for (const std::string& k : known) {
      if (k.find(given) != std::string::npos) return k;
    }
  }
  return {};
}

std::size_t count_bare_dots(std::string_view text) {
  enum class St { normal, comment, basic, literal, ml_basic, ml_literal };
  St st = St::normal;
  std::size_t dots = 0;
  const auto at = [&](std::size_t i, std::string_view s) { return text.substr(i, s.size()) == s; };
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    switch (st) {
      case St::normal:
        if (c == '#') st = St::comment;
        else if (at(i, "\"\"\"")) { st = St::ml_basic; i += 2; }
        else if (at(i, "'''")) { st = St::ml_literal; i += 2; }
        else if (c == '"') st = St::basic;
        else if (c == '\'') st = St::literal;
        else if (c == '.') ++dots;
        break;
      case St::comment:
        if (c == '\n') st = St::normal;
        break;
      case St::basic:
        if (c == '\\') ++i;
        else if (c == '"' || c == '\n') st = St::normal;
        break;
      case St::literal:
        if (c == '\'' || c == '\n') st = St::normal;
        break;
      case St::ml_basic:
        if (c == '\\') ++i;
        else if (at(i, "\"\"\"")) { st = St::normal; i += 2; }
        break;
      case St::ml_literal:
        if (at(i, "'''")) { st = St::normal; i += 2; }
        break;
    }
  }
  return dots;
}

bool is_safe_stem(std::string_view s) {
  if (s.empty() || s.size() > 100) return false;
  const auto alnum = [](char c) {
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9');
  };
  if (!alnum(s.front())) return false;  // no hidden files, nothing a shell reads as an option
  return std::all_of(s.begin(), s.end(),
                     [&](char c) { return alnum(c) || c == '-' || c == '_' || c == '.'; });
}

bool is_iso_date(std::string_view s) {
  if (s.size() != 10 || s[4] != '-' || s[7] != '-') return false;
  int v[3] = {0, 0, 0};
  const std::size_t starts[3] = {0, 5, 8};
  const std::size_t lens[3] = {4, 2, 2};
  for (int k = 0; k < 3; ++k) {
    for (std::size_t i = starts[k]; i < starts[k] + lens[k]; ++i) {
      if (s[i] < '0' || s[i] > '9') return false;
      v[k] = v[k] * 10 + (s[i] - '0');
    }
  }
  const int year = v[0], month = v[1], day = v[2];
  if (month < 1 || month > 12 || day < 1) return false;
  const bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
  const int days[12] = {31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  return day <= days[month - 1];
}

bool has_control_chars(std::string_view s) {
  return std::any_of(s.begin(), s.end(),
                     [](char c) { return static_cast<unsigned char>(c) < 0x20 || c == 0x7f; });
}

/// One table of the file ([band], or band.end_a) and the dotted path used for its keys.
struct Section {
  const toml::table* table = nullptr;  // nullptr: the section is absent
  std::string path;                    // "band", "band.end_a"
  SourcePos pos;                       // where the section starts
  std::string title;                   // "[band]", or "band.end_a" for an inline table
  explicit operator bool() const { return table != nullptr; }
};

class Reader {
 public:
  Reader(std::string_view text, std::string name) : text_(text) {
    d_.file = std::move(name);
    line_starts_.push_back(0);
    for (std::size_t i = 0; i < text_.size(); ++i) {
      if (text_[i] == '\n') line_starts_.push_back(i + 1);
    }
  }

  Design read() {
    if (count_bare_dots(text_) > kMaxBareDots) {
      fail({}, "", "", "not a bandforge design file: more than " + std::to_string(kMaxBareDots) +
                           " '.' outside strings and comments");
    }
    toml::table root;
    try {
      root = toml::parse(text_, std::string_view(d_.file));
    } catch (const toml::parse_error& e) {
      fail(pos_of(e.source().begin), "", "",
           "TOML syntax error: " + std::string(e.description()));
    }
    read_root(root);
    return std::move(d_);
  }

 private:
  std::string_view text_;
  std::vector<std::size_t> line_starts_;
  Design d_;

  // ---- positions and messages ----------------------------------------------------------

  static SourcePos pos_of(const toml::source_position& p) {
    return SourcePos{static_cast<int>(std::min<toml::source_index>(p.line, 1u << 30)),
                     static_cast<int>(std::min<toml::source_index>(p.column, 1u << 30))};
  }

  [[noreturn]] void fail(SourcePos pos, const std::string& key, const std::string& value,
                         const std::string& problem) const {
    throw DesignError(d_.file, pos.line, pos.column, key, value, problem);
  }

  // Byte offset of a 1-based line and column (toml++ counts columns in code points).
  std::size_t offset(const toml::source_position& p) const {
    if (p.line == 0 || p.line > line_starts_.size()) return text_.size();
    std::size_t i = line_starts_[p.line - 1];
    for (toml::source_index col = 1; col < p.column && i < text_.size() && text_[i] != '\n';) {
      ++i;
      if (i >= text_.size() || (static_cast<unsigned char>(text_[i]) & 0xC0) != 0x80) ++col;
    }
    return i;
  }

  /// The value exactly as written in the file, for messages: "\"3 N\"", "400", "[0.2, 0.5]".
  std::string written(const toml::node& n) const {
    const toml::source_region& r = n.source();
    const std::size_t b = offset(r.begin);
    std::size_t e = r.end.line == r.begin.line ? offset(r.end) : text_.find('\n', b);
    if (e == std::string_view::npos || e > text_.size()) e = text_.size();
    if (b >= e) return {};
    std::string s(text_.substr(b, e - b));
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.pop_back();
    if (s.size() > 80) {
      std::size_t cut = 77;
      while (cut > 0 && (static_cast<unsigned char>(s[cut]) & 0xC0) == 0x80) --cut;
      s = s.substr(0, cut) + "...";
    }
    return s;
  }

  // ---- sections and keys -----------------------------------------------------------------

  Section section(const toml::table& root, const std::string& name) {
    Section s;
    s.path = name;
    s.title = "[" + name + "]";
    const toml::node* n = root.get(name);
    if (n == nullptr) return s;
    s.pos = pos_of(n->source().begin);
    if (n->is_array_of_tables()) {
      fail(s.pos, name, "", "write the section once as [" + name + "], not as [[" + name + "]]");
    }
    s.table = n->as_table();
    if (s.table == nullptr) {
      fail(s.pos, name, written(*n), "expected a section [" + name + "] holding keys");
    }
    d_.where[name] = s.pos;
    return s;
  }

  Section subtable(const Section& parent, std::string_view key, std::string_view example) {
    Section s;
    s.path = parent.path + "." + std::string(key);
    s.title = s.path;
    const toml::node* n = node(parent, key);
    if (n == nullptr) return s;
    s.pos = pos_of(n->source().begin);
    s.table = n->as_table();
    if (s.table == nullptr) {
      fail(s.pos, s.path, written(*n), "expected an inline table such as " + std::string(example));
    }
    return s;
  }

  void check_keys(const Section& s, std::initializer_list<const char*> known_list) const {
    const std::vector<std::string> known(known_list.begin(), known_list.end());
    for (auto&& [k, v] : *s.table) {
      const std::string_view key = k.str();
      if (std::find(known.begin(), known.end(), key) != known.end()) continue;
      const std::string suggestion = nearest(key, known);
      std::string problem = "unknown key '" + std::string(key) + "' in " + s.title;
      if (!suggestion.empty()) {
        problem += "; did you mean '" + suggestion + "'?";
      } else {
        std::vector<std::string> names;
        for (const auto& kn : known) names.push_back(kn);
        problem += "; valid keys: " + join(names);
      }
      fail(pos_of(k.source().begin), s.path + "." + std::string(key), written(v), problem);
    }
  }

  /// The value of `key`, recording where it was written; nullptr when absent.
  const toml::node* node(const Section& s, std::string_view key) {
    if (!s) return nullptr;
    const toml::node* n = s.table->get(key);
    if (n != nullptr) d_.where[s.path + "." + std::string(key)] = pos_of(n->source().begin);
    return n;
  }

  SourcePos pos(const toml::node& n) const { return pos_of(n.source().begin); }

  /// A value that is present in `s` but wrong: the message names it and quotes it as written.
  [[noreturn]] void bad_value(const Section& s, std::string_view key,
                              const std::string& problem) const {
    const toml::node& n = *s.table->get(key);
    fail(pos(n), s.path + "." + std::string(key), written(n), problem);
  }

  [[noreturn]] void missing(const Section& s, std::string_view key, const std::string& what) const {
    fail(s.pos, s.path + "." + std::string(key), "",
         "missing key '" + std::string(key) + "' in " + s.title + ": " + what);
  }

  [[noreturn]] void missing_section(const std::string& name, const std::string& what) const {
    fail({}, name, "", "missing section [" + name + "]: " + what);
  }

  // ---- typed values ----------------------------------------------------------------------

  std::optional<std::string> string(const Section& s, std::string_view key) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    if (const auto* v = n->as_string()) return v->get();
    bad_value(s, key, "expected a string in double quotes, e.g. " + in_quotes("text"));
  }

  /// One of `choices`; returns its index.
  std::optional<std::size_t> choice(const Section& s, std::string_view key,
                                    std::initializer_list<std::string_view> choices) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    const auto* v = n->as_string();
    std::size_t i = 0;
    if (v != nullptr) {
      for (std::string_view c : choices) {
        if (v->get() == c) return i;
        ++i;
      }
    }
    bad_value(s, key, "expected " + join_quoted(choices));
  }

  /// A required "cw" or "ccw"; `what` says what the key means when it is missing.
  Turn turn(const Section& s, std::string_view key, const std::string& what) {
    const auto t = choice(s, key, {"cw", "ccw"});
    if (!t) missing(s, key, what);
    return *t == 0 ? Turn::cw : Turn::ccw;
  }

  double quantity_of(const toml::node& n, const std::string& path, Quantity q) const {
    if (const auto* v = n.as_string()) {
      try {
        return parse_quantity(v->get(), q);
      } catch (const UnitParseError& e) {
        fail(pos(n), path, written(n), e.what());
      }
    }
    if (n.is_number()) {
      const std::string given = written(n);
      const std::string unit = display_unit(q, UnitSystem::si);
      fail(pos(n), path, given,
           "give the unit, e.g. " + in_quotes(given + (unit == "°" ? "" : " ") + unit) +
               " (" + quantity_name(q) + ")");
    }
    fail(pos(n), path, written(n),
         "expected " + quantity_name(q) + " as a string with its unit, e.g. " +
             quantity_examples(q));
  }

  std::optional<double> quantity(const Section& s, std::string_view key, Quantity q) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    return quantity_of(*n, s.path + "." + std::string(key), q);
  }

  double required_quantity(const Section& s, std::string_view key, Quantity q,
                           const std::string& what) {
    auto v = quantity(s, key, q);
    if (!v) missing(s, key, what + ", e.g. " + quantity_examples(q));
    return *v;
  }

  void must_be_positive(const Section& s, std::string_view key, double v, Quantity q) const {
    if (v > 0.0) return;
    const std::string path = s.path + "." + std::string(key);
    const toml::node* n = s.table->get(key);
    fail(n ? pos(*n) : s.pos, path, n ? written(*n) : "",
         std::string(v == 0.0 ? "zero" : "negative") + " is not allowed: it must be greater than "
         "zero, e.g. " + quantity_examples(q));
  }

  double positive(const Section& s, std::string_view key, Quantity q, const std::string& what) {
    const double v = required_quantity(s, key, q, what);
    must_be_positive(s, key, v, q);
    return v;
  }

  /// A bare number (friction, service factor): no quotes, no unit.
  std::optional<double> number(const Section& s, std::string_view key, std::string_view example) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    return number_of(*n, s.path + "." + std::string(key), example);
  }

  double number_of(const toml::node& n, const std::string& path, std::string_view example) const {
    std::optional<double> v;
    if (const auto* i = n.as_integer()) v = static_cast<double>(i->get());
    if (const auto* f = n.as_floating_point()) v = f->get();
    if (v) {
      if (!std::isfinite(*v)) fail(pos(n), path, written(n), "expected a finite number");
      return *v;
    }
    if (n.is_string()) {
      fail(pos(n), path, written(n),
           "expected a bare number without quotes or unit, e.g. " + std::string(example));
    }
    fail(pos(n), path, written(n), "expected a number, e.g. " + std::string(example));
  }

  /// ["x", "y"]: two lengths.
  std::optional<Vec2> point(const Section& s, std::string_view key) {
    const toml::node* n = node(s, key);
    if (n == nullptr) return std::nullopt;
    const std::string path = s.path + "." + std::string(key);
    const auto* arr = n->as_array();
    if (arr == nullptr || arr->size() != 2) {
      fail(pos(*n), path, written(*n),
           "expected a point as two lengths [\"x\", \"y\"], e.g. [\"-60 mm\", \"-300 mm\"] "
           "(drum centre at the origin, x right, y up)");
    }
    return Vec2{quantity_of(*arr->get(0), path, Quantity::length),
                quantity_of(*arr->get(1), path, Quantity::length)};
  }

  // ---- the sections ----------------------------------------------------------------------

  void read_root(const toml::table& root) {
    static const std::vector<std::string> kSections = {
        "project", "drum", "lining", "band", "lever", "load", "duty", "concept", "drawing"};
    for (auto&& [k, v] : root) {
      const std::string_view key = k.str();
      if (std::find(kSections.begin(), kSections.end(), key) != kSections.end()) continue;
      const std::string suggestion = nearest(key, kSections);
      std::string problem;
      if (v.is_table() || v.is_array_of_tables()) {
        problem = "unknown section [" + std::string(key) + "]";
        problem += suggestion.empty() ? "; valid sections: [" + join(kSections) + "]"
                                      : "; did you mean [" + suggestion + "]?";
      } else {
        problem = "key '" + std::string(key) + "' is outside any section; keys belong in a "
                  "section such as [project] or [drum]";
      }
      // A section's "value" is its whole body: quote nothing.
      const bool is_section = v.is_table() || v.is_array_of_tables();
      fail(pos_of(k.source().begin), std::string(key), is_section ? "" : written(v), problem);
    }

    const Section project = section(root, "project");
    const Section drum = section(root, "drum");
    const Section lining = section(root, "lining");
    const Section band = section(root, "band");
    const Section lever = section(root, "lever");
    const Section load = section(root, "load");
    const Section duty = section(root, "duty");
    const Section concept_sec = section(root, "concept");
    const Section drawing = section(root, "drawing");
    const bool is_concept = static_cast<bool>(concept_sec);

    if (!project) missing_section("project", "it gives at least the title, e.g. title = \"Hoist brake\"");
    if (!drum) missing_section("drum", "it gives the drum diameter, width, bore and rotation");
    if (!lining) missing_section("lining", "it gives the lining material (or friction) and thickness");
    if (!band) missing_section("band", "it gives the steel band's width, thickness and ends");
    if (!lever && !is_concept) {
      missing_section("lever", "it gives the pivot and handle points (or describe the arms in a "
                      "[concept] section)");
    }
    if (!load) missing_section("load", "it gives the torque needed or the lever force available");

    read_project(project);
    read_drum(drum);
    read_lining(lining);
    read_band(band, is_concept);
    read_lever(lever, is_concept);
    read_load(load);
    if (duty) read_duty(duty);
    if (concept_sec) read_concept(concept_sec);
    if (drawing) read_drawing(drawing);
  }

  void read_project(const Section& s) {
    check_keys(s, {"title", "number", "revision", "owner", "creator", "approver", "date"});
    Project& p = d_.project;
    const auto one_line = [&](std::string_view key, std::optional<std::string> v) {
      if (v && has_control_chars(*v)) {
        bad_value(s, key,
                  "must be one line of text without tabs or control characters (it goes in the "
                  "title block)");
      }
      return v;
    };
    auto title = one_line("title", string(s, "title"));
    if (!title) missing(s, "title", "the drawing title, e.g. title = \"Hoist holding brake\"");
    if (title->find_first_not_of(' ') == std::string::npos) {
      bad_value(s, "title", "the title must not be empty");
    }
    p.title = *title;
    if (auto v = one_line("number", string(s, "number"))) {
      if (!is_safe_stem(*v)) {
        bad_value(s, "number",
                  "the number names the output files: use letters, digits, '-', '_' and '.', starting "
                  "with a letter or digit, e.g. \"KFW-2207-BR\"");
      }
      p.number = *v;
    }
    if (auto v = one_line("revision", string(s, "revision"))) p.revision = *v;
    if (auto v = one_line("owner", string(s, "owner"))) p.owner = *v;
    if (auto v = one_line("creator", string(s, "creator"))) p.creator = *v;
    if (auto v = one_line("approver", string(s, "approver"))) p.approver = *v;
    if (const toml::node* n = node(s, "date")) {
      if (const auto* dt = n->as_date()) {
        char buf[16];
        std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", static_cast<int>(dt->get().year),
                      static_cast<int>(dt->get().month), static_cast<int>(dt->get().day));
        p.date = buf;
      } else if (const auto* str = n->as_string(); str != nullptr && is_iso_date(str->get())) {
        p.date = str->get();
      } else {
        fail(pos(*n), "project.date", written(*n),
             "expected an ISO 8601 date YYYY-MM-DD, e.g. \"2026-11-30\"");
      }
    }
  }

  void read_drum(const Section& s) {
    check_keys(s, {"diameter", "width", "bore", "rotation", "material"});
    Drum& dr = d_.drum;
    dr.diameter = positive(s, "diameter", Quantity::length, "the friction-surface diameter");
    dr.width = positive(s, "width", Quantity::length, "the face width of the rim");
    dr.bore = positive(s, "bore", Quantity::length, "the shaft bore");
    if (dr.bore >= dr.diameter / 2) {
      bad_value(s, "bore", "the bore must be smaller than half the drum diameter (" +
                format_quantity(dr.diameter / 2, Quantity::length, UnitSystem::si) +
                ") to leave a hub and a rim");
    }
    dr.rotation = turn(s, "rotation", "the load's rotation to be braked, seen from the front: "
                                      "rotation = \"cw\" or \"ccw\"");
    dr.material = string(s, "material").value_or("cast-iron");
    const DrumMaterial* m = find_drum_material(dr.material);
    if (m == nullptr) {
      std::vector<std::string> keys;
      for (const auto& dm : drum_materials()) keys.push_back(in_quotes(dm.key));
      bad_value(s, "material", "unknown drum material; valid: " + join(keys));
    }
    dr.density = m->density;
    dr.specific_heat = m->specific_heat;
    dr.material_source =
        "density: " + m->density_source + "; specific heat: " + m->specific_heat_source;
  }

  void read_lining(const Section& s) {
    check_keys(s, {"material", "friction", "friction_range", "pressure_limit",
                   "temperature_limit", "power_limit", "thickness"});
    Lining& li = d_.lining;
    const LiningMaterial* m = nullptr;
    if (auto key = string(s, "material")) {
      m = find_lining(*key);
      if (m == nullptr) {
        std::vector<std::string> keys;
        for (const auto& lm : lining_materials()) keys.push_back(in_quotes(lm.key));
        const std::string suggestion = nearest(*key, [&] {
          std::vector<std::string> k;
          for (const auto& lm : lining_materials()) k.push_back(lm.key);
          return k;
        }());
        bad_value(s, "material", "unknown lining material" +
                  (suggestion.empty() ? std::string() : "; did you mean " + in_quotes(suggestion) + "?") +
                  "; valid: " + join(keys) +
                  "; or leave material out and give friction and pressure_limit");
      }
      li.material = m->key;
    }

    const std::optional<double> f = number(s, "friction", "friction = 0.35");
    if (f && !(*f > 0.0 && *f < 1.0)) {
      bad_value(s, "friction",
                "the coefficient of friction must lie between 0 and 1 (exclusive), e.g. 0.35");
    }

    std::optional<std::array<double, 2>> range;
    if (const toml::node* n = node(s, "friction_range")) {
      const auto* arr = n->as_array();
      if (arr == nullptr || arr->size() != 2) {
        fail(pos(*n), "lining.friction_range", written(*n),
             "expected [min, max] as two bare numbers, e.g. friction_range = [0.25, 0.45]");
      }
      const std::array<double, 2> r = {
          number_of(*arr->get(0), "lining.friction_range", "[0.25, 0.45]"),
          number_of(*arr->get(1), "lining.friction_range", "[0.25, 0.45]")};
      if (!(r[0] > 0.0 && r[0] <= r[1] && r[1] < 1.0)) {
        fail(pos(*n), "lining.friction_range", written(*n),
             "need 0 < min <= max < 1, e.g. friction_range = [0.25, 0.45]");
      }
      range = r;
    }

    if (m != nullptr) {
      li.friction_min = m->friction_min;
      li.friction_max = m->friction_max;
      li.friction = m->friction;
      li.friction_source = m->friction_source;
      li.pressure_limit = m->pressure_limit;
      li.pressure_source = m->pressure_source;
      li.temperature_limit = m->temperature_limit;
      li.temperature_source = m->temperature_source;
      li.power_limit = m->power_limit;
      li.power_source = m->power_source;
      if (range) {
        li.friction_min = (*range)[0];
        li.friction_max = (*range)[1];
        li.friction = f ? *f : 0.5 * ((*range)[0] + (*range)[1]);
        li.friction_source = f ? "design file"
                               : "design file (friction_range; nominal = middle of the range)";
      } else if (f) {
        li.friction = *f;
        li.friction_source = "design file (nominal f); range: " + m->friction_source;
        if (*f < li.friction_min || *f > li.friction_max) {
          bad_value(s, "friction",
                    "lies outside the published range " + range_text(li.friction_min, li.friction_max) +
                    " for \"" + m->key + "\"; give friction_range = [min, max] as well to "
                    "override the range");
        }
      }
    } else {
      if (!f) {
        missing(s, "friction", "without a material, give friction (a bare number, e.g. friction "
                               "= 0.35) and pressure_limit, or give material = " +
                                   lining_keys());
      }
      li.friction = *f;
      li.friction_min = range ? (*range)[0] : *f;
      li.friction_max = range ? (*range)[1] : *f;
      li.friction_source = "design file";
    }
    if (li.friction < li.friction_min || li.friction > li.friction_max) {
      bad_value(s, "friction", "must lie within friction_range " +
                range_text(li.friction_min, li.friction_max));
    }

    if (auto p = quantity(s, "pressure_limit", Quantity::stress)) {
      must_be_positive(s, "pressure_limit", *p, Quantity::stress);
      li.pressure_limit = *p;
      li.pressure_source = "design file";
    } else if (m == nullptr) {
      missing(s, "pressure_limit", "without a material, give the allowable lining pressure, e.g. " +
                                       quantity_examples(Quantity::stress));
    }
    if (auto t = quantity(s, "temperature_limit", Quantity::temperature)) {
      if (!(*t > 0.0)) {
        bad_value(s, "temperature_limit",
                  "a lining temperature limit must be above 0 °C, e.g. \"200 °C\"");
      }
      li.temperature_limit = *t;
      li.temperature_source = "design file";
    }
    if (auto w = quantity(s, "power_limit", Quantity::power_density)) {
      must_be_positive(s, "power_limit", *w, Quantity::power_density);
      li.power_limit = *w;
      li.power_source = "design file";
    }
    li.thickness = required_quantity(s, "thickness", Quantity::length,
                                     "the radial lining thickness (\"0 mm\" for a bare band)");
    if (li.thickness < 0.0) {
      bad_value(s, "thickness",
                "must not be negative; give \"0 mm\" for a bare band, e.g. \"5 mm\"");
    }
  }

  static std::string range_text(double lo, double hi) {
    return format_quantity(lo, Quantity::dimensionless, UnitSystem::si, 3) + "–" +
           format_quantity(hi, Quantity::dimensionless, UnitSystem::si, 3);
  }

  static std::string lining_keys() {
    std::vector<std::string> keys;
    for (const auto& lm : lining_materials()) keys.push_back(in_quotes(lm.key));
    return join(keys);
  }

  BandEnd read_end(const Section& band, std::string_view key) {
    const std::string example =
        std::string("{ mount = \"lever\", at = [\"60 mm\", \"-300 mm\"] }");
    const Section s = subtable(band, key, example);
    if (!s) missing(band, key, "give " + std::string(key) + " = " + example);
    check_keys(s, {"mount", "at"});
    BandEnd end;
    const auto mount = choice(s, "mount", {"lever", "frame"});
    if (!mount) missing(s, "mount", "where the end is pinned: mount = \"lever\" or \"frame\"");
    end.mount = *mount == 0 ? Mount::lever : Mount::frame;
    const auto at = point(s, "at");
    if (!at) missing(s, "at", "the pin centre, e.g. at = [\"60 mm\", \"-300 mm\"]");
    end.at = *at;
    return end;
  }

  void read_band(const Section& s, bool is_concept) {
    check_keys(s, {"width", "thickness", "allowable_stress", "sense", "end_a", "end_b",
                   "pin_diameter", "clearance", "pin_allowable_shear", "model", "end_joint"});
    Band& b = d_.band;
    b.width = positive(s, "width", Quantity::length, "the steel band width");
    if (b.width > d_.drum.width) {
      bad_value(s, "width", "the band is wider than the drum face (" +
                format_quantity(d_.drum.width, Quantity::length, UnitSystem::si) +
                "); the band width must not exceed drum.width");
    }
    b.thickness = positive(s, "thickness", Quantity::length, "the steel band thickness");
    b.allowable_stress = positive(s, "allowable_stress", Quantity::stress,
                                  "the allowable tensile stress of the band");
    b.sense = turn(s, "sense", "the way the band runs from end A round the drum to end B: "
                               "sense = \"cw\" or \"ccw\"");

    if (is_concept) {
      for (const char* key : {"end_a", "end_b"}) {
        if (node(s, key) != nullptr) {
          bad_value(s, key, "a concept design has no pin coordinates: remove " + std::string(key) +
                    ", or remove the [concept] section to describe the pin layout");
        }
      }
    } else {
      b.end_a = read_end(s, "end_a");
      b.end_b = read_end(s, "end_b");
      if (b.end_a.mount == Mount::frame && b.end_b.mount == Mount::frame) {
        const toml::node* n = s.table->get("end_b")->as_table()->get("mount");
        fail(pos(*n), "band.end_b.mount", written(*n),
             "at least one band end must be on the lever (both ends are on the frame, so the "
             "lever cannot tighten the band)");
      }
      if (std::hypot(b.end_a.at.x - b.end_b.at.x, b.end_a.at.y - b.end_b.at.y) < 1e-9) {
        const toml::node* n = s.table->get("end_b")->as_table()->get("at");
        fail(pos(*n), "band.end_b.at", written(*n),
             "end_b is at the same point as end_a; the two pins need distinct centres");
      }
    }

    if (auto pin = quantity(s, "pin_diameter", Quantity::length)) {
      must_be_positive(s, "pin_diameter", *pin, Quantity::length);
      b.pin_diameter = *pin;
    } else if (!is_concept) {
      missing(s, "pin_diameter", "the band-end and pivot pin diameter");
    }
    b.clearance = kDefaultClearance;
    if (auto c = quantity(s, "clearance", Quantity::length)) {
      if (*c < 0.0) {
        bad_value(s, "clearance",
                  "the radial release clearance must not be negative, e.g. \"1.5 mm\"");
      }
      b.clearance = *c;
    }
    // Distortion-energy relation between shear and tensile allowables.
    b.pin_allowable_shear = b.allowable_stress / std::numbers::sqrt3;
    if (auto tau = quantity(s, "pin_allowable_shear", Quantity::stress)) {
      must_be_positive(s, "pin_allowable_shear", *tau, Quantity::stress);
      b.pin_allowable_shear = *tau;
    }
    if (auto model = choice(s, "model", {"thin", "thick"})) {
      b.model = *model == 0 ? TensionModel::thin : TensionModel::thick;
    }
    if (auto joint = choice(s, "end_joint", {"auto", "riveted-lap", "riveted-compact", "welded-block"})) {
      constexpr EndJointChoice kinds[] = {EndJointChoice::automatic, EndJointChoice::riveted_lap,
                                          EndJointChoice::riveted_compact,
                                          EndJointChoice::welded_block};
      b.end_joint = kinds[*joint];
    }
  }

  void read_lever(const Section& s, bool is_concept) {
    if (!s) return;  // only allowed for a concept design (checked in read_root)
    check_keys(s, {"pivot", "handle", "width", "thickness", "allowable_stress"});
    Lever& l = d_.lever;
    if (is_concept) {
      for (const char* key : {"pivot", "handle"}) {
        if (node(s, key) != nullptr) {
          bad_value(s, key, "a concept design has no pin coordinates: remove " + std::string(key) +
                    ", or remove the [concept] section to describe the pin layout");
        }
      }
      // The lever section is optional here, but its bending check needs all three sizes.
      const bool any = s.table->contains("width") || s.table->contains("thickness") ||
                       s.table->contains("allowable_stress");
      if (!any) return;
    } else {
      const auto pivot = point(s, "pivot");
      if (!pivot) missing(s, "pivot", "the lever pivot centre, e.g. pivot = [\"-110 mm\", \"-300 mm\"]");
      const auto handle = point(s, "handle");
      if (!handle) {
        missing(s, "handle", "where the operator's force acts, e.g. handle = [\"700 mm\", \"-300 mm\"]");
      }
      l.pivot = *pivot;
      l.handle = *handle;
      if (std::hypot(l.handle.x - l.pivot.x, l.handle.y - l.pivot.y) < 1e-6) {
        bad_value(s, "handle",
                  "the handle is at the pivot, so the operator's force has no arm; put the handle "
                  "at the far end of the lever");
      }
    }
    l.width = positive(s, "width", Quantity::length, "the lever plate width (in the view plane)");
    l.thickness = positive(s, "thickness", Quantity::length,
                           "the lever plate thickness (along the drum axis)");
    l.allowable_stress = positive(s, "allowable_stress", Quantity::stress,
                                  "the allowable bending stress of the lever");
  }

  void read_load(const Section& s) {
    check_keys(s, {"torque", "lever_force", "service_factor"});
    Load& ld = d_.load;
    const auto torque = quantity(s, "torque", Quantity::torque);
    const auto force = quantity(s, "lever_force", Quantity::force);
    if (torque && force) {
      bad_value(s, "lever_force",
                "give either torque (solve the lever force) or lever_force (solve the torque), not both");
    }
    if (!torque && !force) {
      fail(s.pos, "load", "",
           "give either torque = \"400 N*m\" (the braking torque needed) or lever_force = "
           "\"200 N\" (the force the operator can apply)");
    }
    if (torque) {
      must_be_positive(s, "torque", *torque, Quantity::torque);
      ld.given = Load::Given::torque;
      ld.torque = *torque;
    } else {
      must_be_positive(s, "lever_force", *force, Quantity::force);
      ld.given = Load::Given::lever_force;
      ld.lever_force = *force;
    }
    if (auto sf = number(s, "service_factor", "service_factor = 1.25")) {
      if (!(*sf > 0.0)) {
        bad_value(s, "service_factor", "the service factor must be greater than zero, e.g. 1.25");
      }
      ld.service_factor = *sf;
    }
  }

  void read_duty(const Section& s) {
    check_keys(s, {"speed", "inertia", "mass", "stop_distance", "rope_radius", "stops_per_hour",
                   "ambient"});
    Duty& du = d_.duty;
    du.present = true;
    const toml::node* speed_node = node(s, "speed");
    if (speed_node == nullptr) {
      missing(s, "speed", "the speed at the start of a stop: the drum's angular speed, e.g. "
                          "\"300 rpm\", or a hoist load's linear speed, e.g. \"0.5 m/s\"");
    }
    bool hoist = false;
    double speed = 0.0;
    if (const auto* str = speed_node->as_string()) {
      try {
        speed = parse_quantity(str->get(), Quantity::angular_speed);
      } catch (const UnitParseError& angular) {
        try {
          speed = parse_quantity(str->get(), Quantity::linear_speed);
          hoist = true;
        } catch (const UnitParseError&) {
          bad_value(s, "speed",
                    std::string(angular.what()) + " (or, for a hoist, a linear speed such as "
                    "\"0.5 m/s\")");
        }
      }
    } else {
      bad_value(s, "speed",
                "give the unit: an angular speed such as \"300 rpm\", or a hoist load's linear speed "
                "such as \"0.5 m/s\"");
    }
    if (!(speed > 0.0)) {
      bad_value(s, "speed", "the speed must be greater than zero, e.g. \"300 rpm\" or \"0.5 m/s\"");
    }

    if (hoist) {
      du.hoist_speed = speed;
      du.hoist_mass = positive(s, "mass", Quantity::mass,
                               "a hoist duty (speed is a linear speed) needs the lowered mass");
      du.stop_distance = positive(s, "stop_distance", Quantity::length,
                                  "a hoist duty needs the load's travel during the stop");
      du.rope_radius = positive(s, "rope_radius", Quantity::length,
                                "a hoist duty needs the rope radius on the brake shaft");
      du.speed = du.hoist_speed / du.rope_radius;  // the drum speed that the hoist speed means
      if (auto i = quantity(s, "inertia", Quantity::inertia)) {
        if (*i < 0.0) {
          bad_value(s, "inertia",
                    "the inertia must not be negative, e.g. " + quantity_examples(Quantity::inertia));
        }
        du.inertia = *i;
      }
    } else {
      du.speed = speed;
      for (const char* key : {"mass", "stop_distance", "rope_radius"}) {
        if (node(s, key) != nullptr) {
          bad_value(s, key,
                    std::string(key) + " belongs to a hoist duty, whose speed is the load's linear "
                    "speed (e.g. speed = \"0.5 m/s\"); with an angular speed (" +
                        written(*speed_node) + ") the duty is a rotating one: give inertia instead");
        }
      }
      du.inertia = positive(s, "inertia", Quantity::inertia,
                            "a rotating duty (speed is an angular speed) needs the rotating "
                            "inertia reflected to the drum shaft");
    }

    if (const toml::node* n = node(s, "stops_per_hour")) {
      double per_hour = 0.0;
      if (const auto* str = n->as_string()) {
        try {
          per_hour = parse_quantity(str->get(), Quantity::rate) * 3600.0;
        } catch (const UnitParseError& e) {
          fail(pos(*n), "duty.stops_per_hour", written(*n),
               std::string(e.what()) + "; or a bare number of stops per hour: stops_per_hour = 20");
        }
      } else {
        per_hour = number_of(*n, "duty.stops_per_hour", "stops_per_hour = 20");
      }
      if (!(per_hour > 0.0)) {
        fail(pos(*n), "duty.stops_per_hour", written(*n),
             "the number of stops per hour must be greater than zero, e.g. stops_per_hour = 20");
      }
      du.stops_per_hour = per_hour;
    }
    if (auto t = quantity(s, "ambient", Quantity::temperature)) du.ambient = *t;
  }

  void read_concept(const Section& s) {
    check_keys(s, {"kind", "wrap", "handle_arm", "arm_a", "arm_b"});
    Concept& c = d_.concept_arms;
    c.present = true;
    const auto kind = choice(s, "kind", {"simple", "differential", "summing"});
    if (!kind) missing(s, "kind", "kind = \"simple\", \"differential\" or \"summing\"");
    c.kind = *kind == 0 ? BrakeKind::simple
                        : (*kind == 1 ? BrakeKind::differential : BrakeKind::summing);
    c.wrap = positive(s, "wrap", Quantity::angle, "the wrap angle");
    if (c.wrap >= 2.0 * std::numbers::pi) {
      bad_value(s, "wrap", "the wrap angle must be less than 360°, e.g. \"270°\"");
    }
    c.handle_arm = positive(s, "handle_arm", Quantity::length,
                            "the perpendicular arm of the operator's force about the pivot");
    c.arm_b = positive(s, "arm_b", Quantity::length,
                       "the perpendicular arm of end B about the pivot");
    if (c.kind == BrakeKind::simple) {
      if (auto a = quantity(s, "arm_a", Quantity::length); a && *a != 0.0) {
        bad_value(s, "arm_a",
                  "in a simple brake end A is anchored at the pivot: arm_a must be \"0 mm\" or left "
                  "out (use kind = \"differential\" or \"summing\" for two arms)");
      }
      c.arm_a = 0.0;
      d_.band.end_a.mount = Mount::frame;
      d_.band.end_b.mount = Mount::lever;
    } else {
      c.arm_a = positive(s, "arm_a", Quantity::length,
                         "the perpendicular arm of end A about the pivot");
      d_.band.end_a.mount = Mount::lever;
      d_.band.end_b.mount = Mount::lever;
    }
  }

  void read_drawing(const Section& s) {
    check_keys(s, {"sheet", "scale"});
    DrawingOptions& dw = d_.drawing;
    if (auto sheet = choice(s, "sheet", {"A2", "A3", "A4"})) {
      dw.sheet = std::array<const char*, 3>{"A2", "A3", "A4"}[*sheet];
    }
    if (const toml::node* n = node(s, "scale")) {
      // ISO 5455 (REFERENCE.md §5.4).
      static constexpr std::array<std::pair<int, int>, 18> kIso5455{{
          {50, 1}, {20, 1}, {10, 1}, {5, 1}, {2, 1}, {1, 1}, {1, 2}, {1, 5}, {1, 10}, {1, 20},
          {1, 50}, {1, 100}, {1, 200}, {1, 500}, {1, 1000}, {1, 2000}, {1, 5000}, {1, 10000}}};
      const auto* str = n->as_string();
      int num = 0, den = 0;
      bool ok = false;
      if (str != nullptr) {
        const std::string& t = str->get();
        const std::size_t colon = t.find(':');
        if (colon != std::string::npos && colon > 0 && colon + 1 < t.size() && t.size() < 16) {
          const auto digits = [](std::string_view v) {
            return std::all_of(v.begin(), v.end(), [](char c) { return c >= '0' && c <= '9'; });
          };
          const std::string_view a(t.data(), colon), b(t.data() + colon + 1, t.size() - colon - 1);
          if (digits(a) && digits(b)) {
            num = std::stoi(std::string(a));
            den = std::stoi(std::string(b));
            ok = std::find(kIso5455.begin(), kIso5455.end(), std::pair{num, den}) !=
                 kIso5455.end();
          }
        }
      }
      if (!ok) {
        fail(pos(*n), "drawing.scale", written(*n),
             "expected an ISO 5455 scale: \"1:1\", \"1:2\", \"1:5\", \"1:10\", \"1:20\", "
             "\"1:50\", \"1:100\" ... \"1:10000\" or \"2:1\", \"5:1\", \"10:1\", \"20:1\", "
             "\"50:1\"; leave scale out to choose it automatically");
      }
      dw.scale_num = num;
      dw.scale_den = den;
    }
  }
};

}  // namespace

Design read_design_text(std::string_view text, const std::string& name) {
  if (text.size() > kMaxFileBytes) {
    throw DesignError(name, 0, 0, "", "",
                      "not a bandforge design file: larger than " +
                          std::to_string(kMaxFileBytes / 1024) + " KiB");
  }
  return Reader(text, name).read();
}

namespace {

// The whole of standard input, up to one byte past the size limit (read_design_text reports it).
std::string read_all(std::istream& in, const std::string& name) {
  std::string text;
  std::array<char, 65536> buf;
  while (in.read(buf.data(), buf.size()) || in.gcount() > 0) {
    text.append(buf.data(), static_cast<std::size_t>(in.gcount()));
    if (text.size() > kMaxFileBytes) break;
  }
  if (in.bad()) throw IoError("cannot read design file " + name + ": read error");
  return text;
}

}  // namespace

Design read_design_file(const std::string& path) {
  namespace fs = std::filesystem;
  if (path == kStdinPath) return read_design_text(read_all(std::cin, kStdinName), kStdinName);
  std::error_code ec;
  const fs::file_status st = fs::status(path, ec);
  if (ec || !fs::exists(st)) throw IoError("cannot read design file " + path + ": no such file");
  if (fs::is_directory(st)) {
    throw IoError("cannot read design file " + path + ": it is a directory");
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError("cannot read design file " + path + ": permission denied or unreadable");
  return read_design_text(read_all(in, path), path);
}

std::string starter_design() {
  return R"(# bandforge design file: one band brake. Edit the values, then run
#   bandforge solve this-file.toml
# Every size is a string with its unit ("250 mm", "10 in", "120 N*m", "55 MPa", "270°"); only
# plain ratios (friction, service_factor, stops_per_hour) are bare numbers.
# Front view: x right, y up, drum centre at the origin, drum axis toward the viewer.
# This starter describes an invented example: the holding brake of a conveyor take-up drum.

[project]                      # title-block data (ISO 7200); only title is required
title = "Conveyor take-up drum brake"  # drawing title
number = "NEW-BRAKE-1"         # identification number, also the output file name (letters, digits, - _ .)
revision = "0"                 # revision index
owner = "Your company"         # legal owner of the drawing
creator = "Your name"          # who drew it
approver = ""                  # who approved it
date = "2026-01-15"            # YYYY-MM-DD

[drum]
diameter = "250 mm"            # friction-surface diameter (a length: mm, cm, m, in, ft)
width = "60 mm"                # face width of the rim
bore = "35 mm"                 # shaft bore, less than half the diameter
rotation = "ccw"               # the load's rotation to be braked, seen from the front: "cw" or "ccw"
material = "steel"             # "cast-iron" or "steel" (density and specific heat; `bandforge materials`)

[lining]
material = "molded"            # "woven", "molded", "sintered", "cork", "wood" or "iron" (published table)
# friction = 0.3               # optional: nominal friction, a bare number between 0 and 1
# friction_range = [0.25, 0.4] # optional: lowest and highest credible friction, bare numbers
# pressure_limit = "0.7 MPa"   # optional: allowable lining pressure (Pa, kPa, MPa, psi)
# temperature_limit = "200 °C" # optional: maximum bulk temperature (°C, K, °F)
# power_limit = "0.5 W/mm^2"   # optional: power per lining area (W/mm^2, W/in^2)
thickness = "4 mm"             # radial lining thickness; "0 mm" for a bare steel band

[band]
width = "50 mm"                # steel band width (the lining has the same width), at most the drum width
thickness = "2 mm"             # steel band thickness
allowable_stress = "55 MPa"    # allowable tensile stress, gross section (Pa, kPa, MPa, psi)
sense = "ccw"                  # the way the band runs from end A round the drum to end B: "cw" or "ccw"
end_a = { mount = "frame", at = ["45 mm", "-190 mm"] }   # mount "lever" or "frame"; at = pin centre [x, y]
end_b = { mount = "lever", at = ["-45 mm", "-190 mm"] }  # at least one end must be on the lever
pin_diameter = "12 mm"         # band-end and pivot pin diameter
clearance = "1.5 mm"           # radial clearance when released (default 1.5 mm)
# pin_allowable_shear = "30 MPa"  # optional; default allowable_stress/√3
# model = "thick"              # optional: "thin" (default) or "thick" band tension model
# end_joint = "auto"           # optional: "auto" (default: the first that fits the run),
#                              # "riveted-lap", "riveted-compact" or "welded-block"

[lever]
pivot = ["110 mm", "-190 mm"]  # pivot centre [x, y]
handle = ["-450 mm", "-190 mm"] # where the operator's force acts, perpendicular to pivot→handle
width = "45 mm"                # plate width in the view plane
thickness = "12 mm"            # plate thickness along the drum axis
allowable_stress = "100 MPa"   # allowable bending stress

[load]                         # give exactly one of torque / lever_force
torque = "120 N*m"             # braking torque needed (N*m, kN*m, lbf*ft, lbf*in): solves the lever force
# lever_force = "200 N"        # or: the force available at the handle (N, kN, lbf): solves the torque
service_factor = 1.5           # bare number > 0, multiplies the torque (default 1)

[duty]                         # optional: thermal checks
speed = "120 rpm"              # drum speed at the start of a stop (rpm, rad/s); a hoist gives the
                               # load's linear speed instead ("0.5 m/s") with mass, stop_distance
                               # and rope_radius
inertia = "4 kg*m^2"           # rotating inertia reflected to the drum shaft (kg*m^2, lb*ft^2)
stops_per_hour = 30            # bare number, stops per hour
ambient = "30 °C"              # ambient temperature (°C, K, °F; default 40 °C)

# [concept]                    # instead of end_a/end_b and pivot/handle: textbook arms, no geometry
# kind = "simple"              # "simple", "differential" or "summing"
# wrap = "250°"                # wrap angle (°, deg, rad), less than 360°
# handle_arm = "540 mm"        # perpendicular arm of the operator's force about the pivot
# arm_b = "110 mm"             # perpendicular arm of end B about the pivot
# arm_a = "0 mm"               # end A's arm; 0 or left out for a simple brake

[drawing]
sheet = "A3"                   # "A2", "A3" or "A4"
# scale = "1:5"                # ISO 5455 scale; left out = chosen automatically
)";
}

}  // namespace bandforge
