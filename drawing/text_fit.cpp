#include "drawing/text_fit.hpp"

namespace bandforge::drawing {

double fitted_height(const Canvas& c, std::string_view text, double h, double width) {
  static const double heights[] = {20, 14, 10, 7, 5, 3.5, 2.5, 1.8};  // ISO 3098 series
  for (double candidate : heights) {
    if (candidate > h) continue;
    if (c.text_width(text, candidate) <= width) return candidate;
  }
  return 1.8;
}

std::string ellipsize(const Canvas& c, std::string_view text, double h, double width) {
  if (c.text_width(text, h) <= width) return std::string(text);
  std::string s(text);
  while (!s.empty()) {
    // Drop one UTF-8 character (its continuation bytes are 10xxxxxx).
    do {
      s.pop_back();
    } while (!s.empty() && (static_cast<unsigned char>(s.back()) & 0xC0) == 0x80);
    if (c.text_width(s + "…", h) <= width) return s + "…";
  }
  return "…";
}

std::vector<std::string> wrap_lines(const Canvas& c, std::string_view text, double h, double width) {
  // Explicit line breaks first, then each paragraph wrapped at spaces.
  if (const size_t nl = text.find('\n'); nl != std::string_view::npos) {
    auto lines = wrap_lines(c, text.substr(0, nl), h, width);
    for (auto& l : wrap_lines(c, text.substr(nl + 1), h, width)) lines.push_back(std::move(l));
    return lines;
  }
  std::vector<std::string> lines;
  std::string line;
  size_t i = 0;
  while (i < text.size()) {
    size_t j = text.find(' ', i);
    if (j == std::string_view::npos) j = text.size();
    const std::string word(text.substr(i, j - i));
    const std::string trial = line.empty() ? word : line + " " + word;
    if (!line.empty() && c.text_width(trial, h) > width) {
      lines.push_back(line);
      line = word;
    } else {
      line = trial;
    }
    i = j + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

}  // namespace bandforge::drawing
