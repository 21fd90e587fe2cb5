// SPDX-License-Identifier: Apache-2.0
// Field files: VTU pieces, PVTU records, the PVD time series (see field_output.h).
#include "field_output.h"

#include "result_files.h"
#include "wall_clock.h"

#include <deal.II/base/utilities.h>
#include <deal.II/lac/vector.h>
#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <filesystem>
#include <limits>
#include <sstream>

namespace quantacal::solver::detail {
namespace {

using namespace dealii;
namespace fs = std::filesystem;

/// Heat flux -k grad T, W/m^2 (NaN where the material cannot be evaluated).
template <int dim>
class HeatFluxOutput : public DataPostprocessorVector<dim> {
public:
  explicit HeatFluxOutput(const fe::MaterialField<dim>& field)
      : DataPostprocessorVector<dim>("heat_flux", update_values | update_gradients),
        field_(field) {}
  void
  evaluate_scalar_field(const DataPostprocessorInputs::Scalar<dim>& inputs,
                        std::vector<dealii::Vector<double>>& computed) const override {
    const auto cell = inputs.template get_cell<dim>();
    for (unsigned int q = 0; q < inputs.solution_values.size(); ++q) {
      double k = 0.0;
      try {
        k = field_.conductivity(cell->material_id(), inputs.solution_values[q]);
      } catch (const std::exception&) {
        k = std::numeric_limits<double>::quiet_NaN();
      }
      for (unsigned int d = 0; d < dim; ++d)
        computed[q](d) = -k * inputs.solution_gradients[q][d];
    }
  }

private:
  const fe::MaterialField<dim>& field_;
};

} // namespace

template <int dim>
FieldWriter<dim>::FieldWriter(const CaseDescription& description,
                              const Discretization<dim>& discretization,
                              const fe::MaterialField<dim>& field, bool enabled)
    : folder_(description.output.folder), discretization_(discretization), field_(field),
      enabled_(enabled) {}

template <int dim>
void FieldWriter<dim>::write(const Vector& temperature, double time, RunResult& result) {
  if (!enabled_)
    return;
  const auto start = Clock::now();
  DataOut<dim> out;
  out.attach_dof_handler(discretization_.dof_handler);
  out.add_data_vector(temperature, "temperature");
  HeatFluxOutput<dim> flux(field_);
  out.add_data_vector(temperature, flux);
  dealii::Vector<float> material(discretization_.triangulation.n_active_cells()),
      ranks(discretization_.triangulation.n_active_cells());
  for (const auto& cell : discretization_.triangulation.active_cell_iterators())
    if (cell->is_locally_owned()) {
      material(cell->active_cell_index()) = cell->material_id();
      ranks(cell->active_cell_index()) = static_cast<float>(discretization_.rank);
    }
  out.add_data_vector(material, "material_id");
  out.add_data_vector(ranks, "mpi_rank");
  out.build_patches(discretization_.mapping, discretization_.fe.degree,
                    DataOut<dim>::curved_inner_cells);

  const std::string stem = "fields-" + Utilities::int_to_string(counter_, 4);
  const std::string piece =
      stem + "." + Utilities::int_to_string(discretization_.rank, 4) + ".vtu";
  {
    std::ostringstream vtu;
    out.write_vtu(vtu);
    write_file_atomically((fs::path(folder_) / piece).string(), vtu.str());
  }
  MPI_Barrier(discretization_.communicator);
  if (discretization_.rank == 0) {
    std::vector<std::string> pieces;
    for (unsigned int r = 0; r < discretization_.n_ranks; ++r)
      pieces.push_back(stem + "." + Utilities::int_to_string(r, 4) + ".vtu");
    std::ostringstream pvtu;
    out.write_pvtu_record(pvtu, pieces);
    write_file_atomically((fs::path(folder_) / (stem + ".pvtu")).string(), pvtu.str());
    series_.emplace_back(time, stem + ".pvtu");
    std::ostringstream pvd;
    DataOutBase::write_pvd_record(pvd, series_);
    write_file_atomically((fs::path(folder_) / "fields.pvd").string(), pvd.str());
    if (counter_ == 0)
      result.written_files.push_back((fs::path(folder_) / "fields.pvd").string());
    result.written_files.push_back((fs::path(folder_) / (stem + ".pvtu")).string());
  }
  ++counter_;
  result.timings.output += seconds_since(start);
}

template class FieldWriter<2>;
template class FieldWriter<3>;

} // namespace quantacal::solver::detail
