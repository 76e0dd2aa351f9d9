//! Thrust lines through a [`super::Ring`]: given, least and greatest, least thickness, load factor.
