// SPDX-License-Identifier: Apache-2.0
#include <quantacal/common/text.h>

#include <algorithm>
#include <cctype>

namespace quantacal {

std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j)
    row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t above = row[j];
      const std::size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + cost});
      diagonal = above;
    }
  }
  return row[b.size()];
}

std::string nearest_word(const std::string& word,
                         const std::vector<std::string>& candidates) {
  const auto lower = [](std::string s) {
    for (char& ch : s)
      ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    return s;
  };
  // A difference of letter case only is the nearest miss of all.
  for (const auto& c : candidates)
    if (c != word && lower(c) == lower(word))
      return c;
  std::string best;
  std::size_t best_distance = std::string::npos;
  for (const auto& c : candidates) {
    const std::size_t d = edit_distance(word, c);
    if (d < best_distance) {
      best_distance = d;
      best = c;
    }
  }
  // A near miss: at most half the word, and at most 3 edits for words of up
  // to 11 characters (a third of the word beyond).
  const std::size_t n = word.size();
  const std::size_t limit = std::max<std::size_t>(
      1, std::min<std::size_t>(n / 2, std::max<std::size_t>(3, n / 3)));
  if (best.empty() || best_distance > limit)
    return "";
  return best;
}

std::string did_you_mean(const std::string& word,
                         const std::vector<std::string>& candidates,
                         const std::string& quote_prefix) {
  const std::string best = nearest_word(word, candidates);
  return best.empty() ? std::string() : " (did you mean '" + quote_prefix + best + "'?)";
}

std::string trim_blanks(const std::string& s) {
  const auto first = s.find_first_not_of(" \t\r");
  if (first == std::string::npos)
    return {};
  const auto last = s.find_last_not_of(" \t\r");
  return s.substr(first, last - first + 1);
}

std::string markup_escape(const std::string& s) {
  std::string out;
  out.reserve(s.size());
  for (const char c : s) {
    switch (c) {
    case '&':
      out += "&amp;";
      break;
    case '<':
      out += "&lt;";
      break;
    case '>':
      out += "&gt;";
      break;
    case '"':
      out += "&quot;";
      break;
    case '\'':
      out += "&#39;";
      break;
    default:
      out += c;
    }
  }
  return out;
}

} // namespace quantacal
