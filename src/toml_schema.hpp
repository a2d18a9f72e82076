// The machinery every bandforge TOML schema shares (the design file, src/design_reader.cpp; the
// brief, src/brief_reader.cpp): source positions, sections and keys, typed values with units,
// messages that name file, line, column, key and the value as written, did-you-mean. It also
// reads the sections both schemas have in common ([project], [lining], [duty]), so that they
// mean the same in both. Internal to src/: nothing outside the readers includes this header.
#pragma once

#include <toml++/toml.h>

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "src/design.hpp"
#include "src/errors.hpp"
#include "src/units.hpp"

namespace bandforge::schema {

/// "text" with double quotes, for messages.
std::string in_quotes(std::string_view s);
/// "a, b or c".
std::string join(const std::vector<std::string>& items);
/// "\"a\", \"b\" or \"c\"".
std::string join_quoted(std::initializer_list<std::string_view> items);
/// The known name closest to `given`, or "" when none is plausibly meant.
std::string nearest(std::string_view given, const std::vector<std::string>& known);
/// Dots outside strings and comments (toml++ recurses once per dotted-key segment).
std::size_t count_bare_dots(std::string_view text);
/// Letters, digits, '-', '_', '.', starting with a letter or digit: safe as a file stem.
bool is_safe_stem(std::string_view s);
bool is_iso_date(std::string_view s);
bool has_control_chars(std::string_view s);

/// The text of `path` ("-": standard input), read to at most one byte past `max_bytes` (the
/// caller reports the size). `what` names the file in messages ("design file", "brief").
/// Throws IoError (exit 4): no such file, a directory, unreadable.
std::string read_source(const std::string& path, const std::string& what, std::size_t max_bytes);

/// One table of the file ([band], or band.end_a) and the dotted path used for its keys.
struct Section {
  const toml::table* table = nullptr;  // nullptr: the section is absent
  std::string path;                    // "band", "band.end_a"
  SourcePos pos;                       // where the section starts
  std::string title;                   // "[band]", or "band.end_a" for an inline table
  explicit operator bool() const { return table != nullptr; }
};

/// Reads one TOML text of a bandforge schema. A schema's reader derives from it and adds its
/// sections; `where_` collects the position of every key read ("band.end_a.at" → 27:9).
class Reader {
 public:
  Reader(std::string_view text, std::string name) : text_(text), name_(std::move(name)) {
    line_starts_.push_back(0);
    for (std::size_t i = 0; i < text_.size(); ++i) {
      if (text_[i] == '\n') line_starts_.push_back(i + 1);
    }
  }

  /// Parses the text; `what` names the kind of file in messages ("bandforge design file").
  toml::table parse_root(const std::string& what) const;

  /// Every top-level key must be one of `sections` (a table); anything else is an error with a
  /// did-you-mean. `example` names two sections for the message about stray keys.
  void check_sections(const toml::table& root, const std::vector<std::string>& sections,
                      const std::string& example) const;

  // Sections both schemas share, with the same keys and meaning.
  void read_project(const Section& s, Project& p);
  void read_lining(const Section& s, Lining& li);
  void read_duty(const Section& s, Duty& du);
  /// [drum] material (default "cast-iron"): the key, density, specific heat and their sources.
  void read_drum_material(const Section& s, Drum& dr);

 protected:
  std::string_view text_;
  std::vector<std::size_t> line_starts_;
  std::string name_;
  std::map<std::string, SourcePos> where_;


  // ---- positions and messages ----------------------------------------------------------

  static SourcePos pos_of(const toml::source_position& p) {
    return SourcePos{static_cast<int>(std::min<toml::source_index>(p.line, 1u << 30)),
                     static_cast<int>(std::min<toml::source_index>(p.column, 1u << 30))};
  }

  [[noreturn]] void fail(SourcePos pos, const std::string& key, const std::string& value,
                         const std::string& problem) const {
    throw DesignError(name_, pos.line, pos.column, key, value, problem);
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
    where_[name] = s.pos;
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
    if (n != nullptr) where_[s.path + "." + std::string(key)] = pos_of(n->source().begin);
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

  static std::string range_text(double lo, double hi);
  static std::string lining_keys();
};

}  // namespace bandforge::schema
