"""How a body moves when the forces on it do not balance: the drift preview."""
