// SPDX-License-Identifier: Apache-2.0
// heat_step: a small deal.II heat solver of your own that takes c_p(T), e(T)
// and k(T) from a quantacal material card. It shows the one thing quantacal
// asks of such a solver: call MaterialField::evaluate once per cell with the
// temperatures at the quadrature points (asking for the properties it uses),
// and write the time derivative in energy form, (E(T) - E(T_old)) / dt, with
// the Jacobian dE/dT that comes with it. Then the stored energy changes by
// exactly the heat that crossed the boundary (to the Newton tolerance), however
// steeply c_p varies.
//
// Problem (illustrative): a 20 mm square bar section, uniform at 700 K, cooled
// on its face x = 0 by convection (h = 2000 W/m^2/K, 300 K fluid), the other
// faces insulated; backward Euler, Newton with the consistent Jacobian.
// Usage: heat_step <card.yaml>
#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/tria.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparse_direct.h>
#include <deal.II/lac/sparse_matrix.h>
#include <deal.II/lac/vector.h>
#include <deal.II/numerics/vector_tools.h>

#include <cmath>
#include <cstdio>
#include <exception>
#include <iostream>
#include <vector>

using namespace dealii;
constexpr int dim = 2;

int main(int argc, char** argv) {
  if (argc != 2) {
    std::cerr << "usage: heat_step <card.yaml>\n";
    return 2;
  }
  try {
    // 1. The material, and the field that maps material ids to materials.
    const quantacal::MaterialPtr metal = quantacal::load_card(argv[1]);
    const quantacal::fe::MaterialField<dim> field(
        {{0, metal}}); // cells have material id 0

    // 2. An ordinary deal.II discretisation.
    const double side = 0.02;                         // m
    const double h = 2000.0, fluid = 300.0, dt = 0.5; // W/m^2/K, K, s
    Triangulation<dim> mesh;
    GridGenerator::hyper_cube(mesh, 0.0, side, true); // boundary ids: 0 is x = 0
    mesh.refine_global(4);
    const FE_Q<dim> fe(2);
    DoFHandler<dim> dofs(mesh);
    dofs.distribute_dofs(fe);
    DynamicSparsityPattern dsp(dofs.n_dofs());
    DoFTools::make_sparsity_pattern(dofs, dsp);
    SparsityPattern pattern;
    pattern.copy_from(dsp);
    SparseMatrix<double> jacobian(pattern);
    Vector<double> T(dofs.n_dofs()), T_old(dofs.n_dofs()), residual(dofs.n_dofs()),
        update(dofs.n_dofs());
    T = 700.0; // K

    const QGauss<dim> cell_quadrature(fe.degree + 1);
    const QGauss<dim - 1> face_quadrature(fe.degree + 1);
    FEValues<dim> fv(fe, cell_quadrature,
                     update_values | update_gradients | update_JxW_values);
    FEFaceValues<dim> ffv(fe, face_quadrature, update_values | update_JxW_values);
    const unsigned int n = fe.n_dofs_per_cell();
    std::vector<types::global_dof_index> index(n);
    std::vector<double> t_q(cell_quadrature.size()), t_old_q(cell_quadrature.size()),
        t_face(face_quadrature.size());
    std::vector<Tensor<1, dim>> grad_q(cell_quadrature.size());
    quantacal::fe::PointProperties now, before;

    // Stored energy int E(T) dx (J per metre of depth) and boundary heat rate.
    double stored = 0.0, heat_in = 0.0;

    // 3. The assembly loop: residual R(T) and Jacobian dR/dT of
    //    int (E(T) - E(T_old))/dt v + k(T) grad T . grad v dx + int_{x=0} h (T - fluid) v
    //    ds
    const auto assemble = [&]() {
      jacobian = 0.0;
      residual = 0.0;
      stored = 0.0;
      heat_in = 0.0;
      FullMatrix<double> cell_j(n, n);
      Vector<double> cell_r(n);
      for (const auto& cell : dofs.active_cell_iterators()) {
        fv.reinit(cell);
        fv.get_function_values(T, t_q);
        fv.get_function_values(T_old, t_old_q);
        fv.get_function_gradients(T, grad_q);
        // E, dE/dT, k, dk/dT at once; at the previous step only E
        field.evaluate(*cell, t_q, now,
                       quantacal::fe::property_energy | quantacal::fe::property_capacity |
                           quantacal::fe::property_conduction);
        field.evaluate(*cell, t_old_q, before, quantacal::fe::property_energy);
        cell_j = 0.0;
        cell_r = 0.0;
        for (unsigned int q = 0; q < t_q.size(); ++q) {
          const double w = fv.JxW(q);
          stored += now.energy[q] * w;
          for (unsigned int i = 0; i < n; ++i) {
            const double vi = fv.shape_value(i, q);
            const Tensor<1, dim> gi = fv.shape_grad(i, q);
            cell_r(i) += ((now.energy[q] - before.energy[q]) / dt * vi +
                          now.conductivity[q] * (grad_q[q] * gi)) *
                         w;
            for (unsigned int j = 0; j < n; ++j)
              cell_j(i, j) += (now.capacity[q] / dt * fv.shape_value(j, q) * vi +
                               now.conductivity[q] * (fv.shape_grad(j, q) * gi) +
                               now.conductivity_derivative[q] * fv.shape_value(j, q) *
                                   (grad_q[q] * gi)) *
                              w;
          }
        }
        for (const unsigned int f : cell->face_indices())
          if (cell->face(f)->at_boundary() && cell->face(f)->boundary_id() == 0) {
            ffv.reinit(cell, f);
            ffv.get_function_values(T, t_face);
            for (unsigned int q = 0; q < t_face.size(); ++q) {
              const double w = ffv.JxW(q);
              heat_in += h * (fluid - t_face[q]) * w;
              for (unsigned int i = 0; i < n; ++i) {
                cell_r(i) += h * (t_face[q] - fluid) * ffv.shape_value(i, q) * w;
                for (unsigned int j = 0; j < n; ++j)
                  cell_j(i, j) += h * ffv.shape_value(j, q) * ffv.shape_value(i, q) * w;
              }
            }
          }
        cell->get_dof_indices(index);
        for (unsigned int i = 0; i < n; ++i) {
          residual(index[i]) += cell_r(i);
          for (unsigned int j = 0; j < n; ++j)
            jacobian.add(index[i], index[j], cell_j(i, j));
        }
      }
    };

    // 4. Time loop: Newton on each backward-Euler step, then the energy check.
    T_old = T;
    assemble();
    const double stored_start = stored;
    double heat_total = 0.0;
    std::printf("# t (s)   T centre (K)   T face (K)   dE stored (J/m)   heat in (J/m)   "
                "imbalance\n");
    for (unsigned int step = 1; step <= 40; ++step) {
      T_old = T;
      for (unsigned int it = 0; it < 20; ++it) {
        assemble();
        SparseDirectUMFPACK lu;
        lu.initialize(jacobian);
        lu.vmult(update, residual);
        T -= update;
        if (update.linfty_norm() < 1e-9) // K
          break;
      }
      assemble();                 // stored energy and boundary heat rate at the new T
      heat_total += dt * heat_in; // backward Euler: the flux at the new time
      const double change = stored - stored_start;
      std::printf("%8.2f %14.6f %12.6f %17.6e %15.6e %11.1e\n", step * dt,
                  VectorTools::point_value(dofs, T, Point<dim>(side / 2, side / 2)),
                  VectorTools::point_value(dofs, T, Point<dim>(0.0, side / 2)), change,
                  heat_total, std::abs(change - heat_total) / std::abs(heat_total));
    }
    return 0;
  } catch (const quantacal::RangeError& e) {
    std::cerr << "heat_step: temperature out of the material's range: " << e.what()
              << "\n";
  } catch (const std::exception& e) {
    std::cerr << "heat_step: " << e.what() << "\n";
  }
  return 1;
}
