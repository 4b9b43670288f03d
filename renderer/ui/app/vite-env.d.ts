/// <reference types="vite/client" />
// Vite's client types: lets any renderer file import a plain .css file for its side effect.
