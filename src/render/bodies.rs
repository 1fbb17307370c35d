//! Moon and planets (being drawn in the next step).
use super::raster::Canvas;
use super::{Palette, ViewTransform};
use crate::scene::Scene;
pub(crate) fn draw_bodies(_cv: &mut Canvas, _scene: &Scene, _t: &ViewTransform, _dpr: f32, _pal: &Palette, _rows: (usize, usize)) {}
