// SPDX-License-Identifier: Apache-2.0
// The transient heat-conduction engine behind `quantacal run`.
//
// Equation (energy form): d E(T)/dt = div(k(T) grad T) + q, E = rho e(T) per
// reference volume. Weak residual per test function phi_i, with w = 1 (planar,
// solid) or w = 2 pi r (axisymmetric):
//
//   M_i(T) = int w phi_i E(T)
//   F_i(T) = - int w k(T) grad T . grad phi_i + int_Gamma w q_b(T) phi_i + int w q phi_i
//
// TR-BDF2 (Bank et al., IEEE Trans. Electron Devices 32 (1985) 1992;
// Hosea and Shampine, Appl. Numer. Math. 20 (1996) 21), gamma = 2 - sqrt 2:
//
//   stage 1 (trapezoid to t_n + gamma h):  M(T_g) - M(T_n) = (gamma h / 2) (F(T_g) +
//   F(T_n)) stage 2 (BDF2 to t_n + h):             M(T_1) - a M(T_g) + b M(T_n) = c h
//   F(T_1) a = 1 / (gamma (2 - gamma)), b = (1 - gamma)^2 / (gamma (2 - gamma)), c = (1 -
//   gamma) / (2 - gamma)
//
// Because a - b = 1 and sum_i phi_i = 1, summing the rows gives the exact
// ledger  E_1 - E_n = h [w1 (Q_n + Q_g) + c Q_1] + (residuals) with w1 = a gamma / 2,
// so the stored energy and the boundary heat accumulated with these weights
// balance to the Newton tolerance. Heat through fixed-temperature boundaries
// is the reaction: the residual rows of the constrained degrees of freedom.
//
// Each stage is solved by Newton's method with the consistent Jacobian
// (capacity, dk/dT and boundary derivatives; not symmetric, hence GMRES with
// Trilinos ML AMG), with backtracking when the residual grows.
#include "report.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/index_set.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/utilities.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/grid_in.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>
#include <deal.II/grid/tria.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/solver_gmres.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/lac/trilinos_precondition.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>
#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <iostream>
#include <limits>
#include <map>
#include <set>
#include <sstream>
#include <unistd.h>

namespace quantacal::fe {

namespace {

using namespace dealii;
namespace fs = std::filesystem;

/// Stefan-Boltzmann constant, W/m^2/K^4 (CODATA 2018, exact from h, k and c).
constexpr double stefan_boltzmann = 5.670374419e-8;
/// TR-BDF2 constants (gamma = 2 - sqrt 2 makes both stages share one Jacobian shape).
const double tr_gamma = 2.0 - std::sqrt(2.0);
const double tr_a = 1.0 / (tr_gamma * (2.0 - tr_gamma));
const double tr_b = (1.0 - tr_gamma) * (1.0 - tr_gamma) / (tr_gamma * (2.0 - tr_gamma));
const double tr_c = (1.0 - tr_gamma) / (2.0 - tr_gamma);
const double tr_w1 = tr_a * tr_gamma / 2.0;

using Clock = std::chrono::steady_clock;
double seconds_since(Clock::time_point t0) {
  return std::chrono::duration<double>(Clock::now() - t0).count();
}

std::string ids_text(const std::set<unsigned int>& ids) {
  std::string s;
  for (const unsigned int id : ids)
    s += (s.empty() ? "" : ", ") + std::to_string(id);
  return s.empty() ? "none" : s;
}

CardError case_error(const CaseDescription& d, const CaseLocation& w,
                     const std::string& field, const std::string& expected) {
  return CardError(d.file, w.line, w.column, w.field.empty() ? field : w.field, w.value,
                   "expected " + expected);
}

/// A failure inside a stage solve; the step is rejected and retried smaller.
struct StageFailure {
  std::string reason;
};

/// Heat flux -k grad T, W/m^2, for the field output.
template <int dim>
class HeatFluxOutput : public DataPostprocessorVector<dim> {
public:
  explicit HeatFluxOutput(const MaterialField<dim>& field)
      : DataPostprocessorVector<dim>("heat_flux", update_values | update_gradients),
        field_(field) {}
  void evaluate_scalar_field(const DataPostprocessorInputs::Scalar<dim>& inputs,
                             std::vector<Vector<double>>& computed) const override {
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
  const MaterialField<dim>& field_;
};

template <int dim>
class HeatEngine {
public:
  HeatEngine(const CaseDescription& d, const RunOptions& o);
  RunResult run();

private:
  using Vec = TrilinosWrappers::MPI::Vector;

  /// Sums returned by one assembly (global, over all ranks).
  struct Totals {
    double stored = 0.0;   ///< int w E(T), J
    double boundary = 0.0; ///< int_Gamma w q_b(T), W (natural boundaries only)
    double source = 0.0;   ///< int w q, W
    double shift = 0.0;    ///< int w E_shift, J (constant: the subtracted reference)
  };

  // setup
  void make_mesh();
  void check_ids();
  void setup_system();
  void set_initial_temperature();
  void locate_probes();

  // numerics
  Totals assemble(const Vec& T_ghost, double time, double beta_h,
                  const Vec* capacity_reference, bool with_matrix);
  double boundary_temperature(std::size_t b, double time) const;
  void apply_dirichlet(Vec& T, double time) const;
  Totals solve_stage(Vec& T, double time, double beta_h, const Vec& known,
                     const Vec* capacity_reference, Vec& energy_vec, Vec& flux_vec,
                     double& reaction);
  double reaction_sum(const Vec& residual) const;

  // output
  std::vector<double> probe_values(const Vec& T_ghost) const;
  void write_fields(const Vec& T_ghost, double time);
  void write_tables(bool final_write);
  void log_line(const std::string& s) const;
  void progress(double t, double h, bool force);

  const CaseDescription& d_;
  const RunOptions& opt_;
  MPI_Comm comm_;
  unsigned int rank_ = 0;
  unsigned int n_ranks_ = 1;
  bool write_ = true;

  parallel::distributed::Triangulation<dim> tria_;
  FE_Q<dim> fe_;
  MappingQ<dim> mapping_;
  DoFHandler<dim> dof_;
  QGauss<dim> cell_quad_;
  std::unique_ptr<Quadrature<dim>> mass_quad_; ///< nodal (Gauss-Lobatto) or Gauss
  QGauss<dim - 1> face_quad_;
  IndexSet owned_, relevant_;
  AffineConstraints<double> constraints_;
  std::vector<std::pair<types::global_dof_index, std::size_t>> dirichlet_dofs_; // owned
  std::vector<std::size_t> fixed_boundaries_; // index into d_.boundaries
  std::map<types::boundary_id, std::size_t> natural_boundaries_;
  MaterialField<dim> field_;
  std::map<types::material_id, double> initial_by_id_;
  /// E(T_initial) per material, J/m^3: subtracted inside the residual so that the
  /// assembled energies are small differences (less round-off); added back in the ledger.
  std::map<types::material_id, double> energy_shift_;
  double shift_total_ = 0.0; ///< sum over materials of shift * volume (w-weighted), J

  TrilinosWrappers::SparseMatrix matrix_;
  Vec mass_vec_, flux_vec_; // assembled by assemble()
  Vec raw_mass_vec_;        // int w phi_i |E| without the shift: the round-off scale

  struct ProbeSite {
    bool mine = false;
    typename DoFHandler<dim>::active_cell_iterator cell;
    Point<dim> unit;
  };
  std::vector<ProbeSite> sites_;

  RunResult result_;
  Clock::time_point start_;
  double last_progress_ = -1.0;
  std::vector<std::pair<double, std::string>> pvd_;
  unsigned int field_counter_ = 0;
  bool terminal_ = false;
};

template <int dim>
HeatEngine<dim>::HeatEngine(const CaseDescription& d, const RunOptions& o)
    : d_(d), opt_(o), comm_(o.communicator),
      tria_(o.communicator, typename Triangulation<dim>::MeshSmoothing(
                                Triangulation<dim>::smoothing_on_refinement |
                                Triangulation<dim>::smoothing_on_coarsening)),
      fe_(d.solver.degree), mapping_(d.solver.degree), dof_(tria_),
      cell_quad_(d.solver.degree + 1), face_quad_(d.solver.degree + 1) {
  mass_quad_ = std::make_unique<QGauss<dim>>(d.solver.degree + 1);
  rank_ = Utilities::MPI::this_mpi_process(comm_);
  n_ranks_ = Utilities::MPI::n_mpi_processes(comm_);
  write_ = o.write_output;
  if (o.log && o.progress && rank_ == 0) {
    if (o.log == &std::cout)
      terminal_ = isatty(STDOUT_FILENO);
    else if (o.log == &std::cerr)
      terminal_ = isatty(STDERR_FILENO);
  }
}

template <int dim>
void HeatEngine<dim>::log_line(const std::string& s) const {
  if (opt_.log && rank_ == 0) {
    if (terminal_ && last_progress_ >= 0)
      *opt_.log << "\r\033[K";
    *opt_.log << s << '\n' << std::flush;
  }
}

// ---- mesh -------------------------------------------------------------------------

template <int dim>
void HeatEngine<dim>::make_mesh() {
  const MeshSpec& m = d_.mesh;
  auto auto_cells = [](const std::vector<double>& size) {
    const double smallest = *std::min_element(size.begin(), size.end());
    std::vector<unsigned int> reps;
    for (const double s : size)
      reps.push_back(std::max(
          1u, std::min(64u, static_cast<unsigned int>(std::lround(s / smallest)))));
    return reps;
  };
  if (m.kind == MeshSpec::Kind::gmsh) {
    if (!fs::exists(m.file))
      throw case_error(d_, m.where, "mesh.file",
                       "an existing Gmsh .msh file (not found: " + m.file + ")");
    GridIn<dim> in;
    in.attach_triangulation(tria_);
    std::ifstream f(m.file);
    if (!f)
      throw case_error(d_, m.where, "mesh.file",
                       "a readable Gmsh .msh file (" + m.file + ")");
    try {
      in.read_msh(f);
    } catch (const std::exception& e) {
      std::string what = e.what();
      const auto pos = what.find("The violated condition");
      if (what.size() > 600)
        what = what.substr(0, 600);
      (void)pos;
      throw case_error(d_, m.where, "mesh.file",
                       "a " + std::to_string(dim) +
                           "D Gmsh .msh mesh that deal.II can read (" + m.file +
                           "): " + what);
    }
  } else if (m.kind == MeshSpec::Kind::plate || m.kind == MeshSpec::Kind::block) {
    Point<dim> p0, p1;
    for (int i = 0; i < dim; ++i) {
      const double origin = i < static_cast<int>(m.origin.size()) ? m.origin[i] : 0.0;
      p0[i] = origin;
      p1[i] = origin + m.size[i];
    }
    std::vector<unsigned int> reps = m.cells.empty() ? auto_cells(m.size) : m.cells;
    GridGenerator::subdivided_hyper_rectangle(tria_, reps, p0, p1, /*colorize=*/true);
  } else { // cylinder
    if constexpr (dim == 2) {
      std::vector<unsigned int> reps =
          m.cells.empty() ? auto_cells({m.radius, m.length}) : m.cells;
      GridGenerator::subdivided_hyper_rectangle(tria_, reps, Point<2>(0, 0),
                                                Point<2>(m.radius, m.length), true);
      // deal.II colours 0: r = 0, 1: r = R, 2: z = 0, 3: z = L -> ours (solver.h)
      const std::map<types::boundary_id, types::boundary_id> renumber{
          {0, 3}, {1, 0}, {2, 1}, {3, 2}};
      for (const auto& cell : tria_.active_cell_iterators())
        for (const auto& face : cell->face_iterators())
          if (face->at_boundary())
            face->set_boundary_id(renumber.at(face->boundary_id()));
    } else {
      Triangulation<3> serial;
      const unsigned int axial =
          m.cells.empty()
              ? std::max(1u, static_cast<unsigned int>(std::lround(m.length / m.radius)))
              : m.cells[0];
      GridGenerator::subdivided_cylinder(serial, axial, m.radius, m.length / 2);
      // axis x -> z (cyclic permutation, orientation preserved), end x = -L/2 -> z = 0
      const double half = m.length / 2;
      GridTools::transform(
          [half](const Point<3>& p) { return Point<3>(p[1], p[2], p[0] + half); },
          serial);
      serial.set_all_manifold_ids(numbers::flat_manifold_id);
      serial.set_all_manifold_ids_on_boundary(0, 0);
      tria_.copy_triangulation(serial);
      tria_.set_all_manifold_ids(numbers::flat_manifold_id);
      tria_.set_all_manifold_ids_on_boundary(0, 0);
      tria_.set_manifold(0, CylindricalManifold<3>(2));
    }
  }
  if (m.kind != MeshSpec::Kind::gmsh)
    for (const auto& cell : tria_.active_cell_iterators())
      cell->set_material_id(static_cast<types::material_id>(m.material_id));
  tria_.refine_global(m.refinements);
  if (m.kind != MeshSpec::Kind::gmsh && !m.regions.empty()) {
    for (const auto& cell : tria_.active_cell_iterators()) {
      if (cell->is_artificial())
        continue;
      const Point<dim> c = cell->center();
      for (const auto& reg : m.regions) {
        bool inside = true;
        for (int i = 0; i < dim; ++i)
          inside = inside && c[i] >= reg.lower[i] && c[i] <= reg.upper[i];
        if (inside)
          cell->set_material_id(static_cast<types::material_id>(reg.material_id));
      }
    }
  }
  if (d_.geometry == Geometry::axisymmetric) {
    double rmin = std::numeric_limits<double>::infinity();
    for (const auto& cell : tria_.active_cell_iterators())
      if (cell->is_locally_owned())
        for (const unsigned int v : cell->vertex_indices())
          rmin = std::min(rmin, cell->vertex(v)[0]);
    rmin = Utilities::MPI::min(rmin, comm_);
    if (rmin < -1e-12)
      throw case_error(d_, m.where, "mesh",
                       "an axisymmetric mesh with x = r >= 0 everywhere (found r = " +
                           format_double(rmin) + " m)");
  }
}

template <int dim>
void HeatEngine<dim>::check_ids() {
  std::set<unsigned int> mids, bids;
  for (const auto& cell : tria_.active_cell_iterators())
    if (cell->is_locally_owned()) {
      mids.insert(cell->material_id());
      for (const auto& face : cell->face_iterators())
        if (face->at_boundary())
          bids.insert(face->boundary_id());
    }
  mids = Utilities::MPI::compute_set_union(mids, comm_);
  bids = Utilities::MPI::compute_set_union(bids, comm_);

  std::map<types::material_id, MaterialPtr> mats;
  std::set<unsigned int> carded;
  for (const auto& ms : d_.materials) {
    carded.insert(ms.id);
    if (!mids.count(ms.id)) {
      log_line("note: materials: id " + std::to_string(ms.id) +
               " is not in the mesh (mesh material ids: " + ids_text(mids) + ")");
      continue;
    }
    MaterialPtr mat = ms.material;
    if (!mat) {
      if (ms.card.empty() || !fs::exists(ms.card))
        throw case_error(d_, ms.where, "materials",
                         "an existing material card (not found: " + ms.card + ")");
      mat = load_card(ms.card);
    }
    mats[static_cast<types::material_id>(ms.id)] = mat;
    initial_by_id_[static_cast<types::material_id>(ms.id)] =
        ms.initial_temperature ? *ms.initial_temperature : d_.initial_temperature;
  }
  for (const unsigned int id : mids)
    if (!carded.count(id)) {
      CaseLocation w = d_.materials.empty() ? CaseLocation{} : d_.materials.front().where;
      throw CardError(d_.file, w.line, w.column, "materials", std::to_string(id),
                      "expected a card for every material id of the mesh: id " +
                          std::to_string(id) +
                          " has none (mesh material ids: " + ids_text(mids) +
                          "; cards given for: " + ids_text(carded) + ")");
    }
  for (const auto& [id, mat] : mats) {
    const double t0 = initial_by_id_[id];
    if (t0 < mat->lower_temperature() || t0 > mat->upper_temperature())
      throw case_error(d_, d_.initial_where, "initial_temperature",
                       "an initial temperature inside the valid range of " + mat->name() +
                           " (" + format_double(mat->lower_temperature()) + " K to " +
                           format_double(mat->upper_temperature()) + " K), got " +
                           format_double(t0) + " K");
  }
  field_ = MaterialField<dim>(mats);
  for (const auto& [id, mat] : mats)
    energy_shift_[id] = field_.energy(id, initial_by_id_[id]);

  for (std::size_t b = 0; b < d_.boundaries.size(); ++b) {
    const BoundarySpec& bs = d_.boundaries[b];
    if (!bids.count(bs.boundary_id))
      throw CardError(d_.file, bs.where.line, bs.where.column,
                      bs.where.field.empty() ? "boundaries" : bs.where.field,
                      std::to_string(bs.boundary_id),
                      "expected a boundary id of the mesh (the mesh has boundary ids: " +
                          ids_text(bids) + ")");
    if (d_.geometry == Geometry::axisymmetric &&
        d_.mesh.kind == MeshSpec::Kind::cylinder && bs.boundary_id == 3 &&
        (bs.temperature || bs.convection || bs.radiation))
      throw CardError(
          d_.file, bs.where.line, bs.where.column, bs.where.field, "3",
          "expected no condition on the axis r = 0 (boundary id 3 is always insulated)");
    if (bs.temperature)
      fixed_boundaries_.push_back(b);
    else if (bs.convection || bs.radiation)
      natural_boundaries_[static_cast<types::boundary_id>(bs.boundary_id)] = b;
  }
  std::set<unsigned int> given;
  for (const auto& bs : d_.boundaries)
    given.insert(bs.boundary_id);
  std::set<unsigned int> open;
  for (const unsigned int id : bids)
    if (!given.count(id))
      open.insert(id);
  if (!open.empty())
    log_line("note: boundary ids without a condition are insulated: " + ids_text(open));
}

template <int dim>
void HeatEngine<dim>::setup_system() {
  dof_.distribute_dofs(fe_);
  owned_ = dof_.locally_owned_dofs();
  DoFTools::extract_locally_relevant_dofs(dof_, relevant_);

  constraints_.clear();
  constraints_.reinit(relevant_);
  DoFTools::make_hanging_node_constraints(dof_, constraints_);
  std::set<types::boundary_id> fixed_ids;
  for (const std::size_t b : fixed_boundaries_)
    fixed_ids.insert(static_cast<types::boundary_id>(d_.boundaries[b].boundary_id));
  dirichlet_dofs_.clear();
  if (!fixed_ids.empty()) {
    std::vector<types::global_dof_index> face_dofs(fe_.n_dofs_per_face());
    std::map<types::global_dof_index, std::size_t> which;
    for (const auto& cell : dof_.active_cell_iterators()) {
      if (cell->is_artificial())
        continue;
      for (const auto& face : cell->face_iterators())
        if (face->at_boundary() && fixed_ids.count(face->boundary_id())) {
          face->get_dof_indices(face_dofs);
          std::size_t b = 0;
          for (const std::size_t fb : fixed_boundaries_)
            if (d_.boundaries[fb].boundary_id == face->boundary_id())
              b = fb;
          for (const auto i : face_dofs) {
            if (!constraints_.is_constrained(i))
              constraints_.add_line(i);
            if (owned_.is_element(i))
              which[i] = b;
          }
        }
    }
    dirichlet_dofs_.assign(which.begin(), which.end());
  }
  constraints_.close();

  DynamicSparsityPattern dsp(relevant_);
  DoFTools::make_sparsity_pattern(dof_, dsp, constraints_, false);
  SparsityTools::distribute_sparsity_pattern(dsp, owned_, comm_, relevant_);
  matrix_.reinit(owned_, owned_, dsp, comm_);
  mass_vec_.reinit(owned_, comm_);
  raw_mass_vec_.reinit(owned_, comm_);
  flux_vec_.reinit(owned_, comm_);
}

template <int dim>
double HeatEngine<dim>::boundary_temperature(std::size_t b, double time) const {
  return d_.boundaries[b].temperature->value(time);
}

template <int dim>
void HeatEngine<dim>::apply_dirichlet(Vec& T, double time) const {
  for (const auto& [i, b] : dirichlet_dofs_)
    T[i] = boundary_temperature(b, time);
  T.compress(VectorOperation::insert);
}

template <int dim>
void HeatEngine<dim>::set_initial_temperature() {
  // Each node takes the initial temperature of the lowest material id among its cells.
  std::map<types::global_dof_index, std::pair<types::material_id, double>> value;
  std::vector<types::global_dof_index> dofs(fe_.n_dofs_per_cell());
  for (const auto& cell : dof_.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    cell->get_dof_indices(dofs);
    const auto id = cell->material_id();
    const auto it = initial_by_id_.find(id);
    const double t0 = it == initial_by_id_.end() ? d_.initial_temperature : it->second;
    for (const auto i : dofs) {
      if (!owned_.is_element(i))
        continue;
      auto v = value.find(i);
      if (v == value.end() || id < v->second.first)
        value[i] = {id, t0};
    }
  }
  Vec T(owned_, comm_);
  for (const auto& [i, v] : value)
    T[i] = v.second;
  T.compress(VectorOperation::insert);
  mass_vec_ = T; // reused below as storage of the initial field
}

template <int dim>
void HeatEngine<dim>::locate_probes() {
  const auto& probes = d_.output.probes;
  sites_.assign(probes.size(), ProbeSite{});
  for (std::size_t p = 0; p < probes.size(); ++p) {
    Point<dim> x;
    for (int i = 0; i < dim; ++i)
      x[i] = probes[p].point[i];
    bool found = false;
    for (const auto& cell : dof_.active_cell_iterators()) {
      if (!cell->is_locally_owned())
        continue;
      // cheap bounding-box test first
      const BoundingBox<dim> box = cell->bounding_box();
      bool near = true;
      for (int i = 0; i < dim; ++i) {
        const double pad = 1e-9 * (box.get_boundary_points().second[i] -
                                   box.get_boundary_points().first[i]) +
                           1e-14;
        near = near && x[i] >= box.get_boundary_points().first[i] - pad &&
               x[i] <= box.get_boundary_points().second[i] + pad;
      }
      if (!near)
        continue;
      try {
        const Point<dim> u = mapping_.transform_real_to_unit_cell(cell, x);
        if (GeometryInfo<dim>::is_inside_unit_cell(u, 1e-9)) {
          sites_[p].cell = cell;
          sites_[p].unit = GeometryInfo<dim>::project_to_unit_cell(u);
          found = true;
          break;
        }
      } catch (const typename Mapping<dim>::ExcTransformationFailed&) {
      }
    }
    const unsigned int owner = Utilities::MPI::min(found ? rank_ : n_ranks_, comm_);
    if (owner == n_ranks_) {
      std::string pt;
      for (int i = 0; i < dim; ++i)
        pt += (i ? ", " : "") + format_double(x[i]) + " m";
      throw case_error(d_, probes[p].where, "output.probes",
                       "a probe point inside the mesh (" + probes[p].name + " at (" + pt +
                           ") is outside)");
    }
    sites_[p].mine = owner == rank_;
  }
}

// ---- assembly ---------------------------------------------------------------------

template <int dim>
typename HeatEngine<dim>::Totals
HeatEngine<dim>::assemble(const Vec& T_ghost, double time, double beta_h,
                          const Vec* capacity_reference, bool with_matrix) {
  const bool axisym = d_.geometry == Geometry::axisymmetric;
  const bool capacity_form = d_.solver.formulation == Formulation::capacity;
  FEValues<dim> fv(mapping_, fe_, cell_quad_,
                   update_values | update_gradients | update_quadrature_points |
                       update_JxW_values);
  FEFaceValues<dim> ffv(mapping_, fe_, face_quad_,
                        update_values | update_quadrature_points | update_JxW_values);
  const unsigned int n = fe_.n_dofs_per_cell();
  const unsigned int nq = cell_quad_.size();
  const bool lumped = d_.solver.mass == SolverSpec::Mass::lumped ||
                      (d_.solver.mass == SolverSpec::Mass::automatic && fe_.degree == 1);
  FEValues<dim> fvm(mapping_, fe_, *mass_quad_,
                    update_values | update_quadrature_points | update_JxW_values);
  // lumped: one "point" per node (its temperature, weight int w phi_i); else the Gauss
  // points
  const unsigned int nqm = lumped ? n : mass_quad_->size();
  std::vector<double> Tm(nqm), Tmref(nqm), lump(n);
  Vector<double> local_values(n);
  PointProperties props_m;
  const unsigned int nfq = face_quad_.size();
  FullMatrix<double> cell_matrix(n, n);
  Vector<double> cell_mass(n), cell_flux(n), cell_raw(n);
  std::vector<types::global_dof_index> dofs(n);
  std::vector<double> T(nq), Tref(nq), Tf(nfq);
  std::vector<Tensor<1, dim>> gradT(nq);
  PointProperties props;

  if (with_matrix)
    matrix_ = 0;
  mass_vec_ = 0;
  raw_mass_vec_ = 0;
  flux_vec_ = 0;
  Totals local;
  bool failed = false;
  std::string message;
  double material_seconds = 0.0; // this rank's time inside MaterialField::evaluate

  for (const auto& cell : dof_.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    const types::material_id cell_material = cell->material_id();
    fv.reinit(cell);
    fv.get_function_values(T_ghost, T);
    fv.get_function_gradients(T_ghost, gradT);
    if (lumped) {
      cell->get_dof_values(T_ghost, local_values);
      for (unsigned int i = 0; i < n; ++i)
        Tm[i] = local_values(i);
    } else {
      fvm.reinit(cell);
      fvm.get_function_values(T_ghost, Tm);
    }
    if (capacity_form && capacity_reference) {
      if (lumped) {
        cell->get_dof_values(*capacity_reference, local_values);
        for (unsigned int i = 0; i < n; ++i)
          Tmref[i] = local_values(i);
      } else {
        fvm.get_function_values(*capacity_reference, Tmref);
      }
    }
    try {
      for (unsigned int q = 0; q < nq; ++q)
        if (!(T[q] > 0.0) || !std::isfinite(T[q]))
          throw RangeError("quantacal::fe::run_case", "temperature field",
                           "a positive, finite temperature", T[q]);
      for (unsigned int q = 0; q < nqm; ++q)
        if (!(Tm[q] > 0.0) || !std::isfinite(Tm[q]))
          throw RangeError("quantacal::fe::run_case", "temperature field",
                           "a positive, finite temperature", Tm[q]);
      const auto t_mat = Clock::now();
      // each point set gets only what the assembly below reads from it: E, dE/dT and
      // d^2E/dT^2 at the mass points, k and dk/dT at the Gauss points
      field_.evaluate(cell_material, Tm, props_m, PropertySet::thermal);
      field_.evaluate(cell_material, T, props, PropertySet::conductivity);
      material_seconds += seconds_since(t_mat);
    } catch (const std::exception& e) {
      if (!failed)
        message = e.what();
      failed = true;
      continue;
    }
    const double shift =
        energy_shift_.count(cell_material) ? energy_shift_.at(cell_material) : 0.0;
    double q_src = 0.0;
    for (const auto& s : d_.sources)
      if (time >= s.start && time < s.end &&
          (s.material_ids.empty() ||
           std::find(s.material_ids.begin(), s.material_ids.end(), cell_material) !=
               s.material_ids.end()))
        q_src += s.power_density;

    cell_matrix = 0;
    cell_mass = 0;
    cell_raw = 0;
    cell_flux = 0;
    // stored-energy term. Lumped (default): M_i = m_i E(T_i) with m_i = int w phi_i, the
    // row sum of the w-weighted mass matrix (positive also on the axis r = 0, where a
    // nodal quadrature would give zero weight). Consistent: int w phi_i E(T_h) on Gauss
    // points.
    if (lumped) {
      for (unsigned int i = 0; i < n; ++i) {
        lump[i] = 0.0;
        for (unsigned int q = 0; q < nq; ++q)
          lump[i] += fv.shape_value(i, q) * fv.JxW(q) *
                     (axisym ? 2.0 * M_PI * fv.quadrature_point(q)[0] : 1.0);
      }
      for (unsigned int i = 0; i < n; ++i) {
        const double w = lump[i];
        const double E = props_m.energy[i] - shift, C = props_m.capacity[i],
                     dC = props_m.capacity_derivative[i];
        local.stored += E * w;
        local.shift += shift * w;
        cell_mass(i) += (capacity_form ? C * (Tm[i] - Tmref[i]) : E) * w;
        cell_raw(i) += std::abs(props_m.energy[i]) * w;
        if (with_matrix)
          cell_matrix(i, i) += (capacity_form ? C + dC * (Tm[i] - Tmref[i]) : C) * w;
      }
    } else {
      fvm.reinit(cell);
      for (unsigned int q = 0; q < nqm; ++q) {
        const double w =
            fvm.JxW(q) * (axisym ? 2.0 * M_PI * fvm.quadrature_point(q)[0] : 1.0);
        const double E = props_m.energy[q] - shift, C = props_m.capacity[q],
                     dC = props_m.capacity_derivative[q];
        local.stored += E * w;
        local.shift += shift * w;
        const double m_val = capacity_form ? C * (Tm[q] - Tmref[q]) : E;
        const double m_der = capacity_form ? C + dC * (Tm[q] - Tmref[q]) : C;
        for (unsigned int i = 0; i < n; ++i) {
          const double phi_i = fvm.shape_value(i, q);
          cell_mass(i) += phi_i * m_val * w;
          cell_raw(i) += phi_i * std::abs(props_m.energy[q]) * w;
          if (with_matrix)
            for (unsigned int j = 0; j < n; ++j)
              cell_matrix(i, j) += phi_i * m_der * fvm.shape_value(j, q) * w;
        }
      }
    }
    // conduction and sources on the Gauss quadrature
    for (unsigned int q = 0; q < nq; ++q) {
      const double w =
          fv.JxW(q) * (axisym ? 2.0 * M_PI * fv.quadrature_point(q)[0] : 1.0);
      const double k = props.conductivity[q], dk = props.conductivity_derivative[q];
      local.source += q_src * w;
      for (unsigned int i = 0; i < n; ++i) {
        const double phi_i = fv.shape_value(i, q);
        const Tensor<1, dim> grad_i = fv.shape_grad(i, q);
        cell_flux(i) += (-k * (gradT[q] * grad_i) + q_src * phi_i) * w;
        if (with_matrix) {
          const double gTi = gradT[q] * grad_i;
          for (unsigned int j = 0; j < n; ++j)
            cell_matrix(i, j) +=
                beta_h *
                (k * (grad_i * fv.shape_grad(j, q)) + dk * fv.shape_value(j, q) * gTi) *
                w;
        }
      }
    }
    // natural boundaries: convection and radiation
    for (const unsigned int f : cell->face_indices()) {
      if (!cell->at_boundary(f))
        continue;
      const auto it = natural_boundaries_.find(cell->face(f)->boundary_id());
      if (it == natural_boundaries_.end())
        continue;
      const BoundarySpec& bs = d_.boundaries[it->second];
      ffv.reinit(cell, f);
      ffv.get_function_values(T_ghost, Tf);
      for (unsigned int q = 0; q < nfq; ++q) {
        const double w =
            ffv.JxW(q) * (axisym ? 2.0 * M_PI * ffv.quadrature_point(q)[0] : 1.0);
        const double Ts = Tf[q];
        double flux = 0.0, dflux = 0.0; // into the body, W/m^2 and W/m^2/K
        if (bs.convection) {
          const double h = bs.convection->coefficient.value(Ts);
          const double dh = bs.convection->coefficient.derivative(Ts);
          const double dT = bs.convection->ambient_temperature - Ts;
          flux += h * dT;
          dflux += dh * dT - h;
        }
        if (bs.radiation) {
          const double es = bs.radiation->emissivity * stefan_boltzmann;
          const double Ta = bs.radiation->ambient_temperature;
          flux += es * (Ta * Ta * Ta * Ta - Ts * Ts * Ts * Ts);
          dflux += -4.0 * es * Ts * Ts * Ts;
        }
        local.boundary += flux * w;
        for (unsigned int i = 0; i < n; ++i) {
          const double phi_i = ffv.shape_value(i, q);
          cell_flux(i) += flux * phi_i * w;
          if (with_matrix)
            for (unsigned int j = 0; j < n; ++j)
              cell_matrix(i, j) -= beta_h * dflux * phi_i * ffv.shape_value(j, q) * w;
        }
      }
    }
    cell->get_dof_indices(dofs);
    mass_vec_.add(dofs, cell_mass);
    raw_mass_vec_.add(dofs, cell_raw);
    flux_vec_.add(dofs, cell_flux);
    if (with_matrix)
      constraints_.distribute_local_to_global(cell_matrix, dofs, matrix_);
  }
  result_.timings.material_evaluation += material_seconds;
  mass_vec_.compress(VectorOperation::add);
  raw_mass_vec_.compress(VectorOperation::add);
  flux_vec_.compress(VectorOperation::add);
  if (with_matrix)
    matrix_.compress(VectorOperation::add);

  const int any_failed = Utilities::MPI::max(failed ? 1 : 0, comm_);
  if (any_failed) {
    const unsigned int who = Utilities::MPI::min(failed ? rank_ : n_ranks_, comm_);
    message = Utilities::MPI::broadcast(comm_, message, who);
    throw StageFailure{message};
  }
  Totals global;
  global.stored = Utilities::MPI::sum(local.stored, comm_);
  global.boundary = Utilities::MPI::sum(local.boundary, comm_);
  global.source = Utilities::MPI::sum(local.source, comm_);
  global.shift = Utilities::MPI::sum(local.shift, comm_);
  return global;
}

template <int dim>
double HeatEngine<dim>::reaction_sum(const Vec& residual) const {
  double s = 0.0;
  for (const auto& [i, b] : dirichlet_dofs_)
    s += residual[i];
  return Utilities::MPI::sum(s, comm_);
}

// Solves M(T) - known - beta_h F(T) = 0 for T (in: guess, out: solution).
// On return mass_vec_/flux_vec_ hold M(T), F(T); they are copied to energy_vec/flux_vec.
template <int dim>
typename HeatEngine<dim>::Totals
HeatEngine<dim>::solve_stage(Vec& T, double time, double beta_h, const Vec& known,
                             const Vec* capacity_reference, Vec& energy_vec,
                             Vec& flux_vec, double& reaction) {
  Vec T_ghost(owned_, relevant_, comm_);
  Vec ref_ghost;
  if (capacity_reference) {
    ref_ghost.reinit(owned_, relevant_, comm_);
    ref_ghost = *capacity_reference;
  }
  const Vec* ref = capacity_reference ? &ref_ghost : nullptr;
  apply_dirichlet(T, time);
  Vec residual(owned_, comm_), free_res(owned_, comm_), delta(owned_, comm_),
      trial(owned_, comm_);
  Vec scale_vec(owned_, comm_);

  double floor = 0.0;
  auto evaluate = [&](const Vec& Tv, bool with_matrix, double& norm, double& scale) {
    const auto t0 = Clock::now();
    T_ghost = Tv;
    const Totals tot = assemble(T_ghost, time, beta_h, ref, with_matrix);
    residual = mass_vec_;
    residual -= known;
    residual.add(-beta_h, flux_vec_);
    free_res = residual;
    for (const auto& [i, b] : dirichlet_dofs_)
      free_res[i] = 0.0;
    free_res.compress(VectorOperation::insert);
    norm = free_res.l2_norm();
    // scale: the energy change of this stage, plus a round-off floor
    scale_vec = mass_vec_;
    if (d_.solver.formulation == Formulation::energy)
      scale_vec -= energy_vec;
    scale = scale_vec.l2_norm();
    floor = 1e-14 * (mass_vec_.l2_norm() + raw_mass_vec_.l2_norm() +
                     beta_h * flux_vec_.l2_norm());
    result_.timings.assembly += seconds_since(t0);
    return tot;
  };

  double norm = 0.0, scale = 0.0;
  Totals tot = evaluate(T, true, norm, scale);
  const unsigned int max_it = d_.solver.max_newton_iterations;
  for (unsigned int it = 0;; ++it) {
    if (!std::isfinite(norm))
      throw StageFailure{"the residual is not finite (NaN or inf)"};
    const double target = d_.solver.newton_tolerance * scale + floor;
    if (norm <= target && it > 0)
      break;
    if (norm <= 1e-300)
      break;
    if (it >= max_it) {
      std::ostringstream s;
      s << "Newton did not converge in " << max_it << " iterations (residual " << norm
        << ", target " << target << ")";
      throw StageFailure{s.str()};
    }
    // J delta = -R
    const auto t_lin = Clock::now();
    Vec rhs(free_res);
    rhs *= -1.0;
    delta = 0;
    const double rhs_norm = norm;
    const double lin_tol = std::min(
        1e-4 * rhs_norm, std::max(d_.solver.linear_tolerance * rhs_norm, 0.1 * target));
    SolverControl control(2000, std::max(lin_tol, 1e-300));
    TrilinosWrappers::PreconditionAMG amg;
    TrilinosWrappers::PreconditionAMG::AdditionalData amg_data;
    amg_data.elliptic = true;
    amg_data.higher_order_elements = fe_.degree > 1;
    amg_data.smoother_sweeps = 2;
    amg_data.aggregation_threshold = 0.02;
    amg.initialize(matrix_, amg_data);
    SolverGMRES<Vec> gmres(control, SolverGMRES<Vec>::AdditionalData(60));
    try {
      gmres.solve(matrix_, delta, rhs, amg);
    } catch (const std::exception& e) {
      result_.steps.n_linear_iterations += control.last_step();
      result_.timings.linear_solve += seconds_since(t_lin);
      throw StageFailure{
          std::string("the linear solver failed: ") +
          (control.last_value() == control.last_value() ? "no convergence" : "NaN")};
    }
    result_.steps.n_linear_iterations += control.last_step();
    result_.timings.linear_solve += seconds_since(t_lin);
    for (const auto& [i, b] : dirichlet_dofs_)
      delta[i] = 0.0;
    delta.compress(VectorOperation::insert);
    ++result_.steps.n_newton_iterations;
    // an update at the round-off level of the temperatures: nothing more to gain
    const bool roundoff_update = delta.linfty_norm() <= 1e-13 * T.linfty_norm();

    // backtracking: accept the first step length that does not raise the residual
    double alpha = 1.0;
    bool accepted = false;
    std::string last_problem;
    for (int ls = 0; ls < 5; ++ls) {
      trial = T;
      trial.add(alpha, delta);
      double n_new = 0.0, s_new = 0.0;
      try {
        const Totals t_new = evaluate(trial, true, n_new, s_new);
        if (std::isfinite(n_new) &&
            (n_new < norm || ls == 4 || roundoff_update ||
             n_new <= d_.solver.newton_tolerance * s_new + floor)) {
          T = trial;
          norm = n_new;
          scale = s_new;
          tot = t_new;
          accepted = true;
          break;
        }
      } catch (const StageFailure& f) {
        last_problem = f.reason;
      }
      alpha *= 0.5;
    }
    if (!accepted)
      throw StageFailure{last_problem.empty() ? "Newton line search failed"
                                              : last_problem};
    if (roundoff_update && std::isfinite(norm))
      break;
  }
  reaction = reaction_sum(residual);
  energy_vec = mass_vec_;
  flux_vec = flux_vec_;
  return tot;
}

// ---- output -----------------------------------------------------------------------

template <int dim>
std::vector<double> HeatEngine<dim>::probe_values(const Vec& T_ghost) const {
  std::vector<double> v(sites_.size(), 0.0);
  for (std::size_t p = 0; p < sites_.size(); ++p)
    if (sites_[p].mine) {
      const Quadrature<dim> quad(std::vector<Point<dim>>{sites_[p].unit},
                                 std::vector<double>{1.0});
      FEValues<dim> fv(mapping_, fe_, quad, update_values);
      fv.reinit(sites_[p].cell);
      std::vector<double> val(1);
      fv.get_function_values(T_ghost, val);
      v[p] = val[0];
    }
  std::vector<double> sums(v.size(), 0.0);
  if (!v.empty())
    Utilities::MPI::sum(v, comm_, sums);
  return sums;
}

template <int dim>
void HeatEngine<dim>::write_fields(const Vec& T_ghost, double time) {
  if (!write_ || !d_.output.fields)
    return;
  const auto t0 = Clock::now();
  DataOut<dim> out;
  out.attach_dof_handler(dof_);
  out.add_data_vector(T_ghost, "temperature");
  HeatFluxOutput<dim> flux(field_);
  out.add_data_vector(T_ghost, flux);
  Vector<float> material(tria_.n_active_cells()), ranks(tria_.n_active_cells());
  for (const auto& cell : tria_.active_cell_iterators())
    if (cell->is_locally_owned()) {
      material(cell->active_cell_index()) = cell->material_id();
      ranks(cell->active_cell_index()) = static_cast<float>(rank_);
    }
  out.add_data_vector(material, "material_id");
  out.add_data_vector(ranks, "mpi_rank");
  out.build_patches(mapping_, fe_.degree, DataOut<dim>::curved_inner_cells);

  const std::string stem = "fields-" + Utilities::int_to_string(field_counter_, 4);
  const std::string piece = stem + "." + Utilities::int_to_string(rank_, 4) + ".vtu";
  {
    std::ostringstream s;
    out.write_vtu(s);
    detail::write_file_atomically((fs::path(d_.output.folder) / piece).string(), s.str());
  }
  MPI_Barrier(comm_);
  if (rank_ == 0) {
    std::vector<std::string> pieces;
    for (unsigned int r = 0; r < n_ranks_; ++r)
      pieces.push_back(stem + "." + Utilities::int_to_string(r, 4) + ".vtu");
    std::ostringstream s;
    out.write_pvtu_record(s, pieces);
    detail::write_file_atomically(
        (fs::path(d_.output.folder) / (stem + ".pvtu")).string(), s.str());
    pvd_.emplace_back(time, stem + ".pvtu");
    std::ostringstream p;
    DataOutBase::write_pvd_record(p, pvd_);
    detail::write_file_atomically((fs::path(d_.output.folder) / "fields.pvd").string(),
                                  p.str());
    if (field_counter_ == 0)
      result_.written_files.push_back(
          (fs::path(d_.output.folder) / "fields.pvd").string());
    result_.written_files.push_back(
        (fs::path(d_.output.folder) / (stem + ".pvtu")).string());
  }
  ++field_counter_;
  result_.timings.output += seconds_since(t0);
}

template <int dim>
void HeatEngine<dim>::write_tables(bool final_write) {
  if (!write_ || rank_ != 0)
    return;
  const auto t0 = Clock::now();
  const fs::path folder(d_.output.folder);
  detail::write_file_atomically((folder / "probes.csv").string(),
                                detail::probes_csv(result_));
  detail::write_file_atomically((folder / "energy.csv").string(),
                                detail::energy_csv(result_));
  if (final_write) {
    result_.written_files.push_back((folder / "probes.csv").string());
    result_.written_files.push_back((folder / "energy.csv").string());
    result_.written_files.push_back((folder / "summary.yaml").string());
    result_.timings.total = seconds_since(start_);
    detail::write_file_atomically((folder / "summary.yaml").string(),
                                  detail::summary_yaml(d_, result_));
  }
  result_.timings.output += seconds_since(t0);
}

template <int dim>
void HeatEngine<dim>::progress(double t, double h, bool force) {
  if (!opt_.log || rank_ != 0)
    return;
  const double wall = seconds_since(start_);
  if (!force && wall - last_progress_ < (terminal_ ? 0.25 : 5.0))
    return;
  last_progress_ = wall;
  const double frac = d_.time.end > 0 ? t / d_.time.end : 1.0;
  const double eta = frac > 0 ? wall * (1.0 - frac) / frac : 0.0;
  std::ostringstream s;
  s << std::setprecision(4) << "t = " << t << " s of " << d_.time.end << " s, step " << h
    << " s, steps " << result_.steps.n_steps << " (" << result_.steps.n_rejected
    << " rejected), about " << std::setprecision(2) << std::fixed << eta << " s left";
  if (terminal_)
    *opt_.log << "\r\033[K" << s.str() << std::flush;
  else
    *opt_.log << s.str() << '\n' << std::flush;
}

// ---- the run ----------------------------------------------------------------------

template <int dim>
RunResult HeatEngine<dim>::run() {
  start_ = Clock::now();
  result_.n_ranks = n_ranks_;
  if (write_) {
    int ok = 1;
    std::string msg;
    if (rank_ == 0) {
      try {
        detail::prepare_output_folder(d_.output.folder, d_.file, d_.output.where);
      } catch (const CardError&) {
        ok = 0;
      }
    }
    ok = Utilities::MPI::min(ok, comm_);
    if (!ok) // every rank raises the same error
      detail::prepare_output_folder(d_.output.folder, d_.file, d_.output.where);
  }

  make_mesh();
  check_ids();
  setup_system();
  set_initial_temperature();
  locate_probes();
  result_.n_cells = tria_.n_global_active_cells();
  result_.n_dofs = dof_.n_dofs();
  for (const auto& p : d_.output.probes)
    result_.probe_names.push_back(p.name);
  result_.probe_temperatures.assign(sites_.size(), {});

  if (opt_.log && rank_ == 0) {
    std::ostringstream h;
    h << "quantacal run: " << d_.name << " ("
      << (d_.file.empty() ? "in-code case" : d_.file) << ")\n"
      << "  "
      << (d_.geometry == Geometry::planar         ? "2D planar"
          : d_.geometry == Geometry::axisymmetric ? "2D axisymmetric"
                                                  : "3D")
      << ", " << result_.n_cells << " cells, " << result_.n_dofs << " unknowns (FE_Q"
      << fe_.degree << "), " << n_ranks_ << " MPI rank" << (n_ranks_ > 1 ? "s" : "")
      << ", TR-BDF2, "
      << (d_.solver.formulation == Formulation::energy ? "energy" : "capacity")
      << " form\n"
      << "  output: " << (write_ ? d_.output.folder : std::string("(none)")) << "\n"
      << "  caution: " << run_caution();
    log_line(h.str());
  }

  // state at t = start
  Vec T(mass_vec_); // initial field from set_initial_temperature
  Vec T_ghost(owned_, relevant_, comm_);
  double t = 0.0;
  // the initial field is the initial temperature everywhere; fixed boundary values
  // apply from the first stage on (their jump is heat through the boundary)
  T_ghost = T;
  Vec M_n(owned_, comm_), F_n(owned_, comm_), M_g(owned_, comm_), F_g(owned_, comm_);
  Vec M_1(owned_, comm_), F_1(owned_, comm_);
  Vec T_prev(owned_, comm_), T_g(owned_, comm_), T_1(owned_, comm_), known(owned_, comm_);
  Vec cref(owned_, comm_);
  Totals tot_n;
  try {
    tot_n = assemble(T_ghost, t, 0.0, &T_ghost, false);
  } catch (const StageFailure& f) {
    throw case_error(d_, d_.initial_where, "initial_temperature",
                     "an initial temperature field the materials accept (" + f.reason +
                         ")");
  }
  M_n = mass_vec_;
  F_n = flux_vec_;
  if (d_.solver.formulation == Formulation::capacity)
    M_n = 0; // the capacity residual has no stored-energy vector
  const double E0 = tot_n.stored;
  shift_total_ = tot_n.shift;
  double Qb = 0.0, Qs = 0.0;
  auto record = [&](double time, double stored) {
    result_.times.push_back(time);
    const auto pv = probe_values(T_ghost);
    for (std::size_t p = 0; p < pv.size(); ++p)
      result_.probe_temperatures[p].push_back(pv[p]);
    EnergyRecord e;
    e.time = time;
    e.stored_energy = stored + shift_total_;
    e.boundary_heat = Qb;
    e.source_heat = Qs;
    const double dE = stored - E0;
    const double tiny = std::max(1e-300, 1e-30 * std::abs(E0));
    e.relative_imbalance = std::abs(dE - Qb - Qs) / std::max(std::abs(dE), tiny);
    if (result_.energy.size() > 0)
      result_.worst_relative_imbalance =
          std::max(result_.worst_relative_imbalance, e.relative_imbalance);
    result_.energy.push_back(e);
  };
  record(t, E0);
  result_.timings.setup = seconds_since(start_);
  write_fields(T_ghost, t);
  write_tables(false);

  // stop times: output times, source switches, the end
  std::set<double> stops;
  stops.insert(d_.time.end);
  if (d_.output.interval > 0)
    for (double s = d_.output.interval; s < d_.time.end * (1 - 1e-12);
         s += d_.output.interval)
      stops.insert(s);
  for (const auto& s : d_.sources) {
    if (s.start > 0 && s.start < d_.time.end)
      stops.insert(s.start);
    if (std::isfinite(s.end) && s.end < d_.time.end)
      stops.insert(s.end);
  }
  std::set<double> field_times;
  if (d_.output.interval > 0)
    for (double s = d_.output.interval; s < d_.time.end * (1 - 1e-12);
         s += d_.output.interval)
      field_times.insert(s);

  const double max_step = d_.time.max_step > 0 ? d_.time.max_step : d_.time.end / 20.0;
  const double min_step =
      d_.time.min_step > 0 ? d_.time.min_step : d_.time.first_step * 1e-6;
  double h = std::min(d_.time.first_step, max_step);
  double h_prev = 0.0;
  bool have_prev = false;
  unsigned int consecutive_rejections = 0;
  std::string last_failure;

  while (t < d_.time.end * (1 - 1e-14)) {
    if (result_.steps.n_steps >= d_.time.max_steps) {
      result_.stop_reason =
          "reached time.max_steps = " + std::to_string(d_.time.max_steps) +
          " accepted steps at t = " + format_double(t) + " s";
      break;
    }
    // land exactly on the next stop time
    const double next_stop = *stops.upper_bound(t * (1 + 1e-14) + 1e-300);
    double h_try = h;
    // `clamped`: the step was shortened for the stop (so the next proposal may
    // grow back); `lands`: this step ends exactly on the stop time.
    bool clamped = false;
    bool lands = false;
    if (t + h_try >= next_stop * (1 - 1e-12)) {
      h_try = next_stop - t;
      clamped = true;
      lands = true;
    } else if (d_.time.adaptive && t + 1.5 * h_try > next_stop) {
      // split the remaining interval in two rather than leave a sliver
      h_try = 0.5 * (next_stop - t);
      clamped = true;
    }
    const double t_g = t + tr_gamma * h_try;
    const double t_1 = lands ? next_stop : t + h_try;
    bool ok = true;
    Totals tot_g, tot_1;
    double reaction_g = 0.0, reaction_1 = 0.0;
    try {
      // stage 1: trapezoid to t_g
      T_g = T;
      known = M_n;
      known.add(0.5 * tr_gamma * h_try, F_n);
      if (d_.solver.formulation == Formulation::capacity)
        cref = T;
      M_g = M_n;
      tot_g =
          solve_stage(T_g, t_g, 0.5 * tr_gamma * h_try, known,
                      d_.solver.formulation == Formulation::capacity ? &cref : nullptr,
                      M_g, F_g, reaction_g);
      // stage 2: BDF2 to t_1; guess by linear extrapolation
      T_1 = T_g;
      T_1 *= 1.0 / tr_gamma;
      T_1.add(1.0 - 1.0 / tr_gamma, T);
      if (d_.solver.formulation == Formulation::energy) {
        known = M_g;
        known *= tr_a;
        known.add(-tr_b, M_n);
        M_1 = M_n;
      } else {
        known = 0;
        cref = T_g;
        cref *= tr_a;
        cref.add(-tr_b, T);
        M_1 = 0;
      }
      tot_1 =
          solve_stage(T_1, t_1, tr_c * h_try, known,
                      d_.solver.formulation == Formulation::capacity ? &cref : nullptr,
                      M_1, F_1, reaction_1);
      // non-physical temperature
      double tmin = std::numeric_limits<double>::infinity();
      for (const auto i : owned_)
        tmin = std::min(tmin, static_cast<double>(T_1[i]));
      tmin = Utilities::MPI::min(tmin, comm_);
      if (!(tmin > 0.0))
        throw StageFailure{"non-physical temperature " + format_double(tmin) + " K"};
    } catch (const StageFailure& f) {
      ok = false;
      last_failure = f.reason;
    }

    double err = 0.0;
    if (ok && d_.time.adaptive) {
      // Milne-type estimate: T_1 against the quadratic through (t_prev, T_prev),
      // (t, T), (t_g, T_g) extrapolated to t_1 (linear through T, T_g on the first step).
      double local = 0.0;
      const double s0 = -h_prev, s1 = 0.0, s2 = tr_gamma * h_try, s = h_try;
      for (const auto i : owned_) {
        double p;
        if (have_prev) {
          const double l0 = (s - s1) * (s - s2) / ((s0 - s1) * (s0 - s2));
          const double l1 = (s - s0) * (s - s2) / ((s1 - s0) * (s1 - s2));
          const double l2 = (s - s0) * (s - s1) / ((s2 - s0) * (s2 - s1));
          p = l0 * T_prev[i] + l1 * T[i] + l2 * T_g[i];
        } else {
          p = T[i] + (T_g[i] - T[i]) / tr_gamma;
        }
        local = std::max(local, std::abs(T_1[i] - p));
      }
      err = Utilities::MPI::max(local, comm_);
      if (!std::isfinite(err))
        ok = false, last_failure = "non-finite error estimate";
    }
    if (ok && d_.time.adaptive && err > d_.time.tolerance && h_try > min_step * 1.0001) {
      ++result_.steps.n_rejected;
      h = std::max(min_step,
                   h_try * std::max(0.2, 0.9 * std::cbrt(d_.time.tolerance / err)));
      continue; // an error rejection is control, not a failure
    }
    if (!ok) {
      ++result_.steps.n_rejected;
      ++consecutive_rejections;
      if (consecutive_rejections >= d_.time.max_rejections || h_try * 0.5 < min_step) {
        std::ostringstream s;
        s << "stopped at t = " << format_double(t) << " s after "
          << consecutive_rejections << " consecutive rejected steps (last step "
          << format_double(h_try)
          << " s; time.max_rejections = " << d_.time.max_rejections
          << ", time.min_step = " << format_double(min_step) << " s): " << last_failure;
        result_.stop_reason = s.str();
        break;
      }
      log_line("step rejected at t = " + format_double(t) + " s, step " +
               format_double(h_try) + " s: " + last_failure +
               "; retrying with half the step");
      h = 0.5 * h_try;
      continue;
    }
    consecutive_rejections = 0;

    // accept: ledger with the TR-BDF2 weights
    Qb += h_try * (tr_w1 * (tot_n.boundary + tot_g.boundary) + tr_c * tot_1.boundary) +
          tr_a * reaction_g + reaction_1;
    Qs += h_try * (tr_w1 * (tot_n.source + tot_g.source) + tr_c * tot_1.source);
    T_prev = T;
    T = T_1;
    M_n = (d_.solver.formulation == Formulation::energy) ? M_1 : M_n;
    F_n = F_1;
    tot_n = tot_1;
    h_prev = h_try;
    have_prev = true;
    t = t_1;
    T_ghost = T;
    ++result_.steps.n_steps;
    if (result_.steps.n_steps == 1 || h_try < result_.steps.smallest_step)
      result_.steps.smallest_step = h_try;
    result_.steps.largest_step = std::max(result_.steps.largest_step, h_try);
    record(t, tot_1.stored);
    if (opt_.on_step)
      opt_.on_step(t, h_try);

    // next step size
    double factor = 2.0;
    if (d_.time.adaptive && err > 0)
      factor = std::min(2.0, std::max(0.2, 0.9 * std::cbrt(d_.time.tolerance / err)));
    if (d_.time.adaptive) {
      const double proposal = h_try * factor;
      h = clamped ? std::max(h, proposal) : proposal;
      h = std::min(std::max(h, min_step), max_step);
    } else {
      h = d_.time.first_step;
    }

    const bool at_field_time =
        field_times.count(t) || std::abs(t - d_.time.end) <= 1e-12 * d_.time.end;
    if (at_field_time && std::abs(t - d_.time.end) > 1e-12 * d_.time.end) {
      write_fields(T_ghost, t);
      write_tables(false);
      progress(t, h_try, true);
    } else {
      progress(t, h_try, false);
    }
  }
  result_.completed = result_.stop_reason.empty();

  // final state
  double tmin = std::numeric_limits<double>::infinity(), tmax = -tmin;
  for (const auto i : owned_) {
    tmin = std::min(tmin, static_cast<double>(T[i]));
    tmax = std::max(tmax, static_cast<double>(T[i]));
  }
  result_.minimum_temperature = Utilities::MPI::min(tmin, comm_);
  result_.maximum_temperature = Utilities::MPI::max(tmax, comm_);
  result_.crossings = detail::find_crossings(result_, d_.output.crossing_temperatures);
  write_fields(T_ghost, t);
  result_.timings.total = seconds_since(start_);
  write_tables(true);
  if (write_ && d_.output.plot && rank_ == 0) {
    const std::string warning = detail::plot_cooling_curves(
        d_.output.folder, result_, d_.name, result_.written_files);
    if (!warning.empty())
      log_line("warning: " + warning);
  }
  if (opt_.log && rank_ == 0) {
    std::ostringstream s;
    s << (result_.completed ? "finished" : "STOPPED") << ": t = " << format_double(t)
      << " s, " << result_.steps.n_steps << " steps (" << result_.steps.n_rejected
      << " rejected), " << result_.steps.n_newton_iterations
      << " Newton iterations, worst relative energy imbalance " << std::scientific
      << std::setprecision(2) << result_.worst_relative_imbalance << ", " << std::fixed
      << result_.timings.total << " s wall";
    log_line(s.str());
    if (write_)
      log_line("results in " + d_.output.folder +
               " (probes.csv, energy.csv, summary.yaml, cooling_curves.svg, fields.pvd)");
  }
  if (!result_.completed && opt_.throw_on_failure)
    throw NumericalError(
        "quantacal::fe::run_case",
        (d_.file.empty() ? d_.name : d_.file) + ": " + result_.stop_reason +
            (write_ ? " (results up to that time are in " + d_.output.folder + ")"
                    : std::string()));
  return result_;
}

} // namespace

RunResult run_case(const CaseDescription& description, const RunOptions& options) {
  if (description.solver.degree < 1 || description.solver.degree > 3)
    throw CardError(description.file, 0, 0, "solver.degree",
                    std::to_string(description.solver.degree),
                    "expected a degree 1, 2 or 3");
  if (!(description.time.end > 0) || !(description.time.first_step > 0))
    throw CardError(description.file, description.time.where.line,
                    description.time.where.column, "time", "",
                    "expected time.end > 0 and time.first_step > 0");
  if (description.dimension() == 2) {
    HeatEngine<2> engine(description, options);
    return engine.run();
  }
  HeatEngine<3> engine(description, options);
  return engine.run();
}

} // namespace quantacal::fe
