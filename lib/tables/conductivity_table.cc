// SPDX-License-Identifier: Apache-2.0
// ConductivityTable: k(T) and dk/dT through the PropertyTable machinery (k in the
// place of the capacity, dk/dT in the place of its derivative).
#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>
#include <quantacal/tables/conductivity_table.h>

#include <cmath>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace quantacal {
namespace {

const char* const evaluate_function = "quantacal::ConductivityTable::evaluate";
const char* const build_function = "quantacal::ConductivityTable::build";

std::string kelvin(double t) {
  return format_double(t) + " K";
}

/**
 * A conductivity model seen as a ThermalModel for the table builder: C = k,
 * dC/dT = dk/dT, breakpoints the model's. U = 0 here, so the table's U is the
 * integral of its k from the lower end (the Kirchhoff transform); it is not used.
 */
class ConductivityAsThermal final : public ThermalModel {
public:
  ConductivityAsThermal(const ConductivityModel& model, std::string name, double lower,
                        double upper)
      : model_(model), name_(std::move(name)), lower_(lower), upper_(upper) {}
  ThermalState evaluate(double temperature) const override {
    const ConductivityValue k = model_.evaluate(temperature);
    ThermalState s;
    s.capacity = k.value;
    s.capacity_derivative = k.derivative;
    return s;
  }
  double lower_temperature() const override { return lower_; }
  double upper_temperature() const override { return upper_; }
  std::vector<double> breakpoints() const override { return model_.breakpoints(); }
  std::string name() const override { return name_; }

private:
  const ConductivityModel& model_;
  std::string name_;
  double lower_, upper_;
};

} // namespace

std::shared_ptr<const ConductivityTable>
ConductivityTable::build(const ConductivityModel& model, const std::string& name,
                         const TableOptions& options) {
  const double lower = options.lower_temperature;
  const double upper = options.upper_temperature;
  if (!(std::isfinite(lower) && lower >= std::numeric_limits<double>::min()))
    throw RangeError(build_function, name, "a lower temperature > 0 K", lower);
  if (!(std::isfinite(upper) && upper > lower))
    throw RangeError(build_function, name,
                     "a finite upper temperature above " + kelvin(lower), upper);
  std::shared_ptr<ConductivityTable> table(new ConductivityTable);
  table->name_ = name;
  table->lower_ = lower;
  table->upper_ = upper;
  if (model.kind() == "constant") {
    const ConductivityValue k = model.evaluate(lower);
    if (!(std::isfinite(k.value) && k.value > 0.0 && k.derivative == 0.0))
      throw NumericalError(
          build_function,
          name + ": the constant conductivity gives k = " + format_double(k.value) +
              " W/m/K, dk/dT = " + format_double(k.derivative) +
              " W/m/K^2; expected k > 0 and dk/dT = 0");
    table->constant_ = k.value;
    return table;
  }
  const ConductivityAsThermal adapter(model, name, lower, upper);
  table->table_ = PropertyTable::build(adapter, options);
  table->statistics_ = table->table_->statistics();
  table->statistics_.worst_energy_error = 0.0; // U = integral of k: not checked
  return table;
}

ConductivityValue ConductivityTable::evaluate(double temperature) const {
  if (!(temperature >= lower_ && temperature <= upper_))
    throw RangeError(evaluate_function, name_,
                     kelvin(lower_) + " <= T <= " + kelvin(upper_), temperature);
  if (!table_)
    return {constant_, 0.0};
  const ThermalState s = table_->evaluate(temperature);
  return {s.capacity, s.capacity_derivative};
}

void ConductivityTable::evaluate(const double* temperatures, std::size_t n,
                                 double* conductivity, double* derivative) const {
  const auto throw_first_outside = [&] {
    for (std::size_t i = 0; i < n; ++i)
      if (!(temperatures[i] >= lower_ && temperatures[i] <= upper_))
        throw RangeError(evaluate_function, name_,
                         kelvin(lower_) + " <= T <= " + kelvin(upper_), temperatures[i]);
  };
  if (!table_) {
    bool inside = true;
    for (std::size_t i = 0; i < n; ++i)
      inside &= (temperatures[i] >= lower_) & (temperatures[i] <= upper_);
    if (!inside)
      throw_first_outside();
    for (std::size_t i = 0; conductivity && i < n; ++i)
      conductivity[i] = constant_;
    for (std::size_t i = 0; derivative && i < n; ++i)
      derivative[i] = 0.0;
    return;
  }
  try {
    // The table applies the same range rule (its message names the table's function).
    // With both outputs, the table's U goes to a scratch array: asked for all three
    // outputs the table runs its AVX2 kernel where the CPU has it (same numbers).
    if (conductivity && derivative) {
      constexpr std::size_t chunk = 64;
      double scratch[chunk];
      for (std::size_t i = 0; i < n; i += chunk) {
        const std::size_t m = n - i < chunk ? n - i : chunk;
        table_->evaluate(temperatures + i, m, scratch, conductivity + i, derivative + i);
      }
    } else {
      table_->evaluate(temperatures, n, nullptr, conductivity, derivative);
    }
  } catch (const RangeError&) {
    throw_first_outside();
    throw;
  }
}

std::vector<double> ConductivityTable::node_temperatures() const {
  if (!table_)
    return {lower_, upper_};
  return table_->node_temperatures();
}

} // namespace quantacal
