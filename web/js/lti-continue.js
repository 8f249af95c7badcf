// A launch's page posts its form at once: the one-time ticket to this origin, or a deep linking response to the platform. Its button does the same without scripts.
document.querySelector('form')?.submit();
