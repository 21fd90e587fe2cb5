// SPDX-License-Identifier: Apache-2.0
// Quarter of the meridian section of a sphere of radius R, for 2D
// axisymmetric runs (x = r >= 0, y = z >= 0): by symmetry the quadrant with an
// insulated equatorial plane is the whole sphere. An O-grid of quadrilaterals
// (a core block and two blocks under the curved surface), all structured, so
// deal.II's GridIn::read_msh gets quads only.
//
// Physical tags (deal.II reads them as ids):
//   surface 1            material id 1 (the body)
//   curve 1  "surface"   boundary id 1, the sphere's surface r^2 + z^2 = R^2
//   curve 2  "equator"   boundary id 2, the plane z = 0 (insulated by symmetry)
//   curve 3  "axis"      boundary id 3, the axis r = 0 (insulated)
//
// Generate: gmsh -2 -format msh22 sphere_quadrant.geo -o sphere_quadrant.msh
R = 0.05;   // m, sphere radius
n = 13;     // nodes along the core edges and along each half of the arc
m = 13;     // nodes from the core to the surface
a = 0.5 * R;  // half-width of the core block on the axes
c = 0.42 * R; // corner of the core block on the diagonal

Point(1) = {0, 0, 0};
Point(2) = {a, 0, 0};
Point(3) = {c, c, 0};
Point(4) = {0, a, 0};
Point(5) = {R, 0, 0};
Point(6) = {R * Sqrt(0.5), R * Sqrt(0.5), 0};
Point(7) = {0, R, 0};

Line(1) = {1, 2};        // equator, core
Line(2) = {2, 3};
Line(3) = {3, 4};
Line(4) = {4, 1};        // axis, core
Line(5) = {2, 5};        // equator, outer block
Line(6) = {3, 6};
Line(7) = {4, 7};        // axis, outer block
Circle(8) = {5, 1, 6};   // surface, lower half of the arc
Circle(9) = {6, 1, 7};   // surface, upper half of the arc

Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Curve Loop(2) = {5, 8, -6, -2};
Plane Surface(2) = {2};
Curve Loop(3) = {6, 9, -7, -3};
Plane Surface(3) = {3};

Transfinite Curve {1, 2, 3, 4, 8, 9} = n;
Transfinite Curve {5, 6, 7} = m;
Transfinite Surface {1} = {1, 2, 3, 4};
Transfinite Surface {2} = {2, 5, 6, 3};
Transfinite Surface {3} = {3, 6, 7, 4};
Recombine Surface {1, 2, 3};

Physical Surface("body", 1) = {1, 2, 3};
Physical Curve("surface", 1) = {8, 9};
Physical Curve("equator", 2) = {1, 5};
Physical Curve("axis", 3) = {4, 7};
