! SPDX-License-Identifier: Apache-2.0
! An outside Fortran program on the installed Fortran module (quantacal::fortran):
! loads a card, evaluates c_p(300 K) in J/kg/K and compares it with the value the
! C++ consumer printed (round-trip decimal, given as the second argument).
program fortran_consumer
  use, intrinsic :: iso_c_binding, only: c_double
  use quantacal
  implicit none
  type(qc_material_t) :: metal
  character(len=4096) :: path, text
  real(c_double) :: cp, expected
  call get_command_argument(1, path)
  call get_command_argument(2, text)
  read (text, *) expected
  if (qc_load(metal, trim(path)) /= qc_ok) error stop qc_error_message()
  if (qc_evaluate(metal, 300.0_c_double, qc_per_mass, capacity=cp) /= qc_ok) &
    error stop qc_error_message()
  write (*, '(a, es24.16e3, a, l1)') 'Fortran cp(300 K) = ', cp, &
    ' J/kg/K, equal to C++: ', cp == expected
  call qc_release(metal)
  if (cp /= expected) error stop 'c_p differs from the C++ value'
end program fortran_consumer
