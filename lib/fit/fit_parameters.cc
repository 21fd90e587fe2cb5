// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: free-parameter names, and models with parameters set.
#include "fit_detail.h"
#include <quantacal/fit/fit.h>

#include <memory>

namespace quantacal::fit {
namespace detail {

ModelState apply(const Material& start, const std::vector<FreeParameter>& parameters,
                 const std::vector<double>& values) {
  HeatCapacityModel model = start.model();
  std::shared_ptr<const MetalConductivity> metal;
  for (std::size_t j = 0; j < parameters.size(); ++j) {
    const FreeParameter& f = parameters[j];
    if (f.conductivity) {
      if (!metal)
        metal =
            std::dynamic_pointer_cast<const MetalConductivity>(start.data().conductivity);
      metal = metal->with_parameter(f.name, values[j]);
    } else {
      model = model.with_contribution(
          f.index, model.contributions()[f.index]->with_parameter(f.name, values[j]));
    }
  }
  ModelState s;
  s.model = std::make_shared<const HeatCapacityModel>(std::move(model));
  s.conductivity = metal ? ConductivityPtr(metal) : start.data().conductivity;
  return s;
}

std::vector<FreeParameter> free_parameters(const std::vector<CardParameter>& parameters) {
  std::vector<FreeParameter> out;
  for (const CardParameter& p : parameters)
    out.push_back({p.path, p.conductivity, p.index, p.name, p.unit, p.value});
  return out;
}

} // namespace detail

std::vector<FreeParameter>
resolve_free_parameters(const Material& material, const std::vector<std::string>& names) {
  return detail::free_parameters(resolve_card_parameters(material, names, "--free"));
}

} // namespace quantacal::fit
