package lab

// Caution is the note every report of the example programs carries.
const Caution = "These numbers feed decisions about patient safety. This program computes; acceptance of an " +
	"indicator lot or a process is decided by the laboratory's qualified people under the standards and " +
	"regulations that apply to them."
