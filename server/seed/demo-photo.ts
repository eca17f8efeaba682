/**
 * An invented side-on line drawing of a rider on a trainer at the bottom of the pedal stroke,
 * rendered to JPEG so the demo has a photo to measure. Not a real person; the joint positions are
 * placed so the drawing reads as a plausible position (knee bent roughly 35° at the bottom).
 */
export const DEMO_PHOTO_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="800" viewBox="0 0 1200 800">
  <rect width="1200" height="800" fill="#F6F1E9"/>
  <line x1="0" y1="720" x2="1200" y2="720" stroke="#c9bfae" stroke-width="6"/>
  <g fill="none" stroke="#1E2329" stroke-width="8" stroke-linecap="round" stroke-linejoin="round">
    <circle cx="330" cy="560" r="168"/>
    <circle cx="900" cy="560" r="168"/>
    <path d="M330 560 L560 580 L720 330 L470 330 Z"/>
    <path d="M560 580 L455 270"/>
    <path d="M720 330 L900 560"/>
    <path d="M720 330 L735 280 L800 270"/>
    <path d="M800 270 q40 5 30 50"/>
    <path d="M400 262 L520 262"/>
    <path d="M560 580 L560 750" stroke="#777" stroke-width="10"/>
  </g>
  <g fill="none" stroke="#1F4D45" stroke-width="26" stroke-linecap="round" stroke-linejoin="round">
    <path d="M470 250 L610 445 L590 660 L640 665"/>
    <path d="M470 250 L640 130 L790 265"/>
    <circle cx="665" cy="95" r="36" fill="#1F4D45"/>
  </g>
  <circle cx="560" cy="750" r="10" fill="#C8643B"/>
</svg>`;
