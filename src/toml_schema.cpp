#include "src/toml_schema.hpp"

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <numbers>

#include "src/materials.hpp"

namespace bandforge::schema {


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


std::string read_source(const std::string& path, const std::string& what, std::size_t max_bytes) {
  namespace fs = std::filesystem;
  const bool stdin_path = path == "-";
  const std::string name = stdin_path ? "<stdin>" : path;
  const auto read_all = [&](std::istream& in) {
    std::string text;
    std::array<char, 65536> buf;
    while (in.read(buf.data(), buf.size()) || in.gcount() > 0) {
      text.append(buf.data(), static_cast<std::size_t>(in.gcount()));
      if (text.size() > max_bytes) break;
    }
    if (in.bad()) throw IoError("cannot read " + what + " " + name + ": read error");
    return text;
  };
  if (stdin_path) return read_all(std::cin);
  std::error_code ec;
  const fs::file_status st = fs::status(path, ec);
  if (ec || !fs::exists(st)) throw IoError("cannot read " + what + " " + path + ": no such file");
  if (fs::is_directory(st)) throw IoError("cannot read " + what + " " + path + ": it is a directory");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError("cannot read " + what + " " + path + ": permission denied or unreadable");
  return read_all(in);
}

toml::table Reader::parse_root(const std::string& what) const {
  // toml++ 3.3 recurses once per dotted-key segment and overflows the stack at ~40 000 segments
  // ("[a.a.a...]"). Our files nest three deep; a file with this many dots outside strings is not one.
  constexpr std::size_t kMaxBareDots = 1000;
  if (count_bare_dots(text_) > kMaxBareDots) {
    fail({}, "", "", "not a " + what + ": more than " + std::to_string(kMaxBareDots) +
                         " '.' outside strings and comments");
  }
  try {
    return toml::parse(text_, std::string_view(name_));
  } catch (const toml::parse_error& e) {
    fail(pos_of(e.source().begin), "", "", "TOML syntax error: " + std::string(e.description()));
  }
}

void Reader::check_sections(const toml::table& root, const std::vector<std::string>& sections,
                            const std::string& example) const {
  for (auto&& [k, v] : root) {
    const std::string_view key = k.str();
    if (std::find(sections.begin(), sections.end(), key) != sections.end()) continue;
    const std::string suggestion = nearest(key, sections);
    std::string problem;
    const bool is_section = v.is_table() || v.is_array_of_tables();
    if (is_section) {
      problem = "unknown section [" + std::string(key) + "]";
      problem += suggestion.empty() ? "; valid sections: [" + join(sections) + "]"
                                    : "; did you mean [" + suggestion + "]?";
    } else {
      problem = "key '" + std::string(key) + "' is outside any section; keys belong in a "
                "section such as " + example;
    }
    // A section's "value" is its whole body: quote nothing.
    fail(pos_of(k.source().begin), std::string(key), is_section ? "" : written(v), problem);
  }
}

void Reader::read_project(const Section& s, Project& p) {
  check_keys(s, {"title", "number", "revision", "owner", "creator", "approver", "date"});
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

void Reader::read_lining(const Section& s, Lining& li) {
  check_keys(s, {"material", "friction", "friction_range", "pressure_limit",
                 "temperature_limit", "power_limit", "thickness"});
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

std::string Reader::range_text(double lo, double hi) {
  return format_quantity(lo, Quantity::dimensionless, UnitSystem::si, 3) + "–" +
         format_quantity(hi, Quantity::dimensionless, UnitSystem::si, 3);
}

std::string Reader::lining_keys() {
  std::vector<std::string> keys;
  for (const auto& lm : lining_materials()) keys.push_back(in_quotes(lm.key));
  return join(keys);
}

void Reader::read_duty(const Section& s, Duty& du) {
  check_keys(s, {"speed", "inertia", "mass", "stop_distance", "rope_radius", "stops_per_hour",
                 "ambient", "drive"});
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
  // What drives a hoist: the hoist rules (REFERENCE §7) are for powered hoists.
  if (auto drive = choice(s, "drive", {"powered", "manual"})) {
    if (!hoist) {
      bad_value(s, "drive",
                "drive belongs to a hoist duty (speed a linear speed such as \"0.5 m/s\"): it says "
                "whether a motor (\"powered\") or a hand (\"manual\") drives the hoist; remove it "
                "from a rotating duty");
    }
    du.drive = *drive == 0 ? HoistDrive::powered : HoistDrive::manual;
  }
}

void Reader::read_drum_material(const Section& s, Drum& dr) {
  dr.material = string(s, "material").value_or("cast-iron");
  const DrumMaterial* m = find_drum_material(dr.material);
  if (m == nullptr) {
    std::vector<std::string> keys;
    for (const auto& dm : drum_materials()) keys.push_back(in_quotes(dm.key));
    bad_value(s, "material", "unknown drum material; valid: " + join(keys));
  }
  dr.density = m->density;
  dr.specific_heat = m->specific_heat;
  dr.material_source = "density: " + m->density_source + "; specific heat: " + m->specific_heat_source;
}

}  // namespace bandforge::schema
