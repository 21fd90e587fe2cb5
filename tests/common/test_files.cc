// SPDX-License-Identifier: Apache-2.0
// write_file_atomically: the target is the old file or the whole new one.
#include <quantacal/common/files.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace {

namespace fs = std::filesystem;

std::string read(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

fs::path fresh_folder(const std::string& name) {
  const fs::path folder = fs::temp_directory_path() / ("quantacal-files-" + name);
  fs::remove_all(folder);
  fs::create_directories(folder);
  return folder;
}

TEST(WriteFileAtomically, CreatesAndReplacesLeavingNoTemporary) {
  const fs::path folder = fresh_folder("replace");
  const fs::path target = folder / "a.csv";
  quantacal::write_file_atomically(target.string(), "first\n");
  EXPECT_EQ(read(target), "first\n");
  quantacal::write_file_atomically(target.string(), std::string("x\0y", 3));
  EXPECT_EQ(read(target), std::string("x\0y", 3)); // bytes as given
  EXPECT_FALSE(fs::exists(folder / "a.csv.tmp"));
  fs::remove_all(folder);
}

TEST(WriteFileAtomically, MissingFolderIsAnErrorNamingTheFile) {
  const fs::path folder = fresh_folder("missing");
  const fs::path target = folder / "no-such-folder" / "a.csv";
  try {
    quantacal::write_file_atomically(target.string(), "x");
    FAIL() << "no error";
  } catch (const std::ios_base::failure& e) {
    EXPECT_NE(std::string(e.what()).find("cannot write " + target.string() + ".tmp"),
              std::string::npos)
        << e.what();
  }
  fs::remove_all(folder);
}

// A target that cannot be replaced (here a non-empty folder of that name): the
// rename fails, the error says so, the target is untouched and no temporary is left.
TEST(WriteFileAtomically, FailedRenameLeavesTargetAndNoTemporary) {
  const fs::path folder = fresh_folder("rename");
  const fs::path target = folder / "summary.yaml";
  fs::create_directories(target / "inside");
  try {
    quantacal::write_file_atomically(target.string(), "new");
    FAIL() << "no error";
  } catch (const std::ios_base::failure& e) {
    EXPECT_NE(std::string(e.what()).find("cannot rename"), std::string::npos) << e.what();
  }
  EXPECT_TRUE(fs::is_directory(target / "inside"));
  EXPECT_FALSE(fs::exists(folder / "summary.yaml.tmp"));
  fs::remove_all(folder);
}

} // namespace
