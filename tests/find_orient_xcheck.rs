//! Finder orientation: the find module's parity model checked against the
//! optics module's 3-D fold model (orient::orientation) for the same finders
//! expressed as trains, over parallactic angles and altitudes.
use nightfield::find::finder::*;
use nightfield::optics::train::*;
use nightfield::orient::{orientation, MountState};

fn train(instrument: Instrument, accessories: Vec<Accessory>) -> Train {
    Train { name: String::new(), instrument, accessories, mount: Mount::AltAz }
}

#[test]
fn finder_parity_matches_fold_model() {
    let finder_instr = |erecting| Instrument::Finder(nightfield::optics::train::Finder { aperture_mm: 50.0, magnification: 8.0, true_field_deg: 6.0, erecting, transmission: 0.85 });
    let diag = |prism| Accessory::StarDiagonal(StarDiagonal { prism, rotation_deg: 0.0, transmission: None });
    let cases: Vec<(FinderKind, Train)> = vec![
        (FinderKind::StraightThrough, train(finder_instr(false), vec![])),
        (FinderKind::RightAngle { prism: PrismKind::Mirror }, train(finder_instr(false), vec![diag(DiagonalKind::Mirror90)])),
        (FinderKind::RightAngle { prism: PrismKind::Erect }, train(finder_instr(false), vec![diag(DiagonalKind::ErectingRoof90)])),
        (FinderKind::Binoculars, train(Instrument::Binoculars(Binoculars { aperture_mm: 50.0, magnification: 10.0, true_field_deg: Some(6.5), apparent_field_deg: None, eye_relief_mm: None, transmission: 0.85 }), vec![])),
        (FinderKind::ReflexSight { ring_radii_deg: vec![0.5, 2.0] }, train(Instrument::NakedEye(NakedEye::default()), vec![])),
    ];
    for (kind, t) in cases {
        let ours = nightfield::find::finder::Finder::new(FinderSpec { kind: kind.clone(), aperture_mm: 50.0, magnification: 8.0, true_field_deg: 6.0 }).unwrap();
        let t2 = ours.to_train();
        for q_deg in [-120.0f64, -30.0, 0.0, 45.0, 170.0] {
            for alt_deg in [10.0f64, 40.0, 75.0] {
                let st = MountState { parallactic_rad: q_deg.to_radians(), alt_rad: alt_deg.to_radians(), pier_side: None, user_rotation_rad: 0.0, dec_rad: None };
                let theirs = orientation(&t, &st).unwrap().m.to_cols_array();
                let mine = ours.orientation(q_deg.to_radians()).m.to_cols_array();
                let d = theirs.iter().zip(mine.iter()).map(|(a, b)| (a - b).abs()).fold(0.0, f64::max);
                assert!(d < 1e-9, "{kind:?} q={q_deg} alt={alt_deg}: mine {mine:?} fold model {theirs:?}");
                let via = orientation(&t2, &st).unwrap().m.to_cols_array();
                assert!(via.iter().zip(mine.iter()).all(|(a, b)| (a - b).abs() < 1e-9), "to_train {kind:?}");
            }
        }
    }
}
