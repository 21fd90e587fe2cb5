// SPDX-License-Identifier: Apache-2.0
#include <quantacal/common/files.h>

#include <filesystem>
#include <fstream>
#include <ios>
#include <system_error>

namespace quantacal {

namespace fs = std::filesystem;

void write_file_atomically(const std::string& path, const std::string& content) {
  const std::string tmp = path + ".tmp";
  const auto fail = [&tmp](const std::string& message) {
    std::error_code ignored;
    fs::remove(tmp, ignored);
    throw std::ios_base::failure(message);
  };
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out)
      fail("cannot write " + tmp);
    out << content;
    out.close();
    if (!out)
      fail("writing " + tmp + " failed (disk full?)");
  }
  std::error_code ec;
  fs::rename(tmp, path, ec);
  if (ec)
    fail("cannot rename " + tmp + " to " + path + ": " + ec.message());
}

} // namespace quantacal
