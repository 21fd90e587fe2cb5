// SPDX-License-Identifier: Apache-2.0
// `quantacal run case.yaml`: the transient heat-conduction solver (lib/fe).
// Works under `mpirun -np N`; only rank 0 prints.
#include "command_registry.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/solver/solver.h>

#include <deal.II/base/mpi.h>

#include <filesystem>
#include <iostream>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

void print_run_help(std::ostream& out) {
  out << "usage: quantacal run <case.yaml> [options]\n"
         "       mpirun -np N quantacal run <case.yaml> [options]\n\n"
         "Solves the transient heat-conduction case described by the case file\n"
         "(format: docs/cases.md) and writes probes.csv, energy.csv, summary.yaml,\n"
         "cooling_curves.svg and fields.pvd into the case's output folder.\n\n"
         "options:\n"
         "  --output DIR          write into DIR instead of the case's output.folder\n"
         "  --formulation F       energy (default) or capacity (to measure its energy "
         "loss)\n"
         "  --degree P            finite-element degree 1, 2 or 3 (overrides "
         "solver.degree)\n"
         "  --no-fields           do not write VTU/PVTU/PVD field files\n"
         "  --no-plot             do not run gnuplot\n"
         "  --quiet               no header, progress or log lines\n\n"
         "Results are estimates to be checked against measurements; quench and cryogen\n"
         "work follows local codes and licensed practice.\n";
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
      std::string case_file, output, formulation;
      int degree = 0;
      bool fields = true, plot = true, quiet = false;
      for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string& a = args[i];
        auto value = [&](const char* option) -> std::string {
          if (i + 1 >= args.size())
            throw std::invalid_argument(std::string("option ") + option +
                                        " needs a value");
          return args[++i];
        };
        if (a == "--help" || a == "-h") {
          if (rank == 0)
            print_run_help(std::cout);
          return ok;
        } else if (a == "--output") {
          output = value("--output");
        } else if (a == "--formulation") {
          formulation = value("--formulation");
          if (formulation != "energy" && formulation != "capacity")
            throw std::invalid_argument("--formulation \"" + formulation +
                                        "\": expected energy or capacity");
        } else if (a == "--degree") {
          const std::string v = value("--degree");
          if (v != "1" && v != "2" && v != "3")
            throw std::invalid_argument("--degree \"" + v + "\": expected 1, 2 or 3");
          degree = std::stoi(v);
        } else if (a == "--no-fields") {
          fields = false;
        } else if (a == "--no-plot") {
          plot = false;
        } else if (a == "--quiet") {
          quiet = true;
        } else if (!a.empty() && a[0] == '-') {
          throw std::invalid_argument("unknown option '" + a +
                                      "' (see quantacal run --help)");
        } else if (case_file.empty()) {
          case_file = a;
        } else {
          throw std::invalid_argument("one case file expected, got also '" + a + "'");
        }
      }
      if (case_file.empty()) {
        if (rank == 0)
          print_run_help(std::cerr);
        return invalid_input;
      }
      fe::CaseDescription description = fe::load_case(case_file);
      if (!output.empty())
        description.output.folder =
            std::filesystem::absolute(output).lexically_normal().string();
      if (!formulation.empty())
        description.solver.formulation =
            formulation == "energy" ? fe::Formulation::energy : fe::Formulation::capacity;
      if (degree > 0)
        description.solver.degree = static_cast<unsigned int>(degree);
      if (!fields)
        description.output.fields = false;
      if (!plot)
        description.output.plot = false;
      fe::RunOptions options;
      options.communicator = MPI_COMM_WORLD;
      options.log = quiet ? nullptr : &std::cout;
      fe::run_case(description, options);
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
