//! The intrados and extrados as polylines, left to right, and their checks.
