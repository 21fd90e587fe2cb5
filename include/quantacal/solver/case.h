// SPDX-License-Identifier: Apache-2.0
/**
 * @file case.h
 * @brief The description of a transient heat-conduction case: geometry, mesh,
 *        materials, initial and boundary conditions, sources, time span,
 *        outputs and solver settings; and its reader for YAML case files.
 *
 * Why it exists: a case is data, separate from the engine that runs it
 * (quantacal/solver/solver.h). A case file is read into a CaseDescription
 * (load_case), or a test builds one in code; run_case then solves it. The
 * case file format is documented in docs/cases.md. Lengths in m, times in s,
 * temperatures in K (the reader converts the units written in the file).
 *
 * @code
 *   quantacal::solver::CaseDescription c = quantacal::solver::load_case("case.yaml");
 *   c.solver.degree = 2;           // any field may be changed before the run
 * @endcode
 *
 * No deal.II here.
 */
#ifndef QUANTACAL_SOLVER_CASE_H
#define QUANTACAL_SOLVER_CASE_H

#include <quantacal/material/material.h>
#include <quantacal/models/monotone_cubic.h>

#include <limits>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::solver {

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
 * A boundary curve: h against the surface temperature, or a fixed temperature
 * against time. The monotone cubic through its points (Fritsch-Carlson slopes,
 * quantacal::MonotoneCubic), constant beyond the end points; one point is a
 * constant. Build it as `Curve{{x0, x1, ...}, {y0, y1, ...}}`.
 */
using Curve = MonotoneCubic;

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

/**
 * The scale temperatures are written in (probes.csv, summary.yaml, plots, report,
 * progress line); inside the solver everything stays in K. Rates are written in
 * K/s for kelvin and celsius (a kelvin and a degree Celsius are the same
 * interval), in degF/s for fahrenheit.
 */
enum class TemperatureUnit {
  kelvin,    ///< K
  celsius,   ///< degC
  fahrenheit ///< degF
};

/** A band of temperatures whose passage is measured per probe (docs/results.md). */
struct TemperatureWindow {
  double upper = 0.0; ///< K
  double lower = 0.0; ///< K, below upper
  CaseLocation where;
};

/** What is written. */
struct OutputSpec {
  std::string folder;    ///< resolved output folder
  double interval = 0.0; ///< s between field outputs (VTU); 0 = first and last only
  bool fields = true;    ///< write VTU/PVTU/PVD
  /// write the gnuplot scripts of the cooling curves, cooling rates and energy ledger
  /// (`quantacal run` then runs gnuplot on them for the SVG and PNG plots)
  bool plot = true;
  /// `quantacal run` writes report.html (docs/results.md)
  bool report = true;
  /// scale of the temperatures written; a case file's default is the unit its
  /// initial_temperature is written in
  TemperatureUnit temperature_unit = TemperatureUnit::kelvin;
  std::vector<Probe> probes;
  std::vector<double> crossing_temperatures; ///< K
  std::vector<TemperatureWindow> windows;    ///< output.windows
  /// simulated time between checkpoints, s (0 = none): a checkpoint is written after
  /// the first accepted step at or past each multiple (docs/cases.md, "Checkpoints")
  double checkpoint_interval = 0.0;
  /// wall-clock time between checkpoints, s (0 = none), counted from the start of
  /// this session or its last checkpoint
  double checkpoint_wall_interval = 0.0;
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

/**
 * Adaptive refinement and coarsening of the mesh in time (docs/cases.md,
 * "Adaptive meshes"). Every `every` accepted steps each cell gets the Kelly
 * indicator of the temperature scaled to a temperature error across the cell,
 * eta_K h_K / sqrt(|K|) in K; cells above `refine_above` are refined (up to
 * `levels` levels above the case's mesh and about `max_cells` active cells, the
 * largest indicators first), cells below `coarsen_below` coarsened (never below
 * the case's mesh). The temperature and the stepper's previous level move to the
 * new mesh by interpolation; the stored-energy change this makes is reported in
 * energy.csv apart from the physical balance.
 */
struct AdaptivitySpec {
  bool enabled = false;
  unsigned int every = 5;          ///< accepted steps between remeshes
  unsigned int levels = 2;         ///< refinement levels allowed above the case's mesh
  unsigned int max_cells = 200000; ///< active cells (all ranks), approximate limit
  double refine_above = 1.0;       ///< K, indicator above which a cell is refined
  double coarsen_below = 0.1;      ///< K, indicator below which a cell is coarsened
  CaseLocation where;
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
  AdaptivitySpec adaptivity;

  /** 2 or 3. */
  int dimension() const { return geometry == Geometry::solid ? 3 : 2; }
};

/**
 * Reads a case file. Relative paths inside (mesh file, cards, output folder)
 * are resolved against the case file's folder.
 * @param path case file
 * @throws InputError (file:line:column: field = "value": expected ...) for any
 *         missing, misspelt, repeated, mis-united or non-physical entry; cards
 *         named by the case are loaded here and their errors propagate
 */
CaseDescription load_case(const std::string& path);

/**
 * Same from text.
 * @param text YAML
 * @param file name used in messages
 * @param base_directory folder against which relative paths are resolved
 * @param load_materials false to leave MaterialSpec::material null (run_case loads them)
 * @throws InputError as load_case
 */
CaseDescription load_case_from_string(const std::string& text, const std::string& file,
                                      const std::string& base_directory,
                                      bool load_materials = true);

} // namespace quantacal::solver

#endif
