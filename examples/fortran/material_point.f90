! SPDX-License-Identifier: Apache-2.0
!> The material routine of a Fortran finite-element code, in the shape such codes
!> call at every integration point: temperature in; internal energy, its
!> temperature derivative, conductivity and its derivative out. The material is
!> loaded once (quench_material_load) and only read afterwards, so the routine may
!> be called from any number of threads at once.
module quench_material
  use, intrinsic :: iso_c_binding, only: c_double
  use quantacal
  implicit none
  private
  public :: quench_material_load, quench_material_release, material_point

  !> The loaded card: set once before the first integration point, then read-only.
  type(qc_material_t), save :: metal

contains

  !> Loads the card at path; stops the program with the library's message if it
  !> cannot (a located "path:line:column: ..." for a bad card).
  subroutine quench_material_load(path)
    character(len=*), intent(in) :: path
    if (qc_load(metal, path) /= qc_ok) error stop qc_error_message()
  end subroutine quench_material_load

  subroutine quench_material_release()
    call qc_release(metal)
  end subroutine quench_material_release

  !> Properties at one integration point.
  !> @param temperature  K, inside the card's valid range
  !> @param per_volume   .true.: u in J/m^3 of the reference volume; .false.: J/kg
  !> @param u            internal energy from the card's reference temperature
  !> @param du_dt        du/dT (rho c_p, J/m^3/K, or c_p, J/kg/K)
  !> @param k            conductivity, W/m/K
  !> @param dk_dt        dk/dT, W/m/K^2
  !> @param status       qc_ok, or qc_range_error outside the valid range (cut the
  !>                     time step), or another qc_* status; the message is
  !>                     qc_error_message()
  subroutine material_point(temperature, per_volume, u, du_dt, k, dk_dt, status)
    real(c_double), intent(in) :: temperature
    logical, intent(in) :: per_volume
    real(c_double), intent(out) :: u, du_dt, k, dk_dt
    integer, intent(out) :: status
    integer :: basis
    basis = qc_per_mass
    if (per_volume) basis = qc_per_volume
    status = qc_evaluate(metal, temperature, basis, energy=u, capacity=du_dt, &
                         conductivity=k, conductivity_derivative=dk_dt)
  end subroutine material_point

end module quench_material
