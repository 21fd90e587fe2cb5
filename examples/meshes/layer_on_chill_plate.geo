// SPDX-License-Identifier: Apache-2.0
// A thin alloy layer on a copper chill plate, 2D planar section (per metre of
// depth). Structured quadrilaterals, graded towards the interface so the
// steep gradients on both sides of it are resolved.
//
// Physical tags (deal.II reads them as ids):
//   surface 1 "layer"      material id 1, 0 <= y <= t_layer
//   surface 2 "plate"      material id 2, -t_plate <= y <= 0
//   curve 1   "top"        boundary id 1, free surface of the layer, y = t_layer
//   curve 2   "bottom"     boundary id 2, cooled face of the plate, y = -t_plate
//   curve 3   "sides"      boundary id 3, x = 0 and x = width (insulated by symmetry)
// The interface y = 0 is interior (perfect contact), so it has no tag.
//
// Generate: gmsh -2 -format msh22 layer_on_chill_plate.geo -o layer_on_chill_plate.msh
width = 0.02;     // m
t_layer = 0.001;  // m
t_plate = 0.01;   // m
nx = 21;          // nodes across
ny_layer = 9;     // nodes through the layer
ny_plate = 17;    // nodes through the plate

Point(1) = {0, -t_plate, 0};
Point(2) = {width, -t_plate, 0};
Point(3) = {width, 0, 0};
Point(4) = {0, 0, 0};
Point(5) = {width, t_layer, 0};
Point(6) = {0, t_layer, 0};

Line(1) = {1, 2}; // bottom
Line(2) = {2, 3}; // right side, plate
Line(3) = {3, 4}; // interface
Line(4) = {4, 1}; // left side, plate
Line(5) = {3, 5}; // right side, layer
Line(6) = {5, 6}; // top
Line(7) = {6, 4}; // left side, layer

Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Curve Loop(2) = {-3, 5, 6, 7};
Plane Surface(2) = {2};

Transfinite Curve {1, 3, 6} = nx;
// plate: cells shrink towards the interface (y = 0)
Transfinite Curve {2} = ny_plate Using Progression 0.88;
Transfinite Curve {4} = ny_plate Using Progression 1 / 0.88;
Transfinite Curve {5, 7} = ny_layer;
Transfinite Surface {1} = {1, 2, 3, 4};
Transfinite Surface {2} = {4, 3, 5, 6};
Recombine Surface {1, 2};

Physical Surface("layer", 1) = {2};
Physical Surface("plate", 2) = {1};
Physical Curve("top", 1) = {6};
Physical Curve("bottom", 2) = {1};
Physical Curve("sides", 3) = {2, 4, 5, 7};
