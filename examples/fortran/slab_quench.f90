! SPDX-License-Identifier: Apache-2.0
!> A 1D quench with the material routine of material_point.f90: a plate of a bundled
!> card cooled on both faces by a fluid through a heat-transfer coefficient h, by
!> the method of lines in energy form,
!>
!>   V_i (E(T_i) - E(T_i,old)) / dt + F(i+1/2) - F(i-1/2) = - [i = n] h (T_n - T_fluid),
!>   F(i+1/2) = - (k_i + k_(i+1))/2 (T_(i+1) - T_i) / dx,
!>
!> on the half thickness (symmetry at x = 0), vertex-centred finite volumes, backward
!> Euler with Newton (consistent tridiagonal Jacobian from dE/dT and dk/dT). Summing
!> the equations, the fluxes cancel: the stored energy changes by exactly the heat
!> through the face, to the Newton tolerance, whatever c_p(T) does inside a step.
!> The program checks that balance every step and at the end.
!>
!> Usage: slab_quench CARD [T_start T_fluid h half_thickness t_end steps]
!> Defaults (illustrative, not a measured case): copper-like plate 20 mm thick from
!> 300 K into a 77 K bath with h = 500 W/m^2/K for 300 s in 150 steps.
program slab_quench
  use, intrinsic :: iso_c_binding, only: c_double
  use quantacal, only: qc_ok, qc_error_message
  use quench_material
  implicit none
  integer, parameter :: n_cells = 40, max_newton = 30
  real(c_double), parameter :: newton_tolerance = 1d-11 ! K, on the update
  real(c_double), parameter :: balance_tolerance = 1d-10 ! relative, per step and total
  character(len=1024) :: card, text
  real(c_double) :: t_start, t_fluid, h, half, t_end, dt, dx, time
  real(c_double) :: t(0:n_cells), t_new(0:n_cells), e_old(0:n_cells), volume(0:n_cells)
  real(c_double) :: e(0:n_cells), c(0:n_cells), k(0:n_cells), dk(0:n_cells)
  real(c_double) :: residual(0:n_cells), lower(0:n_cells), diagonal(0:n_cells), &
                    upper(0:n_cells), update(0:n_cells)
  real(c_double) :: stored_start, stored, heat_in, step_heat, step_stored, worst_step
  integer :: steps, step, iteration, i, status, newton_total
  logical :: converged

  call get_command_argument(1, card)
  if (len_trim(card) == 0) error stop "usage: slab_quench CARD [T_start T_fluid h half_thickness t_end steps]"
  t_start = real_argument(2, 300d0)
  t_fluid = real_argument(3, 77d0)
  h = real_argument(4, 500d0)       ! W/m^2/K, illustrative
  half = real_argument(5, 0.01d0)   ! m
  t_end = real_argument(6, 300d0)   ! s
  steps = nint(real_argument(7, 150d0))
  call quench_material_load(trim(card))

  dx = half / n_cells
  dt = t_end / steps
  volume = dx
  volume(0) = dx / 2
  volume(n_cells) = dx / 2
  t = t_start
  call properties(t)
  stored_start = sum(volume * e)
  stored = stored_start
  heat_in = 0
  worst_step = 0
  newton_total = 0
  time = 0

  write (*, '(a)') "#  t (s)   T centre (K)   T face (K)   dE stored (J/m^2)   heat in (J/m^2)   step imbalance"
  do step = 1, steps
    e_old = e
    t_new = t
    converged = .false.
    do iteration = 1, max_newton
      call properties(t_new)
      call assemble(t_new)
      call solve_tridiagonal(lower, diagonal, upper, -residual, update)
      t_new = t_new + update
      newton_total = newton_total + 1
      if (maxval(abs(update)) < newton_tolerance) then
        converged = .true.
        exit
      end if
    end do
    if (.not. converged) error stop "slab_quench: Newton did not converge"
    call properties(t_new)
    t = t_new
    time = step * dt
    ! The balance of this step: stored-energy change against the heat in through the
    ! face at the new temperature (backward Euler), per unit area of one face.
    step_stored = sum(volume * (e - e_old))
    step_heat = -dt * h * (t(n_cells) - t_fluid)
    worst_step = max(worst_step, abs(step_stored - step_heat) / abs(step_heat))
    stored = stored + step_stored
    heat_in = heat_in + step_heat
    if (mod(step, max(1, steps / 10)) == 0) write (*, '(f8.1, 2f14.6, 2es20.10, es15.2)') time, &
      t(0), t(n_cells), stored - stored_start, heat_in, abs(step_stored - step_heat) / abs(step_heat)
  end do

  write (*, '(a, i0, a, f5.2, a)') "Newton iterations: ", newton_total, " (", &
    real(newton_total) / steps, " per step)"
  write (*, '(a, es10.2, a, es10.2)') "energy balance: worst step ", worst_step, &
    ", whole run ", abs((stored - stored_start) - heat_in) / abs(heat_in)
  call check(worst_step < balance_tolerance, "a step's energy balance")
  call check(abs((stored - stored_start) - heat_in) < balance_tolerance * abs(heat_in), &
             "the whole run's energy balance")
  call check(all(t > t_fluid) .and. all(t < t_start), "temperatures between fluid and start")
  call check(t(0) >= t(n_cells), "the centre is the warmest point")
  call quench_material_release()

contains

  !> e = rho e(T) (J/m^3), c = dE/dT, k, dk/dT at every node through the
  !> per-point routine.
  subroutine properties(temperatures)
    real(c_double), intent(in) :: temperatures(0:n_cells)
    integer :: j
    do j = 0, n_cells
      call material_point(temperatures(j), .true., e(j), c(j), k(j), dk(j), status)
      if (status /= qc_ok) then
        write (*, '(a)') "slab_quench: "//qc_error_message()
        error stop 1
      end if
    end do
  end subroutine properties

  !> Residual and its tridiagonal Jacobian at temperatures tt (properties current).
  subroutine assemble(tt)
    real(c_double), intent(in) :: tt(0:n_cells)
    real(c_double) :: kf, flux, dflux_left, dflux_right
    integer :: j
    residual = volume * (e - e_old) / dt
    diagonal = volume * c / dt
    lower = 0
    upper = 0
    do j = 0, n_cells - 1
      kf = (k(j) + k(j + 1)) / 2
      flux = -kf * (tt(j + 1) - tt(j)) / dx
      dflux_left = -dk(j) / 2 * (tt(j + 1) - tt(j)) / dx + kf / dx
      dflux_right = -dk(j + 1) / 2 * (tt(j + 1) - tt(j)) / dx - kf / dx
      residual(j) = residual(j) + flux
      residual(j + 1) = residual(j + 1) - flux
      diagonal(j) = diagonal(j) + dflux_left
      upper(j) = upper(j) + dflux_right
      lower(j + 1) = lower(j + 1) - dflux_left
      diagonal(j + 1) = diagonal(j + 1) - dflux_right
    end do
    residual(n_cells) = residual(n_cells) + h * (tt(n_cells) - t_fluid)
    diagonal(n_cells) = diagonal(n_cells) + h
  end subroutine assemble

  !> Thomas algorithm: a tridiagonal system (lower(0) and upper(n) unused).
  subroutine solve_tridiagonal(a, b, cc, rhs, x)
    real(c_double), intent(in) :: a(0:n_cells), b(0:n_cells), cc(0:n_cells), rhs(0:n_cells)
    real(c_double), intent(out) :: x(0:n_cells)
    real(c_double) :: cp(0:n_cells), dp(0:n_cells), m
    integer :: j
    cp(0) = cc(0) / b(0)
    dp(0) = rhs(0) / b(0)
    do j = 1, n_cells
      m = b(j) - a(j) * cp(j - 1)
      cp(j) = cc(j) / m
      dp(j) = (rhs(j) - a(j) * dp(j - 1)) / m
    end do
    x(n_cells) = dp(n_cells)
    do j = n_cells - 1, 0, -1
      x(j) = dp(j) - cp(j) * x(j + 1)
    end do
  end subroutine solve_tridiagonal

  real(c_double) function real_argument(position, default)
    integer, intent(in) :: position
    real(c_double), intent(in) :: default
    call get_command_argument(position, text)
    real_argument = default
    if (len_trim(text) > 0) read (text, *) real_argument
  end function real_argument

  subroutine check(condition, what)
    logical, intent(in) :: condition
    character(len=*), intent(in) :: what
    if (.not. condition) then
      write (*, '(a)') "slab_quench: check failed: "//what
      error stop 1
    end if
    write (*, '(a)') "ok: "//what
  end subroutine check

end program slab_quench
