// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: reading the CSV data file, and its SHA-256 checksum.
#include "fit_detail.h"
#include <quantacal/common/text.h>
#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <sstream>

namespace quantacal::fit {
namespace detail {

std::optional<double> parse_double(const std::string& text) {
  const char* first = text.data();
  const char* last = first + text.size();
  if (first != last && *first == '+')
    ++first;
  double value = 0.0;
  const auto r = std::from_chars(first, last, value);
  if (r.ec != std::errc() || r.ptr != last || !std::isfinite(value))
    return std::nullopt;
  return value;
}

} // namespace detail

namespace {

const std::vector<std::string> kColumns = {
    "T_K",        "T_from_K",    "cp_J_per_kg_K", "cp_J_per_mol_K",
    "e_J_per_kg", "e_J_per_mol", "k_W_per_m_K",   "sigma"};

struct Cell {
  std::string text;
  int column = 0; // 1-based character column of the cell's first character
};

std::vector<Cell> split(const std::string& line) {
  std::vector<Cell> cells;
  std::size_t start = 0;
  while (true) {
    const std::size_t comma = line.find(',', start);
    const std::string raw = line.substr(
        start, comma == std::string::npos ? std::string::npos : comma - start);
    const std::size_t lead = raw.find_first_not_of(" \t");
    cells.push_back(
        {trim_blanks(raw),
         static_cast<int>(start + (lead == std::string::npos ? 0 : lead)) + 1});
    if (comma == std::string::npos)
      break;
    start = comma + 1;
  }
  return cells;
}

bool skipped(const std::string& line) {
  const std::string t = trim_blanks(line);
  return t.empty() || t[0] == '#';
}

} // namespace

std::string sha256_hex(const std::string& bytes) {
  static constexpr std::array<std::uint32_t, 64> k = {
      0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4,
      0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe,
      0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f,
      0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7,
      0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc,
      0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b,
      0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116,
      0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
      0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
      0xc67178f2};
  std::array<std::uint32_t, 8> h = {0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a,
                                    0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19};
  std::string m = bytes;
  const std::uint64_t bit_length = static_cast<std::uint64_t>(bytes.size()) * 8u;
  m.push_back(static_cast<char>(0x80));
  while (m.size() % 64 != 56)
    m.push_back('\0');
  for (int i = 7; i >= 0; --i)
    m.push_back(static_cast<char>((bit_length >> (8 * i)) & 0xffu));
  const auto rotr = [](std::uint32_t x, int n) { return (x >> n) | (x << (32 - n)); };
  for (std::size_t block = 0; block < m.size(); block += 64) {
    std::array<std::uint32_t, 64> w{};
    for (int t = 0; t < 16; ++t)
      for (int b = 0; b < 4; ++b)
        w[t] = (w[t] << 8) | static_cast<unsigned char>(m[block + 4 * t + b]);
    for (int t = 16; t < 64; ++t) {
      const std::uint32_t s0 =
          rotr(w[t - 15], 7) ^ rotr(w[t - 15], 18) ^ (w[t - 15] >> 3);
      const std::uint32_t s1 = rotr(w[t - 2], 17) ^ rotr(w[t - 2], 19) ^ (w[t - 2] >> 10);
      w[t] = w[t - 16] + s0 + w[t - 7] + s1;
    }
    auto v = h;
    for (int t = 0; t < 64; ++t) {
      const std::uint32_t s1 = rotr(v[4], 6) ^ rotr(v[4], 11) ^ rotr(v[4], 25);
      const std::uint32_t ch = (v[4] & v[5]) ^ (~v[4] & v[6]);
      const std::uint32_t t1 = v[7] + s1 + ch + k[t] + w[t];
      const std::uint32_t s0 = rotr(v[0], 2) ^ rotr(v[0], 13) ^ rotr(v[0], 22);
      const std::uint32_t maj = (v[0] & v[1]) ^ (v[0] & v[2]) ^ (v[1] & v[2]);
      const std::uint32_t t2 = s0 + maj;
      v = {t1 + t2, v[0], v[1], v[2], v[3] + t1, v[4], v[5], v[6]};
    }
    for (int i = 0; i < 8; ++i)
      h[i] += v[i];
  }
  static const char* hex = "0123456789abcdef";
  std::string out;
  for (const std::uint32_t x : h)
    for (int i = 28; i >= 0; i -= 4)
      out.push_back(hex[(x >> i) & 0xfu]);
  return out;
}

namespace {

/** Indices into kColumns. */
enum Column { t_col, from_col, cp_kg, cp_mol, e_kg, e_mol, k_col, sigma_col };

/** The header row: its cells and, per known column, the cell index (-1 if absent). */
struct Header {
  std::vector<Cell> cells;
  int line = 0;
  std::vector<int> index;
};

/** Maps the header's cells to the known columns: unknown and duplicate names fail. */
std::vector<int> column_indices(const Header& h, const std::string& file) {
  std::vector<int> index(kColumns.size(), -1);
  for (std::size_t c = 0; c < h.cells.size(); ++c) {
    const std::string& name = h.cells[c].text;
    const auto it = std::find(kColumns.begin(), kColumns.end(), name);
    if (it == kColumns.end()) {
      std::string list;
      for (const auto& k : kColumns)
        list += (list.empty() ? "" : ", ") + k;
      throw CardError(file, h.line, h.cells[c].column, "header", name,
                      "unknown column" + quantacal::did_you_mean(name, kColumns) +
                          "; expected some of: " + list);
    }
    const std::size_t k = static_cast<std::size_t>(it - kColumns.begin());
    if (index[k] >= 0)
      throw CardError(file, h.line, h.cells[c].column, "header", name,
                      "duplicate column");
    index[k] = static_cast<int>(c);
  }
  return index;
}

/** The columns a data file needs: T_K, one value column, T_from_K with energies. */
void check_columns(const Header& h, const std::string& file) {
  const std::vector<int>& index = h.index;
  if (index[t_col] < 0)
    throw CardError(
        file, h.line, 1, "header", "", "missing column 'T_K'" + [&] {
          for (const auto& c : h.cells)
            if (!quantacal::did_you_mean(c.text, {"T_K"}).empty())
              return " (found '" + c.text + "': did you mean 'T_K'?)";
          return std::string();
        }());
  if (index[cp_kg] >= 0 && index[cp_mol] >= 0)
    throw CardError(file, h.line, h.cells[index[cp_mol]].column, "header",
                    "cp_J_per_mol_K",
                    "give one of cp_J_per_kg_K and cp_J_per_mol_K, not both");
  if (index[e_kg] >= 0 && index[e_mol] >= 0)
    throw CardError(file, h.line, h.cells[index[e_mol]].column, "header", "e_J_per_mol",
                    "give one of e_J_per_kg and e_J_per_mol, not both");
  if (index[cp_kg] < 0 && index[cp_mol] < 0 && index[e_kg] < 0 && index[e_mol] < 0 &&
      index[k_col] < 0)
    throw CardError(file, h.line, 1, "header", "",
                    "missing a value column: expected cp_J_per_kg_K or cp_J_per_mol_K "
                    "(or e_J_per_kg, e_J_per_mol, k_W_per_m_K)");
  if ((index[e_kg] >= 0 || index[e_mol] >= 0) && index[from_col] < 0)
    throw CardError(file, h.line, 1, "header", "",
                    "missing column 'T_from_K' (the lower temperature of each energy "
                    "increment)");
}

/** The first row that is not blank or a comment, checked as the header. */
Header read_header(std::istream& in, int& line_number, const std::string& file) {
  Header h;
  std::string line;
  while (std::getline(in, line)) {
    ++line_number;
    if (skipped(line))
      continue;
    h.cells = split(line);
    h.line = line_number;
    break;
  }
  if (h.cells.empty())
    throw CardError(file, 1, 1, "", "",
                    "empty data file: expected a header row naming the columns, e.g. "
                    "\"T_K,cp_J_per_kg_K\"");
  h.index = column_indices(h, file);
  check_columns(h, file);
  return h;
}

/** One data row's cells, read against the header. */
struct Row {
  const Header& header;
  std::vector<Cell> cells;
  int line = 0;
  const std::string& file;

  const Cell& cell(int k) const {
    return cells[static_cast<std::size_t>(header.index[k])];
  }

  /** The number in column @p k; NaN for an empty cell that is not @p required. */
  double value(int k, bool required, const char* what) const {
    const Cell& c = cell(k);
    if (c.text.empty()) {
      if (required)
        throw CardError(file, line, c.column, kColumns[k], "",
                        std::string("empty cell: expected ") + what);
      return std::nan("");
    }
    const auto v = detail::parse_double(c.text);
    if (!v)
      throw CardError(file, line, c.column, kColumns[k], c.text,
                      std::string("expected a number (") + what + ")");
    return *v;
  }
};

/** The kind of @p p from its value column, with the checks of that kind. */
void set_kind(DataPoint& p, const Row& row, int value_col) {
  const Cell& vc = row.cell(value_col);
  const auto fail = [&](const Cell& c, const std::string& column,
                        const std::string& expected) {
    return CardError(row.file, row.line, c.column, column, c.text, expected);
  };
  switch (value_col) {
  case cp_kg:
  case cp_mol:
    p.kind = Observable::capacity;
    p.per_mass = value_col == cp_kg;
    if (!(p.value > 0.0))
      throw fail(vc, kColumns[value_col], "expected a specific heat > 0");
    break;
  case e_kg:
  case e_mol: {
    p.kind = Observable::energy_increment;
    p.per_mass = value_col == e_kg;
    p.from_temperature = row.value(from_col, true, "the lower temperature in K");
    if (!(p.from_temperature >= 0.0 && p.from_temperature < p.temperature))
      throw fail(row.cell(from_col), "T_from_K",
                 "expected a temperature >= 0 K and below T_K = " + row.cell(t_col).text +
                     " K");
    if (!(p.value > 0.0))
      throw fail(vc, kColumns[value_col], "expected an energy increment > 0");
    break;
  }
  default:
    p.kind = Observable::conductivity;
    if (!(p.value > 0.0))
      throw fail(vc, kColumns[value_col], "expected a conductivity > 0 W/m/K");
  }
}

DataPoint read_row(const Row& row, bool has_sigma) {
  DataPoint p;
  p.line = row.line;
  p.temperature = row.value(t_col, true, "a temperature in K");
  const Cell& tc = row.cell(t_col);
  if (!(p.temperature > 0.0))
    throw CardError(row.file, row.line, tc.column, "T_K", tc.text,
                    "expected a temperature > 0 K");
  int n_values = 0;
  int value_col = -1;
  for (int k : {cp_kg, cp_mol, e_kg, e_mol, k_col}) {
    if (row.header.index[k] < 0)
      continue;
    const double v = row.value(k, false, "a measured value");
    if (std::isnan(v))
      continue;
    ++n_values;
    value_col = k;
    p.value = v;
  }
  if (n_values != 1)
    throw CardError(row.file, row.line, tc.column, "", "",
                    n_values == 0 ? "row has no measured value (fill one of the cp, e or "
                                    "k columns)"
                                  : "row fills several value columns (one per row)");
  set_kind(p, row, value_col);
  if (has_sigma) {
    const Cell& sc = row.cell(sigma_col);
    const double s = row.value(sigma_col, false, "an uncertainty");
    if (std::isnan(s))
      throw CardError(row.file, row.line, sc.column, "sigma", "",
                      "empty cell: expected an uncertainty > 0 (the file has a sigma "
                      "column, so every row needs one)");
    if (!(s > 0.0))
      throw CardError(row.file, row.line, sc.column, "sigma", sc.text,
                      "expected an uncertainty > 0");
    p.sigma = s;
  }
  return p;
}

} // namespace

DataSet read_data_from_string(const std::string& text, const std::string& file) {
  DataSet data;
  data.file = file;
  data.sha256 = sha256_hex(text);
  // A UTF-8 byte-order mark (spreadsheet exports) is not part of the first column name.
  const bool bom = text.compare(0, 3, "\xEF\xBB\xBF") == 0;
  std::istringstream in(bom ? text.substr(3) : text);
  int line_number = 0;
  const Header header = read_header(in, line_number, file);
  data.has_sigma = header.index[sigma_col] >= 0;
  std::string line;
  while (std::getline(in, line)) {
    ++line_number;
    if (skipped(line))
      continue;
    const Row row{header, split(line), line_number, file};
    if (row.cells.size() != header.cells.size())
      throw CardError(file, line_number, row.cells.back().column, "", "",
                      "expected " + std::to_string(header.cells.size()) +
                          " cells (as the header) "
                          "but found " +
                          std::to_string(row.cells.size()));
    data.points.push_back(read_row(row, data.has_sigma));
  }
  if (data.points.empty())
    throw CardError(file, header.line, 1, "", "", "no data rows after the header");
  return data;
}

DataSet read_data(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw CardError(path, 0, 0, "", "", "cannot open the data file");
  std::ostringstream text;
  text << in.rdbuf();
  return read_data_from_string(text.str(), path);
}

} // namespace quantacal::fit
