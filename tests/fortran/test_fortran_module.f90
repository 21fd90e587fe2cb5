! SPDX-License-Identifier: Apache-2.0
!> The Fortran module on the C interface (lib/fortran/quantacal.f90): array and
!> point forms agree with each other and with strided (non-contiguous) arrays, the
!> inverse and the equilibrium, and the error paths (status and message text).
!> Usage: test_fortran_module MATERIALS_FOLDER
program test_fortran_module
  use, intrinsic :: iso_c_binding, only: c_double
  use quantacal
  implicit none
  character(len=1024) :: folder
  type(qc_material_t) :: cu, other(2), spare
  real(c_double) :: lower, upper, molar_mass, density, tf
  real(c_double) :: t(6), e(6), c(6), dc(6), k(6), dk(6), back(6), heats(2)
  real(c_double) :: e1, c1, dc1, k1, dk1, strided(12), short(3)
  integer :: failures, i, status

  failures = 0
  call get_command_argument(1, folder)
  call expect(qc_load(cu, trim(folder)//"/copper.yaml"), qc_ok, "load copper")
  call expect(qc_valid_range(cu, lower, upper), qc_ok, "valid range")
  call check(lower == 4 .and. upper == 1500, "copper.yaml's valid_range, 4 K to 1500 K")
  call expect(qc_molar_mass(cu, molar_mass), qc_ok, "molar mass")
  call expect(qc_reference_density(cu, density), qc_ok, "reference density")
  call expect(qc_density(cu, 300d0, e1), qc_ok, "density at 300 K")
  call check(e1 == density, "one phase at 300 K: the reference density")

  t = [4d0, 20d0, 77d0, 300d0, 900d0, 1500d0]
  call expect(qc_evaluate(cu, t, qc_per_volume, energy=e, capacity=c, &
                          capacity_derivative=dc, conductivity=k, &
                          conductivity_derivative=dk), qc_ok, "evaluate an array")
  do i = 1, 6
    call expect(qc_evaluate(cu, t(i), qc_per_volume, e1, c1, dc1, k1, dk1), qc_ok, &
                "evaluate a point")
    call check(e1 == e(i) .and. c1 == c(i) .and. dc1 == dc(i) .and. k1 == k(i) .and. &
               dk1 == dk(i), "point and array forms agree")
  end do
  ! A strided section (copied in and out by the contiguous dummy)
  strided = -1
  call expect(qc_evaluate(cu, t, qc_per_volume, capacity=strided(1:12:2)), qc_ok, &
              "evaluate into a strided section")
  call check(all(strided(1:12:2) == c) .and. all(strided(2:12:2) == -1), &
             "strided output: the same numbers, the gaps untouched")
  ! per mass = per volume / density
  call expect(qc_evaluate(cu, t, qc_per_mass, capacity=back), qc_ok, "per mass")
  call check(all(abs(back * density / c - 1) < 1d-14), "per volume = density x per mass")

  call expect(qc_temperature_from_energy(cu, e, qc_per_volume, back), qc_ok, "inverse")
  call check(all(abs(back / t - 1) < 1d-12), "T(e(T)) = T")

  ! Equal masses of copper at 300 K and 400 K: between the starts, heats balance.
  other(1) = cu
  other(2) = cu
  call expect(qc_equilibrium(other, [1d0, 1d0], [300d0, 400d0], tf, heats), qc_ok, &
              "equilibrium")
  call check(tf > 340 .and. tf < 360 .and. abs(heats(1) + heats(2)) < 1d-8 * heats(1), &
             "equal bodies meet near the mean, heats balance")

  ! Error paths.
  call expect(qc_evaluate(cu, [300d0, 2000d0], qc_per_mass, energy=e(1:2)), &
              qc_range_error, "out of range")
  call contains("temperatures[1] = 2000 K")
  call contains("requires 4 K <= T <= 1500 K")
  call expect(qc_evaluate(cu, t, qc_per_mass, energy=short), qc_invalid_argument, &
              "an output of the wrong size")
  call contains("energy has 3 for 6 temperatures")
  call expect(qc_evaluate(cu, t, qc_per_mass), qc_invalid_argument, "no output")
  call contains("no output array given")
  call expect(qc_evaluate(cu, 300d0, qc_per_mass), qc_invalid_argument, &
              "no output at a point")
  call contains("flags = 0")
  call expect(qc_evaluate(cu, t, 7, energy=e), qc_invalid_argument, "a bad basis")
  call contains("basis = 7")
  call expect(qc_equilibrium(other, [1d0], [300d0, 400d0], tf), qc_invalid_argument, &
              "equilibrium sizes")
  call contains("differ in size")
  call expect(qc_load(other(1), trim(folder)//"/copper.yaml"), qc_invalid_argument, &
              "loading into a handle that holds a card (a copy of cu)")
  call contains("holds a card already")
  call expect(qc_load(spare, trim(folder)//"/no-such-card.yaml"), qc_input_error, &
              "a missing card")
  call contains("no-such-card.yaml: cannot open the card file")
  call check(.not. qc_loaded(spare), "a failed load leaves no handle")
  call expect(qc_load_text(spare, "name: x"//new_line('a')//"molar_mass: [1, 2", &
                           "bad.yaml"), qc_input_error, "malformed YAML text")
  call contains("bad.yaml:")
  call contains("YAML syntax error")
  call check(qc_status_text(qc_range_error) == "range error", "status names")

  call qc_release(cu)
  call qc_release(cu) ! a released handle may be released again
  if (failures > 0) then
    write (*, '(i0, a)') failures, " checks failed"
    error stop 1
  end if
  write (*, '(a)') "test_fortran_module: all checks passed"

contains

  subroutine expect(got, wanted, what)
    integer, intent(in) :: got, wanted
    character(len=*), intent(in) :: what
    if (got /= wanted) then
      write (*, '(a)') "FAILED "//what//": got "//qc_status_text(got)//", expected "// &
        qc_status_text(wanted)//": "//qc_error_message()
      failures = failures + 1
    end if
  end subroutine expect

  subroutine contains(fragment)
    character(len=*), intent(in) :: fragment
    if (index(qc_error_message(), fragment) == 0) then
      write (*, '(a)') "FAILED message """//qc_error_message()//""" lacks """// &
        fragment//""""
      failures = failures + 1
    end if
  end subroutine contains

  subroutine check(condition, what)
    logical, intent(in) :: condition
    character(len=*), intent(in) :: what
    if (.not. condition) then
      write (*, '(a)') "FAILED "//what
      failures = failures + 1
    end if
  end subroutine check

end program test_fortran_module
