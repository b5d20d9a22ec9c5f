// Package markdown writes seatsmith's result documents as Markdown: the
// title as a level-two heading, sections as level three, lists as bullet
// lists, tables as pipe tables (numbers aligned right, pipes in cells
// escaped), and the not-official caution last, as a quotation.
package markdown
