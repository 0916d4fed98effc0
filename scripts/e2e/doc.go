// Package e2e holds the browser tests of edgewise: they drive the built page
// in headless chromium (chromedp) the way a user would, against the site
// served on localhost and the single offline file opened from disk.
//
// They need the built site (make build), the offline file (make dist) and
// Debian's chromium. `make test` provides all three and sets
// EDGEWISE_E2E=require, so that in CI a missing browser fails the run
// instead of skipping it. Without EDGEWISE_E2E the tests skip.
// Screenshots go to scripts/e2e/screens/ (not committed) for people to look at.
package e2e
