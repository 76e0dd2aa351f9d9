//! The arch cut into voussoirs, each with its loads: a [`super::Ring`].
