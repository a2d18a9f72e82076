// The design-file reader: examples convert to the right SI values, the starter design reads back,
// every reader-side mistake of issue 2 §5 gives a DesignError naming the key, the line, the value
// as written and what is valid, and no input crashes it.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <random>
#include <regex>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include "src/design_reader.hpp"
#include "src/errors.hpp"
#include "src/materials.hpp"

namespace bandforge {
namespace {

namespace fs = std::filesystem;

// A valid design of our own (not the bundled example): small simple brake, tight end on the frame.
const std::string kBase = R"([project]
title = "Test brake"
number = "T-1"

[drum]
diameter = "300 mm"
width = "70 mm"
bore = "40 mm"
rotation = "ccw"

[lining]
material = "woven"
thickness = "4 mm"

[band]
width = "60 mm"
thickness = "2 mm"
allowable_stress = "50 MPa"
sense = "ccw"
end_a = { mount = "frame", at = ["50 mm", "-230 mm"] }
end_b = { mount = "lever", at = ["-50 mm", "-230 mm"] }
pin_diameter = "12 mm"

[lever]
pivot = ["100 mm", "-230 mm"]
handle = ["-500 mm", "-230 mm"]
width = "35 mm"
thickness = "10 mm"
allowable_stress = "110 MPa"

[load]
torque = "150 N*m"
)";

/// kBase with the line `old_line` replaced by `new_line` ("" deletes it).
std::string with(const std::string& text, const std::string& old_line, const std::string& new_line) {
  const std::size_t at = text.find(old_line + "\n");
  EXPECT_NE(at, std::string::npos) << "test bug: no line " << old_line;
  if (at == std::string::npos) return text;
  std::string out = text;
  out.replace(at, old_line.size() + 1, new_line.empty() ? "" : new_line + "\n");
  return out;
}

/// 1-based number of the first line that contains `needle`.
int line_of(const std::string& text, const std::string& needle) {
  const std::size_t at = text.find(needle);
  EXPECT_NE(at, std::string::npos) << "test bug: no " << needle;
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
}

struct Caught {
  bool thrown = false;
  std::string key;
  int line = -1;
  std::string what;
};

Caught read_error(const std::string& text) {
  Caught c;
  try {
    read_design_text(text, "t.toml");
  } catch (const DesignError& e) {
    c.thrown = true;
    c.key = e.key();
    c.line = e.line();
    c.what = e.what();
    EXPECT_EQ(e.code(), Exit::bad_design);
  }
  return c;
}

// One mistake: the reader must name `key` at `line`, quote the value as written, and say what
// is valid.
void expect_mistake(const std::string& text, const std::string& key, int line,
                    const std::vector<std::string>& message_parts) {
  const Caught c = read_error(text);
  ASSERT_TRUE(c.thrown) << "accepted:\n" << text;
  EXPECT_EQ(c.key, key) << c.what;
  EXPECT_EQ(c.line, line) << c.what;
  EXPECT_EQ(c.what.rfind("t.toml:", 0), 0u) << c.what;  // the message starts with the file name
  for (const std::string& part : message_parts) {
    EXPECT_NE(c.what.find(part), std::string::npos) << "message: " << c.what << "\nmissing: " << part;
  }
}

// ---------------------------------------------------------------------------------------------
// Valid input

TEST(DesignReader, BaseDesignReads) {
  const Design d = read_design_text(kBase, "t.toml");
  EXPECT_EQ(d.file, "t.toml");
  EXPECT_DOUBLE_EQ(d.drum.diameter, 0.300);
  EXPECT_EQ(d.band.end_b.mount, Mount::lever);
  EXPECT_DOUBLE_EQ(d.lever.handle.x, -0.500);
  // Defaults: drum material cast-iron, clearance 1.5 mm (common practice, no source),
  // pin shear σ/√3 (distortion-energy relation), thin model, service factor 1, no duty.
  EXPECT_EQ(d.drum.material, "cast-iron");
  EXPECT_DOUBLE_EQ(d.band.clearance, 0.0015);
  EXPECT_NEAR(d.band.pin_allowable_shear, 50e6 / std::sqrt(3.0), 1e-6);
  EXPECT_EQ(d.band.model, TensionModel::thin);
  EXPECT_DOUBLE_EQ(d.load.service_factor, 1.0);
  EXPECT_EQ(d.load.given, Load::Given::torque);
  EXPECT_FALSE(d.duty.present);
  EXPECT_FALSE(d.concept_arms.present);
  EXPECT_EQ(d.project.number, "T-1");
}

// Hand conversions of examples/bin-hoist.toml, written out here independently of units.cpp.
TEST(DesignReader, BinHoistExampleConvertsToSi) {
  const fs::path path = fs::path(BANDFORGE_SOURCE_DIR) / "examples" / "bin-hoist.toml";
  if (!fs::exists(path)) GTEST_SKIP() << "examples/bin-hoist.toml is not in this tree";
  const Design d = read_design_file(path.string());
  constexpr double in3 = 0.0254 * 0.0254 * 0.0254;

  EXPECT_EQ(d.project.title, "Bin hoist holding brake");
  EXPECT_EQ(d.project.number, "KFW-2207-BR");
  EXPECT_EQ(d.project.date, "2026-11-30");
  EXPECT_DOUBLE_EQ(d.drum.diameter, 0.400);  // 400 mm
  EXPECT_DOUBLE_EQ(d.drum.width, 0.100);
  EXPECT_DOUBLE_EQ(d.drum.bore, 0.060);
  EXPECT_EQ(d.drum.rotation, Turn::cw);
  // Cast iron, REFERENCE §2.2 (Faires 881): 0.253 lb/in³ = 0.253 × 0.45359237 / 0.0254³
  // = 7003.02 kg/m³; c = 101 ft·lbf/(lbm·°F) = 101 × 1.35582 J / (0.453592 kg × 5/9 K)
  // = 543.41 J/(kg·K) (REFERENCE: "about 544").
  EXPECT_NEAR(d.drum.density, 0.253 * 0.45359237 / in3, 1e-9);
  EXPECT_NEAR(d.drum.density, 7003.02, 0.01);
  EXPECT_NEAR(d.drum.specific_heat, 543.41, 0.01);
  EXPECT_NE(d.drum.material_source.find("Faires"), std::string::npos);

  // Molded, Juvinall & Marshek 5th ed. Table 18.1 (REFERENCE §2.4 Table A): f 0.25–0.45, nominal
  // the middle 0.35; pressure lower end 150 psi = 150 × 6894.757 Pa = 1 034 214 Pa; temperature
  // lower end 400 °F = (400 − 32)/1.8 = 204.44 °C; Neale Table 7.4 moulded 0.6 W/mm² = 6e5 W/m².
  EXPECT_EQ(d.lining.material, "molded");
  EXPECT_DOUBLE_EQ(d.lining.friction_min, 0.25);
  EXPECT_DOUBLE_EQ(d.lining.friction_max, 0.45);
  EXPECT_NEAR(d.lining.friction, 0.35, 1e-12);
  EXPECT_NEAR(d.lining.pressure_limit, 1034214.0, 1.0);
  EXPECT_NEAR(d.lining.temperature_limit, 204.444, 1e-3);
  EXPECT_NEAR(d.lining.power_limit, 6e5, 1e-6);
  EXPECT_DOUBLE_EQ(d.lining.thickness, 0.005);
  EXPECT_NE(d.lining.friction_source.find("Table 18.1"), std::string::npos);
  EXPECT_NE(d.lining.power_source.find("Table 7.4"), std::string::npos);

  EXPECT_DOUBLE_EQ(d.band.width, 0.080);
  EXPECT_DOUBLE_EQ(d.band.thickness, 0.003);
  EXPECT_DOUBLE_EQ(d.band.allowable_stress, 60e6);  // 60 MPa
  EXPECT_EQ(d.band.sense, Turn::cw);
  EXPECT_EQ(d.band.end_a.mount, Mount::frame);
  EXPECT_DOUBLE_EQ(d.band.end_a.at.x, -0.060);
  EXPECT_DOUBLE_EQ(d.band.end_a.at.y, -0.300);
  EXPECT_EQ(d.band.end_b.mount, Mount::lever);
  EXPECT_DOUBLE_EQ(d.band.end_b.at.x, 0.060);
  EXPECT_DOUBLE_EQ(d.band.pin_diameter, 0.016);
  EXPECT_DOUBLE_EQ(d.band.clearance, 0.0015);
  EXPECT_NEAR(d.band.pin_allowable_shear, 34.641e6, 1e3);  // 60 MPa/√3 = 34.641 MPa

  EXPECT_DOUBLE_EQ(d.lever.pivot.x, -0.110);
  EXPECT_DOUBLE_EQ(d.lever.handle.x, 0.700);
  EXPECT_DOUBLE_EQ(d.lever.handle.y, -0.300);
  EXPECT_DOUBLE_EQ(d.lever.width, 0.040);
  EXPECT_DOUBLE_EQ(d.lever.thickness, 0.012);
  EXPECT_DOUBLE_EQ(d.lever.allowable_stress, 120e6);

  EXPECT_EQ(d.load.given, Load::Given::torque);
  EXPECT_DOUBLE_EQ(d.load.torque, 400.0);  // 400 N·m
  EXPECT_DOUBLE_EQ(d.load.service_factor, 1.25);

  // Hoist duty: 0.5 m/s on a 150 mm rope radius is 0.5/0.15 = 3.333 rad/s at the drum.
  EXPECT_TRUE(d.duty.present);
  EXPECT_DOUBLE_EQ(d.duty.hoist_mass, 250.0);
  EXPECT_DOUBLE_EQ(d.duty.hoist_speed, 0.5);
  EXPECT_DOUBLE_EQ(d.duty.stop_distance, 0.15);
  EXPECT_DOUBLE_EQ(d.duty.rope_radius, 0.150);
  EXPECT_NEAR(d.duty.speed, 3.33333, 1e-5);
  EXPECT_DOUBLE_EQ(d.duty.stops_per_hour, 20.0);
  EXPECT_DOUBLE_EQ(d.duty.ambient, 40.0);  // default
}

TEST(DesignReader, EveryExampleReads) {
  const fs::path dir = fs::path(BANDFORGE_SOURCE_DIR) / "examples";
  int count = 0;
  for (const auto& entry : fs::directory_iterator(dir)) {
    if (entry.path().extension() != ".toml") continue;
    SCOPED_TRACE(entry.path().string());
    Design d;
    ASSERT_NO_THROW(d = read_design_file(entry.path().string()));
    EXPECT_GT(d.drum.diameter, 0.0);
    EXPECT_GT(d.band.thickness, 0.0);
    EXPECT_GT(d.lining.friction, 0.0);
    ++count;
  }
  EXPECT_GT(count, 0);
}

// The positions recorded for later checks (layout errors point back into the file).
TEST(DesignReader, RecordsWhereEachKeyWasWritten) {
  const Design d = read_design_text(kBase, "t.toml");
  // end_a's `at` array: find it by hand in the text.
  const int line = line_of(kBase, "end_a = {");
  const std::string text_line = "end_a = { mount = \"frame\", at = [\"50 mm\", \"-230 mm\"] }";
  ASSERT_EQ(d.where.count("band.end_a.at"), 1u);
  EXPECT_EQ(d.where.at("band.end_a.at").line, line);
  EXPECT_EQ(d.where.at("band.end_a.at").column, static_cast<int>(text_line.find('[')) + 1);
  EXPECT_EQ(d.where.at("band.end_a").column, static_cast<int>(text_line.find('{')) + 1);
  EXPECT_EQ(d.where.at("band").line, line_of(kBase, "[band]"));
  EXPECT_EQ(d.where.at("drum.diameter").line, line_of(kBase, "diameter = "));
  EXPECT_EQ(d.where.at("drum.diameter").column, 12);  // `diameter = "` — the value's quote

  const std::set<std::string> expected = {
      "project", "project.title", "project.number",
      "drum", "drum.diameter", "drum.width", "drum.bore", "drum.rotation",
      "lining", "lining.material", "lining.thickness",
      "band", "band.width", "band.thickness", "band.allowable_stress", "band.sense",
      "band.end_a", "band.end_a.mount", "band.end_a.at",
      "band.end_b", "band.end_b.mount", "band.end_b.at", "band.pin_diameter",
      "lever", "lever.pivot", "lever.handle", "lever.width", "lever.thickness",
      "lever.allowable_stress",
      "load", "load.torque"};
  std::set<std::string> got;
  for (const auto& [k, pos] : d.where) got.insert(k);
  EXPECT_EQ(got, expected);

  // design_fail (design.cpp) uses these positions for checks made after reading.
  try {
    design_fail(d, "band.end_a.at", "[\"50 mm\", \"-230 mm\"]", "pin inside the band circle");
    ADD_FAILURE();
  } catch (const DesignError& e) {
    EXPECT_EQ(e.line(), line);
    EXPECT_NE(std::string(e.what()).find("t.toml:" + std::to_string(line) + ":"), std::string::npos);
  }
}

TEST(DesignReader, ExplicitLiningValuesOverrideTheTable) {
  std::string t = with(kBase, "material = \"woven\"",
                       "material = \"woven\"\nfriction = 0.3\nfriction_range = [0.2, 0.4]\n"
                       "pressure_limit = \"100 psi\"\ntemperature_limit = \"200 °C\"\n"
                       "power_limit = \"0.5 W/mm^2\"");
  const Design d = read_design_text(t, "t.toml");
  EXPECT_DOUBLE_EQ(d.lining.friction, 0.3);
  EXPECT_DOUBLE_EQ(d.lining.friction_min, 0.2);
  EXPECT_DOUBLE_EQ(d.lining.friction_max, 0.4);
  EXPECT_NEAR(d.lining.pressure_limit, 689475.7, 0.1);  // 100 psi, NIST SP 811
  EXPECT_DOUBLE_EQ(d.lining.temperature_limit, 200.0);
  EXPECT_DOUBLE_EQ(d.lining.power_limit, 0.5e6);
  EXPECT_EQ(d.lining.friction_source, "design file");
  EXPECT_EQ(d.lining.pressure_source, "design file");
  EXPECT_EQ(d.lining.temperature_source, "design file");
  EXPECT_EQ(d.lining.power_source, "design file");
}

TEST(DesignReader, LiningWithoutMaterialNeedsFrictionAndPressure) {
  std::string t = with(kBase, "material = \"woven\"", "friction = 0.32\npressure_limit = \"0.6 MPa\"");
  const Design d = read_design_text(t, "t.toml");
  EXPECT_EQ(d.lining.material, "");
  EXPECT_DOUBLE_EQ(d.lining.friction, 0.32);
  EXPECT_DOUBLE_EQ(d.lining.friction_min, 0.32);  // range defaults to [f, f]
  EXPECT_DOUBLE_EQ(d.lining.friction_max, 0.32);
  EXPECT_DOUBLE_EQ(d.lining.pressure_limit, 0.6e6);
  EXPECT_DOUBLE_EQ(d.lining.temperature_limit, 0.0);  // not given
}

TEST(DesignReader, RotatingDutyAndOptionalKeys) {
  std::string t = kBase +
                  "service_factor = 1.5\n\n[duty]\nspeed = \"300 rpm\"\ninertia = \"2 kg*m^2\"\n"
                  "stops_per_hour = \"12 /h\"\nambient = \"86 °F\"\n\n[drawing]\nsheet = \"A2\"\n"
                  "scale = \"1:5\"\n";
  t = with(t, "pin_diameter = \"12 mm\"",
           "pin_diameter = \"12 mm\"\nclearance = \"2 mm\"\npin_allowable_shear = \"40 MPa\"\n"
           "model = \"thick\"");
  const Design d = read_design_text(t, "t.toml");
  EXPECT_NEAR(d.duty.speed, 300 * 2 * std::numbers::pi / 60, 1e-12);  // 1 rpm = 2π/60 rad/s
  EXPECT_DOUBLE_EQ(d.duty.inertia, 2.0);
  EXPECT_DOUBLE_EQ(d.duty.hoist_mass, 0.0);
  EXPECT_NEAR(d.duty.stops_per_hour, 12.0, 1e-12);
  EXPECT_NEAR(d.duty.ambient, 30.0, 1e-12);  // (86 − 32)/1.8
  EXPECT_DOUBLE_EQ(d.load.service_factor, 1.5);
  EXPECT_EQ(d.drawing.sheet, "A2");
  EXPECT_EQ(d.drawing.scale_num, 1);
  EXPECT_EQ(d.drawing.scale_den, 5);
  EXPECT_DOUBLE_EQ(d.band.clearance, 0.002);
  EXPECT_DOUBLE_EQ(d.band.pin_allowable_shear, 40e6);
  EXPECT_EQ(d.band.model, TensionModel::thick);
}

TEST(DesignReader, LeverForceInsteadOfTorque) {
  const Design d = read_design_text(with(kBase, "torque = \"150 N*m\"", "lever_force = \"45 lbf\""),
                                    "t.toml");
  EXPECT_EQ(d.load.given, Load::Given::lever_force);
  EXPECT_NEAR(d.load.lever_force, 45 * 4.4482216152605, 1e-9);  // NIST SP 811
}

// A concept design: arms instead of pins; the lever section may be left out.
const std::string kConcept = R"([project]
title = "Concept"

[drum]
diameter = "16 in"
width = "4 in"
bore = "2 in"
rotation = "cw"

[lining]
material = "molded"
thickness = "0.25 in"

[band]
width = "3 in"
thickness = "0.125 in"
allowable_stress = "8000 psi"
sense = "cw"

[load]
lever_force = "50 lbf"

[concept]
kind = "differential"
wrap = "270°"
handle_arm = "30 in"
arm_a = "1 in"
arm_b = "5 in"
)";

TEST(DesignReader, ConceptDesignReads) {
  const Design d = read_design_text(kConcept, "c.toml");
  EXPECT_TRUE(d.concept_arms.present);
  EXPECT_EQ(d.concept_arms.kind, BrakeKind::differential);
  EXPECT_NEAR(d.concept_arms.wrap, 1.5 * std::numbers::pi, 1e-12);
  EXPECT_NEAR(d.concept_arms.handle_arm, 0.762, 1e-12);  // 30 × 0.0254 m
  EXPECT_NEAR(d.concept_arms.arm_a, 0.0254, 1e-12);
  EXPECT_NEAR(d.concept_arms.arm_b, 0.127, 1e-12);
  EXPECT_EQ(d.band.end_a.mount, Mount::lever);
  EXPECT_EQ(d.band.end_b.mount, Mount::lever);
  EXPECT_NEAR(d.band.allowable_stress, 8000 * 6894.757293168, 1e-3);  // psi, NIST SP 811

  const Design s = read_design_text(
      with(with(kConcept, "kind = \"differential\"", "kind = \"simple\""), "arm_a = \"1 in\"", ""),
      "c.toml");
  EXPECT_EQ(s.concept_arms.kind, BrakeKind::simple);
  EXPECT_DOUBLE_EQ(s.concept_arms.arm_a, 0.0);
  EXPECT_EQ(s.band.end_a.mount, Mount::frame);  // simple: end A anchored at the pivot
  EXPECT_EQ(s.band.end_b.mount, Mount::lever);
}

TEST(DesignReader, TomlDateIsAccepted) {
  const Design d = read_design_text(with(kBase, "number = \"T-1\"", "date = 2027-02-28"), "t.toml");
  EXPECT_EQ(d.project.date, "2027-02-28");
}

// ---------------------------------------------------------------------------------------------
// The starter design (`bandforge new`)

TEST(StarterDesign, ReadsBackWithoutError) {
  const std::string s = starter_design();
  Design d;
  ASSERT_NO_THROW(d = read_design_text(s, "new.toml"));
  EXPECT_DOUBLE_EQ(d.drum.diameter, 0.250);
  EXPECT_EQ(d.drum.material, "steel");
  EXPECT_DOUBLE_EQ(d.drum.density, 7850.0);
  EXPECT_EQ(d.lining.material, "molded");
  EXPECT_DOUBLE_EQ(d.load.torque, 120.0);
  EXPECT_NEAR(d.duty.speed, 120 * 2 * std::numbers::pi / 60, 1e-12);
  EXPECT_DOUBLE_EQ(d.duty.ambient, 30.0);
  // Its own numbers, not a bundled example's.
  for (const auto& entry : fs::directory_iterator(fs::path(BANDFORGE_SOURCE_DIR) / "examples")) {
    if (entry.path().extension() != ".toml") continue;
    const Design e = read_design_file(entry.path().string());
    EXPECT_NE(d.drum.diameter, e.drum.diameter) << entry.path();
    EXPECT_NE(d.project.title, e.project.title) << entry.path();
    EXPECT_NE(d.project.number, e.project.number) << entry.path();
  }
}

TEST(StarterDesign, EveryKeyIsDocumented) {
  const std::string s = starter_design();
  std::istringstream in(s);
  std::string line;
  const std::regex key_line(R"(^#?\s*([a-z_]+)\s*=)");
  std::set<std::string> keys;
  while (std::getline(in, line)) {
    std::smatch m;
    if (!std::regex_search(line, m, key_line)) continue;
    keys.insert(m[1]);
    if (line[0] != '#') {
      EXPECT_NE(line.find(" # "), std::string::npos) << "key without a comment: " << line;
    }
  }
  // Every key the reader knows appears in the starter, live or commented out.
  for (const char* k : {"title", "number", "revision", "owner", "creator", "approver", "date",
                        "diameter", "width", "bore", "rotation", "material", "friction",
                        "friction_range", "pressure_limit", "temperature_limit", "power_limit",
                        "thickness", "allowable_stress", "sense", "end_a", "end_b",
                        "pin_diameter", "clearance", "pin_allowable_shear", "model", "pivot",
                        "handle", "torque", "lever_force", "service_factor", "speed", "inertia",
                        "stops_per_hour", "ambient", "kind", "wrap", "handle_arm", "arm_a",
                        "arm_b", "sheet", "scale"}) {
    EXPECT_EQ(keys.count(k), 1u) << "starter does not mention " << k;
  }
}

TEST(StarterDesign, CommentedAlternativesAreValid) {
  std::string s = starter_design();
  // Uncomment the optional lining overrides, the pin shear and model, and the scale.
  for (const char* key : {"# friction = ", "# friction_range = ", "# pressure_limit = ",
                          "# temperature_limit = ", "# power_limit = ",
                          "# pin_allowable_shear = ", "# model = ", "# end_joint = ",
                          "# scale = "}) {
    const std::size_t at = s.find(key);
    ASSERT_NE(at, std::string::npos) << key;
    s.erase(at, 2);
  }
  Design d;
  ASSERT_NO_THROW(d = read_design_text(s, "new.toml"));
  EXPECT_EQ(d.lining.friction_source, "design file");
  EXPECT_EQ(d.band.model, TensionModel::thick);
  EXPECT_EQ(d.band.end_joint, EndJointChoice::automatic);  // the starter's "auto"
  EXPECT_EQ(d.drawing.scale_den, 5);
}

// ---------------------------------------------------------------------------------------------
// Mistakes (issue 2 §5, the reader's share). Each names key, line, value and what is valid.

TEST(DesignMistakes, UnknownEndJoint) {
  const std::string t = with(kBase, "pin_diameter = \"12 mm\"",
                             "pin_diameter = \"12 mm\"\nend_joint = \"glued\"");
  expect_mistake(t, "band.end_joint", line_of(t, "end_joint ="),
                 {"\"glued\"", "\"auto\"", "\"riveted-lap\"", "\"riveted-compact\"", "\"welded-block\""});
  const Design d = read_design_text(with(kBase, "pin_diameter = \"12 mm\"",
                                         "pin_diameter = \"12 mm\"\nend_joint = \"welded-block\""),
                                    "t.toml");
  EXPECT_EQ(d.band.end_joint, EndJointChoice::welded_block);
}

TEST(DesignMistakes, TomlSyntaxError) {
  const std::string t = with(kBase, "width = \"60 mm\"", "width = \"60 mm");
  expect_mistake(t, "", line_of(t, "width = \"60 mm\n"), {"TOML syntax error"});
}

TEST(DesignMistakes, MissingKeyPointsAtTheSection) {
  const std::string t = with(kBase, "thickness = \"2 mm\"", "");
  expect_mistake(t, "band.thickness", line_of(t, "[band]"),
                 {"missing key 'thickness' in [band]", "\"400 mm\""});
}

TEST(DesignMistakes, MissingSectionIsNamed) {
  std::string t = kBase;
  t.erase(t.find("[drum]"), t.find("[lining]") - t.find("[drum]"));
  expect_mistake(t, "drum", 0, {"missing section [drum]"});
}

TEST(DesignMistakes, MissingTitle) {
  const std::string t = with(kBase, "title = \"Test brake\"", "");
  expect_mistake(t, "project.title", 1, {"missing key 'title'"});
}

TEST(DesignMistakes, UnknownKeySuggestsTheNearest) {
  const std::string t = with(kBase, "thickness = \"2 mm\"", "thicknes = \"2 mm\"");
  expect_mistake(t, "band.thicknes", line_of(t, "thicknes ="),
                 {"unknown key 'thicknes' in [band]; did you mean 'thickness'?", "\"2 mm\""});
}

TEST(DesignMistakes, UnknownKeyListsValidKeysWhenNothingIsClose) {
  const std::string t = with(kBase, "bore = \"40 mm\"", "bore = \"40 mm\"\ncolour = \"red\"");
  expect_mistake(t, "drum.colour", line_of(t, "colour"),
                 {"unknown key 'colour' in [drum]", "diameter", "rotation"});
}

TEST(DesignMistakes, UnknownKeyByPartOfItsName) {
  const std::string t = with(kBase, "material = \"woven\"", "material = \"woven\"\npressure = \"1 MPa\"");
  expect_mistake(t, "lining.pressure", line_of(t, "pressure ="), {"did you mean 'pressure_limit'?"});
}

TEST(DesignMistakes, UnknownKeyInAnInlineTable) {
  const std::string t = with(kBase, "end_a = { mount = \"frame\", at = [\"50 mm\", \"-230 mm\"] }",
                             "end_a = { mont = \"frame\", at = [\"50 mm\", \"-230 mm\"] }");
  expect_mistake(t, "band.end_a.mont", line_of(t, "end_a ="), {"did you mean 'mount'?"});
}

TEST(DesignMistakes, UnknownSectionSuggestsTheNearest) {
  const std::string t = with(kBase, "[band]", "[bnad]");
  expect_mistake(t, "bnad", line_of(t, "[bnad]"), {"unknown section [bnad]; did you mean [band]?"});
}

TEST(DesignMistakes, KeyOutsideAnySection) {
  const std::string t = "title = \"x\"\n" + kBase;
  expect_mistake(t, "title", 1, {"outside any section"});
}

TEST(DesignMistakes, SectionWrittenAsArrayOfTables) {
  const std::string t = with(kBase, "[load]", "[[load]]");
  expect_mistake(t, "load", line_of(t, "[[load]]"), {"not as [[load]]"});
}

TEST(DesignMistakes, LengthGivenInNewtons) {
  const std::string t = with(kBase, "thickness = \"2 mm\"", "thickness = \"3 N\"");
  expect_mistake(t, "band.thickness", line_of(t, "\"3 N\""),
                 {"band.thickness = \"3 N\"", "is a force", "expected a length such as \"3 mm\""});
}

TEST(DesignMistakes, TorqueGivenAsEnergy) {
  const std::string t = with(kBase, "torque = \"150 N*m\"", "torque = \"150 J\"");
  expect_mistake(t, "load.torque", line_of(t, "150 J"), {"is an energy", "\"150 N*m\""});
}

TEST(DesignMistakes, NumberWithoutUnit) {
  const std::string t = with(kBase, "diameter = \"300 mm\"", "diameter = 300");
  expect_mistake(t, "drum.diameter", line_of(t, "diameter = 300"),
                 {"drum.diameter = 300", "give the unit, e.g. \"300 mm\""});
}

TEST(DesignMistakes, StringWithoutUnit) {
  const std::string t = with(kBase, "diameter = \"300 mm\"", "diameter = \"300\"");
  expect_mistake(t, "drum.diameter", line_of(t, "diameter ="), {"has no unit", "\"300 mm\""});
}

TEST(DesignMistakes, UnknownUnit) {
  const std::string t = with(kBase, "diameter = \"300 mm\"", "diameter = \"300 mn\"");
  expect_mistake(t, "drum.diameter", line_of(t, "diameter ="),
                 {"unknown unit \"mn\"", "mm, cm, m, in, ft"});
}

TEST(DesignMistakes, ZeroSize) {
  const std::string t = with(kBase, "width = \"60 mm\"", "width = \"0 mm\"");
  expect_mistake(t, "band.width", line_of(t, "\"0 mm\""), {"\"0 mm\"", "greater than zero"});
}

TEST(DesignMistakes, NegativeSize) {
  const std::string t = with(kBase, "diameter = \"300 mm\"", "diameter = \"-300 mm\"");
  expect_mistake(t, "drum.diameter", line_of(t, "-300 mm"), {"negative", "greater than zero"});
}

TEST(DesignMistakes, NegativeLiningThickness) {
  const std::string t = with(kBase, "thickness = \"4 mm\"", "thickness = \"-1 mm\"");
  expect_mistake(t, "lining.thickness", line_of(t, "-1 mm"), {"must not be negative", "0 mm"});
}

TEST(DesignMistakes, BareBandIsAllowed) {
  EXPECT_NO_THROW(read_design_text(with(kBase, "thickness = \"4 mm\"", "thickness = \"0 mm\""), "t"));
}

TEST(DesignMistakes, BoreTooLarge) {
  const std::string t = with(kBase, "bore = \"40 mm\"", "bore = \"150 mm\"");
  expect_mistake(t, "drum.bore", line_of(t, "bore ="), {"half the drum diameter", "150 mm"});
}

TEST(DesignMistakes, BandWiderThanDrum) {
  const std::string t = with(kBase, "width = \"60 mm\"", "width = \"80 mm\"");
  expect_mistake(t, "band.width", line_of(t, "\"80 mm\""), {"wider than the drum face", "70 mm"});
}

TEST(DesignMistakes, FrictionAboveOne) {
  const std::string t = with(kBase, "material = \"woven\"", "friction = 1.2\npressure_limit = \"1 MPa\"");
  expect_mistake(t, "lining.friction", line_of(t, "friction ="), {"= 1.2", "between 0 and 1"});
}

TEST(DesignMistakes, FrictionZero) {
  const std::string t = with(kBase, "material = \"woven\"", "friction = 0\npressure_limit = \"1 MPa\"");
  expect_mistake(t, "lining.friction", line_of(t, "friction ="), {"between 0 and 1"});
}

TEST(DesignMistakes, FrictionAsString) {
  const std::string t = with(kBase, "material = \"woven\"", "friction = \"0.3\"\npressure_limit = \"1 MPa\"");
  expect_mistake(t, "lining.friction", line_of(t, "friction ="), {"bare number without quotes"});
}

TEST(DesignMistakes, FrictionRangeReversed) {
  const std::string t = with(kBase, "material = \"woven\"", "material = \"woven\"\nfriction_range = [0.5, 0.2]");
  expect_mistake(t, "lining.friction_range", line_of(t, "friction_range"),
                 {"[0.5, 0.2]", "0 < min <= max < 1"});
}

TEST(DesignMistakes, FrictionOutsideTheTableRange) {
  const std::string t = with(kBase, "material = \"woven\"", "material = \"woven\"\nfriction = 0.6");
  expect_mistake(t, "lining.friction", line_of(t, "friction ="),
                 {"outside the published range 0.25–0.45", "friction_range"});
}

TEST(DesignMistakes, LiningWithoutMaterialOrFriction) {
  const std::string t = with(kBase, "material = \"woven\"", "");
  expect_mistake(t, "lining.friction", line_of(t, "[lining]"), {"\"woven\"", "friction = 0.35"});
}

TEST(DesignMistakes, UnknownLiningMaterial) {
  const std::string t = with(kBase, "material = \"woven\"", "material = \"wovn\"");
  expect_mistake(t, "lining.material", line_of(t, "wovn"), {"did you mean \"woven\"?", "\"sintered\""});
}

TEST(DesignMistakes, UnknownDrumMaterial) {
  const std::string t = with(kBase, "rotation = \"ccw\"", "rotation = \"ccw\"\nmaterial = \"brass\"");
  expect_mistake(t, "drum.material", line_of(t, "brass"), {"\"cast-iron\" or \"steel\""});
}

TEST(DesignMistakes, RotationNotCwOrCcw) {
  const std::string t = with(kBase, "rotation = \"ccw\"", "rotation = \"clockwise\"");
  expect_mistake(t, "drum.rotation", line_of(t, "clockwise"), {"\"clockwise\"", "\"cw\" or \"ccw\""});
}

TEST(DesignMistakes, TitleNotAString) {
  const std::string t = with(kBase, "title = \"Test brake\"", "title = 5");
  expect_mistake(t, "project.title", 2, {"expected a string"});
}

TEST(DesignMistakes, UnsafeProjectNumber) {
  const std::string t = with(kBase, "number = \"T-1\"", "number = \"../T 1\"");
  expect_mistake(t, "project.number", 3, {"\"../T 1\"", "letters, digits"});
}

TEST(DesignMistakes, InvalidDate) {
  const std::string t = with(kBase, "number = \"T-1\"", "date = \"2026-02-30\"");
  expect_mistake(t, "project.date", 3, {"YYYY-MM-DD"});
}

TEST(DesignMistakes, BothEndsOnTheFrame) {
  const std::string t = with(kBase, "end_b = { mount = \"lever\", at = [\"-50 mm\", \"-230 mm\"] }",
                             "end_b = { mount = \"frame\", at = [\"-50 mm\", \"-230 mm\"] }");
  expect_mistake(t, "band.end_b.mount", line_of(t, "end_b ="),
                 {"at least one band end must be on the lever"});
}

TEST(DesignMistakes, MountMisspelled) {
  const std::string t = with(kBase, "end_b = { mount = \"lever\", at = [\"-50 mm\", \"-230 mm\"] }",
                             "end_b = { mount = \"arm\", at = [\"-50 mm\", \"-230 mm\"] }");
  expect_mistake(t, "band.end_b.mount", line_of(t, "end_b ="), {"\"arm\"", "\"lever\" or \"frame\""});
}

TEST(DesignMistakes, PointWithOneCoordinate) {
  const std::string t = with(kBase, "pivot = [\"100 mm\", \"-230 mm\"]", "pivot = [\"100 mm\"]");
  expect_mistake(t, "lever.pivot", line_of(t, "pivot ="), {"[\"100 mm\"]", "two lengths"});
}

TEST(DesignMistakes, PointCoordinateInWrongUnit) {
  const std::string t = with(kBase, "pivot = [\"100 mm\", \"-230 mm\"]", "pivot = [\"100 mm\", \"-230 N\"]");
  expect_mistake(t, "lever.pivot", line_of(t, "pivot ="), {"\"-230 N\"", "is a force"});
}

TEST(DesignMistakes, HandleAtThePivot) {
  const std::string t = with(kBase, "handle = [\"-500 mm\", \"-230 mm\"]", "handle = [\"100 mm\", \"-230 mm\"]");
  expect_mistake(t, "lever.handle", line_of(t, "handle ="), {"handle is at the pivot"});
}

TEST(DesignMistakes, EndMissing) {
  const std::string t = with(kBase, "end_b = { mount = \"lever\", at = [\"-50 mm\", \"-230 mm\"] }", "");
  expect_mistake(t, "band.end_b", line_of(t, "[band]"), {"missing key 'end_b'", "mount = \"lever\""});
}

TEST(DesignMistakes, BothTorqueAndLeverForce) {
  const std::string t = with(kBase, "torque = \"150 N*m\"", "torque = \"150 N*m\"\nlever_force = \"200 N\"");
  expect_mistake(t, "load.lever_force", line_of(t, "lever_force"), {"not both"});
}

TEST(DesignMistakes, NeitherTorqueNorLeverForce) {
  const std::string t = with(kBase, "torque = \"150 N*m\"", "service_factor = 1.2");
  expect_mistake(t, "load", line_of(t, "[load]"), {"torque", "lever_force"});
}

TEST(DesignMistakes, ServiceFactorNotPositive) {
  const std::string t = with(kBase, "torque = \"150 N*m\"", "torque = \"150 N*m\"\nservice_factor = -1");
  expect_mistake(t, "load.service_factor", line_of(t, "service_factor"), {"greater than zero"});
}

TEST(DesignMistakes, ConceptWithPinCoordinates) {
  const std::string t = kBase + "\n[concept]\nkind = \"simple\"\nwrap = \"250°\"\nhandle_arm = \"500 mm\"\narm_b = \"100 mm\"\n";
  expect_mistake(t, "band.end_a", line_of(t, "end_a ="), {"a concept design has no pin coordinates"});
}

TEST(DesignMistakes, ConceptLeverWithPivot) {
  const std::string t = kConcept + "\n[lever]\npivot = [\"0 mm\", \"0 mm\"]\n";
  expect_mistake(t, "lever.pivot", line_of(t, "pivot ="), {"a concept design has no pin coordinates"});
}

TEST(DesignMistakes, ConceptLeverPartlyGiven) {
  const std::string t = kConcept + "\n[lever]\nwidth = \"1 in\"\n";
  expect_mistake(t, "lever.thickness", line_of(t, "[lever]"), {"missing key 'thickness'"});
}

TEST(DesignMistakes, WrapOfAFullTurn) {
  const std::string t = with(kConcept, "wrap = \"270°\"", "wrap = \"360 deg\"");
  expect_mistake(t, "concept.wrap", line_of(t, "wrap ="), {"\"360 deg\"", "less than 360°"});
}

TEST(DesignMistakes, WrapOfZero) {
  const std::string t = with(kConcept, "wrap = \"270°\"", "wrap = \"0°\"");
  expect_mistake(t, "concept.wrap", line_of(t, "wrap ="), {"greater than zero"});
}

TEST(DesignMistakes, WrapWithoutUnit) {
  const std::string t = with(kConcept, "wrap = \"270°\"", "wrap = 270");
  expect_mistake(t, "concept.wrap", line_of(t, "wrap ="), {"give the unit, e.g. \"270°\""});
}

TEST(DesignMistakes, SimpleConceptWithArmA) {
  const std::string t = with(kConcept, "kind = \"differential\"", "kind = \"simple\"");
  expect_mistake(t, "concept.arm_a", line_of(t, "arm_a ="), {"anchored at the pivot"});
}

TEST(DesignMistakes, DifferentialConceptWithoutArmA) {
  const std::string t = with(kConcept, "arm_a = \"1 in\"", "");
  expect_mistake(t, "concept.arm_a", line_of(t, "[concept]"), {"missing key 'arm_a'"});
}

TEST(DesignMistakes, DutyWithoutSpeed) {
  const std::string t = kBase + "\n[duty]\ninertia = \"2 kg*m^2\"\n";
  expect_mistake(t, "duty.speed", line_of(t, "[duty]"), {"missing key 'speed'", "\"300 rpm\"", "\"0.5 m/s\""});
}

TEST(DesignMistakes, RotatingDutyWithoutInertia) {
  const std::string t = kBase + "\n[duty]\nspeed = \"300 rpm\"\n";
  expect_mistake(t, "duty.inertia", line_of(t, "[duty]"), {"missing key 'inertia'"});
}

TEST(DesignMistakes, HoistDutyWithoutRopeRadius) {
  const std::string t = kBase + "\n[duty]\nspeed = \"0.5 m/s\"\nmass = \"100 kg\"\nstop_distance = \"0.1 m\"\n";
  expect_mistake(t, "duty.rope_radius", line_of(t, "[duty]"), {"missing key 'rope_radius'"});
}

TEST(DesignMistakes, HoistKeysWithAngularSpeed) {
  const std::string t = kBase + "\n[duty]\nspeed = \"300 rpm\"\nmass = \"100 kg\"\ninertia = \"1 kg*m^2\"\n";
  expect_mistake(t, "duty.mass", line_of(t, "mass ="), {"belongs to a hoist duty", "\"0.5 m/s\""});
}

TEST(DesignMistakes, DutySpeedInWrongUnit) {
  const std::string t = kBase + "\n[duty]\nspeed = \"300 N\"\ninertia = \"1 kg*m^2\"\n";
  expect_mistake(t, "duty.speed", line_of(t, "speed ="), {"is a force", "\"300 rpm\"", "\"0.5 m/s\""});
}

TEST(DesignMistakes, DrawingScaleNotIso5455) {
  const std::string t = kBase + "\n[drawing]\nscale = \"1:3\"\n";
  expect_mistake(t, "drawing.scale", line_of(t, "scale ="), {"\"1:3\"", "ISO 5455", "\"1:5\""});
}

TEST(DesignMistakes, DrawingSheetUnknown) {
  const std::string t = kBase + "\n[drawing]\nsheet = \"A1\"\n";
  expect_mistake(t, "drawing.sheet", line_of(t, "sheet ="), {"\"A2\", \"A3\" or \"A4\""});
}

// Columns count characters, not bytes: the value quoted in the message must be cut right even
// after non-ASCII text on the same line.
TEST(DesignMistakes, ValueAsWrittenAfterNonAsciiKey) {
  const std::string t = with(kBase, "bore = \"40 mm\"", "bore = \"40 mm\"\n\"dürchmesser\" = \"400 mm\"");
  expect_mistake(t, "drum.dürchmesser", line_of(t, "dürchmesser"), {"= \"400 mm\": unknown key"});
}

// ---------------------------------------------------------------------------------------------
// Whatever the file holds, the reader ends in a DesignError (or a valid design), never a crash.

// A damaged file either reads or is refused with a DesignError that names the file; anything
// else (another exception, a crash) is a defect.
void survives(const std::string& text) {
  try {
    read_design_text(text, "fuzz.toml");
  } catch (const DesignError& e) {
    EXPECT_EQ(std::string(e.what()).rfind("fuzz.toml", 0), 0u) << e.what();
  } catch (const std::exception& e) {
    ADD_FAILURE() << "not a DesignError: " << e.what() << "\nfor:\n" << text;
  }
}

TEST(DesignGarbage, EmptyFile) {
  expect_mistake("", "project", 0, {"missing section [project]"});
}

TEST(DesignGarbage, BinaryBytes) {
  std::mt19937 rng(20261130);  // fixed seed: reproducible
  for (int i = 0; i < 300; ++i) {
    std::string s(static_cast<std::size_t>(rng() % 400), '\0');
    for (char& c : s) c = static_cast<char>(rng() & 0xFF);
    EXPECT_TRUE(read_error(s).thrown);
  }
}

TEST(DesignGarbage, NulBytesInsideAValidFile) {
  std::string t = kBase;
  t.insert(t.find("width"), std::string("\0\0", 2));
  EXPECT_TRUE(read_error(t).thrown);
}

TEST(DesignGarbage, DeeplyNestedTables) {
  EXPECT_TRUE(read_error(std::string(5000, '[')).thrown);
  EXPECT_TRUE(read_error("a = " + std::string(5000, '[')).thrown);
  std::string inl = "a = ";
  for (int i = 0; i < 2000; ++i) inl += "{ b = ";
  EXPECT_TRUE(read_error(inl).thrown);
  // Dotted keys: toml++ recurses per segment and would overflow the stack near 40 000.
  std::string dotted = "[a";
  for (int i = 0; i < 200000; ++i) dotted += ".a";
  dotted += "]\n";
  const Caught c = read_error(dotted);
  EXPECT_TRUE(c.thrown);
  EXPECT_NE(c.what.find("not a bandforge design file"), std::string::npos);
}

TEST(DesignGarbage, HugeNumbers) {
  EXPECT_TRUE(read_error(with(kBase, "diameter = \"300 mm\"", "diameter = \"1e999 mm\"")).thrown);
  EXPECT_TRUE(read_error(with(kBase, "diameter = \"300 mm\"", "diameter = 1e999")).thrown);
  EXPECT_TRUE(read_error(with(kBase, "diameter = \"300 mm\"", "diameter = 99999999999999999999999")).thrown);
  EXPECT_TRUE(read_error(with(kBase, "diameter = \"300 mm\"", "diameter = \"nan mm\"")).thrown);
  EXPECT_TRUE(read_error(with(kBase, "material = \"woven\"", "friction = nan\npressure_limit = \"1 MPa\"")).thrown);
  EXPECT_TRUE(read_error(with(kBase, "material = \"woven\"", "friction = inf\npressure_limit = \"1 MPa\"")).thrown);
  survives(with(kBase, "diameter = \"300 mm\"", "diameter = \"1e300 mm\""));
  survives(with(kBase, "pin_diameter = \"12 mm\"", "pin_diameter = \"1e-300 mm\""));
}

TEST(DesignGarbage, OversizedFile) {
  const std::string t = kBase + "# " + std::string(2 << 20, 'x') + "\n";
  const Caught c = read_error(t);
  EXPECT_TRUE(c.thrown);
  EXPECT_NE(c.what.find("larger than"), std::string::npos);
}

TEST(DesignGarbage, EveryPrefixOfAValidFile) {
  for (std::size_t n = 0; n < kBase.size(); ++n) survives(kBase.substr(0, n));
}

TEST(DesignGarbage, RandomByteMutationsOfAValidFile) {
  std::mt19937 rng(7);
  const std::string alphabet = "[]{}=\"',.#\n -0123456789e°xmN*/\\";
  for (int i = 0; i < 2000; ++i) {
    std::string t = kBase;
    for (int k = 0; k < 3; ++k) {
      t[rng() % t.size()] = alphabet[rng() % alphabet.size()];
    }
    survives(t);
  }
}

TEST(DesignGarbage, WrongTypesEverywhere) {
  // Replace each value in turn by values of every TOML type.
  const std::vector<std::string> values = {"1", "-1", "0.5", "true", "\"\"", "\"x\"", "[]",
                                           "[1, 2]", "{}", "{ a = 1 }", "2026-01-01",
                                           "07:30:00", "[[1]]", "\"1e400 mm\""};
  std::istringstream in(kBase);
  std::string line;
  while (std::getline(in, line)) {
    const std::size_t eq = line.find(" = ");
    if (eq == std::string::npos) continue;
    for (const std::string& v : values) survives(with(kBase, line, line.substr(0, eq) + " = " + v));
  }
}

TEST(DesignFile, MissingFileIsAnIoError) {
  EXPECT_THROW(read_design_file("/nonexistent/bandforge/brake.toml"), IoError);
  EXPECT_THROW(read_design_file(BANDFORGE_SOURCE_DIR), IoError);  // a directory
}

}  // namespace
}  // namespace bandforge
