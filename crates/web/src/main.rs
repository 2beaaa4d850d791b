//! Entry point of the bedside screen: mounts the app on the page's body.

fn main() {
    plumbline_web::start();
}
