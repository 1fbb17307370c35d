//! Generic presets (no brands): typical club instruments and accessories.

use super::train::*;

/// A named train the app can offer as a starting point.
#[derive(Clone, Debug, PartialEq)]
pub struct Preset {
    pub id: &'static str,
    pub train: Train,
}

fn scope(name: &str, design: Design, aperture_mm: f64, focal_length_mm: f64, obstruction_mm: f64, mount: Mount, accessories: Vec<Accessory>) -> Train {
    Train {
        name: name.to_string(),
        instrument: Instrument::Telescope(Telescope {
            design,
            aperture_mm,
            focal_length_mm,
            obstruction_mm,
            mirror_reflectivity: default_mirror_reflectivity(),
            glass_transmission: default_glass_transmission(),
        }),
        accessories,
        mount,
    }
}

/// An eyepiece with the simple field rule's stop and a typical eye relief.
pub fn eyepiece(focal_length_mm: f64, apparent_field_deg: f64) -> Eyepiece {
    let barrel = if focal_length_mm * apparent_field_deg.to_radians() > Barrel::In125.max_field_stop_mm() {
        Barrel::In2
    } else {
        Barrel::In125
    };
    Eyepiece {
        focal_length_mm,
        apparent_field_deg,
        field_stop_mm: None,
        eye_relief_mm: None,
        barrel,
        transmission: default_eyepiece_transmission(),
    }
}

/// Generic eyepieces: (label, eyepiece). Field stops left empty (unknown).
pub fn eyepieces() -> Vec<(&'static str, Eyepiece)> {
    vec![
        ("32 mm 52°", Eyepiece { field_stop_mm: Some(27.0), eye_relief_mm: Some(22.0), barrel: Barrel::In125, ..eyepiece(32.0, 52.0) }),
        ("25 mm 52°", Eyepiece { eye_relief_mm: Some(17.0), ..eyepiece(25.0, 52.0) }),
        ("20 mm 68°", eyepiece(20.0, 68.0)),
        ("15 mm 60°", eyepiece(15.0, 60.0)),
        ("10 mm 52°", Eyepiece { eye_relief_mm: Some(7.0), ..eyepiece(10.0, 52.0) }),
        ("6 mm 60°", eyepiece(6.0, 60.0)),
        ("3.7 mm 60°", eyepiece(3.7, 60.0)),
        ("30 mm 82° (2″)", Eyepiece { barrel: Barrel::In2, field_stop_mm: Some(42.0), ..eyepiece(30.0, 82.0) }),
    ]
}

fn ep(label: &str) -> Accessory {
    let e = eyepieces().into_iter().find(|(l, _)| *l == label).map(|(_, e)| e).unwrap_or_else(|| eyepiece(25.0, 52.0));
    Accessory::Eyepiece(e)
}

fn mirror_diagonal() -> Accessory {
    Accessory::StarDiagonal(StarDiagonal { prism: DiagonalKind::Mirror90, rotation_deg: 0.0, transmission: None })
}

/// Generic trains for a club night.
pub fn presets() -> Vec<Preset> {
    let altaz = Mount::AltAz;
    let eq = Mount::Equatorial { pier_side: PierSide::West };
    vec![
        Preset { id: "naked_eye", train: Train { name: "Naked eye".into(), instrument: Instrument::NakedEye(NakedEye::default()), accessories: vec![], mount: altaz } },
        Preset {
            id: "binoculars_10x50",
            train: Train {
                name: "10×50 binoculars".into(),
                instrument: Instrument::Binoculars(Binoculars {
                    aperture_mm: 50.0,
                    magnification: 10.0,
                    true_field_deg: Some(6.5),
                    apparent_field_deg: None,
                    eye_relief_mm: Some(17.0),
                    transmission: default_binocular_transmission(),
                }),
                accessories: vec![],
                mount: altaz,
            },
        },
        Preset {
            id: "finder_8x50",
            train: Train {
                name: "8×50 finder".into(),
                instrument: Instrument::Finder(Finder { aperture_mm: 50.0, magnification: 8.0, true_field_deg: 5.0, erecting: false, transmission: default_binocular_transmission() }),
                accessories: vec![],
                mount: altaz,
            },
        },
        Preset { id: "refractor_80_600", train: scope("80/600 refractor", Design::Refractor, 80.0, 600.0, 0.0, altaz, vec![mirror_diagonal(), ep("25 mm 52°")]) },
        Preset {
            id: "newtonian_200_1200_rocker",
            train: scope("200/1200 Newtonian on a rocker mount", Design::Newtonian { focuser_angle_deg: 45.0 }, 200.0, 1200.0, 50.0, altaz, vec![ep("25 mm 52°")]),
        },
        Preset {
            id: "newtonian_150_750_eq",
            train: scope("150/750 Newtonian on an equatorial mount", Design::Newtonian { focuser_angle_deg: 0.0 }, 150.0, 750.0, 47.0, eq, vec![ep("25 mm 52°")]),
        },
        Preset { id: "maksutov_127_1500", train: scope("127/1500 Maksutov-type", Design::MaksutovCassegrain, 127.0, 1500.0, 38.0, altaz, vec![mirror_diagonal(), ep("25 mm 52°")]) },
        Preset { id: "schmidt_cassegrain_203_2032", train: scope("203/2032 Schmidt-type Cassegrain", Design::SchmidtCassegrain, 203.0, 2032.0, 70.0, eq, vec![mirror_diagonal(), ep("32 mm 52°")]) },
        Preset {
            id: "refractor_80_480_camera",
            train: scope(
                "80/480 refractor with a camera",
                Design::Refractor,
                80.0,
                480.0,
                0.0,
                eq,
                vec![Accessory::Camera(Camera { sensor_width_mm: 23.5, sensor_height_mm: 15.6, pixel_pitch_um: 3.9, pixels_x: 6000, pixels_y: 4000, rotation_deg: 0.0, row_order: RowOrder::TopDown })],
            ),
        },
    ]
}

/// Generic accessories besides eyepieces: (label, accessory).
pub fn accessories() -> Vec<(&'static str, Accessory)> {
    let m = |factor| FocalModifier { factor, lens_focal_length_mm: None, extra_spacing_mm: 0.0, transmission: default_lens_transmission() };
    let diag = |prism| Accessory::StarDiagonal(StarDiagonal { prism, rotation_deg: 0.0, transmission: None });
    vec![
        ("90° mirror diagonal", diag(DiagonalKind::Mirror90)),
        ("90° prism diagonal", diag(DiagonalKind::Prism90)),
        ("45° erecting prism", diag(DiagonalKind::ErectingRoof45)),
        ("90° erecting prism", diag(DiagonalKind::ErectingRoof90)),
        ("2× Barlow lens", Accessory::Barlow(m(2.0))),
        ("0.63× focal reducer", Accessory::Reducer(m(0.63))),
        ("Moon filter", Accessory::Filter(Filter { filter: FilterKind::Neutral, transmission: 0.13 })),
        ("Nebula band-pass filter", Accessory::Filter(Filter { filter: FilterKind::NebulaBandPass, transmission: 0.2 })),
        ("Full-aperture solar filter", Accessory::Filter(Filter { filter: FilterKind::Solar, transmission: 1e-5 })),
        ("Phone held to the eyepiece", Accessory::Phone(Phone { lens_focal_length_mm: 4.3, pixel_pitch_um: Some(1.0), rotation_deg: 0.0 })),
    ]
}
