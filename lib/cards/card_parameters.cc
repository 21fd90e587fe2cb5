// SPDX-License-Identifier: Apache-2.0
// The numeric parameters of a loaded card, named by field path.
#include <quantacal/cards/card_parameters.h>

#include <quantacal/common/exceptions.h>
#include <quantacal/common/text.h>
#include <quantacal/models/metal_conductivity.h>

#include <map>
#include <memory>

namespace quantacal {
namespace {

std::string joined(const std::vector<std::string>& items) {
  std::string list;
  for (const auto& item : items)
    list += (list.empty() ? "" : ", ") + item;
  return list;
}

} // namespace

std::vector<CardParameter> card_parameters(const Material& material) {
  std::vector<CardParameter> all;
  const auto& contributions = material.model().contributions();
  // A card with phases holds one term, the phase sequence, whose parameters are
  // named by their card paths already ("phases[1].from.temperature").
  const bool phased = material.data().phase_layout != nullptr;
  for (std::size_t i = 0; i < contributions.size(); ++i)
    for (const Parameter& p : contributions[i]->parameters())
      all.push_back(
          {phased ? p.name : "heat_capacity[" + std::to_string(i) + "]." + p.name, false,
           i, p.name, p.unit, p.value});
  const auto metal =
      std::dynamic_pointer_cast<const MetalConductivity>(material.data().conductivity);
  if (metal)
    for (const Parameter& p : metal->parameters())
      all.push_back({"conductivity." + p.name, true, 0, p.name, p.unit, p.value});
  return all;
}

std::vector<CardParameter> resolve_card_parameters(const Material& material,
                                                   const std::vector<std::string>& names,
                                                   const std::string& option) {
  const auto fail = [&](const std::string& what) {
    return InputError::argument(option, "", "", what);
  };
  // All parameters by full path, and bare names with the paths they can mean.
  const std::vector<CardParameter> all = card_parameters(material);
  // (the bare name is the last part of the path: "theta_D" for
  // "phases[0].heat_capacity[0].theta_D")
  std::map<std::string, std::vector<std::size_t>> bare;
  for (std::size_t k = 0; k < all.size(); ++k)
    if (!all[k].conductivity)
      bare[all[k].name.substr(all[k].name.rfind('.') + 1)].push_back(k);
  std::vector<std::string> choices;
  for (const auto& p : all)
    choices.push_back(p.path);
  for (const auto& [name, list] : bare)
    if (list.size() == 1)
      choices.push_back(name);

  std::vector<CardParameter> out;
  for (const std::string& raw : names) {
    const CardParameter* found = nullptr;
    for (const auto& p : all)
      if (p.path == raw)
        found = &p;
    const auto it = found ? bare.end() : bare.find(raw);
    if (it != bare.end() && it->second.size() == 1) {
      found = &all[it->second.front()];
    } else if (it != bare.end()) {
      std::vector<std::string> paths;
      for (std::size_t k : it->second)
        paths.push_back(all[k].path);
      throw fail("'" + raw +
                 "' is ambiguous in this card; name one of: " + joined(paths));
    }
    if (!found) {
      std::string hint = did_you_mean(raw, choices);
      const bool metal = std::dynamic_pointer_cast<const MetalConductivity>(
                             material.data().conductivity) != nullptr;
      if (raw.rfind("conductivity.", 0) == 0 && !metal)
        hint += " (the card's conductivity is of kind '" +
                material.data().conductivity->kind() +
                "', which has no parameters to fit; use kind 'metal')";
      throw fail("unknown parameter '" + raw + "'" + hint +
                 "; this card has: " + joined(choices));
    }
    for (const auto& o : out)
      if (o.path == found->path)
        throw fail("parameter '" + raw + "' given twice (as " + o.path + ")");
    out.push_back(*found);
  }
  if (out.empty())
    throw fail("expected at least one parameter name");
  return out;
}

} // namespace quantacal
