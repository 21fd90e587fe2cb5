# SPDX-License-Identifier: Apache-2.0
"""The exceptions of quantacal, one class per kind of failure.

They mirror the C++ types of quantacal/common/exceptions.h and keep their
context as attributes, so a caller can both print a message and act on its
parts:

- InputError (also a ValueError): a card, a unit string or an argument is
  malformed or non-physical; ``file``, ``line`` and ``column`` (1-based, 0 if
  unknown), ``field``, ``value`` and ``expected``;
- RangeError (also a ValueError): a temperature or energy outside a material's
  valid range, or NaN; ``function``, ``subject`` (the material), ``condition``,
  ``value`` and, for an array argument, ``index`` of the first offending point;
- NumericalError (also a RuntimeError): a computation did not reach its goal;
  ``function``.

All three derive from quantacal.Error. The extension module raises them; this
file holds no logic of its own besides keeping the attributes through pickling.
"""

__all__ = ["Error", "InputError", "RangeError", "NumericalError"]


class Error(Exception):
    """Base class of every error quantacal raises."""

    _fields = ()

    def __init__(self, message="", **context):
        super().__init__(message)
        for name in self._fields:
            setattr(self, name, context.pop(name, getattr(type(self), "_default_" + name, None)))
        if context:
            raise TypeError(f"{type(self).__name__}: unknown attribute(s) {sorted(context)}")

    def __reduce__(self):
        return (_rebuild, (type(self), str(self), {n: getattr(self, n) for n in self._fields}))


def _rebuild(cls, message, context):
    return cls(message, **context)


class InputError(Error, ValueError):
    """Malformed or non-physical input: a card (file or text), a unit, an argument.

    Attributes: file (str, "" for an argument), line and column (int, 1-based,
    0 if unknown), field (the field path, e.g. ``heat_capacity[0].theta_D``, or
    the argument's name), value (the raw text of the offending value),
    expected (what was expected, in words).
    """

    _fields = ("file", "line", "column", "field", "value", "expected")
    _default_file = ""
    _default_line = 0
    _default_column = 0
    _default_field = ""
    _default_value = ""
    _default_expected = ""


class RangeError(Error, ValueError):
    """A temperature or energy outside a material's valid range (or NaN).

    Attributes: function (the C++ call that refused it), subject (the
    material), condition (e.g. ``4 K <= T <= 1500 K``), value (the offending
    number, SI), index (tuple: where the first offending point is in the array
    argument; () for a scalar; None if unknown).
    """

    _fields = ("function", "subject", "condition", "value", "index")
    _default_function = ""
    _default_subject = ""
    _default_condition = ""


class NumericalError(Error, RuntimeError):
    """A computation that did not reach its goal (a table that missed its
    tolerance, a root finder that did not converge). Attribute: function."""

    _fields = ("function",)
    _default_function = ""

for _cls in (Error, InputError, RangeError, NumericalError):
    _cls.__module__ = "quantacal"  # as users name them: quantacal.InputError
