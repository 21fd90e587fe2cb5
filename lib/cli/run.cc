// SPDX-License-Identifier: Apache-2.0
// `quantacal run case.yaml`: the transient heat-conduction solver (lib/solver),
// then the plot of the cooling curves (gnuplot, started here: the library
// starts no program). Works under `mpirun -np N`; only rank 0 prints and plots.
#include "command_registry.h"
#include "gnuplot.h"
#include "options.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/solver/solver.h>

#include <deal.II/base/mpi.h>

#include <csignal>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <memory>
#include <string>
#include <system_error>
#include <vector>

namespace quantacal::cli {
namespace {

OptionParser run_parser() {
  OptionParser parser(
      "run", "<case.yaml> [options]",
      "Solves the transient heat-conduction case described by the case file\n"
      "(format: docs/cases.md) and writes probes.csv, energy.csv, summary.yaml,\n"
      "report.html, the plots (cooling curves, cooling rates, energy ledger; SVG and\n"
      "PNG) and fields.pvd into the case's output folder (docs/results.md).\n"
      "Run it as `mpirun -np N quantacal run <case.yaml> [options]` on N MPI ranks.\n");
  parser.add_value("output", "DIR", "write into DIR instead of the case's output.folder")
      .add_value("formulation", "F",
                 "energy (default) or capacity (to measure its energy loss)",
                 {"energy", "capacity"})
      .add_value("degree", "P",
                 "finite-element degree 1, 2 or 3 (overrides solver.degree)",
                 {"1", "2", "3"})
      .add_flag("no-fields", "do not write VTU/PVTU/PVD field files")
      .add_flag("no-plot", "do not plot (no gnuplot scripts, no SVG or PNG)")
      .add_flag("resume",
                "continue from the last checkpoint in the output folder (written with\n"
                "output.checkpoint_interval); the result files are continued")
      .add_flag("quiet", "no header, progress or log lines")
      .add_epilogue(
          "Results are estimates to be checked against measurements; quench and cryogen\n"
          "work follows local codes and licensed practice.\n")
      .add_epilogue(exit_code_help());
  return parser;
}

/** The case file with the command line's overrides applied. */
solver::CaseDescription load_with_overrides(const ParsedOptions& options) {
  solver::CaseDescription description = solver::load_case(options.positional.front());
  if (const auto output = options.text("output"))
    description.output.folder =
        std::filesystem::absolute(*output).lexically_normal().string();
  if (const auto formulation = options.text("formulation"))
    description.solver.formulation = *formulation == "energy"
                                         ? solver::Formulation::energy
                                         : solver::Formulation::capacity;
  if (const auto degree = options.text("degree"))
    description.solver.degree = static_cast<unsigned int>(std::stoi(*degree));
  if (options.has("no-fields"))
    description.output.fields = false;
  if (options.has("no-plot"))
    description.output.plot = false;
  return description;
}

/**
 * For tests only: QUANTACAL_TEST_KILL_AT=step:N makes the process kill itself
 * (SIGKILL, no clean-up) after the N-th accepted step of this session, and
 * QUANTACAL_TEST_KILL_AT=checkpoint:POINT:N at POINT (written, renamed, committed)
 * of the N-th checkpoint it writes, so that a test can interrupt a run at a named
 * point (docs/cases.md, "Checkpoints and --resume").
 */
void install_test_kill_point(solver::RunOptions& run_options) {
  const char* text = std::getenv("QUANTACAL_TEST_KILL_AT");
  if (!text || !*text)
    return;
  const std::string spec(text);
  const auto last = spec.rfind(':');
  const auto count = last == std::string::npos
                         ? 0UL
                         : std::strtoul(spec.c_str() + last + 1, nullptr, 10);
  if (count == 0)
    throw UsageError("QUANTACAL_TEST_KILL_AT = \"" + spec +
                     "\": expected step:N or checkpoint:POINT:N with N >= 1");
  const std::string what = spec.substr(0, last);
  if (what == "step") {
    auto seen = std::make_shared<unsigned long>(0);
    run_options.on_step = [seen, count](double, double) {
      if (++*seen == count)
        std::raise(SIGKILL);
    };
  } else if (what == "checkpoint:written" || what == "checkpoint:renamed" ||
             what == "checkpoint:committed") {
    const std::string point = what.substr(what.find(':') + 1);
    auto seen = std::make_shared<unsigned long>(0);
    run_options.on_checkpoint = [seen, count, point](const std::string& at) {
      if (at == "written")
        ++*seen;
      if (at == point && *seen == count)
        std::raise(SIGKILL);
    };
  } else {
    throw UsageError("QUANTACAL_TEST_KILL_AT = \"" + spec +
                     "\": expected step:N or checkpoint:POINT:N (POINT: written, "
                     "renamed or committed)");
  }
}

/**
 * Runs gnuplot on each script the run wrote and renames its STEM.svg.tmp and
 * STEM.png.tmp; a missing or failing gnuplot never fails the run (a warning says
 * why).
 */
void make_plots(const solver::RunResult& result, std::ostream* log) {
  namespace fs = std::filesystem;
  for (const std::string& script : result.plot_scripts) {
    const fs::path path(script);
    const std::string stem = path.stem().string();
    std::string warning = run_gnuplot(script);
    for (const char* extension : {".svg", ".png"}) {
      const fs::path made = path.parent_path() / (stem + extension);
      std::error_code error;
      if (warning.empty())
        fs::rename(made.string() + ".tmp", made, error);
      else
        fs::remove(made.string() + ".tmp", error);
      if (warning.empty() && error)
        warning = "cannot rename " + stem + extension + ".tmp (" + error.message() + ")";
    }
    if (!warning.empty() && log)
      *log << "warning: " << warning << ": " << stem << ".svg and " << stem
           << ".png not made (the script " << stem << ".gp is written)\n";
  }
}

/** Writes report.html after the plots (a failure to write it is a warning). */
void write_report(const solver::CaseDescription& description,
                  const solver::RunResult& result, std::ostream* log) {
  if (!description.output.report)
    return;
  try {
    const std::string path = solver::write_report(description, result);
    if (log)
      *log << "report: " << path << '\n';
  } catch (const std::exception& e) {
    if (log)
      *log << "warning: report.html not written: " << e.what() << '\n';
  }
}

int run_command(const std::vector<std::string>& args) {
  int argc = 1;
  char name[] = "quantacal";
  char* argv_storage[] = {name, nullptr};
  char** argv = argv_storage;
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);

  return guarded("run", [&]() -> int {
    try {
      const OptionParser parser = run_parser();
      const ParsedOptions options = parser.parse(args);
      if (options.help) {
        if (rank == 0)
          std::cout << parser.help();
        return ok;
      }
      if (options.positional.empty()) {
        if (rank == 0)
          std::cerr << parser.help();
        return invalid_input;
      }
      if (options.positional.size() > 1)
        throw UsageError("one case file expected, got also '" + options.positional[1] +
                         "'");
      const solver::CaseDescription description = load_with_overrides(options);
      solver::RunOptions run_options;
      run_options.communicator = MPI_COMM_WORLD;
      run_options.log = options.has("quiet") ? nullptr : &std::cout;
      run_options.throw_on_failure = false; // plot what there is first
      run_options.resume = options.has("resume");
      install_test_kill_point(run_options);
      const solver::RunResult result = solver::run_case(description, run_options);
      if (rank == 0) {
        make_plots(result, run_options.log);
        write_report(description, result, run_options.log);
      }
      if (!result.completed)
        throw solver::stopped_run_error(description, result, run_options);
      return ok;
    } catch (...) {
      if (rank != 0)
        std::cerr.setstate(std::ios::failbit); // rank 0 alone reports
      throw;
    }
  });
}

const CommandRegistrar registrar("run",
                                 "solve a transient heat-conduction case (deal.II, MPI)",
                                 run_command);

} // namespace
} // namespace quantacal::cli
