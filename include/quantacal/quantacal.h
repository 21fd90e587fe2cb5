// SPDX-License-Identifier: Apache-2.0
/**
 * @file quantacal.h
 * @brief Umbrella header of the quantacal core (no deal.II, no yaml-cpp).
 */
#ifndef QUANTACAL_QUANTACAL_H
#define QUANTACAL_QUANTACAL_H

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_parameters.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/cards/units.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/material/equilibrium.h>
#include <quantacal/material/material.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/metal_conductivity.h>
#include <quantacal/models/thermal_model.h>
#include <quantacal/models/thermal_state.h>
#include <quantacal/tables/conductivity_table.h>
#include <quantacal/tables/property_table.h>
#include <quantacal/version.h>

#endif
