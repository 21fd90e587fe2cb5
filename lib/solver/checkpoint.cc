// SPDX-License-Identifier: Apache-2.0
// Checkpoints: atomic writing, checked reading (see checkpoint.h).
#include "checkpoint.h"

#include "card_reader.h"
#include "case_errors.h"
#include "result_files.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/files.h>

#include <deal.II/base/mpi.h>
#include <deal.II/distributed/solution_transfer.h>

#include <boost/archive/archive_exception.hpp>
#include <boost/archive/binary_iarchive.hpp>
#include <boost/archive/binary_oarchive.hpp>
#include <boost/serialization/string.hpp>
#include <boost/serialization/utility.hpp>
#include <boost/serialization/vector.hpp>

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <ios>
#include <sstream>

// How the plain structs of a run go into a boost archive (binary: doubles bit-exact).
namespace boost::serialization {

using namespace quantacal::solver;
using namespace quantacal::solver::detail;

template <class Archive>
void serialize(Archive& ar, AssembledSums& s, unsigned int) {
  ar& s.stored& s.boundary& s.source& s.shift;
}
template <class Archive>
void serialize(Archive& ar, StepControl::State& s, unsigned int) {
  ar& s.step& s.previous_step& s.has_previous_step& s.consecutive_rejections;
}
template <class Archive>
void serialize(Archive& ar, EnergyLedger::State& s, unsigned int) {
  ar& s.initial_stored& s.shift& s.boundary_heat& s.source_heat& s.remesh_change;
}
template <class Archive>
void serialize(Archive& ar, StepperState& s, unsigned int) {
  ar& s.sums& s.previous_step& s.has_previous;
}
template <class Archive>
void serialize(Archive& ar, FieldSeries& s, unsigned int) {
  ar& s.counter& s.series;
}
template <class Archive>
void serialize(Archive& ar, EnergyRecord& r, unsigned int) {
  ar& r.time& r.stored_energy& r.boundary_heat& r.source_heat& r.remesh_change& r
      .relative_imbalance;
}
template <class Archive>
void serialize(Archive& ar, StepStatistics& s, unsigned int) {
  ar& s.n_steps& s.n_rejected& s.n_newton_iterations& s.n_linear_iterations& s
      .n_jacobian_assemblies& s.n_residual_assemblies& s.smallest_step& s.largest_step& s
      .n_remeshes& s.most_dofs& s.fewest_dofs;
}
template <class Archive>
void serialize(Archive& ar, PhaseTimes& t, unsigned int) {
  ar& t.setup& t.assembly& t.material_evaluation& t.linear_solve& t.preconditioner& t
      .output& t.total;
}
template <class Archive>
void serialize(Archive& ar, RunState& s, unsigned int) {
  ar& s.time& s.index& s.next_checkpoint_time& s.wall_seconds& s.control& s.ledger& s
      .stepper& s.transformations& s.fields;
  RunResult& r = s.result;
  ar& r.probe_names& r.times& r.probe_temperatures& r.probe_rates& r.energy& r
      .worst_relative_imbalance& r.steps& r.timings& r.written_files;
}

} // namespace boost::serialization

namespace quantacal::solver::detail {
namespace {

using namespace dealii;
namespace fs = std::filesystem;

/// First line of state.bin's archive: what it is and its layout version.
constexpr const char* state_magic = "quantacal checkpoint state";
// 2: the ledger's remesh change; 3: the probes' dT/dt
constexpr unsigned int state_format = 3;
constexpr unsigned int record_format = 1;
constexpr const char* state_file = "state.bin";
constexpr const char* forest_file = "mesh";

std::string folder_name(unsigned int index) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "checkpoint-%06u", index);
  return buffer;
}

/** Size and hash of one file of a checkpoint. */
struct FileEntry {
  std::string name;
  std::uintmax_t bytes = 0;
  std::string hash;
};

std::string read_bytes(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw std::ios_base::failure("cannot read " + path.string());
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::string hash_of(const std::string& bytes) {
  return hex64(fnv1a(bytes.data(), bytes.size()));
}

/**
 * Runs @p work on rank 0; if it throws, every rank throws std::ios_base::failure
 * with its message (collective).
 */
template <class Work>
void on_rank_zero(MPI_Comm communicator, Work&& work) {
  std::string failure;
  if (Utilities::MPI::this_mpi_process(communicator) == 0) {
    try {
      work();
    } catch (const std::exception& e) {
      failure = e.what();
      if (failure.empty())
        failure = "checkpoint write failed";
    }
  }
  failure = Utilities::MPI::broadcast(communicator, failure, 0);
  if (!failure.empty())
    throw std::ios_base::failure(failure);
}

std::string record_text(const CaseDescription& description, const RunState& state,
                        unsigned int ranks,
                        const std::vector<FingerprintSection>& fingerprint,
                        const std::vector<FileEntry>& files) {
  std::ostringstream out;
  out << "# quantacal checkpoint record: it names the last complete checkpoint of\n"
         "# this output folder; `quantacal run CASE --resume` continues from it.\n"
         "# Written by the run; do not edit (the sizes and hashes are checked).\n";
  out << "format: " << record_format << '\n';
  out << "folder: " << folder_name(state.index) << '\n';
  out << "index: " << state.index << '\n';
  out << "time_s: " << number(state.time) << '\n';
  out << "accepted_steps: " << state.result.steps.n_steps << '\n';
  out << "ranks: " << ranks << '\n';
  out << "case: " << quoted(description.name) << '\n';
  out << "case_file: " << quoted(description.file) << '\n';
  out << "fingerprint:\n";
  for (const FingerprintSection& section : fingerprint)
    out << "  " << quoted(section.key) << ": " << quoted(section.hash) << '\n';
  out << "files:\n";
  for (const FileEntry& file : files)
    out << "  - {name: " << quoted(file.name) << ", bytes: " << file.bytes
        << ", fnv1a64: " << quoted(file.hash) << "}\n";
  return out.str();
}

/** Removes every checkpoint folder of @p folder except @p keep (rank 0). */
void remove_other_checkpoints(const fs::path& folder, const std::string& keep) {
  std::error_code ec;
  std::vector<fs::path> stale;
  for (const auto& entry : fs::directory_iterator(folder, ec)) {
    const std::string name = entry.path().filename().string();
    if (name.rfind("checkpoint-", 0) == 0 && name != keep && entry.is_directory())
      stale.push_back(entry.path());
  }
  for (const fs::path& path : stale)
    fs::remove_all(path, ec); // best effort: a leftover is removed next time
}

[[noreturn]] void damaged(const fs::path& file, const std::string& what) {
  throw InputError(file.string(), 0, 0, "", "", what);
}

/** The record's files, each present with its size and hash (rank 0's check). */
void check_files(const fs::path& record, const fs::path& folder,
                 const YAML::Node& files) {
  if (!files.IsSequence() || files.size() == 0)
    damaged(record, "expected a checkpoint record with a `files` list (it has none)");
  for (std::size_t i = 0; i < files.size(); ++i) {
    const YAML::Node entry = files[i];
    if (!entry.IsMap() || !entry["name"] || !entry["bytes"] || !entry["fnv1a64"])
      damaged(record, "expected files[" + std::to_string(i) +
                          "] to be {name, bytes, fnv1a64} (the record is damaged)");
    const fs::path file = folder / entry["name"].as<std::string>();
    const auto bytes = entry["bytes"].as<std::uintmax_t>();
    std::error_code ec;
    if (!fs::is_regular_file(file, ec))
      damaged(file, "expected the checkpoint file that " + record.filename().string() +
                        " lists (it is missing)");
    const std::uintmax_t found = fs::file_size(file, ec);
    if (ec || found != bytes)
      damaged(file, "expected " + std::to_string(bytes) + " bytes as " +
                        record.filename().string() + " records, found " +
                        std::to_string(found) +
                        (found < bytes ? " (truncated)" : " (damaged)"));
    const std::string hash = hash_of(read_bytes(file));
    if (hash != entry["fnv1a64"].as<std::string>())
      damaged(file, "expected the content " + record.filename().string() +
                        " records (FNV-1a hash " + entry["fnv1a64"].as<std::string>() +
                        ", found " + hash + "): the file is damaged");
  }
}

/** The record, parsed; throws InputError naming it. */
YAML::Node read_record(const fs::path& record) {
  std::error_code ec;
  if (!fs::exists(record, ec))
    damaged(record, "expected a checkpoint to resume from (there is none: no run "
                    "with output.checkpoint_interval or output.checkpoint_wall_interval "
                    "has written one into " +
                        record.parent_path().string() +
                        "; start the run without --resume)");
  const YAML::Node root =
      quantacal::detail::parse_yaml(read_bytes(record), record.string());
  try {
    if (!root.IsMap() || !root["format"] || !root["folder"] || !root["ranks"] ||
        !root["fingerprint"] || !root["files"])
      damaged(record, "expected a checkpoint record with format, folder, ranks, "
                      "fingerprint and files (the record is damaged)");
    if (root["format"].as<unsigned int>() != record_format)
      damaged(record, "expected a checkpoint record of format " +
                          std::to_string(record_format) + " (found format " +
                          root["format"].as<std::string>() +
                          ", written by another version of quantacal)");
  } catch (const YAML::Exception& e) {
    damaged(record, "expected a checkpoint record (unreadable: " + e.msg + ")");
  }
  return root;
}

/** What the record says; with @p check, every file it lists is checked against it. */
LoadedCheckpoint read_record_and_files(const CaseDescription& description, bool check) {
  LoadedCheckpoint loaded;
  loaded.record = checkpoint_record_path(description);
  const fs::path record(loaded.record);
  const YAML::Node root = read_record(record);
  try {
    const std::string name = root["folder"].as<std::string>();
    if (name.rfind("checkpoint-", 0) != 0 || name.find('/') != std::string::npos)
      damaged(record, "expected folder: checkpoint-NNNNNN (found \"" + name + "\")");
    const fs::path folder = record.parent_path() / name;
    loaded.folder = folder.string();
    loaded.forest = (folder / forest_file).string();
    loaded.ranks = root["ranks"].as<unsigned int>();
    for (const auto& item : root["fingerprint"])
      loaded.sections.emplace_back(item.first.as<std::string>(),
                                   item.second.as<std::string>());
    if (check)
      check_files(record, folder, root["files"]);
  } catch (const YAML::Exception& e) {
    damaged(record, "expected a checkpoint record (unreadable: " + e.msg + ")");
  }
  return loaded;
}

void read_state(LoadedCheckpoint& loaded) {
  const fs::path file = fs::path(loaded.folder) / state_file;
  std::ifstream in(file, std::ios::binary);
  if (!in)
    damaged(file, "expected a readable checkpoint state (cannot open it)");
  try {
    boost::archive::binary_iarchive archive(in);
    std::string magic;
    unsigned int format = 0;
    archive >> magic >> format;
    if (magic != state_magic || format != state_format)
      damaged(file, "expected a quantacal checkpoint state of format " +
                        std::to_string(state_format));
    archive >> loaded.state;
  } catch (const InputError&) {
    throw;
  } catch (const std::exception& e) { // archive_exception, or a size read from damage
    damaged(file, std::string("expected a readable checkpoint state (") + e.what() + ")");
  }
}

} // namespace

std::string checkpoint_record_path(const CaseDescription& description) {
  return (fs::path(description.output.folder) / "checkpoint.yaml").string();
}

LoadedCheckpoint read_checkpoint(const CaseDescription& description,
                                 MPI_Comm communicator) {
  // rank 0 checks the files; if that fails, every rank checks and raises the same error
  int ok = 1;
  if (Utilities::MPI::this_mpi_process(communicator) == 0) {
    try {
      read_record_and_files(description, true);
    } catch (const InputError&) {
      ok = 0;
    }
  }
  ok = Utilities::MPI::min(ok, communicator);
  LoadedCheckpoint loaded = read_record_and_files(description, !ok);
  read_state(loaded);
  return loaded;
}

void check_fingerprint(const CaseDescription& description, const LoadedCheckpoint& loaded,
                       const std::vector<FingerprintSection>& current,
                       bool with_materials) {
  const auto material = [](const std::string& key) {
    return key.rfind("materials[", 0) == 0;
  };
  const std::string source = " (the checkpoint " + loaded.record +
                             " was written for another case; resume only the case "
                             "that wrote it, or start again without --resume)";
  for (const FingerprintSection& section : current) {
    if (material(section.key) && !with_materials)
      continue;
    const std::string* hash = nullptr;
    for (const auto& [key, saved] : loaded.sections)
      if (key == section.key)
        hash = &saved;
    if (!hash)
      throw case_error(description, section.where, section.key,
                       "no " + section.key + " (the checkpoint has none)" + source);
    if (*hash != section.hash)
      throw case_error(description, section.where, section.key,
                       "the same " + section.what +
                           " as when the checkpoint was written" + source);
  }
  // an entry of a list (a boundary, a probe, ...) the case no longer has
  for (const auto& [key, hash] : loaded.sections) {
    if (material(key) && !with_materials)
      continue;
    bool present = false;
    for (const FingerprintSection& section : current)
      present = present || section.key == key;
    if (!present)
      throw InputError(description.file, 0, 0, key, "",
                       "expected " + key + " as when the checkpoint was written (the " +
                           "case no longer has it)" + source);
  }
}

template <int dim>
void write_checkpoint(const CaseDescription& description,
                      Discretization<dim>& discretization,
                      const std::vector<Vector*>& vectors, const RunState& state,
                      const std::vector<FingerprintSection>& fingerprint,
                      const std::function<void(const std::string&)>& hook) {
  const MPI_Comm communicator = discretization.communicator;
  const fs::path folder(description.output.folder);
  const std::string name = folder_name(state.index);
  const fs::path temporary = folder / (name + ".tmp");
  const fs::path final_folder = folder / name;
  on_rank_zero(communicator, [&] {
    fs::remove_all(temporary); // a leftover of an interrupted write
    if (!fs::create_directory(temporary))
      throw std::ios_base::failure("cannot create " + temporary.string());
  });
  // the level vectors attached to the cells of the saved mesh
  std::vector<Vector> ghosted;
  ghosted.reserve(vectors.size());
  for (const Vector* v : vectors) {
    ghosted.push_back(discretization.ghosted_vector());
    ghosted.back() = *v;
  }
  std::vector<const Vector*> attached;
  for (const Vector& v : ghosted)
    attached.push_back(&v);
  parallel::distributed::SolutionTransfer<dim, Vector> transfer(
      discretization.dof_handler);
  transfer.prepare_for_serialization(attached);
  discretization.triangulation.save((temporary / forest_file).string());
  on_rank_zero(communicator, [&] {
    std::ostringstream bytes;
    {
      boost::archive::binary_oarchive archive(bytes);
      const std::string magic = state_magic;
      const unsigned int format = state_format;
      RunState copy = state;
      archive << magic << format << copy;
    }
    std::ofstream out(temporary / state_file, std::ios::binary | std::ios::trunc);
    out << bytes.str();
    out.close();
    if (!out)
      throw std::ios_base::failure("cannot write " + (temporary / state_file).string());
  });
  MPI_Barrier(communicator);
  if (hook)
    hook("written");
  std::vector<FileEntry> files;
  on_rank_zero(communicator, [&] {
    std::vector<fs::path> paths;
    for (const auto& entry : fs::directory_iterator(temporary))
      if (entry.is_regular_file())
        paths.push_back(entry.path());
    std::sort(paths.begin(), paths.end());
    for (const fs::path& path : paths) {
      const std::string bytes = read_bytes(path);
      files.push_back({path.filename().string(), bytes.size(), hash_of(bytes)});
    }
    fs::remove_all(final_folder); // a leftover of an interrupted run
    fs::rename(temporary, final_folder);
  });
  if (hook)
    hook("renamed");
  on_rank_zero(communicator, [&] {
    write_file_atomically(checkpoint_record_path(description),
                          record_text(description, state,
                                      Utilities::MPI::n_mpi_processes(communicator),
                                      fingerprint, files));
  });
  if (hook)
    hook("committed");
  on_rank_zero(communicator, [&] { remove_other_checkpoints(folder, name); });
}

template <int dim>
void read_checkpoint_vectors(const Discretization<dim>& discretization,
                             const std::vector<Vector*>& vectors) {
  parallel::distributed::SolutionTransfer<dim, Vector> transfer(
      discretization.dof_handler);
  std::vector<Vector*> targets = vectors;
  transfer.deserialize(targets);
}

template void write_checkpoint<2>(const CaseDescription&, Discretization<2>&,
                                  const std::vector<Vector*>&, const RunState&,
                                  const std::vector<FingerprintSection>&,
                                  const std::function<void(const std::string&)>&);
template void write_checkpoint<3>(const CaseDescription&, Discretization<3>&,
                                  const std::vector<Vector*>&, const RunState&,
                                  const std::vector<FingerprintSection>&,
                                  const std::function<void(const std::string&)>&);
template void read_checkpoint_vectors<2>(const Discretization<2>&,
                                         const std::vector<Vector*>&);
template void read_checkpoint_vectors<3>(const Discretization<3>&,
                                         const std::vector<Vector*>&);

} // namespace quantacal::solver::detail
