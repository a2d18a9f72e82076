#include "geometry/step_canonical.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <map>
#include <string>
#include <unordered_map>
#include <vector>

#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

// One entity instance: its body split into literal text and references.
// text[0] ref[0] text[1] ref[1] ... text[n]: text has one more piece than refs.
struct Entity {
  long id = 0;
  std::vector<std::string> text;
  std::vector<long> refs;       // original ids
  std::vector<std::size_t> to;  // indices into the entity list
};

std::string ref(long id) { return std::string(1, '#').append(std::to_string(id)); }

[[noreturn]] void bad(const std::string& what) {
  throw BuildError("while making the STEP file reproducible: " + what);
}

// FNV-1a, 64 bit: the same value on every run and platform (std::hash is not promised to be).
struct Fnv {
  std::uint64_t h = 1469598103934665603ull;
  void add(std::string_view s) {
    for (unsigned char c : s) {
      h ^= c;
      h *= 1099511628211ull;
    }
    add_byte(0xff);  // separator, so that "ab"+"c" differs from "a"+"bc"
  }
  void add(std::uint64_t v) {
    for (int i = 0; i < 8; ++i) add_byte(static_cast<unsigned char>(v >> (8 * i)));
  }
  void add_byte(unsigned char c) {
    h ^= c;
    h *= 1099511628211ull;
  }
};

// Parses "#id = body;" instances up to ENDSEC. Line breaks outside strings are dropped (with the
// indentation after them), since the writer breaks long lines at widths that depend on the ids.
std::vector<Entity> parse_data(std::string_view s, std::size_t& pos) {
  std::vector<Entity> out;
  auto skip_ws = [&] {
    while (pos < s.size() && (s[pos] == ' ' || s[pos] == '\n' || s[pos] == '\r' || s[pos] == '\t')) ++pos;
  };
  for (;;) {
    skip_ws();
    if (s.compare(pos, 7, "ENDSEC;") == 0) {
      pos += 7;
      return out;
    }
    if (pos >= s.size() || s[pos] != '#') bad("expected an entity instance in the DATA section");
    ++pos;
    Entity e;
    std::size_t digits = 0;
    while (pos < s.size() && s[pos] >= '0' && s[pos] <= '9') {
      e.id = e.id * 10 + (s[pos++] - '0');
      ++digits;
    }
    if (digits == 0) bad("an entity instance without a number");
    skip_ws();
    if (pos >= s.size() || s[pos] != '=') bad(std::string("expected '=' after ").append(ref(e.id)));
    ++pos;
    skip_ws();
    std::string piece;
    bool in_string = false, done = false;
    while (pos < s.size() && !done) {
      const char c = s[pos];
      if (in_string) {
        ++pos;
        // Line ends are not part of a Part 21 string; OCCT wraps long strings at widths that
        // depend on the entity numbers.
        if (c == '\n' || c == '\r') continue;
        piece += c;
        if (c == '\'') {
          if (pos < s.size() && s[pos] == '\'') {
            piece += s[pos++];  // '' is a quote inside the string
          } else {
            in_string = false;
          }
        }
        continue;
      }
      if (c == '\'') {
        in_string = true;
        piece += c;
        ++pos;
      } else if (c == '\n' || c == '\r') {
        ++pos;
        while (pos < s.size() && (s[pos] == ' ' || s[pos] == '\t')) ++pos;
      } else if (c == '#') {
        ++pos;
        long target = 0;
        std::size_t n = 0;
        while (pos < s.size() && s[pos] >= '0' && s[pos] <= '9') {
          target = target * 10 + (s[pos++] - '0');
          ++n;
        }
        if (n == 0) bad(std::string("a '#' without a number in ").append(ref(e.id)));
        e.text.push_back(piece);
        piece.clear();
        e.refs.push_back(target);
      } else if (c == ';') {
        ++pos;
        done = true;
      } else {
        piece += c;
        ++pos;
      }
    }
    if (!done) bad(std::string("the DATA section ends inside ").append(ref(e.id)));
    e.text.push_back(piece);
    out.push_back(std::move(e));
  }
}

}  // namespace

std::string canonical_step(std::string_view s) {
  const std::size_t data = s.find("\nDATA;");
  if (s.compare(0, 13, "ISO-10303-21;") != 0 || data == std::string_view::npos) {
    bad("not an ISO 10303-21 file");
  }
  std::size_t pos = data + 6;
  std::vector<Entity> ents = parse_data(s, pos);
  const std::string_view tail = s.substr(pos);

  std::unordered_map<long, std::size_t> index;
  for (std::size_t i = 0; i < ents.size(); ++i) {
    if (!index.emplace(ents[i].id, i).second) bad(ref(ents[i].id) + " is defined twice");
  }
  std::vector<bool> referenced(ents.size(), false);
  for (Entity& e : ents) {
    for (long r : e.refs) {
      auto it = index.find(r);
      if (it == index.end()) bad(ref(e.id) + " refers to a missing " + ref(r));
      e.to.push_back(it->second);
      referenced[it->second] = true;
    }
  }

  // Content hash of each instance's whole subgraph (Merkle style). A reference back into an
  // instance still being hashed (a cycle) contributes a fixed marker instead.
  enum : unsigned char { fresh, busy, done };
  std::vector<unsigned char> state(ents.size(), fresh);
  std::vector<std::uint64_t> hash(ents.size(), 0);
  std::vector<std::pair<std::size_t, std::size_t>> stack;  // (entity, next child)
  for (std::size_t root = 0; root < ents.size(); ++root) {
    if (state[root] != fresh) continue;
    stack.push_back({root, 0});
    state[root] = busy;
    while (!stack.empty()) {
      auto& [e, k] = stack.back();
      if (k < ents[e].to.size()) {
        const std::size_t c = ents[e].to[k++];
        if (state[c] == fresh) {
          state[c] = busy;
          stack.push_back({c, 0});
        }
        continue;
      }
      Fnv f;
      for (std::size_t i = 0; i < ents[e].text.size(); ++i) {
        f.add(ents[e].text[i]);
        if (i < ents[e].to.size()) {
          const std::size_t c = ents[e].to[i];
          f.add(state[c] == done ? hash[c] : std::uint64_t{0x5eed});
        }
      }
      hash[e] = f.h;
      state[e] = done;
      stack.pop_back();
    }
  }

  // New numbers: depth-first pre-order from the unreferenced instances taken in hash order,
  // children in the order they are written. Instances only reachable through a cycle follow.
  std::vector<std::size_t> starts;
  for (std::size_t i = 0; i < ents.size(); ++i) {
    if (!referenced[i]) starts.push_back(i);
  }
  std::vector<std::size_t> rest(ents.size());
  for (std::size_t i = 0; i < ents.size(); ++i) rest[i] = i;
  auto by_hash = [&](std::size_t a, std::size_t b) { return hash[a] < hash[b]; };
  std::stable_sort(starts.begin(), starts.end(), by_hash);
  std::stable_sort(rest.begin(), rest.end(), by_hash);
  starts.insert(starts.end(), rest.begin(), rest.end());

  std::vector<long> number(ents.size(), 0);
  std::vector<std::size_t> order;
  order.reserve(ents.size());
  std::vector<std::size_t> todo;
  for (std::size_t start : starts) {
    if (number[start] != 0) continue;
    todo.push_back(start);
    while (!todo.empty()) {
      const std::size_t e = todo.back();
      todo.pop_back();
      if (number[e] != 0) continue;
      number[e] = static_cast<long>(order.size()) + 1;
      order.push_back(e);
      for (auto it = ents[e].to.rbegin(); it != ents[e].to.rend(); ++it) {
        if (number[*it] == 0) todo.push_back(*it);
      }
    }
  }

  std::string out(s.substr(0, data + 6));
  out += '\n';
  for (std::size_t e : order) {
    out += '#';
    out += std::to_string(number[e]);
    out += " = ";
    for (std::size_t i = 0; i < ents[e].text.size(); ++i) {
      out += ents[e].text[i];
      if (i < ents[e].to.size()) {
        out += '#';
        out += std::to_string(number[ents[e].to[i]]);
      }
    }
    out += ";\n";
  }
  out += "ENDSEC;";
  out += tail;
  return out;
}

std::string part21_real(double v) {
  char buf[40];
  for (int digits = 1; digits <= 17; ++digits) {
    std::snprintf(buf, sizeof buf, "%.*G", digits, v);
    if (std::strtod(buf, nullptr) == v) break;
  }
  std::string t = buf;
  const std::size_t e = t.find('E');
  std::string mantissa = t.substr(0, e), exponent = e == std::string::npos ? "" : t.substr(e);
  if (mantissa.find('.') == std::string::npos) mantissa += '.';
  return mantissa.append(exponent);
}

std::string exact_colours(std::string_view s, const std::vector<std::array<double, 3>>& exact) {
  static constexpr std::string_view key = "COLOUR_RGB(";
  std::string out;
  std::size_t from = 0;
  for (std::size_t at = s.find(key); at != std::string_view::npos; at = s.find(key, from)) {
    // COLOUR_RGB('name',r,g,b): skip the name string (quotes doubled inside), then three reals.
    std::size_t p = at + key.size();
    if (p >= s.size() || s[p] != '\'') bad("a COLOUR_RGB without a name");
    for (++p; p < s.size(); ++p) {
      if (s[p] == '\'') {
        if (p + 1 < s.size() && s[p + 1] == '\'') {
          ++p;
        } else {
          break;
        }
      }
    }
    const std::size_t values = p + 1;  // at the ',' before r
    const std::size_t close = s.find(')', values);
    if (close == std::string_view::npos) bad("an unterminated COLOUR_RGB");
    const std::string args(s.substr(values, close - values));  // ",r,g,b"
    double rgb[3];
    const char* c = args.c_str();
    bool parsed = true;
    for (double& v : rgb) {
      if (*c != ',') parsed = false;
      if (!parsed) break;
      char* end = nullptr;
      v = std::strtod(c + 1, &end);
      parsed = end != c + 1;
      c = end;
    }
    parsed = parsed && *c == '\0';
    out.append(s.substr(from, values - from));
    from = values;
    if (!parsed) continue;
    for (const auto& want : exact) {
      if (std::abs(rgb[0] - want[0]) < 1e-6 && std::abs(rgb[1] - want[1]) < 1e-6 &&
          std::abs(rgb[2] - want[2]) < 1e-6) {
        for (double v : want) out.append(",").append(part21_real(v));
        from = close;
        break;
      }
    }
  }
  out.append(s.substr(from));
  return out;
}

std::string occurrence_ids_from_one(std::string_view s) {
  static constexpr std::string_view key = "NEXT_ASSEMBLY_USAGE_OCCURRENCE('";
  // Pass 1: the numeric ids in use; pass 2: replace each by its rank.
  std::map<long, long> rank;
  std::vector<std::pair<std::size_t, std::size_t>> spans;  // id text [begin, end)
  for (std::size_t at = s.find(key); at != std::string_view::npos; at = s.find(key, at + 1)) {
    const std::size_t begin = at + key.size();
    std::size_t end = begin;
    while (end < s.size() && s[end] >= '0' && s[end] <= '9') ++end;
    if (end == begin || end >= s.size() || s[end] != '\'') continue;  // not a plain number
    rank[std::stol(std::string(s.substr(begin, end - begin)))] = 0;
    spans.push_back({begin, end});
  }
  long next = 0;
  for (auto& [id, r] : rank) r = ++next;
  std::string out;
  std::size_t from = 0;
  for (auto [begin, end] : spans) {
    out.append(s.substr(from, begin - from));
    out.append(std::to_string(rank[std::stol(std::string(s.substr(begin, end - begin)))]));
    from = end;
  }
  out.append(s.substr(from));
  return out;
}

namespace {

// Decodes one UTF-8 sequence at s[i]; a malformed one becomes U+FFFD.
char32_t next_code_point(std::string_view s, std::size_t& i) {
  const unsigned char c = static_cast<unsigned char>(s[i++]);
  int extra = c >= 0xf0 ? 3 : c >= 0xe0 ? 2 : c >= 0xc0 ? 1 : 0;
  if (c >= 0x80 && extra == 0) return 0xfffd;
  char32_t cp = extra == 3 ? c & 0x07 : extra == 2 ? c & 0x0f : extra == 1 ? c & 0x1f : c;
  for (; extra > 0; --extra) {
    if (i >= s.size() || (static_cast<unsigned char>(s[i]) & 0xc0) != 0x80) return 0xfffd;
    cp = (cp << 6) | (static_cast<unsigned char>(s[i++]) & 0x3f);
  }
  return cp;
}

}  // namespace

std::string encode_non_ascii(std::string_view s) {
  std::string out;
  out.reserve(s.size());
  std::string wide;  // pending \X2\ run
  auto flush = [&] {
    if (wide.empty()) return;
    out.append("\\X2\\").append(wide).append("\\X0\\");
    wide.clear();
  };
  for (std::size_t i = 0; i < s.size();) {
    if (static_cast<unsigned char>(s[i]) < 0x80) {
      flush();
      out += s[i++];
      continue;
    }
    const char32_t cp = next_code_point(s, i);
    char buf[16];
    if (cp > 0xffff) {
      const char32_t v = cp - 0x10000;
      std::snprintf(buf, sizeof buf, "%04X%04X", static_cast<unsigned>(0xd800 + (v >> 10)),
                    static_cast<unsigned>(0xdc00 + (v & 0x3ff)));
    } else {
      std::snprintf(buf, sizeof buf, "%04X", static_cast<unsigned>(cp));
    }
    wide += buf;
  }
  flush();
  return out;
}

}  // namespace bandforge::geom
