// SPDX-License-Identifier: Apache-2.0
/**
 * @file solver.h
 * @brief Case description (loaded from a YAML case file) and the transient
 *        heat-conduction solver engine behind `quantacal run`.
 *
 * The engine solves rho de(T)/dt = div(k(T) grad T) + q in energy form on a
 * parallel::distributed::Triangulation with continuous FE_Q elements of
 * degree 1-3, in 2D planar (per metre of depth), 2D axisymmetric (x = r,
 * y = z, integrals weighted by 2 pi r, so energies are those of the whole
 * body of revolution) and 3D. Time stepping is TR-BDF2 (gamma = 2 - sqrt 2)
 * with an embedded error estimate, step-size control and step rejection;
 * each stage is solved by Newton's method with the consistent Jacobian and
 * GMRES preconditioned by Trilinos ML AMG. The case file format is
 * documented in docs/cases.md.
 *
 * Everything a test needs is reachable in-process: build or load a
 * CaseDescription, call run_case, inspect the RunResult (probe histories,
 * energy ledger, step statistics, crossing times). The header does not
 * include deal.II; only MPI.
 */
#ifndef QUANTACAL_SOLVER_SOLVER_H
#define QUANTACAL_SOLVER_SOLVER_H

#include <quantacal/material/material.h>

#include <mpi.h>

#include <functional>
#include <iosfwd>
#include <limits>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::fe {

/** Where a value came from in the case file, for error messages (1-based; 0 = unknown).
 */
struct CaseLocation {
  int line = 0;      ///< 1-based line
  int column = 0;    ///< 1-based column
  std::string field; ///< field path, e.g. "boundaries[1].id"
  std::string value; ///< raw text of the value
};

/** Space and its integrals. */
enum class Geometry {
  planar,       ///< 2D, x-y, quantities per metre of depth (J/m, W/m)
  axisymmetric, ///< 2D, x = r >= 0, y = z; integrals weighted by 2 pi r (J, W)
  solid         ///< 3D (J, W)
};

/** Form of the time derivative. */
enum class Formulation {
  energy,  ///< d E(T)/dt with E = rho e(T): conserves energy to Newton tolerance
  capacity ///< rho c_p(T) dT/dt with c_p at the new temperature: shown only to measure
           ///< its loss
};

/**
 * A piecewise monotone cubic y(x) through points (Fritsch-Carlson slopes),
 * constant beyond the end points; one point means a constant.
 */
struct Curve {
  std::vector<double> x; ///< strictly increasing
  std::vector<double> y;
  /** y at @p t (constant continuation outside [x.front(), x.back()]). */
  double value(double t) const;
  /** dy/dx at @p t (0 outside the points). */
  double derivative(double t) const;
};

/** The mesh: a Gmsh file or a built-in generator. Lengths in m. */
struct MeshSpec {
  enum class Kind {
    gmsh,  ///< `file`: physical tags become material ids (cells) and boundary ids (faces)
    plate, ///< 2D rectangle origin..origin+size; boundary ids 0: x = x0, 1: x = x1, 2: y
           ///< = y0, 3: y = y1
    block, ///< 3D box; boundary ids 0/1: x0/x1, 2/3: y0/y1, 4/5: z0/z1
    cylinder ///< 3D: axis z, 0 <= z <= length; 2D axisymmetric: r in [0, radius], z in
             ///< [0, length]; boundary ids 0: mantle r = radius, 1: end z = 0, 2: end z =
             ///< length, 3: axis r = 0 (axisymmetric only; always insulated)
  };
  Kind kind = Kind::plate;
  std::string file;           ///< resolved path of the .msh file (Kind::gmsh)
  std::vector<double> origin; ///< m (plate, block), default 0
  std::vector<double> size;   ///< m (plate: 2, block: 3)
  std::vector<unsigned int>
      cells;           ///< coarse cells per direction before refinement (plate, block,
                       ///< and for cylinder: {radial, axial} in 2D)
  double radius = 0.0; ///< m (cylinder)
  double length = 0.0; ///< m (cylinder)
  unsigned int refinements = 0; ///< global refinements of the coarse mesh
  unsigned int material_id = 1; ///< material id of generated cells
  /** A box of cells (by cell centre) given another material id (built-in meshes). */
  struct Region {
    unsigned int material_id = 0;
    std::vector<double> lower; ///< m
    std::vector<double> upper; ///< m
    CaseLocation where;
  };
  std::vector<Region> regions;
  CaseLocation where;
};

/** One material of the case. */
struct MaterialSpec {
  unsigned int id = 0;  ///< material id in the mesh
  std::string card;     ///< resolved path of the card ("" if `material` is given in code)
  MaterialPtr material; ///< the loaded material (run_case loads `card` if null)
  std::optional<double>
      initial_temperature; ///< K; overrides the case's initial temperature
  CaseLocation where;
};

/** Boundary condition on one boundary id. No part set = insulated. */
struct BoundarySpec {
  unsigned int boundary_id = 0;
  /** Fixed temperature T(t), K against s (may be constant). Excludes the other two. */
  std::optional<Curve> temperature;
  /** Convection: heat flux into the body h(T_s) (T_ambient - T_s). */
  struct Convection {
    Curve coefficient; ///< h against the surface temperature, W/m^2/K against K
    double ambient_temperature = 0.0; ///< K
  };
  std::optional<Convection> convection;
  /** Radiation: heat flux into the body epsilon sigma (T_ambient^4 - T_s^4). */
  struct Radiation {
    double emissivity = 0.0;          ///< 0 < epsilon <= 1
    double ambient_temperature = 0.0; ///< K
  };
  std::optional<Radiation> radiation;
  CaseLocation where;
};

/** A volumetric heat source q, W/m^3, switched on in [start, end). */
struct HeatSource {
  std::vector<unsigned int> material_ids;               ///< where; empty = everywhere
  double power_density = 0.0;                           ///< W/m^3
  double start = 0.0;                                   ///< s
  double end = std::numeric_limits<double>::infinity(); ///< s
  CaseLocation where;
};

/** Time integration. */
struct TimeSpec {
  double end = 0.0;        ///< s
  double first_step = 0.0; ///< s
  double tolerance = 0.1;  ///< K: allowed local error estimate per step (max over nodes)
  double min_step = 0.0;   ///< s; 0 = first_step * 1e-6
  double max_step = 0.0;   ///< s; 0 = (end - start) / 20
  unsigned int max_rejections =
      10;                          ///< consecutive rejected attempts before the run stops
  unsigned int max_steps = 200000; ///< accepted steps before the run stops
  bool adaptive = true; ///< false: fixed step first_step (for convergence studies)
  CaseLocation where;
};

/** A named point whose temperature is recorded at every accepted step. */
struct Probe {
  std::string name;
  std::vector<double> point; ///< m (dim coordinates; axisymmetric: r, z)
  CaseLocation where;
};

/** What is written. */
struct OutputSpec {
  std::string folder;    ///< resolved output folder
  double interval = 0.0; ///< s between field outputs (VTU); 0 = first and last only
  bool fields = true;    ///< write VTU/PVTU/PVD
  bool plot = true;      ///< run gnuplot for cooling_curves.svg
  std::vector<Probe> probes;
  std::vector<double> crossing_temperatures; ///< K
  CaseLocation where;
};

/** Nonlinear and linear solver settings. */
struct SolverSpec {
  Formulation formulation = Formulation::energy;
  unsigned int degree = 1; ///< FE_Q degree, 1..3
  double newton_tolerance =
      1e-11; ///< relative to the stage's energy-change residual scale
  unsigned int max_newton_iterations = 15;
  double linear_tolerance = 1e-12; ///< relative GMRES tolerance
  /// Treatment of the stored-energy term.
  ///  - lumped: M_i = m_i E(T_i), m_i = int w phi_i (row sum of the mass matrix): E is
  ///    evaluated at nodal temperatures only, a sharp initial jump gives no over- or
  ///    undershoot (recommended for degree 1);
  ///  - consistent: int w phi_i E(T_h) on Gauss points (more accurate for degree 2, 3);
  ///  - automatic (default): lumped for degree 1, consistent otherwise.
  /// The energy ledger is exact in every case (it uses the same sums).
  enum class Mass { automatic, lumped, consistent };
  Mass mass = Mass::automatic;
};

/** A whole case, as read from a case file (or built in code by a test). */
struct CaseDescription {
  std::string file; ///< case file path as given ("" if built in code)
  std::string name; ///< case name
  Geometry geometry = Geometry::planar;
  MeshSpec mesh;
  std::vector<MaterialSpec> materials;
  double initial_temperature = 0.0; ///< K
  CaseLocation initial_where;
  std::vector<BoundarySpec> boundaries;
  std::vector<HeatSource> sources;
  TimeSpec time;
  OutputSpec output;
  SolverSpec solver;

  /** 2 or 3. */
  int dimension() const { return geometry == Geometry::solid ? 3 : 2; }
};

/**
 * Reads a case file. Relative paths inside (mesh file, cards, output folder)
 * are resolved against the case file's folder.
 * @param path case file
 * @throws CardError (file:line:column: field = "value": expected ...) for any
 *         missing, misspelt, mis-united or non-physical entry; cards named by
 *         the case are loaded here and their errors propagate
 */
CaseDescription load_case(const std::string& path);

/**
 * Same from text.
 * @param text YAML
 * @param file name used in messages
 * @param base_directory folder against which relative paths are resolved
 * @param load_materials false to leave MaterialSpec::material null (run_case loads them)
 */
CaseDescription load_case_from_string(const std::string& text, const std::string& file,
                                      const std::string& base_directory,
                                      bool load_materials = true);

/** One row of the energy ledger (cumulative from the start). */
struct EnergyRecord {
  double time = 0.0;          ///< s
  double stored_energy = 0.0; ///< J (planar: J/m), relative to the materials' references
  double boundary_heat = 0.0; ///< J that entered through the boundary since the start
  double source_heat = 0.0;   ///< J released by sources since the start
  double relative_imbalance = 0.0; ///< |dE - Q_b - Q_s| / max(|dE|, tiny)
};

/** Time at which a probe first crossed a temperature, and its rate there. */
struct Crossing {
  std::string probe;
  double temperature = 0.0; ///< K
  bool crossed = false;
  double time = 0.0; ///< s (linear interpolation between the samples around it)
  double rate = 0.0; ///< dT/dt there, K/s (negative when cooling)
};

/** Counts over the run. */
struct StepStatistics {
  unsigned int n_steps = 0;    ///< accepted steps
  unsigned int n_rejected = 0; ///< rejected attempts (error, Newton failure, range)
  unsigned int n_newton_iterations = 0; ///< over all stages of all attempts
  unsigned int n_linear_iterations = 0; ///< GMRES iterations, total
  double smallest_step = 0.0;           ///< s, accepted
  double largest_step = 0.0;            ///< s, accepted
};

/** Wall-clock seconds by phase (rank 0's clock). */
struct PhaseTimes {
  double setup = 0.0;
  double assembly = 0.0;
  double material_evaluation = 0.0; ///< part of `assembly`: MaterialField calls
  double linear_solve = 0.0;
  double output = 0.0;
  double total = 0.0;
};

/** Everything a run produced (on every rank: the figures are global). */
struct RunResult {
  std::vector<std::string> probe_names;
  std::vector<double> times; ///< s, t = start and each accepted step
  std::vector<std::vector<double>> probe_temperatures; ///< [probe][sample], K
  std::vector<EnergyRecord> energy;                    ///< one per entry of `times`
  double worst_relative_imbalance = 0.0;
  std::vector<Crossing> crossings; ///< per probe, per requested temperature
  StepStatistics steps;
  PhaseTimes timings;
  unsigned long long n_cells = 0;
  unsigned long long n_dofs = 0;
  unsigned int n_ranks = 1;
  double minimum_temperature = 0.0;       ///< K, over the nodes at the end
  double maximum_temperature = 0.0;       ///< K, over the nodes at the end
  bool completed = false;                 ///< reached the end time
  std::string stop_reason;                ///< why it stopped early ("" if completed)
  std::vector<std::string> written_files; ///< paths written (rank 0's list)
};

/** How run_case behaves around the computation. */
struct RunOptions {
  MPI_Comm communicator = MPI_COMM_WORLD;
  bool write_output = true;    ///< false: compute only (no files, no plot)
  std::ostream* log = nullptr; ///< run header and log lines (rank 0); null = silent
  bool progress = true;        ///< one-line progress display when `log` is a terminal
  bool throw_on_failure =
      true; ///< a run that stops early throws NumericalError after writing
  /** Called on every rank after each accepted step: (time s, step s). */
  std::function<void(double, double)> on_step;
};

/**
 * Runs @p description. Collective over options.communicator (MPI must be
 * initialised, e.g. by dealii::Utilities::MPI::MPI_InitFinalize).
 *
 * Output files (if write_output), each written to a temporary name and renamed:
 * probes.csv, energy.csv, summary.yaml, cooling_curves.gp/.svg, and
 * fields-NNNN.pvtu/.vtu with fields.pvd.
 *
 * @throws CardError for inconsistencies found against the mesh (boundary id or
 *         material id not in the mesh, a material id without a card, a probe
 *         outside the mesh, a missing mesh file), with the case file location
 * @throws NumericalError if the run stops early and throw_on_failure (outputs
 *         written so far are complete files)
 * @throws std::ios_base::failure if the output folder cannot be written
 */
RunResult run_case(const CaseDescription& description, const RunOptions& options = {});

/** The caution printed in run headers and written to summary.yaml. */
const char* run_caution();

} // namespace quantacal::fe

#endif
