//! Image orientation: how an optical train and its mount turn and mirror the sky.
//!
//! Convention shared by every module: a sky offset is a tangent-plane vector
//! (east, north) in radians; the screen frame is (right, up) as the observer
//! sees it. The naked eye facing the sky, and a chart, show north up and east
//! LEFT: that is the matrix [[-1, 0], [0, 1]] (determinant −1). A train that
//! mirrors the image has determinant +1 in this convention.

use glam::DMat2;

/// The 2×2 map from sky offsets (east, north) to screen (right, up).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkyToScreen {
    pub m: DMat2,
}

impl SkyToScreen {
    /// North up, east left: the chart and naked-eye view.
    pub fn chart() -> Self {
        SkyToScreen { m: DMat2::from_cols_array(&[-1.0, 0.0, 0.0, 1.0]) }
    }
}
