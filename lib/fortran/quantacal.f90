! SPDX-License-Identifier: Apache-2.0
!> The Fortran interface of quantacal: a module on the C interface
!> (include/quantacal/c/quantacal.h) through ISO_C_BINDING, with Fortran types,
!> character arguments and assumed-shape arrays.
!>
!> Every procedure returns an integer status (qc_ok = 0, or one of the other
!> qc_* status values); on failure qc_error_message() gives this thread's
!> message (for a card, "path:line:column: ..."). A loaded material is immutable:
!> any number of threads (OpenMP or otherwise) may evaluate one at once. Units
!> are SI: K, J/kg, J/mol, J/m^3, W/m/K.
!>
!>   use quantacal
!>   type(qc_material_t) :: steel
!>   real(c_double) :: t(4) = [300d0, 500d0, 700d0, 900d0], e(4), c(4)
!>   if (qc_load(steel, "materials/steel_c45.yaml") /= qc_ok) stop qc_error_message()
!>   status = qc_evaluate(steel, t, qc_per_volume, energy=e, capacity=c)
!>   call qc_release(steel)
module quantacal
  use, intrinsic :: iso_c_binding, only: c_ptr, c_null_ptr, c_null_char, c_char, c_int, &
                                          c_double, c_size_t, c_loc, c_associated, &
                                          c_f_pointer
  implicit none
  private

  ! Status values (qc_status of the C interface).
  integer, parameter, public :: qc_ok = 0, qc_input_error = 1, qc_range_error = 2, &
                                qc_numerical_error = 3, qc_invalid_argument = 4, &
                                qc_out_of_memory = 5, qc_internal_error = 6
  ! Bases (qc_basis).
  integer, parameter, public :: qc_per_mass = 0, qc_per_mole = 1, qc_per_volume = 2

  !> A loaded material: a handle to the C object. Assignment copies the handle, not
  !> the material: release it once (qc_release), through any one of its copies.
  type, public :: qc_material_t
    type(c_ptr) :: handle = c_null_ptr
  end type qc_material_t

  public :: qc_load, qc_load_text, qc_release, qc_loaded, qc_valid_range, &
            qc_molar_mass, qc_reference_density, qc_density, qc_evaluate, &
            qc_temperature_from_energy, qc_equilibrium, qc_error_message, qc_status_text

  !> Properties at one temperature or at an array of temperatures.
  interface qc_evaluate
    module procedure evaluate_array, evaluate_point
  end interface qc_evaluate

  ! The C flags (qc_property_flag).
  integer(c_int), parameter :: flag_energy = 1, flag_capacity = 2, &
                               flag_capacity_derivative = 4, flag_conductivity = 8, &
                               flag_conductivity_derivative = 16

  interface
    integer(c_int) function c_load_card(path, material) bind(c, name="qc_load_card")
      import :: c_char, c_ptr, c_int
      character(kind=c_char), intent(in) :: path(*)
      type(c_ptr), intent(out) :: material
    end function c_load_card
    integer(c_int) function c_load_card_text(text, name, material) &
        bind(c, name="qc_load_card_text")
      import :: c_char, c_ptr, c_int
      character(kind=c_char), intent(in) :: text(*), name(*)
      type(c_ptr), intent(out) :: material
    end function c_load_card_text
    subroutine c_free(material) bind(c, name="qc_free")
      import :: c_ptr
      type(c_ptr), value :: material
    end subroutine c_free
    integer(c_int) function c_valid_range(material, lower, upper) &
        bind(c, name="qc_valid_range")
      import :: c_ptr, c_int, c_double
      type(c_ptr), value :: material
      real(c_double), intent(out) :: lower, upper
    end function c_valid_range
    integer(c_int) function c_molar_mass(material, value) bind(c, name="qc_molar_mass")
      import :: c_ptr, c_int, c_double
      type(c_ptr), value :: material
      real(c_double), intent(out) :: value
    end function c_molar_mass
    integer(c_int) function c_reference_density(material, value) &
        bind(c, name="qc_reference_density")
      import :: c_ptr, c_int, c_double
      type(c_ptr), value :: material
      real(c_double), intent(out) :: value
    end function c_reference_density
    integer(c_int) function c_density(material, temperature, value) &
        bind(c, name="qc_density")
      import :: c_ptr, c_int, c_double
      type(c_ptr), value :: material
      real(c_double), value :: temperature
      real(c_double), intent(out) :: value
    end function c_density
    integer(c_int) function c_evaluate(material, temperatures, n, basis, flags, energy, &
                                       capacity, capacity_derivative, conductivity, &
                                       conductivity_derivative) bind(c, name="qc_evaluate")
      import :: c_ptr, c_int, c_double, c_size_t
      type(c_ptr), value :: material
      real(c_double), intent(in) :: temperatures(*)
      integer(c_size_t), value :: n
      integer(c_int), value :: basis, flags
      type(c_ptr), value :: energy, capacity, capacity_derivative, conductivity, &
                            conductivity_derivative
    end function c_evaluate
    integer(c_int) function c_temperature_from_energy(material, energies, n, basis, &
                                                      temperatures) &
        bind(c, name="qc_temperature_from_energy")
      import :: c_ptr, c_int, c_double, c_size_t
      type(c_ptr), value :: material
      real(c_double), intent(in) :: energies(*)
      integer(c_size_t), value :: n
      integer(c_int), value :: basis
      real(c_double), intent(out) :: temperatures(*)
    end function c_temperature_from_energy
    integer(c_int) function c_equilibrium(n, materials, masses, initial_temperatures, &
                                          final_temperature, heats) &
        bind(c, name="qc_equilibrium")
      import :: c_ptr, c_int, c_double, c_size_t
      integer(c_size_t), value :: n
      type(c_ptr), intent(in) :: materials(*)
      real(c_double), intent(in) :: masses(*), initial_temperatures(*)
      real(c_double), intent(out) :: final_temperature
      type(c_ptr), value :: heats
    end function c_equilibrium
    type(c_ptr) function c_last_error() bind(c, name="qc_last_error")
      import :: c_ptr
    end function c_last_error
    type(c_ptr) function c_status_name(status) bind(c, name="qc_status_name")
      import :: c_ptr, c_int
      integer(c_int), value :: status
    end function c_status_name
    integer(c_int) function c_set_error(status, message) bind(c, name="qc_set_error")
      import :: c_int, c_char
      integer(c_int), value :: status
      character(kind=c_char), intent(in) :: message(*)
    end function c_set_error
    integer(c_size_t) function c_strlen(text) bind(c, name="strlen")
      import :: c_ptr, c_size_t
      type(c_ptr), value :: text
    end function c_strlen
  end interface

contains

  !> Loads the card at path (trailing blanks ignored); builds its tables. The
  !> material must not hold a card already (qc_invalid_argument: release it first;
  !> it may have copies that still use it).
  integer function qc_load(material, path) result(status)
    type(qc_material_t), intent(inout) :: material
    character(len=*), intent(in) :: path
    status = refuse_loaded(material, "qc_load")
    if (status /= qc_ok) return
    status = c_load_card(trim(path)//c_null_char, material%handle)
  end function qc_load

  !> Loads a card from YAML text (lines joined with new_line('a')); name is what
  !> messages call it.
  integer function qc_load_text(material, text, name) result(status)
    type(qc_material_t), intent(inout) :: material
    character(len=*), intent(in) :: text, name
    status = refuse_loaded(material, "qc_load_text")
    if (status /= qc_ok) return
    status = c_load_card_text(text//c_null_char, trim(name)//c_null_char, &
                              material%handle)
  end function qc_load_text

  !> qc_invalid_argument (and its message) if material holds a card, else qc_ok.
  integer function refuse_loaded(material, caller) result(status)
    type(qc_material_t), intent(in) :: material
    character(len=*), intent(in) :: caller
    status = qc_ok
    if (c_associated(material%handle)) &
      status = c_set_error(qc_invalid_argument, caller//" (Fortran): the material "// &
                           "holds a card already: qc_release it first"//c_null_char)
  end function refuse_loaded

  !> Releases the material (a released or never loaded one is allowed).
  subroutine qc_release(material)
    type(qc_material_t), intent(inout) :: material
    call c_free(material%handle)
    material%handle = c_null_ptr
  end subroutine qc_release

  !> True if the material holds a loaded card.
  logical function qc_loaded(material)
    type(qc_material_t), intent(in) :: material
    qc_loaded = c_associated(material%handle)
  end function qc_loaded

  !> The valid temperature range, K.
  integer function qc_valid_range(material, lower, upper) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(out) :: lower, upper
    status = c_valid_range(material%handle, lower, upper)
  end function qc_valid_range

  !> Molar mass, kg/mol.
  integer function qc_molar_mass(material, molar_mass) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(out) :: molar_mass
    status = c_molar_mass(material%handle, molar_mass)
  end function qc_molar_mass

  !> Reference density, kg/m^3 (the density of qc_per_volume).
  integer function qc_reference_density(material, density) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(out) :: density
    status = c_reference_density(material%handle, density)
  end function qc_reference_density

  !> Density at a temperature, kg/m^3.
  integer function qc_density(material, temperature, density) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(in) :: temperature
    real(c_double), intent(out) :: density
    status = c_density(material%handle, temperature, density)
  end function qc_density

  !> Properties at the temperatures (K) on the basis: each present output is
  !> computed (and must be as long as temperatures); absent ones are not.
  !> energy e (J/kg, J/mol or J/m^3), capacity c_p = de/dT, capacity_derivative
  !> dc_p/dT, conductivity k (W/m/K), conductivity_derivative dk/dT (W/m/K^2).
  integer function evaluate_array(material, temperatures, basis, energy, capacity, &
                                  capacity_derivative, conductivity, &
                                  conductivity_derivative) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(in), contiguous :: temperatures(:)
    integer, intent(in) :: basis
    real(c_double), intent(inout), contiguous, target, optional :: energy(:), &
      capacity(:), capacity_derivative(:), conductivity(:), conductivity_derivative(:)
    type(c_ptr) :: p(5)
    integer(c_int) :: flags
    integer :: n
    n = size(temperatures)
    flags = 0
    p = c_null_ptr
    status = qc_ok
    call take(energy, flag_energy, 1, "energy")
    call take(capacity, flag_capacity, 2, "capacity")
    call take(capacity_derivative, flag_capacity_derivative, 3, "capacity_derivative")
    call take(conductivity, flag_conductivity, 4, "conductivity")
    call take(conductivity_derivative, flag_conductivity_derivative, 5, &
              "conductivity_derivative")
    if (status /= qc_ok) return
    if (flags == 0) then
      status = c_set_error(qc_invalid_argument, "qc_evaluate (Fortran): no output "// &
                           "array given"//c_null_char)
      return
    end if
    status = c_evaluate(material%handle, temperatures, int(n, c_size_t), &
                        int(basis, c_int), flags, p(1), p(2), p(3), p(4), p(5))
  contains
    subroutine take(array, flag, slot, label)
      real(c_double), intent(inout), contiguous, target, optional :: array(:)
      integer(c_int), intent(in) :: flag
      integer, intent(in) :: slot
      character(len=*), intent(in) :: label
      character(len=24) :: sizes
      if (.not. present(array) .or. status /= qc_ok) return
      if (size(array) /= n) then
        write (sizes, '(i0, " for ", i0)') size(array), n
        status = c_set_error(qc_invalid_argument, "qc_evaluate (Fortran): "//label// &
                             " has "//trim(sizes)//" temperatures"//c_null_char)
        return
      end if
      flags = ior(flags, flag)
      if (n > 0) p(slot) = c_loc(array)
    end subroutine take
  end function evaluate_array

  !> Properties at one temperature: the per-integration-point form.
  integer function evaluate_point(material, temperature, basis, energy, capacity, &
                                  capacity_derivative, conductivity, &
                                  conductivity_derivative) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(in) :: temperature
    integer, intent(in) :: basis
    real(c_double), intent(out), target, optional :: energy, capacity, &
      capacity_derivative, conductivity, conductivity_derivative
    real(c_double), target :: t(1)
    type(c_ptr) :: p(5)
    integer(c_int) :: flags
    t(1) = temperature
    flags = 0
    p = c_null_ptr
    if (present(energy)) then
      flags = ior(flags, flag_energy)
      p(1) = c_loc(energy)
    end if
    if (present(capacity)) then
      flags = ior(flags, flag_capacity)
      p(2) = c_loc(capacity)
    end if
    if (present(capacity_derivative)) then
      flags = ior(flags, flag_capacity_derivative)
      p(3) = c_loc(capacity_derivative)
    end if
    if (present(conductivity)) then
      flags = ior(flags, flag_conductivity)
      p(4) = c_loc(conductivity)
    end if
    if (present(conductivity_derivative)) then
      flags = ior(flags, flag_conductivity_derivative)
      p(5) = c_loc(conductivity_derivative)
    end if
    ! flags 0 (no output present) is reported by the C call as an invalid argument
    status = c_evaluate(material%handle, t, 1_c_size_t, int(basis, c_int), flags, &
                        p(1), p(2), p(3), p(4), p(5))
  end function evaluate_point

  !> The temperatures (K) at which the stored energy on the basis equals energies.
  integer function qc_temperature_from_energy(material, energies, basis, &
                                              temperatures) result(status)
    type(qc_material_t), intent(in) :: material
    real(c_double), intent(in), contiguous :: energies(:)
    integer, intent(in) :: basis
    real(c_double), intent(out), contiguous :: temperatures(:)
    if (size(temperatures) /= size(energies)) then
      status = c_set_error(qc_invalid_argument, "qc_temperature_from_energy "// &
                           "(Fortran): temperatures and energies differ in size"// &
                           c_null_char)
      return
    end if
    status = c_temperature_from_energy(material%handle, energies, &
                                       int(size(energies), c_size_t), &
                                       int(basis, c_int), temperatures)
  end function qc_temperature_from_energy

  !> The common final temperature (K) of bodies in contact (masses in kg, starts
  !> in K); heats, if present, receives each body's heat, J (+ taken, - given).
  integer function qc_equilibrium(materials, masses, initial_temperatures, &
                                  final_temperature, heats) result(status)
    type(qc_material_t), intent(in) :: materials(:)
    real(c_double), intent(in), contiguous :: masses(:), initial_temperatures(:)
    real(c_double), intent(out) :: final_temperature
    real(c_double), intent(out), contiguous, target, optional :: heats(:)
    type(c_ptr) :: handles(size(materials)), heat_pointer
    integer :: i
    if (size(masses) /= size(materials) .or. &
        size(initial_temperatures) /= size(materials)) then
      status = c_set_error(qc_invalid_argument, "qc_equilibrium (Fortran): "// &
                           "materials, masses and initial_temperatures differ in "// &
                           "size"//c_null_char)
      return
    end if
    heat_pointer = c_null_ptr
    if (present(heats)) then
      if (size(heats) /= size(materials)) then
        status = c_set_error(qc_invalid_argument, "qc_equilibrium (Fortran): heats "// &
                             "differs in size from materials"//c_null_char)
        return
      end if
      if (size(heats) > 0) heat_pointer = c_loc(heats)
    end if
    do i = 1, size(materials)
      handles(i) = materials(i)%handle
    end do
    status = c_equilibrium(int(size(materials), c_size_t), handles, masses, &
                           initial_temperatures, final_temperature, heat_pointer)
  end function qc_equilibrium

  !> The message of this thread's last failed call ("" after a successful one).
  function qc_error_message() result(message)
    character(len=:), allocatable :: message
    message = c_text(c_last_error())
  end function qc_error_message

  !> The name of a status value ("ok", "range error", ...).
  function qc_status_text(status) result(text)
    integer, intent(in) :: status
    character(len=:), allocatable :: text
    text = c_text(c_status_name(int(status, c_int)))
  end function qc_status_text

  !> A NUL-terminated C string as a Fortran string.
  function c_text(pointer) result(text)
    type(c_ptr), intent(in) :: pointer
    character(len=:), allocatable :: text
    character(kind=c_char), pointer :: chars(:)
    integer :: i, n
    if (.not. c_associated(pointer)) then
      text = ""
      return
    end if
    n = int(c_strlen(pointer))
    call c_f_pointer(pointer, chars, [n])
    allocate (character(len=n) :: text)
    do i = 1, n
      text(i:i) = chars(i)
    end do
  end function c_text

end module quantacal
